"""Geometry of the pH–bicarbonate (Davenport) diagram, as plain numbers for any renderer.

The plane has pH across and plasma bicarbonate up. Each pCO2 is a curve on it (an isobar) given by
Henderson–Hasselbalch, pH = 6.1 + log10(HCO3 / (0.03 × pCO2)). Each primary disorder's
expected-compensation rule becomes a band between two curves; the patient's draw is one point.
:func:`raster` turns all of that into a grid of characters (braille dots for isobars, a dot fill
for bands, digits naming the bands) so that a terminal widget only has to colour and print it.

Nothing here reads a draw or calls a disorder: the diagram shows where the point lies, and the
disorder analysis (``workup.disorders``) says what it means.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from workup.settings import DEFAULTS, Settings

PK = 6.1
"""Apparent pK of the bicarbonate buffer in plasma (Silverthorn, Human Physiology, 8th ed.)."""
SOLUBILITY = 0.03
"""CO2 solubility in plasma, mmol/L per mmHg (Silverthorn, Human Physiology, 8th ed.)."""

PH_RANGE = (6.90, 7.80)
"""The pH shown across the diagram (display choice, common practice)."""
HCO3_RANGE = (0.0, 50.0)
"""The bicarbonate shown up the diagram, mmol/L (display choice, common practice)."""
ISOBARS = (20.0, 30.0, 40.0, 60.0, 80.0)
"""The pCO2 curves drawn, mmHg (display choice)."""

TOLERANCE = 2.0
"""Half-width of every band (± 2 mmHg or mmol/L around the rule): Winters' ± 2 (Albert, Dell &
Winters, Ann Intern Med 1967, from memory) and the ± 2 bands of Berend, de Vries & Gans, NEJM 2014
(read in a secondary summary)."""


def hco3_on_isobar(ph: np.ndarray | float, pco2: float) -> np.ndarray:
    """Bicarbonate (mmol/L) at ``ph`` on the isobar of ``pco2`` mmHg (Henderson–Hasselbalch)."""
    return SOLUBILITY * pco2 * np.power(10.0, np.asarray(ph, dtype=float) - PK)


def ph_of(hco3: np.ndarray | float, pco2: np.ndarray | float) -> np.ndarray:
    """pH from bicarbonate (mmol/L) and pCO2 (mmHg) by Henderson–Hasselbalch."""
    hco3 = np.asarray(hco3, dtype=float)
    pco2 = np.asarray(pco2, dtype=float)
    return PK + np.log10(hco3 / (SOLUBILITY * pco2))


def isobar(pco2: float, n: int = 400) -> tuple[np.ndarray, np.ndarray]:
    """(pH, HCO3) samples of one isobar inside the diagram's ranges."""
    ph = np.linspace(*PH_RANGE, n)
    hco3 = hco3_on_isobar(ph, pco2)
    inside = (hco3 >= HCO3_RANGE[0]) & (hco3 <= HCO3_RANGE[1])
    return ph[inside], hco3[inside]


@dataclass(frozen=True)
class Band:
    """The expected-compensation region of one primary disorder on the pH–HCO3 plane."""

    id: str
    """Stable id, e.g. ``metabolic_acidosis``, ``respiratory_acidosis_chronic``."""
    name: str
    """Human name."""
    digit: str
    """One character naming the band on the diagram and in the legend."""
    rule: str
    """The rule in words."""
    source: str
    """Where the rule comes from."""
    edge_a: np.ndarray
    """One edge as an (n, 2) array of (pH, HCO3)."""
    edge_b: np.ndarray
    """The other edge, same shape, same order of the primary variable."""
    primary: np.ndarray = field(repr=False)
    """The primary variable along both edges (HCO3 for metabolic, pCO2 for respiratory bands)."""

    @property
    def polygon(self) -> np.ndarray:
        """The closed outline: edge a, then edge b backwards."""
        return np.vstack([self.edge_a, self.edge_b[::-1]])

    def contains(self, ph: np.ndarray | float, hco3: np.ndarray | float) -> np.ndarray:
        """True where (pH, HCO3) lies inside the band (points on the edge may go either way)."""
        return points_in_polygon(np.asarray(ph, float), np.asarray(hco3, float), self.polygon)


def points_in_polygon(x: np.ndarray, y: np.ndarray, poly: np.ndarray) -> np.ndarray:
    """Even-odd ray casting of every (x, y) against the polygon ``poly`` (n, 2)."""
    x, y = np.broadcast_arrays(np.atleast_1d(x), np.atleast_1d(y))
    inside = np.zeros(x.shape, dtype=bool)
    px, py = poly[:, 0], poly[:, 1]
    qx, qy = np.roll(px, -1), np.roll(py, -1)
    for x1, y1, x2, y2 in zip(px, py, qx, qy, strict=True):
        if y1 == y2:
            continue
        crosses = (y1 > y) != (y2 > y)
        at_x = x1 + (y - y1) * (x2 - x1) / (y2 - y1)
        inside ^= crosses & (x < at_x)
    return inside


def _metabolic(
    id_: str, name: str, digit: str, rule: str, source: str, hco3: np.ndarray, lo, hi
) -> Band:
    pco2_lo, pco2_hi = lo(hco3), hi(hco3)
    # A higher pCO2 at the same HCO3 means a lower pH.
    a = np.column_stack([ph_of(hco3, pco2_hi), hco3])
    b = np.column_stack([ph_of(hco3, pco2_lo), hco3])
    return Band(id_, name, digit, rule, source, a, b, hco3)


def _respiratory(
    id_: str, name: str, digit: str, rule: str, source: str, pco2: np.ndarray, lo, hi
) -> Band:
    h_lo, h_hi = lo(pco2), hi(pco2)
    a = np.column_stack([ph_of(h_lo, pco2), h_lo])
    b = np.column_stack([ph_of(h_hi, pco2), h_hi])
    return Band(id_, name, digit, rule, source, a, b, pco2)


NARINS = "Narins & Emmett, Medicine 1980 (as tabulated in a secondary source); ± 2 from Berend, de Vries & Gans, NEJM 2014"


def bands(settings: Settings = DEFAULTS, n: int = 60) -> tuple[Band, ...]:
    """The six expected-compensation bands, each fanning out from the normal point.

    Normal HCO3 and pCO2 come from ``settings`` (24 and 40 by default). The spans of the primary
    variable (HCO3 4–normal, normal–45; pCO2 normal–90, 15–normal) are display choices.
    """
    h0, p0, t = settings.bicarbonate_normal, settings.pco2_normal, TOLERANCE
    acid_h = np.linspace(4.0, h0, n)
    alk_h = np.linspace(h0, 45.0, n)
    hi_p = np.linspace(p0, 90.0, n)
    lo_p = np.linspace(15.0, p0, n)
    return (
        _metabolic(
            "metabolic_acidosis", "metabolic acidosis", "1",
            "pCO2 = 1.5 × HCO3 + 8 ± 2 (Winters)",
            "Albert, Dell & Winters, Ann Intern Med 1967 (from memory)",
            acid_h, lambda h: 1.5 * h + 8 - t, lambda h: 1.5 * h + 8 + t,
        ),
        _metabolic(
            "metabolic_alkalosis", "metabolic alkalosis", "2",
            "ΔpCO2 = 0.7 × ΔHCO3 ± 2",
            "Berend, de Vries & Gans, NEJM 2014 (read in a secondary summary)",
            alk_h, lambda h: p0 + 0.7 * (h - h0) - t, lambda h: p0 + 0.7 * (h - h0) + t,
        ),
        _respiratory(
            "respiratory_acidosis_acute", "acute respiratory acidosis", "3",
            "ΔHCO3 = 0.1 × ΔpCO2 ± 2", NARINS,
            hi_p, lambda p: h0 + 0.1 * (p - p0) - t, lambda p: h0 + 0.1 * (p - p0) + t,
        ),
        _respiratory(
            "respiratory_acidosis_chronic", "chronic respiratory acidosis", "4",
            "ΔHCO3 = 0.35 × ΔpCO2 ± 2", NARINS,
            hi_p, lambda p: h0 + 0.35 * (p - p0) - t, lambda p: h0 + 0.35 * (p - p0) + t,
        ),
        _respiratory(
            "respiratory_alkalosis_acute", "acute respiratory alkalosis", "5",
            "ΔHCO3 = 0.2 × ΔpCO2 ± 2", NARINS,
            lo_p, lambda p: h0 - 0.2 * (p0 - p) - t, lambda p: h0 - 0.2 * (p0 - p) + t,
        ),
        _respiratory(
            "respiratory_alkalosis_chronic", "chronic respiratory alkalosis", "6",
            "ΔHCO3 = 0.4 to 0.5 × ΔpCO2 ± 2", NARINS,
            lo_p, lambda p: h0 - 0.5 * (p0 - p) - t, lambda p: h0 - 0.4 * (p0 - p) + t,
        ),
    )  # fmt: skip


@dataclass(frozen=True)
class Point:
    """A draw's place on the diagram."""

    ph: float
    """Measured pH."""
    hco3: float
    """Bicarbonate in mmol/L (the gas analyzer's, else serum total CO2)."""
    label: str = ""
    """The draw's label."""

    @property
    def pco2(self) -> float:
        """The pCO2 (mmHg) of the isobar through the point (Henderson–Hasselbalch)."""
        return float(self.hco3 / (SOLUBILITY * 10.0 ** (self.ph - PK)))

    @property
    def on_plane(self) -> bool:
        """True when the point falls inside the diagram's ranges."""
        return PH_RANGE[0] <= self.ph <= PH_RANGE[1] and HCO3_RANGE[0] <= self.hco3 <= HCO3_RANGE[1]


def point_for(
    ph: float | None,
    gas_hco3: float | None,
    serum_hco3: float | None,
    pco2: float | None,
    label: str = "",
) -> tuple[Point | None, str]:
    """The draw's point and where its bicarbonate came from, or (None, what is missing).

    The gas analyzer's bicarbonate is paired with the gas pH first because both come from one
    sample; then the value computed from pH and pCO2; serum total CO2 (a separate sample) last.
    """
    if ph is None:
        return None, "enter the gas pH to place the draw"
    if gas_hco3 is not None:
        return Point(ph, gas_hco3, label), "gas bicarbonate"
    if pco2 is not None:
        return Point(ph, float(hco3_on_isobar(ph, pco2)), label), "from pH and pCO2"
    if serum_hco3 is not None:
        return Point(ph, serum_hco3, label), "serum total CO2"
    return None, "enter the gas pCO2 or a bicarbonate to place the draw"


def bands_containing(point: Point, settings: Settings = DEFAULTS) -> list[Band]:
    """The bands the point lies in (geometry only; the disorder analysis gives the meaning)."""
    return [b for b in bands(settings) if bool(b.contains(point.ph, point.hco3)[0])]


# Braille: dot (column, row) of a 2 × 4 cell to its bit (Unicode braille patterns, U+2800).
_DOT = {(0, 0): 0x01, (0, 1): 0x02, (0, 2): 0x04, (1, 0): 0x08,
        (1, 1): 0x10, (1, 2): 0x20, (0, 3): 0x40, (1, 3): 0x80}  # fmt: skip
_BIT = np.zeros((4, 2), dtype=np.int64)
for (_c, _r), _b in _DOT.items():
    _BIT[_r, _c] = _b

FILL = "·"
"""Character of a band cell without other marks."""
MARK = "●"
"""Character of the current draw's point."""
OTHER_MARK = "○"
"""Character of the case's other draws."""


@dataclass(frozen=True)
class Raster:
    """The diagram as a grid of characters, each with a style key for the renderer.

    Style keys: ``""`` (empty), ``axis``, ``isobar``, ``isobar_label``, ``band:<id>``,
    ``band_label:<id>``, ``point``, ``other_point``.
    """

    chars: list[list[str]]
    """Rows of single characters, top row first."""
    styles: list[list[str]]
    """A style key per character."""
    bands: tuple[Band, ...]
    """The bands drawn (for the legend)."""

    def lines(self) -> list[str]:
        """The rows as plain strings."""
        return ["".join(r) for r in self.chars]


_LEFT = 3  # columns for the HCO3 tick labels
_BOTTOM = 1  # rows for the pH tick labels


def raster(
    cols: int,
    rows: int,
    point: Point | None = None,
    others: tuple[Point, ...] = (),
    settings: Settings = DEFAULTS,
) -> Raster:
    """Draw the diagram on a ``cols`` × ``rows`` character grid (axes included)."""
    cols, rows = max(cols, _LEFT + 10), max(rows, _BOTTOM + 5)
    w, h = cols - _LEFT, rows - _BOTTOM
    chars = [[" "] * cols for _ in range(rows)]
    styles = [[""] * cols for _ in range(rows)]
    (x0, x1), (y0, y1) = PH_RANGE, HCO3_RANGE

    def cell_of(ph: np.ndarray, hco3: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
        c = np.floor((ph - x0) / (x1 - x0) * w).astype(int)
        r = np.floor((y1 - hco3) / (y1 - y0) * h).astype(int)
        return np.clip(c, 0, w - 1), np.clip(r, 0, h - 1)

    # Band fill: a cell belongs to the first band its centre lies in.
    cc, rr = np.meshgrid(np.arange(w), np.arange(h))
    cx = x0 + (cc + 0.5) / w * (x1 - x0)
    cy = y1 - (rr + 0.5) / h * (y1 - y0)
    all_bands = bands(settings)
    owner = np.full((h, w), -1)
    for i, b in enumerate(all_bands):
        inside = b.contains(cx.ravel(), cy.ravel()).reshape(h, w)
        owner[(owner < 0) & inside] = i
    for r in range(h):
        for c in range(w):
            if owner[r, c] >= 0:
                chars[r][c + _LEFT] = FILL
                styles[r][c + _LEFT] = f"band:{all_bands[owner[r, c]].id}"

    # Isobars in braille: 2 × 4 dots a cell, so curves are finer than the cell grid.
    dots = np.zeros((h, w), dtype=np.int64)
    for p in ISOBARS:
        ph, hco3 = isobar(p, n=8 * (w + h))
        fx = (ph - x0) / (x1 - x0) * w * 2
        fy = (y1 - hco3) / (y1 - y0) * h * 4
        dx = np.clip(np.floor(fx).astype(int), 0, 2 * w - 1)
        dy = np.clip(np.floor(fy).astype(int), 0, 4 * h - 1)
        np.bitwise_or.at(dots, (dy // 4, dx // 2), _BIT[dy % 4, dx % 2])
    for r, c in zip(*np.nonzero(dots), strict=True):
        chars[r][c + _LEFT] = chr(0x2800 + int(dots[r, c]))
        styles[r][c + _LEFT] = "isobar"
    for p in ISOBARS:
        ph, hco3 = isobar(p)
        if len(ph) == 0:
            continue
        c, r = cell_of(ph[-1:], hco3[-1:])
        _put(chars, styles, int(r[0]), int(c[0]) + _LEFT - 1, f"{p:g}", "isobar_label", cols)

    # Band digits at the middle of each band's cells.
    for i, b in enumerate(all_bands):
        rs, cs = np.nonzero(owner == i)
        if len(rs):
            k = np.argsort(rs * w + cs)[len(rs) // 2]
            _put(chars, styles, int(rs[k]), int(cs[k]) + _LEFT, b.digit, f"band_label:{b.id}", cols)

    for other in others:
        if other.on_plane:
            c, r = cell_of(np.array([other.ph]), np.array([other.hco3]))
            _put(chars, styles, int(r[0]), int(c[0]) + _LEFT, OTHER_MARK, "other_point", cols)
    if point is not None and point.on_plane:
        c, r = cell_of(np.array([point.ph]), np.array([point.hco3]))
        _put(chars, styles, int(r[0]), int(c[0]) + _LEFT, MARK, "point", cols)

    # Axes: HCO3 ticks on the left, pH ticks along the bottom.
    for value in range(int(y0), int(y1) + 1, 10):
        r = min(int((y1 - value) / (y1 - y0) * h), h - 1)
        _put(chars, styles, r, 0, f"{value:>2}", "axis", cols)
    for tick in np.arange(7.0, x1 + 1e-9, 0.2):
        c = int((tick - x0) / (x1 - x0) * w) + _LEFT
        _put(chars, styles, rows - 1, max(c - 1, _LEFT), f"{tick:.1f}", "axis", cols)
    return Raster(chars, styles, all_bands)


def _put(chars, styles, r: int, c: int, text: str, style: str, cols: int) -> None:
    c = max(0, min(c, cols - len(text)))
    for i, ch in enumerate(text):
        chars[r][c + i] = ch
        styles[r][c + i] = style
