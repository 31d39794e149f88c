"""A real editing session for the crash tests: journals (and now and then saves) edits in a loop.

Run as a "zygote": it imports workup once, then for every ``run`` line on stdin forks a child that
opens the case, journals edit after edit and saves every few edits until it is killed. The test
kills the child with SIGKILL or SIGHUP at a random moment. Forking spares each child the imports,
so a few dozen kills take seconds; each child is still an ordinary process the kernel kills.

Protocol (one line each, on stdout, written unbuffered so a kill never leaves half a line):
``start PID`` / ``stale PID`` (took over the lock of killed PID) / ``ready`` / ``J N`` (edit N
journaled) / ``S N`` (edit N saved); after the child ends the zygote writes ``exit PID STATUS``.
"""

from __future__ import annotations

import os
import signal
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parents[3]
if str(ROOT) not in sys.path:
    sys.path.insert(0, str(ROOT))

from workup.analytes import Panel, analyte  # noqa: E402
from workup.caseio import load_case  # noqa: E402
from workup.model import Case  # noqa: E402
from workup.quantity import read_value  # noqa: E402
from workup.session import CaseSession  # noqa: E402


def edited(base: Case, n: int) -> Case:
    """Edit number ``n`` of ``base`` (invented values): notes, one serum value and a draw note."""
    case = base.model_copy(deep=True)
    case.notes = f"edit {n}"
    draw = case.draws[0]
    draw.serum.sodium = read_value(analyte(Panel.serum, "sodium"), 125 + n % 30, case.units)
    draw.notes = ("x" * (n % 200)) or None  # vary the size so successive writes differ in length
    return case


def edit_number(case: Case) -> int | None:
    """The ``n`` of a case made by :func:`edited`, or None for the original."""
    if case.notes and case.notes.startswith("edit "):
        return int(case.notes.split()[1])
    return None


def _say(text: str) -> None:
    os.write(1, (text + "\n").encode())


def child(case_path: Path, original: Path, save_every: int, offset: int) -> None:
    """Open the case and edit it forever (until killed)."""
    # A shell started under nohup passes SIGHUP on ignored; the test needs a hang-up to kill the
    # session as it would an editor whose terminal went away.
    signal.signal(signal.SIGHUP, signal.SIG_DFL)
    _say(f"start {os.getpid()}")
    base = load_case(original)
    session = CaseSession.open(case_path)
    if session.lock is not None and session.lock.took_over is not None:
        _say(f"stale {session.lock.took_over.pid}")
    _say("ready")
    n = offset
    while True:
        n += 1
        case = edited(base, n)
        session.journal(case)
        _say(f"J {n}")
        if n % save_every == 0:
            session.save(case)
            _say(f"S {n}")


def zygote() -> None:
    """Fork one editing child per ``run CASE ORIGINAL SAVE_EVERY OFFSET`` line on stdin."""
    _say("zygote ready")
    for line in sys.stdin:
        parts = line.split()
        if not parts or parts[0] == "quit":
            break
        _, case_path, original, save_every, offset = parts
        pid = os.fork()
        if pid == 0:
            try:
                child(Path(case_path), Path(original), int(save_every), int(offset))
            finally:
                os._exit(3)  # only reached if the child fails before being killed
        _, status = os.waitpid(pid, 0)
        _say(f"exit {pid} {status}")


if __name__ == "__main__":
    zygote()
