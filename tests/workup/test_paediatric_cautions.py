"""Children's reference values stated beside the adult readings: TTKG, urine K/creatinine and the
infant's bicarbonate threshold, each with its named source (from memory) or the reason none is used.

Sources, from memory: normal TTKG of infants 4.9-15.5 and children 4.1-10.5 on their usual diet
with a normal serum potassium (Rodríguez-Soriano et al., Pediatr Nephrol 1990); renal
bicarbonate threshold of infants about 22 mmol/L (Edelmann et al., J Clin Invest 1967). No
paediatric urine K/creatinine cut-off is named. Inputs are invented, not patients.
"""

from __future__ import annotations

import pytest

from workup.findings import Status
from workup.indices import compute_all
from workup.inputs import DrawInputs
from workup.model import Sex

_SERUM = {"sodium": 140.0, "chloride": 116.0, "bicarbonate": 18.0, "osmolality": 300.0,
          "creatinine": 30.0}  # fmt: skip
_URINE = {"sodium": 40.0, "chloride": 30.0, "ph": 6.5, "osmolality": 600.0, "creatinine": 2000.0}


def _x(age: int | None, serum_k: float, urine_k: float) -> DrawInputs:
    return DrawInputs(
        serum={**_SERUM, "potassium": serum_k}, urine={**_URINE, "potassium": urine_k},
        age=age, sex=Sex.male, height_cm=100,
    )  # fmt: skip


@pytest.mark.parametrize(
    ("age", "serum_k", "urine_k", "ttkg", "range_text", "side"),
    [
        # TTKG = (urine K / plasma K) / (urine osm / plasma osm), urine osm / plasma osm = 2.
        # (30 / 6.0) / 2 = 2.5; infants 4.9-15.5 (Rodríguez-Soriano 1990, from memory): below.
        (0, 6.0, 30.0, 2.5, "normal infants with a normal serum K run 4.9-15.5", "below"),
        # Children 4.1-10.5 (Rodríguez-Soriano 1990, from memory): 2.5 is below it.
        (6, 6.0, 30.0, 2.5, "normal children with a normal serum K run 4.1-10.5", "below"),
        # (72 / 3.0) / 2 = 12: above the children's 10.5, inside the infants' 15.5 (same source).
        (9, 3.0, 72.0, 12.0, "normal children with a normal serum K run 4.1-10.5", "above"),
        (0, 3.0, 72.0, 12.0, "normal infants with a normal serum K run 4.9-15.5", None),
        # (48 / 3.0) / 2 = 8: inside the children's range (same source).
        (17, 3.0, 48.0, 8.0, "normal children with a normal serum K run 4.1-10.5", None),
    ],
)
def test_child_ttkg_states_the_range_of_the_age(age, serum_k, urine_k, ttkg, range_text, side):
    child = compute_all(_x(age, serum_k, urine_k))["ttkg"]
    adult = compute_all(_x(40, serum_k, urine_k))["ttkg"]
    assert child.value == pytest.approx(ttkg, abs=1e-9)
    first = child.reasons[0]
    assert first.startswith(f"age {age}: ") and range_text in first
    assert "Rodríguez-Soriano et al., Pediatr Nephrol 1990" in first and "from memory" in first
    assert "not used as a cut-off" in first
    if side is None:
        assert "even that range" not in first
    else:
        assert f"{ttkg:g} is {side} even that range" in first
    # The range is a comparison, not the cut-off: the reading is the adult one.
    assert child.interpretation == adult.interpretation
    assert child.status is Status.caution
    band = child.extra["child_range"]
    expected = (4.9, 15.5) if age == 0 else (4.1, 10.5)
    assert (band["low"], band["high"]) == expected and "Rodríguez-Soriano" in band["source"]
    assert "child_range" not in adult.extra


@pytest.mark.parametrize("age", [0, 6, 17])
def test_urine_k_creatinine_says_why_no_children_number_is_used(age):
    # No paediatric source for a urine K/creatinine cut-off is named here: the adult 1.5 mmol/mmol
    # (Halperin, Afr J Nephrol 2017) stays, and the caution says so without a children's number.
    child = compute_all(_x(age, 3.0, 30.0))["urine_potassium_creatinine_ratio"]
    adult = compute_all(_x(40, 3.0, 30.0))["urine_potassium_creatinine_ratio"]
    first = child.reasons[0]
    assert first.startswith(f"age {age}: ")
    assert "no paediatric source is named here" in first and "no children's cut-off" in first
    assert "less creatinine" in first
    assert child.interpretation == adult.interpretation and child.value == adult.value


@pytest.mark.parametrize(
    ("fid", "bicarbonate"),
    [
        # Edelmann et al., J Clin Invest 1967 (from memory): infants' threshold about 22 mmol/L.
        ("urine_ph", 18.0),
        ("urine_anion_gap", 18.0),
        ("urine_osmolal_gap", 18.0),
        ("urine_ph", 21.0),
    ],
)
def test_infant_caution_gives_the_threshold_its_source_and_the_value(fid, bicarbonate):
    x = DrawInputs(
        serum={**_SERUM, "bicarbonate": bicarbonate, "potassium": 4.0, "glucose": 5.0,
               "urea": 4.0},
        urine={**_URINE, "potassium": 20.0, "urea": 200.0, "glucose": 0.0},
        age=0, height_cm=65,
    )  # fmt: skip
    f = compute_all(x)[fid]
    assert f.value is not None
    text = next(r for r in f.reasons if "infant" in r)
    assert "renal bicarbonate threshold is about 22 mmol/L" in text
    assert "Edelmann et al., J Clin Invest 1967, from memory" in text
    assert f"(plasma bicarbonate {bicarbonate:g})" in text
    assert "adult cut-off of 22" in text
    # At age 1 the infant's threshold is not stated.
    older = compute_all(DrawInputs(serum=x.serum, urine=x.urine, age=1, height_cm=75))[fid]
    assert not any("Edelmann" in r for r in older.reasons)
