"""The ``kidney`` section: eGFR and the tubular studies that were done."""

from __future__ import annotations

from workup.findings import Status
from workup.indices.kidney import egfr_id
from workup.notes import phrases as ph
from workup.notes.sections.context import Context, Section

_KIDNEY = (
    ("egfr", "the eGFR"),
    ("fe_bicarbonate", "the fractional excretion of bicarbonate"),
    ("urine_blood_pco2", "the urine-minus-blood pCO2"),
    ("fe_phosphate", "the fractional excretion of phosphate"),
    ("tmp_gfr", "the TmP/GFR"),
    ("fe_urate", "the fractional excretion of urate"),
)

_KIDNEY_BRIEF = {"fe_bicarbonate": "the FEHCO3", "urine_blood_pco2": "the U-B pCO2"}
"""The tubular studies a short note keeps (eGFR and the rest stay in the full note)."""


def kidney_section(c: Context) -> Section:
    """eGFR and the tubular studies that were done (absent ones are not listed as gaps here:
    the causes and suggested tests say which would help)."""
    s = Section("kidney", "Tubular" if c.brief else "Kidney function and tubular studies")
    parts = []
    for id, label in _KIDNEY:
        if id == "egfr" and egfr_id(c.case.patient.age) != id:  # a child: bedside Schwartz
            id, label = egfr_id(c.case.patient.age), "the eGFR (bedside Schwartz)"
        f = c.finding(id)
        if f is None or f.status is Status.needs_input:
            continue
        if c.brief and id not in _KIDNEY_BRIEF:
            continue
        parts.append(c.clause(id, _KIDNEY_BRIEF.get(id, label) if c.brief else label))
    parts = [p for p in parts if p]
    if parts:
        s.sentences.append(ph.sentence(ph.join_clauses(parts)))
    return s
