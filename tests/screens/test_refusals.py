"""Pilot flows at 80 × 24: a refused entry is shown on its row, explained, and listed at save.

The demo case is an invented scenario (see cases/).
"""

from __future__ import annotations

from pathlib import Path

from textual.widgets import Input, Static

from screens.case_screen import CaseScreen
from screens.dialogs import ChoiceScreen
from screens.help_screen import HelpScreen
from tests.screens.support import SIZE, forms
from tests.screens.support import field as _field
from tests.screens.support import make_app as _app
from workup.caseio import load_case
from workup.userconfig import settings_file


async def test_refused_draw_time_is_shown_and_listed_before_saving(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        before = load_case(demo).draws[screen.index].taken  # the draw the case opened on
        await forms(screen)  # the draw form is built on its first visit
        taken = screen.query_one("#meta-taken", Input)
        taken.focus()
        taken.value = "138"  # a sodium typed into the wrong row
        await pilot.pause()
        state = str(screen.query_one("#st-taken", Static).render())
        assert "refused" in state and "not a date/time" in state
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


async def test_refused_values_say_why_on_the_help_line_and_in_f1(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        # Each typo must be refused with the core's reason, not only "refused".
        typos = [
            ("serum-sodium", "1380", "not a possible sodium"),
            ("serum-potassium", "abc", "write a number"),
            ("serum-bicarbonate", "161.0", "not a possible"),
            ("serum-chloride", "104 mEq/x", "unknown unit"),
        ]
        for fid, text, reason in typos:
            row = await _field(screen, fid)
            row.input.focus()
            row.input.value = text
            await pilot.pause()
            assert row.state_kind == "-refused"
            hint = str(screen.query_one("#field-help", Static).render())
            assert reason in hint
        await pilot.press("f1")
        await pilot.pause()
        assert isinstance(app.screen, HelpScreen)
        page = str(app.screen.help)
        assert "Refused on draw" in page
        for fid, _text, reason in typos:
            name = (await _field(screen, fid)).analyte.name
            assert any(name in line and reason in line for line in page.splitlines())


async def test_new_case_takes_its_units_from_the_user_settings(tmp_path: Path) -> None:
    app = _app(tmp_path)  # no settings file: conventional units
    async with app.run_test(size=SIZE) as pilot:
        app.new_case()
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        creat = await _field(screen, "serum-creatinine")
        assert creat.unit == "mg/dL"  # ready to type into, not "unit?"
        for fid in ("serum-urea-nitrogen", "serum-glucose", "serum-albumin"):
            assert (await _field(screen, fid)).unit is not None
        creat.input.focus()
        await pilot.pause()
        hint = str(screen.query_one("#field-help", Static).render())
        assert "units: conventional (from your settings; Ctrl+T switches)" in hint
        creat.input.value = "0.8"
        await pilot.pause()
        m = screen.draw.serum.creatinine
        # 0.8 mg/dL x 88.4 = 70.7 umol/L: creatinine 113.12 g/mol (IUPAC standard atomic weights).
        assert m is not None and abs(m.canonical - 70.7) < 0.05


async def test_new_case_in_si_units_when_the_settings_say_so(tmp_path: Path) -> None:
    settings_file().parent.mkdir(parents=True, exist_ok=True)
    settings_file().write_text("unit_system: si\nanion_gap_upper: 12\n", encoding="utf-8")
    app = _app(tmp_path)
    async with app.run_test(size=SIZE) as pilot:
        app.new_case()
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        assert (await _field(screen, "serum-creatinine")).unit == "umol/L"
        assert app.user_overrides() == {"anion_gap_upper": 12.0}  # numbers still read
