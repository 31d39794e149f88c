"""The ``renal_acid`` section: urine pH, the urine anion and osmolal gaps, and ammonium.

When the measures of ammonium excretion disagree, the section says so and which would settle it.
"""

from __future__ import annotations

from workup.findings import Finding, Status
from workup.notes import phrases as ph
from workup.notes.sections.context import Context, Section

_RENAL = (
    ("urine_ph", "the urine pH"),
    ("urine_anion_gap", "the urine anion gap"),
    ("urine_osmolal_gap", "the urine osmolal gap"),
    ("urine_ammonium_estimate", None),
    ("urine_ammonium_creatinine_ratio", "the urine ammonium/creatinine ratio"),
)


def _ammonium_label(f: Finding) -> str:
    if f.extra.get("measured"):
        return "the measured urine ammonium"
    return "the urine ammonium estimated from the osmolal gap"


def renal_acid_section(c: Context) -> Section:
    """Urine pH, the urine anion and osmolal gaps or measured ammonium, with their caveats."""
    s = Section("renal_acid", "Ammonium" if c.brief else "Renal acid excretion")
    draw = c.draw
    if draw is not None and not draw.urine.measurements() and c.brief:
        s.sentences.append("Not assessed: no urine with this draw; a spot urine is suggested.")
        return s
    if draw is not None and not draw.urine.measurements():
        s.sentences.append(
            "Not assessed: no urine studies were entered with this draw; a spot urine for "
            "sodium, potassium, chloride, pH, osmolality, urea, glucose and creatinine, taken "
            "with the blood, is suggested."
        )
        return s
    parts = []
    for id, label in _RENAL:
        f = c.finding(id)
        if f is None:
            continue
        if c.brief and (f.status is Status.needs_input or id == "urine_ph"):
            continue  # the short note keeps the ammonium reading; urine pH is in the full one
        if c.brief and id == "urine_ammonium_estimate" and not f.extra.get("measured"):
            continue  # the daily note keeps the osmolal gap it was estimated from
        if c.brief and id == "urine_ammonium_creatinine_ratio" and parts:
            continue  # one ammonium measure is enough for a daily note
        words = None
        if id == "urine_ph" and not c.brief and not c.acidosis:
            # "appropriately" and "despite the acidosis" only hold during an acidosis.
            words = {"acidified": "acidified", "not_acidified": "not acidified"}.get(
                ph.plain_word(f)
            )
        parts.append(c.clause(id, label or _ammonium_label(f), words=words))
    parts = [p for p in parts if p]
    if parts:
        s.sentences.append(ph.sentence(ph.join_clauses(parts)))
    s.sentences.extend(_ammonium_summary(c))
    return s


def _ammonium_summary(c: Context) -> list[str]:
    directions: dict[str, str] = {}
    measured = False
    for id, table in ph.AMMONIUM_DIRECTION.items():
        f = c.finding(id)
        if f is None or not ph.stated(f) or ph.plain_word(f) not in table:
            continue
        if "unmeasured_anions" in f.extra:
            continue  # a gap beside ample ammonium says nothing about it (see its caution)
        directions[id] = table[ph.plain_word(f)]
        if id == "urine_ammonium_estimate" and f.extra.get("measured"):
            measured = True
    found = set(directions.values())
    if len(found) > 1:
        if measured:
            return [
                "These measures disagree about ammonium excretion; the measured urine ammonium "
                "is the direct one."
            ]
        return [
            "These measures disagree about ammonium excretion; a measured urine ammonium would "
            "settle it."
        ]
    if len(found) == 1 and len(directions) > 1 and not c.brief:
        return [f"Taken together, renal ammonium excretion appears {found.pop()}."]
    return []
