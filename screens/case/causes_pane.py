"""The F5 Causes tab: the ranked causes and next tests (screens/findings_view.py draws them).

The screen hands each new assessment down through ``show``; the pane posts nothing up.
"""

from __future__ import annotations

from textual.app import ComposeResult
from textual.widget import Widget

from screens.case.pane_base import WorkspacePane
from screens.findings_view import CausesView
from workup.assess import Assessment


class CausesPane(WorkspacePane):
    """The causes judged on every draw of the case."""

    def __init__(self) -> None:
        super().__init__("F5 Causes", id="tab-causes")

    def compose(self) -> ComposeResult:
        """The ranking view (filled by ``show``)."""
        yield CausesView(id="causes")

    def show(self, a: Assessment | None, error: str | None) -> None:
        """Show the ranking of assessment ``a`` (or ``error``, why there is none)."""
        self.query_one(CausesView).show(a, error)

    def focus_target(self) -> Widget | None:
        """The ranking itself, to scroll it by keyboard."""
        return self.query_one(CausesView)
