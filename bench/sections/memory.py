"""The memory section: peak memory of `workup --cases DIR` with generated 10,000-case libraries.

The app runs in the pty (bench/pty_bench.py) until its library screen lists a generated case; the
first run builds the index from nothing, the others find it built. Both library shapes are opened
(the demo-derived one and bench/varied_library.py's).
"""

from __future__ import annotations

import importlib.util
from collections.abc import Callable
from pathlib import Path

from bench import pty_bench
from bench.plan import Plan
from bench.sections.rows import missing_rows
from bench.stats import summarize
from bench.table import Row, Target

MEMORY_LIBRARY = 10000
SHAPES = ("demo", "varied")
"""The library shapes opened: the demo-derived one and bench/varied_library.py's."""


def memory_figures(shape: str = "demo") -> list[tuple[str, str]]:
    """The figure names for one library shape."""
    kind = "cases" if shape == "demo" else f"{shape} cases"
    same = "Same" if shape == "demo" else f"Same, {kind}"
    return [
        (f"Peak memory (max RSS), library of {MEMORY_LIBRARY:,} {kind} open", "MiB"),
        (f"{same}, app and its helper processes together (PSS, sampled)", "MiB"),
        (f"Start to settled library screen, {MEMORY_LIBRARY:,} {kind}, cold index", "s"),
        (f"Start to settled library screen, {MEMORY_LIBRARY:,} {kind}, warm index", "s"),
    ]


MEMORY_FIGURES = [fig for shape in SHAPES for fig in memory_figures(shape)]


def memory_rows(plan: Plan, work: Path, log: Callable[..., None]) -> list[Row]:
    """Peak RSS of ``workup --cases DIR`` on generated 10,000-case libraries, cold then warm."""
    if importlib.util.find_spec("screens.app") is None:
        raise RuntimeError("screens/app.py (build_app) is not in the tree yet")
    from bench.library_bench import generate

    rows: list[Row] = []
    for shape in SHAPES:
        env = pty_bench.bench_env(work / f"home-{shape}")
        folder = work / f"library-{shape}"
        generate(shape, folder, MEMORY_LIBRARY)
        pty_bench.make_private(folder)
        runs = [pty_bench.library_run(folder, env, work) for _ in range(plan.memory_reps)]
        rows += shape_rows(shape, runs)
    return rows


def shape_rows(shape: str, runs: list[pty_bench.RunResult]) -> list[Row]:
    """The four rows of one library shape from its runs (the first one with a cold index)."""
    figures = memory_figures(shape)
    failed = [r.ready for r in runs if r.ready != "listed"]
    if failed:
        return missing_rows(figures, f"the library screen did not list the cases: {failed[0]}")
    rss = [r.max_rss_mib for r in runs]
    hung = sum(1 for r in runs if r.exit_note)
    kill_note = f" {hung} of {len(runs)} runs had to be killed after Ctrl+Q." if hung else ""
    rows = [
        Row(
            figures[0][0],
            "MiB",
            value=summarize(rss),
            target=Target("value", "<", 150.0, statistic="high"),
            note="Judged on the largest run (peak memory is a worst case); the first run builds "
            "the index from nothing." + kill_note,
            extra={"samples": rss},
        ),
    ]
    tree = [r.tree_peak_mib for r in runs if r.tree_peak_mib]
    rows.append(
        Row(
            figures[1][0],
            "MiB",
            value=summarize(tree),
            target=Target("value", "<", 150.0, statistic="high"),
            note="Sum of the proportional set sizes (PSS, shared pages split among the processes "
            "sharing them) of the app and every process below it, read from /proc every 0.1 s "
            "(a shorter peak can be missed); max RSS above counts the largest single process.",
            extra={"samples": tree},
        )
        if tree
        else missing_rows([figures[1]], "no sample from /proc")[0]
    )
    rows.append(Row(figures[2][0], "s", value=summarize([runs[0].settled_s])))
    warm = [r.settled_s for r in runs[1:]]
    rows.append(
        Row(figures[3][0], "s", value=summarize(warm), extra={"samples": warm})
        if warm
        else missing_rows([figures[3]], "one run only")[0]
    )
    return rows
