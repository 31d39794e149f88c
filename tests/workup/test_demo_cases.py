"""Every demo case in cases/ (each an invented scenario) through the real assess().

The table names, per file, the leading cause expected from the vignette the file describes, and
the primary disorder of each draw; a new case file without a row here fails the test, so every
fixture stays clinically coherent.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from workup.assess import assess
from workup.caseio import load_case
from workup.findings import Verdict

CASES = Path(__file__).resolve().parents[2] / "cases"

# file → (leading pattern or None, {draw label: [(disorder id, primary)]})
EXPECTED: dict[str, tuple[str | None, dict[str, list[tuple[str, bool]]]]] = {
    "gi-loss-diarrhea.yaml": (
        "gi_bicarbonate_loss", {"admission": [("normal_gap_metabolic_acidosis", True)]},
    ),
    "gi-loss-low-urine-sodium.yaml": (
        "gi_bicarbonate_loss", {"admission": [("normal_gap_metabolic_acidosis", True)]},
    ),
    "distal-rta-classic.yaml": (
        "distal_rta",
        {"baseline": [("normal_gap_metabolic_acidosis", True)], "bicarbonate 3 h": []},
    ),
    "proximal-rta-fanconi.yaml": (
        "proximal_rta",
        {"baseline": [("normal_gap_metabolic_acidosis", True)],
         "bicarbonate 4 h": [("normal_gap_metabolic_acidosis", True)]},
    ),
    "type4-hypoaldosteronism.yaml": (
        "hypoaldosteronism", {"clinic": [("normal_gap_metabolic_acidosis", True)]},
    ),
    "hyperkalemic-distal-obstruction.yaml": (
        "hyperkalemic_distal_rta", {"ward": [("normal_gap_metabolic_acidosis", True)]},
    ),
    "ckd-acidosis.yaml": ("ckd_acidosis", {"clinic": [("normal_gap_metabolic_acidosis", True)]}),
    "mixed-ketoacidosis-saline.yaml": (
        "chloride_load",
        {"6 h": [("high_gap_metabolic_acidosis", True), ("normal_gap_metabolic_acidosis", False)]},
    ),
    "respiratory-alkalosis-chronic.yaml": (None, {"ED": [("respiratory_alkalosis", True)]}),
    "child-drta.yaml": ("distal_rta", {"clinic": [("normal_gap_metabolic_acidosis", True)]}),
    "toluene-like.yaml": (None, {"ED": [("normal_gap_metabolic_acidosis", True)]}),
    "incomplete-drta-stones.yaml": (
        "incomplete_distal_rta",
        {"furosemide 2 h": [], "furosemide 4 h": [], "furosemide 6 h": [], "clinic": []},
    ),
}  # fmt: skip

FILES = sorted(p.name for p in CASES.glob("*.yaml"))


def test_every_demo_case_has_an_expectation() -> None:
    assert sorted(EXPECTED) == FILES


@pytest.mark.parametrize("name", FILES)
def test_demo_case_is_marked_invented(name: str) -> None:
    first = (CASES / name).read_text(encoding="utf-8").splitlines()[0]
    assert first.startswith("#") and "Invented" in first and "not a real patient" in first


@pytest.mark.parametrize("name", FILES)
def test_demo_case_disorders_and_leading_pattern(name: str) -> None:
    leading, per_draw = EXPECTED[name]
    a = assess(load_case(CASES / name))
    got = {r.label: [(d.id, d.primary) for d in r.disorders] for r in a.draws}
    assert got == per_draw
    if leading is None:
        assert not any(c.verdict is Verdict.likely for c in a.patterns)
        assert a.ranking_notes
        return
    assert a.leading is not None
    assert a.leading.id == leading, [(c.id, round(c.score, 2)) for c in a.patterns]
    assert a.leading.verdict is Verdict.likely
    runner_up = a.patterns[1]
    assert runner_up.score < a.leading.score


def test_respiratory_alkalosis_demo_is_compensation_not_acidosis() -> None:
    a = assess(load_case(CASES / "respiratory-alkalosis-chronic.yaml"))
    primary = a.disorders[0]
    assert (primary.detail, primary.compensation) == ("chronic", "appropriate")
    assert any("compensation for a chronic respiratory alkalosis" in n for n in a.ranking_notes)


def test_low_urine_sodium_demo_sets_the_anion_gap_aside() -> None:
    a = assess(load_case(CASES / "gi-loss-low-urine-sodium.yaml"))
    assert a.indices["urine_anion_gap"].status.value == "not_valid"
    assert any("urine anion gap" in n and "set aside" in n for n in a.ranking_notes)
