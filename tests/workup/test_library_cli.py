"""``workup list``: rows, JSON, search terms, cohort CSV and the exit codes."""

from __future__ import annotations

import csv
import io
import json
import shutil
from pathlib import Path

import pytest

from workup.cli import main


@pytest.fixture
def folder(tmp_path: Path, cases_dir: Path) -> Path:
    out = tmp_path / "cases"
    shutil.copytree(cases_dir, out)
    (out / "broken.yaml").write_text("schema: 1\nlabel: [unclosed\n", encoding="utf-8")
    return out


def test_lists_every_case_and_the_broken_file(folder: Path, capsys) -> None:
    assert main(["list", str(folder)]) == 0
    out, err = capsys.readouterr()
    lines = out.splitlines()
    assert lines[0].startswith("FILE") and "LEADING CAUSE" in lines[0] and "PENDING" in lines[0]
    n = len(list(folder.glob("*.yaml")))
    assert len([ln for ln in lines[1:] if not ln.startswith(" ")]) == n
    assert any(ln.startswith("broken.yaml") and "DID NOT LOAD" in ln for ln in lines)
    assert f"{n} of {n} case file(s)" in err and "1 did not load" in err


def test_json_has_one_object_per_case(folder: Path, capsys) -> None:
    assert main(["list", str(folder), "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert len(data) == len(list(folder.glob("*.yaml")))
    by_file = {d["file"]: d for d in data}
    assert (
        by_file["broken.yaml"]["ok"] is False
        and "not valid YAML" in by_file["broken.yaml"]["error"]
    )
    distal = by_file["distal-rta-classic.yaml"]
    assert distal["ok"] and distal["draws"] == 2 and distal["latest_taken"] == "2026-11-22T13:30"
    assert set(distal) >= {"label", "leading", "pending", "next_test", "loading_expected"}


def test_search_terms_filter_and_report_the_matched_values(folder: Path, capsys) -> None:
    assert main(["list", str(folder), "--json", "k<3.0"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data, "the demo library has a case with potassium below 3.0"
    for d in data:
        assert d["match"]["values"][0]["field"] == "serum.potassium"
        assert d["match"]["values"][0]["value"] < 3.0
        assert d["match"]["values"][0]["status"] in ("measured", "unusual")
    assert main(["list", str(folder), "k<3.0"]) == 0
    assert "at draw" in capsys.readouterr().out


def test_default_folder_comes_from_workup_cases(folder: Path, capsys, monkeypatch) -> None:
    monkeypatch.setenv("WORKUP_CASES", str(folder))
    assert main(["list", "is:broken", "--json"]) == 0
    assert [d["file"] for d in json.loads(capsys.readouterr().out)] == ["broken.yaml"]


def test_cohort_csv(folder: Path, tmp_path: Path, capsys) -> None:
    target = tmp_path / "audit.csv"
    assert main(["list", str(folder), "--cohort", "--csv", str(target)]) == 0
    rows = list(csv.reader(io.StringIO(target.read_text(encoding="utf-8"))))
    assert rows[0][0] == "month" and sum(int(r[4]) for r in rows[1:]) == len(
        list(folder.glob("*.yaml"))
    )
    assert main(["list", str(folder), "--cohort"]) == 0
    assert "By leading pattern" in capsys.readouterr().out


@pytest.mark.parametrize(
    ("args", "code", "message"),
    [
        (["list", "/no/such/folder/anywhere"], 2, "no such folder"),
        (["list", "{folder}", "uga>0"], 2, "unknown index or analyte"),
        (["list", "{folder}", "--csv", "x.csv"], 2, "--csv needs --cohort"),
        (["list", "{folder}", "--cohort", "--csv", "{tmp}/a-file/a.csv"], 1, "cannot write"),
    ],
)
def test_exit_codes(folder: Path, tmp_path: Path, capsys, args, code, message) -> None:
    (tmp_path / "a-file").write_text("a file, so no folder can be made here", encoding="utf-8")
    argv = [a.format(folder=folder, tmp=tmp_path) for a in args]
    assert main(argv) == code
    assert message in capsys.readouterr().err


def test_rebuild_discards_the_cache(folder: Path, capsys) -> None:
    assert main(["list", str(folder), "--json"]) == 0
    first = capsys.readouterr().out
    assert main(["list", str(folder), "--json", "--rebuild"]) == 0
    assert capsys.readouterr().out == first


def test_a_case_with_no_likely_cause_names_none_as_leading(capsys) -> None:
    # Invented demo G: the low bicarbonate is compensation for a respiratory alkalosis, so the
    # best-ranked cause is unlikely and must not read as the leading cause.
    from workup.cli import main

    assert main(["list", "cases", "respiratory"]) == 0
    out = capsys.readouterr().out
    row = next(line for line in out.splitlines() if line.startswith("respiratory-alk"))
    assert "none likely" in row and "Bicarbonate loss" not in row


def test_an_unchanged_repeat_listing_needs_neither_the_model_nor_yaml(
    folder: Path, tmp_path: Path
) -> None:
    """The warm listing reads the index only: no pydantic, no YAML, no calculators."""
    import os
    import subprocess
    import sys

    env = dict(os.environ, XDG_CACHE_HOME=str(tmp_path / "cache"))
    env["XDG_CONFIG_HOME"] = str(tmp_path / "config")  # no user settings file
    listing = [sys.executable, "-m", "workup.cli", "list", str(folder), "--json"]
    subprocess.run(listing, env=env, capture_output=True, check=True)  # builds the index
    probe = (
        "import sys, io\n"
        "from workup.cli import main\n"
        "out, sys.stdout = sys.stdout, io.StringIO()\n"
        f"code = main(['list', {str(folder)!r}, '--json'])\n"
        "sys.stdout = out\n"
        "heavy = [m for m in ('pydantic', 'yaml', 'workup.assess', 'workup.model') "
        "if m in sys.modules]\n"
        "print(code, heavy)\n"
    )
    done = subprocess.run([sys.executable, "-c", probe], env=env, capture_output=True, text=True)
    assert done.stdout.strip() == "0 []", done.stdout + done.stderr


def _objects_from_entries(folder: Path, reverse: bool) -> list[dict]:
    """The --json objects as the general path makes them: entries, sorted, each to_json."""
    from workup.library import list_library, sort_entries

    return [e.to_json() for e in sort_entries(list_library(folder), "file", reverse)]


@pytest.mark.parametrize("reverse", [False, True])
def test_plain_json_listing_from_stored_rows_matches_the_entries(
    folder: Path, capsys, reverse: bool
) -> None:
    """The plain ``--json`` listing writes each row's stored JSON; it must say exactly what the
    entries say, in the same order (files that did not load last), cold, warm and after an edit."""
    flag = ["--reverse"] if reverse else []
    outputs = []
    for step in ("cold", "warm", "edited"):
        if step == "edited":
            path = folder / "distal-rta-classic.yaml"
            path.write_text(path.read_text(encoding="utf-8") + "# edited\n", encoding="utf-8")
        assert main(["list", str(folder), "--json", *flag]) == 0
        out, err = capsys.readouterr()
        outputs.append(out)
        assert json.loads(out) == _objects_from_entries(folder, reverse), step
        n = len(list(folder.glob("*.yaml")))
        assert f"{n} of {n} case file(s)" in err and "1 did not load" in err
    files = [d["file"] for d in json.loads(outputs[0])]
    assert files[-1] == "broken.yaml" and files[:-1] == sorted(files[:-1], reverse=reverse)
    assert outputs[0] == outputs[1] == outputs[2]
