"""The library index: an SQLite cache of case summaries, keyed by file name, size and mtime (ns).

It lives in the per-user cache folder (``platformdirs.user_cache_path("workup")/library``, which
honours XDG_CACHE_HOME), one file per library folder and settings, and holds nothing that cannot
be rebuilt from the case files: it may be deleted at any time. It is rebuilt silently when it is
missing, corrupt, or was written by another index schema or another version of the code that
computes the summaries. Many readers may use it at once (WAL journal); each batch of writes is
one short ``BEGIN IMMEDIATE`` transaction, so a second writer waits rather than interleaves.
"""

from __future__ import annotations

import contextlib
import functools
import hashlib
import json
import os
import sqlite3
from dataclasses import dataclass
from pathlib import Path
from typing import Any

from workup import __version__
from workup.library_draws import DrawValues, draws_from_json
from workup.library_pool import POOL_THRESHOLD, pool_allowed, summarize_many
from workup.library_rows import ROW_FIELDS, LibraryEntry, entry_from_row, listing_json
from workup.library_scan import scan_folder
from workup.library_summary import summarize_file

INDEX_SCHEMA = 5
"""Bump when the table layout or the meaning of a column changes."""

_CORE = Path(__file__).resolve().parent
_LIST_COLUMNS = ", ".join(ROW_FIELDS[:-2])
_STORED = (*ROW_FIELDS, "listing")
"""The stored columns: a summary row, then its ``workup list --json`` object as text."""
_TYPE = {
    **dict.fromkeys(("n_draws", "pending", "loading_expected", "has_loading"), "INTEGER"),
    "numbers": "BLOB",
}
_CREATE = f"""
CREATE TABLE meta (key TEXT PRIMARY KEY, value TEXT NOT NULL);
CREATE TABLE cases (
    name TEXT PRIMARY KEY, size INTEGER NOT NULL, mtime_ns INTEGER NOT NULL, ok INTEGER NOT NULL,
    {", ".join(f"{f} {_TYPE.get(f, 'TEXT')}" for f in ROW_FIELDS[4:])},
    listing TEXT NOT NULL
);
"""


@dataclass(frozen=True, slots=True)
class RefreshStats:
    """What one refresh did."""

    read: int
    """Files (re)read because they were new or changed."""
    removed: int
    """Entries dropped because their file is gone."""
    unchanged: int
    """Files served from the index."""
    rebuilt: bool
    """True when the index was created afresh (missing, stale or corrupt)."""


def cache_dir() -> Path:
    """The folder holding library indexes."""
    from platformdirs import user_cache_path

    return user_cache_path("workup", appauthor=False) / "library"


def cache_path(folder: Path, overrides: dict[str, float] | None = None) -> Path:
    """The index file for ``folder`` under the user's settings ``overrides``."""
    key = json.dumps([str(Path(folder).resolve()), sorted((overrides or {}).items())])
    return cache_dir() / f"index-{hashlib.sha1(key.encode()).hexdigest()[:16]}.sqlite"


@functools.lru_cache(maxsize=1)
def engine_stamp() -> str:
    """Identifies the code that computes summaries: schema, version and the core's source files.

    A changed calculator changes the stamp, so an index never serves summaries computed by other
    code. Computed once per process so that one run sees one stamp.
    """
    h = hashlib.sha1(f"{INDEX_SCHEMA}|{__version__}".encode())
    for p in sorted(_CORE.rglob("*.py")):
        with contextlib.suppress(OSError):
            st = p.stat()
            h.update(f"{p.relative_to(_CORE)}|{st.st_size}|{st.st_mtime_ns}".encode())
    return h.hexdigest()


def remove_index(path: Path) -> None:
    """Delete the index file at ``path`` with its WAL and shared-memory files."""
    for p in (path, path.with_name(path.name + "-wal"), path.with_name(path.name + "-shm")):
        with contextlib.suppress(OSError):
            p.unlink()


def _private_file(path: Path) -> None:
    """Create the index file readable by its owner only: it holds case labels and notes.

    SQLite gives its -wal and -shm files the same permissions as the database file.
    """
    path.parent.mkdir(mode=0o700, parents=True, exist_ok=True)
    if not path.exists():
        os.close(os.open(path, os.O_CREAT | os.O_WRONLY, 0o600))


def _connect(path: Path | str) -> sqlite3.Connection:
    conn = sqlite3.connect(str(path), timeout=10.0, isolation_level=None)
    conn.execute("PRAGMA journal_mode=WAL")
    conn.execute("PRAGMA synchronous=NORMAL")
    return conn


def _current(conn: sqlite3.Connection, stamp: str) -> bool:
    """True when the tables exist and were written for ``stamp``; raises DatabaseError if corrupt."""
    tables = {r[0] for r in conn.execute("SELECT name FROM sqlite_master WHERE type='table'")}
    if not {"meta", "cases"} <= tables:
        return False
    row = conn.execute("SELECT value FROM meta WHERE key='stamp'").fetchone()
    if row is None or row[0] != stamp:
        return False
    conn.execute("SELECT count(*) FROM cases").fetchone()
    return True


def _reset(conn: sqlite3.Connection, stamp: str) -> None:
    conn.execute("BEGIN IMMEDIATE")
    try:
        if _current(conn, stamp):  # another process rebuilt it while we waited for the lock
            conn.execute("COMMIT")
            return
        conn.execute("DROP TABLE IF EXISTS cases")
        conn.execute("DROP TABLE IF EXISTS meta")
        for stmt in _CREATE.split(";"):
            if stmt.strip():
                conn.execute(stmt)
        conn.execute("INSERT INTO meta VALUES ('stamp', ?)", (stamp,))
        conn.execute("COMMIT")
    except BaseException:
        conn.execute("ROLLBACK")
        raise


class LibraryIndex:
    """The cached summaries of one library folder."""

    def __init__(
        self,
        folder: Path,
        conn: sqlite3.Connection,
        overrides: dict[str, float],
        location: Path | None,
        rebuilt: bool,
    ) -> None:
        self.folder = Path(folder)
        self.conn = conn
        self.overrides = overrides
        self.location = location
        """The index file, or None when it had to be kept in memory (cache not writable)."""
        self._rebuilt = rebuilt
        self._fresh: dict[str, tuple[Any, ...]] | None = None
        """Listing rows of the last refresh, when it read every file itself."""
        self._fresh_json: dict[str, str] = {}
        """Their ``--json`` objects as text, by name."""

    @classmethod
    def open(
        cls,
        folder: Path,
        cache_file: Path | None = None,
        overrides: dict[str, float] | None = None,
    ) -> LibraryIndex:
        """Open (creating, or rebuilding when stale or corrupt) the index of ``folder``."""
        overrides = dict(overrides or {})
        path = Path(cache_file) if cache_file is not None else cache_path(folder, overrides)
        stamp = engine_stamp()
        for _attempt in range(2):
            conn = None
            try:
                _private_file(path)
                conn = _connect(path)
                rebuilt = not _current(conn, stamp)
                if rebuilt:
                    _reset(conn, stamp)
                return cls(folder, conn, overrides, path, rebuilt)
            except sqlite3.DatabaseError:
                # Corrupt or not a database at all: it is only a cache, start again.
                if conn is not None:
                    conn.close()
                remove_index(path)
            except OSError:
                break
        # The cache folder is unusable (read-only home, full disk): index in memory this time.
        conn = _connect(":memory:")
        _reset(conn, stamp)
        return cls(folder, conn, overrides, None, True)

    def __enter__(self) -> LibraryIndex:
        return self

    def __exit__(self, *exc: object) -> None:
        self.close()

    def close(self) -> None:
        """Close the connection."""
        self.conn.close()

    def refresh(self, workers: int | None = None) -> RefreshStats:
        """Bring the index up to date with the folder: read new and changed files, drop gone ones."""
        on_disk = scan_folder(self.folder)
        known = {
            n: (s, m) for n, s, m in self.conn.execute("SELECT name, size, mtime_ns FROM cases")
        }
        todo = [(n, s, m) for n, (s, m) in sorted(on_disk.items()) if known.get(n) != (s, m)]
        gone = [n for n in known if n not in on_disk]
        if (
            len(todo) >= POOL_THRESHOLD
            and workers != 1
            and (os.cpu_count() or 1) > 1
            and not pool_allowed()
            and self.location is not None
            and build_in_helper(self.folder, self.location, self.overrides)
        ):
            # The helper process filled the index using every core; read only what is left.
            known = {
                n: (s, m) for n, s, m in self.conn.execute("SELECT name, size, mtime_ns FROM cases")
            }
            read_by_helper = len(todo)
            todo = [(n, s, m) for n, s, m in todo if known.get(n) != (s, m)]
        else:
            read_by_helper = 0
        insert = f"INSERT OR REPLACE INTO cases ({', '.join(_STORED)}) VALUES ({', '.join('?' * len(_STORED))})"
        if gone:
            self._write(
                lambda c: c.executemany("DELETE FROM cases WHERE name=?", [(n,) for n in gone])
            )
        fresh: dict[str, tuple[Any, ...]] = {}
        fresh_json: dict[str, str] = {}
        if todo:
            pending: list[tuple[Any, ...]] = []
            folder = self.folder
            for rows in summarize_many(self.folder, todo, self.overrides, workers):
                for r in rows:
                    fresh[r[0]] = r[:-2]
                    text = fresh_json[r[0]] = listing_json(entry_from_row(folder, r[:-2]))
                    pending.append((*r, text))
                # A few hundred rows per transaction: fewer commits, and an interrupted build
                # still keeps nearly all it has read.
                if len(pending) >= 400:
                    self._write(lambda c, rows=pending: c.executemany(insert, rows))
                    pending = []
            if pending:
                self._write(lambda c, rows=pending: c.executemany(insert, rows))
        # When this process read every file, the listing needs nothing back from the database.
        self._fresh = fresh if len(fresh) == len(on_disk) else None
        self._fresh_json = fresh_json
        read = max(read_by_helper, len(todo))
        stats = RefreshStats(read, len(gone), len(on_disk) - read, self._rebuilt)
        self._rebuilt = False
        return stats

    def _write(self, fn: Any) -> None:
        self.conn.execute("BEGIN IMMEDIATE")
        try:
            fn(self.conn)
            self.conn.execute("COMMIT")
        except BaseException:
            self.conn.execute("ROLLBACK")
            raise

    def entries(self) -> list[LibraryEntry]:
        """Every indexed case, by file name."""
        if self._fresh is not None:
            fresh = self._fresh
            return [entry_from_row(self.folder, fresh[n]) for n in sorted(fresh)]
        rows = self.conn.execute(f"SELECT {_LIST_COLUMNS} FROM cases ORDER BY name")
        return [entry_from_row(self.folder, r) for r in rows]

    def listing(self, reverse: bool = False) -> list[tuple[str, bool]]:
        """(``workup list --json`` object as text, loaded?) of every case in the listing's file
        order (as ``sort_entries(..., "file", reverse)``: by name, files that did not load last),
        without building an entry per case."""
        if self._fresh is not None:
            fresh, text = self._fresh, self._fresh_json
            ordered = sorted(fresh, reverse=reverse)
            ordered.sort(key=lambda n: not fresh[n][3])  # stable: name order kept within each
            return [(text[n], bool(fresh[n][3])) for n in ordered]
        way = "DESC" if reverse else "ASC"
        rows = self.conn.execute(f"SELECT listing, ok FROM cases ORDER BY ok = 0, name {way}")
        return [(text, bool(ok)) for text, ok in rows]

    def draws(self, names: list[str] | None = None) -> dict[str, list[DrawValues]]:
        """The stored per-draw numbers of ``names`` (default: every case), for search conditions."""
        if names is not None and len(names) <= 500:  # SQLite caps the number of parameters
            marks = ", ".join("?" * len(names))
            rows = self.conn.execute(
                f"SELECT name, draws, numbers FROM cases WHERE name IN ({marks})", names
            )
        else:
            wanted = None if names is None else set(names)
            rows = (
                r
                for r in self.conn.execute("SELECT name, draws, numbers FROM cases WHERE ok=1")
                if wanted is None or r[0] in wanted
            )
        out = {}
        for n, d, b in rows:
            try:
                out[n] = draws_from_json(d, b)
            except (ValueError, KeyError, TypeError, IndexError):
                # A damaged row: the file is the source of truth, read it again.
                out[n] = self._reread_draws(n)
        return out

    def _reread_draws(self, name: str) -> list[DrawValues]:
        try:
            st = (self.folder / name).stat()
        except OSError:
            return []
        row = dict(
            zip(
                ROW_FIELDS,
                summarize_file(self.folder, name, st.st_size, st.st_mtime_ns, self.overrides),
                strict=True,
            )
        )
        return draws_from_json(row["draws"], row["numbers"])


def build_in_helper(folder: Path, location: Path, overrides: dict[str, float]) -> bool:
    """Bring the index at ``location`` up to date from a separate, single-threaded process.

    Used by processes that may not start a pool themselves (see workup.library_pool.pool_allowed);
    the helper may. Returns False when the helper failed (the caller then reads serially).
    """
    import subprocess
    import sys

    cmd = [sys.executable, "-m", "workup.library_index", str(folder), str(location)]
    try:
        done = subprocess.run(
            cmd,
            input=json.dumps(overrides),
            text=True,
            stdout=subprocess.DEVNULL,
            stderr=subprocess.DEVNULL,
            check=False,
            timeout=3600,
        )
    except (OSError, subprocess.SubprocessError):
        return False
    return done.returncode == 0


def _helper_main(argv: list[str]) -> int:
    """``python -m workup.library_index FOLDER INDEX`` with the settings as JSON on stdin."""
    import sys

    folder, location = Path(argv[0]), Path(argv[1])
    overrides = {str(k): float(v) for k, v in json.loads(sys.stdin.read() or "{}").items()}
    with LibraryIndex.open(folder, location, overrides) as index:
        index.refresh()
    return 0


if __name__ == "__main__":
    import sys

    raise SystemExit(_helper_main(sys.argv[1:]))
