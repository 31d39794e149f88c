"""The screens a case opens over itself from its current state: the note draft (F7), the
trends over its draws (F9) and the draws side by side (Shift+F9).

A mixin of CaseScreen, for its keys; each screen is imported on first use (start-up does not
wait for it) and lives in its own module: screens/note_screen.py and screens/trends.py.
"""

from __future__ import annotations

from pathlib import Path
from typing import TYPE_CHECKING

from screens import persistence

if TYPE_CHECKING:
    from textual.screen import Screen

    from workup.assess import Assessment
    from workup.model import Case

    _ScreenBase = Screen[None]
else:
    _ScreenBase = object


class SideScreens(_ScreenBase):
    """Open the note, trends and comparison screens on this case."""

    case: Case
    path: Path | None
    cases_dir: Path
    assessment: Assessment | None
    error: str | None

    def action_note(self) -> None:
        """Open the note screen on the current assessment."""
        if self.assessment is None:
            self.notify(self.error or "Nothing to draft yet.", severity="warning")
            return
        from screens.note_screen import NoteScreen

        self.app.push_screen(
            NoteScreen(
                self.assessment,
                self.case,
                lambda: persistence.note_path(self.path, self.cases_dir, self.case.label),
                persistence.write_note,
            )
        )

    def _open_optional(self, name: str) -> None:
        try:
            import screens.trends as trends
        except ImportError:
            self.notify("Trends are not available yet.", severity="warning")
            return
        self.app.push_screen(getattr(trends, name)(self.case))

    def action_trends(self) -> None:
        """Show each value over the case's draws."""
        self._open_optional("TrendsScreen")

    def action_compare(self) -> None:
        """Compare the case's draws side by side."""
        self._open_optional("CompareScreen")
