"""Result rows, their pass/fail verdict against a target, and the one table ``make bench`` prints.

A row holds a figure's summary, the baseline measured in the same run (if any), the pair-by-pair
ratio, and a target; the verdict is computed here, never written by hand.
"""

from __future__ import annotations

import operator
from collections.abc import Callable, Sequence
from dataclasses import dataclass, field
from typing import Any, Literal

from bench.stats import Summary

Statistic = Literal["median", "p99", "high"]
_COMPARE: dict[str, Callable[[float, float], bool]] = {
    "<": operator.lt,
    "<=": operator.le,
}


@dataclass(frozen=True, slots=True)
class Target:
    """A goal for one statistic of a row: e.g. the median ratio at most 1.3."""

    of: Literal["value", "ratio"]
    """Whether the goal is on the measured value or on the ratio to the baseline."""
    op: Literal["<", "<="]
    """The comparison the statistic must satisfy."""
    limit: float
    """The bound."""
    statistic: Statistic = "median"
    """Which statistic is judged: the median, the 99th percentile or the largest value."""
    label: str = ""
    """What kind of target it is when a row has several ("goal", "new"); empty for the first."""

    def text(self, unit: str) -> str:
        """How the target reads in the table, e.g. "median ratio ≤ 1.3" or "goal: ..."."""
        op = {"<": "<", "<=": "≤"}[self.op]
        stat = {"median": "median", "p99": "p99", "high": "max"}[self.statistic]
        label = f"{self.label}: " if self.label else ""
        if self.of == "ratio":
            return f"{label}{stat} ratio {op} {self.limit:g}"
        return f"{label}{stat} {op} {self.limit:g} {unit}".rstrip()


@dataclass
class Row:
    """One line of the benchmark table."""

    figure: str
    """What was measured, in words."""
    unit: str
    """Unit of the values ("s", "ms", "MiB", "bytes", "B/s")."""
    value: Summary | None = None
    """The measured values (None when the figure could not be measured)."""
    baseline: Summary | None = None
    """The baseline measured side by side, if the figure has one."""
    baseline_name: str = ""
    """What the baseline is."""
    ratio: Summary | None = None
    """Pair-by-pair ratios value/baseline."""
    target: Target | None = None
    """The goal, if the figure has one."""
    more_targets: tuple[Target, ...] = ()
    """Further goals judged the same way (a stricter goal beside a limit, a newer target beside
    an earlier one); each gets its own verdict."""
    note: str = ""
    """Why a figure is missing, or what to keep in mind reading it."""
    also: tuple[Statistic, ...] = ()
    """Statistics shown beside the median besides the judged one (e.g. the p99)."""
    extra: dict[str, Any] = field(default_factory=dict)
    """Raw samples and details, kept in the JSON file only."""

    @property
    def verdict(self) -> str:
        """ "pass", "FAIL", "n/a" (not measured) or "" (no target), for :attr:`target`."""
        if self.target is None:
            return "" if self.value is not None else "n/a"
        return self.judge(self.target)

    @property
    def targets(self) -> tuple[Target, ...]:
        """Every goal of the row: :attr:`target` first, then :attr:`more_targets`."""
        return ((self.target,) if self.target else ()) + self.more_targets

    def judged(self, target: Target) -> float | None:
        """The statistic ``target`` is judged on (None when it was not measured)."""
        summary = self.ratio if target.of == "ratio" else self.value
        return None if summary is None else getattr(summary, target.statistic)

    def judge(self, target: Target) -> str:
        """ "pass", "FAIL" or "n/a" (not measured) for one goal of this row."""
        x = self.judged(target)
        if x is None:
            return "n/a"
        return "pass" if _COMPARE[target.op](x, target.limit) else "FAIL"

    def to_json(self) -> dict[str, Any]:
        """A plain dict for bench/results/latest.json."""
        return {
            "figure": self.figure,
            "unit": self.unit,
            "value": self.value.to_json() if self.value else None,
            "baseline": self.baseline.to_json() if self.baseline else None,
            "baseline_name": self.baseline_name,
            "ratio": self.ratio.to_json() if self.ratio else None,
            "target": self.target.text(self.unit) if self.target else None,
            "verdict": self.verdict,
            "more_targets": [
                {"target": t.text(self.unit), "verdict": self.judge(t)} for t in self.more_targets
            ],
            "note": self.note,
            "extra": self.extra,
        }


def number_text(x: float) -> str:
    """A number with about three significant figures, no exponent for everyday sizes."""
    if x == 0:
        return "0"
    ax = abs(x)
    if ax >= 100:
        return f"{x:.0f}"
    if ax >= 10:
        return f"{x:.1f}"
    if ax >= 1:
        return f"{x:.2f}"
    if ax >= 0.01:
        return f"{x:.3f}"
    return f"{x:.2g}"


def spread(s: Summary) -> str:
    """The spread of a summary: the IQR from 4 measurements up, else the range; with n."""
    if s.n >= 4:
        return f"IQR {number_text(s.q1)}–{number_text(s.q3)}, n={s.n}"
    if s.n == 1:
        return "n=1"
    return f"range {number_text(s.low)}–{number_text(s.high)}, n={s.n}"


def cells(row: Row) -> list[str]:
    """The table cells of ``row``."""
    if row.value is None:
        value = "not measured"
    else:
        value = f"{number_text(row.value.median)} {row.unit} ({spread(row.value)})"
        shown = list(row.also)
        shown += [t.statistic for t in row.targets if t.statistic != "median"]
        for stat in dict.fromkeys(shown):
            label = {"p99": "p99", "high": "max", "median": "median"}[stat]
            value += f"; {label} {number_text(getattr(row.value, stat))}"
    base = f"{number_text(row.baseline.median)} {row.unit}" if row.baseline else ""
    if row.baseline_name and base:
        base += f" ({row.baseline_name})"
    ratio = f"{number_text(row.ratio.median)}× ({spread(row.ratio)})" if row.ratio else ""
    target = "; ".join(t.text(row.unit) for t in row.targets)
    verdict = "; ".join(row.judge(t) for t in row.targets) if row.targets else row.verdict
    return [row.figure, value, base, ratio, target, verdict]


HEADER = ["Figure", "Median (spread)", "Baseline, same run", "Ratio, pair by pair", "Target", ""]


def render(rows: Sequence[Row]) -> str:
    """The rows as a Markdown table (readable as plain text too), notes listed underneath."""
    lines = [
        "| " + " | ".join(HEADER) + " |",
        "|" + "|".join("---" for _ in HEADER) + "|",
    ]
    notes: list[str] = []
    for row in rows:
        cell = cells(row)
        if row.note:
            if row.note not in notes:  # one note shared by several rows is listed once
                notes.append(row.note)
            cell[0] += f" [{notes.index(row.note) + 1}]"
        lines.append("| " + " | ".join(c.replace("|", "/") for c in cell) + " |")
    if notes:
        lines.append("")
        lines.extend(f"[{i}] {n}" for i, n in enumerate(notes, 1))
    return "\n".join(lines)
