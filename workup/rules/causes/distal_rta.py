"""Classic distal RTA (type 1): the collecting duct cannot secrete H+, so the urine stays alkaline,
ammonium is low, potassium low or normal, and the urine-minus-blood pCO2 stays low on loading.

One row per answer that bears on the cause; see :class:`workup.rules.cause.Cause`.
"""

from __future__ import annotations

from workup.context import Flag
from workup.rules.cause import CLEARLY_HIGH_AGAINST, Cause
from workup.rules.readings import FURO_ACIDIFIED_BELOW

CAUSE = Cause(
    id="distal_rta",
    name="Classic distal RTA (type 1)",
    questions=("urine_ph", "ammonium", "potassium", "urine_blood_pco2", "fe_bicarbonate"),
    answers={
        ("ammonium", "high"): (-1.0, "low ammonium is the defect of distal RTA"),
        ("ammonium", "clearly_high"): (-CLEARLY_HIGH_AGAINST, "the kidney is excreting acid, which classic distal RTA cannot (UOG 129.7 ± 17 in distal RTA, Kim et al., AJKD 1996)"),
        ("ammonium", "low"): (1.0, "the renal defect lowers ammonium"),
        ("urine_ph", "not_acidified"): (2.0, "distal H+ secretion fails"),
        ("urine_ph", "not_acidified_high_ammonium"): (0.5, "but with high ammonium a urine pH above 5.5 is expected"),
        ("urine_ph", "acidified"): (-3.0, "distal H+ secretion works"),
        ("acidification_test", "acidified"): (-3.0, "distal acidification is intact"),
        ("acidification_test", "not_acidified"): (2.0, f"never below {FURO_ACIDIFIED_BELOW}"),
        ("potassium", "hypo"): (1.5, "typical of classic distal RTA"),
        ("potassium", "hyper"): (-2.0, "classic distal RTA has a low or normal potassium"),
        ("k_response", "wasting_in_hypokalemia"): (1.0, "renal potassium wasting"),
        ("k_response", "conserving_in_hypokalemia"): (-1.0, "distal RTA usually wastes potassium"),
        ("fe_bicarbonate", "high"): (-2.0, "classic distal RTA wastes little bicarbonate"),
        ("fe_bicarbonate", "intermediate"): (0.5, "distal RTA with bicarbonate wasting (type 3) runs 5–15%"),
        ("fe_bicarbonate", "low"): (1.0, "fits classic distal RTA"),
        ("urine_blood_pco2", "low"): (3.0, "the collecting duct fails to secrete H+ into alkaline urine"),
        ("urine_blood_pco2", "normal"): (-3.0, "distal H+ secretion into alkaline urine is intact"),
    },
    history={
        Flag.autoimmune_disease: (1.5, "Sjögren's and lupus cause classic distal RTA"),
        Flag.lithium: (1.0, "lithium impairs distal acidification"),
        Flag.toluene: (1.0, "toluene gives a distal-RTA-like picture"),
        Flag.solvent_inhalation: (1.0, "toluene gives a distal-RTA-like picture"),
    },
)  # fmt: skip
