"""A chloride load (saline): a dilutional acidosis with a normal renal response, recognised from
the fluid chart rather than the laboratory pattern.

One row per answer that bears on the cause; see :class:`workup.rules.cause.Cause`.
"""

from __future__ import annotations

from workup.context import Flag
from workup.rules.cause import Cause, NoHistory

CAUSE = Cause(
    id="chloride_load",
    name="Chloride load (saline)",
    questions=("ammonium", "urine_ph"),
    answers={
        ("ammonium", "high"): (0.5, "a normal renal response"),
        ("ammonium", "clearly_high"): (0.5, "a normal renal response"),
        ("ammonium", "low"): (-0.5, "a chloride load alone leaves ammonium excretion intact"),
        ("urine_ph", "acidified"): (0.5, "a normal renal response"),
    },
    history={
        Flag.saline_load: (3.0, "chloride-rich fluid dilutes bicarbonate"),
        Flag.ketoacidosis: (1.0, "ketoanions lost in urine during recovery leave a normal-gap "
                                 "component (from memory)"),
    },
    # A dilutional (saline) acidosis is recognised from the fluid chart alone: without a recorded
    # chloride load the laboratory pattern cannot make it more than unlikely.
    no_history=NoHistory(
        frozenset({Flag.saline_load}),
        "history: no chloride-rich fluid recorded",
        -4.0,
        "the acidosis cannot be dilutional without a chloride load",
    ),
)  # fmt: skip
