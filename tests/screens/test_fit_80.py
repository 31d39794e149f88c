"""Three things a fellow met typing a draw at 80 x 24, keyboard only (issues 13 and 15).

Typing value after value with Tab stays in value fields through the blood gas; the help line of a
unitless field reads naturally; the findings pane's line naming the shown draw keeps to one
line of 80 columns. On the invented distal RTA demo (cases/, an invented scenario).
"""

from __future__ import annotations

from pathlib import Path

from rich.text import Text

from screens.case_screen import CaseScreen
from tests.screens.support import SIZE, screen_rows
from tests.screens.support import make_app as _app


async def test_tab_from_the_serum_values_through_the_gas_stays_in_value_fields(
    demo: Path,
) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        await pilot.press("f2")
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        screen.query_one("#in-serum-osmolality").focus()
        await pilot.pause()
        await pilot.press("tab")
        assert app.focused is not None and app.focused.id == "in-blood-gas-ph"
        await pilot.press("tab")
        assert app.focused is not None and app.focused.id == "in-blood-gas-pco2"
        # The sample is still in the form, after the gas values.
        for _ in range(5):
            if app.focused is not None and app.focused.id == "meta-sample":
                break
            await pilot.press("tab")
        assert app.focused is not None and app.focused.id == "meta-sample"


async def test_a_unitless_field_says_so_once(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        await pilot.press("f2")
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        screen.query_one("#in-blood-gas-ph").focus()
        await pilot.pause()
        help_text = screen.query_one("#field-help").render()
        first = (help_text.plain if isinstance(help_text, Text) else str(help_text)).split("\n")[0]
        assert first.startswith("pH (blood gas), no unit")
        assert "in no unit" not in first and "units no unit" not in first


async def test_the_draw_header_fits_one_line_at_80_in_whole_words(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        header = screen.query_one("#findings-draw")
        assert header.display and header.size.height == 1
        rows = screen_rows(app)
        [row] = [r for r in rows if "'baseline'" in r]
        # Still says which draw is shown and why, and what the other draw is for.
        assert "(the acidosis)" in row and "'bicarbonate 3 h'" in row and "loading test" in row
        assert "causes" in row.split("loading test")[1]
        assert not any(r.startswith("read by the causes") for r in rows)
