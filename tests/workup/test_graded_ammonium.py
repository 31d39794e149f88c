"""Graded ammonium: a clearly high ammonium counts strongly against the low-ammonium causes.

Every vignette is an invented scenario, not a patient. Sources of the cut-offs (settings.py):
Kim et al., AJKD 1996 (distal RTA UOG 129.7 ± 17.0; NH4Cl-loaded controls 319.7 ± 58.4);
Kamel et al., AJKD 1997 (UOG below 100 low, NH4 ≈ UOG / 2); Berend et al., Kidney Dis 2017,
Table 1 (distal and type 4 RTA below 150, diarrhea above 200).
"""

from __future__ import annotations

import pytest

from tests.workup.test_patterns import _case, _draw, _serum
from workup.assess import assess
from workup.findings import Verdict
from workup.rules.ammonium import ammonium, grade
from workup.rules.readings import Reading, Readings
from workup.settings import DEFAULTS


def _urine(uog: float) -> dict:
    """Urine whose osmolal gap is ``uog``: calculated 2 × (40 + 15) + 600 / 2.8 = 324.3 mOsm/kg;
    UAG 40 + 15 − 80 = −25 (negative, agreeing)."""
    return {"sodium": 40, "potassium": 15, "chloride": 80, "osmolality": round(324.3 + uog),
            "urea_nitrogen": "600 mg/dL", "glucose": "0 mg/dL", "creatinine": "100 mg/dL"}  # fmt: skip


# name → (serum K, HCO3, creatinine, urine pH, context, age): each the history and chemistry of
# one low-ammonium cause (Berend 2017, Table 1), with a urine osmolal gap of 300.
PICTURES = {
    "classic distal": (2.8, 15, "0.9 mg/dL", 6.5, ["autoimmune_disease"], 45),
    "type 4": (6.0, 18, "1.3 mg/dL", 5.2, ["diabetes", "raas_blocker"], 60),
    "CKD": (5.3, 18, "3.0 mg/dL", 5.2, ["known_ckd"], 70),
    "voltage distal": (6.0, 15, "1.1 mg/dL", 6.5, ["urinary_obstruction"], 70),
}
LOW_AMMONIUM_CAUSES = ("distal_rta", "hyperkalemic_distal_rta", "hypoaldosteronism", "ckd_acidosis")


def _assess(picture: str, uog: float, **urine_more):
    k, hco3, cr, ph, ctx, age = PICTURES[picture]
    urine = {**_urine(uog), "ph": ph, **urine_more}
    return assess(_case([_draw("baseline", _serum(k, hco3, cr), urine)], context=ctx, age=age))


@pytest.mark.parametrize("picture", list(PICTURES))
def test_uog_300_leaves_no_low_ammonium_cause_possible(picture):
    # UOG 300 mOsm/kg is NH4 ≈ 150 mmol/L (Kamel et al., AJKD 1997), three times the low cut-off
    # of 100 and near the NH4Cl-loaded controls of Kim et al., AJKD 1996 (319.7 ± 58.4), far
    # above distal RTA (129.7 ± 17.0) and above 150 in distal and type 4 RTA (Berend et al.,
    # Kidney Dis 2017, Table 1): none of the causes that lower ammonium may stay possible.
    a = _assess(picture, 300)
    assert a.indices["urine_osmolal_gap"].value == pytest.approx(300, abs=0.5)
    verdicts = {c.id: c.verdict for c in a.patterns}
    for pid in LOW_AMMONIUM_CAUSES:
        assert verdicts[pid] is Verdict.unlikely, (picture, pid)


def test_adequate_but_not_clearly_high_ammonium_counts_less():
    # UOG 170: above the 150 cut-off for adequate ammonium (Berend et al., Kidney Dis 2017,
    # Table 1) but under the 200 of diarrhea: graded, not binary, so classic distal RTA with its
    # history stays possible here and is unlikely at 300.
    distal = {c.id: c for c in _assess("classic distal", 170).patterns}["distal_rta"]
    assert distal.verdict is Verdict.possible
    clearly = {c.id: c for c in _assess("classic distal", 300).patterns}["distal_rta"]
    assert clearly.score < distal.score
    assert any("clearly high" in e.text for e in clearly.against)


@pytest.mark.parametrize(
    ("index", "value", "expected"),
    [
        # Urine osmolal gap (mOsm/kg): adequate above 150, clearly high above 200 (Berend et al.,
        # Kidney Dis 2017, Table 1: diarrhea above 200; Kim et al., AJKD 1996).
        ("urine_osmolal_gap", 170.0, "adequate"),
        ("urine_osmolal_gap", 200.0, "adequate"),
        ("urine_osmolal_gap", 201.0, "clearly_high"),
        # Urine ammonium (mmol/L): twice the low cut-off of 50 (UOG 200 / 2, Kamel et al., AJKD
        # 1997; arithmetic).
        ("urine_ammonium_estimate", 90.0, "adequate"),
        ("urine_ammonium_estimate", 120.0, "clearly_high"),
        # NH4/creatinine (mmol/mmol): > 200 mmol/day over 10 mmol/day creatinine (derived,
        # common practice).
        ("urine_ammonium_creatinine_ratio", 12.0, "adequate"),
        ("urine_ammonium_creatinine_ratio", 25.0, "clearly_high"),
        # The urine anion gap is not graded: it tracks ammonium too loosely (Kim et al., AJKD
        # 1996, r = −0.70; Raphael et al., CJASN 2018, r = 0.18 in CKD).
        ("urine_anion_gap", -60.0, "adequate"),
    ],
)
def test_grade_of_one_reading(index, value, expected):
    word = "negative" if index == "urine_anion_gap" else "adequate"
    r = Reading(index, word, value, "d", index, 1.0, f"{index} {value}")
    assert grade(r, DEFAULTS) == expected
    low = Reading(index, "low" if index != "urine_anion_gap" else "positive", value, "d", index,
                  1.0, "x")  # fmt: skip
    assert grade(low, DEFAULTS) == "low"


def test_call_carries_its_grade_and_keeps_its_word():
    # The call's word stays "high" (existing keys and JSON unchanged); the grade says how high.
    r = Reading("urine_osmolal_gap", "adequate", 300.0, "d", "urine_osmolal_gap", 1.0, "UOG 300")
    call = ammonium(Readings(by_key={"urine_osmolal_gap": r}), DEFAULTS)
    assert call is not None
    assert (call.word, call.grade) == ("high", "clearly_high")
    assert "clearly high" in call.text and "monovalent" in call.text


def test_measured_ammonium_clearly_high_also_counts():
    # Measured NH4 200 mmol/L over creatinine 8.84 mmol/L = 22.6 mmol/mmol, above 20 (derived
    # from > 200 mmol/day, common practice): classic distal RTA is unlikely on it.
    a = _assess("classic distal", 120, ammonium=200)
    call = {c.id: c for c in a.patterns}["distal_rta"]
    assert call.verdict is Verdict.unlikely
    assert any("NH4" in e.text or "ammonium" in e.text for e in call.against)
