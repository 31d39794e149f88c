"""Verdicts against targets and the rendered table."""

from __future__ import annotations

from bench.stats import summarize
from bench.table import Row, Target, render, spread


def _row(values, target, ratio=None):
    return Row(
        "Startup",
        "s",
        value=summarize(values),
        ratio=summarize(ratio) if ratio else None,
        target=target,
    )


def test_ratio_target_is_judged_on_the_median_ratio():
    ok = _row([1.0] * 5, Target("ratio", "<=", 1.3), ratio=[1.1, 1.2, 1.3, 1.4, 1.5])
    assert ok.verdict == "pass"  # median ratio 1.3 meets "<= 1.3"
    bad = _row([1.0] * 5, Target("ratio", "<=", 1.3), ratio=[1.2, 1.31, 1.4])
    assert bad.verdict == "FAIL"


def test_strict_value_target_and_max_statistic():
    assert _row([2.0, 2.0, 2.0], Target("value", "<", 2.0)).verdict == "FAIL"
    assert _row([1.9, 1.0, 1.0], Target("value", "<", 2.0)).verdict == "pass"
    worst = _row([100.0, 120.0, 151.0], Target("value", "<", 150.0, statistic="high"))
    assert worst.verdict == "FAIL"  # the median (120) passes; the largest run does not


def test_missing_value_or_ratio_is_not_applicable():
    assert Row("x", "s", note="not measured: y").verdict == "n/a"
    assert _row([1.0], Target("ratio", "<=", 1.3)).verdict == "n/a"
    assert _row([1.0], None).verdict == ""


def test_spread_is_iqr_from_four_values_else_range():
    assert spread(summarize([1.0, 2.0, 3.0, 4.0])).startswith("IQR 1.75–3.25")
    assert spread(summarize([1.0, 3.0])) == "range 1.00–3.00, n=2"


def test_render_has_one_line_per_row_and_shared_notes_once():
    rows = [
        Row("A", "s", note="not measured: piece missing"),
        Row("B", "s", note="not measured: piece missing"),
        _row([0.5, 0.6, 0.7, 0.8], Target("value", "<", 1.0)),
    ]
    text = render(rows)
    lines = text.splitlines()
    assert lines[0].startswith("| Figure |")
    assert sum(1 for line in lines if line.startswith("| A [1]")) == 1
    assert sum(1 for line in lines if line.startswith("| B [1]")) == 1
    assert text.count("piece missing") == 1
    assert "| median < 1 s | pass |" in text


def test_target_text():
    assert Target("ratio", "<=", 1.3).text("s") == "median ratio ≤ 1.3"
    assert Target("value", "<", 150.0, statistic="high").text("MiB") == "max < 150 MiB"


def test_p99_is_shown_when_asked_and_the_judged_statistic_always():
    asked = Row("Recompute", "ms", value=summarize([1.0, 2.0, 3.0]), also=("p99",))
    assert "; p99 2.98" in render([asked])
    judged = _row([100.0, 120.0, 140.0], Target("value", "<", 150.0, statistic="high"))
    assert "; max 140" in render([judged])
