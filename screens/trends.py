"""Trends over a case's draws as small text charts, and two draws side by side.

The series and the comparison come from the core (workup.trends); this module only draws them.
Every point is a status mark (o measured, ! unusual or caution, x NOT VALID, + valid) so that the
charts read in monochrome, and every number is written beside its status word.
"""

from __future__ import annotations

from rich.text import Text
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import VerticalScroll
from textual.screen import Screen
from textual.widgets import DataTable, Footer, Static

from workup.formatting import fmt_number
from workup.model import Case
from workup.trends import POINT_MARK, POINT_WORD, Comparison, Series, compare, trends

CHART_HEIGHT = 5
"""Rows of the plotting area."""


def _fmt(value: float | None, unit: str) -> str:
    text = fmt_number(value, unit)
    return f"{text} {unit}".strip() if value is not None else "—"


def chart_lines(series: Series, width: int = 48, height: int = CHART_HEIGHT) -> list[str]:
    """``series`` drawn as ``height`` rows of text plus an axis row, one column slot per draw.

    Points are their status marks; dots join consecutive values; draws without the value leave a
    gap. The y-axis shows the highest and lowest value plotted.
    """
    points = series.points
    present = [p.value for p in points if p.value is not None]
    n = len(points)
    axis_w = 8
    plot_w = max(8, width - axis_w - 1)
    if not present:
        return [f"{'':>{axis_w}} (no values entered)"]
    lo, hi = min(present), max(present)
    if hi - lo < 1e-9:
        pad = 0.1 if series.unit == "" else 1.0
        lo, hi = lo - pad, hi + pad
    grid = [[" "] * plot_w for _ in range(height)]
    xs = [round(i * (plot_w - 1) / (n - 1)) if n > 1 else plot_w // 2 for i in range(n)]

    def y_of(v: float) -> int:
        return round((hi - v) / (hi - lo) * (height - 1))

    prev: tuple[int, int] | None = None
    for p, x in zip(points, xs, strict=True):
        if p.value is None:
            prev = None
            continue
        y = y_of(p.value)
        if prev is not None:
            (x0, y0) = prev
            for xi in range(x0 + 1, x):
                yi = round(y0 + (y - y0) * (xi - x0) / (x - x0))
                if grid[yi][xi] == " ":
                    grid[yi][xi] = "·"
        prev = (x, y)
    for p, x in zip(points, xs, strict=True):
        if p.value is not None:
            grid[y_of(p.value)][x] = POINT_MARK[p.status]
    top, bottom = fmt_number(hi, series.unit), fmt_number(lo, series.unit)
    lines = []
    for r, row in enumerate(grid):
        label = top if r == 0 else bottom if r == height - 1 else ""
        lines.append(f"{label:>{axis_w}} ┤{''.join(row)}")
    axis = [" "] * plot_w
    for i, x in enumerate(xs):
        tag = str(i + 1)
        for j, ch in enumerate(tag):
            if x + j < plot_w:
                axis[x + j] = ch
    lines.append(f"{'':>{axis_w}} └{''.join(axis)}")
    return lines


def series_text(series: Series, width: int = 48) -> Text:
    """Title, chart and one line per draw (number, value, status word, note) of ``series``."""
    out = Text()
    unit = f" ({series.unit})" if series.unit else ""
    out.append(f"{series.name}{unit}\n", style="bold")
    for line in chart_lines(series, width):
        out.append(line + "\n")
    for i, p in enumerate(series.points, 1):
        when = p.taken.isoformat(sep=" ", timespec="minutes") if p.taken else "undated"
        during = " (during a loading test)" if p.during else ""
        out.append(
            f"  {i} {when:<16} {_fmt(p.value, series.unit):>12}  "
            f"{POINT_MARK[p.status]} {POINT_WORD[p.status]:<11}  {p.draw}{during}\n"
        )
        if p.note:
            out.append(f"      {p.note}\n", style="italic")
    return out


LEGEND = (
    "Marks: o measured  ! unusual or caution  + valid  x NOT VALID (not to be relied on)  "
    "· joins draws; a gap means the value was not entered."
)


class TrendsScreen(Screen):
    """Bicarbonate, potassium, pH, anion gap and urine pH over the draws of ``case``."""

    DEFAULT_CSS = """
    TrendsScreen #trends-title { height: 1; padding: 0 1; text-style: bold; }
    TrendsScreen .trend { padding: 0 1 1 1; }
    TrendsScreen #trends-legend { padding: 0 1; color: $text-muted; }
    """

    BINDINGS = [
        Binding("escape,q", "back", "Back"),
        Binding("c", "compare", "Compare draws"),
    ]

    def __init__(self, case: Case) -> None:
        super().__init__()
        self.case = case

    def compose(self) -> ComposeResult:
        yield Static(f"Trends: {self.case.label}", id="trends-title")
        with VerticalScroll(id="trends-body"):
            yield Static(LEGEND, id="trends-legend")
            try:
                series = trends(self.case)
            except Exception as exc:  # a calculator's failure must not close the app
                yield Static(f"The trends cannot be drawn: {type(exc).__name__}: {exc}")
                return
            for s in series:
                yield Static(series_text(s), classes="trend")
        yield Footer()

    def on_mount(self) -> None:
        self.query_one("#trends-body").focus()

    def action_back(self) -> None:
        """Return to the screen below."""
        self.app.pop_screen()

    def action_compare(self) -> None:
        """Two draws side by side."""
        if len(self.case.draws) < 2:
            self.notify("Comparing needs two draws; this case has one.", severity="warning")
            return
        self.app.push_screen(CompareScreen(self.case))


def _cell(
    value: float | None, status: str, unit: str, signed: bool = False, words: bool = True
) -> Text:
    """A number with its status mark, and its status word unless space is short."""
    number = fmt_number(value, unit) if value is not None else "—"
    if signed and value is not None and not number.startswith("-") and float(number) != 0:
        number = "+" + number
    word = f" {POINT_WORD[status]}" if words else ""
    return Text(f"{number} {POINT_MARK[status]}{word}")


MARKS_LINE = "Marks: + valid  ! caution or unusual  x NOT VALID  ? needs input  o measured"
WORDS_AT = 110
"""From this width the comparison writes each status word beside its mark."""


class CompareScreen(Screen):
    """Two draws of ``case`` side by side with the change in each index and value.

    By default the earliest and the latest draw (e.g. baseline and bicarbonate loading); a and b
    step the first and second draw through the case's draws.
    """

    DEFAULT_CSS = """
    CompareScreen #compare-title { height: 1; padding: 0 1; text-style: bold; }
    CompareScreen #compare-note { height: 1; padding: 0 1; color: $text-muted; }
    CompareScreen #compare-marks { height: 1; padding: 0 1; }
    CompareScreen DataTable { height: 1fr; }
    """

    BINDINGS = [
        Binding("escape,q", "back", "Back"),
        Binding("a", "step_a", "First draw"),
        Binding("b", "step_b", "Second draw"),
    ]

    def __init__(self, case: Case) -> None:
        super().__init__()
        self.case = case
        self.error: str | None = None
        """Why the comparison cannot be shown (fewer than two draws, a failing calculator)."""
        self.labels: list[str] = []
        self.a = self.b = ""
        from workup.assess import assess

        try:
            self._assessment = assess(case)
            # The core's order (by time when every draw is dated), not necessarily the file's.
            self.labels = [p.draw for p in trends(case, self._assessment)[0].points]
            first = compare(case, assessment=self._assessment)
            self.a, self.b = first.a, first.b
        except Exception as exc:  # shown on the screen rather than closing the app
            self.error = str(exc.args[0]) if isinstance(exc, KeyError) else f"{exc}"

    def compose(self) -> ComposeResult:
        yield Static("", id="compare-title")
        yield Static(
            "A change is only as valid as its weaker end: it takes the weaker status.",
            id="compare-note",
        )
        yield Static(MARKS_LINE, id="compare-marks")
        yield DataTable(id="compare", cursor_type="row", zebra_stripes=True)
        yield Footer()

    def on_mount(self) -> None:
        if self.error is not None:
            self.query_one("#compare-title", Static).update(f"Cannot compare: {self.error}")
            return
        self.refresh_table()
        self.query_one(DataTable).focus()

    def comparison(self) -> Comparison:
        """The comparison now shown."""
        return compare(self.case, self.a, self.b, self._assessment)

    def refresh_table(self) -> None:
        """Redraw the table for the chosen draws."""
        c = self.comparison()
        self.query_one("#compare-title", Static).update(f"Compare: {c.a}  →  {c.b}")
        table = self.query_one(DataTable)
        table.clear(columns=True)
        words = self.app.size.width >= WORDS_AT
        width = 40 if words else 30
        table.add_columns("Index or value", c.a[:20], c.b[:20], "Change")
        for r in c.rows:
            unit = f" ({r.unit})" if r.unit else ""
            name = (
                r.name
                if len(r.name) + len(unit) <= width
                else r.name[: width - len(unit) - 1] + "…"
            )
            table.add_row(
                Text(f"{name}{unit}"),
                _cell(*r.a, r.unit, words=words),
                _cell(*r.b, r.unit, words=words),
                _cell(r.change, r.change_status, r.unit, signed=True, words=words),
            )

    def _step(self, which: str) -> None:
        if self.error is not None:
            return
        current = getattr(self, which)
        other = self.b if which == "a" else self.a
        i = self.labels.index(current)
        for k in range(1, len(self.labels) + 1):
            nxt = self.labels[(i + k) % len(self.labels)]
            if nxt != other:
                setattr(self, which, nxt)
                break
        self.refresh_table()

    def action_step_a(self) -> None:
        """Step the first draw to the next one."""
        self._step("a")

    def action_step_b(self) -> None:
        """Step the second draw to the next one."""
        self._step("b")

    def action_back(self) -> None:
        """Return to the screen below."""
        self.app.pop_screen()
