"""eGFR (CKD-EPI 2021, Inker et al., NEJM 2021) against values computed by hand from the equation."""

from __future__ import annotations

import pytest

from workup.analytes import analyte
from workup.findings import Status
from workup.indices import kidney
from workup.inputs import DrawInputs
from workup.model import Sex

MG_DL = analyte("serum", "creatinine").unit("mg/dL").factor


@pytest.mark.parametrize(
    ("scr", "age", "sex", "expected"),
    [
        # Computed by hand from the published equation (Inker et al., NEJM 2021):
        # 142 × 1 × 1 × 0.9938^50 × 1.012 = 105.3
        (0.7, 50, Sex.female, 105.3),
        # 142 × (1.0/0.7)^−1.200 × 0.9938^50 × 1.012 = 68.6
        (1.0, 50, Sex.female, 68.6),
        # 142 × (0.5/0.7)^−0.241 × 0.9938^40 × 1.012 = 121.5
        (0.5, 40, Sex.female, 121.5),
        # 142 × 0.9938^60 = 97.8
        (0.9, 60, Sex.male, 97.8),
        # 142 × (1.5/0.9)^−1.200 × 0.9938^60 = 53.0
        (1.5, 60, Sex.male, 53.0),
        # 142 × (0.6/0.9)^−0.302 × 0.9938^30 = 133.2
        (0.6, 30, Sex.male, 133.2),
    ],
)
def test_ckd_epi_2021_hand_values(scr, age, sex, expected):
    assert kidney.ckd_epi_2021(scr, age, sex) == pytest.approx(expected, abs=0.1)
    f = kidney.egfr(DrawInputs(serum={"creatinine": scr * MG_DL}, age=age, sex=sex))
    assert f.value == pytest.approx(expected, abs=0.1) and f.status is Status.ok


@pytest.mark.parametrize(
    ("value", "cat"),
    [(95, "G1"), (90, "G1"), (75, "G2"), (50, "G3a"), (35, "G3b"), (20, "G4"), (10, "G5")],
)
def test_kdigo_categories(value, cat):
    # KDIGO 2012 GFR categories.
    assert kidney.category(value) == cat


def test_egfr_needs_age_and_sex():
    f = kidney.egfr(DrawInputs(serum={"creatinine": 80}))
    assert f.status is Status.needs_input and set(f.needs) == {"patient.age", "patient.sex"}


def test_egfr_not_valid_in_children_and_states_steady_state():
    f = kidney.egfr(DrawInputs(serum={"creatinine": 50}, age=12, sex=Sex.male))
    assert f.status is Status.not_valid and "adults" in f.reasons[0]
    adult = kidney.egfr(DrawInputs(serum={"creatinine": 80}, age=40, sex=Sex.male))
    assert any("acute kidney injury" in r for r in adult.reasons)


def test_egfr_not_valid_when_acute_kidney_injury_is_flagged() -> None:
    # Common practice: creatinine-based equations assume a steady state (Inker et al., NEJM 2021).
    from workup.context import Flag
    from workup.indices.kidney import egfr
    from workup.inputs import DrawInputs
    from workup.model import Sex

    base = DrawInputs(serum={"creatinine": 150.0}, age=60, sex=Sex.male)
    assert egfr(base).status.value != "not_valid"
    flagged = DrawInputs(
        serum={"creatinine": 150.0},
        age=60,
        sex=Sex.male,
        context=frozenset({Flag.acute_kidney_injury}),
    )
    f = egfr(flagged)
    assert f.status.value == "not_valid" and "steady state" in f.reasons[0]
