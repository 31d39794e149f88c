"""The real app in a real pseudo-terminal, killed mid-edit: the edits come back on the next start.

Each test starts ``python -m workup.cli FILE`` in an 80 × 24 pty (TERM=xterm-256color, XDG_*
pointed at a private folder), types a value into a field, waits for the draft to appear, kills
the process (SIGKILL, or SIGHUP as a dropped SSH line delivers it), starts the app again in a new
pty and reads the screen for the restore offer. The demo case is an invented scenario.
"""

from __future__ import annotations

import fcntl
import os
import re
import select
import shutil
import signal
import struct
import subprocess
import sys
import termios
import threading
import time
from pathlib import Path

import pytest

from screens.case_screen import JOURNAL_SECONDS
from screens.recovery import RECOVERY_TITLE

ROOT = Path(__file__).resolve().parents[2]
F2 = b"\x1bOQ"
END = b"\x1b[F"
BACKSPACE = b"\x7f"
ANSI = re.compile(
    rb"\x1b(\[[0-?]*[ -/]*[@-~]|\][^\x07\x1b]*(\x07|\x1b\\)|P[^\x1b]*\x1b\\|[()][A-Za-z0-9]|[=>NOM78c])"
)

pytestmark = pytest.mark.skipif(
    not hasattr(os, "openpty") or sys.platform == "win32", reason="needs a pseudo-terminal"
)


class Terminal:
    """The app in a pty: a thread drains its output (a full pty would block the app)."""

    def __init__(self, args: list[str], env: dict[str, str], cwd: Path) -> None:
        master, slave = os.openpty()
        fcntl.ioctl(slave, termios.TIOCSWINSZ, struct.pack("HHHH", 24, 80, 0, 0))
        self.master = master
        self.proc = subprocess.Popen(
            args,
            stdin=slave,
            stdout=slave,
            stderr=slave,
            env=env,
            cwd=cwd,
            start_new_session=True,  # its own session, as a login over SSH has
            close_fds=True,
        )
        os.close(slave)
        self._buf = bytearray()
        self._lock = threading.Lock()
        self._reader = threading.Thread(target=self._drain, daemon=True)
        self._reader.start()

    def _drain(self) -> None:
        while True:
            try:
                ready, _, _ = select.select([self.master], [], [], 0.1)
                if not ready:
                    if self.proc.poll() is not None:
                        return
                    continue
                data = os.read(self.master, 65536)
            except OSError:  # EIO once the child side is gone
                return
            if not data:
                return
            with self._lock:
                self._buf += data

    def text(self, since: int = 0) -> str:
        """What the app wrote after byte ``since``, escape sequences removed."""
        with self._lock:
            raw = bytes(self._buf[since:])
        return ANSI.sub(b"", raw).decode("utf-8", errors="replace")

    def mark(self) -> int:
        """The number of bytes read so far (for ``text(since=...)``)."""
        with self._lock:
            return len(self._buf)

    def wait_for(self, words: str, timeout: float, since: int = 0) -> bool:
        """Poll the screen output until ``words`` appear or ``timeout`` seconds pass."""
        end = time.monotonic() + timeout
        while time.monotonic() < end:
            if words in self.text(since):
                return True
            if self.proc.poll() is not None:
                return words in self.text(since)
            time.sleep(0.05)
        return False

    def send(self, data: bytes) -> None:
        """Type ``data``."""
        os.write(self.master, data)

    def close(self) -> None:
        """Make sure the process is gone and the pty closed."""
        if self.proc.poll() is None:
            self.proc.kill()
        self.proc.wait(timeout=10)
        self._reader.join(timeout=5)
        os.close(self.master)


@pytest.fixture
def setup(tmp_path: Path, cases_dir: Path) -> tuple[list[str], dict[str, str], Path, Path]:
    """The command, its environment, its working folder and the case file (a private copy)."""
    home = tmp_path / "home"
    folder = tmp_path / "cases"
    folder.mkdir(mode=0o700)
    case = folder / "distal.yaml"
    shutil.copy(cases_dir / "distal-rta-classic.yaml", case)
    os.chmod(case, 0o600)
    env = {
        "PATH": os.environ.get("PATH", ""),
        "HOME": str(home),
        "TERM": "xterm-256color",
        "LANG": "C.UTF-8",
        "PYTHONPATH": str(ROOT),
        "WORKUP_CASES": str(folder),
    }
    for var in ("XDG_DATA_HOME", "XDG_CONFIG_HOME", "XDG_CACHE_HOME", "XDG_STATE_HOME"):
        env[var] = str(home / var.lower())
    args = [sys.executable, "-m", "workup.cli", str(case)]
    return args, env, tmp_path, case


def _drafts(env: dict[str, str]) -> list[Path]:
    folder = Path(env["XDG_STATE_HOME"]) / "workup" / "drafts"
    return sorted(folder.glob("*.draft.json")) if folder.is_dir() else []


def _wait_for_draft(env: dict[str, str], holding: str, timeout: float) -> Path | None:
    end = time.monotonic() + timeout
    while time.monotonic() < end:
        for p in _drafts(env):
            try:
                if holding in p.read_text(encoding="utf-8"):
                    return p
            except OSError:
                pass
        time.sleep(0.05)
    return None


def _retype(term: Terminal, value: bytes) -> None:
    # Written as a person types, in separate writes: backspaces sent in one write together
    # with the digits after them were seen to be dropped (the field read "141152").
    for keys in (END, BACKSPACE * 6, value):
        term.send(keys)
        time.sleep(0.2)


def _type_sodium(term: Terminal, value: bytes) -> None:
    # The case opens on its findings; F2 shows the form with serum sodium focused.
    term.send(F2)
    time.sleep(0.3)  # the form takes focus before the keys that edit it
    _retype(term, value)


def _edit_then_kill(setup, sig: int) -> tuple[subprocess.Popen, Path, Terminal]:
    args, env, cwd, _case = setup
    term = Terminal(args, env, cwd)
    try:
        assert term.wait_for("Demo B", timeout=30), term.text()[-2000:]
        _type_sodium(term, b"152")
        draft = _wait_for_draft(env, '"sodium": 152', timeout=15)
        assert draft is not None, "no draft appeared within 15 s of typing"
        os.kill(term.proc.pid, sig)
        term.proc.wait(timeout=10)
    finally:
        term.close()
    return term.proc, draft, term


def _restore_offer_shown(setup) -> str:
    args, env, cwd, _case = setup
    term = Terminal(args, env, cwd)
    try:
        shown = term.wait_for(RECOVERY_TITLE, timeout=30)
        screen = term.text()
    finally:
        term.close()
    assert shown, screen[-2000:]
    return screen


def test_sigkill_mid_edit_then_the_next_start_offers_the_edits(setup) -> None:
    proc, draft, _ = _edit_then_kill(setup, signal.SIGKILL)
    assert proc.returncode == -signal.SIGKILL
    assert draft.exists()  # a kill is never a clean close
    case = setup[3]
    assert "sodium: 141" in case.read_text()  # the file itself was not saved
    assert not (case.parent / f".{case.name}.lock").exists() or _lock_free(case)
    screen = _restore_offer_shown(setup)
    assert "distal.yaml" in screen


def test_sighup_mid_edit_is_not_a_clean_close(setup) -> None:
    args, env, cwd, case = setup
    term = Terminal(args, env, cwd)
    try:
        assert term.wait_for("Demo B", timeout=30), term.text()[-2000:]
        _type_sodium(term, b"152")
        assert _wait_for_draft(env, '"sodium": 152', timeout=15) is not None
        ticked = time.monotonic()  # a journal tick wrote it, at most a poll before now
        # A second edit, and the line drops before the journal timer comes round again: the
        # hangup itself writes the draft once more.
        since = term.mark()
        _retype(term, b"147")
        assert term.wait_for("147", timeout=10, since=since)
        os.kill(term.proc.pid, signal.SIGHUP)
        before_next_tick = time.monotonic() - ticked < JOURNAL_SECONDS - 0.1
        term.proc.wait(timeout=10)
    finally:
        term.close()
    assert term.proc.returncode == -signal.SIGHUP  # died of the hangup, no clean close
    if before_next_tick:  # only then is the handler, not the timer, known to have written it
        assert _wait_for_draft(env, '"sodium": 147', timeout=1) is not None
    else:
        assert _drafts(env), "the draft went with the hangup"
    assert "sodium: 141" in case.read_text()
    screen = _restore_offer_shown(setup)
    assert "distal.yaml" in screen


def _lock_free(case: Path) -> bool:
    from workup.locking import current_holder

    return current_holder(case) is None
