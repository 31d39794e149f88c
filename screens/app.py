"""The workup terminal app: one factory, :func:`build_app`, for the launcher and the tests.

The app owns the screen stack: the library at the bottom, a case workspace over it, dialogs and
help over that. It holds no clinical logic. Heavy modules (the case workspace and the whole core
behind it) are imported only when a case is opened, so the first screen comes up fast.
"""

from __future__ import annotations

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
        self.cases_dir = cases_dir
        self.start_file = file
        self.clock = clock or datetime.now
        self._theme_name = theme
        self._overrides: dict[str, float] | None = None

    def on_mount(self) -> None:
        self.theme = self._theme_name
        # With a file the case comes up first; the library is built when the case is closed.
        if self.start_file is None or not self.open_case(self.start_file):
            self.show_library()
        self._check_size()

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
        self, case, path: Path | None, dirty: bool = False, tab: str = "tab-draw"
    ) -> CaseScreen:
        from screens.case_screen import CaseScreen

        return CaseScreen(
            case, path, self.cases_dir, self.clock, self.user_overrides(), dirty, start_tab=tab
        )

    def open_case(self, path: Path) -> bool:
        """Open the case file at ``path`` on its findings, or say why it cannot be read."""
        from screens import persistence

        try:
            case = persistence.read_case(path)
        except persistence.CaseFileError as exc:
            shown = "\n".join(p.format(path.name) for p in exc.problems[:5])
            more = f"\n(+{len(exc.problems) - 5} more)" if len(exc.problems) > 5 else ""
            self.notify(
                f"{shown}{more}", title="Cannot open the case", severity="error", timeout=15
            )
            return False
        self.push_screen(self._case_screen(case, path, tab="tab-findings"))
        return True

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
