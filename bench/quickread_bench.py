"""Timing of workup.quickread.parse against PyYAML's C loader over generated case texts.

The texts (invented cases from :func:`bench.library_bench.case_text`) are made first and held in
memory, so only parsing is timed. Each text is distinct, as in a real library: the first pass of
parse starts with empty memos and pays for every new scalar once; a second pass over the same
texts shows the best case (every piece already seen) and is reported apart, not as the result.

Run: ``python -m bench.quickread_bench [N]`` (default 2000 texts, best of 5 rounds).
"""

from __future__ import annotations

import json
import random
import sys
import time

import yaml

from bench.library_bench import _templates, case_text
from workup import quickread

try:
    from yaml import CSafeLoader as _Loader
except ImportError:  # pragma: no cover - depends on how PyYAML was built
    from yaml import SafeLoader as _Loader  # type: ignore[assignment]


def _clear_memos() -> None:
    for memo in (
        quickread._SCALARS,
        quickread._LINES,
        quickread._MAP_ITEMS,
        quickread._SEQ_ITEMS,
        quickread._KEYS,
    ):
        memo.clear()


def run(n: int = 2000, rounds: int = 5) -> dict[str, float | int]:
    """Microseconds per file: C loader, parse from empty memos, parse with warm memos."""
    templates = _templates()
    rng = random.Random(1)
    texts = [case_text(templates[i % len(templates)], i, rng) for i in range(n)]
    declined = sum(quickread.parse(t) is None for t in texts)
    c_best = cold_best = warm_best = float("inf")
    for _ in range(rounds):
        t0 = time.perf_counter()
        for t in texts:
            yaml.load(t, Loader=_Loader)
        c_best = min(c_best, time.perf_counter() - t0)
        _clear_memos()
        t0 = time.perf_counter()
        for t in texts:
            quickread.parse(t)
        cold_best = min(cold_best, time.perf_counter() - t0)
        t0 = time.perf_counter()
        for t in texts:
            quickread.parse(t)
        warm_best = min(warm_best, time.perf_counter() - t0)
    return {
        "files": n,
        "declined": declined,
        "csafeloader_us": round(1e6 * c_best / n, 1),
        "parse_us": round(1e6 * cold_best / n, 1),
        "speedup": round(c_best / cold_best, 2),
        "parse_warm_us": round(1e6 * warm_best / n, 1),
    }


def main(argv: list[str] | None = None) -> int:
    """Print one JSON row."""
    args = sys.argv[1:] if argv is None else argv
    print(json.dumps(run(int(args[0]) if args else 2000)))
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
