"""Searching the library: the search line filters the rows as you type (docs/search.md).

LibraryScreen (screens/library.py) mixes this in; the query itself is parsed and matched by the
core (workup.search), and the matches land in ``shown`` for the table and the preview.
"""

from __future__ import annotations

from pathlib import Path
from typing import TYPE_CHECKING, Any

from textual.timer import Timer
from textual.widgets import DataTable, Input

from workup.library import LibraryEntry

if TYPE_CHECKING:
    from textual.screen import Screen

    _ScreenBase = Screen
else:
    _ScreenBase = object

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

SORT_WORD = {"file": "file", "label": "case label", "date": "latest draw", "pattern": "cause"}
"""How the status line names each sort key."""
FILTER_DELAY = 0.15
"""Seconds to wait after a keystroke before filtering, so fast typing filters once."""


class LibrarySearchMixin(_ScreenBase):
    """The library screen's search line: filtering, and moving between it and the table."""

    # The screen's state, set and described in LibraryScreen.__init__.
    cases_dir: Path
    entries: list[LibraryEntry]
    shown: list[LibraryEntry]
    sort_key: str
    reverse: bool
    query_text: str
    _draws: dict[str, Any] | None
    _timer: Timer | None
    _preview_for: Path | None
    _matched: dict[str, Any]

    if TYPE_CHECKING:  # defined by LibraryScreen and the loading

        def _overrides(self) -> dict[str, float]: ...

        def _fill(self) -> None: ...

        def _status(self, text: str, error: bool = False) -> None: ...

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
