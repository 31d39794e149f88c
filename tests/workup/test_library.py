"""The library index: listing, broken and changed files, rebuild after deletion or corruption.

Libraries are generated from the demo cases with varied values (invented data, see
bench/library_bench.py).
"""

from __future__ import annotations

import os
import sqlite3
import threading
from pathlib import Path

import pytest

from bench.library_bench import generate_library
from tests.workup.helpers.library_files import BROKEN, _cache, _write_broken
from workup import library as lib
from workup.caseio import CaseFileError, load_case
from workup.library import list_library
from workup.library_index import LibraryIndex, cache_path, engine_stamp


def test_lists_every_file_with_a_summary(library: Path, tmp_path: Path) -> None:
    entries = list_library(library, _cache(tmp_path), workers=1)
    assert [e.name for e in entries] == sorted(p.name for p in library.glob("*.yaml"))
    assert all(e.ok and e.label and e.n_draws >= 1 for e in entries)
    first = load_case(library / entries[0].name)
    assert entries[0].label == first.label
    latest = first.latest_draw()
    assert entries[0].latest_draw == latest.label
    assert entries[0].latest_taken == latest.taken.isoformat(timespec="minutes")


def test_broken_files_are_listed_with_the_loaders_error(library: Path, tmp_path: Path) -> None:
    _write_broken(library)
    entries = {e.name: e for e in list_library(library, _cache(tmp_path), workers=1)}
    assert len(entries) == 30 + len(BROKEN) + 2
    for name in [*BROKEN, "latin1.yaml", "nul.yaml"]:
        e = entries[name]
        assert not e.ok, name
        with pytest.raises(CaseFileError) as info:
            load_case(library / name)
        # Same words as the checking loader, with the library-relative name.
        assert e.error == str(info.value).replace(str(library / name), name)
        assert e.error.startswith(name)
    assert sum(e.ok for e in entries.values()) == 30


def test_lean_reading_agrees_with_the_checking_loader(library: Path) -> None:
    # Includes files the lean path must hand back: '&' and '!' in notes are harmless text.
    (library / "amp.yaml").write_text(
        'schema: 1\nlabel: "Bed 3 & 4!"\nnotes: "K* fell"\n', encoding="utf-8"
    )
    for path in sorted(library.glob("*.yaml")):
        assert lib._read_case(path) == load_case(path), path.name


def test_plain_case_files_take_the_one_pass_path(library: Path, monkeypatch) -> None:
    from workup import caseio

    def refuse(path: object) -> None:
        raise AssertionError(f"the checking loader was used for {path}")

    monkeypatch.setattr(caseio, "load_case", refuse)
    case = lib._read_case(library / "case-00003.yaml")
    assert case.label.endswith("#00003")
    with pytest.raises(AssertionError, match="checking loader"):
        (library / "odd.yaml").write_text("schema: 1\nlabel: A & B\n", encoding="utf-8")
        lib._read_case(library / "odd.yaml")


def test_second_listing_reads_nothing_and_a_changed_file_is_reread(
    library: Path, tmp_path: Path
) -> None:
    cache = _cache(tmp_path)
    with LibraryIndex.open(library, cache) as idx:
        first = idx.refresh(workers=1)
    assert (first.read, first.unchanged, first.rebuilt) == (30, 0, True)
    with LibraryIndex.open(library, cache) as idx:
        again = idx.refresh(workers=1)
    assert (again.read, again.removed, again.unchanged, again.rebuilt) == (0, 0, 30, False)

    target = library / "case-00004.yaml"
    text = target.read_text(encoding="utf-8")
    target.write_text(text.replace("#00004", "#00004 edited"), encoding="utf-8")
    (library / "case-00005.yaml").unlink()
    with LibraryIndex.open(library, cache) as idx:
        stats = idx.refresh(workers=1)
        entries = {e.name: e for e in idx.entries()}
    assert (stats.read, stats.removed) == (1, 1)
    assert entries["case-00004.yaml"].label.endswith("#00004 edited")
    assert "case-00005.yaml" not in entries


def test_a_file_broken_then_fixed_between_runs(library: Path, tmp_path: Path) -> None:
    cache = _cache(tmp_path)
    target = library / "case-00002.yaml"
    good = target.read_text(encoding="utf-8")
    target.write_text(good + "label: twice\n", encoding="utf-8")
    broken = {e.name: e for e in list_library(library, cache, workers=1)}["case-00002.yaml"]
    assert not broken.ok and "appears twice" in (broken.error or "")
    target.write_text(good, encoding="utf-8")
    os.utime(target, ns=(broken.mtime_ns + 10**9, broken.mtime_ns + 10**9))
    fixed = {e.name: e for e in list_library(library, cache, workers=1)}["case-00002.yaml"]
    assert fixed.ok and fixed.error is None


def test_rebuilt_silently_after_the_cache_is_deleted(library: Path, tmp_path: Path) -> None:
    cache = _cache(tmp_path)
    before = list_library(library, cache, workers=1)
    for p in cache.parent.iterdir():
        p.unlink()
    after = list_library(library, cache, workers=1)
    assert after == before
    assert cache.exists()


@pytest.mark.parametrize("damage", ["garbage", "truncated", "empty"])
def test_rebuilt_silently_after_the_cache_is_corrupted(
    library: Path, tmp_path: Path, damage: str
) -> None:
    cache = _cache(tmp_path)
    before = list_library(library, cache, workers=1)
    for extra in ("-wal", "-shm"):
        Path(str(cache) + extra).unlink(missing_ok=True)
    data = cache.read_bytes()
    if damage == "garbage":
        cache.write_bytes(b"this is not a database" * 200)
    elif damage == "truncated":
        cache.write_bytes(data[: len(data) // 3])
    else:
        cache.write_bytes(b"")
    assert list_library(library, cache, workers=1) == before
    with sqlite3.connect(cache) as conn:
        assert conn.execute("PRAGMA integrity_check").fetchone()[0] == "ok"


def test_rebuilt_when_written_by_another_schema_or_code(library: Path, tmp_path: Path) -> None:
    cache = _cache(tmp_path)
    list_library(library, cache, workers=1)
    with sqlite3.connect(cache) as conn:
        conn.execute("UPDATE meta SET value='written-by-an-older-version' WHERE key='stamp'")
        conn.execute("UPDATE cases SET label='stale label'")
    with LibraryIndex.open(library, cache) as idx:
        stats = idx.refresh(workers=1)
        labels = {e.label for e in idx.entries()}
    assert stats.rebuilt and stats.read == 30
    assert "stale label" not in labels
    with sqlite3.connect(cache) as conn:
        assert conn.execute("SELECT value FROM meta").fetchone()[0] == engine_stamp()


def test_default_cache_lives_under_xdg_cache_home(library: Path, tmp_path: Path) -> None:
    home = Path(os.environ["XDG_CACHE_HOME"])  # set per test by tests/conftest.py
    path = cache_path(library)
    assert path.is_relative_to(home / "workup")
    list_library(library, workers=1)
    assert path.exists()
    # Settings change the leading pattern, so they get their own index.
    assert cache_path(library, {"anion_gap_upper": 12.0}) != path


def test_the_index_is_private_to_its_owner(library: Path, tmp_path: Path) -> None:
    cache = tmp_path / "private" / "index.sqlite"
    list_library(library, cache, workers=1)
    for p in cache.parent.iterdir():
        assert p.stat().st_mode & 0o077 == 0, p.name  # holds labels and notes
    assert cache.parent.stat().st_mode & 0o077 == 0


def test_a_folder_link_that_loops_is_not_followed(library: Path, tmp_path: Path) -> None:
    (library / "loop").symlink_to(library, target_is_directory=True)
    assert len(list_library(library, _cache(tmp_path), workers=1)) == 30


def test_an_unwritable_cache_falls_back_to_memory(library: Path, tmp_path: Path) -> None:
    blocker = tmp_path / "not-a-folder"
    blocker.write_text("x", encoding="utf-8")
    with LibraryIndex.open(library, blocker / "index.sqlite") as idx:
        idx.refresh(workers=1)
        assert idx.location is None
        assert len(idx.entries()) == 30


def test_subfolders_are_listed_by_relative_name(library: Path, tmp_path: Path) -> None:
    (library / "2025").mkdir()
    (library / "case-00001.yaml").rename(library / "2025" / "moved.yaml")
    (library / ".hidden").mkdir()
    (library / "readme.txt").write_text("not a case", encoding="utf-8")
    names = [e.name for e in list_library(library, _cache(tmp_path), workers=1)]
    assert "2025/moved.yaml" in names
    assert len(names) == 30 and not any("readme" in n or "hidden" in n for n in names)


def test_concurrent_listings_share_one_cache(library: Path, tmp_path: Path) -> None:
    cache = _cache(tmp_path)
    results: list[int] = []
    errors: list[BaseException] = []

    def work() -> None:
        try:
            results.append(len(list_library(library, cache, workers=1)))
        except BaseException as exc:  # collected and failed below
            errors.append(exc)

    threads = [threading.Thread(target=work) for _ in range(4)]
    for t in threads:
        t.start()
    for t in threads:
        t.join()
    assert errors == [] and results == [30, 30, 30, 30]


def test_a_reader_sees_a_consistent_index_while_another_writes(
    library: Path, tmp_path: Path
) -> None:
    cache = _cache(tmp_path)
    list_library(library, cache, workers=1)
    reader = LibraryIndex.open(library, cache)
    try:
        reader.conn.execute("BEGIN")
        before = reader.entries()
        (library / "case-00000.yaml").unlink()
        assert len(list_library(library, cache, workers=1)) == 29
        assert reader.entries() == before  # its snapshot holds until it ends its read
        reader.conn.execute("COMMIT")
        assert len(reader.entries()) == 29
    finally:
        reader.close()


def test_a_process_pool_gives_the_same_rows(tmp_path: Path) -> None:
    folder = tmp_path / "many"
    generate_library(folder, lib.POOL_THRESHOLD + 10, seed=3)
    _write_broken(folder)
    pooled = list_library(folder, tmp_path / "a.sqlite", workers=2)
    serial = list_library(folder, tmp_path / "b.sqlite", workers=1)
    assert pooled == serial
    assert sum(not e.ok for e in pooled) == len(BROKEN) + 2


def test_a_threaded_process_builds_a_large_index_in_a_helper(tmp_path: Path, monkeypatch) -> None:
    # The terminal app runs threads, so it may not fork a pool; a helper process does it.
    import workup.library_index as li

    def not_here(*_a: object, **_k: object) -> None:
        raise AssertionError("read in this process, not in the helper")

    folder = tmp_path / "many"
    generate_library(folder, lib.POOL_THRESHOLD + 5, seed=4)
    _write_broken(folder)
    stop = threading.Event()
    other = threading.Thread(target=stop.wait)
    other.start()
    try:
        assert not lib.pool_allowed()
        with LibraryIndex.open(folder, tmp_path / "a.sqlite") as idx:
            monkeypatch.setattr(li, "summarize_many", not_here)
            stats = idx.refresh()
            helped = idx.entries()
    finally:
        stop.set()
        other.join()
        monkeypatch.undo()
    assert stats.read == lib.POOL_THRESHOLD + 5 + len(BROKEN) + 2
    assert helped == list_library(folder, tmp_path / "b.sqlite", workers=1)
