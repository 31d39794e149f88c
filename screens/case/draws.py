"""The case's draws: which one is shown, and adding, copying, deleting or pasting into one.

A mixin of CaseScreen (Ctrl+N and Ctrl+PgUp/PgDn are the screen's keys): each change goes into
the working copy, the draw form is told which draw to show, and the draft is written at once.
"""

from __future__ import annotations

from collections.abc import Callable
from datetime import datetime
from typing import TYPE_CHECKING, Any

from screens.case.drafts import DraftJournal
from screens.dialogs import ChoiceScreen
from workup.model import Draw

if TYPE_CHECKING:
    from screens.case.draw_pane import DrawPane


def fresh_draw(draws: list[Draw], clock: Callable[[], datetime]) -> Draw:
    """An empty draw time-stamped now (to the minute), labelled apart from ``draws``."""
    labels = {d.label for d in draws}
    n = len(draws) + 1
    while f"draw {n}" in labels:
        n += 1
    taken = clock().replace(second=0, microsecond=0)
    return Draw(label=f"draw {n}", taken=taken)


class DrawActions(DraftJournal):
    """Move between the draws and change the case's list of draws."""

    index: int
    clock: Callable[[], datetime]
    draw_pane: DrawPane

    if TYPE_CHECKING:  # the screen's own, named here for the reader and the type checker

        @property
        def draw(self) -> Draw: ...
        def _mark_dirty(self) -> None: ...
        def _show_draw(self) -> None: ...
        def _recompute(self) -> None: ...
        async def action_tab(self, tab_id: str) -> None: ...

    def switch_draw(self, index: int) -> None:
        """Show draw ``index`` in the form and the findings."""
        self.index = max(0, min(index, len(self.case.draws) - 1))
        self._show_draw()
        self._recompute()
        if self.changed_since_journal:
            self.journal_now()  # a draw added, copied, deleted or left: journal at once

    def action_previous_draw(self) -> None:
        """Show the draw before this one."""
        if self.index > 0:
            self.switch_draw(self.index - 1)

    def action_next_draw(self) -> None:
        """Show the draw after this one."""
        if self.index < len(self.case.draws) - 1:
            self.switch_draw(self.index + 1)

    async def action_new_draw(self) -> None:
        """Add an empty draw, time-stamped now, and show it on its first value (repeat labs are
        typed straight in; its label and time come after the values in Tab order)."""
        if self._refuse_if_read_only():
            return
        self.case.draws.append(fresh_draw(self.case.draws, self.clock))
        self._mark_dirty()
        self.switch_draw(len(self.case.draws) - 1)
        await self.action_tab("tab-draw")  # the form may not be built yet
        # The tab may already be shown with focus further down the form: start at its top.
        self.set_focus(self.draw_pane.query_one("#in-serum-sodium"))

    def action_copy_draw(self) -> None:
        """Add a copy of this draw's values as a new draw."""
        if self._refuse_if_read_only():
            return
        new = fresh_draw(self.case.draws, self.clock)
        copy = self.draw.model_copy(deep=True)
        copy.label, copy.taken, copy.during = new.label, new.taken, None
        self.case.draws.append(copy)
        self._mark_dirty()
        self.switch_draw(len(self.case.draws) - 1)

    def action_delete_draw(self) -> None:
        """Remove this draw, after asking."""
        if self._refuse_if_read_only():
            return
        if len(self.case.draws) == 1:
            self.notify("A case keeps at least one draw.", severity="warning")
            return

        def done(answer: str | None) -> None:
            if answer != "delete":
                return
            gone = self.index
            del self.case.draws[gone]
            self.draw_pane.forget_draw(gone)
            self.switch_draw(min(gone, len(self.case.draws) - 1))
            self._mark_dirty()

        self.app.push_screen(
            ChoiceScreen(
                f"Delete the draw {self.draw.label!r} and its values?",
                [("cancel", "Keep it"), ("delete", "Delete")],
            ),
            done,
        )

    def action_paste(self) -> None:
        """Read a pasted lab report into this draw (when the paste screen is available)."""
        if self._refuse_if_read_only():
            return
        try:
            from screens.paste import PasteScreen
            from workup.paste import apply_proposal
        except ImportError:
            self.notify("Pasting lab reports is not available yet.", severity="warning")
            return

        def done(proposal: Any) -> None:
            if proposal is None:
                return
            try:
                updated = apply_proposal(self.draw, proposal)
            except Exception as exc:
                self.notify(f"The pasted values could not be applied: {exc}", severity="error")
                return
            self.case.draws[self.index] = updated
            self._mark_dirty()
            self.switch_draw(self.index)

        self.app.push_screen(PasteScreen(self.case.units), done)
