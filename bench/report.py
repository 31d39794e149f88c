"""Putting the latest results into docs/benchmarks.md, between two marker lines.

Run ``python -m bench.report`` to rewrite the table from bench/results/latest.json without
measuring again. Everything outside the markers (how each figure is measured) is left as written.
"""

from __future__ import annotations

import json
from pathlib import Path
from typing import Any

ROOT = Path(__file__).resolve().parent.parent
DOCS = ROOT / "docs" / "benchmarks.md"
START = "<!-- bench-table:start (written by python -m bench --write-docs) -->"
END = "<!-- bench-table:end -->"


def machine_line(m: dict[str, Any]) -> str:
    """One line naming the machine and software a run used."""
    load = m.get("load_before")
    load_text = f"; load average before {load[0]}" if load else ""
    after = m.get("load_after")
    load_text += f", after {after[0]}" if after else ""
    source = ""
    if m.get("commit"):
        changed = m.get("modified_files", 0)
        source = f"; commit {m['commit']}" + (f" + {changed} modified files" if changed else "")
    return (
        f"{m['date_utc']} UTC{source}; {m['nproc']} CPUs, {m['cpu_model']}; Python {m['python']}, "
        f"Textual {m['textual']}, PyYAML {m['pyyaml']}, pydantic {m['pydantic']}; "
        f"{m['platform']}{load_text}; run took {m.get('run_seconds', '?')} s"
    )


def section(doc: dict[str, Any]) -> str:
    """The text that goes between the markers."""
    plan = doc.get("plan", {})
    reps = ", ".join(f"{k} {v}" for k, v in plan.items())
    targets = doc.get("targets") or []  # absent from results written before the list existed
    return "\n".join(
        [START, "", f"Machine: {machine_line(doc['machine'])}.", "", f"Repetitions: {reps}.", "",
         doc["table"], "", *([*targets, ""] if targets else []), END]
    )  # fmt: skip


def splice(text: str, new_section: str) -> str:
    """``text`` with the marked section replaced by ``new_section`` (appended if absent)."""
    if START in text and END in text:
        head, rest = text.split(START, 1)
        _, tail = rest.split(END, 1)
        return head + new_section + tail
    return text.rstrip("\n") + "\n\n" + new_section + "\n"


def write_docs(doc: dict[str, Any], path: Path = DOCS) -> Path:
    """Write the results section of ``doc`` into ``path``."""
    old = path.read_text(encoding="utf-8") if path.exists() else "# Benchmarks\n"
    path.write_text(splice(old, section(doc)), encoding="utf-8")
    return path


def main() -> int:
    """Rewrite the docs table from bench/results/latest.json."""
    doc = json.loads((ROOT / "bench" / "results" / "latest.json").read_text(encoding="utf-8"))
    print(write_docs(doc))
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
