"""Small modal screens: a question with a few answers, a line of text to type, a save conflict,
a size warning."""

from __future__ import annotations

from rich.text import Text
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, Vertical, VerticalScroll
from textual.screen import ModalScreen
from textual.widgets import Button, Footer, Input, Static


class ChoiceScreen(ModalScreen[str]):
    """Ask ``question``; dismisses with the key of the chosen answer ("cancel" on Escape)."""

    BINDINGS = [
        Binding("escape", "choose('cancel')", "Cancel"),
        Binding("left", "app.focus_previous", "Previous", show=False),
        Binding("right", "app.focus_next", "Next", show=False),
    ]

    def __init__(self, question: str, answers: list[tuple[str, str]]) -> None:
        super().__init__()
        self.question = question
        self.answers = answers

    def compose(self) -> ComposeResult:
        with Vertical(classes="dialog"):
            yield Static(self.question, classes="dialog-question")
            with Horizontal(classes="dialog-buttons"):
                for key, label in self.answers:
                    yield Button(label, id=f"answer-{key}", compact=True)
            yield Static("Tab: next answer   Enter: choose   Esc: cancel", classes="dialog-hint")
        yield Footer()

    def on_mount(self) -> None:
        self.query(Button).first().focus()

    def on_button_pressed(self, event: Button.Pressed) -> None:
        event.stop()
        self.dismiss((event.button.id or "answer-cancel").removeprefix("answer-"))

    def action_choose(self, key: str) -> None:
        """Answer ``key`` (bound to Escape for cancel)."""
        self.dismiss(key)


class AskScreen(ModalScreen[str | None]):
    """Ask for one line of text; Enter accepts, Escape cancels (None)."""

    BINDINGS = [Binding("escape", "cancel", "Cancel")]

    def __init__(self, question: str, value: str = "") -> None:
        super().__init__()
        self.question = question
        self.value = value

    def compose(self) -> ComposeResult:
        with Vertical(classes="dialog"):
            yield Static(self.question, classes="dialog-question")
            yield Input(self.value, id="ask-input", compact=True, max_length=200)
            yield Static("Enter: accept   Esc: cancel", classes="dialog-hint")
        yield Footer()

    def on_mount(self) -> None:
        self.query_one(Input).focus()

    def on_input_submitted(self, event: Input.Submitted) -> None:
        event.stop()
        self.dismiss(event.value.strip() or None)

    def action_cancel(self) -> None:
        """Close without an answer."""
        self.dismiss(None)


def diff_text(diff: str) -> Text:
    """A unified diff for the screen: every line keeps its own -/+ mark; colour only adds."""
    out = Text()
    for line in diff.splitlines():
        style = ""
        if line.startswith(("---", "+++")):
            style = "bold"
        elif line.startswith("-"):
            style = "red"
        elif line.startswith("+"):
            style = "green"
        elif line.startswith("@@"):
            style = "italic"
        out.append(line + "\n", style=style)
    return out


class ConflictScreen(ModalScreen[str]):
    """The case file changed on disk since it was opened: show the differences and ask.

    Dismisses with "overwrite", "save_as" or "cancel" (also on Escape).
    """

    DEFAULT_CSS = """
    ConflictScreen { align: center middle; }
    ConflictScreen .wide-dialog {
        width: 95%; max-width: 110; height: 90%;
        padding: 0 1; border: thick $accent; background: $panel;
    }
    ConflictScreen #conflict-diff { height: 1fr; border: round $primary; }
    ConflictScreen .dialog-buttons { height: auto; margin-top: 1; }
    ConflictScreen .dialog-buttons Button { margin-right: 2; }
    """

    BINDINGS = [
        Binding("escape", "choose('cancel')", "Cancel"),
        Binding("left", "app.focus_previous", "Previous", show=False),
        Binding("right", "app.focus_next", "Next", show=False),
        # The differences scroll whichever button has the focus.
        Binding("up", "scroll_diff('up')", "Scroll", show=False),
        Binding("down", "scroll_diff('down')", "Scroll", show=False),
        Binding("pageup", "scroll_diff('page_up')", "Page up", show=False),
        Binding("pagedown", "scroll_diff('page_down')", "Page down", show=False),
    ]

    def __init__(self, message: str, diff: str) -> None:
        super().__init__()
        self.message = message
        self.diff = diff

    def compose(self) -> ComposeResult:
        # Not the app's fixed-width ".dialog": the differences need the terminal's width.
        with Vertical(classes="wide-dialog"):
            yield Static(self.message, classes="dialog-question", id="conflict-message")
            yield Static(
                "- lines: on disk now, would be lost;  + lines: your version",
                classes="dialog-hint",
            )
            with VerticalScroll(id="conflict-diff", can_focus=True):
                yield Static(diff_text(self.diff) if self.diff else "(no difference in the text)")
            with Horizontal(classes="dialog-buttons"):
                yield Button("Save as a new file", id="answer-save_as", compact=True)
                yield Button("Overwrite (keeps a backup)", id="answer-overwrite", compact=True)
                yield Button("Cancel", id="answer-cancel", compact=True)
            yield Static(
                "Tab: next answer   Up/Down, PgUp/PgDn: scroll   Esc: cancel",
                classes="dialog-hint",
            )
        yield Footer()

    def on_mount(self) -> None:
        self.query_one("#answer-save_as", Button).focus()

    def on_button_pressed(self, event: Button.Pressed) -> None:
        event.stop()
        self.dismiss((event.button.id or "answer-cancel").removeprefix("answer-"))

    def action_choose(self, key: str) -> None:
        """Answer ``key`` (bound to Escape for cancel)."""
        self.dismiss(key)

    def action_scroll_diff(self, how: str) -> None:
        """Scroll the differences: up, down, page_up or page_down."""
        box = self.query_one("#conflict-diff", VerticalScroll)
        getattr(box, f"scroll_{how}")(animate=False)


MIN_WIDTH, MIN_HEIGHT = 80, 24


class TooSmallScreen(ModalScreen[None]):
    """Shown instead of a broken layout while the terminal is smaller than 80 × 24."""

    def compose(self) -> ComposeResult:
        yield Static("", id="too-small")
        yield Footer()

    def on_mount(self) -> None:
        self.update_size()

    def on_resize(self) -> None:
        self.update_size()

    def update_size(self) -> None:
        """Say how big the terminal is and how big it needs to be."""
        w, h = self.app.size
        self.query_one("#too-small", Static).update(
            f"Terminal too small: {w} × {h}.\n"
            f"workup needs at least {MIN_WIDTH} × {MIN_HEIGHT}.\n"
            "Enlarge the window; nothing is lost. Ctrl+Q quits."
        )
