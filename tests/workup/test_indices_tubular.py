"""Tubular tests: FEHCO3, urine-minus-blood pCO2, FEPO4, TmP/GFR and FE urate."""

from __future__ import annotations

import pytest

from workup.findings import Status
from workup.indices import tubular
from workup.inputs import DrawInputs
from workup.model import GasSample, LoadingTest, Sex

LOADING = LoadingTest.bicarbonate_loading


def loaded(fe: float, plasma_hco3: float = 22, during=LOADING) -> DrawInputs:
    """Plasma creatinine 80, urine creatinine 8000 µmol/L, urine HCO3 set to give ``fe`` %."""
    uhco3 = fe * plasma_hco3 * 8000 / (100 * 80)
    return DrawInputs(
        serum={"bicarbonate": plasma_hco3, "creatinine": 80},
        urine={"bicarbonate": uhco3, "creatinine": 8000},
        during=during,
    )


@pytest.mark.parametrize(
    ("fe", "reading"),
    [
        (2.0, "low"),  # Rodríguez Soriano, JASN 2002, Table 5: normal < 3%
        (4.0, "low"),  # ASH (Blood) distal RTA example: FEHCO3 4% → classic distal
        (8.0, "intermediate"),  # Rodríguez Soriano 2002: type 4 5–10%
        (20.0, "high"),  # Rodríguez Soriano 2002: proximal > 10–15%
    ],
)
def test_fehco3_bands(fe, reading):
    f = tubular.fe_bicarbonate(loaded(fe))
    assert f.value == pytest.approx(fe)
    assert (f.status, f.interpretation) == (Status.ok, reading)


def test_fehco3_not_valid_outside_loading_or_before_plasma_rises():
    off = tubular.fe_bicarbonate(loaded(20.0, during=None))
    assert off.status is Status.not_valid and "not a bicarbonate-loading draw" in off.reasons[0]
    # Rodríguez Soriano 2002: plasma HCO3 must reach 20–22 first.
    early = tubular.fe_bicarbonate(loaded(20.0, plasma_hco3=17))
    assert early.status is Status.not_valid and "below 20" in early.reasons[0]


def ub(urine_pco2: float, urine_ph: float = 7.8, **kw) -> DrawInputs:
    return DrawInputs(
        gas={"pco2": 40},
        urine={"pco2": urine_pco2, "ph": urine_ph, "bicarbonate": 120},
        during=kw.pop("during", LOADING),
        **kw,
    )


def test_ub_pco2_ash_distal_example():
    # ASH (Blood) distal RTA example: U–B pCO2 15.8 mmHg → classic distal RTA (< 20,
    # Rodríguez Soriano 2002).
    f = tubular.urine_blood_pco2(ub(55.8))
    assert f.value == pytest.approx(15.8)
    assert (f.status, f.interpretation) == (Status.ok, "low")
    normal = tubular.urine_blood_pco2(ub(70))
    assert (normal.status, normal.interpretation) == (Status.ok, "normal")


@pytest.mark.parametrize(
    ("x", "status", "words"),
    [
        (ub(70, urine_ph=7.3), Status.not_valid, "below 7.6"),
        (ub(70, during=None), Status.caution, "not marked"),
        (ub(70, sample=GasSample.venous), Status.caution, "venous"),
    ],
)
def test_ub_pco2_validity(x, status, words):
    f = tubular.urine_blood_pco2(x)
    assert f.status is status and words in f.reasons[0]


def test_ub_pco2_low_urine_bicarbonate_is_a_caution():
    # From memory: urine HCO3 should exceed about 80 mmol/L.
    x = DrawInputs(
        gas={"pco2": 40}, urine={"pco2": 55, "ph": 7.7, "bicarbonate": 60}, during=LOADING
    )
    f = tubular.urine_blood_pco2(x)
    assert f.status is Status.caution and "urine bicarbonate 60" in f.reasons[0]


def test_ub_pco2_needs_urine_ph():
    f = tubular.urine_blood_pco2(DrawInputs(gas={"pco2": 40}, urine={"pco2": 60}))
    assert f.status is Status.needs_input and f.needs == ("urine.ph",)


def phos(uphos: float, pphos: float = 0.6, **kw) -> DrawInputs:
    return DrawInputs(
        serum={"phosphate": pphos, "creatinine": 100},
        urine={"phosphate": uphos, "creatinine": 10000},
        **kw,
    )


def test_fepo4_and_tmp_gfr_low_trp_branch():
    # FE = 100 × 20 × 100 / (0.6 × 10000) = 33.3%; TRP 0.667 ≤ 0.86 → TmP/GFR = TRP × P = 0.40
    # (algebraic form, Payne, Ann Clin Biochem 1998, from memory).
    fe = tubular.fe_phosphate(phos(20))
    assert fe.value == pytest.approx(33.33, abs=0.01)
    assert (fe.status, fe.interpretation) == (Status.ok, "wasting")
    assert fe.extra["trp"] == pytest.approx(0.6667, abs=1e-4)
    tmp = tubular.tmp_gfr(phos(20))
    assert tmp.value == pytest.approx(0.40, abs=0.001) and tmp.interpretation == "low"


def test_tmp_gfr_high_trp_branch():
    # FE 5% → TRP 0.95 > 0.86 → 0.3 × 0.95 / (1 − 0.8 × 0.95) × 1.0 = 1.1875 (Payne 1998, from
    # memory).
    tmp = tubular.tmp_gfr(phos(5, pphos=1.0))
    assert tmp.value == pytest.approx(1.1875, abs=1e-4) and tmp.interpretation == "normal"
    fe = tubular.fe_phosphate(phos(5, pphos=1.0))
    assert fe.interpretation == "normal"
    assert fe.status is Status.caution and "not low" in fe.reasons[0]


def test_fepo4_in_advanced_ckd_is_a_caution():
    # FE = 100 × 5 × 400 / (0.6 × 10000) = 33%; creatinine 400 µmol/L at 60 gives eGFR < 30.
    x = DrawInputs(
        serum={"phosphate": 0.6, "creatinine": 400},
        urine={"phosphate": 5, "creatinine": 10000},
        age=60,
        sex=Sex.male,
    )
    f = tubular.fe_phosphate(x)
    assert f.status is Status.caution and "eGFR" in f.reasons[0]


def test_fe_urate():
    # FE urate = 100 × 2000 × 100 / (100 × 10000) = 20%: high (common practice > 10–15%).
    x = DrawInputs(
        serum={"uric_acid": 100, "creatinine": 100}, urine={"uric_acid": 2000, "creatinine": 10000}
    )
    f = tubular.fe_urate(x)
    assert f.value == pytest.approx(20.0)
    assert (f.status, f.interpretation) == (Status.ok, "high")
    normal_plasma = DrawInputs(
        serum={"uric_acid": 300, "creatinine": 100}, urine={"uric_acid": 6000, "creatinine": 10000}
    )
    g = tubular.fe_urate(normal_plasma)
    assert g.status is Status.caution and "not low" in g.reasons[0]
