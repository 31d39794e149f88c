"""The library screen: the saved cases of one folder, to search, sort, preview and open.

Rows come from the cached library index (workup.library), read in a worker thread so a cold
build of a large library never freezes the screen. Typing in the search line filters as you type
with the syntax of docs/search.md; the preview shows the highlighted case's findings from the
core, every number with its status word. Enter posts OpenCase, n posts NewCase; the app decides
what to do with them.
"""

from __future__ import annotations

from collections.abc import Callable
from pathlib import Path
from typing import Any

from rich.text import Text
from textual import events, work
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import VerticalScroll
from textual.screen import Screen
from textual.timer import Timer
from textual.widgets import DataTable, Footer, Input, Static

from screens.messages import NewCase, OpenCase
from workup.library import (
    SORT_KEYS,
    LibraryEntry,
    describe_pending,
    leading_cells,
    sort_entries,
)

SEARCH_HELP = """Search (filter as you type; every term must hold)
  sicca  "dry eyes"     words in the label, notes or draw labels (any case)
  -diarrhea             a leading - negates any term
  pattern:distal        leading cause (id or name); pattern:none for none ranked
  verdict:likely        likely, possible or unlikely
  date:2026-11          a draw in that year, month or day; date:2026-10-01..2026-11-15
  is:pending            also is:loading, is:expected, is:broken, is:ok
  uag>0  k<3.5          a value in one draw (valid or caution only); >= <= = too
  uag:not_valid         an index's status: valid, caution, not_valid, needs_input
  file:2025/            part of the file name
Short names: ag uag uog ttkg fehco3 k na cl hco3 ph pco2 uph una uk ucl; or
any index id (urine_anion_gap) or panel.analyte (urine.ph), in canonical units."""

COLUMNS = (
    ("File", 22), ("Case", 26), ("Latest draw", 16), ("Leading cause", 22), ("Verdict", 8),
    ("Pending", 12),
)  # fmt: skip
NARROW_COLUMNS = (("File", 16), ("Case", 19), ("Latest", 10), ("Leading cause", 15), ("Verdict", 8))
"""Below WIDE_AT columns the pending column goes (the preview says it) and cells shorten; at
WIDE_AT the six columns fit without scrolling sideways."""
WIDE_AT = 110
SORT_WORD = {"file": "file", "label": "case label", "date": "latest draw", "pattern": "cause"}
FILTER_DELAY = 0.15
"""Seconds to wait after a keystroke before filtering, so fast typing filters once."""


def _cut(text: str, width: int) -> str:
    return text if len(text) <= width else text[: width - 1] + "…"


def _add_columns(table: DataTable, narrow: bool) -> None:
    # Fixed widths (the cells are cut to them): an auto-sized column keeps the widest content it
    # ever held, so the layout depended on what was shown before.
    for label, width in NARROW_COLUMNS if narrow else COLUMNS:
        table.add_column(label, width=width)


def _row(e: LibraryEntry, narrow: bool = False) -> tuple[str, ...]:
    """The table cells of one case (narrow: five short cells that fit 80 columns)."""
    if not e.ok:
        first = (e.error or "").splitlines()[0].removeprefix(e.name).lstrip(":0123456789 ")
        if narrow:
            return (_cut(e.name, 16), _cut(first, 19), "", "DID NOT LOAD", "")
        return (_cut(e.name, 22), _cut(first, 26), "", "DID NOT LOAD", "", "")
    cause, verdict = leading_cells(e)
    if narrow:
        when = (e.latest_taken or "undated")[:10]
        return (_cut(e.name, 16), _cut(e.label, 19), when, _cut(cause, 15), verdict)
    when = (e.latest_taken or "undated").replace("T", " ")
    return (
        _cut(e.name, 22),
        _cut(e.label, 26),
        when,
        _cut(cause, 22),
        verdict,
        describe_pending(e),
    )


def preview_text(path: Path, overrides: dict[str, float]) -> Text:
    """The findings of the case at ``path`` as text: the latest draw's indices with status."""
    from workup.assess import assess
    from workup.caseio import CaseFileError, load_case
    from workup.findings import STATUS_MARK, STATUS_WORD
    from workup.formatting import fmt_value

    out = Text()
    try:
        case = load_case(path)
    except CaseFileError as exc:
        out.append(f"{path.name} did not load\n", style="bold")
        for p in exc.problems[:6]:
            out.append(p.format(path.name) + "\n")
        return out
    a = assess(case, None, overrides)
    out.append(case.label + "\n", style="bold")
    latest = case.latest_draw() if case.draws else None
    when = latest.taken.isoformat(sep=" ", timespec="minutes") if latest and latest.taken else ""
    out.append(f"{len(case.draws)} draw(s); latest: {a.draw_label or 'none'} {when}\n")
    lead = a.leading
    if lead is not None and lead.verdict.value != "unlikely":
        out.append(f"Leading cause: {lead.name} ({lead.verdict.value})\n")
    elif lead is not None:
        out.append(f"No cause is likely or possible; best ranked: {lead.name} (unlikely)\n")
    for note in a.ranking_notes[:1]:
        out.append(note + "\n", style="italic")
    if a.next_tests:
        out.append(f"Next: {a.next_tests[0].text}\n")
    for d in a.disorders[:3]:
        role = "primary" if d.primary else "added"
        out.append(f"{d.name} ({role})\n")
    out.append("Indices of the latest draw   (+ valid, ! caution, x NOT VALID)\n", style="bold")
    for f in a.indices.values():
        if f.value is None:
            continue
        reading = f"  {f.interpretation}" if f.interpretation else ""
        out.append(f" {STATUS_MARK[f.status]} {f.name}: {fmt_value(f)} [{STATUS_WORD[f.status]}]")
        out.append(reading + "\n")
    missing = [f.name for f in a.indices.values() if f.value is None]
    if missing:
        out.append(f" ? needs input: {', '.join(missing)}\n", style="dim")
    return out


class LibraryScreen(Screen):
    """Cases in ``cases_dir``; Enter opens one (posts OpenCase), n starts a new one (NewCase)."""

    DEFAULT_CSS = """
    LibraryScreen #lib-title { height: 1; padding: 0 1; text-style: bold; }
    LibraryScreen #lib-search { height: 1; border: none; padding: 0 1; }
    LibraryScreen #lib-status { height: 1; padding: 0 1; color: $text-muted; }
    LibraryScreen #lib-status.error { color: $error; text-style: bold; }
    LibraryScreen #cases { height: 1fr; }
    LibraryScreen #lib-preview-box { height: 40%; border-top: solid $primary; }
    LibraryScreen #lib-preview { padding: 0 1; }
    """

    BINDINGS = [
        # Priority, so the footer shows it over the table's own Enter; in the search line
        # Enter still means "done searching" (see action_open).
        Binding("enter", "open", "Open", show=True, priority=True),
        Binding("slash", "search", "Search"),
        Binding("n", "new", "New case"),
        Binding("s", "sort", "Sort"),
        Binding("r", "reverse", "Reverse", show=False),
        Binding("t", "trends", "Trends"),
        Binding("c", "compare", "Compare", show=False),
        Binding("f5", "reload", "Reload"),
        Binding("escape", "clear_search", "Clear search", show=False),
    ]

    def __init__(self, cases_dir: Path) -> None:
        super().__init__()
        self.cases_dir = Path(cases_dir)
        self.entries: list[LibraryEntry] = []
        """Every indexed case, in the current sort order."""
        self.shown: list[LibraryEntry] = []
        """The cases the table shows (the search's matches)."""
        self.sort_key = "file"
        self.reverse = False
        self.query_text = ""
        self._draws: dict[str, Any] | None = None
        self._timer: Timer | None = None
        self._preview_for: Path | None = None
        self.narrow = False
        self._loaded_once = False
        self._cursor_name: str | None = None
        self._matched: dict[str, Any] = {}

    # ------------------------------------------------------------ layout

    def compose(self) -> ComposeResult:
        yield Static("Case library", id="lib-title")
        yield Input(
            placeholder="/ search: words  pattern:distal  uag>0  date:2026-11  is:pending",
            id="lib-search",
        )
        yield Static("reading the library…", id="lib-status")
        yield DataTable(id="cases", cursor_type="row", zebra_stripes=True)
        with VerticalScroll(id="lib-preview-box"):
            yield Static("", id="lib-preview")
        yield Footer()

    def on_mount(self) -> None:
        self.narrow = self.app.size.width < WIDE_AT
        table = self.query_one(DataTable)
        _add_columns(table, self.narrow)
        table.focus()
        self.load()

    def on_resize(self, event: events.Resize) -> None:
        narrow = event.size.width < WIDE_AT
        if narrow != self.narrow:
            self.narrow = narrow
            table = self.query_one(DataTable)
            table.clear(columns=True)
            _add_columns(table, narrow)
            self._fill()

    def _overrides(self) -> dict[str, float]:
        get = getattr(self.app, "user_overrides", None)
        return dict(get()) if callable(get) else {}

    # ------------------------------------------------------------ loading

    def load(self) -> None:
        """Bring the index up to date and show its rows (a cold build takes time: in a thread)."""
        self._load_rows(self._overrides())  # the app's settings are read here, on its thread

    @work(thread=True, exclusive=True, group="library")
    def _load_rows(self, overrides: dict[str, float]) -> None:
        from workup.library import list_library

        try:
            entries = list_library(self.cases_dir, overrides=overrides)
        except Exception as exc:  # shown on the screen; the files themselves are untouched
            self.app.call_from_thread(self._status, f"cannot read the library: {exc}", True)
            return
        self.app.call_from_thread(self._loaded, entries)

    def on_screen_resume(self, event: events.ScreenResume) -> None:
        # Back from a case that may have been saved: re-read what changed (cheap when nothing did).
        if self._loaded_once:
            self.load()

    def _loaded(self, entries: list[LibraryEntry]) -> None:
        self._loaded_once = True
        self._draws = None
        self._preview_for = None
        self.entries = sort_entries(entries, self.sort_key, self.reverse)
        self.apply_search()

    def _status(self, text: str, error: bool = False) -> None:
        status = self.query_one("#lib-status", Static)
        status.update(text)
        status.set_class(error, "error")

    # ------------------------------------------------------------ searching

    def on_input_changed(self, event: Input.Changed) -> None:
        self.query_text = event.value
        if self._timer is not None:
            self._timer.stop()
        self._timer = self.set_timer(FILTER_DELAY, self.apply_search)

    def on_input_submitted(self, event: Input.Submitted) -> None:
        self.query_text = event.value
        self.apply_search()
        self.query_one(DataTable).focus()

    def _draws_of(self, names: list[str]) -> dict[str, Any]:
        if self._draws is None:
            from workup.library_index import LibraryIndex

            with LibraryIndex.open(self.cases_dir, None, self._overrides()) as index:
                self._draws = index.draws()
        return self._draws

    def apply_search(self) -> None:
        """Filter the rows by the search line (keeping the last good result on a bad query)."""
        from workup.search import SearchError, search

        try:
            matches = search(self.entries, self.query_text, self._draws_of)
        except SearchError as exc:
            self._status(f"search: {exc}", error=True)
            return
        self.shown = [m.entry for m in matches]
        self._matched = {m.entry.name: m for m in matches if m.draw is not None}
        self._preview_for = None
        self._fill()
        bad = sum(1 for e in self.entries if not e.ok)
        word = SORT_WORD[self.sort_key] + (", reversed" if self.reverse else "")
        tail = f"; {bad} did not load" if bad else ""
        self._status(f"{len(self.shown)} of {len(self.entries)} cases; by {word}{tail}")

    def _fill(self) -> None:
        table = self.query_one(DataTable)
        before = self._cursor_name
        table.clear()
        table.add_rows([_row(e, self.narrow) for e in self.shown])
        if self.shown:
            # Stay on the case that was highlighted, if it is still shown.
            row = next((i for i, e in enumerate(self.shown) if e.name == before), 0)
            table.move_cursor(row=row)
            self._cursor_name = self.shown[row].name
            self._preview(self.shown[row])
        else:
            self.query_one("#lib-preview", Static).update(
                Text("No case matches the search." if self.entries else "No case files here yet.")
            )

    # ------------------------------------------------------------ preview

    def on_data_table_row_highlighted(self, event: DataTable.RowHighlighted) -> None:
        if 0 <= event.cursor_row < len(self.shown):
            self._cursor_name = self.shown[event.cursor_row].name
            self._preview(self.shown[event.cursor_row])

    def _preview(self, e: LibraryEntry) -> None:
        if self._preview_for == e.path:
            return
        self._preview_for = e.path
        try:
            text = preview_text(e.path, self._overrides())
        except Exception as exc:  # a failing calculator must not take the library down
            text = Text(f"{e.name}: the preview failed: {type(exc).__name__}: {exc}")
        m = self._matched.get(e.name)
        if m is not None:
            from workup.formatting import fmt_number
            from workup.library import status_word

            values = ", ".join(
                f"{f} {fmt_number(v, decimals=2 if abs(v or 0) < 10 else 1)} [{status_word(st)}]"
                for f, v, st in m.values
            )
            text = Text(f"Search matched draw {m.draw!r}: {values}\n", style="bold") + text
        self.query_one("#lib-preview", Static).update(text)

    # ------------------------------------------------------------ actions

    def current(self) -> LibraryEntry | None:
        """The highlighted case, if any."""
        table = self.query_one(DataTable)
        if not self.shown or not 0 <= table.cursor_row < len(self.shown):
            return None
        return self.shown[table.cursor_row]

    def action_open(self) -> None:
        """Open the highlighted case (the app handles OpenCase); in the search line, search."""
        box = self.query_one("#lib-search", Input)
        if self.focused is box:
            self.query_text = box.value
            self.apply_search()
            self.query_one(DataTable).focus()
            return
        e = self.current()
        if e is not None:
            self.post_message(OpenCase(e.path))

    def on_data_table_row_selected(self, event: DataTable.RowSelected) -> None:
        if 0 <= event.cursor_row < len(self.shown):
            self.post_message(OpenCase(self.shown[event.cursor_row].path))

    def action_new(self) -> None:
        """Start a new case (the app handles NewCase)."""
        self.post_message(NewCase())

    def action_search(self) -> None:
        """Move to the search line."""
        self.query_one("#lib-search", Input).focus()

    def action_clear_search(self) -> None:
        """Clear the search, or leave the search line when it is already empty."""
        box = self.query_one("#lib-search", Input)
        if box.value:
            box.value = ""
            self.query_text = ""
            self.apply_search()
        self.query_one(DataTable).focus()

    def key_down(self) -> None:
        if self.focused is self.query_one("#lib-search", Input):
            self.query_one(DataTable).focus()

    def action_sort(self) -> None:
        """Sort by the next column: file, case label, latest draw, leading cause."""
        self.sort_key = SORT_KEYS[(SORT_KEYS.index(self.sort_key) + 1) % len(SORT_KEYS)]
        self._resort()

    def action_reverse(self) -> None:
        """Reverse the order."""
        self.reverse = not self.reverse
        self._resort()

    def _resort(self) -> None:
        self.entries = sort_entries(self.entries, self.sort_key, self.reverse)
        self._preview_for = None
        self.apply_search()

    def action_reload(self) -> None:
        """Re-read changed files and refresh the rows."""
        self._status("reading the library…")
        self.load()

    def current_case(self) -> Any:
        """The highlighted case loaded from its file, or None (with a notice) when it cannot be."""
        from workup.caseio import CaseFileError, load_case

        e = self.current()
        if e is None:
            return None
        try:
            return load_case(e.path)
        except CaseFileError as exc:
            self.notify(
                exc.problems[0].format(e.name), title="Cannot read the case", severity="error"
            )
            return None

    def _open_case_view(self, name: str) -> None:
        case = self.current_case()
        if case is None:
            return
        import screens.trends as trends

        if name == "CompareScreen" and len(case.draws) < 2:
            self.notify("Comparing needs two draws; this case has one.", severity="warning")
            return
        self.app.push_screen(getattr(trends, name)(case))

    def action_trends(self) -> None:
        """Trends over the highlighted case's draws."""
        self._open_case_view("TrendsScreen")

    def action_compare(self) -> None:
        """The highlighted case's first and latest draws side by side."""
        self._open_case_view("CompareScreen")

    # ------------------------------------------------------------ help and palette

    def help_context(self) -> tuple[str, list[tuple[str, str]], list[str], str]:
        """What the help screen shows for this screen."""
        keys = [
            ("Up / Down", "move through the cases; the preview follows"),
            ("Enter", "open the highlighted case"),
            ("/", "search (filter as you type); Enter or Down returns to the list"),
            ("Esc", "clear the search"),
            ("s / r", "sort by the next column / reverse the order"),
            ("t / c", "trends over the draws / compare the first and latest draw"),
            ("n", "new case"),
            ("F5", "re-read changed files"),
        ]
        cautions = [
            "The leading cause and pending tests come from the same core as the case view; "
            "open the case to see every finding with its reasons."
        ]
        return "library", keys, cautions, SEARCH_HELP

    def commands(self) -> list[tuple[str, str, Callable[[], Any]]]:
        """Palette entries for this screen's actions."""
        return [
            ("Open case", "Open the highlighted case", self.action_open),
            ("Search cases", "Filter the library (see Help for the syntax)", self.action_search),
            ("Sort cases", "Sort by the next column", self.action_sort),
            ("Reverse order", "Reverse the order of the cases", self.action_reverse),
            ("Trends", "Values over the highlighted case's draws", self.action_trends),
            ("Compare draws", "First and latest draw side by side", self.action_compare),
            ("Reload library", "Re-read changed case files", self.action_reload),
        ]
