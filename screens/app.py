"""The workup terminal app: one factory, :func:`build_app`, for the launcher and the tests.

The app owns the screen stack: the library at the bottom, a case workspace over it, dialogs and
help over that. It holds no clinical logic. Heavy modules (the case workspace and the whole core
behind it) are imported only when a case is opened, so the first screen comes up fast.

This module builds the app: its keys, settings, start-up and terminal handling. Opening cases is
in screens/app_cases.py (its messages in screens/app_notices.py); the actions behind the global
keys and the command palette are in screens/app_actions.py.

Every case is opened through a session (screens/persistence.py): on start the drafts left by
sessions that did not close are offered first; a dropped line (SIGHUP) writes the drafts once
more and ends the process without a clean close, so they are offered again on the next start.
"""

from __future__ import annotations

import contextlib
import os
import signal
from collections.abc import Callable
from datetime import datetime
from pathlib import Path
from typing import TYPE_CHECKING

from textual import events
from textual.app import App
from textual.binding import Binding

from screens.app_actions import DEFAULT_THEME, HIGH_CONTRAST_THEME, GlobalActionsMixin
from screens.app_cases import CaseSessionsMixin
from screens.dialogs import MIN_HEIGHT, MIN_WIDTH, TooSmallScreen

if TYPE_CHECKING:
    from screens.persistence import Draft

__all__ = ["DEFAULT_THEME", "HIGH_CONTRAST_THEME", "WorkupApp", "build_app"]


class WorkupApp(GlobalActionsMixin, CaseSessionsMixin, App[None]):
    """Keyboard-only workspace for working up a metabolic acidosis."""

    CSS_PATH = "workup.tcss"
    TITLE = "workup"
    # The global keys; their action_ methods are in screens/app_actions.py.
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

    # ------------------------------------------------------------ start-up

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
