"""Trend charts and the two-draw comparison screen (demo cases are invented scenarios)."""

from __future__ import annotations

from datetime import datetime
from pathlib import Path

from textual.app import App
from textual.widgets import DataTable, Static

from screens.trends import CompareScreen, TrendsScreen, chart_lines, series_text
from workup.caseio import load_case
from workup.trends import Series, TrendPoint, compare


def _series(values: list[tuple[float | None, str]]) -> Series:
    pts = tuple(
        TrendPoint(f"d{i}", datetime(2026, 11, i + 1), None, v, s)
        for i, (v, s) in enumerate(values)
    )
    return Series("serum.bicarbonate", "Bicarbonate", "mmol/L", pts)


def test_chart_puts_each_point_at_its_height_with_its_status_mark() -> None:
    lines = chart_lines(
        _series([(10.0, "measured"), (20.0, "unusual"), (15.0, "not_valid")]), 40, 5
    )
    assert len(lines) == 6  # five plot rows and the axis
    plot = [ln.split("┤", 1)[1] for ln in lines[:5]]
    assert plot[0].strip("· ") == "!"  # the highest value on the top row, marked unusual
    assert plot[4].strip("· ") == "o"  # the lowest on the bottom row, marked measured
    assert "x" in plot[2]  # 15 is half-way: NOT VALID mark
    assert lines[0].split("┤")[0].strip() == "20.0" and lines[4].split("┤")[0].strip() == "10.0"
    assert lines[5].split("└")[1].split() == ["1", "2", "3"]


def test_chart_leaves_a_gap_for_a_missing_value() -> None:
    lines = chart_lines(_series([(10.0, "measured"), (None, "missing"), (20.0, "measured")]), 40, 5)
    plot = "".join(ln.split("┤", 1)[1] for ln in lines[:5])
    assert plot.count("o") == 2 and "·" not in plot  # no line is drawn across the gap
    assert chart_lines(_series([(None, "missing")]))[0].strip() == "(no values entered)"


def test_series_text_writes_every_value_with_its_status_word() -> None:
    text = series_text(_series([(10.0, "measured"), (None, "missing"), (22.0, "caution")])).plain
    assert "10.0 mmol/L  o measured" in text
    gap_line = next(ln for ln in text.splitlines() if ln.rstrip().endswith(" d1"))
    assert "—" in gap_line and "not entered" in gap_line
    assert "22.0 mmol/L  ! caution" in text


class Host(App[None]):
    def __init__(self, screen) -> None:
        super().__init__()
        self._first = screen

    def on_mount(self) -> None:
        self.theme = "textual-dark"
        self.push_screen(self._first)


async def test_trends_screen_shows_the_five_series(cases_dir: Path) -> None:
    case = load_case(cases_dir / "distal-rta-classic.yaml")
    app = Host(TrendsScreen(case))
    async with app.run_test(size=(80, 24)) as pilot:
        await pilot.pause()
        texts = [str(s.content) for s in app.screen.query(".trend").results(Static)]
        assert [t.splitlines()[0] for t in texts] == [
            "Bicarbonate (mmol/L)",
            "Potassium (mmol/L)",
            "Blood pH",
            "Anion gap (mmol/L)",
            "Urine pH",
        ]
        assert "during a loading test" in texts[0]
        await pilot.press("c")
        await pilot.pause()
        assert isinstance(app.screen, CompareScreen)
        await pilot.press("escape")
        await pilot.pause()
        assert isinstance(app.screen, TrendsScreen)


async def test_compare_screen_rows_and_stepping_draws(cases_dir: Path) -> None:
    case = load_case(cases_dir / "proximal-rta-fanconi.yaml")
    app = Host(CompareScreen(case))
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CompareScreen)
        table = screen.query_one(DataTable)
        expected = compare(case)
        assert table.row_count == len(expected.rows)
        gap_row = next(i for i, r in enumerate(expected.rows) if r.key == "anion_gap")
        cells = [str(c) for c in table.get_row_at(gap_row)]
        # Wide enough for words: each number carries its status word.
        assert cells[0].startswith("Anion gap")
        assert cells[1].endswith(("valid", "caution", "NOT VALID"))
        await pilot.press("a")  # the first draw steps on, skipping the draw shown second
        await pilot.pause()
        assert (screen.a, screen.b) == (expected.a, expected.b)  # two draws: nowhere to go
        await pilot.press("escape")
        await pilot.pause()
        assert not isinstance(app.screen, CompareScreen)


async def test_compare_screen_explains_instead_of_failing(cases_dir: Path) -> None:
    case = load_case(cases_dir / "ckd-acidosis.yaml")  # one draw only
    app = Host(CompareScreen(case))
    async with app.run_test(size=(80, 24)) as pilot:
        await pilot.pause()
        title = str(app.screen.query_one("#compare-title", Static).content)
        assert title.startswith("Cannot compare") and "two draws" in title
        await pilot.press("a")  # nothing to step; must not raise
        await pilot.pause()
