"""Hypoaldosteronism (type 4 RTA): too little aldosterone effect lowers potassium secretion and
ammoniagenesis; the urine still acidifies and the acidosis is mild.

One row per answer that bears on the cause; see :class:`workup.rules.cause.Cause`.
"""

from __future__ import annotations

from workup.context import Flag
from workup.rules.cause import CLEARLY_HIGH_AGAINST, Cause, NoHistory

CAUSE = Cause(
    id="hypoaldosteronism",
    name="Hypoaldosteronism (type 4 RTA)",
    questions=("potassium", "k_response", "urine_ph", "ammonium", "egfr"),
    answers={
        ("ammonium", "high"): (-1.0, "ammonium is low in type 4"),
        ("ammonium", "clearly_high"): (-CLEARLY_HIGH_AGAINST, "ammoniagenesis is not suppressed, so low aldosterone is not what lowers the bicarbonate (UOG below 150 in type 4, Berend et al., Kidney Dis 2017, Table 1)"),
        ("ammonium", "low"): (1.0, "hyperkalemia and low aldosterone lower ammoniagenesis"),
        ("urine_ph", "not_acidified"): (-2.5, "type 4 acidifies the urine below 5.5"),
        ("urine_ph", "not_acidified_high_ammonium"): (-2.5, "type 4 acidifies the urine below 5.5"),
        ("urine_ph", "acidified"): (1.5, "type 4 acidifies the urine"),
        ("potassium", "hypo"): (-3.0, "type 4 is defined by hyperkalemia"),
        ("potassium", "normal"): (-2.5, "type 4 is defined by hyperkalemia"),
        ("potassium", "hyper"): (2.0, "fits low aldosterone"),
        ("k_response", "too_low_for_hyperkalemia"): (2.0, "too little potassium secretion for the hyperkalemia"),
        ("k_response", "responds_to_hyperkalemia"): (-2.0, "potassium secretion responds to hyperkalemia"),
        ("fe_bicarbonate", "high"): (-1.0, "type 4 runs 5–10%"),
        ("fe_bicarbonate", "intermediate"): (1.0, "type 4 runs 5–10%"),
        ("urine_blood_pco2", "low"): (-2.0, "type 4 keeps a normal U–B pCO2"),
        ("urine_blood_pco2", "normal"): (1.0, "fits type 4"),
        ("egfr", "below_ckd_cutoff"): (0.5, "type 4 often comes with reduced kidney function"),
        ("egfr", "below_45"): (0.5, "type 4 often comes with reduced kidney function"),
        ("bicarbonate", "severe"): (-1.5, "type 4 runs 16–22"),
        ("bicarbonate", "moderate"): (-1.0, "type 4 usually runs 16–22"),
        ("bicarbonate", "mild"): (0.5, "a mild acidosis, as in type 4"),
    },
    history={
        Flag.potassium_sparing_diuretic: (1.5, "mineralocorticoid antagonism"),
        Flag.trimethoprim: (1.0, "aldosterone-resistance picture"),
        Flag.raas_blocker: (1.5, "lowers aldosterone"),
        Flag.diabetes: (1.5, "hyporeninemic hypoaldosteronism is common in diabetes"),
        Flag.calcineurin_inhibitor: (1.5, "causes a type 4 picture"),
        Flag.heparin: (1.0, "suppresses aldosterone synthesis"),
        Flag.nsaid: (1.0, "lowers renin"),
        Flag.known_ckd: (0.5, "type 4 often comes with reduced kidney function"),
    },
    no_history=NoHistory(
        frozenset({
            Flag.raas_blocker, Flag.diabetes, Flag.potassium_sparing_diuretic, Flag.trimethoprim,
            Flag.calcineurin_inhibitor, Flag.heparin, Flag.nsaid, Flag.known_ckd,
        }),
        "history: no diabetes, kidney disease or aldosterone-lowering drug recorded",
        -1.0,
        "most type 4 has one of these",
    ),
)  # fmt: skip
