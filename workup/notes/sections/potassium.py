"""The ``potassium`` section: serum potassium, and the kidney's handling read against it.

A TTKG or urine K/creatinine reading is worded by the serum potassium state (low, normal, high),
taken from the index when it says and from the settings' limits otherwise.
"""

from __future__ import annotations

from workup.analytes import Panel
from workup.findings import Status
from workup.notes import phrases as ph
from workup.notes.sections.context import Context, Section
from workup.notes.values import written_number
from workup.settings import DEFAULTS

_KALEMIA_WORD = {"hypo": "low", "normal": "normal", "hyper": "high"}

# How a TTKG or urine K/creatinine reading reads against the serum potassium state.
_K_READING = {
    ("hypo", "low"): "appropriately low for the hypokalemia: the kidney is conserving potassium",
    ("hypo", "high"): "inappropriately high for the hypokalemia: a renal potassium loss",
    ("hyper", "low"): "inappropriately low for the hyperkalemia: a reduced aldosterone effect, "
    "from deficiency or resistance",
    ("hyper", "high"): "appropriately high for the hyperkalemia",
}


_K_READING_BRIEF = {
    ("hypo", "low"): "appropriately low: renal conservation",
    ("hypo", "high"): "inappropriately high: renal K loss",
    ("hyper", "low"): "inappropriately low: reduced aldosterone effect",
    ("hyper", "high"): "appropriately high",
}


def _kalemia(c: Context) -> str | None:
    for id in ("ttkg", "urine_potassium_creatinine_ratio"):
        f = c.finding(id)
        if f is not None and f.extra.get("kalemia") in _KALEMIA_WORD:
            return str(f.extra["kalemia"])
    k = _serum_potassium(c)
    if k is None:
        return None
    settings = c.a.settings or DEFAULTS
    if k < settings.potassium_low:
        return "hypo"
    if k > settings.potassium_high:
        return "hyper"
    return "normal"


def _serum_potassium(c: Context) -> float | None:
    draw = c.draw
    return None if draw is None else draw.serum.canonical("potassium")


def _k_clause(c: Context, id: str, label: str, kalemia: str | None) -> str | None:
    f = c.finding(id)
    if f is None or (c.brief and f.status is Status.needs_input):
        return None
    if not ph.stated(f):
        return c.clause(id, label)
    table = _K_READING_BRIEF if c.brief else _K_READING
    words = table.get((kalemia or "", ph.plain_word(f)))
    if words is None:
        return c.clause(id, label)
    if c.brief:
        label = ph.BRIEF_LABEL.get(id, label)
    return f"{label} is {ph.value_of(f)}" + ph.caution_suffix(f, words, c.said, c.brief)


def potassium_section(c: Context) -> Section:
    """Serum potassium and the kidney's potassium handling (TTKG, urine K/creatinine)."""
    s = Section("potassium", "Potassium")
    draw = c.draw
    kalemia = _kalemia(c)
    m = None if draw is None else draw.serum.measurements().get("potassium")
    serum_k = None
    if m is None:
        s.sentences.append("Serum potassium is not available.")
    elif c.brief:
        # Joined to the kidney's handling below, one sentence in a daily note.
        serum_k = (
            f"serum K {written_number(Panel.serum, 'potassium', m)} {m.unit} "
            f"({_KALEMIA_WORD[kalemia or 'normal']})"
        )
    else:
        s.sentences.append(
            f"Serum potassium {written_number(Panel.serum, 'potassium', m)} {m.unit} is "
            f"{_KALEMIA_WORD[kalemia or 'normal']}."
        )
    if draw is not None and not draw.urine.measurements():
        if serum_k:
            s.sentences.append(ph.sentence(serum_k))
        return s  # the renal section already says no urine was entered
    ratio_id, ratio_label = "urine_potassium_creatinine_ratio", "the urine K/creatinine ratio"
    ratio_f = c.finding(ratio_id)
    if c.brief and ratio_f is not None and ph.stated(ratio_f):
        # One measure of potassium handling is enough for a daily note.
        parts = [_k_clause(c, ratio_id, ratio_label, kalemia)]
    else:
        # In reading order, so that a caveat shared by both is written in full first.
        ttkg = _k_clause(c, "ttkg", "the TTKG", kalemia)
        parts = [ttkg, _k_clause(c, ratio_id, ratio_label, kalemia)]
    parts = [p for p in [serum_k, *parts] if p]
    if parts:
        s.sentences.append(ph.sentence(ph.join_clauses(parts)))
    return s
