"""Bicarbonate lost from the gut: the kidney answers with high ammonium and conserves potassium.

One row per answer that bears on the cause; see :class:`workup.rules.cause.Cause`.
"""

from __future__ import annotations

from workup.context import Flag
from workup.rules.cause import Cause, NoHistory

CAUSE = Cause(
    id="gi_bicarbonate_loss",
    name="Bicarbonate loss from the gut",
    questions=("ammonium", "potassium", "k_response"),
    answers={
        ("ammonium", "high"): (1.0, "the kidney responds to the acidosis, as in gut loss"),
        ("ammonium", "clearly_high"): (1.0, "the kidney responds to the acidosis, as in gut loss"),
        ("ammonium", "low"): (-1.0, "gut loss drives ammonium excretion up"),
        ("urine_ph", "acidified"): (0.5, "fits gut loss"),
        ("potassium", "hypo"): (1.0, "stool potassium loss"),
        ("potassium", "hyper"): (-1.0, "gut loss lowers potassium"),
        ("k_response", "wasting_in_hypokalemia"): (-1.5, "gut loss leaves the kidney conserving potassium"),
        ("k_response", "conserving_in_hypokalemia"): (1.5, "the kidney conserves potassium: the loss is elsewhere"),
        ("fe_bicarbonate", "high"): (-2.0, "the kidney should reclaim bicarbonate"),
    },
    history={
        Flag.diarrhea: (2.5, "stool bicarbonate loss"),
        Flag.laxatives: (2.0, "stool bicarbonate loss"),
        Flag.bowel_fistula_or_ostomy: (2.5, "intestinal fluid loss"),
        Flag.urinary_diversion: (2.5, "bowel exchanges urine chloride for bicarbonate"),
    },
    no_history=NoHistory(
        frozenset({Flag.diarrhea, Flag.laxatives, Flag.bowel_fistula_or_ostomy, Flag.urinary_diversion}),
        "history: no diarrhea, laxatives, fistula or urinary diversion recorded",
        -1.0,
        "hidden laxative use is still possible",
    ),
)  # fmt: skip
