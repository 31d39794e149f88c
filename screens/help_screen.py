"""The help screen: the keys of the screen it was opened from, the status marks and the cautions."""

from __future__ import annotations

from rich.text import Text
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import VerticalScroll
from textual.screen import ModalScreen
from textual.widgets import Footer, Static

from workup.cautions import CAUTION_LINES
from workup.findings import STATUS_MARK, STATUS_WORD, Status

STATUS_MEANING = {
    Status.ok: "computed, and its validity conditions hold",
    Status.caution: "computed, but read it with the caveat given",
    Status.not_valid: "computed, but a validity condition fails: do not rely on it",
    Status.needs_input: "cannot be computed until the missing values are entered",
}


def help_text(
    title: str, keys: list[tuple[str, str]], cautions: list[str], extra: str = ""
) -> Text:
    """The help page as text."""
    out = Text()
    out.append(f"Help: {title}\n\n", style="bold")
    out.append("Keys\n", style="bold")
    for key, what in keys:
        out.append(f"  {key:<14} {what}\n")
    out.append("  Ctrl+P         every action by name (command palette)\n")
    out.append("\nStatus of a computed value (mark, word, meaning)\n", style="bold")
    for s in Status:
        out.append(f"  {STATUS_MARK[s]} {STATUS_WORD[s]:<12} {STATUS_MEANING[s]}\n")
    out.append("\nEntered values: '+ read' accepted, '! unusual' accepted with a caution,\n")
    out.append("'x refused' not possible or not readable (the reason is shown under the form).\n")
    if extra:
        out.append(f"\n{extra}\n")
    out.append("\nCautions\n", style="bold")
    for c in [*dict.fromkeys([*cautions, *CAUTION_LINES])]:
        out.append(f"  - {c}\n")
    return out


class HelpScreen(ModalScreen[None]):
    """Keys, marks and cautions; Escape, F1 or q closes it."""

    BINDINGS = [
        Binding("escape,f1,q,question_mark", "close", "Close help"),
    ]

    def __init__(
        self, title: str, keys: list[tuple[str, str]], cautions: list[str], extra: str = ""
    ) -> None:
        super().__init__()
        self.help = help_text(title, keys, cautions, extra)

    def compose(self) -> ComposeResult:
        with VerticalScroll(id="help-body", can_focus=True):
            yield Static(self.help, id="help-text")
        yield Footer()

    def on_mount(self) -> None:
        self.query_one("#help-body").focus()

    def action_close(self) -> None:
        """Close the help screen."""
        self.dismiss(None)
