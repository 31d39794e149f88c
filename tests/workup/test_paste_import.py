"""``workup import``: the printed proposal, JSON, exit codes, and appending a draw to a case.

The reports are the invented layouts under tests/workup/lab_reports/ (lines starting with "#"
there are comments that the parser reads as unrecognised text, so these tests write their own
comment-free copies where that matters).
"""

from __future__ import annotations

import io
import json
import shutil
from pathlib import Path

import pytest

from workup.caseio import load_case
from workup.cli import main

REPORTS = Path(__file__).parent / "lab_reports"
DEMO = Path(__file__).resolve().parents[2] / "cases" / "distal-rta-classic.yaml"


def _clean_copy(tmp_path: Path, name: str) -> Path:
    text = (REPORTS / name).read_text(encoding="utf-8")
    out = tmp_path / name
    out.write_text(
        "\n".join(line for line in text.split("\n") if not line.startswith("#")), "utf-8"
    )
    return out


def test_prints_each_value_with_its_source_line(capsys, tmp_path) -> None:
    report = _clean_copy(tmp_path, "chemistry_tabbed.txt")
    assert main(["import", str(report)]) == 0
    out = capsys.readouterr().out
    assert "collected: 2026-11-30 08:15" in out
    assert "line 5: Potassium 2.9 L mmol/L 3.5-5.1 Final" in out
    assert "Not taken (3)" in out and "magnesium" in out


def test_json_lists_values_questions_and_unrecognised(capsys, tmp_path) -> None:
    report = _clean_copy(tmp_path, "gas_block.txt")
    assert main(["import", str(report), "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    ph = next(v for v in data["values"] if v["key"] == "ph")
    assert ph == {**ph, "panel": "blood_gas", "value": 7.29, "status": "read", "line": 2}
    assert [q["kind"] for q in data["questions"]] == ["co2", "confirm", "confirm"]
    assert all(q["options"] for q in data["questions"])
    assert {u["line"] for u in data["unrecognised"]} == {4, 6, 7, 11}


def test_reads_standard_input(capsys, monkeypatch) -> None:
    monkeypatch.setattr("sys.stdin", io.TextIOWrapper(io.BytesIO(b"Chemistry\nNa 140 mmol/L\n")))
    assert main(["import", "-"]) == 0
    assert "sodium" in capsys.readouterr().out


def test_units_option_reads_bare_numbers(capsys, tmp_path) -> None:
    report = tmp_path / "r.txt"
    report.write_text("Chemistry\nGlucose 98\n", "utf-8")
    main(["import", str(report), "--json"])
    assert json.loads(capsys.readouterr().out)["questions"][0]["kind"] == "unit"
    main(["import", str(report), "--json", "--units", "conventional"])
    assert json.loads(capsys.readouterr().out)["values"][0]["unit"] == "mg/dL"


def test_into_appends_a_draw_and_keeps_the_rest_of_the_file(capsys, tmp_path) -> None:
    case = tmp_path / "case.yaml"
    shutil.copy(DEMO, case)
    before = case.read_text("utf-8")
    report = _clean_copy(tmp_path, "chemistry_tabbed.txt")
    assert main(["import", str(report), "--into", str(case), "--label", "day 5"]) == 0
    after = case.read_text("utf-8")
    assert after.startswith(before.rstrip("\n"))  # every existing byte kept, comments too
    loaded = load_case(case)
    new = loaded.draw("day 5")
    assert new.serum.potassium.value == 2.9
    assert new.serum.creatinine.unit == "mg/dL"
    assert new.taken is not None and new.taken.isoformat() == "2026-11-30T08:15:00"
    assert len(loaded.draws) == len(load_case(DEMO).draws) + 1


def test_into_refuses_when_anything_is_ambiguous(capsys, tmp_path) -> None:
    case = tmp_path / "case.yaml"
    shutil.copy(DEMO, case)
    before = case.read_bytes()
    report = _clean_copy(tmp_path, "gas_block.txt")
    assert main(["import", str(report), "--into", str(case)]) == 2
    err = capsys.readouterr().err
    assert "3 question(s)" in err and "q1:" in err
    assert case.read_bytes() == before


def test_into_refuses_a_label_already_used(capsys, tmp_path) -> None:
    case = tmp_path / "case.yaml"
    shutil.copy(DEMO, case)
    report = _clean_copy(tmp_path, "chemistry_tabbed.txt")
    assert main(["import", str(report), "--into", str(case), "--label", "baseline"]) == 2
    assert "already labelled 'baseline'" in capsys.readouterr().err


def test_default_label_names_the_time_and_stays_unique(capsys, tmp_path) -> None:
    case = tmp_path / "case.yaml"
    case.write_text("schema: 1\nlabel: invented test case\nunits: conventional\n", "utf-8")
    report = _clean_copy(tmp_path, "chemistry_tabbed.txt")
    assert main(["import", str(report), "--into", str(case)]) == 0
    assert main(["import", str(report), "--into", str(case)]) == 0
    labels = [d.label for d in load_case(case).draws]
    assert labels == ["pasted 2026-11-30 08:15", "pasted 2026-11-30 08:15 (2)"]


@pytest.mark.parametrize(
    ("args", "message"),
    [
        (["no-such-report.txt"], "cannot read the file"),
        (["REPORT", "--into", "no-such-case.yaml"], "cannot read the file"),
    ],
)
def test_bad_inputs_exit_2(capsys, tmp_path, args, message) -> None:
    report = _clean_copy(tmp_path, "chemistry_tabbed.txt")
    args = [
        str(report) if a == "REPORT" else str(tmp_path / a) if a.startswith("no-") else a
        for a in args
    ]
    assert main(["import", *args]) == 2
    assert message in capsys.readouterr().err


def test_a_binary_file_exits_2(capsys, tmp_path) -> None:
    report = tmp_path / "r.bin"
    report.write_bytes(b"\xff\xfe\x00garbage")
    assert main(["import", str(report)]) == 2
    assert "not UTF-8" in capsys.readouterr().err
