"""Borderline readings: a value within its cut-off's imprecision is flagged, not forced to a side.

Every vignette is an invented scenario, not a patient. Margins are documented in docs/indices.md
("Borderline margins").
"""

from __future__ import annotations

import pytest

from tests.workup.test_indices_urine_acid import draw
from tests.workup.test_patterns import _case, _draw, _serum
from workup.assess import assess
from workup.indices import potassium, urine_acid

HYPOKALEMIC = {"sodium": 138, "potassium": 3.0, "chloride": 113, "bicarbonate": 15}


@pytest.mark.parametrize(
    ("ph", "borderline"),
    [
        (5.0, False),  # well below 5.3: acidified (Berend et al., Kidney Dis 2017)
        (5.3, True),  # lower edge of the 5.3–5.5 cut-offs (Berend 2017; Rodríguez Soriano 2002)
        (5.5, True),  # the 5.5 cut-off itself (Berend 2017; Rodríguez Soriano, JASN 2002)
        (5.64, True),  # Batlle et al., NEJM 1988: diarrhea group mean 5.64, on the margin
        (6.5, False),  # clearly not acidified (Rodríguez Soriano, JASN 2002, Table 5)
    ],
)
def test_urine_ph_margin(ph, borderline):
    f = urine_acid.urine_ph(draw({"ph": ph, "sodium": 50}))
    assert f.borderline is borderline
    assert f.to_json()["borderline"] is borderline
    assert ("borderline" in (f.interpretation or "")) is borderline
    assert any("borderline" in r and "Berend" in r for r in f.reasons) is borderline


@pytest.mark.parametrize(
    ("urine_k", "borderline"),
    [
        (5.0, False),  # 0.5 mmol/mmol: conservation, below 1.5 (Halperin, Afr J Nephrol 2017)
        (15.0, True),  # 1.5 mmol/mmol: on the cut-off (Halperin 2017; margin from memory)
        (12.0, False),  # 1.2 mmol/mmol: below the margin (Halperin 2017; margin from memory)
        (40.0, False),  # 4.0 mmol/mmol: clear renal wasting (Halperin 2017)
    ],
)
def test_urine_k_creatinine_margin_in_hypokalemia(urine_k, borderline):
    x = draw({"potassium": urine_k, "creatinine": 10000.0}, serum=HYPOKALEMIC)
    f = potassium.urine_potassium_creatinine_ratio(x)
    assert f.borderline is borderline
    assert ("borderline" in (f.interpretation or "")) is borderline


def _leader(urine: dict) -> str:
    case = _case([_draw("baseline", _serum(3.2), urine)])
    return assess(case).patterns[0].id


BASE = {"sodium": 50, "potassium": 20, "creatinine": "60 mg/dL"}


def test_borderline_urine_ph_does_not_flip_the_leader():
    # Invented vignette: hypokalemic normal-gap acidosis with little else. A clear urine pH of
    # 5.0 puts proximal RTA first and 6.5 puts classic distal RTA first (Rodríguez Soriano,
    # JASN 2002, Table 5), so urine pH alone decides; on the 5.3–5.7 margin it must not.
    assert _leader({**BASE, "ph": 5.0}) == "proximal_rta"
    assert _leader({**BASE, "ph": 6.5}) == "distal_rta"
    without = _leader(BASE)
    for ph in (5.35, 5.45, 5.55, 5.65):
        assert _leader({**BASE, "ph": ph}) == without, ph


def test_borderline_reading_is_shown_in_the_evidence():
    case = _case([_draw("baseline", _serum(3.2), {**BASE, "ph": 5.45})])
    texts = [e.text for p in assess(case).patterns for e in (*p.support, *p.against)]
    assert any("urine pH 5.45" in t and "borderline" in t for t in texts)
