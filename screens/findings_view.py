"""Showing an assessment: the indices with their status, the disorders, the ranked causes.

Every number shown here is one the core computed, printed with the core's status word and mark
(``workup.findings.STATUS_WORD``/``STATUS_MARK``) so that status never rests on colour alone.
"""

from __future__ import annotations

from rich.console import Group
from rich.padding import Padding
from rich.text import Text
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Vertical, VerticalScroll
from textual.widgets import DataTable, Static

from workup.assess import Assessment
from workup.findings import STATUS_MARK, STATUS_WORD, Finding, Status
from workup.formatting import fmt_value
from workup.short_names import short_name

STATUS_STYLE = {
    Status.ok: "status-ok",
    Status.caution: "status-caution",
    Status.not_valid: "status-not-valid",
    Status.needs_input: "status-needs-input",
}

LEGEND = "  ".join(f"{STATUS_MARK[s]} {STATUS_WORD[s]}" for s in Status)
"""The status marks in words, for every view that shows them."""


def status_text(f: Finding) -> Text:
    """``mark word`` of a finding's status, styled by the stylesheet's status classes."""
    style = {
        Status.ok: "bold",
        Status.caution: "bold reverse",
        Status.not_valid: "bold underline",
        Status.needs_input: "dim",
    }[f.status]
    return Text(f"{STATUS_MARK[f.status]} {STATUS_WORD[f.status]}", style=style)


def _item(text: str, indent: int, style: str = "") -> Padding:
    """One line of text whose wrapped lines keep the indent (hanging, readable lists)."""
    return Padding(Text(text, style=style), (0, 0, 0, indent))


def reading_words(f: Finding) -> str:
    """The core's reading of a finding in plain words ("" when there is no value)."""
    if not f.interpretation or f.value is None:
        return ""
    return f.interpretation.replace("_", " ")


def finding_detail(f: Finding, show_source: bool) -> Group:
    """The reasons and missing inputs of one finding; formula and source when asked for."""
    head = Text()
    head.append(f"{f.name}: ", style="bold")
    head.append(fmt_value(f) if f.value is not None else "no value")
    head.append("  [")
    head.append_text(status_text(f))
    head.append("]")
    if reading_words(f):
        head.append(f"  reading: {reading_words(f)}")
    out: list = [head]
    out += [_item(f"- {r}", 2) for r in f.reasons]
    if f.needs:
        out.append(_item("missing: " + ", ".join(f.needs), 2))
    if show_source:
        out.append(_item(f"formula: {f.formula or 'not given'}", 2))
        out.append(_item(f"source: {f.source or 'not given'}", 2))
    else:
        out.append(_item("(s: formula and source)", 2, "dim"))
    return Group(*out)


class IndexTable(DataTable):
    """The indices, one row each; s toggles formula and source of the selected one."""

    BINDINGS = [Binding("s", "toggle_source", "Formula/source", show=False)]

    def action_toggle_source(self) -> None:
        """Show or hide the formula and source of the selected index."""
        view = next(a for a in self.ancestors if isinstance(a, FindingsView))
        view.show_source = not view.show_source
        view.refresh_detail()


class FindingsView(Vertical):
    """Disorders of the draw, then its indices as a table, then the selected index in full."""

    def __init__(self, **kwargs) -> None:
        super().__init__(**kwargs)
        self.assessment: Assessment | None = None
        self.show_source = False
        self._ids: list[str] = []
        self._width = 0
        self._error: str | None = None

    def compose(self) -> ComposeResult:
        yield Static("", id="disorders")
        yield IndexTable(id="indices", cursor_type="row", zebra_stripes=False)
        yield Static("", id="index-detail")

    def on_mount(self) -> None:
        self._columns(self.size.width or 80)

    def _columns(self, width: int) -> None:
        # Value and status (mark and word) keep their full width; name and reading share the rest.
        table = self.query_one(IndexTable)
        table.clear(columns=True)
        value = 14 if width < 100 else 18  # wide terminals show "mL/min/1.73 m2" whole
        rest = max(width - 2 - (value + 13) - 2 * 4, 24)
        name = min(max(rest * 2 // 3, 16), 40)
        self._width = width
        table.add_column("Index", key="name", width=name)
        table.add_column("Value", key="value", width=value)
        table.add_column("Status", key="status", width=13)
        table.add_column("Reading", key="reading", width=rest - name)

    def on_resize(self) -> None:
        if self.size.width and self.size.width != self._width:
            self._columns(self.size.width)
            self.show(self.assessment, self._error)

    def show(self, a: Assessment | None, error: str | None = None) -> None:
        """Show assessment ``a`` (or why there is none)."""
        self.assessment = a
        self._error = error
        disorders = self.query_one("#disorders", Static)
        table = self.query_one(IndexTable)
        row = table.cursor_row
        table.clear()
        self._ids = []
        if a is None:
            disorders.update(error or "No assessment yet.")
            self.refresh_detail()
            return
        disorders.update(disorders_text(a))
        for f in a.indices.values():
            table.add_row(
                short_name(f.id, f.name),
                fmt_value(f) if f.value is not None else "—",
                status_text(f),
                reading_words(f),
                key=f.id,
            )
            self._ids.append(f.id)
        if self._ids:
            table.move_cursor(row=min(max(row, 0), len(self._ids) - 1))
        self.refresh_detail()

    def selected(self) -> Finding | None:
        """The finding under the table's cursor."""
        table = self.query_one(IndexTable)
        if self.assessment is None or not self._ids:
            return None
        i = min(max(table.cursor_row, 0), len(self._ids) - 1)
        return self.assessment.indices.get(self._ids[i])

    def refresh_detail(self) -> None:
        """Redraw the detail of the selected finding."""
        f = self.selected()
        detail = self.query_one("#index-detail", Static)
        if f is None:
            detail.update("Legend: " + LEGEND)
        else:
            detail.update(finding_detail(f, self.show_source))

    def on_data_table_row_highlighted(self, event: DataTable.RowHighlighted) -> None:
        self.refresh_detail()


def disorders_text(a: Assessment) -> Group:
    """The disorders of the draw with their evidence."""
    head = Text()
    head.append(f"Draw: {a.draw_label or 'none'}", style="bold")
    head.append(f"   legend: {LEGEND}", style="dim")
    if not a.disorders:
        return Group(head, Text("Acid-base disorders: none identified from the values entered."))
    out: list = [head, Text("Acid-base disorders:")]
    for d in a.disorders:
        role = "primary" if d.primary else "added"
        bits = [role]
        if d.detail:
            bits.append(d.detail)
        if d.compensation:
            bits.append(f"compensation {d.compensation}")
        out.append(_item(f"> {d.name} ({', '.join(bits)})", 2, "bold"))
        out += [_item(f"- {e.text}", 6) for e in d.evidence]
    return Group(*out)


def causes_text(a: Assessment | None, error: str | None = None) -> Group:
    """The ranked causes of a normal-gap acidosis with for/against/missing, then next tests."""
    if a is None:
        return Group(Text(error or "No assessment yet."))
    out: list = [Text("Causes of a normal-gap acidosis (judged on every draw)", style="bold")]
    out += [_item(note, 2, "italic") for note in a.ranking_notes]
    if not a.patterns:
        out.append(_item("No cause ranked.", 2))
    for p in a.patterns:
        head = Text()
        head.append(f"{p.verdict.value.upper():<9}", style="bold reverse")
        head.append(f" {p.name}", style="bold")
        out += [Text(""), head]
        out += [_item(f"+ for: {e.text}", 4) for e in p.support]
        out += [_item(f"- against: {e.text}", 4) for e in p.against]
        if p.missing:
            out.append(_item("? missing: " + ", ".join(p.missing), 4))
    out += [Text(""), Text("Suggested next tests", style="bold")]
    if not a.next_tests:
        out.append(_item("none suggested", 2))
    for t in a.next_tests:
        out.append(_item(f"* {t.text}", 2))
        if t.why:
            out.append(_item(t.why, 6, "italic"))
    return Group(*out)


class CausesView(VerticalScroll):
    """The pattern ranking, scrollable by keyboard."""

    can_focus = True

    def compose(self) -> ComposeResult:
        yield Static("", id="causes-text")

    def show(self, a: Assessment | None, error: str | None = None) -> None:
        """Show the ranking of assessment ``a``."""
        self.query_one("#causes-text", Static).update(causes_text(a, error))
