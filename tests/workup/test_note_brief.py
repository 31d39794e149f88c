"""The short note, the default of ``workup note``: about 15 lines, the caution always last."""

from __future__ import annotations

from pathlib import Path

import pytest

from workup.caseio import load_case
from workup.cautions import CAUTION_TEXT
from workup.cli import main
from workup.draw_focus import focused_assessment
from workup.note import draft_note

ROOT = Path(__file__).resolve().parents[2]
CASES = sorted((ROOT / "cases").glob("*.yaml"))


@pytest.mark.parametrize("path", CASES, ids=lambda p: p.stem)
def test_the_default_note_is_the_short_one_and_fits_a_consult(path, capsys) -> None:
    assert main(["note", str(path)]) == 0
    out = capsys.readouterr().out
    case = load_case(path)
    a, _focus = focused_assessment(case)
    assert out == draft_note(a, case, "brief", "text")
    lines = out.splitlines()
    assert len(lines) <= 20, len(lines)
    assert max(len(line) for line in lines) <= 80
    assert " ".join(out.split()).endswith(CAUTION_TEXT)
    full = draft_note(a, case, "full", "text")
    assert len(full.splitlines()) > len(lines)


def test_the_distal_rta_note_reads_the_acidosis_and_names_the_loading_draw(capsys) -> None:
    assert main(["note", str(ROOT / "cases" / "distal-rta-classic.yaml")]) == 0
    flat = " ".join(capsys.readouterr().out.split())
    assert "No acid-base disorder is identified" not in flat
    assert "Normal-gap metabolic acidosis" in flat
    assert '"bicarbonate 3 h" is a loading test, read by the causes' in flat
    # Invented demo values: UAG +25 and UOG 30 with the caution on the gap at urine pH 6.8
    # (the gap is read only in an acid urine, from memory).
    assert "UAG is +25.0 mmol/L (positive; read with caution" in flat
    assert "UOG is 30 mOsm/kg (low NH4)" in flat
    assert flat.count("Classic distal RTA (type 1) is likely") == 1


def test_the_full_style_is_still_available(capsys) -> None:
    path = ROOT / "cases" / "distal-rta-classic.yaml"
    assert main(["note", str(path), "--style", "full"]) == 0
    out = capsys.readouterr().out
    assert len(out.splitlines()) > 40
    assert "Considered unlikely" in out
