"""Hyperkalemic (voltage) distal RTA: distal sodium transport fails, so neither H+ nor K+ is
secreted: alkaline urine, low ammonium, hyperkalemia, but a normal urine-minus-blood pCO2.

One row per answer that bears on the cause; see :class:`workup.rules.cause.Cause`.
"""

from __future__ import annotations

from workup.context import Flag
from workup.rules.cause import CLEARLY_HIGH_AGAINST, Cause
from workup.rules.readings import FURO_ACIDIFIED_BELOW

CAUSE = Cause(
    id="hyperkalemic_distal_rta",
    name="Hyperkalemic (voltage) distal RTA",
    questions=("urine_ph", "ammonium", "potassium", "urine_blood_pco2"),
    answers={
        ("ammonium", "high"): (-1.0, "ammonium is low in a voltage defect"),
        ("ammonium", "clearly_high"): (-CLEARLY_HIGH_AGAINST, "the kidney is excreting acid, which a voltage defect cannot (Batlle et al., NEJM 1988; Berend et al., Kidney Dis 2017, Table 1)"),
        ("ammonium", "low"): (1.0, "the renal defect lowers ammonium"),
        ("urine_ph", "not_acidified"): (2.0, "distal H+ secretion fails"),
        ("urine_ph", "not_acidified_high_ammonium"): (0.5, "but with high ammonium a urine pH above 5.5 is expected"),
        ("urine_ph", "acidified"): (-2.0, "distal H+ secretion works"),
        ("acidification_test", "acidified"): (-2.0, "distal acidification is intact"),
        ("acidification_test", "not_acidified"): (1.0, f"never below {FURO_ACIDIFIED_BELOW}"),
        ("potassium", "hypo"): (-6.0, "it is defined by hyperkalemia: a low potassium excludes it"),
        ("potassium", "normal"): (-2.5, "it is defined by hyperkalemia"),
        ("potassium", "hyper"): (2.0, "fits a voltage defect"),
        ("k_response", "too_low_for_hyperkalemia"): (1.5, "too little potassium secretion"),
        ("k_response", "responds_to_hyperkalemia"): (-1.5, "potassium secretion responds"),
        ("fe_bicarbonate", "high"): (-2.0, "a voltage defect wastes little bicarbonate"),
        ("fe_bicarbonate", "low"): (1.0, "fits a voltage defect"),
        ("urine_blood_pco2", "low"): (-2.0, "a voltage defect keeps a normal U–B pCO2"),
        ("urine_blood_pco2", "normal"): (1.0, "fits a voltage defect"),
    },
    history={
        Flag.urinary_obstruction: (2.0, "obstruction causes a voltage defect"),
        Flag.sickle_cell: (1.5, "medullary injury causes a voltage defect"),
        Flag.potassium_sparing_diuretic: (1.0, "amiloride and triamterene block distal sodium channels"),
        Flag.trimethoprim: (1.0, "blocks distal sodium channels"),
    },
)  # fmt: skip
