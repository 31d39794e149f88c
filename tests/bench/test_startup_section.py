"""The startup section's pure parts: its rows against the minimal app and the readiness check."""

from __future__ import annotations

import pytest

from bench.sections.startup import STARTUP_FIGURES, pair_text, shape_rows, shows


def test_settled_rows_carry_the_limit_and_the_goal_and_every_pair():
    app = [1.2, 1.5, 1.4, 1.3, 1.6]
    base = [1.0, 1.0, 1.0, 1.0, 1.0]
    settled, first = shape_rows("library", app, base, [0.9] * 5, [0.6] * 5, "16 widgets.")
    assert settled.figure == STARTUP_FIGURES[2][0] and first.figure == STARTUP_FIGURES[3][0]
    assert settled.ratio.median == pytest.approx(1.4)
    assert [settled.judge(t) for t in settled.targets] == ["pass", "FAIL"]  # ≤ 1.5, not ≤ 1.3
    assert "1.20, 1.50, 1.40, 1.30, 1.60" in settled.note and settled.note.startswith("16 widgets.")
    assert first.targets == () and first.ratio.median == pytest.approx(1.5)


def test_each_ratio_is_taken_within_its_pair():
    # A slow moment hits both runs of the second pair: its ratio stays 1.25.
    settled, _ = shape_rows("case", [1.0, 5.0, 1.0], [0.8, 4.0, 0.8], [1.0] * 3, [1.0] * 3)
    assert settled.ratio.median == pytest.approx(1.25) and settled.ratio.high == pytest.approx(1.25)
    assert pair_text([1.0, 1.234]) == "1.00, 1.23"


def test_readiness_waits_for_the_words_and_reports_a_library_error():
    ready = shows("Demo ")
    assert ready(b"\x1b[?1049h\x1b[1;1Hreading the library\xe2\x80\xa6") is None
    assert ready(b"\x1b[5;3H\x1b[1mDemo F - stage 4\x1b[0m") == "shown"
    said = ready(b"\x1b[3;1Hcannot read the library: permission denied\x1b[0m")
    assert said == "error: cannot read the library: permission denied"
