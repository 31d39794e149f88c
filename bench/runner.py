"""``make bench``: every figure, its baseline from the same run, one table and a JSON file.

Sections run in turn (terminal, startup, recompute, library, memory), one module each under
bench/sections/. A section that cannot run yet (a piece of the app not built, a failure) yields
rows marked "not measured" with the reason, so the table never silently drops a figure. The
names the sections define stay importable from here.
"""

from __future__ import annotations

import json
import tempfile
import time
from collections.abc import Callable
from pathlib import Path
from typing import Any

from bench import machine
from bench.keys import key_bytes
from bench.paths import DEMO_CASES, RESULTS, ROOT
from bench.plan import FULL, QUICK, Plan
from bench.sections.library import (
    COLD_TARGET_FILES,
    LIBRARY_FIGURES,
    LIBRARY_SIZES,
    library_figures,
    library_rows,
    library_rows_from,
    library_samples,
)
from bench.sections.memory import MEMORY_FIGURES, MEMORY_LIBRARY, memory_rows
from bench.sections.recompute import RECOMPUTE_FIGURES, recompute_rows
from bench.sections.rows import missing_rows
from bench.sections.rows import paired_row as _paired_row
from bench.sections.startup import STARTUP_FIGURES, startup_rows
from bench.sections.terminal import (
    APP_KEYS,
    APP_QUIT_KEYS,
    CASE_FILE,
    TERMINAL_FIGURES,
    terminal_rows,
)
from bench.table import Row, render
from bench.target_report import target_lines

__all__ = [
    "APP_KEYS",
    "APP_QUIT_KEYS",
    "CASE_FILE",
    "COLD_TARGET_FILES",
    "DEMO_CASES",
    "FULL",
    "LIBRARY_FIGURES",
    "LIBRARY_SIZES",
    "MEMORY_FIGURES",
    "MEMORY_LIBRARY",
    "QUICK",
    "RECOMPUTE_FIGURES",
    "RESULTS",
    "ROOT",
    "SECTIONS",
    "TERMINAL_FIGURES",
    "Plan",
    "_paired_row",
    "guarded",
    "key_bytes",
    "library_figures",
    "library_rows",
    "library_rows_from",
    "library_samples",
    "memory_rows",
    "missing_rows",
    "recompute_rows",
    "run",
    "terminal_rows",
    "write_results",
]


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


SECTIONS = {
    "terminal": (TERMINAL_FIGURES, terminal_rows),
    "startup": (STARTUP_FIGURES, startup_rows),
    "recompute": (RECOMPUTE_FIGURES, recompute_rows),
    "library": (LIBRARY_FIGURES, library_rows),
    "memory": (MEMORY_FIGURES, memory_rows),
}


def run(
    plan: Plan, only: list[str] | None = None, log: Callable[..., None] = print
) -> dict[str, Any]:
    """Run the chosen sections (all by default) and return the results document."""
    started = time.perf_counter()
    info = machine.info()
    rows: list[Row] = []
    # Other work shares the two cores; the load at the start of each section says how much.
    info["load_by_section"] = {}
    with tempfile.TemporaryDirectory(prefix="workup-bench-") as tmp:
        for name, (figures, fn) in SECTIONS.items():
            if only and name not in only:
                continue
            info["load_by_section"][name] = machine.load_average()
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
        "targets": target_lines(rows),
    }


def write_results(doc: dict[str, Any], path: Path = RESULTS) -> Path:
    """Write the results document as JSON."""
    path.parent.mkdir(parents=True, exist_ok=True)
    path.write_text(json.dumps(doc, indent=2, ensure_ascii=False) + "\n", encoding="utf-8")
    return path
