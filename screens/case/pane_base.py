"""What every tab of the case screen is built from: a pane that names what to focus when shown,
the form pane that sets its own widgets quietly and shows a refusal beside its row, and the
builders of a form row. The two forms (draw_pane.py, case_pane.py) say what each row edits.
"""

from __future__ import annotations

from contextlib import AbstractContextManager
from typing import Any

from textual.containers import Horizontal
from textual.widget import Widget
from textual.widgets import Input, Select, Static, TabPane

from screens.entry import EntryInput, EntrySelect
from screens.flags import FlagList


def entry_input(value: str, id_: str, max_length: int) -> Input:
    """A form's one-line text input (Enter and Tab move on, even in a burst of keys)."""
    return EntryInput(value, id=id_, compact=True, max_length=max_length, validate_on=[])


def entry_select(options: list[tuple[str, Any]], value: Any, id_: str) -> Select:
    """A form's choice list, always holding one of ``options``."""
    return EntrySelect(options, value=value, id=id_, allow_blank=False, compact=True)


def meta_row(name: str, widget: Widget, state_id: str) -> Horizontal:
    """A named row holding ``widget``, with the line ``state_id`` for its refusal."""
    return Horizontal(
        Static(name, classes="field-name"),
        widget,
        Static("", id=state_id, classes="meta-state"),
        classes="field-row meta-row",
    )


class WorkspacePane(TabPane):
    """One tab of the case screen."""

    def focus_target(self) -> Widget | None:
        """The widget to focus when the tab is shown (None: the tab bar keeps the focus)."""
        return None


class FormPane(WorkspacePane):
    """A tab holding a form over the working copy."""

    def __init__(self, title: str, *, id: str) -> None:
        super().__init__(title, id=id)
        self.problems: dict[str, str] = {}
        """The refusal shown on each row's state line, by the line's id."""

    def quiet(self) -> AbstractContextManager[None]:
        """Silence the form's Changed messages while the pane sets its own widgets.

        A value the pane sets itself must not come back as an edit: a late Changed message
        would otherwise be applied to whichever draw is showing when it arrives.
        """
        return self.prevent(Input.Changed, Select.Changed, FlagList.Toggled)

    def set_input(self, selector: str, text: str) -> None:
        """Show ``text`` in the input ``selector`` (quietly; untouched when already shown)."""
        w = self.query_one(selector, Input)
        if w.value != text:
            with self.quiet():
                w.value = text

    def set_select(self, selector: str, value: str) -> None:
        """Choose ``value`` in the list ``selector`` (quietly; untouched when already chosen)."""
        w = self.query_one(selector, Select)
        if w.value != value:
            with self.quiet():
                w.value = value

    def show_problem(self, state_id: str, problem: str | None) -> None:
        """Show ``problem`` on the state line ``state_id``, or clear it."""
        if problem:
            self.problems[state_id] = problem
        else:
            self.problems.pop(state_id, None)
        self.query_one(f"#{state_id}", Static).update(problem or "")
