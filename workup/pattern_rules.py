"""The readings the pattern ranker uses, and the weighted rules that turn them into evidence.

Two steps, kept apart so each can be read and tested alone, each in :mod:`workup.rules`:

1. :func:`gather` (``rules/readings.py``) picks, for each question (urine pH in acidosis,
   ammonium, potassium, FEHCO3 on loading, ...), one reading from the draw that can answer it.
   Only findings with status ok or caution become readings; a not-valid one is kept as "set
   aside" with its reason, so it can never drive a verdict.
2. :func:`judge` (``rules/judge.py``) applies the rule table of docs/ranking.md: each cause's
   module in ``rules/causes/`` gives it evidence for or against with a base weight (1 supportive,
   2 strong, 3 decisive) multiplied by the reading's reliability (ok 1.0, caution 0.5).

This module keeps the names the ranking and the tests import from it.
"""

from __future__ import annotations

from workup.rules.ammonium import AMMONIUM_SOURCES, CORROBORATION, AmmoniumCall, ammonium
from workup.rules.causes import MISSING, PATTERNS
from workup.rules.judge import judge
from workup.rules.questions import (
    MILD_ACIDOSIS_HCO3_MIN,
    QUESTION,
    TYPE4_USUAL_HCO3_MIN,
    missing_for,
)
from workup.rules.readings import (
    FURO_ACIDIFIED_BELOW,
    GLUCOSURIA_ABOVE,
    LOADING_INDICES,
    NAME,
    RENAL_GLUCOSE_THRESHOLD,
    STATUS_FACTOR,
    STEADY_INDICES,
    Reading,
    Readings,
    gather,
)
from workup.rules.readings import new_reading as _new_reading
from workup.rules.tally import Rule, Tally

__all__ = [
    "AMMONIUM_SOURCES",
    "CORROBORATION",
    "FURO_ACIDIFIED_BELOW",
    "GLUCOSURIA_ABOVE",
    "LOADING_INDICES",
    "MILD_ACIDOSIS_HCO3_MIN",
    "MISSING",
    "NAME",
    "PATTERNS",
    "QUESTION",
    "RENAL_GLUCOSE_THRESHOLD",
    "STATUS_FACTOR",
    "STEADY_INDICES",
    "TYPE4_USUAL_HCO3_MIN",
    "AmmoniumCall",
    "Reading",
    "Readings",
    "Rule",
    "Tally",
    "_new_reading",
    "ammonium",
    "gather",
    "judge",
    "missing_for",
]
