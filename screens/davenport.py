"""The pH–bicarbonate (Davenport) diagram drawn in the terminal, with a legend in words.

The geometry and the character grid come from :mod:`workup.diagram`; this widget only colours
the characters and sizes the grid to the space it has. The legend says everything the colours
say, so the diagram reads the same in monochrome.
"""

from __future__ import annotations

from typing import TYPE_CHECKING

from rich.style import Style
from rich.text import Text
from textual.app import ComposeResult
from textual.containers import Horizontal
from textual.widget import Widget
from textual.widgets import Static

from workup.findings import STATUS_WORD, Finding

if TYPE_CHECKING:
    from workup import diagram

# workup.diagram (and numpy behind it) is imported on first drawing, not at start-up.

# One hue per band; the digits and the legend carry the same information without colour.
BAND_COLOURS = {
    "metabolic_acidosis": "red",
    "metabolic_alkalosis": "blue",
    "respiratory_acidosis_acute": "magenta",
    "respiratory_acidosis_chronic": "yellow",
    "respiratory_alkalosis_acute": "cyan",
    "respiratory_alkalosis_chronic": "green",
}


def _style(key: str) -> Style:
    if key.startswith("band_label:"):
        return Style(color=BAND_COLOURS.get(key.split(":", 1)[1]), bold=True)
    if key.startswith("band:"):
        return Style(color=BAND_COLOURS.get(key.split(":", 1)[1]))
    return {
        "isobar": Style(dim=True),
        "isobar_label": Style(italic=True),
        "axis": Style(bold=True),
        "point": Style(bold=True, reverse=True),
        "other_point": Style(bold=True),
    }.get(key, Style())


class DiagramCanvas(Widget):
    """The character grid of the diagram at the widget's current size."""

    DEFAULT_CSS = "DiagramCanvas { width: 1fr; height: 1fr; }"

    def __init__(self, **kwargs) -> None:
        super().__init__(**kwargs)
        self.point: diagram.Point | None = None
        self.others: tuple[diagram.Point, ...] = ()

    def plot(self, point: diagram.Point | None, others: tuple[diagram.Point, ...]) -> None:
        """Place the current draw (and the other draws) and redraw."""
        self.point, self.others = point, others
        self.refresh()

    def render(self) -> Text:
        from workup import diagram

        r = diagram.raster(self.size.width, self.size.height, self.point, self.others)
        out = Text()
        for i, (row, styles) in enumerate(zip(r.chars, r.styles, strict=True)):
            if i:
                out.append("\n")
            for ch, key in zip(row, styles, strict=True):
                out.append(ch, _style(key))
        return out


def legend_text(
    point: diagram.Point | None, source: str, check: Finding | None, others: int
) -> Text:
    """The legend: what the marks mean, where the point is and how far it can be trusted."""
    from workup import diagram

    out = Text()
    out.append("pH across, HCO3 mmol/L up\n", style="bold")
    if point is None:
        out.append(f"{diagram.MARK} this draw: not placed\n  ({source})\n")
    else:
        out.append(f"{diagram.MARK} {point.label or 'this draw'}\n", style="bold")
        out.append(f"  pH {point.ph:.2f}, HCO3 {point.hco3:.1f}\n")
        out.append(f"  HCO3: {source}\n")
        out.append(f"  on the pCO2 {point.pco2:.0f} isobar\n")
        word = STATUS_WORD[check.status] if check is not None else "not checked"
        out.append(f"  gas check (HH): {word}\n")
        if not point.on_plane:
            out.append("  outside the plotted range\n", style="bold")
        inside = diagram.bands_containing(point)
        names = ", ".join(b.digit for b in inside) or "none"
        out.append(f"  inside band(s): {names}\n")
    if others:
        out.append(f"{diagram.OTHER_MARK} other draws ({others})\n")
    out.append("⠉ pCO2 isobars (mmHg at end)\n")
    out.append(f"{diagram.FILL} expected compensation:\n")
    for b in diagram.bands():
        out.append(f" {b.digit}", style=Style(color=BAND_COLOURS[b.id], bold=True))
        out.append(f" {b.name}\n")
    out.append("Bands are geometry; F4 reads\nthe disorders. F1: rules.", style="dim")
    return out


class DavenportView(Horizontal):
    """The diagram with its legend beside it."""

    def compose(self) -> ComposeResult:
        yield DiagramCanvas(id="diagram-canvas")
        yield Static("", id="diagram-legend")

    def show(
        self,
        point: diagram.Point | None,
        source: str,
        others: tuple[diagram.Point, ...],
        check: Finding | None,
    ) -> None:
        """Show ``point`` (the current draw) and ``others`` with a legend."""
        self.query_one(DiagramCanvas).plot(point, others)
        self.query_one("#diagram-legend", Static).update(
            legend_text(point, source, check, len(others))
        )


def band_rules_text() -> str:
    """Each band's rule and source, for the help screen."""
    from workup import diagram

    return "\n".join(f"{b.digit} {b.name}: {b.rule} — {b.source}" for b in diagram.bands())
