"""Opening cases: through a session (screens/persistence.py), with its questions, onto the stack.

WorkupApp (screens/app.py) mixes this in; the library posts OpenCase and NewCase, which land
here. The wording of every message and question is in screens/app_notices.py. The case
workspace and the core behind it are imported only when a case is opened.
"""

from __future__ import annotations

from collections.abc import Callable
from datetime import datetime
from pathlib import Path
from typing import TYPE_CHECKING

from screens.app_notices import (
    case_file_problems,
    pending_edits_question,
    read_only_question,
)
from screens.dialogs import ChoiceScreen
from screens.messages import NewCase, OpenCase

if TYPE_CHECKING:
    from textual.app import App

    from screens.case_screen import CaseScreen
    from screens.persistence import CaseSession, Draft

    _AppBase = App[None]
else:
    _AppBase = object


class CaseSessionsMixin(_AppBase):
    """The app's case opening: open, restore left-over edits, start a new case or a copy."""

    cases_dir: Path
    """The library folder; new cases are saved into it."""
    clock: Callable[[], datetime]
    """The time source handed to every case workspace."""

    if TYPE_CHECKING:  # defined by WorkupApp itself (screens/app.py)

        def user_overrides(self) -> dict[str, float]:
            """The user's settings file, read once."""
            ...

        def show_library(self) -> None:
            """Make sure the library is on the screen stack and shown."""
            ...

    def _case_screen(
        self,
        case,
        path: Path | None,
        dirty: bool = False,
        tab: str = "tab-draw",
        session: CaseSession | None = None,
    ) -> CaseScreen:
        from screens.case_screen import CaseScreen

        return CaseScreen(
            case,
            path,
            self.cases_dir,
            self.clock,
            self.user_overrides(),
            dirty,
            start_tab=tab,
            session=session,
        )

    def open_case(self, path: Path, *, read_only: bool = False) -> bool:
        """Open the case file at ``path`` on its findings, or say why it cannot be.

        Returns False when nothing was shown for it (the file cannot be read); a question about
        it (held by another session, left-over edits) counts as shown.
        """
        from screens import persistence

        try:
            session = persistence.open_session(path, read_only=read_only)
        except persistence.CaseFileError as exc:
            self.notify(
                case_file_problems(exc.problems, path.name),
                title="Cannot open the case",
                severity="error",
                timeout=15,
            )
            return False
        except persistence.CaseLockedError as exc:
            self._ask_read_only(path, exc)
            return True
        except OSError as exc:
            self.notify(f"{path}: {exc}", title="Cannot open the case", severity="error")
            return False
        # The stale-lock and privacy warnings go on the case screen's banner line (see
        # screens.app_notices.banner_text), not in toasts that would cover the findings.
        if session.pending_draft is not None:
            self._offer_pending(session)
        else:
            self._show_session(session, session.case, dirty=False)
        return True

    def _show_session(self, session: CaseSession, case, *, dirty: bool) -> None:
        # A restored case that was never saved has no file yet: its first save names it.
        path = session.path if session.base is not None or session.path.exists() else None
        screen = self._case_screen(
            case.model_copy(deep=True), path, dirty, tab="tab-findings", session=session
        )
        self.push_screen(screen)

    def _ask_read_only(self, path: Path, exc: Exception) -> None:
        def done(answer: str | None) -> None:
            if answer == "read_only":
                self.open_case(path, read_only=True)
            else:
                self.show_library()

        self.push_screen(
            ChoiceScreen(
                read_only_question(path.name, exc),
                [("read_only", "Open read-only"), ("cancel", "Cancel")],
            ),
            done,
        )

    def _offer_pending(self, session: CaseSession) -> None:
        draft = session.pending_draft
        assert draft is not None
        damaged = draft.case is None
        answers = [("discard", "Discard them"), ("later", "Later")]
        if not damaged:
            answers.insert(0, ("restore", "Restore them"))

        def done(answer: str | None) -> None:
            case, dirty = session.case, False
            if answer == "restore" and not damaged:
                if draft.disk_changed():
                    # Restore on the file the edits began from, so a save shows what changed.
                    session.close(keep_draft=True)
                    self.restore_draft(draft)
                    return
                case, dirty = session.restore_pending(), True
            elif answer == "discard":
                session.discard_pending()
            self._show_session(session, case, dirty=dirty)

        self.push_screen(
            ChoiceScreen(pending_edits_question(session.path.name, draft), answers), done
        )

    def restore_draft(self, draft: Draft) -> bool:
        """Open a left-over draft's case with its edits (unsaved); False when it cannot be."""
        from screens import persistence

        changed = draft.case_path is not None and draft.disk_changed()
        try:
            session = persistence.restore_draft(draft)
        except persistence.CaseLockedError as exc:
            self.notify(f"Not restored: {exc}.", severity="error", timeout=10)
            return False
        except (OSError, ValueError) as exc:
            self.notify(f"Not restored: {exc}", severity="error", timeout=10)
            return False
        if changed:
            self.notify(
                f"{session.path.name} changed on disk after these edits began; saving will "
                "show the differences first.",
                severity="warning",
                timeout=15,
            )
        self._show_session(session, session.case, dirty=True)
        return True

    def _pending_drafts(self) -> list[Draft]:
        from screens import persistence

        try:
            return persistence.pending_drafts()
        except OSError as exc:
            self.notify(f"The drafts folder cannot be read: {exc}", severity="error", timeout=15)
            return []

    def action_drafts(self) -> None:
        """List the left-over drafts again, to restore or discard them."""
        from screens.recovery import RecoveryScreen

        drafts = self._pending_drafts()
        if not drafts:
            self.notify("No unsaved edits are left over from other sessions.")
            return

        def done(result: tuple[str, Draft | None] | None) -> None:
            if result and result[0] == "restore" and result[1] is not None:
                self.restore_draft(result[1])

        self.push_screen(RecoveryScreen(drafts), done)

    def new_case(self) -> None:
        """Start a new, empty case (saved into the library folder on first save)."""
        from workup.analytes import UnitSystem
        from workup.model import Case
        from workup.settings import load_user_unit_system

        try:
            chosen = load_user_unit_system()
        except (ValueError, OSError) as exc:
            chosen = "none"  # a bad file must not pick units silently: every field asks
            self.notify(f"unit_system ignored: {exc}", severity="warning", timeout=10)
        units = None if chosen == "none" else UnitSystem(chosen)
        screen = self._case_screen(Case(label="New case", units=units), None, dirty=True)
        if units is not None:
            screen.draw_pane.units_origin = "from your settings"
        self.push_screen(screen)

    def duplicate_case(self, screen: CaseScreen) -> None:
        """Open a copy of ``screen``'s case as a new, unsaved case."""
        copy = screen.case.model_copy(deep=True)
        copy.label = (copy.label + " (copy)")[:120]
        self.push_screen(self._case_screen(copy, None, dirty=True))

    def on_open_case(self, message: OpenCase) -> None:
        self.open_case(Path(message.path))

    def on_new_case(self, message: NewCase) -> None:
        self.new_case()
