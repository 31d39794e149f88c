"""Every number in a drafted note is a number the assessment reports or a value entered for it.

The check reads ``workup assess --json`` for the same case (run in-process through
``workup.cli.main``), formats each index value, lower and upper bound the way
``workup.formatting`` rounds them, and collects every number written inside the JSON's texts
(reasons, evidence, notes, tests, cautions). The note's values line must repeat the draw's
entered values exactly; every other number must be one of the JSON's. ``assess --json`` does not
carry the entered values themselves, so those are read from the case file.
"""

from __future__ import annotations

import json
import re
from pathlib import Path
from typing import Any

import pytest
import yaml

from workup.assess import assess
from workup.caseio import load_case
from workup.cli import main
from workup.draw_focus import focused_assessment
from workup.formatting import fmt_number
from workup.note import draft_note
from workup.notes.render import ascii_text
from workup.notes.sections import build

ROOT = Path(__file__).resolve().parents[2]
CASES = sorted((ROOT / "cases").glob("*.yaml"))

# A number not glued to a letter (so the 2 of pCO2 and the 4 of NH4 are names, not numbers).
NUMBER = re.compile(r"(?<![A-Za-z0-9.])[-+\u2212]?\d+(?:\.\d+)?")
DATE_TIME = re.compile(r"\d{4}-\d{2}-\d{2}(?: \d{2}:\d{2})?")


def numbers(text: str) -> list[str]:
    """The unsigned numbers written in ``text`` (signs are compared through the values)."""
    return [m.group().lstrip("+-\u2212") for m in NUMBER.finditer(text)]


def _strings(obj: Any):
    # Formulas and citations are not read into the note; leaving them out keeps their numbers
    # (coefficients, years, pages) from excusing a stray number.
    if isinstance(obj, str):
        yield obj
    elif isinstance(obj, dict):
        for k, v in obj.items():
            if k not in ("formula", "source"):
                yield from _strings(v)
    elif isinstance(obj, list):
        for v in obj:
            yield from _strings(v)


def json_numbers(data: dict[str, Any]) -> set[str]:
    """Every number ``assess --json`` reports, rounded as the formatting module rounds."""
    out: set[str] = set()
    for f in data["indices"].values():
        for key in ("value", "low", "high"):
            if f.get(key) is not None:
                out.add(fmt_number(f[key], f["unit"]).lstrip("-"))
    for text in _strings(data):
        out.update(numbers(text))
    return out


def entered_numbers(path: Path) -> set[float]:
    """Every number written in the case file's draws (the values as entered)."""
    raw = yaml.safe_load(path.read_text(encoding="utf-8"))
    out: set[float] = set()
    for draw in raw.get("draws", []):
        for panel in ("serum", "blood_gas", "urine"):
            for v in (draw.get(panel) or {}).values():
                if isinstance(v, bool):
                    continue
                if isinstance(v, int | float):
                    out.add(float(v))
                elif isinstance(v, str):
                    out.update(float(n) for n in numbers(v))
    return out


def _scrub(text: str, case) -> str:
    """Drop the case label, draw labels and draw times: names and dates, not values."""
    for label in sorted([case.label, *(d.label for d in case.draws)], key=len, reverse=True):
        text = text.replace(label, " ").replace(ascii_text(label), " ")
    return DATE_TIME.sub(" ", text)


def _assess_json(path: Path, capsys) -> dict[str, Any]:
    capsys.readouterr()
    assert main(["assess", str(path), "--json"]) == 0
    return json.loads(capsys.readouterr().out)


@pytest.mark.parametrize("path", CASES, ids=lambda p: p.stem)
@pytest.mark.parametrize("style", ["brief", "full"])
@pytest.mark.parametrize("fmt", ["text", "markdown"])
def test_every_number_in_the_note_is_reported_or_entered(path, style, fmt, capsys) -> None:
    reported = json_numbers(_assess_json(path, capsys))
    entered = entered_numbers(path)
    case = load_case(path)
    # The draw ``workup note`` and ``workup assess`` both open on by default.
    a, _focus = focused_assessment(case)
    note = _scrub(draft_note(a, case, style, fmt), case)
    stray = [n for n in numbers(note) if n not in reported and float(n) not in entered]
    assert stray == [], f"numbers neither reported nor entered: {stray}"


@pytest.mark.parametrize("path", CASES, ids=lambda p: p.stem)
@pytest.mark.parametrize("brief", [True, False])
def test_values_line_repeats_entered_values_and_the_rest_repeats_the_assessment(
    path, brief, capsys
) -> None:
    reported = json_numbers(_assess_json(path, capsys))
    entered = entered_numbers(path)
    case = load_case(path)
    a, _focus = focused_assessment(case)
    serum_k = {d.serum.canonical("potassium") for d in case.draws if d.label == a.draw_label}
    for section in build(a, case, brief):
        texts = [section.title, *section.sentences, *section.items]
        found = [n for t in texts for n in numbers(_scrub(t, case))]
        if section.key == "values":
            assert found, "the values line shows no values"
            assert [n for n in found if float(n) not in entered] == []
        elif section.key == "acid_base" and brief:
            # The short note opens with the gas as entered, then the assessment's numbers.
            assert [n for n in found if n not in reported and float(n) not in entered] == []
        elif section.key == "potassium":
            # The serum potassium is restated beside the kidney's handling of it.
            assert [n for n in found if n not in reported and float(n) not in serum_k] == []
        else:
            assert [n for n in found if n not in reported] == [], section.key


def test_values_line_keeps_each_value_as_written(tmp_path) -> None:
    # Invented values. A laboratory's "7.40" and "3.0" keep their decimals; nothing is rounded.
    path = tmp_path / "c.yaml"
    path.write_text(
        "schema: 1\nlabel: Test - values as written\nunits: conventional\n"
        "draws:\n  - label: one\n"
        "    serum: {sodium: 139.5, potassium: 3.0, chloride: 110, bicarbonate: 20,"
        " creatinine: 1.25 mg/dL}\n"
        "    urine: {creatinine: 12345.67 umol/L}\n"
        "    blood_gas: {ph: 7.40, pco2: 4.2 kPa}\n",
        encoding="utf-8",
    )
    case = load_case(path)
    flat = " ".join(draft_note(assess(case), case, "full").split())
    assert "creatinine 12345.67 umol/L" in flat
    note = draft_note(assess(case), case, "brief")
    flat = " ".join(note.split())
    assert "pH 7.40, pCO2 4.2 kPa; serum HCO3 20 mmol/L" in flat  # the short note's gas
    note = draft_note(assess(case), case, "full")
    flat = " ".join(note.split())
    assert "Na 139.5" in flat
    assert "K 3.0" in flat
    assert "creatinine 1.25 mg/dL" in flat
    assert "pH 7.40" in flat
    assert "pCO2 4.2 kPa" in flat


def test_number_pattern_reads_values_and_skips_names() -> None:
    assert numbers("pCO2 30 mmHg, NH4 +25.0, gap \u22125.5, HCO3 15") == ["30", "25.0", "5.5", "15"]


def test_the_trace_catches_a_number_nobody_reported(capsys) -> None:
    # Negative control: the check above must be able to fail.
    path = ROOT / "cases" / "gi-loss-diarrhea.yaml"
    reported = json_numbers(_assess_json(path, capsys))
    entered = entered_numbers(path)
    forged = "The anion gap is +31.7 mmol/L (high) in 4242 samples."
    stray = [n for n in numbers(forged) if n not in reported and float(n) not in entered]
    assert stray == ["31.7", "4242"]
