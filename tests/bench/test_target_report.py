"""Several targets on one row, and the list of every target printed under the table."""

from __future__ import annotations

from bench.stats import summarize
from bench.table import Row, Target, render
from bench.target_report import target_lines

LIMIT = Target("ratio", "<=", 1.5)
GOAL = Target("ratio", "<=", 1.3, label="goal")


def _startup(ratios):
    return Row(
        "Startup",
        "s",
        value=summarize([1.0] * len(ratios)),
        ratio=summarize(ratios),
        target=LIMIT,
        more_targets=(GOAL,),
    )


def test_each_target_of_a_row_gets_its_own_verdict():
    row = _startup([1.35, 1.4, 1.45])  # median 1.4: within the limit, short of the goal
    assert row.verdict == "pass"
    assert [row.judge(t) for t in row.targets] == ["pass", "FAIL"]
    line = next(x for x in render([row]).splitlines() if x.startswith("| Startup"))
    assert line.endswith("| median ratio ≤ 1.5; goal: median ratio ≤ 1.3 | pass; FAIL |")
    assert row.to_json()["more_targets"] == [
        {"target": "goal: median ratio ≤ 1.3", "verdict": "FAIL"}
    ]


def test_a_row_with_only_further_targets_is_still_judged():
    row = Row(
        "Warm", "s", value=summarize([0.2, 0.4, 0.35]), more_targets=(Target("value", "<=", 0.3),)
    )
    assert row.verdict == ""  # no first target
    assert render([row]).splitlines()[-1].endswith("| median ≤ 0.3 s | FAIL |")


def test_the_list_names_every_target_with_what_it_was_judged_on():
    rows = [
        _startup([1.1, 1.2, 1.25]),
        _startup([1.6, 1.7, 1.8]),
        Row("Memory", "MiB", note="not measured: no pty", target=Target("value", "<", 150.0)),
        Row("Bytes", "bytes", value=summarize([10.0])),  # no target: not listed
    ]
    lines = target_lines(rows)
    assert lines[0] == "Targets: 2 met, 2 MISSED, 1 not measured."
    assert lines[1:] == [
        "- met: Startup: median ratio ≤ 1.5 (got median 1.20×)",
        "- met: Startup: goal: median ratio ≤ 1.3 (got median 1.20×)",
        "- MISSED: Startup: median ratio ≤ 1.5 (got median 1.70×)",
        "- MISSED: Startup: goal: median ratio ≤ 1.3 (got median 1.70×)",
        "- not measured: Memory: median < 150 MiB",
    ]


def test_a_max_target_reports_the_largest_run():
    row = Row(
        "Peak",
        "MiB",
        value=summarize([100.0, 120.0, 151.0]),
        target=Target("value", "<", 150.0, statistic="high"),
    )
    assert target_lines([row])[1] == "- MISSED: Peak: max < 150 MiB (got max 151)"
