"""Property: ``propose`` never raises, whatever the text, and what it returns is consistent."""

from __future__ import annotations

from hypothesis import given, settings
from hypothesis import strategies as st

from workup.analytes import UnitSystem, analyte
from workup.model import Draw
from workup.paste import apply_proposal, propose

# Pieces of report text, so that generated lines look like reports often enough to reach the
# deeper paths (names, units, ranges, flags, dates, headings) and not only the "no name" path.
PIECES = [
    "Na",
    "K+",
    "Urine",
    "U",
    "CO2",
    "pCO2",
    "HCO3",
    "Creatinine",
    "Glucose",
    "pH",
    "Ketones",
    "BUN",
    "Urea",
    "Albumin",
    "Osmolality",
    "Chemistry",
    "Blood gas",
    "VBG",
    "24 hour urine",
    "Collected",
    "Drawn",
    "2026-11-30",
    "08:15",
    "30/11/2026",
    "03/04/26",
    "Nov 30, 2026",
    "138",
    "2.9",
    "7.31",
    "1,2",
    "<10",
    "-5",
    "1e9",
    "0",
    "mmol/L",
    "mg/dL",
    "umol/L",
    "µmol/L",
    "kPa",
    "mmHg",
    "g/dL",
    "mOsm/kg H2O",
    "(135-145)",
    "3.5-5.1",
    "H",
    "LL",
    "*",
    "critical",
    "neg",
    "2+",
    "trace",
    ":",
    ",",
    ";",
    "\t",
    " ",
    "  ",
    "\n",
    "(",
    ")",
    "[",
    "]",
    "—",
    "–",
]

report_text = st.lists(st.sampled_from(PIECES), max_size=40).map("".join)
units = st.sampled_from([None, UnitSystem.conventional, UnitSystem.si])


def _check(p) -> None:
    for e in p.entries:
        a = analyte(e.panel, e.key)
        low, high = a.hard
        assert low <= e.measurement.canonical <= high
        assert p.values[e.panel][e.key] is not None
    ids = [q.id for q in p.questions]
    assert len(ids) == len(set(ids))
    for q in p.questions:
        assert q.options  # a question always offers something to choose


@settings(max_examples=150, deadline=None)
@given(st.text(max_size=300), units)
def test_propose_never_raises_on_any_text(text: str, system) -> None:
    _check(propose(text, system))


@settings(max_examples=200, deadline=None)
@given(report_text, units)
def test_propose_never_raises_on_report_like_text(text: str, system) -> None:
    p = propose(text, system)
    _check(p)
    # Answering every question with its first option, or leaving all out, gives a valid draw.
    apply_proposal(Draw(label="x"), p, {q.id: 0 for q in p.questions})
    apply_proposal(Draw(label="x"), p, {q.id: None for q in p.questions})
