"""The blood-gas indices: Henderson–Hasselbalch check and the compensation rules.

Each expected value names its source beside the check. Values marked [D] are our own arithmetic
from the published formula, not published worked examples.
"""

from __future__ import annotations

import pytest

from workup.findings import Status
from workup.indices import gas
from workup.inputs import DrawInputs
from workup.model import GasSample


def draw(serum=None, gas_=None, **kw) -> DrawInputs:
    return DrawInputs(serum=serum or {}, gas=gas_ or {}, **kw)


# --- Henderson–Hasselbalch -------------------------------------------------------------------


def test_hh_normal_gas_is_consistent():
    # pH 7.40 / pCO2 40 / HCO3 24 → [H+] 24 × 40/24 = 40.0 vs measured 10^(9 − 7.40) = 39.8
    # (arithmetic [D] on Kassirer & Bleich, NEJM 1965, from memory).
    f = gas.henderson_hasselbalch_ph(draw(gas_={"ph": 7.40, "pco2": 40, "bicarbonate": 24}))
    assert f.status is Status.ok and f.interpretation == "consistent"
    assert f.value == pytest.approx(7.401, abs=0.001)
    assert f.extra["h_computed"] == pytest.approx(40.0)
    assert f.extra["h_measured"] == pytest.approx(39.81, abs=0.01)


@pytest.mark.parametrize(
    ("hco3", "status", "reading"),
    [
        (24, Status.ok, "consistent"),
        (22, Status.caution, "inconsistent"),  # computed 7.363: 0.037 off, within 2 × tolerance
        (12, Status.not_valid, "inconsistent"),  # computed 7.10: far outside (common practice)
    ],
)
def test_hh_mismatch_sets_status(hco3, status, reading):
    f = gas.henderson_hasselbalch_ph(draw(gas_={"ph": 7.40, "pco2": 40, "bicarbonate": hco3}))
    assert (f.status, f.interpretation) == (status, reading)
    if status is Status.not_valid:
        assert "do not fit together" in f.reasons[0]


def test_hh_serum_and_gas_bicarbonate_difference_over_four_is_a_caution():
    # Common practice: gas HCO3 and serum total CO2 more than about 4 apart suggests an error.
    x = draw(serum={"bicarbonate": 30}, gas_={"ph": 7.40, "pco2": 40, "bicarbonate": 24})
    f = gas.henderson_hasselbalch_ph(x)
    assert f.extra["serum_gas_bicarbonate_difference"] == pytest.approx(-6)
    assert f.status is Status.caution
    assert any("differ by 6" in r for r in f.reasons)
    close = gas.henderson_hasselbalch_ph(
        draw(serum={"bicarbonate": 25}, gas_={"ph": 7.40, "pco2": 40, "bicarbonate": 24})
    )
    assert close.status is Status.ok


def test_hh_falls_back_to_serum_total_co2_and_says_so():
    f = gas.henderson_hasselbalch_ph(draw(serum={"bicarbonate": 24}, gas_={"ph": 7.4, "pco2": 40}))
    assert f.extra["bicarbonate_from"] == "serum"
    assert any("serum total CO2" in r for r in f.reasons)


def test_hh_needs_measured_ph():
    f = gas.henderson_hasselbalch_ph(draw(gas_={"pco2": 40, "bicarbonate": 24}))
    assert f.status is Status.needs_input and f.value is None and f.needs == ("blood_gas.ph",)


# --- Winters ---------------------------------------------------------------------------------


@pytest.mark.parametrize(
    ("pco2", "reading"),
    [
        (26, "appropriate"),
        (24, "appropriate"),
        (28, "appropriate"),
        (32, "respiratory_acidosis_added"),
        (20, "respiratory_alkalosis_added"),
    ],
)
def test_winters_hco3_12_expects_26(pco2, reading):
    # Winters' formula 1.5 × 12 + 8 = 26 (24–28): arithmetic [D] on Albert, Dell & Winters,
    # Ann Intern Med 1967 (from memory).
    f = gas.expected_pco2(draw(serum={"bicarbonate": 12}, gas_={"ph": 7.22, "pco2": pco2}))
    assert f.value == pytest.approx(26) and (f.low, f.high) == (24, 28)
    assert f.status is Status.ok and f.interpretation == reading


@pytest.mark.parametrize(
    ("serum", "gas_", "status", "words"),
    [
        ({"bicarbonate": 24}, {"ph": 7.40, "pco2": 40}, Status.not_valid, "not low"),
        ({"bicarbonate": 18}, {"ph": 7.50, "pco2": 25}, Status.not_valid, "alkalemic"),
        ({"bicarbonate": 12}, {"pco2": 26}, Status.caution, "pH not given"),
        ({"bicarbonate": 2}, {"ph": 6.9, "pco2": 12}, Status.caution, "floor"),
    ],
)
def test_winters_outside_a_metabolic_acidosis(serum, gas_, status, words):
    f = gas.expected_pco2(draw(serum=serum, gas_=gas_))
    assert f.status is status
    assert words in f.reasons[0]


def test_winters_venous_gas_is_a_caution():
    x = draw(serum={"bicarbonate": 12}, gas_={"ph": 7.22, "pco2": 26}, sample=GasSample.venous)
    f = gas.expected_pco2(x)
    assert f.status is Status.caution and "arterial" in f.reasons[0]


def test_winters_needs_pco2():
    f = gas.expected_pco2(draw(serum={"bicarbonate": 12}, gas_={"ph": 7.2}))
    assert f.status is Status.needs_input and f.needs == ("blood_gas.pco2",)


# --- Metabolic alkalosis ---------------------------------------------------------------------


def test_metabolic_alkalosis_rule():
    # ΔPaCO2 = 0.7 × ΔHCO3 (Berend, de Vries & Gans, NEJM 2014): HCO3 34 → 40 + 7 = 47.
    f = gas.expected_pco2_metabolic_alkalosis(
        draw(serum={"bicarbonate": 34}, gas_={"ph": 7.48, "pco2": 47})
    )
    assert f.value == pytest.approx(47)
    assert (f.status, f.interpretation) == (Status.ok, "appropriate")
    low = gas.expected_pco2_metabolic_alkalosis(
        draw(serum={"bicarbonate": 20}, gas_={"ph": 7.30, "pco2": 40})
    )
    assert low.status is Status.not_valid and "not high" in low.reasons[0]


def test_metabolic_alkalosis_ceiling_is_a_caution():
    # Common practice: pCO2 rarely rises above about 55 in compensation.
    f = gas.expected_pco2_metabolic_alkalosis(
        draw(serum={"bicarbonate": 50}, gas_={"ph": 7.55, "pco2": 58})
    )
    assert f.value == pytest.approx(58.2)
    assert f.status is Status.caution and "ceiling" in f.reasons[0]


# --- Respiratory rules -----------------------------------------------------------------------


def test_brandis_example_acute_versus_chronic():
    # Brandis, Acid-Base Physiology: PaCO2 60, HCO3 31. Acute: expected 26 → an additional
    # metabolic alkalosis; chronic: expected 32 (4-for-10) → appropriate. Here the chronic rule
    # uses 0.35 (Narins & Emmett 1980) → 31 ± 2, a band that holds Brandis' 32.
    x = draw(serum={"bicarbonate": 31}, gas_={"ph": 7.34, "pco2": 60})
    acute = gas.expected_bicarbonate_respiratory_acidosis_acute(x)
    chronic = gas.expected_bicarbonate_respiratory_acidosis_chronic(x)
    assert acute.value == pytest.approx(26)
    assert (acute.status, acute.interpretation) == (Status.ok, "metabolic_alkalosis_added")
    assert chronic.value == pytest.approx(31)
    assert chronic.low <= 32 <= chronic.high
    assert (chronic.status, chronic.interpretation) == (Status.ok, "appropriate")


@pytest.mark.parametrize(
    ("calc", "pco2", "expected", "low", "high"),
    [
        # 2-for-10 acute, 4–5-for-10 chronic respiratory alkalosis (Brandis; Narins & Emmett 1980)
        (gas.expected_bicarbonate_respiratory_alkalosis_acute, 30, 22.0, 20.0, 24.0),
        (gas.expected_bicarbonate_respiratory_alkalosis_chronic, 30, 19.5, 17.0, 22.0),
    ],
)
def test_respiratory_alkalosis_rules(calc, pco2, expected, low, high):
    f = calc(draw(serum={"bicarbonate": 20}, gas_={"ph": 7.50, "pco2": pco2}))
    assert f.value == pytest.approx(expected)
    assert (f.low, f.high) == (pytest.approx(low), pytest.approx(high))
    assert f.status is Status.ok and f.interpretation == "appropriate"


@pytest.mark.parametrize(
    ("calc", "gas_", "words"),
    [
        (gas.expected_bicarbonate_respiratory_acidosis_acute, {"ph": 7.3, "pco2": 40}, "not high"),
        (
            gas.expected_bicarbonate_respiratory_acidosis_chronic,
            {"ph": 7.5, "pco2": 60},
            "alkalemic",
        ),
        (gas.expected_bicarbonate_respiratory_alkalosis_acute, {"ph": 7.4, "pco2": 40}, "not low"),
        (
            gas.expected_bicarbonate_respiratory_alkalosis_chronic,
            {"ph": 7.3, "pco2": 30},
            "acidemic",
        ),
    ],
)
def test_respiratory_rules_outside_their_primary_state(calc, gas_, words):
    f = calc(draw(serum={"bicarbonate": 24}, gas_=gas_))
    assert f.status is Status.not_valid and words in f.reasons[0]


def test_acute_respiratory_acidosis_limit_is_a_caution():
    # Common practice: acute respiratory acidosis rarely takes HCO3 above 30–32.
    f = gas.expected_bicarbonate_respiratory_acidosis_acute(
        draw(serum={"bicarbonate": 33}, gas_={"ph": 7.0, "pco2": 130})
    )
    assert f.value == pytest.approx(33)
    assert f.status is Status.caution and "usual limit" in f.reasons[0]
