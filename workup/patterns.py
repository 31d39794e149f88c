"""Ranking the causes of a normal-gap metabolic acidosis from every draw of a case.

The ranker reads every draw: steady-state readings (urine pH, ammonium, potassium) come from draws
taken during the normal-gap acidosis, FEHCO3 and the urine-minus-blood pCO2 from bicarbonate-loading
draws (see :mod:`workup.pattern_rules`). Each cause gets weighted evidence for and against; the net
weight orders them and sets the verdict. docs/ranking.md explains the weights.
"""

from __future__ import annotations

from typing import Any

from workup.findings import (
    DrawResult,
    PatternCall,
    Ranking,
    Verdict,
    new_evidence,
    new_pattern_call,
)
from workup.next_tests import leading, suggest, suggest_without_acidosis
from workup.pattern_rules import PATTERNS, Readings, Tally, gather, judge, missing_for
from workup.rules.causes.incomplete_distal_rta import CAUSE as INCOMPLETE
from workup.rules.prior import prior_order, tie_note
from workup.settings import Settings

LIKELY_AT = 4.0
"""Net weight at or above which a cause is called likely (a design choice, docs/ranking.md)."""
UNLIKELY_AT = -1.0
"""Net weight at or below which a cause is called unlikely."""
DECISIVE = 3.0
"""A single piece of evidence against of at least this weight rules out "likely"."""
WITHOUT_ACIDOSIS = frozenset({INCOMPLETE.id})
"""Causes judged only when no draw shows a normal-gap acidosis: the incomplete form of distal
RTA is defined by a normal plasma bicarbonate (with an acidosis, classic distal RTA covers it)."""


def _verdict(score: float, against: list[float]) -> Verdict:
    """The verdict for a net weight and the weights against."""
    if score <= UNLIKELY_AT:
        return Verdict.unlikely
    if score >= LIKELY_AT and not any(w >= DECISIVE for w in against):
        return Verdict.likely
    return Verdict.possible


def _no_acidosis_note(draws: list[DrawResult], judged: bool = False) -> str:
    """Why no draw shows a normal-gap acidosis, from each draw's primary disorder; ``judged``
    when an acidification test lets incomplete distal RTA be judged all the same."""
    parts = []
    for r in draws:
        primary = next((d for d in r.disorders if d.primary), None)
        during = getattr(r.inputs, "during", None)
        if during is not None:
            parts.append(
                f"{r.label}: taken during {during.value.replace('_', ' ')}, not a steady state"
            )
            continue
        if primary is None:
            parts.append(f"{r.label}: no acid-base disorder found")
            continue
        if primary.id == "respiratory_alkalosis" and primary.compensation == "appropriate":
            kind = f"{primary.detail} " if primary.detail in ("acute", "chronic") else ""
            parts.append(
                f"{r.label}: the low bicarbonate is compensation for a {kind}respiratory "
                "alkalosis, not a metabolic acidosis"
            )
        elif primary.id == "high_gap_metabolic_acidosis":
            parts.append(
                f"{r.label}: the acidosis is high-gap only (delta ratio does not show "
                "an added normal-gap acidosis)"
            )
        elif primary.id == "metabolic_acidosis":
            parts.append(f"{r.label}: the gap type is unknown (enter serum sodium and chloride)")
        else:
            parts.append(f"{r.label}: {primary.name.lower()}")
    head = (
        "only incomplete distal RTA is judged, on the acidification test"
        if judged
        else "no cause is ranked"
    )
    return (f"No draw shows a normal-gap metabolic acidosis, so {head}: "
            + "; ".join(parts) + ".")  # fmt: skip


def _call(pid: str, name: str, tally: Tally, rd: Readings, evidence: bool) -> PatternCall:
    """One cause's call from the tally: score, verdict and (with ``evidence``) the reasons."""
    sup_w, ag_w = tally.weights(pid)
    score = sum(sup_w) - sum(ag_w)
    if not evidence:
        return new_pattern_call(pid, name, _verdict(score, ag_w), score)
    sup = sorted(tally.support[pid], key=lambda e: -e.weight)
    ag = sorted(tally.against[pid], key=lambda e: -e.weight)
    return new_pattern_call(pid, name, _verdict(score, ag_w), score, tuple(sup), tuple(ag),
                            missing_for(pid, rd))  # fmt: skip


def _without_acidosis(
    draws: list[DrawResult], rd: Readings, s: Settings, evidence: bool, others: list[PatternCall]
) -> Ranking:
    """No normal-gap acidosis but an acidification test: judge incomplete distal RTA alone; the
    other causes stay unlikely."""
    tally, _ = judge(rd, s, weights_only=not evidence)
    call = _call(INCOMPLETE.id, INCOMPLETE.name, tally, rd, evidence)
    ranked = [*others, call] if call.verdict is Verdict.unlikely else [call, *others]
    notes = [_no_acidosis_note(draws, judged=True)]
    if rd.by_key["acidification_test"].word == "not_acidified":
        notes.append(
            "A failed acidification test supports a distal defect but does not prove it: some "
            "people without one never reach 5.3 (specificity about 85%, Dhayat et al., CJASN 2016)."
        )
    if call.verdict is Verdict.possible:
        notes.append(
            "Incomplete distal RTA is not 'likely' yet; the suggested tests would settle it."
        )
    return Ranking(ranked, suggest_without_acidosis(rd, call), notes)


def _tie_notes(ranked: list[PatternCall], age: int | None) -> list[str]:
    """A note for each group of equal scores among the leading causes (those the next tests
    separate, workup.next_tests.leading)."""
    groups: dict[float, list[str]] = {}
    for c in leading(ranked):
        groups.setdefault(round(c.score, 6), []).append(c.name)
    return [tie_note(names, age) for names in groups.values() if len(names) > 1]


def rank(draws: list[DrawResult], case: Any, settings: Settings, evidence: bool = True) -> Ranking:
    """Judge each candidate cause on the whole case; best first.

    With no normal-gap metabolic acidosis in any draw (outside loading tests) every cause is
    unlikely and ``notes`` says why. With ``evidence=False`` the calls carry no evidence in
    words and no missing inputs (their order, scores, verdicts, the tests and notes are the
    same): what the library index keeps, at a fraction of the cost.
    """
    context = getattr(case, "context", ()) or ()
    rd = gather(draws, context, settings)
    if not rd.acidosis_draws:
        why = _no_acidosis_note(draws) if draws else "The case has no draws to rank."
        calls = [
            new_pattern_call(pid, name, Verdict.unlikely, 0.0,
                        against=(new_evidence("no normal-gap metabolic acidosis in any draw"),))
            for pid, name in PATTERNS.items() if pid not in WITHOUT_ACIDOSIS
        ]  # fmt: skip
        if draws and "acidification_test" in rd.by_key:
            return _without_acidosis(draws, rd, settings, evidence, calls)
        return Ranking(calls, suggest_without_acidosis(rd, None), [why])

    tally, nh4 = judge(rd, settings, weights_only=not evidence)
    age = getattr(getattr(case, "patient", None), "age", None)
    # Equal scores are ordered by how common each cause is at this age (a prior, said in a
    # note), then by the table order.
    prior = prior_order(age)
    calls = []
    for order, (pid, name) in enumerate(PATTERNS.items()):
        if pid not in WITHOUT_ACIDOSIS:
            calls.append((prior.get(pid, len(prior)), order, _call(pid, name, tally, rd, evidence)))
    calls.sort(key=lambda t: (-round(t[2].score, 6), t[0], t[1]))
    ranked = [c for _, _, c in calls]

    notes = _tie_notes(ranked, age)
    presumed = [
        r.label for r in draws if r.label in rd.acidosis_draws and any(
            d.id == "normal_gap_metabolic_acidosis" and (d.detail or "").startswith("presumed")
            for d in r.disorders)
    ]  # fmt: skip
    if presumed:
        notes.append(
            "The acidosis in " + ", ".join(presumed) + " is presumed from the chemistry alone: "
            "without a usable blood gas a low bicarbonate may be compensation for a respiratory "
            "alkalosis."
        )
    if nh4 is not None and ("outweighed" in nh4.text or "set aside" in nh4.text):
        notes.append("Ammonium: " + nh4.text + ".")
    if rd.unmeasured_anions is not None:
        notes.append(
            "Unmeasured urine anions: " + rd.unmeasured_anions + ": ammonium is leaving with "
            "anions the urine anion gap does not count (hippurate after toluene, ketoanions, "
            "D-lactate, some antibiotics such as penicillins), so ammonium is read from the "
            "osmolal gap or a measured value, not from the anion gap."
        )
    if not any(c.verdict is Verdict.likely for c in ranked):
        notes.append(
            "No cause reaches 'likely' yet; the suggested tests would separate the leaders."
        )
    return Ranking(ranked, suggest(ranked, rd), notes)
