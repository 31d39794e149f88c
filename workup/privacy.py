"""Keeping cases private on a shared server: folders 0700, files 0600, and a check that says how.

Nothing here changes the mode of a folder or file that already exists: the user is told, with the
exact command to run, because silently changing a shared folder's mode could break someone else's
setup. Folders and files this package creates are private from the start (see workup.storage).
Nothing in this package sends data anywhere: there is no network code in the core.
"""

from __future__ import annotations

import shlex
import stat
from dataclasses import dataclass
from pathlib import Path

from workup.storage import BACKUP_DIR_NAME, DIR_MODE, FILE_MODE, make_private_dir

OPEN_BITS = 0o077
"""Any permission for the group or for others; a private file or folder has none."""


@dataclass(frozen=True, slots=True)
class PrivacyWarning:
    """Files or a folder that other users of the machine can reach, and the fix."""

    paths: tuple[Path, ...]
    """The folder, or the files, at fault."""
    message: str
    """What is wrong, in words."""
    command: str
    """The exact shell command that fixes it."""

    def format(self) -> str:
        """The message and the command on two lines."""
        return f"{self.message}\n  fix: {self.command}"


def mode_of(path: Path) -> int:
    """The permission bits of ``path`` (symlinks followed)."""
    return stat.S_IMODE(path.stat().st_mode)


def _who(mode: int) -> str:
    parts = []
    if mode & 0o070:
        parts.append("its group")
    if mode & 0o007:
        parts.append("every user")
    return " and ".join(parts)


def check_folder(folder: str | Path) -> list[PrivacyWarning]:
    """Warnings for ``folder``, its backup folder and every file in them that others can reach.

    Returns an empty list when everything is private (or the folder does not exist).
    """
    folder = Path(folder)
    if not folder.is_dir():
        return []
    warnings = []
    mode = mode_of(folder)
    if mode & OPEN_BITS:
        warnings.append(
            PrivacyWarning(
                (folder,),
                f"the folder {folder} is open to {_who(mode)} (mode {mode:o}); "
                "other users of this machine can list or read the cases in it",
                f"chmod {DIR_MODE:o} {shlex.quote(str(folder))}",
            )
        )
    open_dirs = [d for d in (folder / BACKUP_DIR_NAME,) if d.is_dir() and mode_of(d) & OPEN_BITS]
    if open_dirs:
        warnings.append(
            PrivacyWarning(
                tuple(open_dirs),
                f"the backup folder {open_dirs[0]} is open to other users",
                f"chmod {DIR_MODE:o} " + " ".join(shlex.quote(str(d)) for d in open_dirs),
            )
        )
    files = [p for p in _private_files(folder) if mode_of(p) & OPEN_BITS]
    if files:
        n = len(files)
        warnings.append(
            PrivacyWarning(
                tuple(files),
                f"{n} file{'s' if n != 1 else ''} in {folder} can be read by other users "
                f"({', '.join(p.name for p in files[:3])}{', …' if n > 3 else ''})",
                f"chmod {FILE_MODE:o} " + " ".join(shlex.quote(str(p)) for p in files),
            )
        )
    return warnings


def _private_files(folder: Path) -> list[Path]:
    # Every file counts, not only cases: drafted notes (NAME.note.txt), exports and backups
    # hold the same patient data.
    out = [p for p in sorted(folder.iterdir()) if p.is_file() and not p.is_symlink()]
    backups = folder / BACKUP_DIR_NAME
    if backups.is_dir():
        out += sorted(p for p in backups.iterdir() if p.is_file() and not p.is_symlink())
    return out


def ensure_library(folder: str | Path) -> list[PrivacyWarning]:
    """Create the case library ``folder`` 0700 if missing; warnings when an existing one is open."""
    folder = Path(folder)
    existed = folder.is_dir()
    make_private_dir(folder)
    return check_folder(folder) if existed else []
