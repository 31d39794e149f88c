"""Broken case files for the library tests: each must be listed with the loader's own error."""

from __future__ import annotations

from pathlib import Path

DEMO = Path(__file__).resolve().parents[3] / "cases"

# Broken files: each must be listed with the loader's own error, never stop the listing.
BROKEN = {
    "bad-yaml.yaml": "label: [unclosed\n",
    "empty.yaml": "",
    "a-list.yaml": "- one\n- two\n",
    "duplicate.yaml": "schema: 1\nlabel: A\nlabel: B\n",
    "alias.yaml": "schema: 1\nlabel: &x A\nnotes: *x\n",
    "tag.yaml": "schema: 1\nlabel: !!python/object/apply:os.system [echo]\n",
    "unknown-key.yaml": "schema: 1\nlabl: typo\n",
    "implausible.yaml": ("schema: 1\nlabel: X\ndraws:\n  - label: a\n    serum: {sodium: 1380}\n"),
    "future-schema.yaml": "schema: 99\nlabel: X\n",
    "int-key.yaml": "schema: 1\nlabel: X\n1: one\n",
}


def _write_broken(folder: Path) -> None:
    for name, text in BROKEN.items():
        (folder / name).write_text(text, encoding="utf-8")
    (folder / "latin1.yaml").write_bytes(b"schema: 1\nlabel: caf\xe9\n")
    (folder / "nul.yaml").write_bytes(b"schema: 1\nlabel: a\x00b\n")


def _cache(tmp_path: Path) -> Path:
    """The index file the library tests use, under the test's own folder."""
    return tmp_path / "cache" / "index.sqlite"
