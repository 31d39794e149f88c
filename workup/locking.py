"""A lock per case file, so two sessions editing one case learn of each other.

The lock is ``.NAME.lock`` next to the case. It is held with ``flock``, which the kernel drops the
moment the holding process dies (SIGKILL, a dropped SSH line), so a lock can never be left held by
a dead session. The file also holds who took it (pid, user, host, time) as JSON, readable by the
next session: a lock file whose ``flock`` is free but which still names a holder is a stale lock,
taken over with a note saying whose session ended without closing.

``filelock`` is not used: it opens its lock file with O_TRUNC, which would erase the holder's
details while the holder is still running.
"""

from __future__ import annotations

import contextlib
import errno
import fcntl
import getpass
import json
import os
import socket
import time
from dataclasses import asdict, dataclass
from datetime import UTC, datetime
from pathlib import Path

from workup.storage import FILE_MODE


@dataclass(frozen=True, slots=True)
class LockInfo:
    """Who holds (or held) a case's lock."""

    pid: int
    """Process id of the holding session."""
    user: str
    """Login name of the user running it."""
    host: str
    """Host name of the machine it runs on."""
    since: str
    """When it took the lock (ISO 8601, UTC)."""

    def describe(self) -> str:
        """``user@host (pid N) since TIME`` for messages."""
        return f"{self.user}@{self.host} (pid {self.pid}) since {self.since}"

    @classmethod
    def here(cls) -> LockInfo:
        """Details of this process."""
        return cls(
            pid=os.getpid(),
            user=current_user(),
            host=socket.gethostname(),
            since=datetime.now(UTC).isoformat(timespec="seconds"),
        )


def current_user() -> str:
    """The login name of this process's user (the uid when it has no name)."""
    try:
        return getpass.getuser()
    except (KeyError, OSError):  # no passwd entry (containers)
        return str(os.getuid())


class CaseLockedError(RuntimeError):
    """Another running session holds the case's lock."""

    def __init__(self, case_path: Path, holder: LockInfo | None):
        self.case_path = case_path
        self.holder = holder
        who = holder.describe() if holder else "another session (details unreadable)"
        super().__init__(f"{case_path} is open in {who}")


def lock_path(case_path: str | Path) -> Path:
    """The lock file of ``case_path``."""
    case_path = Path(case_path)
    return case_path.parent / f".{case_path.name}.lock"


def _read_info(fd: int) -> LockInfo | None:
    try:
        raw = os.pread(fd, 4096, 0)
        data = json.loads(raw.decode("utf-8"))
        return LockInfo(
            pid=int(data["pid"]),
            user=str(data["user"]),
            host=str(data["host"]),
            since=str(data["since"]),
        )
    except (OSError, ValueError, KeyError, TypeError, UnicodeDecodeError):
        return None


def pid_alive(pid: int) -> bool:
    """Whether a process with ``pid`` exists on this machine."""
    if pid <= 0:
        return False
    try:
        os.kill(pid, 0)
    except ProcessLookupError:
        return False
    except PermissionError:  # exists, belongs to someone else
        return True
    return True


class CaseLock:
    """A held lock on one case file; release it with :meth:`release` (or ``with``)."""

    def __init__(self, case_path: Path, fd: int, info: LockInfo, took_over: LockInfo | None):
        self.case_path = case_path
        """The case file locked."""
        self.path = lock_path(case_path)
        """The lock file."""
        self.info = info
        """Our own details as written in the lock file."""
        self.took_over = took_over
        """The holder named in a stale lock we took over, or None."""
        self._fd: int | None = fd

    @property
    def note(self) -> str | None:
        """A sentence for the user when a stale lock was taken over, else None."""
        t = self.took_over
        if t is None:
            return None
        note = (
            f"took over the lock of {t.describe()}: that session ended without closing "
            "(a crash or a dropped line); look for its unsaved edits among the drafts"
        )
        if t.host == self.info.host and t.pid != self.info.pid and pid_alive(t.pid):
            note += f" (pid {t.pid} now belongs to another program)"
        return note

    @property
    def held(self) -> bool:
        """True until released."""
        return self._fd is not None

    @classmethod
    def acquire(cls, case_path: str | Path) -> CaseLock:
        """Take the lock of ``case_path``; raises CaseLockedError when a live session holds it."""
        case_path = Path(case_path)
        path = lock_path(case_path)
        busy = 0
        for _ in range(40):
            fd = os.open(path, os.O_RDWR | os.O_CREAT | os.O_CLOEXEC, FILE_MODE)
            try:
                fcntl.flock(fd, fcntl.LOCK_EX | fcntl.LOCK_NB)
            except OSError as exc:
                holder = _read_info(fd)
                os.close(fd)
                if exc.errno not in (errno.EWOULDBLOCK, errno.EAGAIN, errno.EACCES):
                    raise
                # A probe by current_holder() holds the flock for microseconds: look again
                # a few times before calling the case taken.
                busy += 1
                if busy >= 5:
                    raise CaseLockedError(case_path, holder) from None
                time.sleep(0.01)
                continue
            # The holder before us may have unlinked the file between our open and our flock:
            # then we hold a lock on a file nobody else will see; start again.
            try:
                same = os.path.samestat(os.fstat(fd), os.stat(path))
            except FileNotFoundError:
                same = False
            if not same:
                os.close(fd)
                continue
            stale = _read_info(fd)
            info = LockInfo.here()
            payload = json.dumps(asdict(info)).encode("utf-8")
            os.ftruncate(fd, 0)
            os.pwrite(fd, payload, 0)
            os.fsync(fd)
            return cls(case_path, fd, info, stale)
        raise OSError(f"could not take the lock {path}: it keeps being replaced")

    def release(self) -> None:
        """Remove the lock file and drop the lock; safe to call twice."""
        fd, self._fd = self._fd, None
        if fd is None:
            return
        # Unlink while still holding the flock, so nobody sees a lock-free file naming us.
        with contextlib.suppress(OSError):
            if os.path.samestat(os.fstat(fd), os.stat(self.path)):
                os.unlink(self.path)
        os.close(fd)

    def __enter__(self) -> CaseLock:
        return self

    def __exit__(self, *exc: object) -> None:
        self.release()


def current_holder(case_path: str | Path) -> LockInfo | None:
    """The live session holding ``case_path``'s lock, or None when nobody holds it.

    Probes the lock without keeping it and without creating a lock file.
    """
    path = lock_path(case_path)
    try:
        # Read-only is enough for flock, and works on a lock file another user owns.
        fd = os.open(path, os.O_RDONLY | os.O_CLOEXEC)
    except FileNotFoundError:
        return None
    try:
        try:
            fcntl.flock(fd, fcntl.LOCK_EX | fcntl.LOCK_NB)
        except OSError:
            return _read_info(fd) or LockInfo(0, "?", "?", "?")
        fcntl.flock(fd, fcntl.LOCK_UN)
        return None
    finally:
        os.close(fd)
