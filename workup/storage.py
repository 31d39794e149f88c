"""Writing files so that a crash or a dropped line never leaves half a case on disk.

Every write goes to a temporary file in the same folder, is flushed and fsynced, and then
replaces the target with ``os.replace`` (atomic on POSIX); the folder is fsynced after.
Files are created private (0600): cases hold patient data on a shared server.
"""

from __future__ import annotations

import contextlib
import os
import tempfile
from pathlib import Path

FILE_MODE = 0o600
DIR_MODE = 0o700


def atomic_write_text(path: str | Path, text: str) -> None:
    """Replace ``path`` with ``text`` atomically, creating it 0600."""
    atomic_write_bytes(path, text.encode("utf-8"))


def atomic_write_bytes(path: str | Path, data: bytes) -> None:
    """Replace ``path`` with ``data`` atomically, creating it 0600."""
    path = Path(path)
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
