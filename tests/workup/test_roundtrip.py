"""Comment-keeping saves: the merged file keeps comments, order and style, and reads back exactly.

The demo cases are invented scenarios; the edits below are arbitrary values, not clinical ones.
"""

from __future__ import annotations

from pathlib import Path

import pytest
import yaml
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from workup.analytes import Panel, analyte
from workup.caseio import case_from_text, dump_case, load_case
from workup.equivalence import same_case
from workup.model import Draw
from workup.quantity import read_value
from workup.roundtrip import WIDTH, RoundTripError, roundtrip_text

CASES = sorted((Path(__file__).resolve().parents[2] / "cases").glob("*.yaml"))

COMMENTED = """\
# Invented case for the round-trip tests.
schema: 1
label: Round trip   # trailing comment on the label
units: conventional
# the context, chosen by hand
context: [diarrhea]
draws:
  # first draw
  - label: day 1
    taken: 2026-11-20T09:10
    serum: {sodium: 139, potassium: 3.1, chloride: 115, bicarbonate: "15 mmol/L",
            creatinine: 0.9 mg/dL}
    blood_gas: {ph: 7.30, pco2: 29 mmHg}   # arterial
  # second draw
  - label: day 2
    serum: {sodium: 140, chloride: 110, bicarbonate: 18}
"""


def _comments(text: str) -> list[str]:
    return [line.split("#", 1)[1].strip() for line in text.splitlines() if "#" in line]


def _measure(panel: Panel, key: str, raw: object):
    return read_value(analyte(panel, key), raw, None)


@pytest.mark.parametrize("path", CASES, ids=lambda p: p.name)
def test_an_unchanged_demo_case_keeps_its_comments_and_reads_back(path):
    text = path.read_text()
    case = load_case(path)
    out = roundtrip_text(text, case)
    assert same_case(case_from_text(out), case)
    assert _comments(out) == _comments(text)
    assert list(yaml.safe_load(out)) == list(yaml.safe_load(text))  # key order
    assert not out.startswith("%YAML")
    longest = max(WIDTH, *(len(line) for line in text.splitlines()))
    assert all(len(line) <= longest for line in out.splitlines())


def test_unchanged_values_keep_the_way_they_were_written():
    case = case_from_text(COMMENTED)
    case.draws[0].serum.sodium = _measure(Panel.serum, "sodium", 141)
    out = roundtrip_text(COMMENTED, case)
    assert "ph: 7.30" in out  # not rewritten as 7.3
    assert 'bicarbonate: "15 mmol/L"' in out  # not rewritten as a bare 15
    assert "sodium: 141" in out
    assert _comments(out) == _comments(COMMENTED)
    assert same_case(case_from_text(out), case)


def test_keys_are_added_in_place_and_removed():
    case = case_from_text(COMMENTED)
    case.notes = "added notes"
    case.draws[1].urine.potassium = _measure(Panel.urine, "potassium", 30)
    case.draws[0].serum.creatinine = None
    out = roundtrip_text(COMMENTED, case)
    keys = list(yaml.safe_load(out))
    assert keys.index("context") < keys.index("notes") < keys.index("draws")
    assert "urine: {potassium: 30}" in out
    assert "creatinine" not in out
    assert same_case(case_from_text(out), case)
    assert "first draw" in out and "the context, chosen by hand" in out


def test_draws_are_matched_by_label_when_added_and_removed():
    case = case_from_text(COMMENTED)
    new = Draw.model_validate({"label": "day 0", "serum": {"sodium": 138}})
    case.draws = [new, case.draws[1]]
    out = roundtrip_text(COMMENTED, case)
    assert same_case(case_from_text(out), case)
    assert "blood_gas" not in out
    assert "trailing comment on the label" in out
    assert out.index("day 0") < out.index("day 2")


def test_reordered_draws_still_read_back():
    case = case_from_text(COMMENTED)
    case.draws = list(reversed(case.draws))
    out = roundtrip_text(COMMENTED, case)
    assert same_case(case_from_text(out), case)


@pytest.mark.parametrize(
    "word", ["no", "on", "yes", "off", "012", "1e3", "~", "null", "2026-11-20"]
)
def test_yaml_11_words_stay_strings_for_pyyaml(word):
    case = case_from_text(COMMENTED)
    case.notes = word
    out = roundtrip_text(COMMENTED, case)
    assert yaml.safe_load(out)["notes"] == word
    assert same_case(case_from_text(out), case)


def test_long_panels_are_wrapped_at_commas():
    case = load_case(CASES[0])
    out = roundtrip_text(CASES[0].read_text(), case)
    for line in out.splitlines():
        assert not line.rstrip().endswith(("mg/", " mg")), line  # no value split across lines


def test_a_file_that_is_not_a_mapping_cannot_be_merged():
    case = case_from_text(COMMENTED)
    with pytest.raises(RoundTripError):
        roundtrip_text("- just\n- a list\n", case)
    with pytest.raises(RoundTripError):
        roundtrip_text("key: [unclosed\n", case)


ALPHABET = st.characters(categories=("L", "N", "P", "S", "Zs"), exclude_characters="\x85")


@settings(max_examples=150, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(
    notes=st.one_of(st.none(), st.text(ALPHABET, min_size=1, max_size=80)),
    sodium=st.one_of(st.none(), st.integers(110, 170)),
    ph=st.one_of(st.none(), st.sampled_from([7.1, 7.25, 7.3, 7.40, 7.45])),
    potassium=st.one_of(st.none(), st.floats(1.5, 8.0).map(lambda x: round(x, 1))),
    drop_second=st.booleans(),
)
def test_random_edits_keep_comments_and_read_back(notes, sodium, ph, potassium, drop_second):
    case = case_from_text(COMMENTED)
    case.notes = notes
    d0 = case.draws[0]
    d0.serum.sodium = None if sodium is None else _measure(Panel.serum, "sodium", sodium)
    d0.blood_gas.ph = None if ph is None else _measure(Panel.blood_gas, "ph", ph)
    d0.urine.potassium = (
        None if potassium is None else _measure(Panel.urine, "potassium", potassium)
    )
    if drop_second:
        case.draws = case.draws[:1]
    out = roundtrip_text(COMMENTED, case)
    assert same_case(case_from_text(out), case)
    kept = _comments(out)
    for c in (
        "Invented case for the round-trip tests.",
        "first draw",
        "the context, chosen by hand",
    ):
        assert c in kept
    if not drop_second:
        assert "second draw" in kept


def test_a_fresh_dump_reads_back_and_a_second_merge_changes_nothing():
    case = case_from_text(COMMENTED)
    text = dump_case(case)
    once = roundtrip_text(text, case)
    assert same_case(case_from_text(once), case)
    assert roundtrip_text(once, case) == once


def test_a_time_written_another_way_is_kept():
    text = COMMENTED.replace("taken: 2026-11-20T09:10", "taken: 2026-11-20 09:10")
    case = case_from_text(text)
    case.notes = "changed"
    out = roundtrip_text(text, case)
    assert "taken: 2026-11-20 09:10" in out
    assert same_case(case_from_text(out), case)
