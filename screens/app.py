"""The workup terminal app: one factory, :func:`build_app`, for the launcher and the tests.

The app owns the screen stack: the library at the bottom, a case workspace over it, dialogs and
help over that. It holds no clinical logic. Heavy modules (the case workspace and the whole core
behind it) are imported only when a case is opened, so the first screen comes up fast.

Every case is opened through a session (screens/persistence.py): on start the drafts left by
sessions that did not close are offered first; a dropped line (SIGHUP) writes the drafts once
more and ends the process without a clean close, so they are offered again on the next start.
"""

from __future__ import annotations

import contextlib
import os
import signal
from collections.abc import Callable, Iterable
from datetime import datetime
from pathlib import Path
from typing import TYPE_CHECKING

from textual import events
from textual.app import App, SystemCommand
from textual.binding import Binding
from textual.screen import Screen

from screens.dialogs import MIN_HEIGHT, MIN_WIDTH, ChoiceScreen, TooSmallScreen
from screens.messages import NewCase, OpenCase

if TYPE_CHECKING:
    from screens.case_screen import CaseScreen
    from screens.persistence import CaseSession, Draft

DEFAULT_THEME = "textual-dark"
HIGH_CONTRAST_THEME = "ansi-dark"
"""Uses the terminal's own palette, so a high-contrast terminal scheme carries through."""


class WorkupApp(App[None]):
    """Keyboard-only workspace for working up a metabolic acidosis."""

    CSS_PATH = "workup.tcss"
    TITLE = "workup"
    BINDINGS = [
        Binding("f1", "help", "Help", id="help"),
        Binding("question_mark", "help", "Help", show=False),
        Binding("ctrl+q", "quit", "Quit", priority=True, id="quit"),
        # Without a mouse a message box cannot be clicked away; at 80x24 a long one hides half
        # the screen until it times out. Priority, so that a focused text field or the note
        # does not take the key while a message is shown; with none shown the key steps aside
        # (check_action) and deletes to the right as usual.
        Binding("ctrl+d", "dismiss_messages", "Dismiss messages", show=False, priority=True),
    ]

    def __init__(
        self,
        cases_dir: Path,
        file: Path | None = None,
        *,
        clock: Callable[[], datetime] | None = None,
        theme: str = DEFAULT_THEME,
    ) -> None:
        super().__init__()
        # Nothing animates: over SSH every animation frame is bytes on the line (tab underlines,
        # scrolls), and a settled screen comes sooner.
        self.animation_level = "none"
        self.cases_dir = cases_dir
        self.start_file = file
        self.clock = clock or datetime.now
        self._theme_name = theme
        self._overrides: dict[str, float] | None = None

    def on_mount(self) -> None:
        self.theme = self._theme_name
        if not self.is_headless:
            self._catch_hangup()
        drafts = self._pending_drafts()
        if drafts:
            from screens.recovery import RecoveryScreen

            # Left-over edits come first: the start file may be one of them.
            if self.start_file is None:
                self.show_library()
            self.push_screen(RecoveryScreen(drafts), self._recovery_done)
        else:
            self._start()
        self._check_size()

    def _start(self) -> None:
        # With a file the case comes up first; the library is built when the case is closed.
        if self.start_file is None or not self.open_case(self.start_file):
            self.show_library()

    def _pending_drafts(self) -> list[Draft]:
        from screens import persistence

        try:
            return persistence.pending_drafts()
        except OSError as exc:
            self.notify(f"The drafts folder cannot be read: {exc}", severity="error", timeout=15)
            return []

    def _recovery_done(self, result: tuple[str, Draft | None] | None) -> None:
        what, draft = result or ("later", None)
        if what == "restore" and draft is not None:
            start = self.start_file
            if start is not None and draft.case_path != Path(os.path.realpath(start)):
                self.notify(
                    f"{start.name} was not opened; open it from the library (Ctrl+O) when "
                    "you are done with the restored case.",
                    timeout=10,
                )
            self.show_library()
            self.restore_draft(draft)
            return
        self._start()

    def _catch_hangup(self) -> None:
        # A dropped SSH line sends SIGHUP. Write every open case's draft once more, then die of
        # the signal as before: it is not a clean close, so the drafts stay for the next start.
        def hangup(signum: int, frame: object) -> None:
            try:
                self.journal_all()
            finally:
                signal.signal(signal.SIGHUP, signal.SIG_DFL)
                os.kill(os.getpid(), signal.SIGHUP)

        with contextlib.suppress(ValueError, OSError):  # not the main thread: leave it
            signal.signal(signal.SIGHUP, hangup)

    def journal_all(self) -> None:
        """Write the draft of every open case with unsaved edits now."""
        from screens.case_screen import CaseScreen

        for screen in self.screen_stack:
            if isinstance(screen, CaseScreen) and screen.dirty:
                with contextlib.suppress(Exception):  # one failing case must not stop the rest
                    screen.journal_now()

    def show_library(self) -> None:
        """Make sure the library is on the screen stack (under any case) and shown."""
        from screens.library import LibraryScreen

        if not any(isinstance(s, LibraryScreen) for s in self.screen_stack):
            self.push_screen(LibraryScreen(self.cases_dir))

    # ------------------------------------------------------------ terminal

    def on_descendant_focus(self, event: events.DescendantFocus) -> None:
        # A blinking cursor costs bytes every half second over SSH.
        if hasattr(event.widget, "cursor_blink"):
            event.widget.cursor_blink = False  # type: ignore[attr-defined]

    def on_resize(self, event: events.Resize) -> None:
        self._check_size(event.size.width, event.size.height)

    def _check_size(self, width: int | None = None, height: int | None = None) -> None:
        width = self.size.width if width is None else width
        height = self.size.height if height is None else height
        small = width < MIN_WIDTH or height < MIN_HEIGHT
        showing = isinstance(self.screen, TooSmallScreen)
        if small and not showing:
            self.push_screen(TooSmallScreen())
        elif not small and showing:
            self.pop_screen()

    # ------------------------------------------------------------ cases

    def user_overrides(self) -> dict[str, float]:
        """The user's settings file, read once; a bad file is reported and ignored."""
        if self._overrides is None:
            from workup.settings import load_user_overrides

            try:
                self._overrides = load_user_overrides()
            except (ValueError, OSError) as exc:
                self._overrides = {}
                self.notify(f"Settings file ignored: {exc}", severity="warning", timeout=10)
        return self._overrides

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
            shown = "\n".join(p.format(path.name) for p in exc.problems[:5])
            more = f"\n(+{len(exc.problems) - 5} more)" if len(exc.problems) > 5 else ""
            self.notify(
                f"{shown}{more}", title="Cannot open the case", severity="error", timeout=15
            )
            return False
        except persistence.CaseLockedError as exc:
            self._ask_read_only(path, exc)
            return True
        except OSError as exc:
            self.notify(f"{path}: {exc}", title="Cannot open the case", severity="error")
            return False
        self._tell_notes(session)
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

    def _tell_notes(self, session: CaseSession) -> None:
        if session.lock is not None and session.lock.note:
            self.notify(session.lock.note, title="Stale lock taken over", severity="warning",
                        timeout=20)  # fmt: skip
        if session.privacy:
            # One toast, not one per warning: the folder's chmod alone already shuts others
            # out; every warning with its command is on the case's help screen (F1).
            first = session.privacy[0]
            more = len(session.privacy) - 1
            tail = f"\n(+{more} more warning{'s' if more != 1 else ''}: F1)" if more else ""
            tail += "\nctrl+d closes this message"
            self.notify(first.format() + tail, title="Case folder not private",
                        severity="warning", timeout=30)  # fmt: skip

    def _ask_read_only(self, path: Path, exc: Exception) -> None:
        holder = getattr(exc, "holder", None)
        who = holder.describe() if holder else "another session (its details are unreadable)"

        def done(answer: str | None) -> None:
            if answer == "read_only":
                self.open_case(path, read_only=True)
            else:
                self.show_library()

        self.push_screen(
            ChoiceScreen(
                f"{path.name} is open in {who}.\nOpen it read-only here (no edits, no "
                "saving), or cancel?",
                [("read_only", "Open read-only"), ("cancel", "Cancel")],
            ),
            done,
        )

    def _offer_pending(self, session: CaseSession) -> None:
        from screens.recovery import draft_line

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
            ChoiceScreen(
                f"Unsaved edits of {session.path.name} were left by a session that did not "
                "close:\n" + draft_line(draft).plain + "\nRestore them (still unsaved until "
                "you save), discard them, or decide later?",
                answers,
            ),
            done,
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
        from workup.model import Case

        self.push_screen(self._case_screen(Case(label="New case"), None, dirty=True))

    def duplicate_case(self, screen: CaseScreen) -> None:
        """Open a copy of ``screen``'s case as a new, unsaved case."""
        copy = screen.case.model_copy(deep=True)
        copy.label = (copy.label + " (copy)")[:120]
        self.push_screen(self._case_screen(copy, None, dirty=True))

    def on_open_case(self, message: OpenCase) -> None:
        self.open_case(Path(message.path))

    def on_new_case(self, message: NewCase) -> None:
        self.new_case()

    def _dirty_cases(self) -> list[CaseScreen]:
        from screens.case_screen import CaseScreen

        return [s for s in self.screen_stack if isinstance(s, CaseScreen) and s.dirty]

    async def action_quit(self) -> None:
        """Quit, first asking about each case with unsaved changes."""
        if isinstance(self.screen, ChoiceScreen):
            return
        dirty = self._dirty_cases()
        if not dirty:
            self.exit()
            return
        case = dirty[-1]
        while self.screen is not case and not isinstance(self.screen, TooSmallScreen):
            self.pop_screen()
        case.confirm_leave(lambda: self._after_leave(case))

    def _after_leave(self, case: CaseScreen) -> None:
        case.dirty = False
        self.call_later(self.action_quit)

    # ------------------------------------------------------------ help and commands

    def action_help(self) -> None:
        """Open the help screen for the current screen."""
        from screens.help_screen import HelpScreen

        screen = self.screen
        if isinstance(screen, HelpScreen | TooSmallScreen):
            return
        context = getattr(screen, "help_context", None)
        if callable(context):
            title, keys, cautions, extra = context()
        else:
            title, cautions, extra = type(screen).__name__.removesuffix("Screen").lower(), [], ""
            keys = [
                (self.get_key_display(b), b.description)
                for b in [*screen.BINDINGS, *self.BINDINGS]
                if isinstance(b, Binding) and b.description
            ]
        self.push_screen(HelpScreen(title, keys, cautions, extra))

    def check_action(self, action: str, parameters: tuple[object, ...]) -> bool | None:
        """Let ctrl+d reach the focused widget when no message box is shown."""
        if action == "dismiss_messages":
            return bool(self._notifications)
        return super().check_action(action, parameters)

    def action_dismiss_messages(self) -> None:
        """Close every message box now (each also closes by itself after a while)."""
        self.clear_notifications()

    def action_high_contrast(self) -> None:
        """Switch between the default theme and the terminal's own palette."""
        self.theme = DEFAULT_THEME if self.theme == HIGH_CONTRAST_THEME else HIGH_CONTRAST_THEME

    def get_system_commands(self, screen: Screen) -> Iterable[SystemCommand]:
        """Palette entries: Textual's own, the app's, and every action of ``screen``."""
        yield from super().get_system_commands(screen)
        yield SystemCommand("Help", "Keys, status marks and cautions (F1)", self.action_help)
        yield SystemCommand(
            "High-contrast theme",
            "Toggle the terminal's own palette (ansi-dark) and the default theme",
            self.action_high_contrast,
        )
        yield SystemCommand("New case", "Start a new, empty case", self.new_case)
        yield SystemCommand(
            "Unsaved drafts",
            "Edits left by sessions that did not close: restore or discard",
            self.action_drafts,
        )
        commands = getattr(screen, "commands", None)
        if callable(commands):
            for title, help_text, callback in commands():
                yield SystemCommand(title, help_text, callback)


def build_app(
    cases_dir: Path,
    file: Path | None = None,
    *,
    clock: Callable[[], datetime] | None = None,
    theme: str = DEFAULT_THEME,
) -> WorkupApp:
    """The app on the library ``cases_dir``, opening ``file`` on its findings when given.

    Inject ``clock`` for repeatable time stamps (tests, snapshots); the theme is set explicitly
    so that an inherited ``TEXTUAL_THEME`` never changes what a snapshot shows.
    """
    return WorkupApp(
        Path(cases_dir), Path(file) if file is not None else None, clock=clock, theme=theme
    )
