"""Tab order in the two forms (issue 15, point 8): entering a form lands on its first value.

The draw form (F2) starts at the serum sodium, not at the draw list, label and time above it;
the case form (F3) starts at the patient's age, not at the case label and unit system. The rows
above the values stay reachable: Shift+Tab from the first value, and Tab after the last field
goes round to the top of the form. Keyboard only, 80 x 24, on the invented distal RTA demo.
"""

from __future__ import annotations

from pathlib import Path

from textual.widgets import Tabs

from screens.case_screen import CaseScreen
from tests.screens.support import SIZE
from tests.screens.support import make_app as _app


def _focused_id(app) -> str | None:
    return app.focused.id if app.focused is not None else None


async def test_tab_from_the_tab_bar_enters_the_draw_form_at_its_first_value(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        assert isinstance(app.screen, CaseScreen)
        await pilot.press("shift+tab")  # from the findings table up to the tab bar
        assert isinstance(app.focused, Tabs)
        await pilot.press("left", "left")  # Findings -> Case -> Draw, by the tab bar
        await pilot.pause()
        assert app.screen.query_one("#tabs").active == "tab-draw"
        await pilot.press("tab")
        assert _focused_id(app) == "in-serum-sodium"
        await pilot.press("shift+tab")  # the draw's own rows are just above, as before
        assert _focused_id(app) == "meta-during"


async def test_tab_after_the_last_draw_field_goes_round_to_the_draw_rows(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        await pilot.press("f2")
        assert _focused_id(app) == "in-serum-sodium"
        app.screen.query_one("#meta-notes").focus()
        await pilot.pause()
        await pilot.press("tab")
        assert _focused_id(app) == "draw-select"
        await pilot.press("tab", "tab", "tab", "tab")  # label, time, loading test, then values
        assert _focused_id(app) == "in-serum-sodium"


async def test_case_form_starts_at_the_first_patient_value(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        await pilot.press("f3")
        assert _focused_id(app) == "case-age"
        await pilot.press("shift+tab", "shift+tab")  # unit system, then the case label
        assert _focused_id(app) == "case-label"
        await pilot.press("f4", "shift+tab", "left")  # tab bar, Findings -> Case
        await pilot.pause()
        await pilot.press("tab")
        assert _focused_id(app) == "case-age"
        app.screen.query_one("#case-context").focus()  # the last field of the form
        await pilot.pause()
        await pilot.press("tab")
        assert _focused_id(app) == "case-label"
