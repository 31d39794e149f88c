"""Row builders the sections share: a figure that could not be measured, a figure with a baseline.

Each section (terminal, library, memory, ...) builds its rows with these, so that a missing figure
and a pair-by-pair ratio read the same way in every part of the table.
"""

from __future__ import annotations

from bench.stats import paired_ratios, summarize
from bench.table import Row, Target


def missing_rows(figures: list[tuple[str, str]], reason: str) -> list[Row]:
    """Rows for figures that could not be measured, all giving ``reason``."""
    return [Row(figure, unit, note=f"not measured: {reason}") for figure, unit in figures]


def paired_row(
    figure: str,
    unit: str,
    app: list[float],
    base: list[float],
    baseline_name: str,
    target: Target | None = None,
    note: str = "",
) -> Row:
    """A row of ``app`` samples against the ``base`` samples taken beside them, pair by pair."""
    ratio = summarize(paired_ratios(app, base)) if all(b > 0 for b in base) else None
    return Row(
        figure,
        unit,
        value=summarize(app),
        baseline=summarize(base),
        baseline_name=baseline_name,
        ratio=ratio,
        target=target,
        note=note,
        extra={"samples": app, "baseline_samples": base},
    )
