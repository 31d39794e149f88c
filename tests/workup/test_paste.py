"""The paste parser: invented report layouts, the unit rules, questions, and applying a proposal.

Every fixture under tests/workup/lab_reports/ is an invented layout (no real laboratory, record
system or patient); its first lines say so. Lines starting with "#" are blanked before parsing so
that line numbers stay those of the file.

Unit factors are those of workup/analytes.py (molar masses from the IUPAC standard atomic
weights; the conversion factors are arithmetic from them). Plausibility
limits are workup's own generous limits (common practice, from memory), not reference intervals.
"""

from __future__ import annotations

from datetime import datetime

import pytest

from tests.workup.helpers.lab_reports import _report
from workup.analytes import UnitSystem
from workup.paste import (
    Proposal,
    propose,
)


def _values(p: Proposal) -> dict[tuple[str, str], tuple[float | str, str]]:
    return {
        (e.panel, e.key): (
            e.measurement.word if e.measurement.word is not None else e.measurement.value,
            e.measurement.unit,
        )
        for e in p.entries
    }


# For each invented layout: every value that must land in a field (value and unit as written),
# the questions (kind, lines), the lines not taken (line: refused?), and the layout lines
# (headings, times, column titles) that are consumed without a value.
FIXTURES = {
    "chemistry_tabbed.txt": dict(
        units=None,
        taken=datetime(2026, 11, 30, 8, 15),
        values={
            ("serum", "sodium"): (139, "mmol/L"),
            ("serum", "potassium"): (2.9, "mmol/L"),
            ("serum", "chloride"): (116, "mmol/L"),
            ("serum", "bicarbonate"): (15, "mmol/L"),
            ("serum", "urea_nitrogen"): (12, "mg/dL"),
            ("serum", "creatinine"): (0.8, "mg/dL"),
            ("serum", "glucose"): (88, "mg/dL"),
            ("serum", "calcium"): (9.1, "mg/dL"),
            ("serum", "phosphate"): (2.1, "mg/dL"),
            ("serum", "albumin"): (4.1, "g/dL"),
            ("serum", "osmolality"): (290, "mOsm/kg"),
        },
        questions=[],
        unrecognised={13: False, 16: False, 19: False},
        layout={3, 4, 5},
    ),
    "colon_si.txt": dict(
        units=UnitSystem.si,
        taken=datetime(2026, 11, 30, 7, 40),
        values={
            ("serum", "sodium"): (137, "mmol/L"),
            ("serum", "potassium"): (6.1, "mmol/L"),
            ("serum", "chloride"): (112, "mmol/L"),
            ("serum", "bicarbonate"): (17, "mmol/L"),
            ("serum", "urea"): (14.2, "mmol/L"),
            ("serum", "creatinine"): (168, "umol/L"),
            ("serum", "glucose"): (5.4, "mmol/L"),
            ("serum", "albumin"): (39, "g/L"),
            ("urine", "sodium"): (48, "mmol/L"),
            ("urine", "potassium"): (21, "mmol/L"),
            ("urine", "chloride"): (52, "mmol/L"),
            ("urine", "osmolality"): (410, "mOsm/kg"),
            ("urine", "creatinine"): (7.9, "mmol/L"),
            ("urine", "ph"): (5.2, ""),
            ("urine", "urea"): (160, "mmol/L"),
        },
        questions=[],
        unrecognised={},
        layout={3, 4, 14},
    ),
    "gas_block.txt": dict(
        units=None,
        taken=datetime(2026, 11, 30, 8, 20),
        values={
            ("blood_gas", "ph"): (7.29, ""),
            ("blood_gas", "pco2"): (3.9, "kPa"),
            ("blood_gas", "bicarbonate"): (13.8, "mmol/L"),
        },
        questions=[("co2", [10]), ("confirm", [11]), ("confirm", [12])],
        unrecognised={6: False, 8: False, 9: False, 13: False},
        layout={3},
    ),
    "two_times.txt": dict(
        units=None,
        taken=None,
        values={
            ("serum", "sodium"): (138, "mmol/L"),
            ("serum", "creatinine"): (0.9, "mg/dL"),
        },
        questions=[("conflict", [6]), ("conflict", [7]), ("time", [4])],
        unrecognised={},
        layout={3, 4},
    ),
    "messy_mixed.txt": dict(
        units=None,
        taken=None,
        values={
            ("serum", "lactate"): (0.9, "mmol/L"),
            ("serum", "albumin"): (2.9, "g/dL"),
            ("urine", "sodium"): (35, "mmol/L"),
            ("urine", "potassium"): (30, "mmol/L"),
            ("urine", "creatinine"): (62, "mg/dL"),
            ("urine", "ph"): (6.9, ""),
            ("serum", "sodium"): (137, "mmol/L"),
        },
        questions=[
            ("panel", [5]),
            ("panel", [6]),
            ("panel", [7]),
            ("panel", [8]),
            ("panel", [9]),
            ("time", [4, 20]),
        ],
        unrecognised={12: True, 15: True, 18: False, 19: True, 22: False, 23: False},
        layout={4, 20},
    ),
}


@pytest.mark.parametrize("name", sorted(FIXTURES))
def test_each_invented_layout_lands_every_value_or_reports_it(name: str) -> None:
    want = FIXTURES[name]
    text = _report(name)
    p = propose(text, want["units"])
    assert _values(p) == want["values"]
    assert [(q.kind, [s.number for s in q.sources]) for q in p.questions] == want["questions"]
    assert {u.source.number: u.refused for u in p.unrecognised} == want["unrecognised"]
    assert p.taken == want["taken"]
    # Every line with text is accounted for: a value, a question, a reason, or layout.
    used = {e.source.number for e in p.entries}
    used |= {s.number for q in p.questions for s in q.sources}
    used |= {u.source.number for u in p.unrecognised}
    used |= want["layout"]
    lines = {i for i, line in enumerate(text.split("\n"), start=1) if line.strip()}
    assert lines == used


def test_values_keep_their_source_lines_and_flags() -> None:
    p = propose(_report("chemistry_tabbed.txt"))
    assert p.sources["serum"]["potassium"].number == 7
    assert p.sources["serum"]["potassium"].text.startswith("Potassium\t2.9")
    k = next(e for e in p.entries if e.key == "potassium")
    assert k.flags == ("L",)


def test_canonical_values_use_the_catalogue_factors() -> None:
    # Creatinine mg/dL x 88.4 = umol/L; glucose mg/dL / 18 = mmol/L (molar masses 113.12 and
    # 180.16 g/mol from the IUPAC standard atomic weights; arithmetic).
    p = propose(_report("chemistry_tabbed.txt"))
    assert p.values["serum"]["creatinine"].canonical == pytest.approx(0.8 * 88.4, rel=1e-3)
    assert p.values["serum"]["glucose"].canonical == pytest.approx(88 / 18.016, rel=1e-3)


def test_the_gas_heading_names_the_sample() -> None:
    assert propose(_report("gas_block.txt")).gas_sample == "arterial"
    assert propose("VBG\npH 7.30\npCO2 48 mmHg").gas_sample == "venous"


# -- unit rules -----------------------------------------------------------------------------


def test_a_bare_ambiguous_number_without_default_is_a_unit_question() -> None:
    p = propose("Chemistry\nGlucose 98")
    assert p.entries == ()
    (q,) = p.questions
    assert q.kind == "unit"
    assert {o.entry.measurement.unit for o in q.options if o.entry} == {"mmol/L", "mg/dL"}


def test_a_bare_number_follows_the_explicit_default() -> None:
    p = propose("Chemistry\nGlucose 98", UnitSystem.conventional)
    assert p.values["serum"]["glucose"].unit == "mg/dL"
    assert p.values["serum"]["glucose"].bare


def test_a_unit_in_the_text_wins_over_the_default() -> None:
    p = propose("Chemistry\nGlucose 5.4 mmol/L", UnitSystem.conventional)
    assert p.values["serum"]["glucose"].unit == "mmol/L"


def test_a_unit_is_never_inferred_from_which_units_make_the_number_possible() -> None:
    # 30 kPa would be 225 mmHg, beyond the hard limit, so only mmHg is offered: still a question.
    p = propose("Blood gas\npCO2 30")
    assert p.entries == ()
    (q,) = p.questions
    assert [o.entry.measurement.unit for o in q.options if o.entry] == ["mmHg"]


def test_a_panel_is_never_inferred_from_which_panel_makes_the_number_possible() -> None:
    # 1.1 mg/dL is impossible as a urine creatinine (workup's hard limit, from memory), so only
    # serum is offered; the user still answers.
    p = propose("Cr 1.1 mg/dL")
    (q,) = p.questions
    assert q.kind == "panel"
    assert [o.entry.panel for o in q.options if o.entry] == ["serum"]


def test_an_impossible_value_is_refused_with_the_read_value_reason() -> None:
    p = propose("Chemistry\nSodium 1380 mmol/L")
    (u,) = p.unrecognised
    assert u.refused
    assert "not a possible sodium" in u.reason


def test_an_unknown_unit_is_refused() -> None:
    p = propose("Chemistry\nSodium 138 mg/L")
    (u,) = p.unrecognised
    assert u.refused and "unknown unit" in u.reason


def test_a_timed_urine_collection_is_not_read_as_spot_urine() -> None:
    p = propose("24 hour urine\nSodium 120 mmol/L")
    assert p.entries == ()
    assert "timed" in p.unrecognised[0].reason


# -- names, markers, sections ---------------------------------------------------------------


@pytest.mark.parametrize(
    "line",
    ["Urine Na 40", "U Na 40", "UNa 40", "Na (urine) 40", "Sodium, urine 40", "Urine sodium: 40"],
)
def test_urine_forms_of_a_name(line: str) -> None:
    p = propose(line)
    assert _values(p) == {("urine", "sodium"): (40, "mmol/L")}


def test_a_name_in_one_panel_only_outside_urine_needs_no_heading() -> None:
    assert _values(propose("Albumin 3.9 g/dL")) == {("serum", "albumin"): (3.9, "g/dL")}


def test_a_urine_only_name_without_urine_marker_is_confirmed() -> None:
    (q,) = propose("Ammonium 20 mmol/L").questions
    assert q.kind == "confirm"


def test_co2_is_total_co2_on_a_chemistry_report() -> None:
    assert _values(propose("Chemistry\nCO2 22 mmol/L")) == {
        ("serum", "bicarbonate"): (22, "mmol/L")
    }


def test_co2_on_a_gas_report_is_asked_even_with_a_unit_of_either() -> None:
    (q,) = propose("Blood gas\nCO2 30").questions
    assert q.kind == "co2"
    fields = {(o.entry.panel, o.entry.key) for o in q.options if o.entry}
    assert fields == {("blood_gas", "pco2"), ("serum", "bicarbonate")}


def test_several_analytes_on_one_line() -> None:
    p = propose("Chemistry\nNa 138, K 4.1; Cl 104 HCO3 22")
    assert _values(p) == {
        ("serum", "sodium"): (138, "mmol/L"),
        ("serum", "potassium"): (4.1, "mmol/L"),
        ("serum", "chloride"): (104, "mmol/L"),
        ("serum", "bicarbonate"): (22, "mmol/L"),
    }


def test_one_value_printed_in_two_units_is_one_value() -> None:
    p = propose("Chemistry\nCreatinine 1.1 mg/dL (97 umol/L)")
    assert p.questions == ()
    assert p.values["serum"]["creatinine"].unit == "mg/dL"


def test_two_different_values_on_one_line_are_asked() -> None:
    (q,) = propose("Chemistry\nSodium 138 mmol/L 131 mmol/L").questions
    assert q.kind == "conflict"
    assert len(q.options) == 2


def test_repeated_analyte_with_the_same_value_is_not_a_question() -> None:
    p = propose("Chemistry\nSodium 138 mmol/L\nSodium 138 mmol/L")
    assert p.questions == ()
    assert p.sources["serum"]["sodium"].number == 2


def test_known_unused_results_say_why() -> None:
    p = propose("Chemistry\nAnion gap 14\nIonized calcium 1.1 mmol/L\nStd HCO3 18")
    reasons = [u.reason for u in p.unrecognised]
    assert "computes" in reasons[0]
    assert "ionized" in reasons[1]
    assert "standard bicarbonate" in reasons[2]


# -- times ----------------------------------------------------------------------------------


@pytest.mark.parametrize(
    ("line", "when"),
    [
        ("Collected: 2026-11-30 08:15", datetime(2026, 11, 30, 8, 15)),
        ("Collected 30/11/2026 08:15", datetime(2026, 11, 30, 8, 15)),
        ("Drawn 11/30/2026 0815", datetime(2026, 11, 30, 8, 15)),
        ("Collection time Nov 30, 2026 2:15 PM", datetime(2026, 11, 30, 14, 15)),
        ("Specimen collected 30-Nov-26 14:30", datetime(2026, 11, 30, 14, 30)),
    ],
)
def test_collection_times(line: str, when: datetime) -> None:
    assert propose(line + "\nChemistry\nSodium 140 mmol/L").taken == when


def test_day_and_month_are_never_guessed() -> None:
    p = propose("Collected 03/04/2026 10:00\nChemistry\nSodium 140 mmol/L")
    assert p.taken is None
    assert "could be day 3" in p.unrecognised[0].reason


def test_a_date_without_a_time_of_day_does_not_set_the_time() -> None:
    p = propose("Collected 2026-11-30\nChemistry\nSodium 140 mmol/L")
    assert p.taken is None
    assert "no time of day" in p.unrecognised[0].reason


# -- resolving and applying -----------------------------------------------------------------
