"""Every case-file read and write the app makes goes through here, so saving can change in one place.

Cases are opened through a :class:`workup.session.CaseSession`: the case's lock is held while it is
open, unsaved edits are journaled to a draft, a save refuses to overwrite a file that changed on
disk (``SaveConflict``) and keeps the replaced version as a backup, and the file's own comments and
key order survive a save (the session's round-trip save). The screens call only this module.
"""

from __future__ import annotations

import re
from pathlib import Path
from typing import TYPE_CHECKING, Any

from workup.caseio import CaseFileError, load_case, save_case
from workup.journal import Draft, discard_draft, pending_drafts
from workup.locking import CaseLockedError, current_holder
from workup.model import Case
from workup.storage import Backup, atomic_write_text, list_backups, restore_backup

if TYPE_CHECKING:
    from workup.session import CaseSession, ReadOnlyError, SaveConflict, SaveResult

_FROM_SESSION = ("CaseSession", "ReadOnlyError", "SaveConflict", "SaveResult")


def __getattr__(name: str) -> Any:
    # The session module brings the round-trip YAML writer (ruamel) with it: the library and
    # the start-up list of drafts do not need it, so it is imported when a case is opened.
    if name in _FROM_SESSION:
        from workup import session

        return getattr(session, name)
    raise AttributeError(f"module {__name__!r} has no attribute {name!r}")


__all__ = [
    "Backup",
    "CaseFileError",
    "CaseLockedError",
    "CaseSession",
    "Draft",
    "ReadOnlyError",
    "SaveConflict",
    "SaveResult",
    "backups_of",
    "create_session",
    "discard_draft",
    "free_path",
    "new_case_path",
    "new_session",
    "note_path",
    "open_session",
    "pending_drafts",
    "put_back",
    "read_case",
    "restore_draft",
    "write_case",
    "write_note",
]


def read_case(path: Path) -> Case:
    """Load the case at ``path`` without a session; raises CaseFileError with every problem."""
    return load_case(path)


def write_case(case: Case, path: Path) -> Path:
    """Save ``case`` to ``path`` without a session (atomically, private); returns the path."""
    return save_case(case, path)


def open_session(path: Path, *, read_only: bool = False) -> CaseSession:
    """Open the case file at ``path`` with its lock (or without, read-only).

    Raises CaseFileError when it cannot be read, CaseLockedError when another running session
    holds it (unless ``read_only``).
    """
    from workup.session import CaseSession

    return CaseSession.open(path, read_only=read_only)


def create_session(path: Path, case: Case) -> CaseSession:
    """A session for ``case`` to be saved at ``path``, which must not exist yet."""
    from workup.session import CaseSession

    return CaseSession.create(path, case)


def restore_draft(draft: Draft) -> CaseSession:
    """Reopen a left-over draft's case with its edits as the current, unsaved version."""
    from workup.session import CaseSession

    return CaseSession.restore(draft)


def new_session(
    cases_dir: Path, label: str, case: Case, keep: CaseSession | None = None
) -> CaseSession:
    """A session for a not-yet-saved case, at the first free file name for ``label``.

    A name is free when no file has it and no running session holds it (two new cases in one
    app both start as ``new-case.yaml`` otherwise). ``keep`` is returned unchanged when its
    path is that free name.
    """
    from workup.session import CaseSession

    stem = _slug(label)
    n = 1
    while True:
        candidate = cases_dir / (f"{stem}.yaml" if n == 1 else f"{stem}-{n}.yaml")
        n += 1
        if keep is not None and keep.path == candidate.resolve():
            return keep
        if candidate.exists() or current_holder(candidate) is not None:
            continue
        try:
            return CaseSession.create(candidate, case)
        except (FileExistsError, CaseLockedError):
            continue  # taken between the look and the lock


def backups_of(path: Path) -> list[Backup]:
    """The kept previous versions of the case file ``path``, newest first."""
    return list_backups(path)


def put_back(backup: Backup) -> Path:
    """Put a backup back as its case file (the version it replaces is backed up first)."""
    return restore_backup(backup)


def _slug(text: str) -> str:
    slug = re.sub(r"[^a-z0-9]+", "-", text.lower()).strip("-")
    return slug[:60].strip("-") or "case"


def free_path(folder: Path, stem: str, suffix: str) -> Path:
    """``folder/stem.suffix``, or ``stem-2``, ``stem-3``… when that name is taken."""
    candidate = folder / f"{stem}{suffix}"
    n = 2
    while candidate.exists():
        candidate = folder / f"{stem}-{n}{suffix}"
        n += 1
    return candidate


def new_case_path(cases_dir: Path, label: str) -> Path:
    """A file name in ``cases_dir`` for a case labelled ``label`` that no other file uses."""
    return free_path(cases_dir, _slug(label), ".yaml")


def note_path(case_path: Path | None, cases_dir: Path, label: str) -> Path:
    """Where the drafted note of a case goes: beside the case file, named after it."""
    if case_path is not None:
        return free_path(case_path.parent, f"{case_path.stem}.note", ".txt")
    return free_path(cases_dir, f"{_slug(label)}.note", ".txt")


def write_note(text: str, path: Path) -> Path:
    """Write the note text to ``path`` (atomically, private); returns the path written."""
    atomic_write_text(path, text if text.endswith("\n") else text + "\n")
    return path
