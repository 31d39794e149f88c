"""Unmeasured urine anions: a positive or near-zero urine anion gap beside plenty of ammonium.

Hippurate after toluene, ketoanions, D-lactate and penicillin-type drug anions leave the urine
with ammonium and are not counted by the anion gap, which then reads falsely positive: Berend et
al., Kidney Dis 2017, Table 1 (toluene: positive UAG with high ammonium); Kamel et al., AJKD 1997
(the osmolal gap tracks ammonium better). Every vignette is an invented scenario, not a patient;
cases/toluene-like.yaml is the invented demo case.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from tests.workup.test_indices_urine_acid import draw, uag_urine
from workup.assess import assess
from workup.caseio import case_from_data, case_to_data, load_case
from workup.context import Flag
from workup.findings import Status, Verdict
from workup.indices import urine_acid

DEMO = Path(__file__).resolve().parents[2] / "cases" / "toluene-like.yaml"


def _urine(uag: float, uog: float, **more) -> dict[str, float]:
    """Urine with Na 50, K 20 and the chloride for ``uag``; urea 160 mmol/L, no glucose, and the
    measured osmolality for a urine osmolal gap of ``uog`` (calculated 2 × 70 + 160 = 300)."""
    return uag_urine(uag, urea=160, glucose=0, osmolality=300 + uog, **more)


NAMED = ("hippurate", "ketoanions", "D-lactate", "penicillin")


@pytest.mark.parametrize(("uag", "words"), [(20, "positive"), (2, "near zero")])
def test_gap_that_misses_plenty_of_ammonium_names_unmeasured_anions(uag, words):
    # UOG 300 mOsm/kg is ammonium ≈ 150 mmol/L (Kamel et al., AJKD 1997): plenty; a UAG of +20
    # (or about zero) beside it is the toluene pattern of Berend et al., Kidney Dis 2017, Table 1.
    f = urine_acid.urine_anion_gap(draw(_urine(uag, 300)))
    assert f.status is Status.caution
    why = next(r for r in f.reasons if "anions the gap does not count" in r)
    assert words in why and all(n in why for n in NAMED)
    assert "osmolal gap 300" in f.extra["unmeasured_anions"]


def test_measured_ammonium_also_reveals_them():
    # Measured NH4 120 mmol/L, above the adequate 75 (half the UOG of 150, Berend 2017).
    f = urine_acid.urine_anion_gap(draw(uag_urine(20, ammonium=120)))
    assert "measured urine ammonium 120" in f.extra["unmeasured_anions"]


@pytest.mark.parametrize(
    ("urine", "why"),
    [
        (_urine(-25, 300), "negative gap: it agrees with the ammonium (Batlle et al., NEJM 1988)"),
        (_urine(20, 60), "low UOG: the gaps agree on low ammonium (Kamel et al., AJKD 1997)"),
        # Low distal sodium already makes a positive gap not valid (common practice).
        ({**_urine(20, 300), "sodium": 15, "chloride": 15}, "urine Na 15 explains the gap"),
    ],
)
def test_only_an_unexplained_disagreement_is_called(urine, why):
    called = urine_acid.urine_anion_gap(draw(_urine(20, 300)))
    assert "unmeasured_anions" in called.extra  # the disagreement itself is called
    f = urine_acid.urine_anion_gap(draw(urine))
    assert "unmeasured_anions" not in f.extra, why


@pytest.mark.parametrize(
    ("flag", "words"),
    [
        (Flag.solvent_inhalation, "hippurate"),  # Berend 2017, Table 1: toluene
        (Flag.ketosis, "ketoanions"),  # ketoanions leave with ammonium (Kamel et al., AJKD 1997)
    ],
)
def test_recorded_history_makes_a_positive_gap_not_valid(flag, words):
    f = urine_acid.urine_anion_gap(draw(_urine(20, 300), context=frozenset({flag})))
    assert f.status is Status.not_valid and words in f.reasons[0]
    # The history explains the gap, so it is not called an unexplained disagreement.
    assert "unmeasured_anions" not in f.extra


def test_demo_ranking_trusts_the_osmolal_gap():
    # Invented demo: UAG +20 beside UOG 301. The ammonium call follows the osmolal gap (clearly
    # high, Berend 2017, Table 1), the anion gap is outweighed, and no low-ammonium cause is
    # possible (Kim et al., AJKD 1996).
    a = assess(load_case(DEMO))
    assert a.indices["urine_anion_gap"].interpretation == "positive"
    assert a.indices["urine_anion_gap"].status is Status.caution
    notes = " ".join(a.ranking_notes)
    assert "outweighed: urine anion gap 20.0" in notes
    assert "Unmeasured urine anions" in notes and "hippurate" in notes
    verdicts = {c.id: c.verdict for c in a.patterns}
    for pid in ("distal_rta", "hyperkalemic_distal_rta", "hypoaldosteronism", "ckd_acidosis"):
        assert verdicts[pid] is Verdict.unlikely
    ammonium = [e for c in a.patterns for e in c.support if "reads ammonium" in e.text]
    assert ammonium and all(e.index == "urine_osmolal_gap" for e in ammonium)


def test_demo_next_tests_ask_for_the_history_and_a_measured_ammonium():
    a = assess(load_case(DEMO))
    ids = [t.id for t in a.next_tests]
    assert ids[:2] == ["unmeasured_anion_history", "urine_ammonium_measured"]
    history = a.next_tests[0].text
    assert "toluene" in history and "ketones" in history


def _demo_with(flags: list[str], **urine) -> object:
    data = case_to_data(load_case(DEMO))
    data["context"] = flags
    data["draws"][0]["urine"].update(urine)
    return assess(case_from_data(data))


def test_recorded_solvent_history_drops_the_history_question():
    a = _demo_with(["solvent_inhalation"])
    ids = [t.id for t in a.next_tests]
    assert "unmeasured_anion_history" not in ids
    assert a.indices["urine_anion_gap"].status is Status.not_valid


def test_measured_ammonium_drops_that_test():
    a = _demo_with([], ammonium=150)
    ids = [t.id for t in a.next_tests]
    assert ids[0] == "unmeasured_anion_history" and "urine_ammonium_measured" not in ids


def test_toluene_and_solvent_flags_count_the_history_once():
    both = {c.id: c.score for c in _demo_with(["toluene", "solvent_inhalation"]).patterns}
    one = {c.id: c.score for c in _demo_with(["solvent_inhalation"]).patterns}
    assert both == one
