"""Renal acid excretion: urine pH, urine anion and osmolal gaps, urine ammonium and NH4/creatinine.

Published group means are used as sign and band checks, named beside each; every validity
condition is shown flipping the status.
"""

from __future__ import annotations

import pytest

from workup.context import Flag
from workup.findings import Status
from workup.indices import ammonium, urine_acid
from workup.inputs import DrawInputs
from workup.model import LoadingTest

# An invented normal-gap acidosis: AG 136 − (112 + 14) = 10, albumin normal, acidemic.
NAGMA = {"sodium": 136, "chloride": 112, "bicarbonate": 14, "albumin": 40, "glucose": 5}
ACIDEMIC = {"ph": 7.28, "pco2": 29}


def draw(urine, serum=None, **kw) -> DrawInputs:
    return DrawInputs(serum=NAGMA if serum is None else serum, gas=ACIDEMIC, urine=urine, **kw)


def uag_urine(uag: float, **more) -> dict[str, float]:
    """A urine with Na 50, K 20 and the chloride that gives ``uag``."""
    return {"sodium": 50, "potassium": 20, "chloride": 70 - uag, "ph": 5.5, **more}


# --- Urine anion gap ---------------------------------------------------------------------------


@pytest.mark.parametrize(
    ("uag", "reading"),
    [
        (-27, "negative"),  # Batlle et al., NEJM 1988: normals after NH4Cl −27 ± 9.8
        (-20, "negative"),  # Batlle 1988: diarrhea −20 ± 5.7
        (23, "positive"),  # Batlle 1988: classic distal RTA +23 ± 4.1
        (30, "positive"),  # Batlle 1988: hyperkalemic distal RTA +30 ± 4.2
        (39, "positive"),  # Batlle 1988: selective aldosterone deficiency +39 ± 4.2
        (-16.2, "negative"),  # Kim et al., AJKD 1996: NH4Cl-loaded controls −16.2 ± 5.5
        (36.7, "positive"),  # Kim 1996: distal RTA +36.7 ± 7.7
        (24.7, "positive"),  # Kim 1996: chronic renal failure +24.7 ± 2.2
        (0, "indeterminate"),  # between the common-practice cut-offs of −10 and +10
    ],
)
def test_uag_sign_against_published_group_means(uag, reading):
    f = urine_acid.urine_anion_gap(draw(uag_urine(uag)))
    assert f.value == pytest.approx(uag)
    assert (f.status, f.interpretation) == (Status.ok, reading)


@pytest.mark.parametrize(
    ("uag", "change", "status", "words"),
    [
        # Low distal Na delivery: a positive gap is unreadable, a negative one still informative.
        (25, {"sodium": 15, "chloride": 10}, Status.not_valid, "urine sodium 15"),
        (-25, {"sodium": 15, "chloride": 60}, Status.caution, "urine sodium 15"),
        # Bicarbonaturia (Berend et al., Kidney Dis 2017: urine pH above 6.5).
        (25, {"ph": 7.2}, Status.not_valid, "bicarbonate is an unmeasured"),
        (25, {"ph": 6.8}, Status.caution, "some urine bicarbonate"),
        (-25, {"ph": 7.2}, Status.caution, "bicarbonate is an unmeasured"),
        # Ketoanions on the dipstick.
        (25, {"ketones": 2}, Status.not_valid, "ketoanions"),
        (-25, {"ketones": 2}, Status.caution, "ketoanions"),
    ],
)
def test_uag_validity_conditions(uag, change, status, words):
    u = uag_urine(uag)
    u.update(change)
    f = urine_acid.urine_anion_gap(draw(u))
    assert f.status is status
    assert words in f.reasons[0]


@pytest.mark.parametrize(
    ("flag", "status", "words"),
    [
        (Flag.ketoacidosis, Status.not_valid, "ketoanions"),
        (Flag.toluene, Status.not_valid, "hippurate"),
        (Flag.lithium, Status.caution, "lithium"),
    ],
)
def test_uag_context_flags(flag, status, words):
    f = urine_acid.urine_anion_gap(draw(uag_urine(25), context=frozenset({flag})))
    assert f.status is status and words in f.reasons[0]


@pytest.mark.parametrize(("uag", "status"), [(25, Status.caution), (-25, Status.ok)])
def test_uag_without_a_urine_ph_cannot_rule_out_bicarbonaturia(uag, status):
    # Above urine pH 6.5 bicarbonate is an unmeasured anion that makes the gap positive (Berend
    # et al., Kidney Dis 2017): without the pH a positive gap cannot be read as plainly valid; a
    # negative one is not made negative by bicarbonate, so it stands.
    u = uag_urine(uag)
    del u["ph"]
    f = urine_acid.urine_anion_gap(draw(u))
    assert f.status is status
    assert ("urine pH not given" in " ".join(f.reasons)) is (status is Status.caution)


def test_uag_during_bicarbonate_loading_is_not_valid():
    f = urine_acid.urine_anion_gap(draw(uag_urine(-25), during=LoadingTest.bicarbonate_loading))
    assert f.status is Status.not_valid and "bicarbonate loading" in f.reasons[0]


def test_uag_with_a_high_serum_gap_is_not_valid_when_positive():
    high_gap = {**NAGMA, "chloride": 100}  # AG 22: unmeasured anions
    f = urine_acid.urine_anion_gap(draw(uag_urine(25), serum=high_gap))
    assert f.status is Status.not_valid and "unmeasured anions" in f.reasons[0]
    neg = urine_acid.urine_anion_gap(draw(uag_urine(-25), serum=high_gap))
    assert neg.status is Status.caution


def test_uag_outside_a_normal_gap_acidosis_is_a_caution():
    normal = {"sodium": 140, "chloride": 104, "bicarbonate": 25, "albumin": 40}
    f = urine_acid.urine_anion_gap(draw(uag_urine(25), serum=normal))
    assert f.status is Status.caution and "not low" in f.reasons[0]
    no_serum = urine_acid.urine_anion_gap(DrawInputs(urine=uag_urine(25)))
    assert no_serum.status is Status.caution


def test_uag_prefers_a_measured_ammonium():
    f = urine_acid.urine_anion_gap(draw(uag_urine(25, ammonium=20)))
    assert f.status is Status.caution and "measured urine ammonium" in f.reasons[0]


def test_uag_needs_chloride():
    f = urine_acid.urine_anion_gap(draw({"sodium": 50, "potassium": 20}))
    assert f.status is Status.needs_input and f.needs == ("urine.chloride",)


# --- Urine osmolal gap and ammonium -----------------------------------------------------------


def uog_urine(gap: float, **more) -> dict[str, float]:
    """A urine whose calculated osmolality is 2 × (50 + 30) + 200 + 0 = 360."""
    return {"sodium": 50, "potassium": 30, "urea": 200, "glucose": 0, "osmolality": 360 + gap,
            **more}  # fmt: skip


@pytest.mark.parametrize(
    ("gap", "reading"),
    [
        (319.7, "adequate"),  # Kim et al., AJKD 1996: NH4Cl-loaded controls 319.7 ± 58.4
        (129.7, "indeterminate"),  # Kim 1996: distal RTA 129.7 ± 17.0 (between 100 and 150)
        (80, "low"),  # Kamel et al., AJKD 1997: < 100 in acidosis = low ammonium
        (220, "adequate"),  # Berend et al., Kidney Dis 2017, Table 1: diarrhea > 200
    ],
)
def test_uog_readings(gap, reading):
    f = urine_acid.urine_osmolal_gap(draw(uog_urine(gap)))
    assert f.value == pytest.approx(gap)
    assert (f.status, f.interpretation) == (Status.ok, reading)


def test_kim_distal_rta_uog_range_never_reads_adequate():
    # Kim 1996: distal RTA 129.7 ± 17.0 — the whole mean ± SD range must not read "adequate".
    for gap in (112.7, 129.7, 146.7):
        assert urine_acid.urine_osmolal_gap(draw(uog_urine(gap))).interpretation != "adequate"


@pytest.mark.parametrize(
    ("gap", "flag", "status"),
    [
        (250, Flag.unmeasured_urine_osmoles, Status.not_valid),
        (50, Flag.unmeasured_urine_osmoles, Status.caution),
        (250, Flag.urease_infection, Status.not_valid),
        (50, Flag.urease_infection, Status.caution),
    ],
)
def test_uog_confounders(gap, flag, status):
    f = urine_acid.urine_osmolal_gap(draw(uog_urine(gap), context=frozenset({flag})))
    assert f.status is status


def test_uog_missing_urine_glucose_states_the_assumption():
    u = uog_urine(250)
    del u["glucose"]
    with_normal_plasma = urine_acid.urine_osmolal_gap(draw(u))
    assert with_normal_plasma.status is Status.ok
    assert any("taken as zero" in r for r in with_normal_plasma.reasons)
    high_plasma = urine_acid.urine_osmolal_gap(draw(u, serum={**NAGMA, "glucose": 20}))
    assert high_plasma.status is Status.caution and "glucose" in high_plasma.reasons[0]


def test_ammonium_estimate_is_half_the_uog_and_a_measured_value_wins():
    # NH4 ≈ UOG / 2 (Kamel et al., AJKD 1997).
    est = ammonium.urine_ammonium_estimate(draw(uog_urine(200)))
    assert est.value == pytest.approx(100) and est.extra["measured"] is False
    assert est.status is Status.caution and est.interpretation == "adequate"
    meas = ammonium.urine_ammonium_estimate(draw(uog_urine(200, ammonium=30)))
    assert meas.value == pytest.approx(30) and meas.extra["measured"] is True
    assert (meas.status, meas.interpretation) == (Status.ok, "low")


@pytest.mark.parametrize(
    ("nh4", "reading"),
    [(20, "low"), (40, "indeterminate"), (120, "adequate")],
)
def test_ammonium_creatinine_ratio(nh4, reading):
    # Urine creatinine 10 000 µmol/L = 10 mmol/L; cut-offs 3 and 10 (derived, common practice).
    f = ammonium.urine_ammonium_creatinine_ratio(draw({"ammonium": nh4, "creatinine": 10000}))
    assert f.value == pytest.approx(nh4 / 10)
    assert (f.status, f.interpretation) == (Status.ok, reading)


def test_ammonium_creatinine_needs_creatinine_or_ammonium_inputs():
    f = ammonium.urine_ammonium_creatinine_ratio(draw({"ammonium": 20}))
    assert f.status is Status.needs_input and f.needs == ("urine.creatinine",)
    g = ammonium.urine_ammonium_creatinine_ratio(draw({"creatinine": 10000}))
    assert g.status is Status.needs_input and "urine.ammonium" in g.needs


# --- Urine pH ---------------------------------------------------------------------------------


@pytest.mark.parametrize(
    ("ph", "reading"), [(5.0, "acidified"), (5.5, "acidified (borderline)"), (6.2, "not_acidified")]
)
def test_urine_ph_against_5_5_during_acidosis(ph, reading):
    # Berend et al., Kidney Dis 2017; Rodríguez Soriano, JASN 2002: > 5.5 in acidosis = defect.
    f = urine_acid.urine_ph(draw({"ph": ph, "sodium": 50}))
    assert (f.status, f.interpretation) == (Status.ok, reading)


@pytest.mark.parametrize(
    ("urine", "kw", "status", "words"),
    [
        ({"ph": 7.0}, {"context": frozenset({Flag.urease_infection})}, Status.not_valid, "urease"),
        ({"ph": 7.8}, {"during": LoadingTest.bicarbonate_loading}, Status.not_valid, "loading"),
        ({"ph": 6.2, "sodium": 10}, {}, Status.caution, "urine sodium 10"),
        # Batlle 1988: diarrhea with high NH4 can hold urine pH above 5.5 (5.64 ± 0.14).
        ({"ph": 5.64}, {"context": frozenset({Flag.diarrhea})}, Status.caution, "diarrhea"),
    ],
)
def test_urine_ph_confounders(urine, kw, status, words):
    f = urine_acid.urine_ph(draw(urine, **kw))
    assert f.status is status and words in f.reasons[0]


def test_urine_ph_outside_acidosis_is_a_caution():
    f = urine_acid.urine_ph(DrawInputs(serum={"bicarbonate": 25}, urine={"ph": 6.5}))
    assert f.status is Status.caution and "not low" in f.reasons[0]


def test_urine_ph_during_furosemide_test_reads_against_5_3():
    # From memory: Walsh et al., Kidney Int 2007: normal if any sample < 5.3.
    x = DrawInputs(urine={"ph": 5.4}, during=LoadingTest.furosemide_fludrocortisone)
    f = urine_acid.urine_ph(x)
    assert (f.status, f.interpretation) == (Status.ok, "not_acidified")
    y = DrawInputs(urine={"ph": 5.2}, during=LoadingTest.furosemide_fludrocortisone)
    assert urine_acid.urine_ph(y).interpretation == "acidified"


def test_urine_ph_above_5_5_with_a_negative_uag_is_a_caution():
    # Batlle et al., NEJM 1988: diarrhea, urine pH 5.64 ± 0.14 with UAG −20 ± 5.7: ample ammonium
    # raises urine pH, so the high pH is no sign of distal RTA even without a diarrhea flag.
    f = urine_acid.urine_ph(draw({"ph": 5.64, "sodium": 50, "potassium": 20, "chloride": 90}))
    assert f.status is Status.caution and "ammonium" in f.reasons[0]
    positive = urine_acid.urine_ph(
        draw({"ph": 5.64, "sodium": 50, "potassium": 20, "chloride": 40})
    )
    assert positive.status is Status.ok
