"""``make bench``: every figure, its baseline from the same run, one table and a JSON file.

Sections run in turn (terminal, recompute, library, memory). A section that cannot run yet (a
piece of the app not built, a failure) yields rows marked "not measured" with the reason, so the
table never silently drops a figure.
"""

from __future__ import annotations

import importlib.util
import json
import subprocess
import sys
import tempfile
import time
from collections.abc import Callable
from dataclasses import dataclass
from pathlib import Path
from typing import Any

from bench import machine, pty_bench
from bench.stats import paired_ratios, summarize
from bench.table import Row, Target, render

ROOT = Path(__file__).resolve().parent.parent
RESULTS = ROOT / "bench" / "results" / "latest.json"
DEMO_CASES = ROOT / "cases"
CASE_FILE = "distal-rta-classic.yaml"
"""The demo case opened for the terminal figures (two draws, every panel filled)."""
APP_KEYS: list[str] = ["f2"]
"""Keys pressed after the first screen settles to reach the entry field.

`workup CASE.yaml` opens on the findings; F2 shows the draw's entry form with its first field
focused (bench.probe checks that the digit then lands in an input).
"""
APP_QUIT_KEYS: list[str] = ["tab", "enter"]
"""Answer to the unsaved-changes question Ctrl+Q asks after the digit: move to Discard, press it."""
LIBRARY_SIZES = (1000, 10000)
COLD_TARGET_FILES = 10_000
"""The library size the cold-listing target is set for."""
MEMORY_LIBRARY = 10000


@dataclass(frozen=True)
class Plan:
    """How many repetitions each section makes."""

    pairs: int
    """Alternating app/baseline pairs in the pty."""
    sweeps: int
    """Recompute sweeps over all demo cases."""
    library_reps: int
    """Repetitions of the library listing benchmark (a fresh process each)."""
    memory_reps: int
    """App starts on the 10,000-case library (the first one with a cold index)."""
    idle_window: float
    """Seconds of idle output measured per run."""


FULL = Plan(pairs=8, sweeps=300, library_reps=3, memory_reps=3, idle_window=1.5)
QUICK = Plan(pairs=3, sweeps=60, library_reps=1, memory_reps=2, idle_window=1.0)

# xterm's bytes for the keys the harness may need (TERM=xterm-256color).
_KEY_BYTES = {
    "tab": b"\t",
    "enter": b"\r",
    "escape": b"\x1b",
    "down": b"\x1b[B",
    "up": b"\x1b[A",
    "f1": b"\x1bOP",
    "f2": b"\x1bOQ",
    "f3": b"\x1bOR",
    "f4": b"\x1bOS",
}


def key_bytes(key: str) -> bytes:
    """What a terminal sends for ``key`` (a Textual key name or a single character)."""
    if key in _KEY_BYTES:
        return _KEY_BYTES[key]
    if key.startswith("ctrl+") and len(key) == 6:
        return bytes([ord(key[-1].lower()) - 96])
    if len(key) == 1:
        return key.encode()
    raise ValueError(f"no terminal bytes known for key {key!r}")


def missing_rows(figures: list[tuple[str, str]], reason: str) -> list[Row]:
    """Rows for figures that could not be measured, all giving ``reason``."""
    return [Row(figure, unit, note=f"not measured: {reason}") for figure, unit in figures]


def guarded(
    name: str, figures: list[tuple[str, str]], fn: Callable[[], list[Row]], log: Callable[..., None]
) -> list[Row]:
    """Run one section; on failure, its figures become "not measured" rows with the reason."""
    log(f"[bench] {name} ...")
    t0 = time.perf_counter()
    try:
        rows = fn()
    except Exception as exc:
        reason = f"{type(exc).__name__}: {exc}".strip()
        log(f"[bench] {name} failed: {reason}")
        rows = missing_rows(figures, reason[:200])
    log(f"[bench] {name} done in {time.perf_counter() - t0:.1f} s")
    return rows


# ---------------------------------------------------------------- terminal: startup, bytes, RSS

TERMINAL_FIGURES = [
    ("Start to settled first screen, `workup CASE.yaml`", "s"),
    ("Start to first full frame", "s"),
    ("Bytes written for the first screen", "bytes"),
    ("Bytes written for one digit typed into a field", "bytes"),
    ("Idle output with the case open", "B/s"),
    ("Peak memory (max RSS), one case open", "MiB"),
]


def _paired_row(
    figure: str,
    unit: str,
    app: list[float],
    base: list[float],
    baseline_name: str,
    target: Target | None = None,
    note: str = "",
) -> Row:
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


def terminal_rows(plan: Plan, work: Path, log: Callable[..., None]) -> list[Row]:
    """Startup, first-screen bytes, keystroke bytes, idle bytes and RSS against the bare form."""
    if importlib.util.find_spec("screens.app") is None:
        raise RuntimeError("screens/app.py (build_app) is not in the tree yet")
    env = pty_bench.bench_env(work / "home")
    cases = pty_bench.copy_cases(DEMO_CASES, work / "cases")
    case = cases / CASE_FILE
    # The probe types into the case, so it gets its own home: nothing it leaves (a draft, a
    # lock) can reach the timed runs.
    probe_env = pty_bench.bench_env(work / "home-probe")
    keys = ",".join(APP_KEYS)
    app_probe = pty_bench.probe(["app", str(cases), str(case), "--keys", keys], probe_env)
    zero = pty_bench.probe(["baseline", "0"], probe_env)["widgets"]
    one = pty_bench.probe(["baseline", "1"], probe_env)["widgets"]
    form_rows = pty_bench.rows_for(app_probe["widgets"], zero, one - zero)
    form_widgets = zero + (one - zero) * form_rows
    log(
        f"[bench] app first screen: {app_probe}; bare form: {form_rows} rows, {form_widgets} widgets"
    )
    app_argv = pty_bench.workup_argv("--cases", str(cases), str(case))
    base_argv = pty_bench.baseline_argv(form_rows)
    app, base = pty_bench.paired_runs(
        app_argv,
        base_argv,
        env,
        work,
        plan.pairs,
        app_keys=[key_bytes(k) for k in APP_KEYS],
        app_quit_keys=[key_bytes(k) for k in APP_QUIT_KEYS],
        idle_window=plan.idle_window,
    )
    hung = [r.exit_note for r in app + base if r.exit_note]
    if hung:
        log(f"[bench] {len(hung)} runs did not quit on Ctrl+Q: {hung[0]}")
    name = f"bare form, {form_widgets} widgets"
    size_note = (
        f"The app's first screen has {app_probe['widgets']} widgets ({app_probe['screen']}); "
        f"the bare form has {form_widgets}."
    )
    if hung:
        size_note += f" {len(hung)} of {len(app) + len(base)} runs had to be killed after Ctrl+Q."
    key_note = (
        f"Keys before the digit: {', '.join(APP_KEYS) or 'none'}; in the headless check the digit "
        f"changed {'; '.join(app_probe['digit_changed'])} (the bare form: an empty input)."
    )
    if not app_probe["focus_is_input"] or not app_probe["digit_changed"]:
        key_note = (
            "The digit did not reach an input field in the headless check (focus: "
            f"{app_probe['focus_before_digit']}); the bytes are for whatever the key did."
        )
    # (measure of one run, target, note) per figure, in TERMINAL_FIGURES order.
    figures = [
        (lambda r: r.settled_s, Target("ratio", "<=", 1.3), size_note),
        (lambda r: r.first_frame_s, None, ""),
        (lambda r: float(r.first_screen_bytes), None, ""),
        (lambda r: float(r.key_bytes or 0), None, key_note),
        (lambda r: r.idle_bytes_per_s, None, ""),
        (lambda r: r.max_rss_mib, None, ""),
    ]
    rows = [
        _paired_row(title, unit, [m(r) for r in app], [m(r) for r in base], name, target, note)
        for (title, unit), (m, target, note) in zip(TERMINAL_FIGURES, figures, strict=True)
    ]
    rows[0].extra["probe"] = app_probe
    return rows


# ---------------------------------------------------------------- recompute

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


# ---------------------------------------------------------------- library listing


def library_figures(sizes: tuple[int, ...]) -> list[tuple[str, str]]:
    """The figure names of the library section."""
    out = []
    for n in sizes:
        out += [
            (f"Library listing, {n:,} cases, cold index", "s"),
            (f"Library listing, {n:,} cases, warm index", "s"),
            (f"Library listing, {n:,} cases, after one file edited", "s"),
        ]
    return out


def library_samples(sizes: tuple[int, ...], reps: int) -> list[dict[str, Any]]:
    """Rows of bench/library_bench.py, each repetition in a fresh process."""
    out: list[dict[str, Any]] = []
    for _ in range(reps):
        done = subprocess.run(
            [sys.executable, "-m", "bench.library_bench", *map(str, sizes)],
            capture_output=True,
            text=True,
            cwd=str(ROOT),
            check=False,
        )
        if done.returncode != 0:
            tail = (done.stderr.strip().splitlines() or ["no output"])[-1]
            raise RuntimeError(f"bench.library_bench failed: {tail}")
        out += [json.loads(line) for line in done.stdout.splitlines() if line.startswith("{")]
    return out


def library_rows_from(samples: list[dict[str, Any]], sizes: tuple[int, ...]) -> list[Row]:
    """Summarise library_bench rows per size into cold, warm and one-edit rows."""
    rows = []
    for n in sizes:
        mine = [s for s in samples if s.get("files") == n]
        if not mine:
            rows += missing_rows(library_figures((n,)), f"no result for {n} files")
            continue
        parse = [float(s["yaml_parse_s"]) for s in mine]
        ok = min(int(s.get("cases_ok", n)) for s in mine)
        note = "" if ok == n else f"only {ok} of {n:,} generated cases were read as valid."
        base = "CSafeLoader parse of the same files"
        figs = library_figures((n,))
        # The 1.5x target is set for 10,000 files. A smaller library is shown for scale: there
        # the fixed start of a listing (interpreter, imports, the pool) weighs like the parse.
        cold_target = Target("ratio", "<=", 1.5) if n >= COLD_TARGET_FILES else None
        if cold_target is None:
            note = (note + " " if note else "") + (
                f"No target: it is set for {COLD_TARGET_FILES:,} files; here the fixed start of "
                "a listing process (interpreter, imports, the worker) is as long as the parse."
            )
        rows.append(
            _paired_row(
                figs[0][0],
                "s",
                [float(s["cold_s"]) for s in mine],
                parse,
                base,
                cold_target,
                note=note,
            )
        )
        rows[-1].extra["library_bench_rows"] = mine  # everything it reported, breakdowns too
        rows.append(
            _paired_row(
                figs[1][0],
                "s",
                [float(s["warm_s"]) for s in mine],
                parse,
                base,
                Target("value", "<", 0.5),
            )
        )
        rows.append(
            _paired_row(
                figs[2][0],
                "s",
                [float(s["one_changed_s"]) for s in mine],
                parse,
                base,
                Target("value", "<", 1.0),
            )
        )
    return rows


def library_rows(plan: Plan, work: Path, log: Callable[..., None]) -> list[Row]:
    """Cold, warm and one-edit listing against the YAML parse, from bench/library_bench.py."""
    if importlib.util.find_spec("workup.library") is None:
        raise RuntimeError("workup/library.py is not in the tree yet")
    return library_rows_from(library_samples(LIBRARY_SIZES, plan.library_reps), LIBRARY_SIZES)


# ---------------------------------------------------------------- memory with a large library

MEMORY_FIGURES = [
    (f"Peak memory (max RSS), library of {MEMORY_LIBRARY:,} cases open", "MiB"),
    ("Same, app and its helper processes together (PSS, sampled)", "MiB"),
    (f"Start to settled library screen, {MEMORY_LIBRARY:,} cases, cold index", "s"),
    (f"Start to settled library screen, {MEMORY_LIBRARY:,} cases, warm index", "s"),
]


def memory_rows(plan: Plan, work: Path, log: Callable[..., None]) -> list[Row]:
    """Peak RSS of ``workup --cases DIR`` on a generated 10,000-case library, cold then warm."""
    if importlib.util.find_spec("screens.app") is None:
        raise RuntimeError("screens/app.py (build_app) is not in the tree yet")
    from bench.library_bench import generate_library

    env = pty_bench.bench_env(work / "home-library")
    folder = work / "library"
    generate_library(folder, MEMORY_LIBRARY)
    pty_bench.make_private(folder)
    runs = [pty_bench.library_run(folder, env, work) for _ in range(plan.memory_reps)]
    failed = [r.ready for r in runs if r.ready != "listed"]
    if failed:
        raise RuntimeError(f"the library screen did not list the cases: {failed[0]}")
    rss = [r.max_rss_mib for r in runs]
    hung = sum(1 for r in runs if r.exit_note)
    kill_note = f" {hung} of {len(runs)} runs had to be killed after Ctrl+Q." if hung else ""
    rows = [
        Row(
            MEMORY_FIGURES[0][0],
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
            MEMORY_FIGURES[1][0],
            "MiB",
            value=summarize(tree),
            target=Target("value", "<", 150.0, statistic="high"),
            note="Sum of the proportional set sizes (PSS, shared pages split among the processes "
            "sharing them) of the app and every process below it, read from /proc every 0.1 s "
            "(a shorter peak can be missed); max RSS above counts the largest single process.",
            extra={"samples": tree},
        )
        if tree
        else missing_rows([MEMORY_FIGURES[1]], "no sample from /proc")[0]
    )
    rows.append(Row(MEMORY_FIGURES[2][0], "s", value=summarize([runs[0].settled_s])))
    warm = [r.settled_s for r in runs[1:]]
    rows.append(
        Row(MEMORY_FIGURES[3][0], "s", value=summarize(warm), extra={"samples": warm})
        if warm
        else missing_rows([MEMORY_FIGURES[3]], "one run only")[0]
    )
    return rows


# ---------------------------------------------------------------- the whole run

SECTIONS = {
    "terminal": (TERMINAL_FIGURES, terminal_rows),
    "recompute": (RECOMPUTE_FIGURES, recompute_rows),
    "library": (library_figures(LIBRARY_SIZES), library_rows),
    "memory": (MEMORY_FIGURES, memory_rows),
}


def run(
    plan: Plan, only: list[str] | None = None, log: Callable[..., None] = print
) -> dict[str, Any]:
    """Run the chosen sections (all by default) and return the results document."""
    started = time.perf_counter()
    info = machine.info()
    rows: list[Row] = []
    with tempfile.TemporaryDirectory(prefix="workup-bench-") as tmp:
        for name, (figures, fn) in SECTIONS.items():
            if only and name not in only:
                continue
            work = Path(tmp) / name
            work.mkdir()
            rows += guarded(name, figures, lambda fn=fn, work=work: fn(plan, work, log), log)
    info["load_after"] = machine.load_average()
    info["run_seconds"] = round(time.perf_counter() - started, 1)
    return {
        "machine": info,
        "plan": plan.__dict__,
        "rows": [r.to_json() for r in rows],
        "table": render(rows),
    }


def write_results(doc: dict[str, Any], path: Path = RESULTS) -> Path:
    """Write the results document as JSON."""
    path.parent.mkdir(parents=True, exist_ok=True)
    path.write_text(json.dumps(doc, indent=2, ensure_ascii=False) + "\n", encoding="utf-8")
    return path
