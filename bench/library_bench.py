"""Benchmark of the case library: cold, warm and one-file-changed listings against a YAML baseline.

The library is generated into a temporary folder from the demo cases in ``cases/`` with varied
values, labels and dates (invented data). The baseline is the time PyYAML's C loader
(CSafeLoader) needs just to parse the same files in one process, measured in the same run, so the
ratio does not depend on how busy the machine is at another moment. Each listing is timed as a
fresh ``workup list --json`` process with its own empty cache folder, so the cold figure pays
for the interpreter, the imports and printing every row, as a fellow's first listing does.

``--shape varied`` uses the second library shape instead (bench/varied_library.py: 1–6 draws,
notes of several lines, comments, SI files, mixed sizes).

Run alone: ``python -m bench.library_bench [--shape demo|varied] [SIZE ...]``; a runner calls
:func:`run`.
"""

from __future__ import annotations

import json
import os
import random
import re
import subprocess
import sys
import tempfile
import time
from datetime import datetime, timedelta
from pathlib import Path
from typing import Any

import yaml

ROOT = Path(__file__).resolve().parent.parent
DEMO_CASES = ROOT / "cases"

try:
    from yaml import CSafeLoader as _Loader
except ImportError:  # pragma: no cover - depends on how PyYAML was built
    from yaml import SafeLoader as _Loader  # type: ignore[assignment]

_NUMBER = re.compile(r"^(-?\d+(?:\.\d+)?)(.*)$")
# Values whose spread must stay small so a generated case stays physiologically possible.
_TIGHT = {"ph": 0.03, "sodium": 0.03, "chloride": 0.04, "osmolality": 0.03}


def _templates() -> list[dict[str, Any]]:
    out = []
    for path in sorted(DEMO_CASES.glob("*.yaml")):
        with path.open("rb") as fh:
            out.append(yaml.load(fh, Loader=_Loader))
    return out


def _vary(key: str, value: Any, rng: random.Random) -> Any:
    """``value`` (a number or "number unit") moved by a few percent, same decimals and unit."""
    text = str(value)
    m = _NUMBER.match(text)
    if m is None or key == "sample":
        return value
    number, rest = m.group(1), m.group(2)
    decimals = len(number.split(".")[1]) if "." in number else 0
    spread = _TIGHT.get(key, 0.10)
    x = float(number)
    if key == "ph":
        moved = x + rng.uniform(-spread, spread)
    else:
        moved = x * (1 + rng.uniform(-spread, spread))
    if x >= 0:
        moved = max(moved, 0.0)
    new = f"{moved:.{decimals}f}"
    return f"{new}{rest}" if rest else new


def _flow(mapping: dict[str, Any]) -> str:
    return "{" + ", ".join(f"{k}: {v}" for k, v in mapping.items()) + "}"


def case_text(template: dict[str, Any], index: int, rng: random.Random) -> str:
    """One invented case file derived from ``template``, written like the demo cases."""
    start = datetime(2025, 1, 1) + timedelta(minutes=rng.randrange(0, 700 * 24 * 60))
    lines = [
        "# Invented case generated for benchmarks and tests (not a real patient).",
        "schema: 1",
        "label: " + json.dumps(f"{template['label']} #{index:05d}"),
    ]
    patient = dict(template.get("patient") or {})
    if "age" in patient:
        patient["age"] = max(18, min(95, int(patient["age"]) + rng.randint(-10, 10)))
    if patient:
        lines.append("patient: " + _flow(patient))
    if template.get("units"):
        lines.append(f"units: {template['units']}")
    if template.get("context"):
        lines.append("context: [" + ", ".join(template["context"]) + "]")
    if template.get("notes"):
        lines.append("notes: " + json.dumps(template["notes"]))
    lines.append("draws:")
    first = None
    for draw in template.get("draws") or []:
        lines.append("  - label: " + json.dumps(draw["label"]))
        taken = draw.get("taken")
        if taken is not None:
            taken = datetime.fromisoformat(str(taken))
            first = first or taken
            when = start + (taken - first)
            lines.append(f"    taken: {when.isoformat(timespec='minutes')}")
        if draw.get("during"):
            lines.append(f"    during: {draw['during']}")
        for panel in ("serum", "blood_gas", "urine"):
            values = draw.get(panel)
            if values:
                varied = {k: _vary(k, v, rng) for k, v in values.items()}
                lines.append(f"    {panel}: " + _flow(varied))
    return "\n".join(lines) + "\n"


def generate_library(folder: Path, n: int, seed: int = 1) -> list[Path]:
    """Write ``n`` invented case files into ``folder``; returns their paths in name order."""
    rng = random.Random(seed)
    templates = _templates()
    folder.mkdir(parents=True, exist_ok=True)
    paths = []
    for i in range(n):
        t = templates[i % len(templates)]
        path = folder / f"case-{i:05d}.yaml"
        path.write_text(case_text(t, i, rng), encoding="utf-8")
        paths.append(path)
    return paths


def yaml_baseline(paths: list[Path]) -> float:
    """Seconds for CSafeLoader to read and parse every file in one process."""
    t0 = time.perf_counter()
    for p in paths:
        with p.open("rb") as fh:
            yaml.load(fh, Loader=_Loader)
    return time.perf_counter() - t0


def _timed(fn, *args: Any, **kwargs: Any) -> tuple[float, Any]:
    t0 = time.perf_counter()
    out = fn(*args, **kwargs)
    return time.perf_counter() - t0, out


def per_file_costs(folder: Path, names: list[str]) -> dict[str, float]:
    """Milliseconds per file, in one process, of each step of indexing ``names``.

    Separates what the index does itself (reading and validating, summarizing, storing) from the
    assessment it calls (the calculators and the pattern ranking), so a slow cold build can be
    traced to its cause.
    """
    from workup import library as lib
    from workup.assess import assess

    paths = [folder / n for n in names]
    n = max(1, len(paths))
    t_yaml = yaml_baseline(paths)
    t0 = time.perf_counter()
    cases = [lib._read_case(p) for p in paths]
    t_read = time.perf_counter() - t0
    t0 = time.perf_counter()
    for c in cases:
        assess(c, None, {})
    t_assess = time.perf_counter() - t0
    t0 = time.perf_counter()
    for name in names:
        st = (folder / name).stat()
        lib.summarize_file(folder, name, st.st_size, st.st_mtime_ns)
    t_all = time.perf_counter() - t0
    return {
        "yaml_parse_ms": round(1000 * t_yaml / n, 3),
        "read_and_validate_ms": round(1000 * t_read / n, 3),
        "assess_ms": round(1000 * t_assess / n, 3),
        "whole_row_ms": round(1000 * t_all / n, 3),
    }


def listing_process(folder: Path, cache_home: Path) -> tuple[float, int, int]:
    """Seconds for one ``workup list FOLDER --json`` process, as a fellow runs it (interpreter
    start, imports, the index and printing every row), with the index cache in ``cache_home``;
    also the number of cases listed and how many loaded."""
    env = dict(os.environ, XDG_CACHE_HOME=str(cache_home))
    cmd = [sys.executable, "-m", "workup.cli", "list", str(folder), "--json"]
    t0 = time.perf_counter()
    done = subprocess.run(cmd, env=env, capture_output=True, check=True)
    seconds = time.perf_counter() - t0
    rows = json.loads(done.stdout)
    return seconds, len(rows), sum(1 for r in rows if r["ok"])


SHAPES = ("demo", "varied")
"""The library shapes: ``demo`` (this module's generator) and ``varied`` (bench/varied_library)."""


def generate(shape: str, folder: Path, n: int) -> list[Path]:
    """Write a library of ``n`` invented cases of ``shape`` into ``folder``."""
    if shape == "varied":
        from bench.varied_library import generate_varied_library

        return generate_varied_library(folder, n)
    if shape != "demo":
        raise ValueError(f"unknown library shape {shape!r}; choose from {SHAPES}")
    return generate_library(folder, n)


def run(sizes: tuple[int, ...] = (1000, 10000), shape: str = "demo") -> list[dict]:
    """One result row per library size: baseline, cold, warm and one-changed seconds and ratios.

    Each listing is a fresh ``workup list`` process; the baseline is parsed in this process.
    """
    rows = []
    for n in sizes:
        with tempfile.TemporaryDirectory(prefix="workup-bench-") as tmp:
            folder = Path(tmp) / "cases"
            cache_home = Path(tmp) / "cache"
            paths = generate(shape, folder, n)
            load_before = os.getloadavg()[0]
            baseline = yaml_baseline(paths)
            cold, listed, ok = listing_process(folder, cache_home)
            warm, _, _ = listing_process(folder, cache_home)
            changed = paths[n // 2]
            changed.write_text(changed.read_text(encoding="utf-8") + "# edited\n", "utf-8")
            one, after, _ = listing_process(folder, cache_home)
            rows.append(
                {
                    "bench": "library",
                    "shape": shape,
                    "files": n,
                    "megabytes": round(sum(p.stat().st_size for p in paths) / 1e6, 2),
                    "cases_ok": ok,
                    "cpus": os.cpu_count(),
                    # Other work on the machine slows the pool more than the one-process baseline.
                    "load_avg_1min": [round(load_before, 2), round(os.getloadavg()[0], 2)],
                    "yaml_parse_s": round(baseline, 3),
                    "cold_s": round(cold, 3),
                    "cold_over_yaml": round(cold / baseline, 2),
                    "target_cold_over_yaml": 1.5,
                    "warm_s": round(warm, 3),
                    "target_warm_s": 0.5,
                    "one_changed_s": round(one, 3),
                    "target_one_changed_s": 1.0,
                    "listed": listed,
                    "listed_after_change": after,
                    "per_file_one_process": per_file_costs(
                        folder, [p.name for p in paths[: min(n, 500)]]
                    ),
                }
            )
    return rows


def main(argv: list[str] | None = None) -> int:
    """Print one JSON row per size (sizes from the command line, default 1000 and 10000)."""
    args = list(sys.argv[1:] if argv is None else argv)
    shape = "demo"
    if "--shape" in args:
        at = args.index("--shape")
        shape = args[at + 1]
        del args[at : at + 2]
    sizes = tuple(int(a) for a in args) or (1000, 10000)
    for row in run(sizes, shape):
        print(json.dumps(row))
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
