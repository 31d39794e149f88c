"""Private folders and files, the warning with its exact fix, and no network code in the core."""

from __future__ import annotations

import ast
import os
import stat
import subprocess
from pathlib import Path

from workup.journal import drafts_folder, write_draft
from workup.locking import CaseLock
from workup.privacy import check_folder, ensure_library
from workup.storage import write_with_backup

CORE = Path(__file__).resolve().parents[2] / "workup"


def _mode(p: Path) -> int:
    return stat.S_IMODE(p.stat().st_mode)


def test_library_created_0700_even_with_a_permissive_umask(tmp_path):
    old = os.umask(0)
    try:
        assert ensure_library(tmp_path / "lib") == []
    finally:
        os.umask(old)
    assert _mode(tmp_path / "lib") == 0o700


def test_everything_a_session_writes_is_private(tmp_path, cases_dir):
    from workup.caseio import load_case

    old = os.umask(0)  # the most permissive umask a server could have
    try:
        lib = tmp_path / "lib"
        ensure_library(lib)
        case_path = lib / "case.yaml"
        case = load_case(cases_dir / "ckd-acidosis.yaml")
        write_with_backup(case_path, b"label: first\n")
        write_with_backup(case_path, b"label: second\n")
        lock = CaseLock.acquire(case_path)
        draft = write_draft(case_path, case, None)
    finally:
        os.umask(old)
    try:
        assert check_folder(lib) == []
        assert _mode(lock.path) == 0o600
        assert _mode(draft) == 0o600
        assert _mode(drafts_folder()) == 0o700
    finally:
        lock.release()


def test_an_open_folder_gets_the_exact_command_that_fixes_it(tmp_path):
    lib = tmp_path / "my cases"  # a space, so the command must quote
    lib.mkdir()
    os.chmod(lib, 0o755)
    (lib / "a.yaml").write_text("label: a\n")
    os.chmod(lib / "a.yaml", 0o644)
    (lib / "b.yaml").write_text("label: b\n")
    os.chmod(lib / "b.yaml", 0o600)
    (lib / "a.note.txt").write_text("a drafted note: patient data too")
    os.chmod(lib / "a.note.txt", 0o644)
    (lib / "sub").mkdir(mode=0o755)  # only the library folder itself is checked

    warnings = check_folder(lib)
    commands = [w.command for w in warnings]
    files = f"'{lib / 'a.note.txt'}' '{lib / 'a.yaml'}'"
    assert commands == [f"chmod 700 '{lib}'", f"chmod 600 {files}"]
    assert "every user" in warnings[0].message
    assert "a.yaml" in warnings[1].format()

    for command in commands:
        subprocess.run(["sh", "-c", command], check=True)
    assert check_folder(lib) == []


def test_group_readable_backups_are_reported(tmp_path):
    lib = tmp_path / "lib"
    ensure_library(lib)
    case = lib / "case.yaml"
    case.write_text("label: a\n")
    os.chmod(case, 0o600)
    backup = write_with_backup(case, b"label: b\n")
    assert backup is not None
    os.chmod(backup.path, 0o640)
    os.chmod(backup.path.parent, 0o750)
    warnings = check_folder(lib)
    assert any("backup folder" in w.message for w in warnings)
    files = [w for w in warnings if backup.path in w.paths]
    assert files and files[0].command.startswith("chmod 600 ")
    for w in warnings:
        subprocess.run(["sh", "-c", w.command], check=True)
    assert check_folder(lib) == []


def test_an_existing_open_library_is_reported_not_silently_changed(tmp_path):
    lib = tmp_path / "lib"
    lib.mkdir()
    os.chmod(lib, 0o750)
    warnings = ensure_library(lib)
    assert [w.command for w in warnings] == [f"chmod 700 {lib}"]
    assert "its group" in warnings[0].message
    assert _mode(lib) == 0o750


NETWORK_MODULES = {"urllib", "http", "requests", "httpx", "smtplib", "ftplib", "telnetlib"}
MINE = ("storage", "session", "journal", "locking", "roundtrip", "migrations", "privacy")


def test_nothing_leaves_the_machine():
    """No network client is imported; ``socket`` serves only gethostname (for lock details)."""
    for name in MINE:
        tree = ast.parse((CORE / f"{name}.py").read_text(encoding="utf-8"))
        for node in ast.walk(tree):
            if isinstance(node, ast.Import):
                mods = [a.name.split(".")[0] for a in node.names]
            elif isinstance(node, ast.ImportFrom):
                mods = [(node.module or "").split(".")[0]]
            else:
                mods = []
            assert not set(mods) & NETWORK_MODULES, (name, mods)
            if (
                isinstance(node, ast.Attribute)
                and isinstance(node.value, ast.Name)
                and node.value.id == "socket"
            ):
                assert node.attr == "gethostname", (name, node.attr)
