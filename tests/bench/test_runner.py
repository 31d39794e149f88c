"""The runner's pure parts: keys, baseline sizing, library rows, docs splicing, machine info."""

from __future__ import annotations

import pytest

from bench import report
from bench.machine import cpu_model
from bench.pty_bench import bench_env, library_ready, rows_for
from bench.runner import key_bytes, library_rows_from, missing_rows


def test_key_bytes_are_what_a_terminal_sends():
    assert key_bytes("7") == b"7"
    assert key_bytes("tab") == b"\t"
    assert key_bytes("ctrl+q") == b"\x11"
    with pytest.raises(ValueError):
        key_bytes("hyper+f13")


def test_baseline_rows_match_the_widget_count():
    # The bare form has 7 fixed widgets and 3 per row (measured by bench.probe).
    assert rows_for(37, fixed=7, per_row=3) == 10
    assert rows_for(39, fixed=7, per_row=3) == 11  # 10.67 rounds to 11
    assert rows_for(3, fixed=7, per_row=3) == 1  # never an empty form


def test_bench_env_is_private(tmp_path):
    env = bench_env(tmp_path / "home")
    assert env["TERM"] == "xterm-256color"
    assert env["XDG_CACHE_HOME"].startswith(str(tmp_path))
    assert "NO_COLOR" not in env and "COLORTERM" not in env and "WORKUP_CASES" not in env


def _sample(files, parse, cold, warm, one, ok=None):
    return {
        "bench": "library", "files": files, "cases_ok": files if ok is None else ok,
        "yaml_parse_s": parse, "cold_s": cold, "warm_s": warm, "one_changed_s": one,
    }  # fmt: skip


def test_library_rows_pair_each_repetition_with_its_own_parse():
    samples = [_sample(10000, 1.0, 1.2, 0.1, 0.2), _sample(10000, 2.0, 2.2, 0.1, 0.3)]
    cold, warm, one = library_rows_from(samples, (10000,))
    assert cold.ratio.median == pytest.approx((1.2 + 1.1) / 2)
    assert cold.verdict == "pass"
    assert warm.value.median == pytest.approx(0.1) and warm.verdict == "pass"
    assert one.value.median == pytest.approx(0.25) and one.verdict == "pass"


def test_the_cold_target_is_judged_at_ten_thousand_files_only():
    cold, warm, _ = library_rows_from([_sample(1000, 1.0, 2.5, 0.1, 0.2)], (1000,))
    assert cold.target is None and "set for 10,000 files" in cold.note
    assert warm.verdict == "pass"


def test_library_rows_flag_failures_and_missing_sizes():
    rows = library_rows_from([_sample(10000, 1.0, 2.0, 0.6, 1.5, ok=9900)], (10000, 1000))
    assert [r.verdict for r in rows[:3]] == ["FAIL", "FAIL", "FAIL"]
    assert "9900 of 10,000" in rows[0].note
    assert [r.verdict for r in rows[3:]] == ["n/a"] * 3


def test_missing_rows_say_why():
    (row,) = missing_rows([("Startup", "s")], "screens/app.py is missing")
    assert row.verdict == "n/a" and "screens/app.py is missing" in row.note


def test_docs_splice_replaces_only_the_marked_section():
    text = f"# B\n\nintro\n\n{report.START}\nold table\n{report.END}\n\nhow it is measured\n"
    out = report.splice(text, f"{report.START}\nnew table\n{report.END}")
    assert "new table" in out and "old table" not in out
    assert out.startswith("# B\n\nintro") and out.endswith("how it is measured\n")
    appended = report.splice("# B\n", f"{report.START}\nT\n{report.END}")
    assert appended.count(report.START) == 1


def test_cpu_model_from_cpuinfo():
    text = "processor\t: 0\nvendor_id\t: X\nmodel name\t: Some CPU @ 2.0GHz\n"
    assert cpu_model(text) == "Some CPU @ 2.0GHz"
    assert cpu_model("processor : 0\n") == "unknown"


def test_library_ready_needs_a_listed_case_or_reports_the_error():
    assert library_ready(b"\x1b[2;1Hreading the library\xe2\x80\xa6") is None
    assert library_ready(b"\x1b[5;3HDemo B #00042\x1b[0m") == "listed"
    said = library_ready(b"\x1b[3;1Hcannot read the library: disk gone\x1b[0m")
    assert said == "error: cannot read the library: disk gone"


def test_docs_section_names_the_machine_and_carries_the_table():
    machine = {
        "date_utc": "2026-12-01 22:00", "nproc": 2, "cpu_model": "Some CPU", "platform": "Linux",
        "python": "3.11.7", "textual": "8.2.8", "pyyaml": "6.0.4", "pydantic": "2.14.4",
        "load_before": [1.5, 1.0, 0.5], "load_after": [2.0, 1.0, 0.5], "run_seconds": 150.0,
        "commit": "abc1234", "modified_files": 2,
    }  # fmt: skip
    text = report.section({"machine": machine, "plan": {"pairs": 8}, "table": "| T |"})
    assert text.startswith(report.START) and text.endswith(report.END)
    assert "2 CPUs, Some CPU; Python 3.11.7, Textual 8.2.8" in text
    assert "load average before 1.5, after 2.0" in text and "| T |" in text
    assert "commit abc1234 + 2 modified files" in text
