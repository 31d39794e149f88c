"""The ``gaps`` section: the anion gap, its albumin correction, the delta ratio, the osmolal gap."""

from __future__ import annotations

from workup.findings import Status
from workup.notes import phrases as ph
from workup.notes.sections.context import Context, Section


def gaps_section(c: Context) -> Section:
    """Anion gap, its albumin-corrected value, the delta ratio and (consult) the osmolal gap."""
    s = Section("gaps", "Gaps")
    parts = [c.clause("anion_gap", "the anion gap")]
    corrected = c.finding("anion_gap_albumin_corrected")
    if corrected is not None and (not c.brief or corrected.status is not Status.needs_input):
        parts.append(c.clause("anion_gap_albumin_corrected", "the albumin-corrected gap"))
    delta = c.finding("delta_ratio")
    # The delta ratio only means something alongside a metabolic acidosis.
    if delta is not None and c.acidosis and delta.status is not Status.needs_input:
        parts.append(c.clause("delta_ratio", "the delta ratio"))
    osm = c.finding("serum_osmolal_gap")
    if osm is not None and not c.brief and osm.status is not Status.needs_input:
        parts.append(c.clause("serum_osmolal_gap", "the serum osmolal gap"))
    parts = [p for p in parts if p]
    if parts:
        s.sentences.append(ph.sentence(ph.join_clauses(parts)))
    return s
