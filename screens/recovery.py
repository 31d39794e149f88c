"""Getting work back: left-over drafts to restore or discard, and a case file's kept backups.

Both screens only list and ask; the app and the case screen do the restoring through
:mod:`screens.persistence`.
"""

from __future__ import annotations

from datetime import UTC, datetime

from rich.text import Text
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Vertical
from textual.screen import ModalScreen
from textual.widgets import Footer, OptionList, Static
from textual.widgets.option_list import Option

from screens.dialogs import ChoiceScreen
from screens.persistence import Backup, Draft, discard_draft

RECOVERY_TITLE = "Unsaved edits from sessions that did not close"


def _when(moment: datetime | None) -> str:
    if moment is None:
        return "an unknown time"
    return moment.astimezone(UTC).strftime("%Y-%m-%d %H:%M UTC")


def draft_line(draft: Draft) -> Text:
    """One draft in words: which case, when, by whom, and whether it can be restored."""
    out = Text()
    if draft.case is None or draft.case_path is None:
        where = draft.case_path.name if draft.case_path else draft.path.name
        out.append("DAMAGED ", style="bold")
        out.append(f"{where}: cannot be restored: {draft.problem}")
        return out
    out.append(f"{draft.case_path.name}", style="bold")
    out.append(f"  {draft.case.label}\n  edited {_when(draft.written)} by {draft.owner}")
    if not draft.case_path.exists():
        out.append("; the case file is gone (restoring keeps the edits as a new file)")
    elif draft.disk_changed():
        out.append("; the file changed on disk since (a save will show the differences)")
    return out


class RecoveryScreen(ModalScreen[tuple[str, "Draft | None"]]):
    """Left-over drafts: restore one, discard one (after asking), or decide later.

    Dismisses with ``("restore", draft)`` or ``("later", None)`` (also when none are left).
    """

    DEFAULT_CSS = """
    RecoveryScreen { align: center middle; }
    RecoveryScreen .wide-dialog {
        width: 90%; max-width: 100; height: auto; max-height: 90%;
        padding: 1 2; border: thick $accent; background: $panel;
    }
    RecoveryScreen #drafts { height: auto; max-height: 14; }
    """

    BINDINGS = [
        Binding("r", "restore", "Restore"),
        Binding("d", "discard", "Discard"),
        Binding("escape,l", "later", "Later"),
    ]

    def __init__(self, drafts: list[Draft]) -> None:
        super().__init__()
        self.drafts = list(drafts)

    def compose(self) -> ComposeResult:
        with Vertical(classes="wide-dialog"):
            yield Static(RECOVERY_TITLE, classes="dialog-question", id="recovery-title")
            yield OptionList(id="drafts")
            yield Static(
                "Enter or r: restore (opens the case with these edits, still unsaved)\n"
                "d: discard (asks first)   Esc or l: later (they are offered again)",
                classes="dialog-hint",
            )
        yield Footer()

    def on_mount(self) -> None:
        self._fill()
        self.query_one(OptionList).focus()

    def _fill(self) -> None:
        box = self.query_one(OptionList)
        box.clear_options()
        box.add_options([Option(draft_line(d)) for d in self.drafts])
        if self.drafts:
            box.highlighted = 0
        n = len(self.drafts)
        self.query_one("#recovery-title", Static).update(
            f"{RECOVERY_TITLE}: {n} draft{'s' if n != 1 else ''}"
        )

    def current(self) -> Draft | None:
        """The highlighted draft."""
        i = self.query_one(OptionList).highlighted
        return self.drafts[i] if i is not None and 0 <= i < len(self.drafts) else None

    def on_option_list_option_selected(self, event: OptionList.OptionSelected) -> None:
        event.stop()
        self.action_restore()

    def action_restore(self) -> None:
        """Restore the highlighted draft (a damaged one cannot be)."""
        d = self.current()
        if d is None:
            return
        if d.case is None:
            self.notify(
                f"This draft cannot be restored: {d.problem}. Discard it with d.",
                severity="warning",
            )
            return
        self.dismiss(("restore", d))

    def action_discard(self) -> None:
        """Delete the highlighted draft, after asking."""
        d = self.current()
        if d is None:
            return

        def done(answer: str | None) -> None:
            if answer != "discard":
                return
            discard_draft(d)
            self.drafts.remove(d)
            if not self.drafts:
                self.dismiss(("later", None))
                return
            self._fill()

        name = d.case_path.name if d.case_path else d.path.name
        self.app.push_screen(
            ChoiceScreen(
                f"Delete the unsaved edits of {name}? They cannot be brought back.",
                [("cancel", "Keep them"), ("discard", "Delete them")],
            ),
            done,
        )

    def action_later(self) -> None:
        """Close the list; the drafts stay and are offered again."""
        self.dismiss(("later", None))


def backup_line(backup: Backup) -> str:
    """One backup in words."""
    return f"{_when(backup.taken)}   {backup.size} bytes   {backup.path.name}"


class BackupsScreen(ModalScreen["Backup | None"]):
    """The kept previous versions of one case file; Enter picks one, Escape cancels (None)."""

    DEFAULT_CSS = """
    BackupsScreen { align: center middle; }
    BackupsScreen .wide-dialog {
        width: 90%; max-width: 100; height: auto; max-height: 90%;
        padding: 1 2; border: thick $accent; background: $panel;
    }
    BackupsScreen #backups { height: auto; max-height: 10; }
    """

    BINDINGS = [Binding("escape", "cancel", "Cancel")]

    def __init__(self, case_name: str, backups: list[Backup]) -> None:
        super().__init__()
        self.case_name = case_name
        self.backups = list(backups)

    def compose(self) -> ComposeResult:
        with Vertical(classes="wide-dialog"):
            yield Static(
                f"Previous versions of {self.case_name} (newest first); each is the file as it "
                "was just before a save replaced it",
                classes="dialog-question",
            )
            yield OptionList(*[Option(backup_line(b)) for b in self.backups], id="backups")
            yield Static("Enter: restore this version (asks first)   Esc: cancel",
                         classes="dialog-hint")  # fmt: skip
        yield Footer()

    def on_mount(self) -> None:
        box = self.query_one(OptionList)
        box.highlighted = 0 if self.backups else None
        box.focus()

    def on_option_list_option_selected(self, event: OptionList.OptionSelected) -> None:
        event.stop()
        self.dismiss(self.backups[event.option_index])

    def action_cancel(self) -> None:
        """Close without choosing."""
        self.dismiss(None)
