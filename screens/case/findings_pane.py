"""The F4 Findings tab: the draw's disorders and indices (screens/findings_view.py draws them).

The screen hands each new assessment down through ``show``; the pane posts nothing up.
"""

from __future__ import annotations

from textual.app import ComposeResult
from textual.widget import Widget

from screens.case.pane_base import WorkspacePane
from screens.findings_view import FindingsView
from workup.assess import Assessment


class FindingsPane(WorkspacePane):
    """The findings of the shown draw."""

    def __init__(self) -> None:
        super().__init__("F4 Findings", id="tab-findings")

    def compose(self) -> ComposeResult:
        """The findings view (filled by ``show``)."""
        yield FindingsView(id="findings")

    def show(self, a: Assessment | None, error: str | None) -> None:
        """Show assessment ``a`` (or ``error``, why there is none)."""
        self.query_one(FindingsView).show(a, error)

    def focus_target(self) -> Widget | None:
        """The index table, to move through the indices."""
        return self.query_one("#indices")
