"""Reading the library: the index is brought up to date in a worker thread, then shown.

LibraryScreen (screens/library.py) mixes this in; the rows land in ``entries`` and the search
(screens/library_search.py) decides which are shown. The status line is written here too.
"""

from __future__ import annotations

from pathlib import Path
from typing import TYPE_CHECKING

from textual import events, work
from textual.widgets import Static

from workup.library import LibraryEntry, sort_entries

if TYPE_CHECKING:
    from textual.screen import Screen

    _ScreenBase = Screen
else:
    _ScreenBase = object


class LibraryLoadingMixin(_ScreenBase):
    """The library screen's background reading of its folder, and its status line."""

    # The screen's state, set and described in LibraryScreen.__init__.
    cases_dir: Path
    entries: list[LibraryEntry]
    sort_key: str
    reverse: bool
    _draws: dict | None
    _preview_for: Path | None
    _loaded_once: bool

    if TYPE_CHECKING:  # defined by LibraryScreen and the search

        def _overrides(self) -> dict[str, float]: ...

        def apply_search(self) -> None:
            """Filter the rows by the search line."""
            ...

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
