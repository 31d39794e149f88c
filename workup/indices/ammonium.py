"""Urine ammonium: the measured value (else half the urine osmolal gap) and its ratio to creatinine.

Read, like the urine gaps of :mod:`.urine_acid` it shares the osmolal gap with, only during a
metabolic acidosis; a measured ammonium is the reference the gaps stand in for.
"""

from __future__ import annotations

from workup.findings import Finding, missing
from workup.indices._common import Judge, finding, fmt, ratio
from workup.indices.urine_acid import UOG_SOURCE, _acidosis_context, _ammonium_reading, _uog
from workup.inputs import DrawInputs

NH4_FORMULA = "measured urine NH4, else NH4 ≈ UOG / 2"
NH4_CR_FORMULA = "urine NH4 (mmol/L) / urine creatinine (mmol/L)"
NH4_CR_SOURCE = (
    "cut-offs derived, common practice: > 200 mmol/day NH4 expected in chronic acidosis over "
    "10–15 mmol/day of creatinine"
)


def _ammonium(x: DrawInputs) -> tuple[float | None, bool, list[str], Judge]:
    """Urine ammonium (measured, else UOG/2), whether measured, missing inputs, validity."""
    if "ammonium" in x.urine:
        j = Judge()
        j.note("measured urine ammonium")
        return x.urine["ammonium"], True, [], j
    gap, need, j = _uog(x)
    if gap is None:
        return None, False, ["urine.ammonium", *need], j
    j.caution(
        "estimated as half the urine osmolal gap: assumes ammonium travels with monovalent anions "
        "and agrees only loosely with a measured value; measure it when you can"
    )
    return gap / 2, False, [], j


def urine_ammonium_estimate(x: DrawInputs) -> Finding:
    """Urine ammonium: the measured value when given, else half the urine osmolal gap."""
    fid, name, unit = "urine_ammonium_estimate", "Urine ammonium", "mmol/L"
    nh4, measured, need, j = _ammonium(x)
    if nh4 is None:
        return missing(fid, name, unit, need, NH4_FORMULA, UOG_SOURCE)
    s = x.settings
    _acidosis_context(x, j, "urine ammonium")
    reading = _ammonium_reading(nh4, s.urine_ammonium_low_below, s.urine_ammonium_adequate_above)
    j.note(
        f"{fmt(nh4)} mmol/L; a spot concentration depends on urine flow, so the ammonium/"
        "creatinine ratio reads better"
    )
    return finding(
        (fid, name, unit, NH4_FORMULA, UOG_SOURCE), nh4, j, reading, extra={"measured": measured}
    )


def urine_ammonium_creatinine_ratio(x: DrawInputs) -> Finding:
    """Urine ammonium over urine creatinine: ammonium excretion corrected for urine flow."""
    fid, name, unit = "urine_ammonium_creatinine_ratio", "Urine NH4/creatinine", "mmol/mmol"
    nh4, measured, need, j = _ammonium(x)
    if "creatinine" not in x.urine:
        need.append("urine.creatinine")
    if nh4 is None or need:
        return missing(fid, name, unit, need, NH4_CR_FORMULA, NH4_CR_SOURCE)
    s = x.settings
    value = ratio(nh4, x.urine["creatinine"] / 1000.0)
    if value is None:
        j.not_valid("urine creatinine is zero: the ratio cannot be formed")
        value = 0.0
    _acidosis_context(x, j, "the ammonium/creatinine ratio")
    reading = _ammonium_reading(value, s.nh4_creatinine_low_below, s.nh4_creatinine_adequate_above)
    j.note(
        f"{fmt(value)} mmol/mmol ({fmt(value * 8.84)} mmol/g); during acidosis below "
        f"{fmt(s.nh4_creatinine_low_below)} is low, above {fmt(s.nh4_creatinine_adequate_above)} "
        "adequate (derived cut-offs, common practice)"
    )
    return finding(
        (fid, name, unit, NH4_CR_FORMULA, NH4_CR_SOURCE), value, j, reading,
        extra={"measured": measured, "ammonium": nh4},
    )  # fmt: skip
