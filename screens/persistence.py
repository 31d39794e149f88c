"""Every case-file read and write the app makes goes through here, so saving can change in one place.

For now this calls :mod:`workup.caseio` and :mod:`workup.storage` directly; the crash-safe save
(journal, backups, locks, conflict checks) will be wired in behind these same functions.
"""

from __future__ import annotations

import re
from pathlib import Path

from workup.caseio import CaseFileError, load_case, save_case
from workup.model import Case
from workup.storage import atomic_write_text

__all__ = [
    "CaseFileError",
    "free_path",
    "new_case_path",
    "note_path",
    "read_case",
    "write_case",
    "write_note",
]


def read_case(path: Path) -> Case:
    """Load the case at ``path``; raises CaseFileError with every problem in words."""
    return load_case(path)


def write_case(case: Case, path: Path) -> Path:
    """Save ``case`` to ``path`` (atomically, private); returns the path written."""
    return save_case(case, path)


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
