"""Sources are cited as published originals (author, journal, year), never as a section of an
internal summary: a reader of the code, docs or tests must be able to look the source up."""

from __future__ import annotations

import re
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[2]
FILES = sorted(
    p
    for folder in ("workup", "docs", "tests/workup", "cases")
    for p in (ROOT / folder).rglob("*")
    if p.suffix in (".py", ".md", ".yaml") and p != Path(__file__).resolve()
)
# "sheet §12", "reference sheet", "clinical-methods sheet": citations nobody outside can follow.
INTERNAL = re.compile(r"sheet\s*§|reference sheet|methods sheet", re.IGNORECASE)


@pytest.mark.parametrize("path", FILES, ids=lambda p: str(p.relative_to(ROOT)))
def test_no_citation_points_at_an_internal_summary(path: Path) -> None:
    text = path.read_text(encoding="utf-8")
    assert INTERNAL.findall(text) == [], path
