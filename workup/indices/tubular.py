"""Tubular tests: bicarbonate loading (FEHCO3, urine-minus-blood pCO2) and proximal transport.

FEHCO3 and the urine-minus-blood pCO2 are provocative tests: they mean something only on a draw
taken during bicarbonate loading, once plasma bicarbonate (FEHCO3) or urine pH (U–B pCO2) has
risen far enough. Phosphate and urate handling look for the proximal tubulopathy of Fanconi.
"""

from __future__ import annotations

from workup.findings import Finding, missing
from workup.indices._common import Judge, bicarbonate, finding, fmt, ratio
from workup.indices.kidney import egfr_estimate
from workup.inputs import DrawInputs
from workup.model import LoadingTest
from workup.settings import (
    TMP_GFR_CHILD_BANDS,
    TMP_GFR_CHILD_CITE,
    TMP_GFR_CHILD_SOURCE,
    age_band,
)

FE_FORMULA = "FE{x} (%) = 100 × (urine {x} × plasma creatinine) / (plasma {x} × urine creatinine)"
FEHCO3_SOURCE = "Rodríguez Soriano, JASN 2002;13:2160, Table 5"
UB_FORMULA = "U–B pCO2 = urine pCO2 − blood pCO2"
UB_SOURCE = (
    "Rodríguez Soriano, JASN 2002;13:2160; Berend et al., Kidney Dis 2017 (cut-off 30); "
    "urine bicarbonate minimum from memory"
)
FEPO4_SOURCE = "common practice (fractional excretion); wasting cut-off common practice 5–15%"
TMP_FORMULA = (
    "TRP = 1 − FEPO4/100; TmP/GFR = TRP × plasma P if TRP ≤ 0.86, else "
    "0.3 × TRP / (1 − 0.8 × TRP) × plasma P"
)
TMP_SOURCE = (
    "algebraic form of the Walton & Bijvoet nomogram (Kenny & Glen; Payne, Ann Clin Biochem "
    "1998;35:201), from memory; adult range 0.8–1.35 mmol/L from memory"
)
FEUA_SOURCE = "common practice: normally about 5–10%, above 10–15% with hypouricemia"


def _fe(x: DrawInputs, key: str, plasma: float | None) -> tuple[float | None, list[str]]:
    """Fractional excretion (%) of ``key``; (value or None, missing inputs)."""
    need = [] if key in x.urine else [f"urine.{key}"]
    if plasma is None:
        need.append(f"serum.{key}")
    need += [f"{p}.creatinine" for p, d in (("serum", x.serum), ("urine", x.urine))
             if "creatinine" not in d]  # fmt: skip
    if need:
        return None, need
    assert plasma is not None
    value = ratio(100.0 * x.urine[key] * x.serum["creatinine"], plasma * x.urine["creatinine"])
    return value, []


def _ckd_note(x: DrawInputs, j: Judge, what: str) -> None:
    """Fractional excretions rise adaptively as GFR falls; say so when the eGFR is low."""
    e = egfr_estimate(x)
    if e is not None and e < x.settings.egfr_ckd_below:
        j.caution(
            f"eGFR about {fmt(e, 0)}: {what} rises adaptively in advanced kidney disease, "
            "so a high value is not by itself tubular wasting"
        )


def fe_bicarbonate(x: DrawInputs) -> Finding:
    """Fractional excretion of bicarbonate during bicarbonate loading."""
    fid, name, unit = "fe_bicarbonate", "FEHCO3 (on loading)", "%"
    formula = FE_FORMULA.format(x="HCO3")
    plasma, _, note = bicarbonate(x)
    value, need = _fe(x, "bicarbonate", plasma)
    if need:
        return missing(fid, name, unit, need, formula, FEHCO3_SOURCE)
    s = x.settings
    j = Judge()
    if value is None:
        j.not_valid("plasma bicarbonate or urine creatinine is zero: the ratio cannot be formed")
        value = 0.0
    if note:
        j.note(note)
    if x.during is not LoadingTest.bicarbonate_loading:
        j.not_valid(
            "not a bicarbonate-loading draw: FEHCO3 is read only once plasma bicarbonate has been "
            "raised by an infusion"
        )
    assert plasma is not None
    if plasma < s.loading_bicarbonate_min:
        j.not_valid(
            f"plasma bicarbonate {fmt(plasma)} is below {fmt(s.loading_bicarbonate_min)}: not "
            "yet raised enough to unmask a low threshold"
        )
    if value < s.fehco3_distal_max:
        reading = "low"
        words = "fits classic distal or hyperkalemic distal RTA (or normal, below 3%)"
    elif value > s.fehco3_proximal_min:
        reading = "high"
        words = "fits proximal RTA"
    else:
        reading = "intermediate"
        words = "fits distal RTA with bicarbonate wasting (type 3) or type 4 RTA (5–10%)"
    j.note(
        f"{fmt(value)}%: below {fmt(s.fehco3_distal_max)} low, above "
        f"{fmt(s.fehco3_proximal_min)} high; {words}"
    )
    j.note("urine bicarbonate must be measured on fresh urine kept from air (gas analyzer)")
    return finding((fid, name, unit, formula, FEHCO3_SOURCE), value, j, reading)


def urine_blood_pco2(x: DrawInputs) -> Finding:
    """Urine minus blood pCO2 in alkaline urine: distal H+ secretion after bicarbonate loading."""
    fid, name, unit = "urine_blood_pco2", "Urine − blood pCO2", "mmHg"
    need = [f"urine.{k}" for k in ("pco2", "ph") if k not in x.urine]
    if "pco2" not in x.gas:
        need.append("blood_gas.pco2")
    if need:
        return missing(fid, name, unit, need, UB_FORMULA, UB_SOURCE)
    s = x.settings
    value = x.urine["pco2"] - x.gas["pco2"]
    j = Judge()
    uph = x.urine["ph"]
    if uph < s.ub_pco2_urine_ph_min:
        j.not_valid(
            f"urine pH {fmt(uph, 2)} is below {fmt(s.ub_pco2_urine_ph_min)}: the gradient is read "
            "only in a maximally alkaline urine"
        )
    if x.during is not LoadingTest.bicarbonate_loading:
        j.caution("not marked as a bicarbonate-loading draw: the test is done after loading")
    uhco3 = x.urine.get("bicarbonate")
    if uhco3 is not None and uhco3 < s.ub_pco2_urine_bicarbonate_min:
        j.caution(
            f"urine bicarbonate {fmt(uhco3)} is below about {fmt(s.ub_pco2_urine_bicarbonate_min)}"
            " (from memory): the gradient may be low for that reason alone"
        )
    if x.venous:
        j.caution(
            f"blood pCO2 from a {x.sample.value} gas runs higher than arterial and lowers the "
            "gradient"
        )
    normal = value > s.ub_pco2_normal_min
    j.note(
        f"{fmt(value)} mmHg: "
        + (
            f"above {fmt(s.ub_pco2_normal_min)}, distal H+ secretion intact (as in proximal, "
            "voltage-type distal or type 4 RTA)"
            if normal
            else f"{fmt(s.ub_pco2_normal_min)} or less, impaired distal H+ secretion (classic "
            "distal RTA)"
        )
    )
    return finding(
        (fid, name, unit, UB_FORMULA, UB_SOURCE), value, j, "normal" if normal else "low"
    )


def _phosphate(x: DrawInputs) -> tuple[float | None, list[str]]:
    return _fe(x, "phosphate", x.serum.get("phosphate"))


def fe_phosphate(x: DrawInputs) -> Finding:
    """Fractional excretion of phosphate (with TRP): renal phosphate wasting."""
    fid, name, unit = "fe_phosphate", "FEPO4", "%"
    formula = FE_FORMULA.format(x="PO4") + "; TRP = 1 − FEPO4/100"
    value, need = _phosphate(x)
    if need:
        return missing(fid, name, unit, need, formula, FEPO4_SOURCE)
    s = x.settings
    j = Judge()
    if value is None:
        j.not_valid("plasma phosphate or urine creatinine is zero: the ratio cannot be formed")
        value = 0.0
    plasma = x.serum["phosphate"]
    wasting = value > s.fe_phosphate_wasting_above
    if plasma >= s.phosphate_low:
        j.caution(
            f"plasma phosphate {fmt(plasma, 2)} is not low: FEPO4 then mostly reflects intake"
        )
    if value > 100:
        j.not_valid("FEPO4 above 100% is not physiological: check units and sample timing")
    _ckd_note(x, j, "FEPO4")
    j.note(
        f"{fmt(value)}% (TRP {fmt(1 - value / 100, 2)}); above "
        f"{fmt(s.fe_phosphate_wasting_above)}% with a low plasma phosphate is renal wasting"
    )
    return finding(
        (fid, name, unit, formula, FEPO4_SOURCE), value, j, "wasting" if wasting else "normal",
        extra={"trp": 1 - value / 100},
    )  # fmt: skip


def tmp_gfr(x: DrawInputs) -> Finding:
    """Tubular maximum of phosphate reabsorption per GFR (TmP/GFR)."""
    fid, name, unit = "tmp_gfr", "TmP/GFR", "mmol/L"
    fe, need = _phosphate(x)
    if need:
        return missing(fid, name, unit, need, TMP_FORMULA, TMP_SOURCE)
    s = x.settings
    j = Judge()
    plasma = x.serum["phosphate"]
    if fe is None:
        j.not_valid("plasma phosphate or urine creatinine is zero: the ratio cannot be formed")
        fe = 100.0
    trp = 1 - fe / 100
    if trp <= 0:
        j.not_valid(
            f"tubular reabsorption {fmt(trp, 2)} is not above zero: check units and sample timing"
        )
        value = 0.0
    elif trp <= 0.86:
        value = trp * plasma
    else:
        value = 0.3 * trp / (1 - 0.8 * trp) * plasma
    band = age_band(TMP_GFR_CHILD_BANDS, x.age)
    if band is not None:
        # A child's TmP/GFR runs well above the adult range: the adult lower limit would call
        # wasting late, so the age's band is read and named first.
        j.caution(
            f"age {x.age}: read against the children's band for {band.label}, "
            f"{band.low:.2f}-{band.high:.2f} mmol/L ({TMP_GFR_CHILD_CITE}), not the adult "
            f"lower limit {fmt(s.tmp_gfr_low, 2)}"
        )
        if band.detail:
            j.note(f"children's band for {band.label}: {band.detail}")
    j.caution(
        "needs a fasting second-morning urine and blood; the formula and range are from memory"
    )
    _ckd_note(x, j, "phosphate excretion")
    if band is None:
        j.note(
            f"{fmt(value, 2)} mmol/L (TRP {fmt(trp, 2)}); below {fmt(s.tmp_gfr_low, 2)} is "
            "renal phosphate wasting"
        )
        reading = "low" if value < s.tmp_gfr_low else "normal"
        return finding(
            (fid, name, unit, TMP_FORMULA, TMP_SOURCE), value, j, reading, extra={"trp": trp}
        )
    return _child_tmp_gfr(value, trp, band.low, band.high, j)


def _child_tmp_gfr(value: float, trp: float, low: float, high: float, j: Judge) -> Finding:
    """A child's TmP/GFR read against the age band ``low``-``high`` (low, normal or high)."""
    if value < low:
        reading, words = "low", "below the band is renal phosphate wasting"
    elif value > high:
        reading = "high"
        words = (
            "above the band: reabsorption higher than the age's range (common practice: as "
            "with low parathyroid hormone action)"
        )
    else:
        reading, words = "normal", "within the band"
    j.note(f"{fmt(value, 2)} mmol/L (TRP {fmt(trp, 2)}); {words}")
    source = f"{TMP_SOURCE}; children's bands: {TMP_GFR_CHILD_SOURCE}"
    meta = ("tmp_gfr", "TmP/GFR", "mmol/L", TMP_FORMULA, source)
    return finding(meta, value, j, reading, low=low, high=high, extra={"trp": trp})


def fe_urate(x: DrawInputs) -> Finding:
    """Fractional excretion of urate: proximal urate wasting."""
    fid, name, unit = "fe_urate", "FE urate", "%"
    formula = FE_FORMULA.format(x="urate")
    value, need = _fe(x, "uric_acid", x.serum.get("uric_acid"))
    if need:
        return missing(fid, name, unit, need, formula, FEUA_SOURCE)
    s = x.settings
    j = Judge()
    if value is None:
        j.not_valid("plasma urate or urine creatinine is zero: the ratio cannot be formed")
        value = 0.0
    high = value > s.fe_urate_high_above
    plasma = x.serum["uric_acid"]
    if plasma >= s.uric_acid_low:
        j.caution(
            f"plasma urate {fmt(plasma, 0)} µmol/L is not low: a high FE urate supports proximal "
            "wasting mainly with hypouricemia"
        )
    if value > 100:
        j.not_valid("FE urate above 100% is not physiological: check units and sample timing")
    _ckd_note(x, j, "FE urate")
    j.note(f"{fmt(value)}%: above {fmt(s.fe_urate_high_above)}% is high")
    return finding((fid, name, unit, formula, FEUA_SOURCE), value, j, "high" if high else "normal")
