"""Every conversion factor of the analyte catalogue against an independent molar-mass library.

The outside reference is ``molmass`` (IUPAC standard atomic weights); pressure is checked against
the definition of the standard atmosphere (101.325 kPa = 760 mmHg). Also tests how
``workup.quantity`` reads written values.
"""

from __future__ import annotations

import pytest
from molmass import Formula

from workup.analytes import MMHG_PER_KPA, MOLAR_MASS, UnitSystem, all_analytes, analyte
from workup.inputs import UREA_MMOL_PER_BUN_MG_DL
from workup.quantity import ValueProblem, read_value

FORMULA = {
    "glucose": "C6H12O6",
    "urea": "CH4N2O",
    "urea_nitrogen": "N2",
    "creatinine": "C4H7N3O",
    "phosphorus": "P",
    "calcium": "Ca",
    "uric_acid": "C5H4N4O3",
    "ethanol": "C2H6O",
    "lactate": "C3H5O3",
    "citrate": "C6H5O7",
    "beta_hydroxybutyrate": "C4H7O3",
}

# analyte key → the MOLAR_MASS entry its mg/dL factor rests on
MASS_OF = {
    "glucose": "glucose",
    "urea": "urea",
    "creatinine": "creatinine",
    "phosphate": "phosphorus",
    "calcium": "calcium",
    "uric_acid": "uric_acid",
    "ethanol": "ethanol",
    "lactate": "lactate",
    "citrate": "citrate",
    "beta_hydroxybutyrate": "beta_hydroxybutyrate",
}


@pytest.mark.parametrize("name", sorted(MOLAR_MASS))
def test_molar_mass_matches_molmass(name):
    assert name in FORMULA, f"add the formula of {name} to this test"
    assert MOLAR_MASS[name] == pytest.approx(Formula(FORMULA[name]).mass, rel=2e-4)


def _mg_dl_units():
    for a in all_analytes():
        for u in a.units:
            if u.symbol == "mg/dL" and a.key in MASS_OF:
                yield pytest.param(a, u, id=a.label)


@pytest.mark.parametrize(("a", "unit"), list(_mg_dl_units()))
def test_mg_dl_factor_from_molmass(a, unit):
    # mg/dL × 10 = mg/L; ÷ g/mol = mmol/L (× 1000 for a µmol/L canonical unit).
    mass = Formula(FORMULA[MASS_OF[a.key]]).mass
    expected = 10.0 / mass * (1000.0 if a.canonical == "umol/L" else 1.0)
    assert unit.factor == pytest.approx(expected, rel=2e-4)


def test_every_mass_unit_is_covered():
    # Every mg/dL unit not of a urea-nitrogen analyte rests on a formula checked above.
    for a in all_analytes():
        if any(u.symbol == "mg/dL" for u in a.units) and a.key != "urea_nitrogen":
            assert a.key in MASS_OF, a.label


@pytest.mark.parametrize(
    ("key", "mg_dl", "canonical"),
    [
        ("creatinine", 1.0, 88.4),  # 10 000 / 113.12 g/mol (IUPAC atomic weights) = 88.4
        ("uric_acid", 1.0, 59.48),  # × 59.48
        ("glucose", 18.0, 1.0),  # ÷ 18
        ("phosphate", 1.0, 0.3229),  # × 0.3229
        ("calcium", 1.0, 0.2495),  # × 0.2495
        ("ethanol", 1.0, 0.217),  # × 0.217
        ("urea", 1.0, 0.1665),  # urea as urea × 0.1665
    ],
)
def test_factors_match_the_published_table(key, mg_dl, canonical):
    factor = analyte("serum", key).unit("mg/dL").factor
    assert mg_dl * factor == pytest.approx(canonical, rel=2e-3)


def test_bun_to_urea_uses_two_nitrogens_per_urea():
    # 1 mol urea (CH4N2O) carries 2 N: BUN mg/dL × 10 / (2 × 14.007) = mmol/L urea (≈ ÷ 2.8),
    # not × 0.714 (mmol/L of N atoms), the common trap.
    two_n = 2 * Formula("N").mass
    factor = UREA_MMOL_PER_BUN_MG_DL
    assert factor == pytest.approx(10.0 / two_n, rel=2e-4)
    assert factor == pytest.approx(1 / 2.8, rel=2e-3)
    assert Formula("CH4N2O").composition()["N"].count == 2


def test_kpa_to_mmhg():
    # 101.325 kPa = 760 mmHg (standard atmosphere).
    factor = MMHG_PER_KPA
    assert factor == pytest.approx(760 / 101.325, rel=1e-5)
    assert analyte("blood_gas", "pco2").unit("kPa").factor == MMHG_PER_KPA


def test_other_fixed_factors():
    assert analyte("serum", "albumin").unit("g/dL").factor == 10.0
    assert analyte("serum", "calcium").unit("mEq/L").factor == 0.5  # Ca is divalent
    assert analyte("serum", "creatinine").unit("mmol/L").factor == 1000.0


# --- Reading written values -------------------------------------------------------------------


def test_reads_a_value_with_its_unit():
    m = read_value(analyte("serum", "creatinine"), "1.1 mg/dL", None)
    assert m.unit == "mg/dL" and m.value == 1.1
    assert m.canonical == pytest.approx(1.1 * 10 / Formula("C4H7N3O").mass * 1000, rel=2e-4)
    kpa = read_value(analyte("blood_gas", "pco2"), "3.9 kPa", None)
    assert kpa.canonical == pytest.approx(3.9 * 760 / 101.325, rel=1e-4)


def test_bare_number_of_an_ambiguous_analyte_needs_units():
    a = analyte("serum", "creatinine")
    with pytest.raises(ValueProblem, match="ambiguous"):
        read_value(a, 1.1, None)
    assert read_value(a, 97, UnitSystem.si).canonical == 97
    assert read_value(a, 1.1, UnitSystem.conventional).canonical == pytest.approx(97.2, abs=0.1)


def test_bare_number_of_an_unambiguous_analyte_is_read_in_its_unit():
    m = read_value(analyte("serum", "sodium"), 140, None)
    assert (m.canonical, m.bare) == (140, True)


@pytest.mark.parametrize(
    ("key", "raw", "words"),
    [
        ("sodium", "1380", "not a possible"),  # typo for 138: outside the hard limit
        ("sodium", "13,8", "comma"),
        ("sodium", "140 furlongs", "unknown unit"),
        ("sodium", True, "expected a number"),
        ("sodium", None, "expected a number"),
        ("sodium", "nan", "cannot read"),
        ("sodium", float("inf"), "finite"),
        ("creatinine", "50 mg/dL", "not a possible"),  # 4420 µmol/L > 3000
    ],
)
def test_refused_values(key, raw, words):
    with pytest.raises(ValueProblem, match=words):
        read_value(analyte("serum", key), raw, UnitSystem.si)


def test_urea_nitrogen_has_no_si_unit():
    with pytest.raises(ValueProblem, match="urea"):
        read_value(analyte("serum", "urea_nitrogen"), 5, UnitSystem.si)


def test_dipstick_words():
    a = analyte("urine", "ketones")
    assert read_value(a, "2+", None).canonical == 2
    assert read_value(a, "neg", None).word == "negative"
    with pytest.raises(ValueProblem, match="dipstick"):
        read_value(a, "lots", None)
