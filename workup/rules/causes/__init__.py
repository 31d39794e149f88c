"""The candidate causes of a normal-gap acidosis: one module per cause, each a table of rules.

To add a cause, write a module here that fills a :class:`~workup.rules.cause.Cause` and list it
in :data:`CAUSES`; the list's order breaks ties in the ranking.
"""

from __future__ import annotations

from workup.rules.cause import Cause
from workup.rules.causes import (
    chloride_load,
    ckd_acidosis,
    distal_rta,
    gi_bicarbonate_loss,
    hyperkalemic_distal_rta,
    hypoaldosteronism,
    incomplete_distal_rta,
    proximal_rta,
)

CAUSES: tuple[Cause, ...] = (
    gi_bicarbonate_loss.CAUSE,
    proximal_rta.CAUSE,
    distal_rta.CAUSE,
    hyperkalemic_distal_rta.CAUSE,
    hypoaldosteronism.CAUSE,
    ckd_acidosis.CAUSE,
    chloride_load.CAUSE,
    incomplete_distal_rta.CAUSE,
)
"""Every cause the ranking judges, in the order used to break ties."""

PATTERNS: dict[str, str] = {c.id: c.name for c in CAUSES}
"""Candidate causes of a normal-gap acidosis, in the order used to break ties."""

MISSING: dict[str, tuple[str, ...]] = {c.id: c.questions for c in CAUSES}
"""The questions that bear on each pattern; an unanswered one is listed as missing."""
