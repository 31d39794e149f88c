"""Atomic private writes, backups of previous versions, and file fingerprints."""

from __future__ import annotations

import os
import stat
from pathlib import Path

import pytest

from workup import storage
from workup.storage import (
    BACKUP_GENERATIONS,
    atomic_write_bytes,
    atomic_write_text,
    backup_current,
    backup_folder,
    list_backups,
    read_with_fingerprint,
    remove_stale_temp_files,
    restore_backup,
    temp_files,
    write_with_backup,
)


def _mode(p: Path) -> int:
    return stat.S_IMODE(p.stat().st_mode)


def test_atomic_write_creates_a_private_file_with_the_content(tmp_path):
    target = tmp_path / "sub" / "case.yaml"
    atomic_write_text(target, "label: x\n")
    assert target.read_text() == "label: x\n"
    assert _mode(target) == 0o600
    assert temp_files(target.parent) == []


def test_atomic_write_makes_a_world_readable_file_private(tmp_path):
    target = tmp_path / "case.yaml"
    target.write_text("old")
    os.chmod(target, 0o644)
    atomic_write_text(target, "new")
    assert _mode(target) == 0o600


def test_a_failed_replace_keeps_the_old_file_and_leaves_no_temp(tmp_path, monkeypatch):
    target = tmp_path / "case.yaml"
    target.write_text("good version")

    def broken(src, dst):
        raise OSError("disk full")

    monkeypatch.setattr(storage.os, "replace", broken)
    with pytest.raises(OSError, match="disk full"):
        atomic_write_text(target, "new version")
    assert target.read_text() == "good version"
    assert temp_files(tmp_path) == []


def test_a_symlink_is_followed_and_kept(tmp_path):
    real = tmp_path / "real.yaml"
    real.write_text("old")
    link = tmp_path / "link.yaml"
    link.symlink_to(real)
    atomic_write_text(link, "new")
    assert link.is_symlink()
    assert real.read_text() == "new"


def test_stale_temp_files_are_removed_but_young_ones_kept(tmp_path):
    old = tmp_path / ".case.yaml.abc.tmp"
    young = tmp_path / ".case.yaml.def.tmp"
    old.write_text("partial")
    young.write_text("partial")
    os.utime(old, (0, 0))
    other = tmp_path / ".other.yaml.abc.tmp"
    other.write_text("someone else's")
    os.utime(other, (0, 0))
    assert remove_stale_temp_files(tmp_path, "case.yaml", older_than=60) == [old]
    assert temp_files(tmp_path) == [young, other]


def test_backup_keeps_the_previous_version_privately(tmp_path):
    case = tmp_path / "case.yaml"
    case.write_text("version 1")
    made = write_with_backup(case, b"version 2")
    assert made is not None and made.path.read_text() == "version 1"
    assert case.read_text() == "version 2"
    folder = backup_folder(case)
    assert folder == tmp_path / ".workup-backups"
    assert _mode(folder) == 0o700
    assert _mode(made.path) == 0o600


def test_no_backup_for_a_new_file(tmp_path):
    assert write_with_backup(tmp_path / "new.yaml", b"x") is None
    assert list_backups(tmp_path / "new.yaml") == []


def test_backups_are_listed_newest_first_and_pruned(tmp_path):
    case = tmp_path / "case.yaml"
    case.write_text("v0")
    for i in range(1, BACKUP_GENERATIONS + 3):
        write_with_backup(case, f"v{i}".encode())
    backups = list_backups(case)
    assert len(backups) == BACKUP_GENERATIONS
    contents = [b.path.read_text() for b in backups]
    last = BACKUP_GENERATIONS + 2
    assert contents == [f"v{i}" for i in range(last - 1, last - 1 - BACKUP_GENERATIONS, -1)]


def test_the_same_content_is_not_backed_up_twice(tmp_path):
    case = tmp_path / "case.yaml"
    case.write_text("same")
    first = backup_current(case)
    second = backup_current(case)
    assert first is not None and second is not None
    assert first.path == second.path
    assert len(list_backups(case)) == 1


def test_backups_of_another_case_with_a_longer_name_are_not_mixed_in(tmp_path):
    a = tmp_path / "a.yaml"
    b = tmp_path / "a.yaml.old.yaml"
    a.write_text("a")
    b.write_text("b")
    backup_current(a)
    backup_current(b)
    assert [x.path.read_text() for x in list_backups(a)] == ["a"]
    (backup_folder(a) / "a.yaml.notastamp.bak").write_text("junk")
    assert len(list_backups(a)) == 1


def test_restore_puts_a_backup_back_and_backs_up_what_it_replaces(tmp_path):
    case = tmp_path / "case.yaml"
    case.write_text("good")
    write_with_backup(case, b"mistake")
    good = list_backups(case)[0]
    restore_backup(good)
    assert case.read_text() == "good"
    assert list_backups(case)[0].path.read_text() == "mistake"


def test_fingerprint_tells_content_changes_not_touches(tmp_path):
    case = tmp_path / "case.yaml"
    atomic_write_bytes(case, b"abc")
    got = read_with_fingerprint(case)
    assert got is not None
    data, fp = got
    assert data == b"abc" and fp.size == 3
    os.utime(case, (1, 1))
    assert read_with_fingerprint(case)[1].sha256 == fp.sha256
    case.write_bytes(b"abd")
    assert read_with_fingerprint(case)[1].sha256 != fp.sha256
    assert read_with_fingerprint(tmp_path / "missing") is None
    assert storage.Fingerprint.from_json(fp.to_json()) == fp
