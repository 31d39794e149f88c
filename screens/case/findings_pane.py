"""The F4 Findings tab: the draw's disorders and indices (screens/findings_view.py draws them).

The screen hands each new assessment down through ``show``; the pane posts nothing up.
"""

from __future__ import annotations

from textual.app import ComposeResult
from textual.widget import Widget
from textual.widgets import Static

from screens.case.pane_base import WorkspacePane
from screens.findings_view import FindingsView
from workup.assess import Assessment


class FindingsPane(WorkspacePane):
    """The findings of the shown draw."""

    def __init__(self) -> None:
        super().__init__("F4 Findings", id="tab-findings")

    def compose(self) -> ComposeResult:
        """Which draw the findings are of (several draws only), then the findings view."""
        yield Static("", id="findings-draw")
        yield FindingsView(id="findings")

    def show(self, a: Assessment | None, error: str | None, header: str | None = None) -> None:
        """Show assessment ``a`` (or ``error``, why there is none) under ``header``, the line
        saying which draw it is of and what the other draws are for."""
        line = self.query_one("#findings-draw", Static)
        line.update(header or "")
        line.display = bool(header)
        self.query_one(FindingsView).show(a, error, with_draw_line=not header)

    def focus_target(self) -> Widget | None:
        """The index table, to move through the indices."""
        return self.query_one("#indices")
