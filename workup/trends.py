"""Trends within a case and the comparison of two draws, each number with its status.

The series are bicarbonate, potassium, blood pH, anion gap and urine pH over the case's draws,
oldest first. A measured value carries ``measured`` (or ``unusual`` outside the usual clinical
range); a computed index carries its Finding status; urine pH carries the status of the
``urine_ph`` index where one was computed, because a urine pH drawn during bicarbonate loading
does not speak to acidification. A draw without the value is a point with ``missing`` status, so
the gap shows instead of being bridged silently. Drawing is left to the app (screens/trends.py).
"""

from __future__ import annotations

from dataclasses import dataclass
from datetime import datetime
from typing import Any

from workup.analytes import CATALOGUE, Panel, analyte
from workup.assess import Assessment, assess
from workup.findings import STATUS_MARK, STATUS_WORD, Finding, Status
from workup.model import Case
from workup.timeorder import comparable_time

MEASURED = "measured"
"""A measured value inside the usual clinical range."""
UNUSUAL = "unusual"
"""A measured value outside the usual clinical range (accepted with a caution)."""
MISSING = "missing"
"""The draw has no such value."""

POINT_WORD: dict[str, str] = {
    **{s.value: w for s, w in STATUS_WORD.items()},
    MEASURED: "measured",
    UNUSUAL: "unusual",
    MISSING: "not entered",
}
"""Every point status in words (never colour alone)."""
POINT_MARK: dict[str, str] = {
    **{s.value: m for s, m in STATUS_MARK.items()},
    MEASURED: "o",
    UNUSUAL: "!",
    MISSING: " ",
}
"""A one-character mark per status, for charts read in monochrome."""


@dataclass(frozen=True, slots=True)
class TrendPoint:
    """One draw's value in a series."""

    draw: str
    """The draw's label."""
    taken: datetime | None
    """When the draw was taken."""
    during: str | None
    """The loading test under way, if any."""
    value: float | None
    """The value (canonical unit), None when missing."""
    status: str
    """measured, unusual, missing, or a Finding status (ok, caution, not_valid, needs_input)."""
    note: str | None = None
    """Why the status is not plain (the first reason), or where the value came from."""


@dataclass(frozen=True, slots=True)
class Series:
    """One quantity over the draws of a case."""

    key: str
    """``panel.analyte`` or an index id."""
    name: str
    """Human name."""
    unit: str
    """Unit of the values ("" for pH)."""
    points: tuple[TrendPoint, ...]
    """One point per draw, oldest first."""

    @property
    def present(self) -> list[TrendPoint]:
        """The points that have a value."""
        return [p for p in self.points if p.value is not None]


def _ordered(case: Case, a: Assessment) -> list[tuple[Any, dict[str, Finding]]]:
    """(draw, findings) pairs oldest first: by time when every draw is dated, else file order."""
    findings = {r.label: r.findings for r in a.draws}
    draws = list(case.draws)
    if draws and all(d.taken is not None for d in draws):
        draws.sort(key=lambda d: comparable_time(d.taken))
    return [(d, findings.get(d.label, {})) for d in draws]


def _measured(panel: Panel, key: str, draw: Any) -> tuple[float | None, str]:
    m = draw.panel(panel).measurements().get(key)
    if m is None:
        return None, MISSING
    low, high = analyte(panel, key).usual
    return m.canonical, (MEASURED if low <= m.canonical <= high else UNUSUAL)


def _point(draw: Any, value: float | None, status: str, note: str | None = None) -> TrendPoint:
    return TrendPoint(
        draw.label, draw.taken, draw.during.value if draw.during else None, value, status, note
    )


def trends(case: Case, assessment: Assessment | None = None) -> list[Series]:
    """The five trend series of ``case`` (pass its assessment to avoid recomputing it)."""
    a = assessment or assess(case)
    rows = _ordered(case, a)
    bicarb, potassium, ph, gap, uph = [], [], [], [], []
    for draw, found in rows:
        v, s = _measured(Panel.serum, "bicarbonate", draw)
        if v is None:
            v, s = _measured(Panel.blood_gas, "bicarbonate", draw)
            note = "the gas analyzer's calculated bicarbonate" if v is not None else None
            bicarb.append(_point(draw, v, s, note))
        else:
            bicarb.append(_point(draw, v, s))
        potassium.append(_point(draw, *_measured(Panel.serum, "potassium", draw)))
        v, s = _measured(Panel.blood_gas, "ph", draw)
        note = None
        if v is not None and draw.blood_gas.sample.value != "arterial":
            note = f"{draw.blood_gas.sample.value} gas"
        ph.append(_point(draw, v, s, note))
        f = found.get("anion_gap")
        if f is None:
            gap.append(_point(draw, None, MISSING))
        else:
            gap.append(_point(draw, f.value, f.status.value, _first_reason(f)))
        f = found.get("urine_ph")
        v, s = _measured(Panel.urine, "ph", draw)
        if f is not None and f.value is not None:
            uph.append(_point(draw, f.value, f.status.value, _first_reason(f)))
        else:
            uph.append(_point(draw, v, s))
    return [
        Series("serum.bicarbonate", "Bicarbonate", "mmol/L", tuple(bicarb)),
        Series("serum.potassium", "Potassium", "mmol/L", tuple(potassium)),
        Series("blood_gas.ph", "Blood pH", "", tuple(ph)),
        Series("anion_gap", "Anion gap", "mmol/L", tuple(gap)),
        Series("urine.ph", "Urine pH", "", tuple(uph)),
    ]


def _first_reason(f: Finding) -> str | None:
    if f.status is Status.ok or not f.reasons:
        return None
    return f.reasons[0]


# --- two draws side by side ------------------------------------------------------------------


@dataclass(frozen=True, slots=True)
class ComparisonRow:
    """One index or analyte in two draws, and its change."""

    key: str
    """Index id or ``panel.analyte``."""
    name: str
    """Human name."""
    unit: str
    """Unit of the values and the change."""
    a: tuple[float | None, str]
    """(value, status) in the first draw."""
    b: tuple[float | None, str]
    """(value, status) in the second draw."""
    change: float | None
    """b − a, None when either is missing."""
    change_status: str
    """The weaker of the two statuses: a change is only as valid as its less valid end."""
    reading: tuple[str | None, str | None] = (None, None)
    """The index's interpretation in each draw (e.g. acidified → not acidified)."""
    index: bool = True
    """True for a computed index, False for a measured value."""


@dataclass(frozen=True)
class Comparison:
    """Two draws of one case, side by side."""

    a: str
    """Label of the first draw."""
    b: str
    """Label of the second draw."""
    rows: tuple[ComparisonRow, ...]
    """Indices in display order, then measured values in catalogue order."""


# Weakest first: the change takes the first of these that either end has.
_WEAKEST = (
    Status.needs_input.value,
    MISSING,
    Status.not_valid.value,
    Status.caution.value,
    UNUSUAL,
    MEASURED,
    Status.ok.value,
)


def change_status(a: str, b: str) -> str:
    """The status of a change between values with statuses ``a`` and ``b``."""
    for s in _WEAKEST:
        if s in (a, b):
            if s == UNUSUAL:
                return Status.caution.value
            if s == MISSING:
                return Status.needs_input.value
            return s
    return Status.ok.value


def compare(
    case: Case,
    a_label: str | None = None,
    b_label: str | None = None,
    assessment: Assessment | None = None,
) -> Comparison:
    """Compare draw ``a_label`` (default: the earliest) with ``b_label`` (default: the latest).

    Raises KeyError for an unknown draw label or a case with fewer than two draws.
    """
    a = assessment or assess(case)
    rows = _ordered(case, a)
    if len(rows) < 2:
        raise KeyError("comparing needs two draws; the case has " + str(len(rows)))
    by_label = {d.label: (d, f) for d, f in rows}
    a_label = a_label or rows[0][0].label
    b_label = b_label or rows[-1][0].label
    for label in (a_label, b_label):
        if label not in by_label:
            raise KeyError(f"no draw labelled {label!r}")
    (da, fa), (db, fb) = by_label[a_label], by_label[b_label]
    out: list[ComparisonRow] = []
    for key in dict.fromkeys([*fa, *fb]):
        x, y = fa.get(key), fb.get(key)
        ref = x or y
        assert ref is not None
        va = (x.value, x.status.value) if x else (None, MISSING)
        vb = (y.value, y.status.value) if y else (None, MISSING)
        out.append(_row(key, ref.name, ref.unit, va, vb, True, (_reading(x), _reading(y))))
    for panel in Panel:
        for key, an in CATALOGUE[panel].items():
            va, vb = _measured(panel, key, da), _measured(panel, key, db)
            if va[0] is None and vb[0] is None:
                continue
            out.append(_row(f"{panel.value}.{key}", f"{an.name} ({_panel_word(panel)})",
                            an.canonical, va, vb, False))  # fmt: skip
    return Comparison(a_label, b_label, tuple(out))


def _panel_word(panel: Panel) -> str:
    return {"serum": "serum", "blood_gas": "gas", "urine": "urine"}[panel.value]


def _reading(f: Finding | None) -> str | None:
    return f.interpretation if f is not None and f.value is not None else None


def _row(
    key: str,
    name: str,
    unit: str,
    va: tuple[float | None, str],
    vb: tuple[float | None, str],
    index: bool,
    reading: tuple[str | None, str | None] = (None, None),
) -> ComparisonRow:
    status = change_status(va[1], vb[1])
    change = vb[0] - va[0] if va[0] is not None and vb[0] is not None else None
    if change is None:
        status = Status.needs_input.value
    return ComparisonRow(key, name, unit, va, vb, change, status, reading, index)
