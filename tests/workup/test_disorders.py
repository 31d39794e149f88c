"""Acid-base disorder analysis: vignettes through assess(), and the rules on hand-made inputs.

Every vignette below is an invented scenario (not a patient). Gas values were chosen so the pH
matches Henderson–Hasselbalch (pH = 6.1 + log10(HCO3 / (0.03 × pCO2))) within 0.01, computed by
hand for these tests. Compensation rules: Winters (Albert, Dell & Winters, Ann Intern Med 1967,
from memory); respiratory 0.1 / 0.35 / 0.2 / 0.4–0.5 × ΔpCO2 (Narins & Emmett, Medicine 1980);
±2 bands and 0.7 × ΔHCO3 (Berend, de Vries & Gans, NEJM 2014); delta-ratio bands (Brandis,
Acid-Base Physiology).
"""

from __future__ import annotations

from typing import Any

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from workup import indices
from workup.assess import assess
from workup.caseio import case_from_data
from workup.disorders import analyse
from workup.findings import Disorder, DrawResult, Finding, Status
from workup.inputs import DrawInputs
from workup.model import GasSample
from workup.patterns import rank
from workup.settings import DEFAULTS


def _case(serum: dict[str, Any], gas: dict[str, Any] | None = None, **extra: Any):
    draw: dict[str, Any] = {"label": "d1", "serum": serum}
    if gas is not None:
        draw["blood_gas"] = gas
    return case_from_data(
        {"label": "invented vignette", "units": "conventional", "draws": [draw], **extra}
    )


def _disorders(serum, gas=None, **extra) -> list[Disorder]:
    return assess(_case(serum, gas, **extra)).disorders


def _ids(ds: list[Disorder]) -> list[tuple[str, bool]]:
    return [(d.id, d.primary) for d in ds]


NORMAL_SERUM = {"sodium": 140, "chloride": 104, "albumin": "4.0 g/dL"}


def _serum(hco3: float, chloride: float | None = None) -> dict[str, Any]:
    """Serum with a normal gap of 10 unless ``chloride`` is given."""
    s = dict(NORMAL_SERUM)
    s["bicarbonate"] = hco3
    s["chloride"] = chloride if chloride is not None else 130 - hco3
    return s


# (name, serum, gas, expected [(id, primary)], primary compensation, primary detail)
VIGNETTES = [
    # Compensated normal-gap acidosis: Winters 1.5 × 15 + 8 = 30.5 ± 2.
    ("normal gap, compensated", _serum(15), {"ph": 7.32, "pco2": 30},
     [("normal_gap_metabolic_acidosis", True)], "appropriate", None),
    # High gap (Na 140 − Cl 110 − HCO3 10 = 20) with delta ratio (20 − 10)/(24 − 10) = 0.71 < 0.8.
    ("high gap + normal gap", _serum(10, 110), {"ph": 7.26, "pco2": 23},
     [("high_gap_metabolic_acidosis", True), ("normal_gap_metabolic_acidosis", False)],
     "appropriate", None),
    # Gap 30, delta ratio 20 / 4 = 5 > 2: an added metabolic alkalosis.
    ("high gap + metabolic alkalosis", _serum(20, 90), {"ph": 7.34, "pco2": 38},
     [("high_gap_metabolic_acidosis", True), ("metabolic_alkalosis", False)], "appropriate", None),
    # Winters for HCO3 12: 26 ± 2; pCO2 35 is too high.
    ("metabolic + respiratory acidosis", _serum(12), {"ph": 7.16, "pco2": 35},
     [("normal_gap_metabolic_acidosis", True), ("respiratory_acidosis", False)],
     "insufficient", None),
    # Respiratory primary: acute expectation 24 + 0.1 × 20 = 26 ± 2, so HCO3 20 is too low.
    ("respiratory + metabolic acidosis", _serum(20), {"ph": 7.15, "pco2": 60},
     [("respiratory_acidosis", True), ("normal_gap_metabolic_acidosis", False)],
     "insufficient", None),
    # Acute respiratory acidosis: HCO3 26 = 24 + 0.1 × 20.
    ("acute respiratory acidosis", _serum(26), {"ph": 7.26, "pco2": 60},
     [("respiratory_acidosis", True)], "appropriate", "acute"),
    # Acute respiratory alkalosis: 24 − 0.2 × 15 = 21 (chronic 16.5–18 ± 2 excludes it).
    ("acute respiratory alkalosis", _serum(21), {"ph": 7.55, "pco2": 25},
     [("respiratory_alkalosis", True)], "appropriate", "acute"),
    # Chronic respiratory alkalosis: 24 − 0.4..0.5 × 15 = 16.5–18; the low HCO3 is compensation.
    ("chronic respiratory alkalosis", _serum(17), {"ph": 7.46, "pco2": 25},
     [("respiratory_alkalosis", True)], "appropriate", "chronic"),
    # Normal pH, opposing disorders: Winters for 14 is 27–31, pCO2 24 is lower.
    ("normal pH: metabolic acidosis + respiratory alkalosis", _serum(14), {"ph": 7.39, "pco2": 24},
     [("normal_gap_metabolic_acidosis", True), ("respiratory_alkalosis", False)],
     "excessive", None),
    # Normal pH below 7.40, high pCO2 and HCO3: chronic expectation 24 + 0.35 × 18 = 30.3 ± 2.
    ("normal pH: respiratory acidosis + metabolic alkalosis", _serum(34), {"ph": 7.39, "pco2": 58},
     [("respiratory_acidosis", True), ("metabolic_alkalosis", False)], "excessive", None),
    # Metabolic alkalosis: expected pCO2 40 + 0.7 × 10 = 47 ± 2.
    ("metabolic alkalosis, compensated", _serum(34), {"ph": 7.49, "pco2": 47},
     [("metabolic_alkalosis", True)], "appropriate", None),
]  # fmt: skip


@pytest.mark.parametrize(
    ("serum", "gas", "expected", "comp", "detail"),
    [v[1:] for v in VIGNETTES],
    ids=[v[0] for v in VIGNETTES],
)
def test_vignette_disorders(serum, gas, expected, comp, detail) -> None:
    ds = _disorders(serum, gas)
    assert _ids(ds) == expected
    assert ds[0].compensation == comp
    assert ds[0].detail == detail
    assert all(d.evidence for d in ds), "every disorder says why"


def test_brandis_example_chronic_fits_acute_would_mean_added_alkalosis() -> None:
    # Brandis, Acid-Base Physiology: PaCO2 60, HCO3 31. Acute: expected 26, so an added
    # metabolic alkalosis; chronic: expected about 31–32, appropriate.
    ds = _disorders(_serum(31), {"ph": 7.34, "pco2": 60})
    primary = ds[0]
    assert (primary.id, primary.detail, primary.compensation) == (
        "respiratory_acidosis", "chronic", "appropriate",
    )  # fmt: skip
    assert not any(d.id == "metabolic_alkalosis" for d in ds)
    fit = next(e.text for e in primary.evidence if "acute expectation" in e.text)
    assert "if the history says acute, a metabolic alkalosis is added" in fit


def test_chronic_respiratory_alkalosis_low_bicarbonate_is_not_metabolic_acidosis() -> None:
    ds = _disorders(_serum(17), {"ph": 7.46, "pco2": 25})
    assert not any("acidosis" in d.id for d in ds)


def test_missing_gas_says_what_cannot_be_concluded() -> None:
    ds = _disorders(_serum(15))
    assert _ids(ds) == [("normal_gap_metabolic_acidosis", True)]
    assert ds[0].detail == "presumed: no usable gas"
    words = " ".join(e.text for e in ds[0].evidence)
    assert "respiratory alkalosis" in words and "enter the gas" in words
    assert ds[0].compensation is None


def test_missing_gas_with_high_gap_is_still_a_high_gap_acidosis() -> None:
    ds = _disorders(_serum(12, 110))  # gap 18
    assert ds[0].id == "high_gap_metabolic_acidosis"
    assert "no usable gas" in (ds[0].detail or "")


def test_inconsistent_gas_is_set_aside_and_said() -> None:
    # pH 7.45 cannot go with HCO3 15 and pCO2 30 (computed 7.32).
    a = assess(_case(_serum(15), {"ph": 7.45, "pco2": 30}))
    hh = a.indices["henderson_hasselbalch_ph"]
    assert hh.interpretation == "inconsistent"
    ds = a.disorders
    words = " ".join(e.text for d in ds for e in d.evidence)
    assert "Henderson–Hasselbalch" in words
    if hh.status is Status.not_valid:
        assert not any(d.id.startswith("respiratory") for d in ds)
        assert "set aside" in words
    else:
        assert "caution" in words


def test_normal_values_give_no_disorder() -> None:
    assert _disorders(_serum(24), {"ph": 7.40, "pco2": 40}) == []


def test_high_gap_hidden_by_alkalosis_with_normal_bicarbonate() -> None:
    ds = _disorders(_serum(24, 96), {"ph": 7.40, "pco2": 40})  # gap 20
    assert _ids(ds) == [("high_gap_metabolic_acidosis", True), ("metabolic_alkalosis", False)]


def test_venous_gas_is_noted() -> None:
    ds = _disorders(_serum(15), {"ph": 7.29, "pco2": 32, "sample": "venous"})
    assert any("venous" in e.text for e in ds[0].evidence)


# The rules alone, on hand-made inputs with no index findings: the fallbacks in disorders.py.


def _x(serum: dict[str, float], gas: dict[str, float] | None = None, **kw: Any) -> DrawInputs:
    return DrawInputs(serum=serum, gas=gas or {}, **kw)


def _gap(value: float) -> dict[str, Finding]:
    return {
        "anion_gap": Finding("anion_gap", "Anion gap", value, "mmol/L", Status.ok,
                             interpretation="high" if value > 14 else "normal"),
    }  # fmt: skip


def test_rules_without_indices_compute_winters_locally() -> None:
    x = _x({"bicarbonate": 12.0}, {"ph": 7.16, "pco2": 35.0})
    ds = analyse(x, _gap(10))
    assert _ids(ds) == [("normal_gap_metabolic_acidosis", True), ("respiratory_acidosis", False)]
    assert any("24–28" in e.text for e in ds[0].evidence)  # Winters 26 ± 2


def test_rules_without_indices_check_henderson_hasselbalch_locally() -> None:
    ds = analyse(_x({"bicarbonate": 15.0}, {"ph": 7.50, "pco2": 30.0}), _gap(10))
    assert ds[0].detail == "presumed: no usable gas"
    assert any("set aside" in e.text for e in ds[0].evidence)


def test_rules_without_gap_do_not_guess_the_gap_type() -> None:
    ds = analyse(_x({"bicarbonate": 15.0}, {"ph": 7.32, "pco2": 30.0}), {})
    assert ds[0].id == "metabolic_acidosis"
    assert "sodium and chloride" in " ".join(e.text for e in ds[0].evidence)


def test_rules_use_gas_bicarbonate_when_serum_lacks_it() -> None:
    ds = analyse(_x({}, {"ph": 7.32, "pco2": 30.0, "bicarbonate": 15.0}), _gap(10))
    assert ds[0].id == "normal_gap_metabolic_acidosis"
    assert "gas bicarbonate" in ds[0].evidence[1].text


def test_rules_band_comes_from_the_index_when_present() -> None:
    winters = Finding("expected_pco2", "Expected pCO2", 30.5, "mmHg", Status.ok,
                      interpretation="appropriate", low=29.0, high=31.0)  # fmt: skip
    x = _x({"bicarbonate": 15.0}, {"ph": 7.29, "pco2": 32.0})
    ds = analyse(x, {**_gap(10), "expected_pco2": winters})
    assert ds[0].compensation == "insufficient"  # 32 > 31 from the index (local band says 32.5)


def test_rules_capillary_sample_noted() -> None:
    x = _x({"bicarbonate": 15.0}, {"ph": 7.32, "pco2": 30.0}, sample=GasSample.capillary)
    assert any("capillary" in e.text for e in analyse(x, _gap(10))[0].evidence)


# Robustness: any values within the analytes' hard limits give a well-formed answer.


def _maybe(lo: float, hi: float):
    return st.one_of(st.none(), st.floats(lo, hi, allow_nan=False))


@settings(max_examples=150, deadline=None)
@given(
    ph=_maybe(6.5, 8.0), pco2=_maybe(5, 200), gas_hco3=_maybe(1, 70), hco3=_maybe(1, 70),
    na=_maybe(80, 200), cl=_maybe(40, 160), alb=_maybe(3, 80), k=_maybe(0.8, 12),
    venous=st.booleans(),
)  # fmt: skip
def test_any_values_give_one_primary_first(ph, pco2, gas_hco3, hco3, na, cl, alb, k, venous):
    gas = {k_: v for k_, v in (("ph", ph), ("pco2", pco2), ("bicarbonate", gas_hco3)) if v}
    serum = {k_: v for k_, v in (("bicarbonate", hco3), ("sodium", na), ("chloride", cl),
                                 ("albumin", alb), ("potassium", k)) if v}  # fmt: skip
    x = DrawInputs(serum=serum, gas=gas, sample=GasSample.venous if venous else GasSample.arterial)
    found = indices.compute_all(x)
    ds = analyse(x, found)
    if ds:
        assert ds[0].primary and sum(d.primary for d in ds) == 1
        assert len({d.id for d in ds}) == len(ds)
        assert ds[0].compensation in (None, "appropriate", "insufficient", "excessive")
    ranking = rank([DrawResult("d", x, found, ds)], None, DEFAULTS)
    assert len(ranking.calls) == 7


def test_inconsistent_gas_names_why_compensation_is_not_assessed() -> None:
    # Invented values: pH 7.29 with HCO3 15 and pCO2 27 mmHg (3.6 kPa) disagree by
    # Henderson–Hasselbalch (computed 7.37), so the gas is set aside, not "missing".
    from workup.assess import assess
    from workup.caseio import case_from_data

    case = case_from_data(
        {
            "label": "invented",
            "draws": [
                {
                    "label": "a",
                    "serum": {"sodium": 139, "chloride": 117, "bicarbonate": 15},
                    "blood_gas": {"ph": 7.29, "pco2": "3.6 kPa"},
                }
            ],
        }
    )
    a = assess(case)
    assert a.indices["henderson_hasselbalch_ph"].status.value == "not_valid"
    assert a.disorders[0].detail == "compensation not assessed (gas set aside)"
