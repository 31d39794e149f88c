"""Pilot flows at 80 × 24: a refused entry is shown on its row, explained, and listed at save.

The demo case is an invented scenario (see cases/).
"""

from __future__ import annotations

from pathlib import Path

from textual.widgets import Input, Static

from screens.case_screen import CaseScreen
from screens.dialogs import ChoiceScreen
from tests.screens.support import SIZE
from tests.screens.support import make_app as _app
from workup.caseio import load_case


async def test_refused_draw_time_is_shown_and_listed_before_saving(demo: Path) -> None:
    before = load_case(demo).draws[-1].taken
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        taken = screen.query_one("#meta-taken", Input)
        taken.focus()
        taken.value = "138"  # a sodium typed into the wrong row
        await pilot.pause()
        state = str(screen.query_one("#st-taken", Static).render())
        assert "refused" in state and "not a date and time" in state
        assert screen.draw.taken == before  # the old time stays; 138 is not read as one
        await pilot.press("ctrl+s")
        await pilot.pause()
        dialog = app.screen
        assert isinstance(dialog, ChoiceScreen)
        assert "taken '138'" in dialog.question
        await pilot.press("escape")  # go back and fix: the refusal is still shown
        await pilot.pause()
        assert app.screen is screen
        assert "refused" in str(screen.query_one("#st-taken", Static).render())
