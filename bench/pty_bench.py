"""What the fellow feels over SSH: startup, bytes per keystroke, idle bytes, peak memory.

Each run starts a program in a real pty (80x24, TERM=xterm-256color), waits until its first screen
has settled, measures the idle output, types one digit into the focused field, counts the bytes
that come back, quits with Ctrl+Q and reads the child's peak RSS. The app and the bare baseline
take turns (app first, then baseline first, ...), so each ratio compares runs made moments apart.
"""

from __future__ import annotations

import json
import os
import re
import shutil
import subprocess
import sys
from collections.abc import Callable
from dataclasses import dataclass
from pathlib import Path
from typing import Any

from bench.stats import alternating_order
from bench.terminal import Session, bytes_between, first_frame_index

ROOT = Path(__file__).resolve().parent.parent
BARE_FORM = ROOT / "bench" / "baselines" / "bare_form.py"
MINIMAL_APP = ROOT / "bench" / "baselines" / "minimal_app.py"

QUIET = 0.4
"""Seconds of silence that mean "settled".

Shorter than Textual's 0.5 s cursor-blink period on purpose: a blinking cursor then does not
stop the screen from counting as settled (choice of this harness, documented in
docs/benchmarks.md).
"""
DIGIT = b"7"
"""The key typed into the field."""


def bench_env(home: Path) -> dict[str, str]:
    """A clean, private environment: our own HOME and XDG folders, 256 colours, no overrides.

    Nothing from the user's configuration, cache or colour settings leaks into the timings, and
    the benchmark never writes into the user's own folders.
    """
    for sub in ("config", "data", "cache", "state"):
        (home / sub).mkdir(parents=True, exist_ok=True)
    return {
        "PATH": os.environ.get("PATH", "/usr/bin:/bin"),
        "HOME": str(home),
        "LANG": "C.UTF-8",
        "TERM": "xterm-256color",
        "XDG_CONFIG_HOME": str(home / "config"),
        "XDG_DATA_HOME": str(home / "data"),
        "XDG_CACHE_HOME": str(home / "cache"),
        "XDG_STATE_HOME": str(home / "state"),
    }


def reset_state(env: dict[str, str]) -> None:
    """Empty the private state folder, so no run finds a draft or lock left by the one before.

    The cache folder is kept: a fellow's second start finds its caches warm too.
    """
    state = Path(env["XDG_STATE_HOME"])
    if state.exists():
        shutil.rmtree(state)
    state.mkdir(parents=True)


def workup_argv(*args: str) -> list[str]:
    """The installed ``workup`` console script (what the fellow types), with ``args``."""
    script = Path(sys.executable).parent / "workup"
    if script.exists():
        return [str(script), *args]
    return [sys.executable, "-m", "workup.cli", *args]


def baseline_argv(rows: int) -> list[str]:
    """The bare form started the same way: a Python script run by the same interpreter."""
    return [sys.executable, str(BARE_FORM), "--rows", str(rows)]


def minimal_argv() -> list[str]:
    """The minimal app (header, four inputs, a table, footer), started like the bare form."""
    return [sys.executable, str(MINIMAL_APP)]


def probe(args: list[str], env: dict[str, str], timeout: float = 60) -> dict[str, Any]:
    """Run bench.probe in a subprocess and return its JSON (raises RuntimeError on failure)."""
    env = {**env, "PYTHONPATH": str(ROOT)}
    done = subprocess.run(
        [sys.executable, "-m", "bench.probe", *args],
        capture_output=True,
        text=True,
        env=env,
        cwd=str(ROOT),
        timeout=timeout,
        check=False,
    )
    if done.returncode != 0:
        tail = (done.stderr.strip().splitlines() or ["no output"])[-1]
        raise RuntimeError(f"probe {' '.join(args[:1])} failed: {tail}")
    return json.loads(done.stdout)


def rows_for(widgets: int, fixed: int, per_row: int) -> int:
    """Label/input rows that give the bare form about ``widgets`` widgets in all."""
    return max(1, round((widgets - fixed) / per_row))


@dataclass
class RunResult:
    """One start-type-quit run."""

    settled_s: float
    """Start to the last byte of the settled first screen."""
    first_frame_s: float
    """Start to the end of the first full frame."""
    first_screen_bytes: int
    """Bytes written up to the settled first screen."""
    idle_bytes_per_s: float
    """Bytes per second while nothing is typed (a blinking cursor, a clock)."""
    key_bytes: int | None
    """Bytes written in answer to one digit, until quiet (None when no digit was typed)."""
    max_rss_mib: float
    """Peak resident memory of the process."""
    screen: str = ""
    """The last words on screen before quitting, escape sequences removed."""
    ready: str = ""
    """What the readiness check said ("" when there was none)."""
    exit_note: str = ""
    """Empty when the program quit by itself on Ctrl+Q; otherwise what happened."""
    tree_peak_mib: float | None = None
    """Peak summed PSS of the program and its helper processes, when sampled."""


def one_run(
    argv: list[str],
    env: dict[str, str],
    cwd: Path,
    *,
    pre_keys: list[bytes] | None = None,
    quit_keys: list[bytes] | None = None,
    type_digit: bool = True,
    idle_window: float = 2.0,
    timeout: float = 60,
    quiet: float = QUIET,
    ready: Callable[[bytes], str | None] | None = None,
    sample_tree: bool = False,
) -> RunResult:
    """Start ``argv`` in a pty, measure it as described in the module docstring, and quit it."""
    reset_state(env)
    s = Session(argv, env, str(cwd), sample_tree=sample_tree)
    s.start()
    try:
        settled = s.wait_settled(quiet, timeout)
        verdict = ""
        if ready is not None:
            # A screen may fall quiet while work goes on behind it (a worker reading a large
            # folder): keep waiting until the check says the screen is ready or failed.
            deadline = s.now() + timeout
            while not (verdict := ready(s.output()) or "") and s.now() < deadline:
                settled = s.wait_quiet(s.now(), quiet, max(deadline - s.now(), quiet * 2))
            verdict = verdict or f"not ready within {timeout:.0f} s"
        first = s.chunks[first_frame_index(s.chunks) or 0].t
        screen_bytes = bytes_between(s.chunks, 0.0, settled)
        # Skip the first moments after settling: Textual starts a cursor blinking only after a
        # pause, and the idle rate that matters over SSH is the steady one.
        s.pump(min(0.6, idle_window))
        idle_start = s.now()
        s.pump(idle_window)
        idle = bytes_between(s.chunks, idle_start, s.now()) / idle_window
        key_bytes = None
        if type_digit:
            for key in pre_keys or []:
                sent = s.send(key)
                s.wait_quiet(sent, quiet, timeout)
            # Type just after a cursor blink (if any) so the next blink falls outside the window:
            # a keystroke restarts Textual's blink timer.
            if s.wait_next(0.6):
                s.pump(0.03)
            sent = s.send(DIGIT)
            last = s.wait_quiet(sent, quiet, 10)
            key_bytes = bytes_between(s.chunks, sent, last)
        exited = s.quit(then=quit_keys or [])
    except BaseException:
        s.kill()
        raise
    exit_note = ""
    if not exited:
        # What was measured before Ctrl+Q stands; the runner reports how many runs hung.
        exit_note = f"still running 10 s after Ctrl+Q, killed; screen: {screen_text(s.output())}"
    elif s.exit_status != 0:
        code = os.waitstatus_to_exitcode(s.exit_status or 0)
        raise RuntimeError(
            f"{Path(argv[0]).name} exited with code {code} after Ctrl+Q: {screen_text(s.output())}"
        )
    return RunResult(
        settled_s=settled,
        first_frame_s=first,
        first_screen_bytes=screen_bytes,
        idle_bytes_per_s=idle,
        key_bytes=key_bytes,
        max_rss_mib=(s.max_rss_kib or 0) / 1024,
        screen=screen_text(s.output(), 400),
        ready=verdict,
        exit_note=exit_note,
        tree_peak_mib=s.tree_peak_kib / 1024 if s.tree_peak_kib else None,
    )


def paired_runs(
    app: list[str],
    baseline: list[str],
    env: dict[str, str],
    cwd: Path,
    pairs: int,
    *,
    app_keys: list[bytes] | None = None,
    app_quit_keys: list[bytes] | None = None,
    idle_window: float = 2.0,
) -> tuple[list[RunResult], list[RunResult]]:
    """``pairs`` runs of each, in alternating turns; one warm-up of each first (not kept)."""
    one_run(app, env, cwd, type_digit=False, quit_keys=app_quit_keys, idle_window=0.1)
    one_run(baseline, env, cwd, type_digit=False, idle_window=0.1)
    measured: list[RunResult] = []
    base: list[RunResult] = []
    for order in alternating_order(pairs):
        for who in order:
            if who == "measured":
                measured.append(
                    one_run(
                        app,
                        env,
                        cwd,
                        pre_keys=app_keys,
                        quit_keys=app_quit_keys,
                        idle_window=idle_window,
                    )
                )
            else:
                base.append(one_run(baseline, env, cwd, idle_window=idle_window))
    return measured, base


def library_run(cases_dir: Path, env: dict[str, str], cwd: Path, timeout: float = 180) -> RunResult:
    """Open the library screen on ``cases_dir`` and read its peak memory once it is listed.

    A longer silence (2 s) counts as settled here, since a large folder may be listed in steps,
    and the screen must show a generated case (or an error) before the run is ended.
    """
    return one_run(
        workup_argv("--cases", str(cases_dir)),
        env,
        cwd,
        type_digit=False,
        idle_window=0.5,
        timeout=timeout,
        quiet=2.0,
        ready=library_ready,
        sample_tree=True,
    )


# A generated case shows as its label ("... #00042") or its file name ("case-00042.yaml").
_GENERATED_LABEL = re.compile(rb"#\d{5}|case-\d{5}")
_LIBRARY_ERROR = re.compile(rb"cannot read the library[^\x1b]*")


def library_ready(output: bytes) -> str | None:
    """ "listed" once a generated case label is on screen, "error: ..." if the screen said so."""
    error = _LIBRARY_ERROR.search(output)
    if error:
        return "error: " + error.group(0).decode("utf-8", "replace").strip()
    if _GENERATED_LABEL.search(output):
        return "listed"
    return None


_ESCAPES = re.compile(rb"\x1b(\[[0-9;?<>=$]*[ -/]*[@-~]|\][^\x07]*\x07|[()][0-9A-Za-z]|.)")


def screen_text(output: bytes, limit: int = 160) -> str:
    """The last words a program wrote, escape sequences removed (for error messages)."""
    text = _ESCAPES.sub(b" ", output).decode("utf-8", "replace")
    return " ".join(text.split())[-limit:]


def make_private(folder: Path) -> Path:
    """Folder 0700 and its case files 0600, as a fellow's library on a shared server should be.

    The app warns about a folder other users can read; the benchmark measures the normal case,
    without that warning on screen.
    """
    folder.chmod(0o700)
    for p in folder.glob("*.yaml"):
        p.chmod(0o600)
    return folder


def copy_cases(src: Path, dst: Path) -> Path:
    """A private copy of the demo cases, so a run can never change the ones in the repository."""
    dst.mkdir(parents=True, exist_ok=True)
    for p in src.glob("*.yaml"):
        shutil.copy2(p, dst / p.name)
    return make_private(dst)
