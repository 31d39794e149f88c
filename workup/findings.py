"""The shape every calculator returns: a value that always travels with its validity.

A number is never shown without its status. ``needs_input`` means the value could not be computed
(``value`` is None and ``needs`` says what to enter); ``not_valid`` means it was computed but a
validity condition fails, so it must not be read as a fact; ``caution`` means it holds with a caveat.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from enum import StrEnum
from typing import Any

from workup.frozen import builder


class Status(StrEnum):
    """How far a computed value can be relied on."""

    ok = "ok"
    caution = "caution"
    not_valid = "not_valid"
    needs_input = "needs_input"


BORDERLINE_SUFFIX = " (borderline)"
"""Added to the interpretation of a value within its cut-off's imprecision, so every screen and
note that prints the interpretation shows it."""

# A word and a symbol for each status, so that status never depends on colour alone.
STATUS_WORD = {
    Status.ok: "valid",
    Status.caution: "caution",
    Status.not_valid: "NOT VALID",
    Status.needs_input: "needs input",
}
STATUS_MARK = {
    Status.ok: "+",
    Status.caution: "!",
    Status.not_valid: "x",
    Status.needs_input: "?",
}


@dataclass(frozen=True, slots=True)
class Finding:
    """One index: its value, unit, validity, the reasons in words and where the method comes from."""

    id: str
    """Stable identifier, e.g. ``urine_anion_gap``."""
    name: str
    """Human name, e.g. "Urine anion gap"."""
    value: float | None
    """The computed value, or None when inputs are missing."""
    unit: str
    """Unit of ``value`` ("" for ratios and pH)."""
    status: Status
    """Validity of the value."""
    reasons: tuple[str, ...] = ()
    """Why the status is what it is, and how to read the value, in words."""
    needs: tuple[str, ...] = ()
    """Missing inputs as ``panel.analyte`` labels (or other field names)."""
    formula: str = ""
    """The formula as plain text."""
    source: str = ""
    """Published source (authors, journal, year) or "common practice"."""
    interpretation: str | None = None
    """A short reading of the value, e.g. "negative", "appropriate", "low"."""
    low: float | None = None
    """Lower bound of an expected range, where the index is one (e.g. expected pCO2)."""
    high: float | None = None
    """Upper bound of an expected range."""
    extra: dict[str, Any] = field(default_factory=dict)
    """Other numbers the index exposes (intermediate terms), keyed by name."""
    borderline: bool = False
    """True when the value sits within the published cut-off's imprecision: it is read as
    borderline (the interpretation says so) and weighs less in the ranking."""

    @property
    def usable(self) -> bool:
        """True when the value exists and may drive a conclusion (ok or caution)."""
        return self.value is not None and self.status in (Status.ok, Status.caution)

    def to_json(self) -> dict[str, Any]:
        """The JSON form used by ``workup assess --json``."""
        out: dict[str, Any] = {
            "value": self.value,
            "unit": self.unit,
            "status": self.status.value,
            "reasons": list(self.reasons),
            "needs": list(self.needs),
            "formula": self.formula,
            "source": self.source,
            "name": self.name,
            "interpretation": self.interpretation,
            "borderline": self.borderline,
        }
        if self.low is not None or self.high is not None:
            out["low"], out["high"] = self.low, self.high
        if self.extra:
            out["extra"] = dict(self.extra)
        return out


def missing(id: str, name: str, unit: str, needs: list[str], formula: str, source: str) -> Finding:
    """A finding that cannot be computed until ``needs`` are entered."""
    key = (id, name, unit, tuple(needs), formula, source)
    found = _MISSING.get(key)
    if found is None:
        found = new_finding(
            id=id,
            name=name,
            value=None,
            unit=unit,
            status=Status.needs_input,
            reasons=("enter " + ", ".join(needs) + " to compute it",),
            needs=tuple(needs),
            formula=formula,
            source=source,
        )
        # Findings are frozen, so the same missing-input finding is shared by every draw that
        # lacks the same inputs (most draws lack the same few); the bound stops odd growth.
        if len(_MISSING) < 4096:
            _MISSING[key] = found
    return found


_MISSING: dict[tuple[Any, ...], Finding] = {}


class Verdict(StrEnum):
    """How well a cause fits the evidence of the whole case."""

    likely = "likely"
    possible = "possible"
    unlikely = "unlikely"


@dataclass(frozen=True, slots=True)
class Evidence:
    """One piece of evidence for or against a disorder or a cause."""

    text: str
    """The evidence in words, with the number it rests on."""
    index: str | None = None
    """The finding id it comes from, if any."""
    draw: str | None = None
    """The draw label it comes from, if any."""
    weight: float = 1.0
    """Strength: 1 = supportive, 2 = strong, 3 = decisive (reliable, specific)."""


@dataclass(frozen=True, slots=True)
class Disorder:
    """One acid-base disorder found in a draw."""

    id: str
    """``normal_gap_metabolic_acidosis``, ``high_gap_metabolic_acidosis``, ``metabolic_alkalosis``,
    ``respiratory_acidosis`` or ``respiratory_alkalosis``; ``metabolic_acidosis`` only when the
    anion gap cannot be computed, so the gap type is not guessed."""
    name: str
    """Human name."""
    primary: bool
    """True for the primary disorder; False for an added (mixed) one."""
    evidence: tuple[Evidence, ...] = ()
    """Why it is called."""
    detail: str | None = None
    """For example "acute", "chronic" or "acute or chronic"."""
    compensation: str | None = None
    """"appropriate", "insufficient" or "excessive" for the primary disorder, else None."""

    def to_json(self) -> dict[str, Any]:
        """JSON form for ``workup assess --json``."""
        return {
            "id": self.id,
            "name": self.name,
            "primary": self.primary,
            "detail": self.detail,
            "compensation": self.compensation,
            "evidence": [e.text for e in self.evidence],
        }


@dataclass(frozen=True, slots=True)
class PatternCall:
    """One candidate cause of a normal-gap acidosis, judged on the whole case."""

    id: str
    """``gi_bicarbonate_loss``, ``proximal_rta``, ``distal_rta``, ``hyperkalemic_distal_rta``,
    ``hypoaldosteronism``, ``ckd_acidosis`` or ``chloride_load`` (saline)."""
    name: str
    """Human name."""
    verdict: Verdict
    """likely, possible or unlikely."""
    score: float
    """Net weight of evidence (for ordering; not a probability)."""
    support: tuple[Evidence, ...] = ()
    """Findings for."""
    against: tuple[Evidence, ...] = ()
    """Findings against."""
    missing: tuple[str, ...] = ()
    """Inputs or tests that would bear on it but are absent."""

    def to_json(self) -> dict[str, Any]:
        """JSON form for ``workup assess --json``."""
        return {
            "id": self.id,
            "name": self.name,
            "verdict": self.verdict.value,
            "score": round(self.score, 2),
            "for": [e.text for e in self.support],
            "against": [e.text for e in self.against],
            "missing": list(self.missing),
        }


@dataclass(frozen=True, slots=True)
class NextTest:
    """A confirmatory or discriminating test to suggest."""

    id: str
    """Stable identifier, e.g. ``bicarbonate_loading_fehco3``."""
    text: str
    """The test in words."""
    why: str
    """What it would settle."""
    separates: tuple[str, ...] = ()
    """Pattern ids it discriminates between."""

    def to_json(self) -> dict[str, Any]:
        """JSON form for ``workup assess --json``."""
        return {
            "id": self.id,
            "text": self.text,
            "why": self.why,
            "separates": list(self.separates),
        }


@dataclass(frozen=True, slots=True)
class DrawResult:
    """Everything computed for one draw: the pattern ranker reads a list of these."""

    label: str
    """The draw's label."""
    inputs: Any
    """The :class:`workup.inputs.DrawInputs` the findings were computed from."""
    findings: dict[str, Finding]
    """Every index, by id, in display order."""
    disorders: list[Disorder]
    """Acid-base disorders of this draw, primary first."""


@dataclass(frozen=True, slots=True)
class Ranking:
    """The pattern ranker's answer for a whole case."""

    calls: list[PatternCall]
    """Every candidate, best first."""
    next_tests: list[NextTest]
    """Suggested tests, most useful first."""
    notes: list[str] = field(default_factory=list)
    """Statements about the ranking as a whole (e.g. why no pattern is called likely)."""


# Constructors for the results made by the thousand in a library build: as calling the class,
# about three times faster, and the objects are as frozen (see workup.frozen).
new_finding = builder(Finding)
"""Make a Finding."""
new_evidence = builder(Evidence)
"""Make an Evidence."""
new_disorder = builder(Disorder)
"""Make a Disorder."""
new_pattern_call = builder(PatternCall)
"""Make a PatternCall."""
new_next_test = builder(NextTest)
"""Make a NextTest."""
new_draw_result = builder(DrawResult)
"""Make a DrawResult."""
