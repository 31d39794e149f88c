"""Settling and byte counting on recorded output, and one real pty round trip."""

from __future__ import annotations

import os
import sys

from bench.terminal import (
    ALT_SCREEN_ON,
    SYNC_END,
    Chunk,
    Session,
    bytes_between,
    descendants,
    first_frame_index,
    parent_pid,
    pss_kib,
    rss_kib,
    settled_index,
    tree_kib,
)


def test_first_frame_needs_the_alternate_screen_then_an_end_of_sync():
    chunks = [Chunk(0.1, b"\x1b[?2026h" + b"x" * 10 + SYNC_END), Chunk(0.2, ALT_SCREEN_ON)]
    assert first_frame_index(chunks) is None  # a sync end before the switch does not count
    chunks.append(Chunk(0.3, b"\x1b[?2026hpaint" + SYNC_END))
    assert first_frame_index(chunks) == 2


def test_marker_split_across_reads_is_found():
    chunks = [Chunk(0.1, ALT_SCREEN_ON + b"paint\x1b[?20"), Chunk(0.2, b"26l")]
    assert first_frame_index(chunks) == 1


def test_without_sync_markers_enough_bytes_make_a_frame():
    chunks = [Chunk(0.1, ALT_SCREEN_ON), Chunk(0.2, b"a" * 1500), Chunk(0.3, b"b" * 600)]
    assert first_frame_index(chunks, min_bytes=2000) == 2


def test_settled_is_the_last_chunk_before_the_first_long_gap_after_the_first_frame():
    chunks = [
        Chunk(0.00, ALT_SCREEN_ON),
        Chunk(0.50, b"\x1b[?2026h" + b"p" * 100 + SYNC_END),
        Chunk(0.60, b"more"),
        Chunk(0.70, b"last"),
        Chunk(1.50, b"blink"),
    ]
    assert settled_index(chunks, quiet=0.4, now=2.0) == 3  # "last"
    # Before the gap has lasted long enough, nothing is settled yet.
    assert settled_index(chunks[:4], quiet=0.4, now=0.9) is None
    # A gap before the first frame (slow imports) never counts.
    assert settled_index(chunks[:1], quiet=0.4, now=5.0) is None


def test_bytes_between_is_inclusive():
    chunks = [Chunk(1.0, b"ab"), Chunk(2.0, b"cde"), Chunk(3.0, b"f")]
    assert bytes_between(chunks, 2.0, 3.0) == 4


CHILD = r"""
import os, sys, tty
tty.setraw(0)                               # as a full-screen program does: no echo, no lines
sys.stdout.buffer.write(b"\x1b[?1049h" + b"x" * 3000)
sys.stdout.flush()
key = os.read(0, 1)                         # the typed key
sys.stdout.buffer.write(b"got " + key * 40)  # 44 bytes in answer
sys.stdout.flush()
os.read(0, 1)                                # Ctrl+Q
"""


def test_real_pty_round_trip(tmp_path):
    env = {"PATH": os.environ.get("PATH", ""), "TERM": "xterm-256color"}
    s = Session([sys.executable, "-c", CHILD], env, str(tmp_path), cols=80, rows=24)
    s.start()
    try:
        s.wait_settled(quiet=0.15, timeout=20)
        assert len(s.output()) >= 3000 + len(ALT_SCREEN_ON)
        sent = s.send(b"7")
        last = s.wait_quiet(sent, quiet=0.15, timeout=20)
        assert bytes_between(s.chunks, sent, last) == 44
        s.quit(timeout=20)
    finally:
        s.kill()
    assert s.exit_status == 0
    assert s.max_rss_kib is not None and s.max_rss_kib > 0


def test_parent_pid_survives_spaces_and_parentheses_in_the_name():
    assert parent_pid("4242 (python -m (x) y) S 17 4242 4242 0 -1") == 17


def test_descendants_walk_the_whole_tree_only():
    parent_of = {10: 1, 11: 10, 12: 11, 13: 10, 20: 1, 21: 20}
    assert descendants(parent_of, 10) == {10, 11, 12, 13}
    assert descendants(parent_of, 21) == {21}


def test_tree_memory_prefers_pss_and_falls_back_to_rss(tmp_path):
    def proc(pid, ppid, pss=None, rss=0):
        d = tmp_path / str(pid)
        d.mkdir()
        (d / "stat").write_text(f"{pid} (app) S {ppid} 1 1 0")
        (d / "status").write_text(f"Name:\tapp\nVmRSS:\t  {rss} kB\n")
        if pss is not None:
            (d / "smaps_rollup").write_text(f"Rss:  {rss} kB\nPss:  {pss} kB\n")

    proc(100, 1, pss=600, rss=900)  # the app
    proc(101, 100, pss=300, rss=800)  # its helper, sharing pages with it
    proc(102, 101, rss=50)  # a worker with no smaps_rollup: RSS instead
    proc(200, 1, pss=5000, rss=5000)  # someone else's process
    (tmp_path / "self").mkdir()  # not a pid: ignored
    assert tree_kib(100, tmp_path) == 600 + 300 + 50
    assert pss_kib("Rss: 1 kB\n") is None and rss_kib("Name: x\n") == 0


def test_this_process_has_memory():
    assert tree_kib(os.getpid()) > 0
