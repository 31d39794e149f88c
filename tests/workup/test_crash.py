"""Real processes killed mid-edit (SIGKILL, and SIGHUP as a dropped SSH line sends): nothing lost.

Each round forks an editing session (tests/workup/helpers/journal_loop.py) that journals an edit
and saves every third one, in a tight loop; the test kills it at a random moment and then checks
that the case file and the draft are each one complete version, that no acknowledged edit is
lost, and that pending_drafts() offers the journaled edits. The next round's session takes over
the stale lock of the killed one. The demo case is an invented scenario.
"""

from __future__ import annotations

import json
import os
import random
import shutil
import signal
import subprocess
import sys
import time
from pathlib import Path

import pytest

from tests.workup.helpers.journal_loop import edit_number, edited
from workup.caseio import load_case
from workup.journal import discard_draft, draft_for, drafts_folder, list_drafts, pending_drafts
from workup.storage import backup_folder, list_backups, temp_files

HELPER = Path(__file__).parent / "helpers" / "journal_loop.py"
SAVE_EVERY = 3
KILLS = {signal.SIGKILL: 20, signal.SIGHUP: 10}
STATS_ENV = "WORKUP_CRASH_STATS"
"""When set, the test writes its counts (kills, interrupted writes...) to this JSON file."""


class Zygote:
    """The helper process; forks one editing child per round."""

    def __init__(self, env: dict[str, str]):
        self.proc = subprocess.Popen(
            [sys.executable, str(HELPER)],
            stdin=subprocess.PIPE,
            stdout=subprocess.PIPE,
            text=True,
            bufsize=1,
            env=env,
        )
        assert self.readline() == "zygote ready"

    def readline(self) -> str:
        assert self.proc.stdout is not None
        line = self.proc.stdout.readline()
        assert line, "the helper ended unexpectedly"
        return line.strip()

    def run(self, *args: object) -> None:
        assert self.proc.stdin is not None
        self.proc.stdin.write(" ".join(str(a) for a in args) + "\n")
        self.proc.stdin.flush()

    def close(self) -> None:
        assert self.proc.stdin is not None
        self.proc.stdin.write("quit\n")
        self.proc.stdin.close()
        self.proc.wait(timeout=10)


@pytest.fixture
def zygote(tmp_path_factory):
    env = {**os.environ, "PYTHONDONTWRITEBYTECODE": "1"}
    z = Zygote(env)
    yield z
    z.close()


def _one_round(z: Zygote, case_path: Path, original: Path, offset: int, sig: int, rng):
    z.run("run", case_path, original, SAVE_EVERY, offset)
    first = z.readline()
    assert first.startswith("start ")
    pid = int(first.split()[1])
    lines = []
    while (line := z.readline()) != "ready":
        lines.append(line)
    # Let it edit for a random while: from right after opening to a few dozen writes.
    time.sleep(rng.uniform(0.0, 0.06))
    os.kill(pid, sig)
    while not (line := z.readline()).startswith("exit "):
        lines.append(line)
    status = int(line.split()[2])
    assert os.WIFSIGNALED(status) and os.WTERMSIG(status) == sig, (line, lines)
    return pid, lines


def test_killed_sessions_lose_nothing(zygote, tmp_path, cases_dir):
    rng = random.Random(20261201)
    library = tmp_path / "library"
    library.mkdir(mode=0o700)
    original = tmp_path / "original.yaml"
    shutil.copy(cases_dir / "distal-rta-classic.yaml", original)
    case_path = library / "case.yaml"
    shutil.copy(original, case_path)
    base = load_case(original)

    kills = [sig for sig, n in KILLS.items() for _ in range(n)]
    rng.shuffle(kills)
    stats = {"kills": 0, "sigkill": 0, "sighup": 0, "journaled": 0, "saved": 0}
    stats |= {"interrupted_writes": 0, "stale_locks_taken_over": 0, "drafts_offered": 0}
    stats["backups_checked"] = 0
    previous_pid = None
    for round_no, sig in enumerate(kills):
        offset = (round_no + 1) * 10_000
        pid, lines = _one_round(zygote, case_path, original, offset, sig, rng)
        stats["kills"] += 1
        stats["sigkill" if sig == signal.SIGKILL else "sighup"] += 1

        # The previous session was killed holding the lock: this one took it over, naming it.
        stale = [int(x.split()[1]) for x in lines if x.startswith("stale ")]
        if previous_pid is not None:
            assert stale == [previous_pid]
            stats["stale_locks_taken_over"] += 1
        previous_pid = pid

        acked = [int(x.split()[1]) for x in lines if x[:2] in ("J ", "S ")]
        saved = [int(x.split()[1]) for x in lines if x.startswith("S ")]
        stats["journaled"] += sum(1 for x in lines if x.startswith("J "))
        stats["saved"] += len(saved)

        # The case file is one complete version: the original, or a saved edit, whole.
        on_disk = load_case(case_path)
        k = edit_number(on_disk)
        assert on_disk == (base if k is None else edited(base, k))
        if k is not None:
            assert k % SAVE_EVERY == 0
        if saved:
            assert k is not None and k >= saved[-1]

        # Every backup is a complete earlier version as well.
        for b in list_backups(case_path):
            kept = load_case(b.path)
            n = edit_number(kept)
            assert kept == (base if n is None else edited(base, n))
            stats["backups_checked"] += 1

        # The draft is one complete version too, and no acknowledged edit is lost.
        draft = draft_for(case_path)
        if draft is not None:
            assert draft.problem is None, draft.problem
            j = edit_number(draft.case)
            assert j is not None and draft.case == edited(base, j)
        newest = max(
            [k or 0, *([edit_number(draft.case) or 0] if draft else [])],
        )
        if acked:
            assert newest >= acked[-1], (newest, acked[-5:])

        # What the next start offers: the journaled edits, unless they are already on disk.
        offered = pending_drafts()
        if draft is not None and draft.case != on_disk:
            assert [d.path for d in offered] == [draft.path]
            assert offered[0].case == draft.case
            stats["drafts_offered"] += 1
        else:
            assert offered == []

        folders = (library, drafts_folder(), backup_folder(case_path))
        leftovers = [p for f in folders for p in temp_files(f)]
        stats["interrupted_writes"] += len(leftovers)
        for p in leftovers:
            p.unlink()
        for d in list_drafts():
            discard_draft(d)  # the user chose "discard": the next round starts clean

    assert stats["kills"] == sum(KILLS.values())
    assert stats["journaled"] > stats["kills"]  # the kills landed mid-loop, not before it
    out = os.environ.get(STATS_ENV)
    if out:
        Path(out).write_text(json.dumps(stats, indent=1))
