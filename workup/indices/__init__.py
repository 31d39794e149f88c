"""Every index: one pure function each, returning a Finding with its validity and source.

``REGISTRY`` lists the calculators in display order (the order a fellow reads a workup: the gas,
the serum gaps, renal acid excretion, potassium, tubular tests, kidney function). Each calculator
takes a :class:`workup.inputs.DrawInputs` and returns exactly one Finding, never raising for any
combination of present, missing or extreme values.
"""

from __future__ import annotations

from collections.abc import Callable

from workup.findings import Finding
from workup.indices import (
    ammonium,
    gas,
    kidney,
    paediatric,
    potassium,
    serum_gaps,
    tubular,
    urine_acid,
)
from workup.inputs import DrawInputs

Calculator = Callable[[DrawInputs], Finding]

REGISTRY: tuple[Calculator, ...] = (
    gas.henderson_hasselbalch_ph,
    serum_gaps.anion_gap,
    serum_gaps.anion_gap_albumin_corrected,
    serum_gaps.delta_ratio,
    gas.expected_pco2,
    gas.expected_pco2_metabolic_alkalosis,
    gas.expected_bicarbonate_respiratory_acidosis_acute,
    gas.expected_bicarbonate_respiratory_acidosis_chronic,
    gas.expected_bicarbonate_respiratory_alkalosis_acute,
    gas.expected_bicarbonate_respiratory_alkalosis_chronic,
    serum_gaps.serum_osmolal_gap,
    urine_acid.urine_ph,
    urine_acid.urine_anion_gap,
    urine_acid.urine_osmolal_gap,
    ammonium.urine_ammonium_estimate,
    ammonium.urine_ammonium_creatinine_ratio,
    potassium.ttkg,
    potassium.urine_potassium_creatinine_ratio,
    tubular.fe_bicarbonate,
    tubular.urine_blood_pco2,
    tubular.fe_phosphate,
    tubular.tmp_gfr,
    tubular.fe_urate,
    kidney.egfr,
    kidney.egfr_schwartz,
)


def compute_all(x: DrawInputs) -> dict[str, Finding]:
    """Run every calculator on ``x``; the dict keeps display order."""
    out: dict[str, Finding] = {}
    for calc in REGISTRY:
        f = calc(x)
        out[f.id] = f
    return paediatric.child_cautions(x, out)
