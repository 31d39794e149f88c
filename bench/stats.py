"""Summaries of repeated measurements: median, spread, percentiles and paired ratios.

Pure functions on lists of floats, so they can be checked against numpy in the tests.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import asdict, dataclass
from typing import Any


def percentile(values: Sequence[float], q: float) -> float:
    """The ``q``-th percentile (0-100) by linear interpolation between order statistics.

    This is the usual "linear" definition (numpy's default): position ``(n - 1) * q / 100``.
    """
    if not values:
        raise ValueError("percentile of no values")
    if not 0 <= q <= 100:
        raise ValueError(f"percentile {q} is outside 0-100")
    xs = sorted(values)
    pos = (len(xs) - 1) * q / 100
    lo = math.floor(pos)
    hi = min(lo + 1, len(xs) - 1)
    return xs[lo] + (xs[hi] - xs[lo]) * (pos - lo)


@dataclass(frozen=True, slots=True)
class Summary:
    """Median and spread of repeated measurements."""

    n: int
    """Number of measurements."""
    median: float
    """Middle value."""
    q1: float
    """25th percentile."""
    q3: float
    """75th percentile."""
    p99: float
    """99th percentile (meaningful only with many measurements)."""
    low: float
    """Smallest value."""
    high: float
    """Largest value."""

    def to_json(self) -> dict[str, Any]:
        """A plain dict for the results file."""
        return asdict(self)


def summarize(values: Sequence[float]) -> Summary:
    """Median, quartiles, 99th percentile and range of ``values`` (at least one)."""
    if not values:
        raise ValueError("nothing to summarize")
    return Summary(
        n=len(values),
        median=percentile(values, 50),
        q1=percentile(values, 25),
        q3=percentile(values, 75),
        p99=percentile(values, 99),
        low=min(values),
        high=max(values),
    )


def paired_ratios(measured: Sequence[float], baseline: Sequence[float]) -> list[float]:
    """``measured[i] / baseline[i]`` for each pair run side by side.

    Each ratio compares two runs taken moments apart, so load from other users of the machine
    largely cancels; summarising the ratios is then fairer than a ratio of two medians.
    """
    if len(measured) != len(baseline):
        raise ValueError(f"{len(measured)} measurements against {len(baseline)} baselines")
    if any(b <= 0 for b in baseline):
        raise ValueError("a baseline measurement is zero or negative; no ratio")
    return [m / b for m, b in zip(measured, baseline, strict=True)]


def alternating_order(pairs: int) -> list[tuple[str, str]]:
    """Run order for ``pairs`` pairs: measured first, then baseline first, and so on (ABBA).

    Alternating who goes first spreads any warm-up advantage (file cache, CPU frequency) evenly.
    """
    return [
        ("measured", "baseline") if i % 2 == 0 else ("baseline", "measured") for i in range(pairs)
    ]
