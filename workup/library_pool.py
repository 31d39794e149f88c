"""Summarizing many case files: in this process, or spread over a process pool when they are many.

Each chunk of files goes through :func:`workup.library_summary.summarize_file`; the index
(workup.library_index) stores the rows as the chunks finish.
"""

from __future__ import annotations

import os
import sys
import threading
from collections.abc import Iterable
from pathlib import Path
from typing import Any

from workup.library_summary import summarize_file

POOL_THRESHOLD = 150
"""Fewer files than this to (re)index are read in-process: a pool costs more than it saves."""


def _summarize_chunk(
    folder: str, items: list[tuple[str, int, int]], overrides: dict[str, float]
) -> list[tuple[Any, ...]]:
    """Pool worker: rows for a chunk of (name, size, mtime_ns)."""
    return [summarize_file(folder, n, s, m, overrides) for n, s, m in items]


def pool_allowed() -> bool:
    """True when this process may start a process pool itself.

    Not from a process running other threads (the terminal app): forking it can deadlock a
    child, and spawning fails under the app's captured standard streams. Such a process builds
    a large index in a helper process instead (see workup.library_index).
    """
    return threading.active_count() == 1


def _guided_chunks(items: list[Any], workers: int, size: int = 100) -> list[list[Any]]:
    """``items`` in chunks of ``size`` that shrink towards the end, so that every process
    finishes within a few files of the others; even the smallest costs far more than its trip
    through the pool."""
    out, i, n = [], 0, len(items)
    while i < n:
        step = max(8, min(size, (n - i) // (4 * workers)))
        out.append(items[i : i + step])
        i += step
    return out


def summarize_many(
    folder: Path,
    items: list[tuple[str, int, int]],
    overrides: dict[str, float],
    workers: int | None = None,
) -> Iterable[list[tuple[Any, ...]]]:
    """Rows for ``items``, in chunks as they finish; with a process pool when there are many.

    ``workers`` counts this process: it reads its share of the chunks between storing the
    others' results, so a pool for two cores is one child. A third process would only compete
    with the two readers for the cores and hold memory of its own.
    """
    cpus = os.cpu_count() or 1
    workers = cpus if workers is None else workers
    if workers <= 1 or len(items) < POOL_THRESHOLD or not pool_allowed():
        # Chunks, so that an interrupted build keeps what it has done.
        for i in range(0, len(items), 400):
            yield _summarize_chunk(str(folder), items[i : i + 400], overrides)
        return
    import multiprocessing
    from collections import deque
    from concurrent.futures import ProcessPoolExecutor

    # fork shares the already-imported core for free (Linux); elsewhere spawn.
    method = "fork" if sys.platform.startswith("linux") else "spawn"
    # Warm the imports once before forking, so each child starts ready.
    if method == "fork":
        import workup.assess
        import workup.caseio  # noqa: F401
    chunks = deque(_guided_chunks(items, workers))
    children = workers - 1
    ctx = multiprocessing.get_context(method)
    with ProcessPoolExecutor(max_workers=children, mp_context=ctx) as pool:
        queued: deque[tuple[Any, list[tuple[str, int, int]]]] = deque()
        while chunks or queued:
            while queued and queued[0][0].done():
                yield queued.popleft()[0].result()
            # Keep every child several chunks ahead: it is fed only between this process's own
            # chunks, and a child left waiting is a core lost.
            while chunks and len(queued) < 4 * children:
                chunk = chunks.popleft()
                queued.append((pool.submit(_summarize_chunk, str(folder), chunk, overrides), chunk))
            if chunks:
                yield _summarize_chunk(str(folder), chunks.popleft(), overrides)
            elif queued:
                # Nothing left to take here: take back a queued chunk no child has started yet
                # rather than wait for it.
                fut, chunk = queued[-1]
                if fut.cancel():
                    queued.pop()
                    yield _summarize_chunk(str(folder), chunk, overrides)
                else:
                    yield queued.popleft()[0].result()
