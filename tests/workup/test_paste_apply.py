"""Pasted lab text, second half: answering the parser's questions and applying a proposal to a
draw. Every fixture is an invented layout (see tests/workup/test_paste.py).
"""

from __future__ import annotations

from datetime import datetime

import pytest

from tests.workup.helpers.lab_reports import _report
from workup.model import Draw
from workup.paste import (
    UnansweredQuestions,
    answers_for_panel,
    apply_proposal,
    propose,
)
from workup.quantity import read_value


def test_resolve_applies_an_answer_and_leaves_the_rest_open() -> None:
    p = propose(_report("gas_block.txt"))
    co2, na, _lactate = p.questions
    resolved = p.resolve({co2.id: 1, na.id: None})
    assert resolved.values["serum"]["bicarbonate"].value == 30
    assert [q.id for q in resolved.questions] == ["q3"]
    assert any("left out at review" in u.reason for u in resolved.unrecognised)
    assert p.questions == (co2, na, _lactate)  # the original is unchanged


def test_resolve_rejects_an_option_that_does_not_exist() -> None:
    p = propose("Na 140")
    with pytest.raises(ValueError, match="options"):
        p.resolve({"q1": 5})


def test_apply_merges_into_a_new_draw_without_mutating_the_input() -> None:
    a = read_value  # the draw's own value is read the way a case file is
    from workup.analytes import analyte

    draw = Draw(label="admission")
    draw.serum.sodium = a(analyte("serum", "sodium"), 150, None)
    draw.serum.albumin = a(analyte("serum", "albumin"), "30 g/L", None)
    p = propose(_report("chemistry_tabbed.txt"))
    new = apply_proposal(draw, p)
    assert new is not draw
    assert draw.serum.sodium.value == 150  # input untouched
    assert draw.taken is None
    assert new.serum.sodium.value == 139  # proposed value replaces the field
    assert new.serum.albumin.value == 4.1
    assert new.taken == datetime(2026, 11, 30, 8, 15)
    assert new.label == "admission"


def test_apply_keeps_fields_the_proposal_does_not_hold() -> None:
    from workup.analytes import analyte

    draw = Draw(label="d")
    draw.urine.citrate = read_value(analyte("urine", "citrate"), "2 mg/dL", None)
    new = apply_proposal(draw, propose("Chemistry\nSodium 140 mmol/L"))
    assert new.urine.citrate.value == 2
    assert new.serum.sodium.value == 140


def test_apply_refuses_unanswered_questions() -> None:
    p = propose("Na 140")
    with pytest.raises(UnansweredQuestions):
        apply_proposal(Draw(label="d"), p)
    new = apply_proposal(Draw(label="d"), p, {"q1": 1})
    assert new.urine.sodium.value == 140
    assert new.serum.sodium is None


def test_apply_sets_the_gas_sample_from_the_heading() -> None:
    p = propose("VBG\npH 7.30\npCO2 48 mmHg")
    assert apply_proposal(Draw(label="d"), p).blood_gas.sample.value == "venous"


def test_a_time_question_answer_sets_the_time() -> None:
    p = propose(_report("two_times.txt"))
    time_q = next(q for q in p.questions if q.kind == "time")
    resolved = p.resolve({time_q.id: 1})
    assert resolved.taken == datetime(2026, 11, 30, 14, 30)


def test_answers_for_panel_answers_only_which_sample_questions() -> None:
    p = propose(_report("messy_mixed.txt"))
    answers = answers_for_panel(p, "serum")
    assert sorted(answers) == ["q1", "q2", "q3", "q4", "q5"]
    resolved = p.resolve(answers)
    assert resolved.values["serum"]["potassium"].value == 2.4
    assert [q.kind for q in resolved.questions] == ["time"]


def test_an_unusual_value_carries_a_caution() -> None:
    # Serum potassium 7.5 is outside workup's usual range (2.0–7.0, common practice).
    p = propose("Chemistry\nPotassium 7.5 mmol/L HH")
    ((entry, note),) = p.cautions()
    assert entry.key == "potassium" and "unusually high" in note


def test_a_sample_quality_remark_makes_the_value_a_question() -> None:
    # Hemolysis raises the measured potassium (common practice): the value is not taken as read.
    p = propose("Chemistry\nPotassium (hemolyzed) 5.9 mmol/L")
    assert p.entries == ()
    (q,) = p.questions
    assert q.kind == "confirm" and "hemolyzed" in q.text
