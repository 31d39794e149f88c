"""The library screen: the saved cases of one folder, to search, sort, preview and open.

Rows come from the cached library index (workup.library), read in a worker thread so a cold
build of a large library never freezes the screen. Typing in the search line filters as you type
with the syntax of docs/search.md; the preview shows the highlighted case's findings from the
core, every number with its status word. Enter posts OpenCase, n posts NewCase; the app decides
what to do with them.

This module lays the screen out, binds its keys and keeps the table and the preview in step
with the shown rows. The jobs behind it, one module each: reading the library in a thread
(library_loading), the search line (library_search), the actions on the highlighted case
(library_actions), the table's columns and cells (library_table), the preview text
(library_preview).
"""

from __future__ import annotations

from collections.abc import Callable
from pathlib import Path
from typing import Any

from rich.text import Text
from textual import events
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import VerticalScroll
from textual.screen import Screen
from textual.timer import Timer
from textual.widgets import DataTable, Input, Static

from screens.app_actions import SteadyFooter
from screens.library_actions import LibraryActionsMixin
from screens.library_loading import LibraryLoadingMixin
from screens.library_preview import match_header, preview_text
from screens.library_search import FILTER_DELAY, SEARCH_HELP, SORT_WORD, LibrarySearchMixin
from screens.library_table import COLUMNS, NARROW_COLUMNS, WIDE_AT, add_columns, row_cells
from workup.library import LibraryEntry

__all__ = [
    "COLUMNS",
    "FILTER_DELAY",
    "NARROW_COLUMNS",
    "SEARCH_HELP",
    "SORT_WORD",
    "WIDE_AT",
    "LibraryScreen",
    "preview_text",
]


class LibraryScreen(LibraryActionsMixin, LibrarySearchMixin, LibraryLoadingMixin, Screen):
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

    # Each key's action_ method is in screens/library_actions.py or, for the search line's
    # keys, screens/library_search.py; a new key also wants a line in help_context below.
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
        yield SteadyFooter()

    def on_mount(self) -> None:
        self.narrow = self.app.size.width < WIDE_AT
        table = self.query_one(DataTable)
        add_columns(table, self.narrow)
        table.focus()
        self.load()

    def on_resize(self, event: events.Resize) -> None:
        narrow = event.size.width < WIDE_AT
        if narrow != self.narrow:
            self.narrow = narrow
            table = self.query_one(DataTable)
            table.clear(columns=True)
            add_columns(table, narrow)
            self._fill()

    def _overrides(self) -> dict[str, float]:
        get = getattr(self.app, "user_overrides", None)
        return dict(get()) if callable(get) else {}

    # ------------------------------------------------------------ table and preview

    def _fill(self) -> None:
        table = self.query_one(DataTable)
        before = self._cursor_name
        table.clear()
        table.add_rows([row_cells(e, self.narrow) for e in self.shown])
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
            text = match_header(m) + text
        self.query_one("#lib-preview", Static).update(text)

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
