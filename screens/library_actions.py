"""What the library's keys do with the highlighted case: open, new, sort, reload, trends, compare.

LibraryScreen (screens/library.py) mixes this in and binds the keys (its BINDINGS). Opening and
starting a case are messages (OpenCase, NewCase) that the app handles in screens/app_cases.py.
"""

from __future__ import annotations

from pathlib import Path
from typing import TYPE_CHECKING, Any

from textual.widgets import DataTable, Input

from screens.messages import NewCase, OpenCase
from workup.library import SORT_KEYS, LibraryEntry, sort_entries

if TYPE_CHECKING:
    from textual.screen import Screen

    _ScreenBase = Screen
else:
    _ScreenBase = object


class LibraryActionsMixin(_ScreenBase):
    """The library screen's actions on its rows and on the highlighted case."""

    # The screen's state, set and described in LibraryScreen.__init__.
    entries: list[LibraryEntry]
    shown: list[LibraryEntry]
    sort_key: str
    reverse: bool
    query_text: str
    _preview_for: Path | None

    if TYPE_CHECKING:  # defined by the search and the loading

        def apply_search(self) -> None:
            """Filter the rows by the search line."""
            ...

        def load(self) -> None:
            """Bring the index up to date and show its rows."""
            ...

        def _status(self, text: str, error: bool = False) -> None: ...

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
