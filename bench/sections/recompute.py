"""The recompute section: edit one value of each demo case and assess it again, in process."""

from __future__ import annotations

from collections.abc import Callable
from pathlib import Path

from bench.paths import DEMO_CASES
from bench.plan import Plan
from bench.stats import summarize
from bench.table import Row, Target

RECOMPUTE_FIGURES = [
    ("Recompute one case after one edit (edit + assess)", "ms"),
    ("Recompute every demo case, one edit each", "ms"),
]


def recompute_rows(plan: Plan, work: Path, log: Callable[..., None]) -> list[Row]:
    """Median and p99 of edit + assess, per case and per sweep of all demo cases."""
    from bench import recompute

    r = recompute.run(DEMO_CASES, sweeps=plan.sweeps)
    if not r.per_case_ms:
        raise RuntimeError("no demo case could be edited and assessed: " + "; ".join(r.skipped))
    note = f"{r.cases} demo cases, {plan.sweeps} sweeps, pooled."
    if r.skipped:
        note += " Skipped: " + "; ".join(r.skipped)
    return [
        Row(
            RECOMPUTE_FIGURES[0][0],
            "ms",
            value=summarize(r.per_case_ms),
            target=Target("value", "<", 2.0),
            note=note,
            also=("p99",),
        ),
        Row(RECOMPUTE_FIGURES[1][0], "ms", value=summarize(r.sweep_ms), also=("p99",)),
    ]
