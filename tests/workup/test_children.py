"""Children: patient height, the bedside Schwartz eGFR and CKD-EPI 2021 not valid under 18.

The demo case cases/child-drta.yaml is an invented scenario (a six-year-old with a classic distal
RTA picture). Hand values below are computed from the published equations, not by the code.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from workup.assess import assess
from workup.caseio import CaseFileError, case_from_data, case_to_data, load_case
from workup.findings import Status
from workup.indices import compute_all, kidney
from workup.inputs import DrawInputs, inputs_for
from workup.model import Sex
from workup.note import draft_note
from workup.rules.readings import gather
from workup.settings import DEFAULTS

ROOT = Path(__file__).resolve().parents[2]
CHILD = ROOT / "cases" / "child-drta.yaml"


def _findings(case):
    return compute_all(inputs_for(case, case.latest_draw()))


def test_demo_child_schwartz_egfr_matches_the_formula_by_hand():
    f = _findings(load_case(CHILD))["egfr_schwartz"]
    # Bedside Schwartz (Schwartz et al., JASN 2009): eGFR = 0.413 × height (cm) / Scr (mg/dL).
    # Height 110 cm; creatinine 35 µmol/L ÷ 88.4 = 0.3959 mg/dL (10 000 / 113.12 g/mol,
    # IUPAC atomic weights);
    # 0.413 × 110 × 88.4 / 35 = 4016.01 / 35 = 114.74 mL/min/1.73 m2, KDIGO 2012 category G1.
    assert f.value == pytest.approx(114.74, abs=0.01)
    assert f.status is Status.ok and f.interpretation == "G1"
    assert f.extra["height_cm"] == 110


def test_demo_child_ckd_epi_is_not_valid_with_the_reason():
    f = _findings(load_case(CHILD))["egfr"]
    # CKD-EPI 2021 was developed in adults (Inker et al., NEJM 2021): not valid at age 6.
    assert f.status is Status.not_valid
    assert "age 6" in f.reasons[0] and "adults" in f.reasons[0] and "Schwartz" in f.reasons[0]


def test_child_without_height_needs_patient_height():
    data = case_to_data(load_case(CHILD))
    del data["patient"]["height"]
    case = case_from_data(data)
    f = _findings(case)["egfr_schwartz"]
    assert f.status is Status.needs_input and f.value is None
    assert f.needs == ("patient.height",)
    assert "patient.height" in f.reasons[0]


@pytest.mark.parametrize(
    ("height", "scr_mg_dl", "expected"),
    [
        # Computed by hand from the bedside Schwartz equation (Schwartz et al., JASN 2009):
        (120.0, 0.5, 99.12),  # 0.413 × 120 / 0.5
        (150.0, 1.2, 51.625),  # 0.413 × 150 / 1.2
        (80.0, 2.0, 16.52),  # 0.413 × 80 / 2.0
    ],
)
def test_bedside_schwartz_hand_values(height, scr_mg_dl, expected):
    assert kidney.bedside_schwartz(height, scr_mg_dl) == pytest.approx(expected, abs=0.001)
    x = DrawInputs(serum={"creatinine": scr_mg_dl * 88.4}, age=10, height_cm=height)
    f = kidney.egfr_schwartz(x)
    assert f.value == pytest.approx(expected, abs=0.01)
    assert f.interpretation == kidney.category(expected)


def test_schwartz_needs_creatinine_age_and_height():
    f = kidney.egfr_schwartz(DrawInputs())
    assert f.status is Status.needs_input
    assert set(f.needs) == {"serum.creatinine", "patient.age", "patient.height"}


def test_schwartz_is_not_valid_in_an_adult():
    x = DrawInputs(serum={"creatinine": 80}, age=40, sex=Sex.male, height_cm=175)
    f = kidney.egfr_schwartz(x)
    # 0.413 × 175 / (80 / 88.4) = 79.86, computed but not valid: the equation is for children.
    assert f.value == pytest.approx(79.86, abs=0.01)
    assert f.status is Status.not_valid and "children" in f.reasons[0]
    assert kidney.egfr(x).status is Status.ok
    no_height = kidney.egfr_schwartz(DrawInputs(serum={"creatinine": 80}, age=40, sex=Sex.male))
    assert no_height.status is Status.needs_input and no_height.needs == ("patient.height",)
    assert "only under 18" in no_height.reasons[0] and "CKD-EPI" in no_height.reasons[0]


def test_schwartz_limits_by_age_and_steady_state():
    from workup.context import Flag

    scr = {"creatinine": 0.4 * 88.4}
    # Derived in children aged 1–16 (CKiD cohort, Schwartz et al., JASN 2009; range from memory).
    infant = kidney.egfr_schwartz(DrawInputs(serum=scr, age=0, height_cm=70))
    assert infant.status is Status.not_valid and "under 1 year" in infant.reasons[0]
    toddler = kidney.egfr_schwartz(DrawInputs(serum=scr, age=1, height_cm=80))
    # KDIGO 2012 categories are not meant for children under 2 (from memory).
    assert toddler.status is Status.caution and "under 2" in toddler.reasons[0]
    older = kidney.egfr_schwartz(DrawInputs(serum=scr, age=17, height_cm=170))
    assert older.status is Status.caution and "age 17" in older.reasons[0]
    aki = kidney.egfr_schwartz(
        DrawInputs(serum=scr, age=8, height_cm=125, context=frozenset({Flag.acute_kidney_injury}))
    )
    # Common practice: a creatinine equation assumes a steady state.
    assert aki.status is Status.not_valid and "steady state" in aki.reasons[0]
    child_ckd_epi = kidney.egfr(
        DrawInputs(serum=scr, age=8, sex=Sex.female, context=frozenset({Flag.acute_kidney_injury}))
    )
    assert "steady state" in child_ckd_epi.reasons[0]


def test_egfr_id_picks_the_equation_for_the_age():
    assert kidney.egfr_id(6) == "egfr_schwartz"
    assert kidney.egfr_id(17) == "egfr_schwartz"
    assert kidney.egfr_id(18) == "egfr"
    assert kidney.egfr_id(None) == "egfr"


def test_readings_use_the_schwartz_egfr_for_a_child():
    case = load_case(CHILD)
    a = assess(case)
    rd = gather(a.draws, case.context, DEFAULTS)
    assert rd.by_key["egfr"].index == "egfr_schwartz"
    assert rd.by_key["egfr"].value == pytest.approx(114.74, abs=0.01)
    assert "egfr" not in rd.set_aside


def test_adult_readings_and_cautions_ignore_the_schwartz_row():
    adult = load_case(ROOT / "cases" / "distal-rta-classic.yaml")
    data = case_to_data(adult)
    data["patient"]["height"] = 165
    case = case_from_data(data)
    a = assess(case)
    assert a.indices["egfr_schwartz"].status is Status.not_valid
    assert not any("Schwartz" in c for c in a.cautions)
    rd = gather(a.draws, case.context, DEFAULTS)
    assert rd.by_key["egfr"].index == "egfr"


def test_child_note_states_the_schwartz_egfr_not_ckd_epi():
    case = load_case(CHILD)
    text = draft_note(assess(case), case)
    assert "eGFR (bedside Schwartz) is 115" in text
    assert "CKD-EPI" not in text.split("Kidney function")[1].split("Causes")[0]


def test_low_child_egfr_drives_the_tubular_kidney_caution():
    # FE urate's low-eGFR caution must come from Schwartz in a child: 0.413 × 100 / 3.0 = 13.8,
    # below the default egfr_ckd_below of 30 (common practice).
    serum = {"creatinine": 3.0 * 88.4, "uric_acid": 100.0}
    urine = {"creatinine": 5000.0, "uric_acid": 1500.0}
    child = DrawInputs(serum=serum, urine=urine, age=7, sex=Sex.male, height_cm=100)
    assert kidney.egfr_estimate(child) == pytest.approx(13.77, abs=0.01)
    f = compute_all(child)["fe_urate"]
    assert any("eGFR about 14" in r for r in f.reasons)
    no_height = DrawInputs(serum=serum, urine=urine, age=7, sex=Sex.male)
    assert kidney.egfr_estimate(no_height) is None


def _with_height(value):
    return {"schema": 1, "label": "t", "patient": {"age": 6, "height": value}}


@pytest.mark.parametrize("value", [116, 116.5, "116 cm", "116cm", " 116 "])
def test_height_in_centimetres_is_read(value):
    case = case_from_data(_with_height(value))
    assert case.patient.height == pytest.approx(float(str(value).replace("cm", "")))


@pytest.mark.parametrize(
    ("value", "words"),
    [
        (1.16, "not possible"),  # metres
        (400, "not possible"),
        (10, "not possible"),
        ("46 in", "cannot read height"),
        ("tall", "cannot read height"),
        (True, "cannot read height"),
    ],
)
def test_impossible_height_is_refused_naming_the_field_and_the_fix(value, words):
    with pytest.raises(CaseFileError) as err:
        case_from_data(_with_height(value))
    text = str(err.value)
    assert "patient.height" in text and words in text and "centimetres" in text


def test_old_files_without_height_still_load():
    data = {"schema": 1, "label": "t", "patient": {"age": 40, "sex": "male"},
            "draws": [{"label": "d", "serum": {"creatinine": "80 umol/L"}}]}  # fmt: skip
    case = case_from_data(data)
    assert case.patient.height is None
    assert inputs_for(case, case.draws[0]).height_cm is None


def test_adult_cutoffs_carry_a_caution_in_a_child():
    # The TTKG and urine K/creatinine keep their adult cut-offs with a caution: the children's
    # TTKG range (Rodríguez-Soriano et al., Pediatr Nephrol 1990, from memory) describes no
    # potassium demand, and no paediatric urine K/creatinine source is named.
    child = _findings(load_case(CHILD))
    ukcr = child["urine_potassium_creatinine_ratio"]
    assert ukcr.status is Status.caution and "age 6" in ukcr.reasons[0]
    assert "age 6" in child["ttkg"].reasons[0]
    assert "Rodríguez-Soriano" in child["ttkg"].reasons[0]
    adult = _findings(load_case(ROOT / "cases" / "distal-rta-classic.yaml"))
    assert not any("adult values" in r for f in adult.values() for r in f.reasons)


def test_infant_bicarbonate_caution_keeps_a_not_valid_reason_first():
    from workup.context import Flag

    serum = {"sodium": 140.0, "chloride": 116.0, "bicarbonate": 18.0}
    urine = {"ph": 6.5, "sodium": 40.0, "potassium": 20.0, "chloride": 30.0}
    infant = compute_all(DrawInputs(serum=serum, urine=urine, age=0, height_cm=70))
    # An infant's renal bicarbonate threshold is about 22 mmol/L (Edelmann et al., J Clin Invest
    # 1967, from memory): its normal bicarbonate sits near the adult cut-off.
    assert infant["urine_ph"].status is Status.caution
    assert "infant" in infant["urine_ph"].reasons[0]
    flagged = compute_all(
        DrawInputs(serum=serum, urine=urine, age=0, context=frozenset({Flag.urease_infection}))
    )
    f = flagged["urine_ph"]
    assert f.status is Status.not_valid and "infant" not in f.reasons[0]
    assert any("infant" in r for r in f.reasons)
    older = compute_all(DrawInputs(serum=serum, urine=urine, age=5, height_cm=110))
    assert not any("infant" in r for r in older["urine_ph"].reasons)


def _child_without_height():
    data = case_to_data(load_case(CHILD))
    del data["patient"]["height"]
    return assess(case_from_data(data))


def test_a_child_without_height_is_asked_for_height_not_creatinine():
    # The bedside Schwartz eGFR needs height (Schwartz et al., JASN 2009) and CKD-EPI 2021 is
    # for adults (Inker et al., NEJM 2021): the demo child has a creatinine, so the eGFR
    # question and its next test must ask for the height.
    a = _child_without_height()
    ckd = next(c for c in a.patterns if c.id == "ckd_acidosis")
    egfr_missing = [m for m in ckd.missing if m.startswith("eGFR")]
    assert egfr_missing and "height" in egfr_missing[0] and "Schwartz" in egfr_missing[0]
    assert "age and sex" not in egfr_missing[0]
    test = next(t for t in a.next_tests if t.id == "egfr")
    assert test.text.startswith("Height") and "Schwartz" in test.text

    # An adult without creatinine is still asked for creatinine, age and sex (CKD-EPI 2021).
    data = case_to_data(load_case(CHILD))
    data["patient"] = {"age": 40, "sex": "male"}
    del data["draws"][0]["serum"]["creatinine"]
    adult = assess(case_from_data(data))
    ckd = next(c for c in adult.patterns if c.id == "ckd_acidosis")
    assert [m for m in ckd.missing if m.startswith("eGFR")] == [
        "eGFR (serum creatinine, age and sex)"
    ]
