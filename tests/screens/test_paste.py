"""PasteScreen: live proposal from pasted text, keyboard answers, Apply/Cancel, snapshots.

The report texts are invented layouts (see tests/workup/lab_reports/); none is a real patient.
"""

from __future__ import annotations

from pathlib import Path

from textual.app import App
from textual.widgets import DataTable, TextArea

from screens.paste import PasteScreen, QuestionTable
from workup.analytes import UnitSystem

REPORTS = Path(__file__).resolve().parents[1] / "workup" / "lab_reports"


def _report(name: str) -> str:
    text = (REPORTS / name).read_text(encoding="utf-8")
    return "\n".join(line for line in text.split("\n") if not line.startswith("#"))


class Host(App):
    """A bare app that opens the paste screen and keeps what it dismisses with."""

    def __init__(self, text: str = "", units: UnitSystem | None = None) -> None:
        super().__init__()
        self.text = text
        self.units = units
        self.results: list = []

    def on_mount(self) -> None:
        self.theme = "textual-dark"
        self.push_screen(PasteScreen(self.units, text=self.text), callback=self.results.append)


async def test_values_appear_with_their_source_lines_as_text_is_entered() -> None:
    app = Host()
    async with app.run_test(size=(80, 24)) as pilot:
        area = app.screen.query_one(TextArea)
        area.text = "Chemistry\nSodium 139 mmol/L\nPotassium 2.9 L mmol/L"
        await pilot.pause()
        values = app.screen.query_one("#paste-values", DataTable)
        assert values.row_count == 2
        row = values.get_row_at(1)
        assert row[:4] == ["serum", "potassium", "2.9 mmol/L [L]", "read"]
        assert row[4].startswith("3: Potassium")


async def test_answering_with_keys_and_applying_dismisses_with_the_resolved_proposal() -> None:
    app = Host(_report("gas_block.txt"))
    async with app.run_test(size=(80, 24)) as pilot:
        app.screen.query_one(QuestionTable).focus()
        await pilot.press("2", "0", "1")  # q1: total CO2; q2: leave out; q3: lactate as serum
        await pilot.press("ctrl+s")
        await pilot.pause()
    (proposal,) = app.results
    assert proposal.questions == ()
    assert proposal.values["serum"]["bicarbonate"].value == 30
    assert proposal.values["serum"]["lactate"].value == 1.1
    assert "sodium" not in proposal.values.get("serum", {})


async def test_apply_with_open_questions_stays_and_says_why() -> None:
    app = Host(_report("gas_block.txt"))
    async with app.run_test(size=(80, 24)) as pilot:
        await pilot.press("ctrl+s")
        await pilot.pause()
        assert isinstance(app.screen, PasteScreen)
        assert any("still open" in n.message for n in app._notifications)
    assert app.results == []


async def test_all_serum_answers_every_which_sample_question() -> None:
    app = Host(_report("messy_mixed.txt"))
    async with app.run_test(size=(80, 24)) as pilot:
        app.screen.query_one(QuestionTable).focus()
        await pilot.press("S")
        screen = app.screen
        assert isinstance(screen, PasteScreen)
        assert sorted(screen.choices) == ["q1", "q2", "q3", "q4", "q5"]


async def test_digits_typed_in_the_paste_area_are_text_not_answers() -> None:
    app = Host("Na 140")
    async with app.run_test(size=(80, 24)) as pilot:
        await pilot.press("end", "1")
        screen = app.screen
        assert isinstance(screen, PasteScreen)
        assert screen.choices == {}
        assert screen.query_one(TextArea).text == "Na 1401"


async def test_cancel_dismisses_with_none() -> None:
    app = Host(_report("chemistry_tabbed.txt"))
    async with app.run_test(size=(80, 24)) as pilot:
        await pilot.press("escape")
        await pilot.pause()
    assert app.results == [None]


def test_snapshot_80x24(snap_compare) -> None:
    async def answer_first(pilot) -> None:
        pilot.app.screen.query_one(QuestionTable).focus()
        await pilot.press("1")

    assert snap_compare(
        Host(_report("gas_block.txt")), terminal_size=(80, 24), run_before=answer_first
    )


def test_snapshot_120x40(snap_compare) -> None:
    assert snap_compare(Host(_report("messy_mixed.txt")), terminal_size=(120, 40))
