"""First minutes at 80 x 24: what a new user sees must be whole words (invented demo case)."""

from __future__ import annotations

from pathlib import Path

from screens.case_screen import CaseScreen
from screens.findings_view import GROUP_KEY, IndexTable
from tests.screens.support import SIZE, screen_rows
from tests.screens.support import make_app as _app
from workup.short_names import SHORT_NAMES


async def test_findings_names_are_whole_at_80_columns(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        table = screen.query_one(IndexTable)
        name_width = table.ordered_columns[0].width
        names = [str(table.get_row(k)[0]) for k in table.rows if k.value != GROUP_KEY]
        assert names
        for name in names:
            assert name in SHORT_NAMES.values(), name
            assert len(name) <= name_width, name


async def test_the_standing_caution_line_is_whole_at_80_columns(demo: Path) -> None:
    # A new case has no case-specific cautions, so the bottom line shows the standing caution:
    # it must read to its end at 80 columns, not stop mid-sentence.
    from workup.cautions import CAUTION_SHORT

    app = _app(demo.parent)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        await pilot.press("n")
        await pilot.pause()
        assert isinstance(app.screen, CaseScreen)
        rows = screen_rows(app)
        assert any(f"! {CAUTION_SHORT} (F1)" in row for row in rows), rows[-3:]


async def test_a_refused_draw_time_is_marked_where_it_can_be_seen_at_80_columns(demo: Path) -> None:
    # The mark sat right of a 46-column input and fell off an 80-column screen, so a refused
    # time looked accepted until the save dialog listed it.
    from textual.widgets import Input

    from screens.case.draw_pane import TAKEN_MARK

    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        await pilot.press("f2")
        await pilot.pause()
        screen = app.screen
        taken = screen.query_one("#meta-taken", Input)
        taken.focus()
        taken.value = "3.4"
        await pilot.pause()
        rows = screen_rows(app)
        row = next(r for r in rows if r.lstrip().startswith("taken"))
        assert TAKEN_MARK in row, row


async def test_a_new_draw_takes_repeat_labs_typed_straight_away(demo: Path) -> None:
    # Repeat labs come in as numbers: after Ctrl+N the first keys typed must land in serum
    # sodium, not rename the draw (its default label and time stay; Shift+Tab reaches them).
    from tests.screens.support import field

    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        n = len(screen.case.draws)
        # As in the app after typing a draw: the form shown, focus far down it (gas pCO2).
        await pilot.press("f2")
        await pilot.pause()
        (await field(screen, "blood-gas-pco2")).input.focus()
        await pilot.pause()
        await pilot.press("ctrl+n")
        await pilot.pause()
        await pilot.press(*"139", "tab", *"3.4")
        await pilot.pause()
        assert len(screen.case.draws) == n + 1
        assert screen.draw.label == f"draw {n + 1}"
        assert (await field(screen, "serum-sodium")).input.value == "139"
        assert (await field(screen, "serum-potassium")).input.value == "3.4"
