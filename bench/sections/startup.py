"""The startup section: the first screens of `workup CASE.yaml` and `workup` against a minimal app.

Both first screens are timed in the pty (bench/pty_bench.py), each run paired with a run of the
minimal Textual app (bench/baselines/minimal_app.py) made next to it, in alternating turns. Unlike
the bare form of the terminal section, the minimal app is not sized to the app: a screen that
mounts many widgets before its first paint pays for them here.
"""

from __future__ import annotations

import importlib.util
import re
from collections.abc import Callable, Sequence
from pathlib import Path

from bench import pty_bench
from bench.keys import key_bytes
from bench.paths import DEMO_CASES
from bench.plan import Plan
from bench.sections.rows import paired_row
from bench.sections.terminal import APP_QUIT_KEYS, CASE_FILE
from bench.stats import alternating_order, paired_ratios
from bench.table import Row, Target

SHAPES = {
    "case": "`workup CASE.yaml`",
    "library": "`workup` (library view, the demo cases)",
}
"""The two first screens measured, by key, with how the table names them."""
LIMIT = Target("ratio", "<=", 1.5)
"""The first screen must settle within 1.5 times the minimal app's."""
GOAL = Target("ratio", "<=", 1.3, label="goal")
"""What the team aims for."""
BASELINE_NAME = "minimal app"


def startup_figures() -> list[tuple[str, str]]:
    """The figure names of this section, two per first screen."""
    out = []
    for shown in SHAPES.values():
        out += [
            (f"Start to settled first screen, {shown}, against the minimal app", "s"),
            (f"Start to first full frame, {shown}, against the minimal app", "s"),
        ]
    return out


STARTUP_FIGURES = startup_figures()


def pair_text(ratios: Sequence[float]) -> str:
    """The ratios in run order, e.g. "1.21, 1.35, 1.18" (the table shows only their summary)."""
    return ", ".join(f"{r:.2f}" for r in ratios)


def shape_rows(
    shape: str,
    app_settled: list[float],
    base_settled: list[float],
    app_first: list[float],
    base_first: list[float],
    widgets_note: str = "",
) -> list[Row]:
    """The settled row (judged against the limit and the goal) and the first-frame row."""
    settled_fig, first_fig = STARTUP_FIGURES[2 * list(SHAPES).index(shape) :][:2]
    note = (
        f"{widgets_note} Settled ratios pair by pair, in run order: "
        f"{pair_text(paired_ratios(app_settled, base_settled))}."
    ).strip()
    settled = paired_row(*settled_fig, app_settled, base_settled, BASELINE_NAME, LIMIT, note)
    settled.more_targets = (GOAL,)
    first = paired_row(*first_fig, app_first, base_first, BASELINE_NAME)
    return [settled, first]


_LIBRARY_ERROR = re.compile(r"cannot read the library[^|]{0,80}")


def shows(words: str) -> Callable[[bytes], str | None]:
    """A readiness check: "shown" once ``words`` are on screen, "error: ..." if the library
    screen said it could not read the folder, else None (keep waiting)."""

    def ready(output: bytes) -> str | None:
        text = pty_bench.screen_text(output, limit=len(output))
        error = _LIBRARY_ERROR.search(text)
        if error:
            return "error: " + error.group(0).strip()
        return "shown" if words in text else None

    return ready


def startup_rows(plan: Plan, work: Path, log: Callable[..., None]) -> list[Row]:
    """Settled and first-frame times of both first screens against the minimal app."""
    if importlib.util.find_spec("screens.app") is None:
        raise RuntimeError("screens/app.py (build_app) is not in the tree yet")
    env = pty_bench.bench_env(work / "home")
    cases = pty_bench.copy_cases(DEMO_CASES, work / "cases")
    case = cases / CASE_FILE
    # `workup` alone opens the library named by $WORKUP_CASES, as a fellow's shell would set it.
    library_env = {**env, "WORKUP_CASES": str(cases)}
    probe_env = pty_bench.bench_env(work / "home-probe")
    counts = {
        "case": pty_bench.probe(["app", str(cases), str(case)], probe_env),
        "library": pty_bench.probe(["library", str(cases)], probe_env),
        "minimal": pty_bench.probe(["minimal"], probe_env),
    }
    log(f"[bench] startup probes: {counts}")
    quit_keys = [key_bytes(k) for k in APP_QUIT_KEYS]
    # Both first screens must show a demo case before they count as settled (a screen that
    # falls quiet while a worker still reads the folder is not the first screen yet).
    programs: dict[str, Callable[[], pty_bench.RunResult]] = {
        "case": lambda: pty_bench.one_run(
            pty_bench.workup_argv("--cases", str(cases), str(case)),
            env, work, type_digit=False, idle_window=0.1, quit_keys=quit_keys,
            ready=shows("Demo B"),
        ),
        "library": lambda: pty_bench.one_run(
            pty_bench.workup_argv(), library_env, work, type_digit=False, idle_window=0.1,
            quit_keys=quit_keys, ready=shows("Demo "),
        ),
        "minimal": lambda: pty_bench.one_run(
            pty_bench.minimal_argv(), env, work, type_digit=False, idle_window=0.1
        ),
    }  # fmt: skip
    for run in programs.values():  # one unrecorded warm-up of each (file cache, bytecode)
        run()
    runs: dict[str, list[tuple[pty_bench.RunResult, pty_bench.RunResult]]] = {s: [] for s in SHAPES}
    for order in alternating_order(plan.startup_pairs):
        for shape in SHAPES:
            done = {who: (programs[shape] if who == "measured" else programs["minimal"])()
                    for who in order}  # fmt: skip
            runs[shape].append((done["measured"], done["baseline"]))
    rows: list[Row] = []
    for shape, pairs in runs.items():
        not_ready = [a.ready for a, _ in pairs if a.ready != "shown"]
        if not_ready:
            raise RuntimeError(f"{SHAPES[shape]} did not show a demo case: {not_ready[0]}")
        app, base = [a for a, _ in pairs], [b for _, b in pairs]
        widgets = (
            f"Widgets on the first screen (headless count): {counts[shape]['widgets']} "
            f"({counts[shape]['screen']}); the minimal app has {counts['minimal']['widgets']}."
        )
        rows += shape_rows(
            shape,
            [r.settled_s for r in app],
            [r.settled_s for r in base],
            [r.first_frame_s for r in app],
            [r.first_frame_s for r in base],
            widgets,
        )
    return rows
