"""The paste screen: paste a lab report, review the proposed values, answer questions, apply.

A modal screen over the case workspace. The core (:mod:`workup.paste`) reads the text and decides
everything; this screen only shows the proposal, records the user's answers and dismisses with
the resolved :class:`~workup.paste.Proposal` (Apply) or None (Cancel).
"""

from __future__ import annotations

from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Vertical
from textual.message import Message
from textual.screen import ModalScreen
from textual.widgets import DataTable, Footer, Static, TextArea

from workup.analytes import UnitSystem
from workup.paste import PANEL_WORD, Proposal, Question, answers_for_panel, propose


class QuestionTable(DataTable):
    """The open questions; digit keys answer the highlighted one."""

    BINDINGS = [
        Binding("1", "choose(0)", "Choose", key_display="1-9"),
        *[Binding(str(n), f"choose({n - 1})", show=False) for n in range(2, 10)],
        Binding("0", "leave_out", "Leave out", key_display="0"),
        Binding("backspace", "clear", "Undo answer", show=False),
        Binding("S", "all_panel('serum')", "All serum", key_display="S"),
        Binding("U", "all_panel('urine')", "All urine", key_display="U"),
    ]

    class Answer(Message):
        """The user answered question ``row`` with option ``index`` (None: leave out)."""

        def __init__(self, row: int, index: int | None, clear: bool = False) -> None:
            super().__init__()
            self.row = row
            self.index = index
            self.clear = clear

    class AllPanel(Message):
        """Answer every which-sample question with ``panel``."""

        def __init__(self, panel: str) -> None:
            super().__init__()
            self.panel = panel

    def action_choose(self, index: int) -> None:
        if self.row_count:
            self.post_message(self.Answer(self.cursor_row, index))

    def action_leave_out(self) -> None:
        if self.row_count:
            self.post_message(self.Answer(self.cursor_row, None))

    def action_clear(self) -> None:
        if self.row_count:
            self.post_message(self.Answer(self.cursor_row, None, clear=True))

    def action_all_panel(self, panel: str) -> None:
        self.post_message(self.AllPanel(panel))


class PasteScreen(ModalScreen["Proposal | None"]):
    """Paste area, live proposal and questions; dismisses with the resolved proposal or None."""

    DEFAULT_CSS = """
    PasteScreen { align: center middle; }
    #paste-dialog {
        width: 100%; height: 100%; max-width: 140; max-height: 50;
        background: $surface; padding: 0 1;
    }
    #paste-title { height: 1; text-style: bold; background: $accent 30%; }
    #paste-text { height: 6; border: none; }
    #paste-text:focus { border: none; background-tint: $accent 10%; }
    #paste-summary { height: 1; color: $text-muted; }
    #paste-values { height: 2fr; min-height: 4; }
    #paste-questions { height: 1fr; min-height: 4; max-height: 10; }
    #paste-options { height: auto; max-height: 5; }
    #paste-detail { height: 1; color: $text-muted; }
    """

    BINDINGS = [
        Binding("ctrl+s", "apply", "Apply", priority=True),
        Binding("escape", "cancel", "Cancel", priority=True),
    ]

    def __init__(self, units: UnitSystem | None, text: str = "") -> None:
        super().__init__()
        self.units = units
        self._initial = text
        self.proposal: Proposal = propose(text, units)
        self.choices: dict[str, int | None] = {}
        self._rows: list[tuple[str, str]] = []  # what each value-table row shows in the detail line

    def compose(self) -> ComposeResult:
        with Vertical(id="paste-dialog"):
            system = self.units.value if self.units else "none (bare numbers are asked)"
            yield Static(f"Paste a lab report · units: {system}", id="paste-title")
            yield TextArea(
                self._initial,
                id="paste-text",
                soft_wrap=False,
                show_line_numbers=True,
                tab_behavior="focus",
            )
            yield Static("", id="paste-summary")
            yield DataTable(id="paste-values", cursor_type="row", zebra_stripes=False)
            yield QuestionTable(id="paste-questions", cursor_type="row")
            yield Static("", id="paste-options")
            yield Static("", id="paste-detail")
        yield Footer()

    def on_mount(self) -> None:
        values = self.query_one("#paste-values", DataTable)
        values.add_columns("Panel", "Analyte", "Value", "Status", "Line")
        questions = self.query_one(QuestionTable)
        questions.add_columns("Q", "Answer", "Question")
        text = self.query_one(TextArea)
        text.cursor_blink = False
        text.focus()
        self._refresh()

    # -- reading ---------------------------------------------------------------------------

    def on_text_area_changed(self, event: TextArea.Changed) -> None:
        old = {q.id: q.text for q in self.proposal.questions}
        self.proposal = propose(event.text_area.text, self.units)
        new = {q.id: q.text for q in self.proposal.questions}
        # An answer survives an edit only while its question is unchanged.
        self.choices = {k: v for k, v in self.choices.items() if old.get(k) == new.get(k)}
        self._refresh()

    def _refresh(self) -> None:
        p = self.proposal
        cap = max(16, self.app.size.width - 62)
        cautions = {id(e): note for e, note in p.cautions()}
        values = self.query_one("#paste-values", DataTable)
        values.clear()
        self._rows = []
        for e in p.entries:
            m = e.measurement
            value = m.word if m.word is not None else f"{_num(m.value)} {m.unit}".strip()
            status = "unusual" if id(e) in cautions else "read"
            flags = f" [{' '.join(e.flags)}]" if e.flags else ""
            values.add_row(
                PANEL_WORD[e.panel],
                e.analyte.name[:24],
                value + flags,
                status,
                f"{e.source.number}: {' '.join(e.source.text.split())}"[:cap],
            )
            self._rows.append((f"line {e.source.number}", cautions.get(id(e), "read as written")))
        for u in p.unrecognised:
            values.add_row(
                "—",
                "not taken",
                "",
                "refused" if u.refused else "skipped",
                f"{u.source.number}: {' '.join(u.source.text.split())}"[:cap],
            )
            self._rows.append((f"line {u.source.number}", u.reason))
        questions = self.query_one(QuestionTable)
        questions.clear()
        for q in p.questions:
            questions.add_row(q.id, self._answer_text(q), _clip(q.text, cap + 30))
        open_count = sum(1 for q in p.questions if q.id not in self.choices)
        when = f"collected {p.taken:%Y-%m-%d %H:%M}" if p.taken else "no collection time"
        self.query_one("#paste-summary", Static).update(
            f"{len(p.entries)} values · {open_count} of {len(p.questions)} questions open · "
            f"{len(p.unrecognised)} not taken · {when}"
        )
        self._show_options()
        self._show_detail()

    def _answer_text(self, q: Question) -> str:
        if q.id not in self.choices:
            return "?"
        pick = self.choices[q.id]
        return "left out" if pick is None else str(pick + 1)

    def _current_question(self) -> Question | None:
        table = self.query_one(QuestionTable)
        if not self.proposal.questions or table.cursor_row >= len(self.proposal.questions):
            return None
        return self.proposal.questions[table.cursor_row]

    def _show_options(self) -> None:
        q = self._current_question()
        if q is None:
            text = "No questions." if self.proposal.entries else "Paste the report above."
        else:
            parts = [f"{i}) {o.label}" for i, o in enumerate(q.options, start=1)]
            text = f"{q.id}: {q.text}\n" + "   ".join(parts) + "   0) leave out"
        self.query_one("#paste-options", Static).update(text)

    def _show_detail(self) -> None:
        table = self.query_one("#paste-values", DataTable)
        text = ""
        if self._rows and table.cursor_row < len(self._rows):
            where, why = self._rows[table.cursor_row]
            text = f"{where}: {why}"
        self.query_one("#paste-detail", Static).update(text)

    def on_data_table_row_highlighted(self, event: DataTable.RowHighlighted) -> None:
        if event.data_table.id == "paste-questions":
            self._show_options()
        else:
            self._show_detail()

    # -- answering -------------------------------------------------------------------------

    def on_question_table_answer(self, message: QuestionTable.Answer) -> None:
        questions = self.proposal.questions
        if not 0 <= message.row < len(questions):
            return
        q = questions[message.row]
        if message.clear:
            self.choices.pop(q.id, None)
        elif message.index is None:
            self.choices[q.id] = None
        elif message.index < len(q.options):
            self.choices[q.id] = message.index
        else:
            self.notify(f"{q.id} has {len(q.options)} option(s)", severity="warning")
            return
        self._refresh_answers()

    def on_question_table_all_panel(self, message: QuestionTable.AllPanel) -> None:
        answers = answers_for_panel(self.proposal, message.panel)
        if not answers:
            self.notify(f"no which-sample question offers {PANEL_WORD[message.panel]}")
            return
        self.choices.update(answers)
        self._refresh_answers()

    def _refresh_answers(self) -> None:
        table = self.query_one(QuestionTable)
        row = table.cursor_row
        self._refresh()
        if table.row_count:
            table.move_cursor(row=min(row + 1, table.row_count - 1))

    # -- leaving ---------------------------------------------------------------------------

    def action_apply(self) -> None:
        resolved = self.proposal.resolve(self.choices)
        if resolved.questions:
            n = len(resolved.questions)
            self.notify(
                f"{n} question(s) still open: choose 1–9 or leave out with 0",
                severity="warning",
            )
            return
        if not resolved.entries:
            self.notify("nothing to apply: no value was recognised", severity="warning")
            return
        self.dismiss(resolved)

    def action_cancel(self) -> None:
        self.dismiss(None)


def _clip(text: str, width: int) -> str:
    return text if len(text) <= width else text[: width - 1] + "…"


def _num(x: float) -> str:
    return str(int(x)) if float(x).is_integer() else f"{x:g}"
