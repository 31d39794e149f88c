"""Reading the invented lab-report fixtures under tests/workup/lab_reports/."""

from __future__ import annotations

from pathlib import Path

REPORTS = Path(__file__).resolve().parents[1] / "lab_reports"


def _report(name: str) -> str:
    """The fixture's text with its "#" lines blanked, so line numbers stay those of the file."""
    text = (REPORTS / name).read_text(encoding="utf-8")
    return "\n".join("" if line.startswith("#") else line for line in text.split("\n"))
