"""Pilot flows through the app at 80 × 24: enter, refuse, save, reopen, switch draws, copy notes.

Keys are pressed where key handling is the point; elsewhere values are set and the app is paused.
Demo cases are invented scenarios (see cases/).
"""

from __future__ import annotations

from pathlib import Path

import pytest
from textual import events
from textual.widgets import Input, Select

from screens.case_screen import CaseScreen
from screens.dialogs import AskScreen, ChoiceScreen, TooSmallScreen
from screens.findings_view import IndexTable
from screens.flags import FlagList
from screens.help_screen import HelpScreen
from screens.note_screen import TMUX_HINT, NoteScreen
from tests.screens.support import CLOCK, SIZE, forms
from tests.screens.support import field as _field
from tests.screens.support import make_app as _app
from workup.assess import assess
from workup.caseio import load_case
from workup.context import Flag
from workup.findings import STATUS_MARK, STATUS_WORD
from workup.formatting import fmt_value
from workup.model import LoadingTest
from workup.userconfig import settings_file


def _table_rows(screen: CaseScreen) -> list[list[str]]:
    table = screen.query_one(IndexTable)
    return [[str(c) for c in table.get_row_at(i)] for i in range(table.row_count)]


async def test_enter_a_case_by_keys_and_see_its_findings(tmp_path: Path) -> None:
    app = _app(tmp_path)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.press("n")  # library: new case
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        assert app.focused is not None and app.focused.id == "in-serum-sodium"
        assert app.focused.cursor_blink is False  # no idle bytes over SSH
        # Demo B baseline (invented): Na 139, K 2.9, Cl 116, HCO3 15; Enter moves on.
        await pilot.press(*"139", "enter", *"2.9", "enter", *"116", "enter", *"15", "enter")
        assert app.focused.id == "in-serum-urea-nitrogen"
        await pilot.pause()
        a = screen.assessment
        assert a is not None
        gap = a.indices["anion_gap"]
        # AG = Na − (Cl + HCO3) = 139 − (116 + 15) (common practice formula).
        assert gap.value == pytest.approx(8.0)
        await pilot.press("f4")
        await pilot.pause()
        rows = {r[0]: r for r in _table_rows(screen)}
        row = rows[gap.name]
        assert row[1] == fmt_value(gap)
        assert f"{STATUS_MARK[gap.status]} {STATUS_WORD[gap.status]}" == row[2]
        assert "UNSAVED" in str(screen.query_one("#titlebar").render())


async def test_keys_arriving_in_one_burst_stay_in_their_fields(tmp_path: Path) -> None:
    # Over a slow SSH link keystrokes arrive bunched: all queued before any is handled.
    app = _app(tmp_path)
    async with app.run_test(size=SIZE) as pilot:
        app.new_case()
        await pilot.pause()
        screen = app.screen
        keys = [*"140", "enter", *"4.1", "tab", *"104", "shift+tab", "end", *"5"]
        for k in keys:
            char = k if len(k) == 1 else ("\r" if k == "enter" else None)
            app.post_message(events.Key(k, char))
        await pilot.pause()
        assert (await _field(screen, "serum-sodium")).input.value == "140"
        assert (await _field(screen, "serum-potassium")).input.value == "4.15"
        assert (await _field(screen, "serum-chloride")).input.value == "104"


async def test_editing_keys_in_a_burst_keep_their_order(tmp_path: Path) -> None:
    # Backspaces are bindings, run after the key bubbles up; typed in one burst with digits they
    # once ran after the digits and deleted them ("141" + Backspace x3 + "152" left "141").
    app = _app(tmp_path)
    async with app.run_test(size=SIZE) as pilot:
        app.new_case()
        await pilot.pause()
        sodium = (await _field(app.screen, "serum-sodium")).input
        sodium.focus()
        sodium.value = "141"
        sodium.cursor_position = 3
        await pilot.pause()
        for k in ["backspace", "backspace", "backspace", *"152", "left", "left", "delete", "3"]:
            app.post_message(events.Key(k, k if len(k) == 1 else None))
        await pilot.pause()
        assert sodium.value == "132"


async def test_impossible_value_is_refused_inline_and_nothing_crashes(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        await pilot.press("f2")
        sodium = await _field(screen, "serum-sodium")
        sodium.input.focus()
        sodium.input.value = ""
        await pilot.press(*"1380")
        await pilot.pause()
        assert sodium.state_kind == "-refused"
        assert "x refused" in str(sodium.query_one(".field-state").render())
        assert "not a possible sodium" in str(screen.query_one("#field-help").render())
        assert screen.draw.serum.sodium is None
        assert screen.assessment is not None
        assert screen.assessment.indices["anion_gap"].value is None
        # Awkward keys on several fields: nothing may raise.
        for fid, text in [("blood-gas-ph", "abc"), ("blood-gas-pco2", "1e999"), ("urine-ph", "-5"),
                          ("serum-potassium", "nan"), ("urine-ketones", "lots")]:  # fmt: skip
            f = await _field(screen, fid)
            f.input.focus()
            f.input.value = text
            for k in ("ctrl+t", "backspace", "enter", "shift+tab"):
                app.post_message(events.Key(k, None))
            await pilot.pause()
        assert app.is_running


async def test_unusual_value_is_accepted_with_a_caution(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        # Usual serum potassium 2.0–7.0 mmol/L (workup/analytes.py; common practice, from memory).
        k = await _field(screen, "serum-potassium")
        k.input.value = "7.5"
        await pilot.pause()
        assert k.state_kind == "-unusual"
        assert screen.draw.serum.potassium is not None
        assert screen.draw.serum.potassium.canonical == 7.5
        assert any("unusually high" in c for c in screen.assessment.cautions)


async def test_pasting_a_block_into_one_field_leaves_the_others_alone(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        before = {k: v for k, v in screen.draw.serum.measurements().items() if k != "potassium"}
        k = await _field(screen, "serum-potassium")
        k.input.focus()
        k.input.value = ""
        k.input.post_message(events.Paste("4.1\nsodium 150\nchloride 99\n"))
        await pilot.pause()
        assert k.input.value == "4.1"
        assert screen.draw.serum.potassium.canonical == 4.1
        after = {k: v for k, v in screen.draw.serum.measurements().items() if k != "potassium"}
        assert after == before


async def test_unit_switch_converts_and_an_ambiguous_bare_number_is_refused(
    tmp_path: Path,
) -> None:
    # A user who sets no unit system for new cases: ambiguous rows start without a unit.
    settings_file().parent.mkdir(parents=True, exist_ok=True)
    settings_file().write_text("unit_system: none\n", encoding="utf-8")
    app = _app(tmp_path)
    async with app.run_test(size=SIZE) as pilot:
        app.new_case()
        await pilot.pause()
        screen = app.screen
        creat = await _field(screen, "serum-creatinine")
        creat.input.focus()
        creat.input.value = "0.8"
        await pilot.pause()
        assert creat.unit is None and creat.state_kind == "-refused"  # never guessed
        assert "Ctrl+T picks one" in str(screen.query_one("#field-help").render())
        assert screen.draw.serum.creatinine is None
        await pilot.press("ctrl+t")  # umol/L: 0.8 umol/L is not a possible creatinine
        await pilot.pause()
        assert creat.unit == "umol/L" and screen.draw.serum.creatinine is None
        await pilot.press("ctrl+t")  # mg/dL: accepted
        await pilot.pause()
        m = screen.draw.serum.creatinine
        assert m is not None and m.unit == "mg/dL"
        # 0.8 mg/dL x 88.4 = 70.7 umol/L: creatinine 113.12 g/mol (IUPAC standard atomic weights).
        assert m.canonical == pytest.approx(70.7, abs=0.05)
        await pilot.press("ctrl+t")  # mmol/L: the value already read is converted, not re-read
        await pilot.pause()
        m2 = screen.draw.serum.creatinine
        assert m2 is not None and m2.unit == "mmol/L"
        assert creat.input.value == "0.07072"
        assert m2.canonical == pytest.approx(m.canonical, rel=5e-4)


async def test_save_writes_the_case_and_reopening_shows_the_same_findings(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        (await _field(screen, "serum-sodium")).input.value = "140"
        await pilot.pause()
        assert screen.dirty
        await pilot.press("ctrl+s")
        await pilot.pause()
        assert not screen.dirty
        first_rows = _table_rows(screen)
    saved = load_case(demo)
    # The case opened on the baseline (the draw that shows the acidosis), so the edit went there.
    assert saved.draws[0].serum.sodium.canonical == 140
    assert saved.draws[-1].serum.sodium.canonical == 141  # the other draw untouched
    assert saved.draws[-1].during is LoadingTest.bicarbonate_loading
    app2 = _app(demo.parent, demo)
    async with app2.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen2 = app2.screen
        assert isinstance(screen2, CaseScreen) and not screen2.dirty
        assert _table_rows(screen2) == first_rows
        assert screen2.assessment.to_json() == assess(saved, "baseline").to_json()


async def test_save_as_duplicate_and_delete_draw(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        screen.action_save_as()
        await pilot.pause()
        ask = app.screen
        assert isinstance(ask, AskScreen)
        ask.query_one(Input).value = "second copy"
        await pilot.press("enter")
        await pilot.pause()
        assert screen.path == demo.parent / "second copy.yaml"
        assert load_case(screen.path) == load_case(demo)
        app.duplicate_case(screen)
        await pilot.pause()
        dup = app.screen
        assert isinstance(dup, CaseScreen) and dup is not screen
        assert dup.path is None and dup.dirty and dup.case.label.endswith("(copy)")
        assert screen.case.label == load_case(demo).label  # the original is not renamed
        dup.action_delete_draw()
        await pilot.pause()
        await pilot.press("tab", "enter")  # "Delete"
        await pilot.pause()
        # The copy opened on the baseline (the acidosis), so that is the draw deleted.
        assert [d.label for d in dup.case.draws] == ["bicarbonate 3 h"]
        assert dup.index == 0 and (await _field(dup, "serum-sodium")).input.value == "141"


async def test_new_case_is_saved_into_the_library_folder(tmp_path: Path) -> None:
    app = _app(tmp_path)
    async with app.run_test(size=SIZE) as pilot:
        app.new_case()
        await pilot.pause()
        screen = await forms(app.screen)  # the case form is built on its first visit
        screen.query_one("#case-label", Input).value = "Bed 7 acidosis"
        (await _field(screen, "serum-sodium")).input.value = "137"
        await pilot.pause()
        assert screen.save_now()
        assert screen.path == tmp_path / "bed-7-acidosis.yaml"
    case = load_case(tmp_path / "bed-7-acidosis.yaml")
    assert case.label == "Bed 7 acidosis"
    assert case.draws[0].taken == CLOCK
    assert case.draws[0].serum.sodium.canonical == 137


async def test_switch_draws_and_add_a_loading_test_draw(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        # Opens on the baseline, the draw that shows the acidosis, not the later loading draw.
        assert screen.index == 0 and screen.assessment.draw_label == "baseline"
        await pilot.press("ctrl+pagedown")
        await pilot.pause()
        assert screen.index == 1 and screen.assessment.draw_label == "bicarbonate 3 h"
        await pilot.press("ctrl+pageup")
        await pilot.pause()
        assert screen.index == 0
        assert (await _field(screen, "serum-sodium")).input.value == "139"
        assert screen.assessment.draw_label == "baseline"
        assert screen.query_one("#meta-during", Select).value == "none"
        await pilot.press("ctrl+n")
        await pilot.pause()
        assert len(screen.case.draws) == 3 and screen.index == 2
        assert screen.draw.taken == CLOCK and screen.draw.label == "draw 3"
        assert (await _field(screen, "serum-sodium")).input.value == ""
        screen.query_one("#meta-during", Select).value = "ammonium_chloride"
        screen.query_one("#meta-label", Input).value = "NH4Cl 4 h"
        await pilot.pause()
        assert screen.draw.during is LoadingTest.ammonium_chloride
        assert screen.draw.label == "NH4Cl 4 h"
        screen.query_one("#meta-label", Input).value = "baseline"  # taken by draw 1
        await pilot.pause()
        assert screen.draw.label == "NH4Cl 4 h"
        assert "another draw" in str(screen.query_one("#st-label").render())
        # Draw 1's values survived the round trip through the form.
        assert screen.case.draws[0].serum.chloride.canonical == 116


async def test_loading_test_chosen_from_its_list_by_keys(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        await pilot.press("ctrl+pageup", "f2")  # baseline draw, no loading test
        await pilot.pause()
        assert screen.draw.during is None
        await pilot.press("shift+tab")  # from serum sodium back to "during loading test"
        assert app.focused is not None and app.focused.id == "meta-during"
        await pilot.press("enter", "down", "enter")
        await pilot.pause()
        assert screen.draw.during is LoadingTest.bicarbonate_loading
        assert screen.dirty


async def test_case_details_and_context_flags_by_keys(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        await pilot.press("f3")
        flags = screen.query_one("#case-context", FlagList)
        flags.focus()
        await pilot.press("home", "space")  # first flag: diarrhea
        await pilot.pause()
        assert Flag.diarrhea in screen.case.context
        assert Flag.autoimmune_disease in screen.case.context  # from the file, kept
        assert str(flags.get_option_at_index(0).prompt).startswith("[x] diarrhea")
        await pilot.press("space")
        await pilot.pause()
        assert Flag.diarrhea not in screen.case.context
        assert str(flags.get_option_at_index(0).prompt).startswith("[ ] diarrhea")
        screen.query_one("#case-weight", Input).value = "61 stone"
        screen.query_one("#case-age", Input).value = "35"
        await pilot.pause()
        assert screen.case.patient.weight == "61 kg" and screen.case.patient.age == 35
        assert "x refused" in str(screen.query_one("#st-weight").render())


async def test_note_is_copied_with_osc52_and_written_beside_the_case(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        await pilot.press("f7")
        await pilot.pause()
        note = app.screen
        assert isinstance(note, NoteScreen)
        assert "Demo B" in note.text
        await pilot.press("f2")
        await pilot.pause()
        assert app.clipboard == note.text
        assert any(TMUX_HINT in n.message for n in app._notifications)
        assert "set -s set-clipboard on" in TMUX_HINT
        await pilot.press("f3")
        await pilot.pause()
        written = demo.parent / "distal.note.txt"
        assert written.read_text().rstrip("\n") == note.text.rstrip("\n")
        await pilot.press("escape")
        await pilot.pause()
        assert isinstance(app.screen, CaseScreen)


async def test_quit_asks_when_unsaved_and_cancel_keeps_working(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        (await _field(screen, "serum-sodium")).input.value = "143"
        await pilot.pause()
        await pilot.press("ctrl+q")
        await pilot.pause()
        assert isinstance(app.screen, ChoiceScreen)
        await pilot.press("escape")
        await pilot.pause()
        assert app.screen is screen and app.is_running
        await pilot.press("ctrl+o")  # close asks too
        await pilot.pause()
        assert isinstance(app.screen, ChoiceScreen)
        await pilot.press("tab", "enter")  # "Discard changes"
        await pilot.pause()
        assert not isinstance(app.screen, CaseScreen)
    assert load_case(demo).draws[0].serum.sodium.canonical == 139  # file untouched (143 dropped)


async def test_quit_with_save_writes_then_exits(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        (await _field(app.screen, "serum-chloride")).input.value = "107"
        await pilot.pause()
        await pilot.press("ctrl+q")
        await pilot.pause()
        await pilot.press("enter")  # "Save" has the focus
        await pilot.pause()
    assert not app.is_running
    assert load_case(demo).draws[0].serum.chloride.canonical == 107


async def test_help_on_every_screen_and_palette_lists_every_action(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        await pilot.press("f1")
        await pilot.pause()
        assert isinstance(app.screen, HelpScreen)
        text = str(app.screen.query_one("#help-text").render())
        assert "Decision support" in text and "NOT VALID" in text and "Ctrl+T" in text
        await pilot.press("escape")
        titles = {c.title for c in app.get_system_commands(screen)}
        for action in ("Save", "Save as…", "Duplicate case", "New case", "Close case", "New draw",
                       "Delete draw", "Next draw", "Draft note", "Paste lab report", "Trends",
                       "Compare draws", "Switch unit", "High-contrast theme", "Help"):  # fmt: skip
            assert action in titles
        await pilot.press("f7")
        await pilot.press("f1")
        await pilot.pause()
        assert isinstance(app.screen, HelpScreen)


async def test_terminal_too_small_shows_a_message(tmp_path: Path) -> None:
    app = _app(tmp_path)
    async with app.run_test(size=(60, 20)) as pilot:
        await pilot.pause()
        assert isinstance(app.screen, TooSmallScreen)
        assert "too small" in str(app.screen.query_one("#too-small").render())
        await pilot.resize_terminal(80, 24)
        await pilot.pause()
        assert not isinstance(app.screen, TooSmallScreen)


async def test_pasted_lab_report_is_applied_to_the_current_draw(demo: Path) -> None:
    paste = pytest.importorskip("workup.paste")
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        await pilot.press("f8")
        await pilot.pause()
        assert app.screen is not screen
        proposal = paste.propose("Sodium 137 mmol/L\nChloride 101 mmol/L\n", screen.case.units)
        # Each line asks "serum or urine?"; answer with the first option, serum.
        app.screen.dismiss(proposal.resolve({q.id: 0 for q in proposal.questions}))
        await pilot.pause()
        assert app.screen is screen
        assert screen.draw.serum.sodium.canonical == 137
        assert screen.draw.serum.chloride.canonical == 101
        assert (
            screen.draw.serum.potassium.canonical == 2.9
        )  # the baseline's, untouched by the paste
        assert (await _field(screen, "serum-sodium")).input.value == "137" and screen.dirty


async def test_optional_screens_open_or_say_they_are_missing(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        for key in ("f8", "f9"):
            await pilot.press(key)
            await pilot.pause()
            opened = app.screen is not screen
            missing = any("not available" in n.message for n in app._notifications)
            assert opened or missing
            if opened:
                await pilot.press("escape")
                await pilot.pause()
        assert app.is_running


KEYS = [
    *"0123456789.-+e ,?xk", "enter", "tab", "shift+tab", "backspace", "delete", "escape",
    "up", "down", "left", "right", "home", "end", "space", "ctrl+t", "ctrl+n", "ctrl+pageup",
    "ctrl+pagedown", "f1", "f2", "f3", "f4", "f5", "f6", "f7", "s", "pageup", "pagedown",
]  # fmt: skip


@pytest.mark.parametrize("seed", [1, 2])
async def test_random_key_storms_do_not_crash(demo: Path, seed: int) -> None:
    import random

    rng = random.Random(seed)
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        for _ in range(12):
            for k in rng.choices(KEYS, k=12):
                app.post_message(events.Key(k, k if len(k) == 1 else None))
            await pilot.pause()
        assert app.is_running
        case_screens = [s for s in app.screen_stack if isinstance(s, CaseScreen)]
        assert case_screens and case_screens[0].case.draws


async def test_ctrl_d_deletes_to_the_right_when_no_message_is_shown(tmp_path: Path) -> None:
    app = _app(tmp_path)
    async with app.run_test(size=SIZE) as pilot:
        app.new_case()
        await pilot.pause()
        sodium = (await _field(app.screen, "serum-sodium")).input
        sodium.focus()
        for k in [*"140", "home", "ctrl+d"]:
            await pilot.press(k)
        await pilot.pause()
        assert not app._notifications and sodium.value == "40"
