"""A cross-check of the startup section under tmux: launch to a screen unchanged for 0.4 s.

The startup section plays the terminal itself and calls a screen settled when no byte has come
for 0.4 s. This check runs the same programs in a real terminal multiplexer instead and polls what
it shows (``tmux capture-pane``, colours included) every 20 ms, so "settled" means the visible
screen did not change for 0.4 s. Polling costs CPU and rounds times to the poll, so it is not
part of ``make bench``; it is there to confirm the two ways agree. Run:
``python -m bench.tmux_check [PAIRS]`` (default 5); prints one JSON object.
"""

from __future__ import annotations

import json
import shlex
import shutil
import subprocess
import sys
import tempfile
import time
from pathlib import Path

from bench import pty_bench
from bench.paths import DEMO_CASES
from bench.sections.terminal import CASE_FILE
from bench.stats import alternating_order, paired_ratios, summarize

QUIET = 0.4
"""Seconds the visible screen must stay the same."""
POLL = 0.02
"""Seconds between two looks at the screen."""
SOCKET = "workup-bench-tmux"
"""A private tmux server, so no user session is touched."""


def _tmux(*args: str) -> subprocess.CompletedProcess[str]:
    return subprocess.run(["tmux", "-L", SOCKET, *args], capture_output=True, text=True)


def settled_time(argv: list[str], env: dict[str, str], timeout: float = 60) -> float:
    """Seconds from launch until the pane first stays unchanged for QUIET s after showing text."""
    pty_bench.reset_state(env)
    exports = " ".join(f"{k}={shlex.quote(v)}" for k, v in env.items())
    command = f"env -i {exports} {shlex.join(argv)}"
    t0 = time.perf_counter()
    _tmux("new-session", "-d", "-s", "run", "-x", "80", "-y", "24", command)
    last_screen, last_change = "", 0.0
    try:
        while (now := time.perf_counter() - t0) < timeout:
            screen = _tmux("capture-pane", "-p", "-e", "-t", "run").stdout
            if screen != last_screen:
                last_screen, last_change = screen, now
            elif screen.strip() and now - last_change >= QUIET:
                return last_change
            time.sleep(POLL)
        raise TimeoutError(f"{argv[0]}: no settled screen within {timeout:.0f} s")
    finally:
        _tmux("send-keys", "-t", "run", "C-q")
        deadline = time.perf_counter() + 10
        while _tmux("has-session", "-t", "run").returncode == 0:
            if time.perf_counter() > deadline:
                _tmux("kill-session", "-t", "run")
                break
            time.sleep(0.05)


def run(pairs: int = 5) -> dict[str, object]:
    """Settled times of both first screens and the minimal app under tmux, pair by pair."""
    if shutil.which("tmux") is None:
        raise RuntimeError("tmux is not installed")
    with tempfile.TemporaryDirectory(prefix="workup-bench-tmux-") as tmp:
        env = pty_bench.bench_env(Path(tmp) / "home")
        cases = pty_bench.copy_cases(DEMO_CASES, Path(tmp) / "cases")
        programs = {
            "case": (pty_bench.workup_argv("--cases", str(cases), str(cases / CASE_FILE)), env),
            "library": (pty_bench.workup_argv(), {**env, "WORKUP_CASES": str(cases)}),
            "minimal": (pty_bench.minimal_argv(), env),
        }
        # A server that outlives each run, so no run pays for starting tmux itself.
        _tmux("new-session", "-d", "-s", "hold", "-x", "80", "-y", "24", "sleep 3600")
        try:
            for argv, e in programs.values():  # warm-up
                settled_time(argv, e)
            times: dict[str, list[tuple[float, float]]] = {"case": [], "library": []}
            for order in alternating_order(pairs):
                for shape in times:
                    got = {}
                    for who in order:
                        argv, e = programs[shape if who == "measured" else "minimal"]
                        got[who] = settled_time(argv, e)
                    times[shape].append((got["measured"], got["baseline"]))
        finally:
            _tmux("kill-server")
    out: dict[str, object] = {"pairs": pairs, "poll_s": POLL, "quiet_s": QUIET}
    for shape, pairs_ in times.items():
        ratios = paired_ratios([a for a, _ in pairs_], [b for _, b in pairs_])
        out[shape] = {
            "settled_s": [round(a, 3) for a, _ in pairs_],
            "minimal_s": [round(b, 3) for _, b in pairs_],
            "ratios": [round(r, 2) for r in ratios],
            "median_ratio": round(summarize(ratios).median, 2),
        }
    return out


def main(argv: list[str] | None = None) -> int:
    """Print the cross-check as one JSON object."""
    args = sys.argv[1:] if argv is None else argv
    print(json.dumps(run(int(args[0]) if args else 5)))
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
