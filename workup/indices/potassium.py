"""Renal potassium handling: the TTKG and the spot urine potassium/creatinine ratio.

Both are read against the serum potassium state: in hypokalemia a low value is appropriate
conservation (renal loss is excluded), in hyperkalemia a low value is an inadequate renal response
(mineralocorticoid deficiency or resistance, or a drug).
"""

from __future__ import annotations

from workup.context import Flag
from workup.findings import Finding, missing
from workup.indices._common import Judge, finding, fmt, plasma_osmolality, ratio, within
from workup.inputs import DrawInputs

TTKG_FORMULA = "TTKG = (urine K / plasma K) / (urine osm / plasma osm)"
TTKG_SOURCE = (
    "Ethier et al., AJKD 1990;15:309; hyperkalemia cut-off Choi & Ziyadeh, JASN 2008 (from "
    "memory); critique Kamel & Halperin, Curr Opin Nephrol Hypertens 2011 (from memory)"
)
UKCR_FORMULA = "urine K (mmol/L) / urine creatinine (mmol/L)"
UKCR_SOURCE = "Halperin, Afr J Nephrol 2017;20:22"

_DRUGS = {
    Flag.potassium_sparing_diuretic: "a potassium-sparing diuretic",
    Flag.trimethoprim: "trimethoprim or pentamidine (amiloride-like ENaC block)",
    Flag.raas_blocker: "an ACE inhibitor, ARB or renin inhibitor",
    Flag.calcineurin_inhibitor: "a calcineurin inhibitor",
    Flag.heparin: "heparin (lowers aldosterone)",
    Flag.nsaid: "an NSAID (lowers renin)",
}


def kalemia(x: DrawInputs) -> str | None:
    """``hypo``, ``normal`` or ``hyper`` from serum potassium; None when not given."""
    k = x.serum.get("potassium")
    if k is None:
        return None
    if k < x.settings.potassium_low:
        return "hypo"
    if k > x.settings.potassium_high:
        return "hyper"
    return "normal"


def _drug_notes(x: DrawInputs, j: Judge) -> None:
    drugs = [text for flag, text in _DRUGS.items() if x.has(flag)]
    if drugs:
        j.caution(
            "on " + ", ".join(drugs) + ": a low renal potassium output may be the drug's effect"
        )
    if x.has(Flag.loop_or_thiazide_diuretic):
        j.caution("a recent loop or thiazide diuretic raises renal potassium output")


def ttkg(x: DrawInputs) -> Finding:
    """Transtubular potassium gradient, read against the cut-off for the serum potassium state."""
    fid, name = "ttkg", "TTKG"
    need = [f"urine.{k}" for k in ("potassium", "osmolality") if k not in x.urine]
    if "potassium" not in x.serum:
        need.append("serum.potassium")
    posm, how, posm_need = plasma_osmolality(x)
    need += posm_need
    if need or posm is None:
        return missing(fid, name, "", need, TTKG_FORMULA, TTKG_SOURCE)
    s = x.settings
    uk, uosm, pk = x.urine["potassium"], x.urine["osmolality"], x.serum["potassium"]
    j = Judge()
    value = ratio(uk * posm, pk * uosm)
    if value is None:
        j.not_valid("urine osmolality or plasma potassium is zero: the ratio cannot be formed")
        value = 0.0
    if how == "calculated":
        j.note(f"plasma osmolality calculated as 2 Na + glucose + urea = {fmt(posm)}")
    if uosm < posm:
        j.not_valid(
            f"urine osmolality {fmt(uosm)} is below plasma {fmt(posm)} ({how}): the TTKG needs a "
            "urine at least as concentrated as plasma"
        )
    una = x.urine.get("sodium")
    if una is None:
        j.caution("urine sodium not given: distal sodium delivery cannot be confirmed")
    elif una < s.urine_sodium_min:
        j.not_valid(
            f"urine sodium {fmt(una)} is below {fmt(s.urine_sodium_min)}: too little distal "
            "sodium delivery for potassium secretion to be judged"
        )
    state = kalemia(x) or "normal"
    cut = s.ttkg_low_hyperkalemia if state == "hyper" else s.ttkg_low_hypokalemia
    reading = "low" if value < cut else "high"
    if state == "hypo":
        j.note(
            f"hypokalemia: below {fmt(cut)} is appropriate conservation (non-renal loss); above "
            "it the kidney is wasting potassium"
        )
    elif state == "hyper":
        j.note(
            f"hyperkalemia: an adequate response is above {fmt(cut)}; below it suggests "
            "mineralocorticoid deficiency or resistance"
        )
    else:
        j.caution(
            f"serum potassium {fmt(pk)} is normal: there is no demand to judge the response "
            f"against (read against {fmt(cut)})"
        )
    _drug_notes(x, j)
    j.caution(
        "the TTKG assumes no solute reabsorption beyond the cortical collecting duct; urea "
        "recycling breaks that, and its authors now prefer urine K/creatinine (Kamel & Halperin "
        "2011, from memory)"
    )
    return finding(
        (fid, name, "", TTKG_FORMULA, TTKG_SOURCE), value, j, reading,
        extra={"kalemia": state, "plasma_osmolality": posm, "plasma_osmolality_from": how},
        borderline=_ttkg_edge(value, state),
    )  # fmt: skip


TTKG_BORDERLINE_HYPOKALEMIA = (3.0, 7.0)
"""TTKG margin read as borderline in hypokalemia: below 3 is renal conservation and above 7 renal
wasting (Ethier et al., AJKD 1990: non-renal loss 0.9 ± 0.2, hyperaldosteronism 6.7 ± 1.3), so
the gap between the two cut-offs settles neither."""
TTKG_BORDERLINE_HYPERKALEMIA = (5.0, 7.0)
"""TTKG margin read as borderline in hyperkalemia: an adequate response is above 7, and the
published "inadequate" cut-offs run from below 5 to below 7 (Choi & Ziyadeh, JASN 2008, from
memory), so only a value under 5 is clearly too low."""


def _ttkg_edge(value: float, state: str) -> str | None:
    """The borderline reason when the TTKG sits between the published cut-offs, else None."""
    if state == "hypo":
        low, high = TTKG_BORDERLINE_HYPOKALEMIA
        why = "below 3 is conservation, above 7 wasting (Ethier et al., AJKD 1990)"
    elif state == "hyper":
        low, high = TTKG_BORDERLINE_HYPERKALEMIA
        why = (
            "the published cut-offs for too little secretion run from 5 to 7 (Choi & Ziyadeh, "
            "JASN 2008, from memory)"
        )
    else:
        return None  # no demand to judge against: already a caution
    if not within(value, low, high):
        return None
    return (
        f"borderline: TTKG {fmt(value)} lies within {fmt(low)}–{fmt(high)} in {state}kalemia; "
        f"{why}, so it does not settle the renal potassium response"
    )


def urine_potassium_creatinine_ratio(x: DrawInputs) -> Finding:
    """Spot urine potassium over creatinine, read against the serum potassium state."""
    fid, name, unit = "urine_potassium_creatinine_ratio", "Urine K/creatinine", "mmol/mmol"
    need = [f"urine.{k}" for k in ("potassium", "creatinine") if k not in x.urine]
    if "potassium" not in x.serum:
        need.append("serum.potassium")
    if need:
        return missing(fid, name, unit, need, UKCR_FORMULA, UKCR_SOURCE)
    s = x.settings
    j = Judge()
    value = ratio(x.urine["potassium"], x.urine["creatinine"] / 1000.0)
    if value is None:
        j.not_valid("urine creatinine is zero: the ratio cannot be formed")
        value = 0.0
    state = kalemia(x) or "normal"
    cut = s.ukcr_high if state == "hyper" else s.ukcr_low
    reading = "low" if value < cut else "high"
    if state == "hypo":
        j.note(
            f"hypokalemia: below {fmt(cut)} is appropriate conservation (non-renal loss, as in "
            "lower-GI loss); above it renal potassium wasting"
        )
    elif state == "hyper":
        j.note(
            f"hyperkalemia: an adequate response is above {fmt(cut)}; below it the kidney is "
            "not excreting potassium"
        )
    else:
        j.caution(
            f"serum potassium {fmt(x.serum['potassium'])} is normal: no demand to judge against "
            f"(read against {fmt(cut)})"
        )
    _drug_notes(x, j)
    j.note(f"{fmt(value)} mmol/mmol ({fmt(value * 8.84)} mmol/g creatinine)")
    edge = None
    if state == "hypo" and within(value, *UKCR_BORDERLINE):
        edge = (
            f"borderline: {fmt(value)} mmol/mmol lies within {fmt(UKCR_BORDERLINE[0], 2)}–"
            f"{fmt(UKCR_BORDERLINE[1], 2)} around the 1.5 cut-off (Halperin, Afr J Nephrol 2017; "
            "margin from memory), so it does not settle renal against non-renal loss"
        )
    return finding(
        (fid, name, unit, UKCR_FORMULA, UKCR_SOURCE),
        value,
        j,
        reading,
        extra={"kalemia": state},
        borderline=edge,
    )


UKCR_BORDERLINE = (1.35, 1.65)
"""Urine K/creatinine (mmol/mmol) margin around the 1.5 cut-off in hypokalemia read as
borderline (cut-off Halperin, Afr J Nephrol 2017; the ±10 % margin is from memory, kept narrow)."""
