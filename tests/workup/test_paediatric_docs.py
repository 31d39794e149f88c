"""docs/indices.md lists every children's reference value in force, with its source, marked from
memory (the values and sources are the ones in workup/settings.py)."""

from __future__ import annotations

from pathlib import Path

import pytest

from workup.settings import (
    INFANT_BICARBONATE_THRESHOLD,
    TMP_GFR_CHILD_BANDS,
    TTKG_CHILD_RANGES,
    AgeBand,
)

DOC = Path(__file__).resolve().parents[2] / "docs" / "indices.md"


def _children_section() -> str:
    text = DOC.read_text(encoding="utf-8")
    return text.split("\n## Children\n")[1].split("\n## ")[0]


def _row(start: str) -> str:
    return next(ln for ln in _children_section().splitlines() if ln.strip().startswith(start))


@pytest.mark.parametrize(
    ("band", "row", "source"),
    [(b, f"| TmP/GFR, {lbl} |", "Payne, Ann Clin Biochem 1998")
     for b, lbl in zip(TMP_GFR_CHILD_BANDS, ("age 0", "age 1", "ages 2–15"), strict=True)]
    + [(b, f"| TTKG, {lbl}", "Rodríguez-Soriano et al., Pediatr Nephrol 1990")
       for b, lbl in zip(TTKG_CHILD_RANGES, ("infants", "children"), strict=True)],
)  # fmt: skip
def test_every_band_is_documented_with_its_source(band: AgeBand, row: str, source: str) -> None:
    line = _row(row)
    unit = " mmol/L" if row.startswith("| TmP") else ""
    assert f"{band.low:g}–{band.high:.2f}{unit}" in line or f"{band.low:g}–{band.high:g}" in line
    assert "[M]" in line
    if "same" not in line:
        assert source in line


def test_the_infant_threshold_and_the_missing_urine_k_creatinine_source_are_documented():
    line = _row("| Renal bicarbonate threshold, infants |")
    assert f"about {INFANT_BICARBONATE_THRESHOLD:g} mmol/L" in line
    assert "Edelmann et al., J Clin Invest 1967 [M]" in line
    assert "no paediatric source named" in _row("| Urine K/creatinine |")
    assert "from memory" in _children_section()
