"""The app's global actions: quit, help, closing message boxes, the theme, the command palette.

WorkupApp (screens/app.py) mixes this in and binds the keys (its BINDINGS); each key's action_
method is here, and so is every palette entry the app adds to a screen's own. The footer that
shows the keys on the library and case screens (SteadyFooter) is here too.
"""

from __future__ import annotations

from collections.abc import Iterable
from typing import TYPE_CHECKING

from textual.app import ComposeResult, SystemCommand
from textual.binding import Binding
from textual.screen import Screen
from textual.widgets import Footer

from screens.dialogs import ChoiceScreen, TooSmallScreen

if TYPE_CHECKING:
    from textual.app import App

    from screens.case_screen import CaseScreen

    _AppBase = App[None]
else:
    _AppBase = object

DEFAULT_THEME = "textual-dark"
HIGH_CONTRAST_THEME = "ansi-dark"
"""Uses the terminal's own palette, so a high-contrast terminal scheme carries through."""


class SteadyFooter(Footer):
    """Textual's footer, rebuilt only when the keys it shows change.

    Textual rebuilds the footer whenever the bindings may have changed: every focus move, so
    every Tab between two fields, repaints the bottom line (over 600 bytes on the line) and at
    start-up the screen settles only after two or three such rebuilds. The keys shown are the
    same unless a widget with keys of its own takes the focus.
    """

    _shown: tuple[tuple[object, ...], ...] | None = None

    def __init__(self) -> None:
        super().__init__()
        # Textual's (private) flag: the footer fills itself when mounted, with the keys known
        # by then, instead of mounting empty and being rebuilt at the first change.
        self._bindings_ready = True

    @staticmethod
    def _keys(screen: Screen) -> tuple[tuple[object, ...], ...]:
        return tuple(
            (b.key, b.description, b.action, enabled, tooltip)
            for (_, b, enabled, tooltip) in screen.active_bindings.values()
            if b.show
        )

    def compose(self) -> ComposeResult:
        self._shown = self._keys(self.screen)
        yield from super().compose()

    def bindings_changed(self, screen: Screen) -> None:
        """Rebuild (as Textual does) only if the keys to show are not those shown."""
        if self._keys(screen) != self._shown:
            super().bindings_changed(screen)


class GlobalActionsMixin(_AppBase):
    """Actions that work on every screen, and the app's entries in the command palette."""

    if TYPE_CHECKING:  # defined by CaseSessionsMixin (screens/app_cases.py)

        def new_case(self) -> None:
            """Start a new, empty case."""
            ...

        def action_drafts(self) -> None:
            """List the left-over drafts again."""
            ...

    def _dirty_cases(self) -> list[CaseScreen]:
        from screens.case_screen import CaseScreen

        return [s for s in self.screen_stack if isinstance(s, CaseScreen) and s.dirty]

    async def action_quit(self) -> None:
        """Quit, first asking about each case with unsaved changes."""
        if isinstance(self.screen, ChoiceScreen):
            return
        dirty = self._dirty_cases()
        if not dirty:
            # A case's form is built on its first visit; shutting down while its widgets mount
            # fails inside Textual, so a Ctrl+Q right after F2 waits for them (a moment).
            for screen in self.screen_stack:
                settle = getattr(screen, "settle_builds", None)
                if settle is not None:
                    await settle()
            self.exit()
            return
        case = dirty[-1]
        while self.screen is not case and not isinstance(self.screen, TooSmallScreen):
            self.pop_screen()
        case.confirm_leave(lambda: self._after_leave(case))

    def _after_leave(self, case: CaseScreen) -> None:
        case.dirty = False
        self.call_later(self.action_quit)

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
