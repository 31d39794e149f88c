"""Writing files so that a crash or a dropped line never leaves half a case on disk.

Every write goes to a temporary file in the same folder, is flushed and fsynced, and then
replaces the target with ``os.replace`` (atomic on POSIX); the folder is fsynced after.
Files are created private (0600): cases hold patient data on a shared server.

Before a case file is replaced, its previous content is kept in ``.workup-backups/`` next to
it (a few generations, private), so a wrong save can be undone with :func:`restore_backup`.
"""

from __future__ import annotations

import contextlib
import hashlib
import os
import tempfile
import time
from dataclasses import dataclass
from datetime import UTC, datetime
from pathlib import Path

FILE_MODE = 0o600
DIR_MODE = 0o700
BACKUP_DIR_NAME = ".workup-backups"
"""Folder next to a case file holding its previous versions."""
BACKUP_GENERATIONS = 5
"""How many previous versions of each case file are kept."""
_STAMP = "%Y%m%dT%H%M%S.%fZ"


def atomic_write_text(path: str | Path, text: str) -> None:
    """Replace ``path`` with ``text`` atomically, creating it 0600."""
    atomic_write_bytes(path, text.encode("utf-8"))


def atomic_write_bytes(path: str | Path, data: bytes) -> None:
    """Replace ``path`` with ``data`` atomically, creating it 0600.

    A symbolic link is followed: its target is replaced and the link kept.
    """
    path = _target(Path(path))
    folder = path.parent
    folder.mkdir(parents=True, exist_ok=True, mode=DIR_MODE)
    fd, tmp = tempfile.mkstemp(dir=folder, prefix=f".{path.name}.", suffix=".tmp")
    try:
        with os.fdopen(fd, "wb") as fh:
            fh.write(data)
            fh.flush()
            os.fsync(fh.fileno())
        os.chmod(tmp, FILE_MODE)
        os.replace(tmp, path)
    except BaseException:
        with contextlib.suppress(OSError):
            os.unlink(tmp)
        raise
    _fsync_dir(folder)


def _target(path: Path) -> Path:
    # Replacing a symlink would turn it into a plain file and leave the real case untouched.
    return Path(os.path.realpath(path)) if path.is_symlink() else path


def _fsync_dir(folder: Path) -> None:
    try:
        fd = os.open(folder, os.O_RDONLY)
    except OSError:
        return
    try:
        os.fsync(fd)
    except OSError:
        pass
    finally:
        os.close(fd)


def make_private_dir(folder: str | Path) -> Path:
    """Create ``folder`` (and parents) if missing; a folder created here is made 0700.

    An existing folder's mode is left alone: :func:`workup.privacy.check_folder` reports it.
    """
    folder = Path(folder)
    if not folder.is_dir():
        folder.mkdir(parents=True, exist_ok=True, mode=DIR_MODE)
        # mkdir's mode is filtered by the umask; say exactly what we mean.
        os.chmod(folder, DIR_MODE)
    return folder


def temp_files(folder: str | Path, name: str = "*") -> list[Path]:
    """Temporary files an interrupted write of ``name`` left in ``folder`` (``.NAME.*.tmp``)."""
    folder = Path(folder)
    if not folder.is_dir():
        return []
    return sorted(p for p in folder.glob(f".{name}.*.tmp") if p.is_file())


def remove_stale_temp_files(
    folder: str | Path, name: str = "*", older_than: float = 600.0
) -> list[Path]:
    """Delete temporary files of ``name`` older than ``older_than`` seconds; returns them.

    Young ones are kept: another process may be writing them right now.
    """
    removed = []
    now = time.time()
    for p in temp_files(folder, name):
        with contextlib.suppress(OSError):
            if now - p.stat().st_mtime > older_than:
                p.unlink()
                removed.append(p)
    return removed


@dataclass(frozen=True, slots=True)
class Backup:
    """One previous version of a case file."""

    path: Path
    """Where the backup copy is stored."""
    original: Path
    """The case file it is a previous version of."""
    taken: datetime
    """When the version was replaced (UTC)."""
    size: int
    """Size in bytes."""


def backup_folder(case_path: str | Path) -> Path:
    """The backup folder of ``case_path`` (``.workup-backups`` next to it)."""
    return _target(Path(case_path)).parent / BACKUP_DIR_NAME


def backup_current(case_path: str | Path, generations: int = BACKUP_GENERATIONS) -> Backup | None:
    """Copy the current content of ``case_path`` into its backup folder; None if it is absent.

    Nothing is copied when the newest backup already holds the same bytes. Older backups beyond
    ``generations`` are removed.
    """
    case_path = _target(Path(case_path))
    try:
        data = case_path.read_bytes()
    except FileNotFoundError:
        return None
    existing = list_backups(case_path)
    if existing and _same_bytes(existing[0].path, data):
        return existing[0]
    folder = make_private_dir(backup_folder(case_path))
    taken = datetime.now(UTC)
    target = folder / f"{case_path.name}.{taken.strftime(_STAMP)}.bak"
    n = 1
    while target.exists():  # two saves in one microsecond
        target = folder / f"{case_path.name}.{taken.strftime(_STAMP)}-{n}.bak"
        n += 1
    atomic_write_bytes(target, data)
    for old in list_backups(case_path)[generations:]:
        with contextlib.suppress(OSError):
            old.path.unlink()
    return Backup(target, case_path, taken, len(data))


def _same_bytes(path: Path, data: bytes) -> bool:
    try:
        return path.read_bytes() == data
    except OSError:
        return False


def list_backups(case_path: str | Path) -> list[Backup]:
    """The backups of ``case_path``, newest first."""
    case_path = _target(Path(case_path))
    folder = backup_folder(case_path)
    if not folder.is_dir():
        return []
    prefix = f"{case_path.name}."
    out: list[tuple[datetime, int, Backup]] = []
    for p in folder.iterdir():
        name = p.name
        if not (name.startswith(prefix) and name.endswith(".bak")) or not p.is_file():
            continue
        stamp, _, n = name[len(prefix) : -len(".bak")].partition("-")
        try:
            taken = datetime.strptime(stamp, _STAMP).replace(tzinfo=UTC)
            seq = int(n) if n else 0
        except ValueError:
            continue  # someone else's file, or a case whose name extends this one
        out.append((taken, seq, Backup(p, case_path, taken, p.stat().st_size)))
    out.sort(key=lambda t: (t[0], t[1]), reverse=True)
    return [b for _, _, b in out]


def restore_backup(backup: Backup) -> Path:
    """Put ``backup`` back in place of its case file; the version it replaces is backed up first."""
    data = backup.path.read_bytes()
    backup_current(backup.original)
    atomic_write_bytes(backup.original, data)
    return backup.original


def write_with_backup(path: str | Path, data: bytes) -> Backup | None:
    """Back up the current ``path`` (if any), then replace it atomically with ``data``."""
    made = backup_current(path)
    atomic_write_bytes(path, data)
    return made


@dataclass(frozen=True, slots=True)
class Fingerprint:
    """What a file held when it was read: enough to tell later whether it changed."""

    sha256: str
    """Hex SHA-256 of the bytes; the content is what counts, not the timestamps."""
    size: int
    """Size in bytes."""
    mtime_ns: int
    """Modification time (nanoseconds) when read; shown to the user, not compared."""

    def to_json(self) -> dict[str, object]:
        """Plain data for a draft file."""
        return {"sha256": self.sha256, "size": self.size, "mtime_ns": self.mtime_ns}

    @classmethod
    def from_json(cls, data: object) -> Fingerprint | None:
        """Back from :meth:`to_json` data; None for None."""
        if data is None:
            return None
        if not isinstance(data, dict):
            raise ValueError("a fingerprint is a mapping")
        return cls(str(data["sha256"]), int(data["size"]), int(data["mtime_ns"]))


def read_with_fingerprint(path: str | Path) -> tuple[bytes, Fingerprint] | None:
    """The bytes of ``path`` and their fingerprint, read once; None when the file is absent."""
    try:
        with open(path, "rb") as fh:
            st = os.fstat(fh.fileno())
            data = fh.read()
    except FileNotFoundError:
        return None
    return data, Fingerprint(hashlib.sha256(data).hexdigest(), len(data), st.st_mtime_ns)
