"""Quoting the analysis's evidence in a sentence, shortening a long lead already written.

Shared by the acid-base section (the evidence of each disorder) and the causes section (the
evidence for and against each cause); what it has written is kept in the :class:`Context`.
"""

from __future__ import annotations

from workup.findings import Evidence
from workup.notes import phrases as ph
from workup.notes.sections.context import Context

LONG_LEAD = 80
"""An evidence lead longer than this is written in full once and shortened after that."""


def evidence_text(ev: tuple[Evidence, ...], c: Context, limit: int | None = None) -> str:
    """Evidence texts as the analysis wrote them, joined; a long lead already written is cut.

    The ranker writes one reading (say the ammonium verdict) as the lead of an item for each
    cause it bears on, "<reading>: <what it means for this cause>"; repeating the whole reading
    under every cause buries the point, so the second time only its first clause is kept.
    """
    picked = ev if limit is None else ev[:limit]
    out = []
    for e in picked:
        text = ph.tidy(e.text)
        if e.index == "henderson_hasselbalch_ph":
            # The failed gas check opens the section in full; its evidence is not quoted twice.
            for said in c.said:
                if said and len(said) > 40 and said in text:
                    text = text.replace(said, "as above")
        lead, sep, why = text.rpartition(": ")
        if sep and c.brief:
            # A short note keeps the deciding finding itself; what it means is in the full note.
            text = lead.split("; ")[0]
            c.leads.add(lead)
        elif sep and len(lead) > LONG_LEAD:
            if lead in c.leads:
                text = f"{lead.split('; ')[0]}, as above: {why}"
            c.leads.add(lead)
        out.append(text)
    return "; ".join(out)
