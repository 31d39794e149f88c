"""The terminal section: `workup CASE.yaml` against the bare form in a pty, turn by turn.

Startup, first-screen bytes, bytes for one digit, idle output and peak RSS of one demo case, each
paired with a bare Textual form of as many widgets (bench/baselines/bare_form.py) run beside it.
"""

from __future__ import annotations

import importlib.util
from collections.abc import Callable
from pathlib import Path

from bench import pty_bench
from bench.keys import key_bytes
from bench.paths import DEMO_CASES
from bench.plan import Plan
from bench.sections.rows import paired_row
from bench.table import Row, Target

CASE_FILE = "distal-rta-classic.yaml"
"""The demo case opened for the terminal figures (two draws, every panel filled)."""
APP_KEYS: list[str] = ["f2"]
"""Keys pressed after the first screen settles to reach the entry field.

`workup CASE.yaml` opens on the findings; F2 shows the draw's entry form with its first field
focused (bench.probe checks that the digit then lands in an input).
"""
APP_QUIT_KEYS: list[str] = ["tab", "enter"]
"""Answer to the unsaved-changes question Ctrl+Q asks after the digit: move to Discard, press it."""

TERMINAL_FIGURES = [
    ("Start to settled first screen, `workup CASE.yaml`", "s"),
    ("Start to first full frame", "s"),
    ("Bytes written for the first screen", "bytes"),
    ("Bytes written for one digit typed into a field", "bytes"),
    ("Idle output with the case open", "B/s"),
    ("Peak memory (max RSS), one case open", "MiB"),
]


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
        paired_row(title, unit, [m(r) for r in app], [m(r) for r in base], name, target, note)
        for (title, unit), (m, target, note) in zip(TERMINAL_FIGURES, figures, strict=True)
    ]
    rows[0].extra["probe"] = app_probe
    return rows
