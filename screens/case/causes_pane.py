"""The F5 Causes tab: the ranked causes and next tests, as one keyboard-scrolled text.

The screen hands each new assessment down through ``show``; the pane posts nothing up.
"""

from __future__ import annotations

from rich.console import Group
from rich.text import Text
from textual.app import ComposeResult
from textual.containers import VerticalScroll
from textual.widget import Widget
from textual.widgets import Static

from screens.case.pane_base import WorkspacePane
from screens.findings_view import item
from workup.assess import Assessment


def causes_text(a: Assessment | None, error: str | None = None) -> Group:
    """The ranked causes of a normal-gap acidosis with for/against/missing, then next tests."""
    if a is None:
        return Group(Text(error or "No assessment yet."))
    out: list = [Text("Causes of a normal-gap acidosis (judged on every draw)", style="bold")]
    out += [item(note, 2, "italic") for note in a.ranking_notes]
    if not a.patterns:
        out.append(item("No cause ranked.", 2))
    for p in a.patterns:
        head = Text()
        head.append(f"{p.verdict.value.upper():<9}", style="bold reverse")
        head.append(f" {p.name}", style="bold")
        out += [Text(""), head]
        out += [item(f"+ for: {e.text}", 4) for e in p.support]
        out += [item(f"- against: {e.text}", 4) for e in p.against]
        if p.missing:
            out.append(item("? missing: " + ", ".join(p.missing), 4))
    out += [Text(""), Text("Suggested next tests", style="bold")]
    if not a.next_tests:
        out.append(item("none suggested", 2))
    for t in a.next_tests:
        out.append(item(f"* {t.text}", 2))
        if t.why:
            out.append(item(t.why, 6, "italic"))
    return Group(*out)


class CausesView(VerticalScroll):
    """The pattern ranking, scrollable by keyboard."""

    can_focus = True

    def compose(self) -> ComposeResult:
        yield Static("", id="causes-text")

    def show(self, a: Assessment | None, error: str | None = None) -> None:
        """Show the ranking of assessment ``a``."""
        self.query_one("#causes-text", Static).update(causes_text(a, error))


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
