"""One call from a case to everything the fellow needs: indices, disorders, patterns, tests.

Indices and disorders come from one draw (the latest by default); the pattern ranking reads every
draw of the case, because a loading-test draw and a baseline draw answer different questions.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

from workup import disorders as _disorders
from workup import indices as _indices
from workup import patterns as _patterns
from workup.analytes import Panel, analyte
from workup.cautions import CAUTION_LINES
from workup.findings import (
    Disorder,
    DrawResult,
    Finding,
    NextTest,
    PatternCall,
    Ranking,
    new_draw_result,
)
from workup.inputs import inputs_for
from workup.model import Case, Draw, GasSample
from workup.quantity import unusual
from workup.settings import Settings, resolve


@dataclass(frozen=True)
class Assessment:
    """The full assessment of a case, centred on one draw."""

    case_label: str
    """The case's label."""
    draw_label: str | None
    """The draw the indices and disorders come from (None for a case without draws)."""
    indices: dict[str, Finding]
    """Every index of that draw, by id."""
    disorders: list[Disorder]
    """Acid-base disorders of that draw, primary first."""
    patterns: list[PatternCall]
    """Causes of a normal-gap acidosis, best first, judged on every draw."""
    next_tests: list[NextTest]
    """Suggested tests, most useful first."""
    cautions: list[str]
    """Case-specific cautions followed by the standing cautions."""
    ranking_notes: list[str] = field(default_factory=list)
    """Statements about the ranking as a whole."""
    draws: list[DrawResult] = field(default_factory=list)
    """Per-draw results for every draw, oldest first."""
    settings: Settings | None = None
    """The settings in force."""

    def to_json(self) -> dict[str, Any]:
        """The documented JSON object of ``workup assess --json``."""
        return {
            "case": self.case_label,
            "draw": self.draw_label,
            "indices": {k: f.to_json() for k, f in self.indices.items()},
            "disorders": [d.to_json() for d in self.disorders],
            "patterns": [p.to_json() for p in self.patterns],
            "next_tests": [t.to_json() for t in self.next_tests],
            "ranking_notes": list(self.ranking_notes),
            "cautions": list(self.cautions),
        }

    @property
    def leading(self) -> PatternCall | None:
        """The best-ranked pattern, if any pattern was ranked."""
        return self.patterns[0] if self.patterns else None


COMPENSATION_RULES = (
    "expected_pco2",
    "expected_pco2_metabolic_alkalosis",
    "expected_bicarbonate_respiratory_acidosis_acute",
    "expected_bicarbonate_respiratory_acidosis_chronic",
    "expected_bicarbonate_respiratory_alkalosis_acute",
    "expected_bicarbonate_respiratory_alkalosis_chronic",
)
"""The compensation rules among the indices. Each is NOT VALID only when the draw is not the
disorder the rule is for (workup/indices/gas.py: bicarbonate, pCO2 or pH on the wrong side), so a
NOT VALID rule is one that does not apply to the draw."""

STATE_BOUND = frozenset(
    {
        *COMPENSATION_RULES,
        "fe_bicarbonate",
        "urine_blood_pco2",
        "egfr_schwartz",
    }
)
"""Indices that are not valid by design outside one acid-base state or loading test (the rule of
another primary disorder; FEHCO3 without a bicarbonate load; the bedside Schwartz eGFR of an
adult; for a child the CKD-EPI reason already names the age or steady-state problem). Their status stays on screen, but
they are not repeated as case cautions, which would bury the ones that matter."""


def draw_result(case: Case, draw: Draw, settings: Settings) -> DrawResult:
    """Compute the indices and disorders of one draw."""
    x = inputs_for(case, draw, settings)
    found = _indices.compute_all(x)
    return new_draw_result(draw.label, x, found, _disorders.analyse(x, found))


def value_cautions(draw: Draw) -> list[str]:
    """Cautions about the draw's values themselves (unusual values, gas sample type)."""
    out = []
    for panel in Panel:
        for key, m in draw.panel(panel).measurements().items():
            a = analyte(panel, key)
            note = unusual(a, m)
            if note:
                out.append(f"{draw.label}: {panel.value.replace('_', ' ')} {note}")
    if draw.blood_gas.sample is not GasSample.arterial and draw.blood_gas.measurements():
        out.append(
            f"{draw.label}: the gas is {draw.blood_gas.sample.value}; the compensation rules were "
            "derived on arterial blood (venous pCO2 runs about 4–6 mmHg higher, pH about 0.03 lower)"
        )
    return out


def _rank(
    case: Case, user_overrides: dict[str, float] | None, evidence: bool = True
) -> tuple[list[DrawResult], Ranking, Settings]:
    settings = resolve(user_overrides or {}, case.settings)
    results = [draw_result(case, d, settings) for d in case.draws]
    return results, _patterns.rank(results, case, settings, evidence), settings


def rank_case(
    case: Case, user_overrides: dict[str, float] | None = None
) -> tuple[list[DrawResult], Ranking]:
    """What the library index stores for each case: every draw's results and the ranking of
    causes, with the same numbers, order, verdicts, tests and notes as :func:`assess`, but
    without the cautions about one draw and without each call's evidence in words."""
    results, ranking, _ = _rank(case, user_overrides, evidence=False)
    return results, ranking


def assess(
    case: Case, draw_label: str | None = None, user_overrides: dict[str, float] | None = None
) -> Assessment:
    """Assess ``case``; indices and disorders from ``draw_label`` (default: the latest draw)."""
    results, ranking, settings = _rank(case, user_overrides)
    if not case.draws:
        return Assessment(
            case.label, None, {}, [], ranking.calls, ranking.next_tests,
            ["The case has no draws yet.", *CAUTION_LINES], ranking.notes, results, settings,
        )  # fmt: skip
    return _centred(case, draw_label, results, ranking.calls, ranking.next_tests, ranking.notes,
                    settings)  # fmt: skip


def recentred(a: Assessment, case: Case, draw_label: str | None) -> Assessment:
    """``a``, an assessment of ``case`` as it stands, centred on draw ``draw_label`` instead.

    The same as ``assess(case, draw_label, ...)`` with the overrides ``a`` was made with, without
    computing it again: every draw's results and the ranking read the whole case, not the
    centre. Raises KeyError for an unknown draw label.
    """
    if not case.draws or a.settings is None:
        return a
    return _centred(case, draw_label, a.draws, a.patterns, a.next_tests, a.ranking_notes,
                    a.settings)  # fmt: skip


def _centred(
    case: Case,
    draw_label: str | None,
    results: list[DrawResult],
    calls: list[PatternCall],
    next_tests: list[NextTest],
    notes: list[str],
    settings: Settings,
) -> Assessment:
    draw = case.draw(draw_label)
    current = next(r for r in results if r.label == draw.label)
    cautions = value_cautions(draw) + [
        r
        for f in current.findings.values()
        if f.status.value == "not_valid" and f.id not in STATE_BOUND
        for r in f.reasons[:1]
    ]
    return Assessment(
        case_label=case.label,
        draw_label=draw.label,
        indices=current.findings,
        disorders=current.disorders,
        patterns=calls,
        next_tests=next_tests,
        cautions=[*dict.fromkeys(cautions), *CAUTION_LINES],
        ranking_notes=notes,
        draws=results,
        settings=settings,
    )
