"""What every tab of the case screen is built from: a pane that names what to focus when shown,
the form pane that sets its own widgets quietly and shows a refusal beside its row, and the
builders of a form row. The two forms (draw_pane.py, case_pane.py) say what each row edits.

A form pane can be built late: its tab is there from the start, but its rows are composed only
when :meth:`WorkspacePane.build` is first awaited (the screen does so when the tab is first shown,
or for a key that needs the form). A case opened on its findings then paints, and is used,
without ever mounting the ~270 widgets of a form the fellow does not open.
"""

from __future__ import annotations

import asyncio
from contextlib import AbstractContextManager
from typing import Any, ClassVar

from textual.app import ComposeResult
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
    """One tab of the case screen, built at once or, with ``late=True``, on first need."""

    def __init__(self, title: str, *, id: str, late: bool = False) -> None:
        super().__init__(title, id=id)
        self.built = not late
        """True once the pane's content is mounted (from the start for a pane not built late).
        Until then the pane keeps what it is told and shows it when built."""
        self._compose_content = not late
        self._building: asyncio.Event | None = None

    def compose(self) -> ComposeResult:
        """The pane's content, or nothing while it waits to be built."""
        if self._compose_content:
            yield from self.content()

    def content(self) -> ComposeResult:
        """The widgets of the pane (composed as ``compose`` would, ``with`` blocks included)."""
        yield from ()

    async def build(self) -> None:
        """Compose a late pane's content now (once; a second caller waits for the first)."""
        if self._building is not None:
            await self._building.wait()
            return
        self._building = asyncio.Event()
        try:
            if not self.built:
                self._compose_content = True
                await self.recompose()
                # Only now: a key handled while the widgets mount must not look for them.
                self.built = True
                self.after_build()
        finally:
            self._building.set()

    async def settle(self) -> None:
        """Wait for a build under way to finish (returns at once when none was started)."""
        if self._building is not None:
            await self._building.wait()

    def after_build(self) -> None:
        """Fill a late pane's new widgets from the state kept while it was not built."""

    def focus_target(self) -> Widget | None:
        """The widget to focus when the tab is shown (None: the tab bar keeps the focus)."""
        return None


class FormPane(WorkspacePane):
    """A tab holding a form over the working copy."""

    FORM_ID: ClassVar[str] = ""
    """The id of the container holding the form's rows (disabled when read-only)."""

    def __init__(self, title: str, *, id: str, late: bool = False) -> None:
        super().__init__(title, id=id, late=late)
        self.problems: dict[str, str] = {}
        """The refusal shown on each row's state line, by the line's id."""
        self.read_only = False
        """True once the form is disabled (kept for a form built later)."""

    def on_mount(self) -> None:
        if self.built:
            self._texts_from_start()

    def after_build(self) -> None:
        """Set up the form, built late, as one built at once."""
        self._texts_from_start()
        if self.read_only:
            self.make_read_only()

    def _texts_from_start(self) -> None:
        # Long texts read from their start, not scrolled to the cursor at their end.
        for w in self.query(".meta-row Input").results(Input):
            w.cursor_position = 0

    def make_read_only(self) -> None:
        """Disable the form (a read-only session must not be edited)."""
        self.read_only = True
        if self.built:
            self.query_one(f"#{self.FORM_ID}").disabled = True

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
