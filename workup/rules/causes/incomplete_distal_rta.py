"""Incomplete distal RTA: the collecting duct cannot lower the urine pH when challenged, yet the
plasma bicarbonate stays normal; it often shows as calcium-phosphate stones or nephrocalcinosis.

It is judged only when no draw shows a normal-gap acidosis (with one, classic distal RTA covers
the defect), on an acidification test: furosemide–fludrocortisone (Walsh et al., Kidney Int 2007,
from memory) or short ammonium chloride (Wrong & Davies, QJM 1959, from memory), normal when any
urine pH is below 5.3. The test is imperfect (Dhayat et al., CJASN 2016: sensitivity 77%,
specificity 85% against ammonium chloride in stone formers), so a failure supports the cause
without settling it, while a pass (negative predictive value 98% there) argues hard against.

One row per answer that bears on the cause; see :class:`workup.rules.cause.Cause`.
"""

from __future__ import annotations

from workup.context import Flag
from workup.rules.cause import Cause, NoHistory
from workup.rules.readings import FURO_ACIDIFIED_BELOW

CAUSE = Cause(
    id="incomplete_distal_rta",
    name="Incomplete distal RTA (no systemic acidosis)",
    questions=("acidification_test",),
    answers={
        ("acidification_test", "not_acidified"): (
            2.0,
            f"never below {FURO_ACIDIFIED_BELOW} without a systemic acidosis; supports a distal "
            "defect but does not prove it (specificity about 85%)",
        ),
        ("acidification_test", "acidified"): (-4.0, "distal acidification is intact"),
    },
    history={
        Flag.kidney_stones: (1.0, "stones, often calcium phosphate, are how the incomplete form presents"),
        Flag.nephrocalcinosis: (1.5, "nephrocalcinosis is typical of a distal acidification defect"),
        Flag.autoimmune_disease: (0.5, "Sjögren's syndrome can cause a distal defect"),
    },
    no_history=NoHistory(
        frozenset({Flag.kidney_stones, Flag.nephrocalcinosis, Flag.autoimmune_disease}),
        "history: no kidney stones, nephrocalcinosis or autoimmune disease recorded",
        -1.0,
        "without them a failed test is more often a false positive",
    ),
)  # fmt: skip
