"""The note screen: the drafted assessment, editable, to copy (OSC 52) or write to a file."""

from __future__ import annotations

from collections.abc import Callable
from pathlib import Path

from textual.app import ComposeResult
from textual.binding import Binding
from textual.screen import Screen
from textual.widgets import Footer, Static, TextArea

from screens.case.titlebar import Field, FittedLine, word_prefixes
from workup.assess import Assessment
from workup.model import Case

TMUX_HINT = (
    "Copied with OSC 52. Under tmux it reaches your computer only with "
    "`set -s set-clipboard on`; if nothing arrived, press F3 to write the note to a file."
)


def draft(assessment: Assessment, case: Case) -> str:
    """The drafted note (the short style, as ``workup note`` prints by default): ``workup.note``
    when present, else the plain assessment text."""
    try:
        from workup.note import draft_note
    except ImportError:
        from workup.commands.assess import render_text

        return render_text(assessment)
    return draft_note(assessment, case, style="brief", fmt="text")


def note_title(label: str) -> FittedLine:
    """The note screen's title line: the case label, then where edits go (shortened first)."""
    return FittedLine(
        [
            Field(tuple(f"Note: {w}" for w in word_prefixes(label)), 2),
            Field(("(edits stay here, not in the case)", "(edits stay here)"), 1),
        ],
        sep=" ",
    )


class NoteScreen(Screen[None]):
    """Edit the drafted note; F2 copies it, F3 writes it beside the case, F4 drafts it afresh."""

    BINDINGS = [
        Binding("f2", "copy", "Copy"),
        # Short words: with the app's Quit and Help the footer fits 80 columns whole.
        Binding("f3", "write", "Write file"),
        Binding("f4", "redraft", "Redraft"),
        Binding("escape", "back", "Back"),
    ]

    def __init__(
        self,
        assessment: Assessment,
        case: Case,
        note_file: Callable[[], Path],
        write: Callable[[str, Path], Path],
    ) -> None:
        super().__init__()
        self.assessment = assessment
        self.case = case
        self.note_file = note_file
        self.write = write

    def compose(self) -> ComposeResult:
        yield Static(note_title(self.case.label), id="titlebar")
        try:
            text = draft(self.assessment, self.case)
        except Exception as exc:  # a half-built drafter must not take the app down
            text = f"The note could not be drafted: {exc}"
        yield TextArea(text, id="note-text", soft_wrap=False, show_line_numbers=False)
        yield Footer()

    def on_mount(self) -> None:
        self.query_one(TextArea).focus()

    @property
    def text(self) -> str:
        """The note as currently edited."""
        return self.query_one(TextArea).text

    def action_copy(self) -> None:
        """Copy the note to the clipboard of the terminal (OSC 52)."""
        self.app.copy_to_clipboard(self.text)
        self.notify(TMUX_HINT, title="Note copied", timeout=8)

    def action_write(self) -> None:
        """Write the note to a file next to the case."""
        try:
            path = self.write(self.text, self.note_file())
        except OSError as exc:
            self.notify(f"Could not write the note: {exc}", severity="error")
            return
        self.notify(f"Note written to {path}", title="Note saved")

    def action_redraft(self) -> None:
        """Replace the edited text with a fresh draft."""
        self.query_one(TextArea).text = draft(self.assessment, self.case)

    def action_back(self) -> None:
        """Return to the case."""
        self.dismiss(None)
