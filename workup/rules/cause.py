"""The shape of one cause's rules: a table from answers and history to weighted evidence.

Each module of :mod:`workup.rules.causes` fills one :class:`Cause`; :mod:`.judge` applies every
table to the answers of :mod:`.questions`. Weights and their reasons are in docs/ranking.md.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field

from workup.context import Flag

CLEARLY_HIGH_AGAINST = 4.0
"""Share of the ammonium call's strength that a clearly high ammonium (several times the low
cut-off, :func:`workup.rules.ammonium.grade`) counts against each cause that lowers ammonium
(classic and voltage distal RTA, type 4, CKD), where an adequate one counts 1. With an ok
osmolal gap and an agreeing urine anion gap (strength 2.5) that is −10, more than all a type 4
picture gathers otherwise (hyperkalemia, low potassium output, acidified urine, diabetes and a
RAAS blocker: +9), so such a cause is left unlikely: the acidosis of these causes is a failure
of ammonium excretion (Kim et al., AJKD 1996; Kamel et al., AJKD 1997; Berend et al., Kidney Dis
2017, Table 1). The multiple itself is a design choice."""

Weighted = tuple[float, str]
"""(signed base weight: > 0 for, < 0 against; why, in words). Base weights run 1 supportive,
2 strong, 3 decisive; the judge multiplies them by the answer's scale (a reading's reliability,
or the strength of the ammonium call). A reason on an answer row may quote a setting by name in
braces, e.g. ``"below {egfr_ckd_below}"`` (history reasons are used as written)."""


@dataclass(frozen=True, slots=True)
class NoHistory:
    """Evidence a cause gets when none of the history that usually comes with it is recorded."""

    flags: frozenset[Flag]
    """The context flags any one of which would make this rule stay silent."""
    text: str
    """What is missing from the history, in words (the evidence's lead)."""
    weight: float
    """Signed base weight (normally < 0)."""
    why: str
    """Why the absence counts, in words."""


@dataclass(frozen=True, slots=True)
class Cause:
    """One candidate cause of a normal-gap acidosis and every rule that bears on it."""

    id: str
    """Stable id (used in case JSON, notes, the next-test signatures)."""
    name: str
    """The cause in words, as the ranking shows it."""
    questions: tuple[str, ...]
    """The questions that bear on it, in the order missing answers are listed (keys of
    :data:`workup.rules.questions.QUESTION`)."""
    answers: Mapping[tuple[str, str], Weighted] = field(default_factory=dict)
    """(question, answer word) → weighted reason. Words are listed in
    :data:`workup.rules.questions.ANSWERS`; an answer without a row says nothing about the cause.
    On the ``ammonium`` question the weight is a share of the ammonium call's strength."""
    history: Mapping[Flag, Weighted] = field(default_factory=dict)
    """Context flag → weighted reason, when the flag is recorded."""
    no_history: NoHistory | None = None
    """Evidence when none of the usual history is recorded, if the cause has such a rule."""
