"""Showing an assessment: the indices with their status and the disorders (the ranked causes:
screens/case/causes_pane.py).

Every number shown here is one the core computed, printed with the core's status word and mark
(``workup.findings.STATUS_WORD``/``STATUS_MARK``) so that status never rests on colour alone.
"""

from __future__ import annotations

from rich.console import Group
from rich.padding import Padding
from rich.text import Text
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Vertical
from textual.widgets import DataTable, Static

from workup.assess import COMPENSATION_RULES, Assessment
from workup.findings import STATUS_MARK, STATUS_WORD, Finding, Status
from workup.formatting import fmt_value
from workup.short_names import SHORT_NAME_WIDTH, short_name

STATUS_STYLE = {
    Status.ok: "status-ok",
    Status.caution: "status-caution",
    Status.not_valid: "status-not-valid",
    Status.needs_input: "status-needs-input",
}

LEGEND = "  ".join(f"{STATUS_MARK[s]} {STATUS_WORD[s]}" for s in Status)
"""The status marks in words, for every view that shows them."""


def status_word(status: Status) -> Text:
    """``mark word`` of a status, with a text style that reads without colour."""
    style = {
        Status.ok: "bold",
        Status.caution: "bold reverse",
        Status.not_valid: "bold underline",
        Status.needs_input: "dim",
    }[status]
    return Text(f"{STATUS_MARK[status]} {STATUS_WORD[status]}", style=style)


def status_text(f: Finding) -> Text:
    """``mark word`` of a finding's status (see :func:`status_word`)."""
    return status_word(f.status)


def item(text: str, indent: int, style: str = "") -> Padding:
    """One line of text whose wrapped lines keep the indent (hanging, readable lists)."""
    return Padding(Text(text, style=style), (0, 0, 0, indent))


def reading_words(f: Finding) -> str:
    """The core's reading of a finding in plain words ("" when there is no value)."""
    if not f.interpretation or f.value is None:
        return ""
    return f.interpretation.replace("_", " ")


def finding_detail(f: Finding, show_source: bool, compact: bool = False) -> Group:
    """The reasons and missing inputs of one finding; formula and source when asked for.
    ``compact``: its line only, and the keys that show the rest."""
    head = Text()
    head.append(f"{f.name}: ", style="bold")
    head.append(fmt_value(f) if f.value is not None else "no value")
    head.append("  [")
    head.append_text(status_text(f))
    head.append("]")
    if reading_words(f):
        head.append(f"  reading: {reading_words(f)}")
    out: list = [head]
    if compact:
        more = f"{len(f.reasons)} reason(s)" + (", missing inputs" if f.needs else "")
        out.append(item(f"Enter: {more}   s: formula and source", 2, "dim"))
        return Group(*out)
    out += [item(f"- {r}", 2) for r in f.reasons]
    if f.needs:
        out.append(item("missing: " + ", ".join(f.needs), 2))
    if show_source:
        out.append(item(f"formula: {f.formula or 'not given'}", 2))
        out.append(item(f"source: {f.source or 'not given'}", 2))
    else:
        out.append(item("(s: formula and source)", 2, "dim"))
    return Group(*out)


GROUP_KEY = "group:compensation"
"""Row key of the one row standing for the compensation rules that do not apply."""

TALL_ROWS = 26
"""From this many rows up, the findings view shows evidence and reasons in full by default;
below it (an 80 x 24 terminal) the index table keeps the room: Enter shows the selected index's
reasons, e the disorders' evidence."""


def not_applicable(a: Assessment) -> list[Finding]:
    """The compensation rules of ``a`` that do not apply to its draw (status NOT VALID)."""
    return [
        f
        for fid in COMPENSATION_RULES
        if (f := a.indices.get(fid)) is not None and f.status is Status.not_valid
    ]


def group_cells(hidden: list[Finding], rules_applying: bool, shown: bool) -> tuple:
    """The four cells of the row standing for the compensation rules in ``hidden``."""
    name = "Other compensation rules" if rules_applying else "Compensation rules"
    word = "hide" if shown else "show"
    return (
        name,
        "not applicable",
        status_word(Status.not_valid),
        Text(f"c: {word} the {len(hidden)}"),
    )


def group_detail(hidden: list[Finding], compact: bool) -> Group:
    """Why each compensation rule of ``hidden`` does not apply (its first reason, full name)."""
    head = Text()
    head.append(f"{len(hidden)} compensation rules do not apply to this draw", style="bold")
    head.append("  [")
    head.append_text(status_word(Status.not_valid))
    head.append("]")
    if compact:
        return Group(head, item("c: show them as rows   Enter: why each does not apply", 2, "dim"))
    out: list = [head]
    out += [
        item(f"- {f.name}: {f.reasons[0] if f.reasons else 'no reason given'}", 2) for f in hidden
    ]
    out.append(item("(c: show them as rows)", 2, "dim"))
    return Group(*out)


class IndexTable(DataTable):
    """The indices, one row each: s toggles formula and source of the selected one, c the
    compensation rules that do not apply, e the disorders' evidence, Enter the full reasons."""

    BINDINGS = [
        Binding("s", "toggle_source", "Formula/source", show=False),
        Binding("c", "toggle_rules", "Rules", show=False),
        Binding("e", "toggle_evidence", "Evidence", show=False),
    ]

    def _view(self) -> FindingsView:
        return next(a for a in self.ancestors if isinstance(a, FindingsView))

    def action_toggle_source(self) -> None:
        """Show or hide the formula and source of the selected index."""
        view = self._view()
        view.show_source = not view.show_source
        view.refresh_detail()

    def action_toggle_evidence(self) -> None:
        """Show or hide the evidence under each acid-base disorder."""
        view = self._view()
        view.show_evidence = not view.evidence
        view.show(view.assessment, view._error, view.with_draw_line)

    def action_toggle_rules(self) -> None:
        """Show the compensation rules that do not apply as rows, or fold them into one."""
        view = self._view()
        view.show_all_rules = not view.show_all_rules
        view.show(view.assessment, view._error, view.with_draw_line)


class FindingsView(Vertical):
    """Disorders of the draw, then its indices as a table, then the selected index in full."""

    def __init__(self, **kwargs) -> None:
        super().__init__(**kwargs)
        self.assessment: Assessment | None = None
        self.show_source = False
        self.show_all_rules = False
        """Compensation rules that do not apply: as rows (True) or one folded row (False)."""
        self.full_detail: bool | None = None
        """The selected index's reasons in full (True), one line (False), or by the height (None)."""
        self.show_evidence: bool | None = None
        """The disorders' evidence shown (True), hidden (False), or by the height (None)."""
        self.with_draw_line = True
        self._ids: list[str] = []
        self._width = 0
        self._compact = (True, False)
        self._error: str | None = None

    def compose(self) -> ComposeResult:
        yield Static("", id="disorders")
        yield IndexTable(id="indices", cursor_type="row", zebra_stripes=False)
        yield Static("", id="index-detail")

    def on_mount(self) -> None:
        self._columns(self.size.width or 80, [])

    @property
    def short(self) -> bool:
        """True on a short terminal, where the table keeps the room by default."""
        return (self.size.height or 0) < TALL_ROWS

    @property
    def compact(self) -> bool:
        """True when the selected index shows in one line (Enter shows its reasons)."""
        return self.short if self.full_detail is None else not self.full_detail

    @property
    def evidence(self) -> bool:
        """True when the disorders show their evidence (e toggles it)."""
        return not self.short if self.show_evidence is None else self.show_evidence

    def _columns(self, width: int, rows: list[tuple]) -> int:
        """Lay out the columns for ``rows`` at ``width``; the reading column's width."""
        # Value and status keep their full width (the widest cell shown); the name column is as
        # wide as the widest short name; the reading takes the rest and wraps when longer.
        table = self.query_one(IndexTable)
        widths = [max([len(str(r[i])) for r in rows] + [len(h)]) for i, h in enumerate(_HEADS)]
        name = min(widths[0], SHORT_NAME_WIDTH + 4)
        value = min(widths[1], 18)
        status = widths[2]
        # 2 columns for the scrollbar, 2 of padding per column.
        reading = max(width - 2 - 2 * len(_HEADS) - name - value - status, 12)
        self._width = width
        layout = (name, value, status, reading)
        if tuple(c.width for c in table.ordered_columns) == layout:
            table.clear()  # same columns: keep them, only the rows change
            return reading
        table.clear(columns=True)
        for (key, head), w in zip(zip(_KEYS, _HEADS, strict=True), layout, strict=True):
            table.add_column(head, key=key, width=w)
        return reading

    def on_resize(self) -> None:
        if not self.size.width:
            return
        if self.size.width != self._width or (self.compact, self.evidence) != self._compact:
            self.show(self.assessment, self._error, self.with_draw_line)

    def _rows(self, a: Assessment) -> list[tuple]:
        hidden = not_applicable(a)
        hidden_ids = {f.id for f in hidden}
        applying = any(fid in a.indices and fid not in hidden_ids for fid in COMPENSATION_RULES)
        rows: list[tuple] = []
        for f in a.indices.values():
            if f.id in hidden_ids and f.id == hidden[0].id and len(hidden) > 1:
                rows.append((GROUP_KEY, *group_cells(hidden, applying, self.show_all_rules)))
            if f.id in hidden_ids and len(hidden) > 1 and not self.show_all_rules:
                continue
            rows.append(
                (
                    f.id,
                    short_name(f.id, f.name),
                    fmt_value(f) if f.value is not None else "—",
                    status_text(f),
                    Text(reading_words(f)),
                )
            )
        return rows

    def show(
        self, a: Assessment | None, error: str | None = None, with_draw_line: bool = True
    ) -> None:
        """Show assessment ``a`` (or why there is none); ``with_draw_line``: say which draw it is
        of (off when the pane's header already says so)."""
        self.assessment = a
        self._error = error
        self.with_draw_line = with_draw_line
        self._compact = (self.compact, self.evidence)
        disorders = self.query_one("#disorders", Static)
        table = self.query_one(IndexTable)
        current = self._ids[table.cursor_row] if 0 <= table.cursor_row < len(self._ids) else None
        row = table.cursor_row
        if a is None:
            self._columns(self.size.width or 80, [])
            self._ids = []
            disorders.update(error or "No assessment yet.")
            self.refresh_detail()
            return
        disorders.update(disorders_text(a, with_draw_line, evidence=self.evidence))
        rows = self._rows(a)
        reading = self._columns(self.size.width or 80, [r[1:] for r in rows])
        self._ids = [r[0] for r in rows]
        for key, *cells in rows:
            table.add_row(*cells, key=key, height=wrapped_lines(str(cells[3]), reading))
        if self._ids:
            # The cursor stays on the same index (or the folded row) when rows come and go.
            target = self._ids.index(current) if current in self._ids else row
            table.move_cursor(row=min(max(target, 0), len(self._ids) - 1))
        self.refresh_detail()

    def selected(self) -> Finding | None:
        """The finding under the table's cursor (None on the folded row)."""
        table = self.query_one(IndexTable)
        if self.assessment is None or not self._ids:
            return None
        i = min(max(table.cursor_row, 0), len(self._ids) - 1)
        return self.assessment.indices.get(self._ids[i])

    def _on_group_row(self) -> bool:
        table = self.query_one(IndexTable)
        return (
            bool(self._ids)
            and self._ids[min(max(table.cursor_row, 0), len(self._ids) - 1)] == GROUP_KEY
        )

    def refresh_detail(self) -> None:
        """Redraw the detail of the selected finding."""
        detail = self.query_one("#index-detail", Static)
        if self.assessment is not None and self._on_group_row():
            detail.update(group_detail(not_applicable(self.assessment), self.compact))
            return
        f = self.selected()
        if f is None:
            detail.update("Legend: " + LEGEND)
        else:
            detail.update(finding_detail(f, self.show_source, self.compact))

    def on_data_table_row_highlighted(self, event: DataTable.RowHighlighted) -> None:
        self.refresh_detail()

    def on_data_table_row_selected(self, event: DataTable.RowSelected) -> None:
        # Enter: the selected index's reasons in full, or back to its one line.
        event.stop()
        self.full_detail = self.compact
        self.refresh_detail()


def wrapped_lines(text: str, width: int) -> int:
    """How many lines ``text`` takes wrapped by whole words at ``width`` (at least one)."""
    lines, used = 1, 0
    for word in text.split():
        if used and used + 1 + len(word) > width:
            lines, used = lines + 1, 0
        if len(word) > width:  # a word wider than the column is folded over several lines
            extra, used = divmod(len(word) + used, width)
            lines += extra - (used == 0)
            used = used or width
            continue
        used += len(word) + (1 if used else 0)
    return lines


_KEYS = ("name", "value", "status", "reading")
_HEADS = ("Index", "Value", "Status", "Reading")


def disorders_text(a: Assessment, with_draw_line: bool = True, evidence: bool = True) -> Group:
    """The disorders of the draw, with their evidence unless ``evidence`` is off."""
    out: list = []
    if with_draw_line:
        out.append(Text(f"Draw: {a.draw_label or 'none'}", style="bold"))
    if not a.disorders:
        out.append(Text("Acid-base disorders: none identified from the values entered."))
        return Group(*out)
    out.append(Text("Acid-base disorders:" if evidence else "Acid-base disorders (e: evidence):"))
    for d in a.disorders:
        role = "primary" if d.primary else "added"
        bits = [role]
        if d.detail:
            bits.append(d.detail)
        if d.compensation:
            bits.append(f"compensation {d.compensation}")
        out.append(item(f"> {d.name} ({', '.join(bits)})", 2, "bold"))
        if evidence:
            out += [item(f"- {e.text}", 6) for e in d.evidence]
    return Group(*out)
