"""Driving a program in a real pseudo-terminal and timing what it writes, as an SSH user sees it.

The parent plays the terminal: it sets the window size, answers the one query that tells us where
frames begin and end, records every chunk the program writes with its arrival time, sends keys and
collects the child's resource usage when it exits. The pure parts (when is the screen "settled",
how many bytes fell in a window) are separate functions so they can be tested without a pty.
"""

from __future__ import annotations

import contextlib
import errno
import fcntl
import os
import pty
import select
import signal
import struct
import termios
import threading
import time
from collections.abc import Mapping, Sequence
from dataclasses import dataclass, field
from pathlib import Path

ALT_SCREEN_ON = b"\x1b[?1049h"
"""Sent by a full-screen program before its first frame."""
SYNC_QUERY = b"\x1b[?2026$p"
"""DECRQM query for synchronized output (mode 2026)."""
SYNC_REPLY = b"\x1b[?2026;2$y"
"""Our answer: supported and currently reset, as most current terminal emulators answer."""
SYNC_END = b"\x1b[?2026l"
"""End of one synchronized frame; with the reply above, each repaint ends with this."""
CTRL_Q = b"\x11"
"""Ctrl+Q, the quit key of both the app and the baseline."""

FIRST_FRAME_BYTES = 2000
"""Without frame markers, this many bytes after the alternate screen count as a first frame.

A choice of this harness: the first 80x24 screens in 256 colours measured here are about 20 KB
(docs/benchmarks.md), so 2000 bytes is already paint, not just mode switches.
"""


@dataclass(frozen=True, slots=True)
class Chunk:
    """One read from the pty master."""

    t: float
    """Seconds since the child was started (perf_counter based)."""
    data: bytes
    """The bytes read."""


def first_frame_index(chunks: Sequence[Chunk], min_bytes: int = FIRST_FRAME_BYTES) -> int | None:
    """Index of the chunk that completes the first frame, or None if no frame has been seen.

    A frame is complete at the first end-of-sync marker after the alternate screen, or, for a
    terminal program that does not use synchronized output, once ``min_bytes`` have arrived after
    the switch to the alternate screen.
    """
    buf = bytearray()
    alt_end: int | None = None
    for i, c in enumerate(chunks):
        # Markers may straddle two reads, so each search starts a little before the new bytes.
        start = max(0, len(buf) - 16)
        buf += c.data
        if alt_end is None:
            pos = buf.find(ALT_SCREEN_ON, start)
            if pos < 0:
                continue
            alt_end = pos + len(ALT_SCREEN_ON)
        if buf.find(SYNC_END, max(alt_end, start)) >= 0:
            return i
        if len(buf) - alt_end >= min_bytes:
            return i
    return None


def settled_index(chunks: Sequence[Chunk], quiet: float, now: float) -> int | None:
    """Index of the last chunk before the output first went quiet for ``quiet`` seconds.

    Only gaps after the first frame count. ``now`` is the current time (same clock as the chunks),
    so that a quiet tail still being waited on is recognised once it is long enough.
    """
    first = first_frame_index(chunks)
    if first is None:
        return None
    for i in range(first, len(chunks)):
        following = chunks[i + 1].t if i + 1 < len(chunks) else now
        if following - chunks[i].t >= quiet:
            return i
    return None


def bytes_between(chunks: Sequence[Chunk], start: float, end: float) -> int:
    """Bytes of the chunks that arrived in ``[start, end]``."""
    return sum(len(c.data) for c in chunks if start <= c.t <= end)


def parent_pid(stat_line: str) -> int:
    """The parent pid from the text of /proc/PID/stat (the name in parentheses may hold spaces)."""
    return int(stat_line.rsplit(")", 1)[1].split()[1])


def descendants(parent_of: Mapping[int, int], root: int) -> set[int]:
    """``root`` and every process below it, given each process's parent."""
    children: dict[int, list[int]] = {}
    for pid, ppid in parent_of.items():
        children.setdefault(ppid, []).append(pid)
    found, stack = {root}, [root]
    while stack:
        for child in children.get(stack.pop(), []):
            if child not in found:
                found.add(child)
                stack.append(child)
    return found


def rss_kib(status_text: str) -> int:
    """VmRSS in KiB from the text of /proc/PID/status (0 when absent, as for a zombie)."""
    for line in status_text.splitlines():
        if line.startswith("VmRSS:"):
            return int(line.split()[1])
    return 0


def pss_kib(rollup_text: str) -> int | None:
    """Pss in KiB from the text of /proc/PID/smaps_rollup (None when absent)."""
    for line in rollup_text.splitlines():
        if line.startswith("Pss:"):
            return int(line.split()[1])
    return None


def process_kib(pid: int, proc: Path = Path("/proc")) -> int:
    """One process's proportional set size (shared pages split among their users), else RSS."""
    with contextlib.suppress(OSError):
        pss = pss_kib((proc / str(pid) / "smaps_rollup").read_text())
        if pss is not None:
            return pss
    return rss_kib((proc / str(pid) / "status").read_text())


def tree_kib(root: int, proc: Path = Path("/proc")) -> int:
    """Summed memory of ``root`` and its descendants right now (Linux /proc; PSS where known)."""
    parent_of: dict[int, int] = {}
    for entry in proc.iterdir():
        if entry.name.isdigit():
            with contextlib.suppress(OSError, ValueError, IndexError):
                parent_of[int(entry.name)] = parent_pid((entry / "stat").read_text())
    total = 0
    for pid in descendants(parent_of, root):
        with contextlib.suppress(OSError):
            total += process_kib(pid, proc)
    return total


class TreeMemorySampler(threading.Thread):
    """Samples the summed memory of a process tree every ``interval`` s and keeps the peak.

    Each process counts its proportional set size (PSS: a page shared by n processes counts 1/n
    in each), so a forked helper's shared pages are not counted twice; ``ru_maxrss`` from wait4
    gives only the largest single process. A peak shorter than the interval can be missed.
    """

    def __init__(self, root: int, interval: float = 0.1) -> None:
        super().__init__(daemon=True, name=f"rss-sampler-{root}")
        self.root = root
        self.interval = interval
        self.peak_kib = 0
        self.samples = 0
        self._stop_event = threading.Event()

    def run(self) -> None:
        """Sample until stopped."""
        while not self._stop_event.is_set():
            with contextlib.suppress(OSError):
                self.peak_kib = max(self.peak_kib, tree_kib(self.root))
                self.samples += 1
            self._stop_event.wait(self.interval)

    def stop(self) -> None:
        """Stop sampling and wait for the thread."""
        self._stop_event.set()
        self.join(timeout=2)


@dataclass
class Session:
    """A program running in a pty of ``cols`` x ``rows``; see :meth:`start`."""

    argv: Sequence[str]
    """Program and arguments."""
    env: Mapping[str, str]
    """The child's whole environment."""
    cwd: str
    """The child's working directory."""
    cols: int = 80
    """Terminal width."""
    rows: int = 24
    """Terminal height."""
    answer_sync: bool = True
    """Answer the synchronized-output query (gives frame boundaries)."""
    chunks: list[Chunk] = field(default_factory=list)
    """Everything the child wrote, in order."""
    pid: int = -1
    """Child pid once started."""
    fd: int = -1
    """Pty master file descriptor once started."""
    t0: float = 0.0
    """perf_counter just before the fork."""
    max_rss_kib: int | None = None
    """The child's peak resident set (KiB) once it has been reaped."""
    exit_status: int | None = None
    """Raw wait status once reaped."""
    sample_tree: bool = False
    """Also sample the summed memory (PSS) of the child and its helpers while it runs."""
    tree_peak_kib: int | None = None
    """Peak of that sum (KiB) once reaped, when sampled."""
    _pending: bytes = b""
    _sampler: TreeMemorySampler | None = None

    def start(self) -> None:
        """Fork the child onto a new pty and exec ``argv``."""
        self.t0 = time.perf_counter()
        pid, fd = pty.fork()
        if pid == 0:  # child: never return into the harness
            try:
                winsize = struct.pack("HHHH", self.rows, self.cols, 0, 0)
                fcntl.ioctl(0, termios.TIOCSWINSZ, winsize)
                os.chdir(self.cwd)
                os.execve(self.argv[0], list(self.argv), dict(self.env))
            finally:
                os._exit(127)
        self.pid, self.fd = pid, fd
        if self.sample_tree:
            self._sampler = TreeMemorySampler(pid)
            self._sampler.start()

    def now(self) -> float:
        """Seconds since start."""
        return time.perf_counter() - self.t0

    def _read_once(self, timeout: float) -> bool:
        """Read what is available within ``timeout``; False on timeout or end of output."""
        if self.fd < 0:
            return False
        ready, _, _ = select.select([self.fd], [], [], max(timeout, 0.0))
        if not ready:
            return False
        try:
            data = os.read(self.fd, 65536)
        except OSError as exc:
            if exc.errno == errno.EIO:  # the child closed its side
                self._close_fd()
                return False
            raise
        if not data:
            self._close_fd()
            return False
        self.chunks.append(Chunk(self.now(), data))
        if self.answer_sync:
            joined = self._pending + data
            if SYNC_QUERY in joined:
                self.send(SYNC_REPLY)
                self._pending = b""
            else:
                self._pending = joined[-len(SYNC_QUERY) :]
        return True

    def _close_fd(self) -> None:
        if self.fd >= 0:
            os.close(self.fd)
            self.fd = -1

    def send(self, data: bytes) -> float:
        """Write ``data`` as typed input; returns the time it was sent."""
        t = self.now()
        os.write(self.fd, data)
        return t

    def pump(self, seconds: float) -> None:
        """Keep reading for ``seconds``."""
        end = self.now() + seconds
        while self.fd >= 0 and self.now() < end:
            self._read_once(end - self.now())

    def wait_next(self, timeout: float) -> bool:
        """Wait up to ``timeout`` s for the next chunk; True if one arrived."""
        return self._read_once(timeout)

    def wait_settled(self, quiet: float, timeout: float) -> float:
        """Read until the screen has settled; returns the time of its last chunk (seconds).

        Raises TimeoutError when no settled frame appears within ``timeout``.
        """
        deadline = self.now() + timeout
        while self.now() < deadline:
            self._read_once(min(quiet / 4, deadline - self.now()))
            idx = settled_index(self.chunks, quiet, self.now())
            if idx is not None:
                return self.chunks[idx].t
            if self.fd < 0:
                raise RuntimeError(f"{self.argv[0]} exited before its screen settled")
        raise TimeoutError(f"no settled screen within {timeout:.0f} s")

    def wait_quiet(self, after: float, quiet: float, timeout: float) -> float:
        """Read until nothing has arrived for ``quiet`` s after time ``after``; last chunk time."""
        deadline = self.now() + timeout
        while self.now() < deadline:
            self._read_once(min(quiet / 4, deadline - self.now()))
            later = [c.t for c in self.chunks if c.t >= after]
            last = later[-1] if later else after
            if self.now() - last >= quiet:
                return last
        raise TimeoutError(f"output did not go quiet within {timeout:.0f} s")

    def quit(self, then: Sequence[bytes] = (), grace: float = 1.5, timeout: float = 10.0) -> bool:
        """Send Ctrl+Q, drain the output and reap the child (killing it after ``timeout``).

        If the child is still running ``grace`` s after Ctrl+Q (a program asking about unsaved
        changes), the keys in ``then`` are typed one by one to answer it. Returns True when the
        child exited by itself.
        """
        if self.fd >= 0:
            with contextlib.suppress(OSError):  # the child may already have gone
                self.send(CTRL_Q)
        self.pump(grace)
        for key in then:
            if self.fd < 0:
                break
            with contextlib.suppress(OSError):
                self.send(key)
            self.pump(0.3)
        deadline = self.now() + timeout
        while self.fd >= 0 and self.now() < deadline:
            self._read_once(0.1)
        return self._reap(deadline)

    def _stop_sampler(self) -> None:
        if self._sampler is not None:
            self._sampler.stop()
            self.tree_peak_kib = self._sampler.peak_kib
            self._sampler = None

    def _reap(self, deadline: float) -> bool:
        self._stop_sampler()  # before the child becomes a zombie with no memory to read
        while True:
            pid, status, usage = os.wait4(self.pid, os.WNOHANG)
            if pid == self.pid:
                self.exit_status = status
                self.max_rss_kib = int(usage.ru_maxrss)  # KiB on Linux
                self._close_fd()
                return True
            if self.now() >= deadline:
                os.kill(self.pid, signal.SIGKILL)
                _, status, usage = os.wait4(self.pid, 0)
                self.exit_status = status
                self.max_rss_kib = int(usage.ru_maxrss)
                self._close_fd()
                return False
            if self.fd >= 0:
                self._read_once(0.05)
            else:
                time.sleep(0.02)

    def kill(self) -> None:
        """Stop the child at once (used when a run fails)."""
        self._stop_sampler()
        if self.pid > 0 and self.exit_status is None:
            with contextlib.suppress(ProcessLookupError):
                os.kill(self.pid, signal.SIGKILL)
            with contextlib.suppress(ChildProcessError):  # already reaped
                _, self.exit_status, usage = os.wait4(self.pid, 0)
                self.max_rss_kib = int(usage.ru_maxrss)
        self._close_fd()

    def output(self) -> bytes:
        """Everything written so far, joined."""
        return b"".join(c.data for c in self.chunks)
