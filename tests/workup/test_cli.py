"""The command line: documented JSON shape, exit codes, messages on stderr."""

from __future__ import annotations

import json
import subprocess
import sys

import pytest

from workup.cli import main

DEMO = "cases/distal-rta-classic.yaml"


def test_assess_json_has_documented_shape(capsys) -> None:
    assert main(["assess", DEMO, "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    assert {"indices", "disorders", "patterns", "next_tests", "cautions"} <= set(out)
    for finding in out["indices"].values():
        assert {"value", "unit", "status", "reasons", "needs", "formula", "source"} <= set(finding)
        assert finding["status"] in {"ok", "caution", "not_valid", "needs_input"}
    for pattern in out["patterns"]:
        assert {"id", "verdict", "for", "against", "missing"} <= set(pattern)
    assert any("not a diagnosis" in c for c in out["cautions"])


def test_assess_defaults_to_the_draw_showing_the_acidosis_and_takes_a_label(capsys) -> None:
    # The latest draw of the demo is a bicarbonate-loading draw; the baseline shows the acidosis.
    main(["assess", DEMO, "--json"])
    assert json.loads(capsys.readouterr().out)["draw"] == "baseline"
    main(["assess", DEMO, "--json", "--draw", "bicarbonate 3 h"])
    assert json.loads(capsys.readouterr().out)["draw"] == "bicarbonate 3 h"
    main(["assess", DEMO, "--json", "--draw", "baseline"])
    assert json.loads(capsys.readouterr().out)["draw"] == "baseline"


def test_assess_unknown_draw_exits_2(capsys) -> None:
    assert main(["assess", DEMO, "--draw", "nope"]) == 2
    err = capsys.readouterr().err
    assert "no draw labelled 'nope'" in err and "baseline" in err


def test_assess_text_shows_status_words(capsys) -> None:
    assert main(["assess", DEMO]) == 0
    out = capsys.readouterr().out
    assert "Anion gap" in out and "valid" in out and "Decision support" in out
    assert max(len(line) for line in out.splitlines()) <= 80


def test_check_reports_file_line_field_and_exits_2(tmp_path, capsys) -> None:
    bad = tmp_path / "bad.yaml"
    bad.write_text("schema: 1\nlabel: x\ndraws:\n  - label: a\n    serum: {sodum: 140}\n")
    assert main(["check", str(bad), DEMO]) == 2
    captured = capsys.readouterr()
    assert (
        f"{bad}:5: draws[0].serum.sodum: unknown key 'sodum'; did you mean 'sodium'?"
        in captured.err
    )
    assert f"{DEMO}: ok" in captured.out


def test_check_all_demo_cases_ok(cases_dir, capsys) -> None:
    files = sorted(str(p) for p in cases_dir.glob("*.yaml"))
    assert files
    assert main(["check", *files]) == 0


@pytest.mark.parametrize("args", [["assess", "missing.yaml"], ["assess", "missing.yaml", "--json"]])
def test_missing_file_exits_2_without_traceback(args, capsys) -> None:
    assert main(args) == 2
    err = capsys.readouterr().err
    assert "cannot read" in err and "Traceback" not in err


def test_console_script_runs_in_a_fresh_process() -> None:
    out = subprocess.run(
        [sys.executable, "-m", "workup.cli", "assess", DEMO, "--json"],
        capture_output=True,
        text=True,
        check=False,
    )
    assert out.returncode == 0, out.stderr
    assert json.loads(out.stdout)["case"].startswith("Demo B")


def test_rules_of_another_state_are_not_repeated_as_case_cautions(capsys) -> None:
    # Demo F is a metabolic acidosis: the metabolic-alkalosis rule is not valid by design and
    # stays on screen with its status, but is not a caution about this case.
    main(["assess", "cases/ckd-acidosis.yaml", "--json"])
    out = json.loads(capsys.readouterr().out)
    assert out["indices"]["expected_pco2_metabolic_alkalosis"]["status"] == "not_valid"
    assert not any("metabolic alkalosis" in c for c in out["cautions"])
    # A not-valid index that matters is still a caution (Demo I: urine sodium 8).
    main(["assess", "cases/gi-loss-low-urine-sodium.yaml", "--json"])
    out = json.loads(capsys.readouterr().out)
    assert any("urine sodium 8" in c for c in out["cautions"])
