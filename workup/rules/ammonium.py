"""One call on renal ammonium excretion, from measured NH4 and the two urine gaps.

The readings come from :mod:`.readings`; the call becomes the ``ammonium`` answer of
:mod:`.questions`, whose strength scales the ammonium rows of every cause's table.
"""

from __future__ import annotations

from dataclasses import dataclass

from workup.acidbase.wording import fmt
from workup.frozen import builder
from workup.rules.readings import Reading, Readings
from workup.settings import DEFAULTS, Settings

AMMONIUM_SOURCES: tuple[tuple[str, float], ...] = (
    ("measured_ammonium", 3.0),
    ("urine_osmolal_gap", 2.0),
    ("urine_anion_gap", 1.5),
)
"""Base weight of each ammonium reading. A measured ammonium is the reference; the osmolal gap
tracks it better than the anion gap (Kamel et al., AJKD 1997; Kim et al., AJKD 1996), and the
anion gap correlates poorly in some settings (Raphael et al., CJASN 2018; Uribarri & Oh, JASN
2021)."""
CORROBORATION = 0.5
"""Extra weight for each weaker ammonium reading that agrees with the leading one (× its
reliability)."""


@dataclass(frozen=True, slots=True)
class AmmoniumCall:
    """The case's answer on renal ammonium excretion, from the most reliable reading."""

    word: str
    """``high`` (adequate response) or ``low``."""
    weight: float
    """Effective weight of the leading reading plus corroboration."""
    lead: Reading
    """The reading that drives the call."""
    text: str
    """The call in words, naming readings that agree or were outweighed."""
    grade: str = "adequate"
    """How strong the call is: ``low``, ``adequate`` or ``clearly_high`` (the leading reading
    several times its low cut-off, see :func:`grade`). A clearly high call answers the
    ``ammonium`` question as ``clearly_high``, whose rows count strongly against the causes
    that lower ammonium."""


_AMMONIUM_WORD = {
    "adequate": "high",
    "negative": "high",
    "low": "low",
    "positive": "low",
}

_new_ammonium_call = builder(AmmoniumCall)


def _clearly_high_cut(index: str | None, s: Settings) -> float | None:
    """The clearly-high cut-off of the finding a reading rests on; None when it has none (the
    urine anion gap tracks ammonium too loosely to be graded: Kim et al., AJKD 1996; Raphael
    et al., CJASN 2018)."""
    if index == "urine_osmolal_gap":
        return s.uog_clearly_high_above
    if index == "urine_ammonium_estimate":
        return s.urine_ammonium_clearly_high_above
    if index == "urine_ammonium_creatinine_ratio":
        return s.nh4_creatinine_clearly_high_above
    return None


def grade(r: Reading, s: Settings) -> str:
    """``low``, ``adequate`` or ``clearly_high`` for an ammonium reading that makes a call (word
    ``adequate``, ``negative``, ``low`` or ``positive``). Cut-offs and sources: the settings
    ``uog_clearly_high_above``, ``urine_ammonium_clearly_high_above`` and
    ``nh4_creatinine_clearly_high_above``."""
    if _AMMONIUM_WORD[r.word] == "low":
        return "low"
    cut = _clearly_high_cut(r.index, s)
    if cut is not None and r.value is not None and r.value > cut:
        return "clearly_high"
    return "adequate"


def ammonium(rd: Readings, s: Settings = DEFAULTS) -> AmmoniumCall | None:
    """Combine measured NH4, the urine osmolal gap and the urine anion gap into one call.

    The reading with the highest effective weight (base × reliability) leads; agreeing weaker
    readings add :data:`CORROBORATION` × their reliability each; disagreeing ones are named as
    outweighed and add nothing. A not-valid reading never appears here (it was set aside in
    :func:`gather`). The leading reading also sets the call's :func:`grade`.
    """
    cands = []
    for key, base in AMMONIUM_SOURCES:
        r = rd.get(key)
        if r is not None and r.word in _AMMONIUM_WORD:
            cands.append((base * r.factor, base, r))
    if not cands:
        return None
    cands.sort(key=lambda c: -c[0])
    w, _, lead = cands[0]
    word = _AMMONIUM_WORD[lead.word]
    agree = [c for c in cands[1:] if _AMMONIUM_WORD[c[2].word] == word]
    differ = [c for c in cands[1:] if _AMMONIUM_WORD[c[2].word] != word]
    strength = grade(lead, s)
    level = {"low": "low", "adequate": "adequate (high)", "clearly_high": "clearly high"}[strength]
    text = f"{lead.text} reads ammonium excretion as {level}"
    if strength == "clearly_high":
        text += f" (over {fmt(_clearly_high_cut(lead.index, s) or 0.0)})"
        if lead.index == "urine_osmolal_gap":
            text += (
                "; estimated from the gap, which assumes ammonium travels with monovalent anions"
            )
    if agree:
        text += "; agreeing: " + ", ".join(c[2].text for c in agree)
    if differ:
        text += "; outweighed: " + ", ".join(f"{c[2].text} reading {c[2].word}" for c in differ)
    aside = [v for k, v in rd.set_aside.items() if k in dict(AMMONIUM_SOURCES)]
    if aside:
        text += "; set aside: " + "; ".join(aside)
    weight = w + sum(CORROBORATION * c[2].factor for c in agree)
    return _new_ammonium_call(word, weight, lead, text, strength)
