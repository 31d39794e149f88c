"""Ties: with no evidence between two causes, the one more common at the patient's age leads.

The order of how common each cause is, by age group, is common practice (from memory), not a
published table; the ranking says it is a prior, not evidence. Every vignette is an invented
scenario, not a patient.
"""

from __future__ import annotations

from tests.workup.test_patterns import _case, _draw, _serum
from workup.assess import assess
from workup.findings import Verdict


def _tied(age: int | None):
    # Invented vignette: hypokalemic normal-gap acidosis, known CKD, no urine and no height, so
    # no eGFR. Proximal RTA: +1 for the low potassium; CKD acidosis: +1.5 known CKD, −0.5 low
    # potassium (weights in docs/ranking.md). Both score 1.0: nothing separates them.
    return assess(_case([_draw("clinic", _serum(3.0), {})], ["known_ckd"], age=age))


def _live(a) -> list[str]:
    return [c.id for c in a.patterns if c.verdict is not Verdict.unlikely]


def test_a_child_tie_puts_the_cause_commoner_in_children_first():
    a = _tied(10)
    scores = {c.id: c.score for c in a.patterns}
    assert scores["proximal_rta"] == scores["ckd_acidosis"] == 1.0
    order = _live(a)
    # Common practice: in children proximal RTA (Fanconi) is commoner than CKD acidosis.
    assert order.index("proximal_rta") < order.index("ckd_acidosis")
    note = next(n for n in a.ranking_notes if n.startswith("Tie:"))
    assert "Proximal RTA" in note and "chronic kidney disease" in note
    assert "in children (common practice)" in note and "a prior, not evidence" in note


def test_the_same_tie_in_an_adult_follows_the_adult_order_and_keeps_the_scores():
    child, adult = _tied(10), _tied(None)
    # The prior moves only the order: every score and verdict is the evidence's alone.
    assert {c.id: (c.score, c.verdict) for c in child.patterns} == {
        c.id: (c.score, c.verdict) for c in adult.patterns
    }
    order = _live(adult)
    # Common practice: in adults CKD acidosis is far commoner than proximal RTA.
    assert order.index("ckd_acidosis") < order.index("proximal_rta")
    note = next(n for n in adult.ranking_notes if n.startswith("Tie:"))
    assert "in adults (age not recorded)" in note


def test_an_adult_tie_between_the_distal_and_proximal_forms():
    # Invented vignette: normal potassium, no urine, eGFR preserved. Classic distal and proximal
    # RTA both score 0 (possible); in adults classic distal RTA (Sjögren's, stones) is the
    # commoner of the two (common practice), so it is listed first with the note.
    a = assess(_case([_draw("clinic", _serum(4.2), {})], age=45))
    scores = {c.id: c.score for c in a.patterns}
    assert scores["distal_rta"] == scores["proximal_rta"]
    order = _live(a)
    assert order.index("distal_rta") < order.index("proximal_rta")
    assert any(n.startswith("Tie:") and "adults (common practice)" in n for n in a.ranking_notes)
