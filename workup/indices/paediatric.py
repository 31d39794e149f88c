"""Cautions for a child where the adult cut-offs an index reads against differ in children.

No paediatric reference range is hard-coded: none is named here with enough confidence, so the
adult cut-off stays and the finding carries a caution saying the children's range differs
(ranges described from memory). Applied by :func:`workup.indices.compute_all` after every index.
"""

from __future__ import annotations

import dataclasses

from workup.findings import Finding, Status
from workup.inputs import DrawInputs

ADULT_AGE = 18
"""Below this age the adult cut-offs are flagged."""
INFANT_AGE = 1
"""Below this age (age 0 in whole years) the infant's lower bicarbonate is flagged."""

CHILD_CUTOFFS: dict[str, str] = {
    "ttkg": "the TTKG cut-offs are adult values; children's TTKG runs higher (from memory)",
    "urine_potassium_creatinine_ratio": (
        "the urine K/creatinine cut-offs are adult values; children's ratios run higher, as "
        "creatinine excretion is lower (from memory)"
    ),
    "tmp_gfr": "the TmP/GFR range is adult; children's TmP/GFR runs higher (from memory)",
}
"""Index id → the caution for a patient under 18."""

INFANT_BICARBONATE = (
    "an infant's normal serum bicarbonate runs lower than the adult cut-off this reading uses "
    "to call an acidosis (from memory); compare with a paediatric reference range"
)
INFANT_ACIDOSIS_READINGS = ("urine_ph", "urine_anion_gap", "urine_osmolal_gap")
"""Indices read as "during an acidosis" by the adult bicarbonate cut-off."""


def with_caution(f: Finding, text: str) -> Finding:
    """``f`` with caution ``text``: an ok value becomes caution; the first reason still explains
    the status (a not-valid reason stays first)."""
    if f.value is None or f.status is Status.needs_input:
        return f
    reasons = list(f.reasons)
    if f.status is Status.not_valid:
        reasons.insert(1, text)
        return dataclasses.replace(f, reasons=tuple(reasons))
    return dataclasses.replace(f, status=Status.caution, reasons=(text, *reasons))


def child_cautions(x: DrawInputs, found: dict[str, Finding]) -> dict[str, Finding]:
    """``found`` with the children's cautions added when the patient is under 18 (in place)."""
    if x.age is None or x.age >= ADULT_AGE:
        return found
    for fid, text in CHILD_CUTOFFS.items():
        if fid in found:
            found[fid] = with_caution(found[fid], f"age {x.age}: {text}")
    if x.age < INFANT_AGE:
        for fid in INFANT_ACIDOSIS_READINGS:
            if fid in found:
                found[fid] = with_caution(found[fid], INFANT_BICARBONATE)
    return found
