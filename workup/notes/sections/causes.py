"""The ``causes`` section: the ranked causes of a normal-gap acidosis, for and against each.

A consult note gives one list item per cause still in play; a daily note one or two sentences.
"""

from __future__ import annotations

from workup.findings import PatternCall, Verdict
from workup.notes import phrases as ph
from workup.notes.sections.context import Context, Section
from workup.notes.sections.evidence import evidence_text

_VERDICT_WORD = {
    Verdict.likely: "likely",
    Verdict.possible: "possible",
    Verdict.unlikely: "unlikely",
}


def causes_section(c: Context) -> Section:
    """The ranked causes of a normal-gap acidosis, with the evidence for and against."""
    s = Section("causes", "Causes")
    for note in c.a.ranking_notes:
        if c.brief and note.startswith("Ammonium:"):
            continue  # the daily note's renal line already says which ammonium reading counts
        if c.brief and note.startswith("Unmeasured urine anions:"):
            continue  # the daily note's ammonium line already gives the urine anion gap's caveat
        if c.brief and note.startswith("No draw shows") and "is judged" in note:
            # The daily note keeps the conclusion; each test draw's reason is in the full note.
            note = note.partition(": ")[0] + "."
        s.sentences.append(ph.sentence(ph.tidy(note)))
        _head, sep, rest = ph.tidy(note).partition(": ")
        if sep:
            c.leads.add(rest)  # a reading the notes state in full is shortened under each cause
    calls = c.a.patterns
    if not calls:
        if not c.a.ranking_notes:
            s.sentences.append("No cause of a normal-gap acidosis was ranked.")
        return s
    if c.brief:
        s.sentences.extend(_causes_brief(c, calls))
    else:
        s.items.extend(_causes_full(c, calls))
    return s


def _causes_brief(c: Context, calls: list[PatternCall]) -> list[str]:
    out = []
    top = calls[0]
    if top.verdict is not Verdict.unlikely:
        text = f"{top.name} is {_VERDICT_WORD[top.verdict]}"
        if top.support:
            # One or two deciding findings: the second only when both fit in about two lines.
            two = evidence_text(top.support, c, 2)
            text += f" (for: {two if len(two) <= 150 else evidence_text(top.support[:1], c)})"
        out.append(ph.sentence(text))
        rest = calls[1:]
    else:
        rest = calls
    # A short note names the leading cause or causes (those sharing the top verdict) only; the
    # rest of the ranking is in the full note.
    tied = [p for p in rest if p.verdict is top.verdict and p.verdict is not Verdict.unlikely]
    if out and tied:
        out.append(
            ph.sentence(
                f"Equally {_VERDICT_WORD[top.verdict]}: " + ", ".join(p.name for p in tied[:2])
            )
        )
    return out


def _causes_full(c: Context, calls: list[PatternCall]) -> list[str]:
    """One list item per cause still in play, best first, then one for those ruled unlikely."""
    out = []
    first = True
    for p in calls:
        if p.verdict is Verdict.unlikely:
            continue
        lead = "the leading consideration" if first else _VERDICT_WORD[p.verdict]
        text = f"{p.name} is {lead}" + (f" ({_VERDICT_WORD[p.verdict]})" if first else "")
        first = False
        parts = [ph.sentence(text)]
        if p.support:
            parts.append(ph.sentence("In favour: " + evidence_text(p.support, c)))
        if p.against:
            parts.append(ph.sentence("Against: " + evidence_text(p.against, c)))
        if p.missing:
            parts.append(ph.sentence("Not yet known: " + ", ".join(ph.tidy(m) for m in p.missing)))
        out.append(" ".join(parts))
    unlikely = [p for p in calls if p.verdict is Verdict.unlikely]
    shared = {p.against[0].text if p.against else "" for p in unlikely}
    if len(unlikely) > 1 and len(shared) == 1 and "" not in shared:
        # One reason rules them all out (no normal-gap acidosis at all): say it once.
        why = ph.tidy(shared.pop())
        out.append(
            ph.sentence(f"Considered unlikely ({why}): " + ", ".join(p.name for p in unlikely))
        )
    elif unlikely:
        parts = [
            f"{p.name} ({evidence_text(p.against, c, 1)})" if p.against else p.name
            for p in unlikely
        ]
        out.append(ph.sentence("Considered unlikely: " + "; ".join(parts)))
    return out
