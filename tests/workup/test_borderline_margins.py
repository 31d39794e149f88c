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


def ttkg_inputs(value: float, k: float):
    """Urine and plasma osmolality equal (300), so TTKG = urine K / plasma K."""
    return draw(
        {"sodium": 60, "potassium": value * k, "osmolality": 300},
        serum={"sodium": 138, "potassium": k, "chloride": 113, "bicarbonate": 15,
               "osmolality": 300},
    )  # fmt: skip


@pytest.mark.parametrize(
    ("value", "k", "word", "borderline"),
    [
        # Hypokalemia: below 3 renal conservation, above 7 renal wasting (Ethier et al., AJKD
        # 1990: non-renal loss 0.9 ± 0.2; hyperaldosteronism 6.7 ± 1.3); between, borderline.
        (0.9, 3.0, "low", False),  # Ethier 1990 non-renal mean
        (2.9, 3.0, "low", False),  # just under the 3 cut-off (Ethier 1990)
        (3.0, 3.0, "high", True),  # on the 3 cut-off (Ethier 1990)
        (5.0, 3.0, "high", True),  # between the two cut-offs (Ethier 1990)
        (6.7, 3.0, "high", True),  # Ethier 1990 hyperaldosteronism mean, inside 3–7
        (7.5, 3.0, "high", False),  # above 7: wasting (Ethier 1990)
        # Hyperkalemia: above 7 adequate; "too low" cut-offs run from < 5 to < 7 (Choi &
        # Ziyadeh, JASN 2008, from memory), so 5–7 is borderline and under 5 is clearly low.
        (3.0, 6.0, "low", False),  # Choi & Ziyadeh 2008: clearly too low
        (5.3, 5.1, "low", True),  # Porteous et al., J Med Case Rep 2011, Table 4: TTKG 5.3
        (6.5, 6.0, "low", True),  # Choi & Ziyadeh 2008: under 7 but over 5
        (9.0, 6.0, "high", False),  # Choi & Ziyadeh 2008: adequate response
        (13.1, 5.5, "high", False),  # Ethier 1990: after a 50 mmol KCl load, 13.1 ± 3.8
    ],
)
def test_ttkg_margin(value, k, word, borderline):
    f = potassium.ttkg(ttkg_inputs(value, k))
    assert f.value == pytest.approx(value)
    assert f.borderline is borderline
    assert f.to_json()["borderline"] is borderline
    assert f.interpretation == word + (" (borderline)" if borderline else "")
    source = "Ethier" if k < 3.5 else "Choi & Ziyadeh"
    assert any(r.startswith("borderline") and source in r for r in f.reasons) is borderline


def test_ttkg_with_normal_potassium_has_no_margin():
    # With a normal serum K there is no demand to judge against (Ethier et al., AJKD 1990):
    # already a caution, not a borderline reading.
    f = potassium.ttkg(ttkg_inputs(5.0, 4.2))
    assert not f.borderline and f.interpretation == "high"


def _scores(serum_k: float, urine: dict) -> dict[str, float]:
    case = _case([_draw("baseline", _serum(serum_k), urine)])
    return {c.id: c.score for c in assess(case).patterns}


@pytest.mark.parametrize(
    ("serum_k", "ttkg_value"),
    [
        (3.2, 5.0),  # hypokalemia, between 3 and 7 (Ethier et al., AJKD 1990)
        (3.2, 6.7),  # Ethier 1990 hyperaldosteronism mean, still between the cut-offs
        (6.0, 6.0),  # hyperkalemia, between 5 and 7 (Choi & Ziyadeh, JASN 2008, from memory)
    ],
)
def test_borderline_ttkg_adds_no_weight(serum_k, ttkg_value):
    # Invented vignette: a normal-gap acidosis whose only renal potassium reading is the TTKG.
    # Plasma osmolality 288 (the helper's serum); urine osmolality 576, so TTKG = UK / K / 2.
    # A borderline TTKG is listed but must leave every cause's score where it is without it,
    # so no cause leads or falls on that one value.
    urine = {"sodium": 50, "osmolality": 576}
    with_ttkg = {**urine, "potassium": ttkg_value * serum_k * 2}
    assert _scores(serum_k, with_ttkg) == _scores(serum_k, urine)
    case = _case([_draw("baseline", _serum(serum_k), with_ttkg)])
    texts = [e.text for p in assess(case).patterns for e in (*p.support, *p.against)]
    assert any(t.startswith("TTKG") and "borderline" in t for t in texts)
