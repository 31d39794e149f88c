"""Validity conditions not covered beside their index's worked examples: each flips a valid finding.

Every case starts from a draw on which the index is valid (status ok) and changes one thing; the
status must move, and the first reason must say why. Conditions are common practice unless the
source is named beside them.
"""

from __future__ import annotations

from dataclasses import replace

import pytest

from workup.context import Flag
from workup.findings import Status
from workup.indices import gas, serum_gaps, tubular, urine_acid
from workup.indices.kidney import creatinine_mg_dl
from workup.inputs import DrawInputs
from workup.model import LoadingTest, Sex

NAGMA = {"sodium": 136, "chloride": 112, "bicarbonate": 14, "albumin": 40, "glucose": 5}
GAS = {"ph": 7.28, "pco2": 29}
OSM = {"sodium": 140, "glucose": 5, "urea": 5, "osmolality": 320, "ethanol": 0}
UOG_URINE = {"sodium": 50, "potassium": 30, "urea": 200, "glucose": 0, "osmolality": 610}

BASES = {
    "osm": (serum_gaps.serum_osmolal_gap, DrawInputs(serum=OSM)),
    "delta": (
        serum_gaps.delta_ratio,
        DrawInputs(serum={**NAGMA, "chloride": 100}, gas=GAS),
    ),
    "winters": (
        gas.expected_pco2,
        DrawInputs(serum={"bicarbonate": 12}, gas={"ph": 7.22, "pco2": 26}),
    ),
    "uog": (urine_acid.urine_osmolal_gap, DrawInputs(serum=NAGMA, gas=GAS, urine=UOG_URINE)),
    "uph_test": (
        urine_acid.urine_ph,
        DrawInputs(urine={"ph": 5.0}, during=LoadingTest.ammonium_chloride),
    ),
    "fe_po4": (
        tubular.fe_phosphate,
        DrawInputs(
            serum={"phosphate": 0.6, "creatinine": 100},
            urine={"phosphate": 20, "creatinine": 10000},
        ),
    ),
    "fe_urate": (
        tubular.fe_urate,
        DrawInputs(
            serum={"uric_acid": 100, "creatinine": 100},
            urine={"uric_acid": 2000, "creatinine": 10000},
        ),
    ),
}


def _with(x: DrawInputs, **change) -> DrawInputs:
    for panel in ("serum", "gas", "urine"):
        if panel in change:
            change[panel] = {**getattr(x, panel), **change[panel]}
    return replace(x, **change)


@pytest.mark.parametrize(
    ("base", "change", "status", "words"),
    [
        # Serum osmolal gap (raised, 30): ketoacidosis, lactic acidosis, CKD and mannitol
        # raise the gap by themselves.
        ("osm", {"context": frozenset({Flag.ketoacidosis})}, Status.caution, "ketoacidosis"),
        ("osm", {"serum": {"lactate": 8}}, Status.caution, "lactic"),
        ("osm", {"context": frozenset({Flag.known_ckd})}, Status.caution, "kidney disease"),
        ("osm", {"context": frozenset({Flag.unmeasured_urine_osmoles})}, Status.caution, "mannitol"),
        # Delta ratio: an alkalemic pH makes the low bicarbonate likely compensation; infused
        # bicarbonate breaks the link between its fall and the gap.
        ("delta", {"gas": {"ph": 7.5, "pco2": 25}}, Status.caution, "alkalemic"),
        ("delta", {"during": LoadingTest.bicarbonate_loading}, Status.not_valid, "infused"),
        # Compensation rules assume a steady state, which an acute load has not reached.
        ("winters", {"during": LoadingTest.bicarbonate_loading}, Status.caution, "steady state"),
        ("winters", {"during": LoadingTest.ammonium_chloride}, Status.caution, "steady state"),
        # Urine osmolal gap: not an acidosis while bicarbonate is infused; no acidosis at all.
        ("uog", {"during": LoadingTest.bicarbonate_loading}, Status.not_valid, "loading"),
        ("uog", {"serum": {"bicarbonate": 26, "chloride": 100}}, Status.caution, "not low"),
        # NH4Cl loading is contraindicated in liver disease.
        ("uph_test", {"context": frozenset({Flag.liver_disease})}, Status.caution, "liver"),
        # Fractional excretions above 100% are not physiological.
        ("fe_po4", {"urine": {"phosphate": 80}}, Status.not_valid, "100%"),
        ("fe_urate", {"urine": {"uric_acid": 12000}}, Status.not_valid, "100%"),
        # Adaptive rise of fractional excretion in advanced CKD.
        ("fe_urate", {"serum": {"creatinine": 500}, "urine": {"uric_acid": 400}, "age": 70,
                      "sex": Sex.female}, Status.caution, "eGFR"),
    ],
)  # fmt: skip
def test_condition_flips_status(base, change, status, words):
    calc, x = BASES[base]
    assert calc(x).status is Status.ok, "the base draw must be valid"
    f = calc(_with(x, **change))
    assert f.status is status
    assert words in f.reasons[0]


def test_tmp_gfr_not_valid_when_reabsorption_is_negative():
    x = DrawInputs(
        serum={"phosphate": 0.6, "creatinine": 100}, urine={"phosphate": 80, "creatinine": 10000}
    )
    f = tubular.tmp_gfr(x)
    assert f.status is Status.not_valid and "not above zero" in f.reasons[0]


def test_creatinine_conversion_matches_the_reference_table():
    # Creatinine mg/dL × 88.4 = µmol/L: 10 000 / 113.12 g/mol (IUPAC atomic weights), arithmetic.
    assert creatinine_mg_dl(88.4) == pytest.approx(1.0, abs=1e-3)
