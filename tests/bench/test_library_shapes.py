"""Library rows per shape, with the earlier and the new targets judged side by side."""

from __future__ import annotations

import pytest

from bench.pty_bench import RunResult
from bench.sections import memory
from bench.sections.library import RUNS, library_figures, library_rows_from


def _sample(shape, files, parse, cold, warm, one):
    return {"bench": "library", "shape": shape, "files": files, "cases_ok": files,
            "megabytes": 16.0, "yaml_parse_s": parse, "cold_s": cold, "warm_s": warm,
            "one_changed_s": one}  # fmt: skip


def test_each_shape_reads_only_its_own_samples():
    samples = [
        _sample("demo", 10000, 2.0, 2.8, 0.28, 0.5),
        _sample("varied", 10000, 4.0, 8.0, 0.4, 0.7),
    ]
    demo = library_rows_from(samples, (10000,), "demo")
    varied = library_rows_from(samples, (10000,), "varied")
    assert demo[0].ratio.median == pytest.approx(1.4)
    assert varied[0].ratio.median == pytest.approx(2.0)
    assert "varied cases" in varied[0].figure and "varied" not in demo[0].figure
    assert "16.0 MB in all" in varied[0].note


def test_the_new_targets_are_judged_beside_the_earlier_ones():
    cold, warm, one = library_rows_from([_sample("demo", 10000, 2.0, 2.8, 0.28, 0.7)], (10000,))
    # cold 1.4x: within the earlier 1.5x, not the new 1.3x
    assert [cold.judge(t) for t in cold.targets] == ["pass", "FAIL"]
    assert [warm.judge(t) for t in warm.targets] == ["pass", "pass"]  # 0.28 s: < 0.5, ≤ 0.3
    assert [one.judge(t) for t in one.targets] == ["pass", "FAIL"]  # 0.7 s: < 1, not ≤ 0.6
    assert cold.targets[1].text("s") == "new: median ratio ≤ 1.3"


def test_no_cold_target_below_ten_thousand_files_on_either_list():
    cold, warm, _ = library_rows_from([_sample("demo", 1000, 0.2, 0.5, 0.1, 0.2)], (1000,))
    assert cold.targets == () and len(warm.targets) == 2


def test_a_shape_without_samples_is_not_measured():
    rows = library_rows_from([_sample("demo", 10000, 2.0, 2.8, 0.28, 0.5)], (10000,), "varied")
    assert [r.verdict for r in rows] == ["n/a"] * 3
    assert [r.figure for r in rows] == [f for f, _ in library_figures((10000,), "varied")]
    assert {shape for shape, _ in RUNS} == {"demo", "varied"}


def _run(rss, settled, ready="listed"):
    return RunResult(settled, settled, 0, 0.0, None, rss, ready=ready, tree_peak_mib=rss + 5)


def test_memory_rows_judge_the_largest_run_of_each_shape():
    rows = memory.shape_rows("varied", [_run(120.0, 9.0), _run(151.0, 2.0), _run(100.0, 2.2)])
    assert rows[0].verdict == "FAIL"  # median 120 passes; the largest run does not
    assert rows[2].value.median == 9.0 and rows[3].value.median == pytest.approx(2.1)
    assert "varied cases" in rows[0].figure
    failed = memory.shape_rows("demo", [_run(80.0, 1.0, ready="not ready within 180 s")])
    assert all(r.verdict == "n/a" for r in failed) and "not ready" in failed[0].note
