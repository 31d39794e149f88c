"""Acidosis of chronic kidney disease: too few nephrons to excrete enough ammonium; it needs a
low eGFR and is usually mild.

One row per answer that bears on the cause; see :class:`workup.rules.cause.Cause`.
"""

from __future__ import annotations

from workup.context import Flag
from workup.rules.cause import CLEARLY_HIGH_AGAINST, Cause

CAUSE = Cause(
    id="ckd_acidosis",
    name="Acidosis of chronic kidney disease",
    questions=("egfr", "ammonium"),
    answers={
        ("ammonium", "high"): (-1.0, "CKD acidosis is a failure of ammonium excretion"),
        ("ammonium", "clearly_high"): (-CLEARLY_HIGH_AGAINST, "the nephrons excrete plenty of acid, so their loss is not the cause (UAG +24.7 in chronic renal failure, Kim et al., AJKD 1996)"),
        ("ammonium", "low"): (1.0, "reduced nephron mass lowers ammonium"),
        ("urine_ph", "not_acidified"): (-0.5, "CKD usually acidifies the urine"),
        ("urine_ph", "not_acidified_high_ammonium"): (-0.5, "CKD usually acidifies the urine"),
        ("urine_ph", "acidified"): (0.5, "CKD usually acidifies the urine"),
        ("potassium", "hypo"): (-0.5, "CKD seldom lowers potassium"),
        ("potassium", "hyper"): (0.5, "reduced kidney function raises potassium"),
        # {egfr_ckd_below} quotes the setting of that name (workup.rules.judge.quote_settings).
        ("egfr", "below_ckd_cutoff"): (3.0, "below {egfr_ckd_below}: enough to cause acidosis"),
        ("egfr", "below_45"): (-1.5, "seldom enough alone to cause acidosis"),
        ("egfr", "below_60"): (-2.0, "too high for CKD to explain the acidosis"),
        ("egfr", "60_or_more"): (-3.0, "kidney function is preserved"),
        ("bicarbonate", "severe"): (-1.0, "CKD acidosis is usually milder"),
    },
    history={
        Flag.known_ckd: (1.5, "reduced nephron mass limits ammonium excretion"),
    },
)  # fmt: skip
