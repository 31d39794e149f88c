"""The disorder ids and names, and the ordered list one draw's disorders are collected in.

Every step of the analysis adds to a :class:`DisorderList`; the primary disorder comes first and
carries the evidence common to the whole draw (a gas caution, a venous sample).
"""

from __future__ import annotations

from workup.findings import Disorder, Evidence, new_disorder

NAMES = {
    "normal_gap_metabolic_acidosis": "Normal-gap metabolic acidosis",
    "high_gap_metabolic_acidosis": "High-gap metabolic acidosis",
    "metabolic_acidosis": "Metabolic acidosis, gap not known",
    "metabolic_alkalosis": "Metabolic alkalosis",
    "respiratory_acidosis": "Respiratory acidosis",
    "respiratory_alkalosis": "Respiratory alkalosis",
}
"""Disorder ids and names. ``metabolic_acidosis`` is used only when the anion gap cannot be
computed (serum sodium or chloride missing), so the gap type is not guessed."""

METABOLIC_ACIDOSES = frozenset(
    {"normal_gap_metabolic_acidosis", "high_gap_metabolic_acidosis", "metabolic_acidosis"}
)
"""The ids that mean a metabolic acidosis of some kind."""


class DisorderList:
    """Collects disorders in order, primary first, without duplicates."""

    def __init__(self, common: list[Evidence]):
        self.out: list[Disorder] = []
        """The disorders so far, in the order they were added."""
        self.common = common
        """Evidence about the whole draw, appended to the primary disorder's own."""

    def add(
        self,
        did: str,
        primary: bool,
        evidence: list[Evidence],
        detail: str | None = None,
        compensation: str | None = None,
    ) -> None:
        """Add disorder ``did`` unless it is already listed (the first mention wins)."""
        if any(d.id == did for d in self.out):
            return
        ev = [*evidence, *self.common] if primary else evidence
        self.out.append(new_disorder(did, NAMES[did], primary, tuple(ev), detail, compensation))

    def has(self, ids: frozenset[str] | set[str]) -> bool:
        """True when any of ``ids`` is listed."""
        return any(d.id in ids for d in self.out)
