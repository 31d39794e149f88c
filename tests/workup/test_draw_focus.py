"""Which draw a one-draw view opens on: the one that best shows the metabolic acidosis."""

from __future__ import annotations

from pathlib import Path

import pytest

from workup.assess import assess
from workup.caseio import case_from_bytes, load_case
from workup.draw_focus import (
    ACIDOSIS,
    LATEST,
    draw_header,
    focus_draw,
    focused_assessment,
    opening_index,
)

ROOT = Path(__file__).resolve().parents[2]

# Invented values. An acidosis: HCO3 15 with pH 7.30 and pCO2 30 (a normal-gap metabolic acidosis
# with the expected respiratory compensation, Winter's formula 1.5 x 15 + 8 +/- 2 = 28.5-32.5;
# Albert, Dell & Winters, Ann Intern Med 1967, from memory). A normal draw: HCO3 24, pH 7.40, pCO2 40
# (common practice reference values).
ACID = (
    "serum: {sodium: 140, potassium: 3.5, chloride: 115, bicarbonate: 15}\n"
    "    blood_gas: {ph: 7.30, pco2: 30 mmHg}\n"
)
NORMAL = (
    "serum: {sodium: 140, potassium: 4.0, chloride: 104, bicarbonate: 24}\n"
    "    blood_gas: {ph: 7.40, pco2: 40 mmHg}\n"
)


def _case(*draws: tuple[str, str, str | None]):
    text = "schema: 1\nlabel: Test - focus\nunits: conventional\ndraws:\n"
    for label, values, during in draws:
        text += f"  - label: {label}\n"
        if during:
            text += f"    during: {during}\n"
        text += f"    {values}"
    return case_from_bytes(text.encode())


@pytest.mark.parametrize(
    ("stem", "label", "reason"),
    [
        # The latest draw of these two demos is a bicarbonate-loading draw.
        ("distal-rta-classic", "baseline", ACIDOSIS),
        ("proximal-rta-fanconi", "baseline", ACIDOSIS),
        ("gi-loss-diarrhea", "admission", ACIDOSIS),
        ("type4-hypoaldosteronism", "clinic", ACIDOSIS),
        # A compensated chronic respiratory alkalosis: no metabolic acidosis in any draw.
        ("respiratory-alkalosis-chronic", "ED", LATEST),
    ],
)
def test_demo_cases_open_on_the_draw_with_the_acidosis(stem, label, reason) -> None:
    case = load_case(ROOT / "cases" / f"{stem}.yaml")
    focus = focus_draw(case, assess(case).draws)
    assert (focus.label, focus.reason) == (label, reason)
    assert case.draws[focus.index].label == label
    assert opening_index(case) == focus.index


def test_the_distal_rta_demo_says_what_the_loading_draw_is_for() -> None:
    case = load_case(ROOT / "cases" / "distal-rta-classic.yaml")
    a, focus = focused_assessment(case)
    assert a.draw_label == "baseline"
    assert any(d.id == "normal_gap_metabolic_acidosis" for d in a.disorders)
    assert focus.sentence() == (
        "findings of draw 'baseline' (the acidosis); 'bicarbonate 3 h' is a loading test, "
        "read by the causes"
    )
    asked = assess(case, "bicarbonate 3 h")
    assert draw_header(case, asked) == (
        "findings of draw 'bicarbonate 3 h' (as chosen); 'baseline' shows the acidosis"
    )


@pytest.mark.parametrize(
    ("draws", "label", "reason"),
    [
        # Two untested draws with an acidosis: the more recent one.
        ((("a", ACID, None), ("b", ACID, None)), "b", ACIDOSIS),
        # An acidosis, then a corrected untested draw: the acidosis is shown.
        ((("a", ACID, None), ("b", NORMAL, None)), "a", ACIDOSIS),
        # An ammonium chloride test draw is never chosen for the acidosis it provokes.
        ((("a", NORMAL, None), ("b", ACID, "ammonium_chloride")), "b", LATEST),
        ((("a", ACID, None), ("b", ACID, "ammonium_chloride")), "a", ACIDOSIS),
        # No acidosis anywhere: the latest draw.
        ((("a", NORMAL, None), ("b", NORMAL, None)), "b", LATEST),
        ((("only", NORMAL, None),), "only", LATEST),
    ],
)
def test_invented_cases(draws, label, reason) -> None:
    case = _case(*draws)
    focus = focus_draw(case, assess(case).draws)
    assert (focus.label, focus.reason) == (label, reason)
    assert [lab for lab, _ in focus.others] == [d[0] for d in draws if d[0] != label]


def test_a_case_without_draws_has_no_focus() -> None:
    case = case_from_bytes(b"schema: 1\nlabel: Test - empty\ndraws: []\n")
    focus = focus_draw(case, [])
    assert (focus.index, focus.label) == (None, None)
    assert opening_index(case) == 0
    assert draw_header(case, assess(case)) is None


def test_a_draw_asked_for_by_label_is_kept() -> None:
    case = _case(("a", ACID, None), ("b", NORMAL, "bicarbonate_loading"))
    a, focus = focused_assessment(case, "b")
    assert a.draw_label == "b" and focus.label == "a"
