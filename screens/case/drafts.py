"""Drafts: the case's unsaved edits journaled through its session, and the read-only guard.

A mixin of CaseScreen (the timer and the warnings are the screen's); the session itself (lock,
draft file, conflict-checked save) is screens/persistence.py, and saving is file_actions.py.
"""

from __future__ import annotations

from pathlib import Path
from typing import TYPE_CHECKING

from screens import persistence

if TYPE_CHECKING:
    from textual.screen import Screen
    from textual.timer import Timer

    from workup.model import Case

    _ScreenBase = Screen[None]
else:
    _ScreenBase = object

JOURNAL_SECONDS = 3.0
"""How often unsaved edits are written to the draft (only when something changed since)."""


class DraftJournal(_ScreenBase):
    """Write the working copy to the draft; refuse edits while another session holds the case."""

    case: Case
    cases_dir: Path
    dirty: bool
    session: persistence.CaseSession | None
    changed_since_journal: bool
    journal_problem: str | None
    journal_timer: Timer | None

    @property
    def read_only(self) -> bool:
        """True when the case was opened while another session held it."""
        return self.session is not None and self.session.read_only

    def end_session(self, clean: bool) -> None:
        """Release the case's lock; a clean close also deletes the draft."""
        if self.session is not None:
            self.session.close(keep_draft=not clean)

    def journal_tick(self) -> None:
        """Timer: write the draft when something changed since the last write."""
        if self.changed_since_journal:
            self.journal_now()

    def journal_now(self) -> bool:
        """Write the working copy to the draft now (if it differs); True when written."""
        if self.read_only:
            return False
        self.changed_since_journal = False
        # The session keeps the version it was given, and the screen edits self.case in
        # place: hand it a copy, or later edits would look already journaled.
        snapshot = self.case.model_copy(deep=True)
        try:
            if self.session is None:
                if not self.dirty:
                    return False
                self.session = persistence.new_session(self.cases_dir, self.case.label, snapshot)
            written = self.session.journal(snapshot)
        except (OSError, persistence.CaseLockedError) as exc:
            if self.journal_problem is None:
                self.notify(
                    f"Unsaved edits could not be written to the draft: {exc}. Save soon.",
                    title="Draft not written",
                    severity="error",
                    timeout=15,
                )
            self.journal_problem = str(exc)
            self.changed_since_journal = True
            return False
        self.journal_problem = None
        return written

    def _refuse_if_read_only(self) -> bool:
        if self.read_only:
            who = self.session.holder.describe() if self.session and self.session.holder else ""
            self.notify(
                f"Read-only: this case is open in another session {who}. Close it there, "
                "then open it again here to edit.",
                severity="warning",
            )
        return self.read_only
