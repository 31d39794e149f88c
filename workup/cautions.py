"""The standing cautions: shown in the README, in the app and in every drafted note."""

from __future__ import annotations

CAUTION_LINES: tuple[str, ...] = (
    "Decision support, not a diagnosis.",
    "Verify every value against the patient and your laboratory's reference ranges.",
    "Defer to local protocols and licensed clinical judgement.",
)

CAUTION_SHORT = "Decision support, not a diagnosis: check patient and local ranges."
"""One line for a status bar: with its "! " mark and " (F1)" it fits 80 columns whole."""

CAUTION_TEXT = " ".join(CAUTION_LINES)
"""The cautions as one sentence group, for notes and help screens."""
