"""Proximal RTA (type 2): bicarbonate wasting on loading, often with the other Fanconi losses
(phosphate, urate, glucose); distal acidification and ammonium are intact in the steady state.

One row per answer that bears on the cause; see :class:`workup.rules.cause.Cause`.
"""

from __future__ import annotations

from workup.context import Flag
from workup.rules.cause import Cause

CAUSE = Cause(
    id="proximal_rta",
    name="Proximal RTA (type 2)",
    questions=("fe_bicarbonate", "phosphate", "glucosuria", "fe_urate", "urine_ph"),
    answers={
        ("ammonium", "high"): (0.5, "distal acidification is intact in proximal RTA"),
        ("ammonium", "clearly_high"): (0.5, "distal acidification is intact in proximal RTA"),
        ("ammonium", "low"): (-0.5, "ammonium is normal in proximal RTA"),
        ("urine_ph", "not_acidified"): (-1.0, "in the steady state proximal RTA acidifies the urine"),
        ("urine_ph", "not_acidified_high_ammonium"): (-1.0, "in the steady state proximal RTA acidifies the urine"),
        ("urine_ph", "acidified"): (1.0, "proximal RTA acidifies the urine in the steady state"),
        ("potassium", "hypo"): (1.0, "renal potassium loss"),
        ("potassium", "hyper"): (-1.0, "proximal RTA wastes potassium"),
        ("k_response", "wasting_in_hypokalemia"): (1.0, "renal potassium wasting"),
        ("k_response", "conserving_in_hypokalemia"): (-0.5, "proximal RTA usually wastes potassium"),
        ("fe_bicarbonate", "high"): (3.0, "proximal bicarbonate wasting"),
        ("fe_bicarbonate", "intermediate"): (0.5, "partial wasting"),
        ("fe_bicarbonate", "low"): (-3.0, "no proximal bicarbonate wasting"),
        ("urine_blood_pco2", "low"): (-1.0, "proximal RTA keeps a normal U–B pCO2"),
        ("urine_blood_pco2", "normal"): (1.0, "fits proximal RTA"),
        # Proximal tubular features beyond bicarbonate (Berend et al. 2017).
        ("phosphate", "wasting"): (1.5, "renal phosphate wasting (Fanconi)"),
        ("phosphate", "normal"): (-0.5, "phosphate handling is normal"),
        ("fe_urate", "high"): (1.0, "urate wasting (Fanconi)"),
        ("fe_urate", "normal"): (-0.5, "urate handling is normal"),
        ("glucosuria", "present"): (1.5, "glucosuria with a normal plasma glucose (Fanconi)"),
        ("glucosuria", "absent"): (-0.5, "no glucosuria"),
        ("bicarbonate", "severe"): (-1.0, "proximal RTA seldom goes below 12"),
    },
    history={
        Flag.proximal_tubule_toxin: (2.0, "a known cause of proximal tubular injury"),
        Flag.carbonic_anhydrase_inhibitor: (2.0, "blocks proximal bicarbonate reabsorption"),
        Flag.paraprotein: (1.5, "light chains injure the proximal tubule"),
    },
)  # fmt: skip
