"""Golden notes: the drafted note of every demo case (invented scenarios), compared word for word.

The golden files under ``tests/workup/golden/notes/`` are the reviewed text. After an intended
change to the note, the indices, the disorder analysis or the ranking, regenerate them with

    WORKUP_UPDATE_GOLDEN=1 .venv/bin/python -m pytest tests/workup/test_note_golden.py -q

then read every changed file for clinical sense before committing it.
"""

from __future__ import annotations

import os
from pathlib import Path

import pytest

from workup.assess import assess
from workup.caseio import load_case
from workup.note import draft_note

ROOT = Path(__file__).resolve().parents[2]
CASES = sorted((ROOT / "cases").glob("*.yaml"))
GOLDEN = Path(__file__).resolve().parent / "golden" / "notes"
UPDATE = os.environ.get("WORKUP_UPDATE_GOLDEN") == "1"

# Text in both styles for every case; markdown for a few cases that exercise the table (several
# draws), a mixed disorder and a missing urine.
MARKDOWN_CASES = (
    "distal-rta-classic",
    "mixed-ketoacidosis-saline",
    "respiratory-alkalosis-chronic",
)

VARIANTS = [(p.stem, style, "text") for p in CASES for style in ("brief", "full")] + [
    (stem, style, "markdown") for stem in MARKDOWN_CASES for style in ("brief", "full")
]


def _golden_path(stem: str, style: str, fmt: str) -> Path:
    return GOLDEN / f"{stem}.{style}.{'md' if fmt == 'markdown' else 'txt'}"


@pytest.mark.parametrize(("stem", "style", "fmt"), VARIANTS, ids=lambda v: str(v))
def test_note_matches_golden(stem: str, style: str, fmt: str) -> None:
    case = load_case(ROOT / "cases" / f"{stem}.yaml")
    note = draft_note(assess(case), case, style, fmt)
    path = _golden_path(stem, style, fmt)
    if UPDATE:
        path.parent.mkdir(parents=True, exist_ok=True)
        path.write_text(note, encoding="utf-8")
    assert path.exists(), f"no golden file {path.name}; run with WORKUP_UPDATE_GOLDEN=1"
    assert note == path.read_text(encoding="utf-8")


def test_every_demo_case_has_golden_notes() -> None:
    # A case added to cases/ without golden notes would otherwise go untested.
    stems = {p.stem for p in CASES}
    golden = {p.name.split(".")[0] for p in GOLDEN.glob("*.txt")}
    assert stems <= golden


def test_no_stale_golden_files() -> None:
    expected = {_golden_path(*v).name for v in VARIANTS}
    present = {p.name for p in GOLDEN.iterdir() if p.is_file()}
    assert present <= expected, f"golden files with no case: {sorted(present - expected)}"
