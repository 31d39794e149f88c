"""The case library: one summary row per case file, kept fast by a rebuildable index.

The YAML files stay the source of truth. :func:`list_library` scans a folder, re-reads only the
files whose size or modification time changed since the index last saw them (see
:mod:`workup.library_index`), and returns one :class:`LibraryEntry` per file. A file that fails
to load becomes an entry with its error; it never stops the listing.

This module is the library's front door: it opens the index and re-exports the names of the
modules that do the work, so callers keep one import path. Each of those holds one job:

- ``library_rows``: the entry and the index row it is read from (shared with the index);
- ``library_draws``: the stored draw values (the ``draws`` and ``numbers`` columns);
- ``library_read``: reading one file by the quick reader or one libyaml pass, with the checking
  loader as the fallback for every doubt;
- ``library_summary``: one file's row; ``library_pool``: many files' rows, over a process pool;
- ``library_scan``: the case files of a folder; ``library_listing``: ordering and wording.

Names with a leading underscore in those modules are shared among them only.

Nothing here imports anything heavy at import time: an unchanged repeat listing must not pay for
pydantic or the calculators.
"""

from __future__ import annotations

from pathlib import Path
from typing import Any

from workup.library_draws import (
    ANALYTE_STATUS_MEASURED,
    ANALYTE_STATUS_UNUSUAL,
    STATUS_CODE,
    DrawValues,
    draws_from_json,
    encode_draws,
)
from workup.library_listing import (
    SORT_KEYS,
    describe_leading,
    describe_pending,
    leading_cells,
    sort_entries,
    status_word,
)
from workup.library_pool import POOL_THRESHOLD, pool_allowed, summarize_many
from workup.library_read import _read_case as _read_case
from workup.library_rows import ROW_FIELDS, LibraryEntry, entry_from_row
from workup.library_rows import _entry_builder as _entry_builder
from workup.library_scan import CASE_SUFFIXES, scan_folder
from workup.library_summary import _loading_kind as _loading_kind
from workup.library_summary import comparable_time, summarize_case, summarize_file

__all__ = [
    "ANALYTE_STATUS_MEASURED",
    "ANALYTE_STATUS_UNUSUAL",
    "CASE_SUFFIXES",
    "POOL_THRESHOLD",
    "ROW_FIELDS",
    "SORT_KEYS",
    "STATUS_CODE",
    "DrawValues",
    "LibraryEntry",
    "comparable_time",
    "describe_leading",
    "describe_pending",
    "draws_from_json",
    "encode_draws",
    "entry_from_row",
    "leading_cells",
    "list_library",
    "open_library",
    "pool_allowed",
    "scan_folder",
    "sort_entries",
    "status_word",
    "summarize_case",
    "summarize_file",
    "summarize_many",
]
# Re-exported too, by the ``x as x`` imports above: _entry_builder, _loading_kind and _read_case,
# which tests and benchmarks reach for by this module's path.


def open_library(
    folder: Path,
    cache_file: Path | None = None,
    overrides: dict[str, float] | None = None,
    workers: int | None = None,
) -> Any:
    """The index of ``folder``, open and brought up to date (a LibraryIndex; close it after use).

    ``cache_file`` defaults to the per-user cache (see :func:`workup.library_index.cache_path`);
    ``overrides`` are the user's settings (the leading pattern depends on them).
    """
    import sqlite3

    from workup.library_index import LibraryIndex, cache_path, remove_index

    index = None
    for attempt in range(2):
        try:
            index = LibraryIndex.open(folder, cache_file, overrides or {})
            index.refresh(workers=workers)
            return index
        except sqlite3.DatabaseError:
            # Damaged while open (another process, a full disk): drop the cache and rebuild once.
            if index is not None:
                index.close()
            if attempt:
                raise
            remove_index(cache_file or cache_path(folder, overrides))
    raise AssertionError("unreachable")


def list_library(
    folder: Path,
    cache_file: Path | None = None,
    overrides: dict[str, float] | None = None,
    workers: int | None = None,
) -> list[LibraryEntry]:
    """Every case file under ``folder``, by name, re-reading only what changed since last time."""
    index = open_library(folder, cache_file, overrides, workers)
    try:
        return index.entries()
    finally:
        index.close()
