"""The messages a case pane posts up to the case screen (attributes down, messages up).

A form pane edits the working copy it was handed in place, then says so; the screen marks the
case unsaved and recomputes the assessment. The screen answers by calling the panes' methods.
"""

from __future__ import annotations

from textual.message import Message


class WorkingCopyEdited(Message):
    """A form changed the case or the shown draw in place."""

    def __init__(self, recompute: bool = True) -> None:
        super().__init__()
        self.recompute = recompute
        """False when the change cannot touch the assessment (free-text notes)."""


class DrawChosen(Message):
    """The fellow picked another draw in the draw list."""

    def __init__(self, index: int) -> None:
        super().__init__()
        self.index = index
        """The position of the chosen draw in the case."""


class UnitSystemChanged(Message):
    """The case's unit system changed (the case already holds the new one)."""
