"""What a paste proposes: the source lines, placed values, questions and refusals, and the proposal.

The reading pass (:mod:`workup.paste.reading`) fills these records; the review answers the
questions with :meth:`Proposal.resolve`, and :mod:`workup.paste.review` merges them into a draw.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field
from datetime import datetime

from workup.analytes import Analyte, UnitSystem, analyte
from workup.quantity import Measurement, unusual

PANEL_WORD = {"serum": "serum", "blood_gas": "blood gas", "urine": "urine"}
"""How each panel is named in questions, option labels and refusals."""


@dataclass(frozen=True, slots=True)
class SourceLine:
    """One line of the pasted text."""

    number: int
    """1-based line number in the pasted text."""
    text: str
    """The line as pasted (tabs kept, trailing spaces removed)."""


@dataclass(frozen=True, slots=True)
class Entry:
    """One value placed in one field of the draw."""

    panel: str
    """Panel value: ``serum``, ``blood_gas`` or ``urine``."""
    key: str
    """Analyte key in that panel."""
    measurement: Measurement
    """The value as read, with its unit and canonical equivalent."""
    source: SourceLine
    """The line the value came from."""
    when: str = ""
    """The collection time written for this value, as written ("" when none)."""
    flags: tuple[str, ...] = ()
    """The laboratory's abnormal flags beside the value (shown, never used)."""

    @property
    def analyte(self) -> Analyte:
        """The catalogue entry of this field."""
        return analyte(self.panel, self.key)

    def describe(self) -> str:
        """``urine sodium 40 mmol/L`` — panel, analyte and value with its unit."""
        m = self.measurement
        value = m.word if m.word is not None else f"{tidy_number(m.value)} {m.unit}".strip()
        return f"{PANEL_WORD[self.panel]} {self.analyte.name} {value}"


@dataclass(frozen=True, slots=True)
class Option:
    """One possible answer to a question."""

    label: str
    """What choosing it does, in words."""
    entry: Entry | None = None
    """The value it sets, for value questions."""
    taken: datetime | None = None
    """The collection time it sets, for a time question."""


@dataclass(frozen=True, slots=True)
class Question:
    """Something the text does not settle; the user chooses an option or leaves it out."""

    id: str
    """Stable identifier within the proposal ("q1", "q2"...), used as the key of ``choices``."""
    kind: str
    """``panel`` (which sample?), ``unit``, ``co2`` (pCO2 or total CO2?), ``confirm`` (a value
    from an unexpected report), ``conflict`` (two values for one field) or ``time``."""
    text: str
    """The question to ask, in words."""
    sources: tuple[SourceLine, ...]
    """The lines it is about."""
    options: tuple[Option, ...]
    """The possible answers; leaving the item out is always possible as well."""


@dataclass(frozen=True, slots=True)
class Unrecognised:
    """A line (or value) that was not taken, with the reason."""

    source: SourceLine
    """The line."""
    reason: str
    """Why it was not taken, and what to do if it matters."""
    refused: bool = False
    """True when a value was read but refused (impossible value, unknown unit, a limit)."""


@dataclass(frozen=True)
class Proposal:
    """A draw proposed from pasted text, to be reviewed before it is applied."""

    values: dict[str, dict[str, Measurement]] = field(default_factory=dict)
    """Recognised values by panel value (``serum``, ``blood_gas``, ``urine``) then analyte key."""
    sources: dict[str, dict[str, SourceLine]] = field(default_factory=dict)
    """The source line of each recognised value, keyed like ``values``."""
    entries: tuple[Entry, ...] = ()
    """The recognised values in the order of the text, with their flags and times."""
    taken: datetime | None = None
    """The collection time, when the text gives exactly one."""
    gas_sample: str | None = None
    """``arterial``, ``venous`` or ``capillary`` when a heading or name says so."""
    questions: tuple[Question, ...] = ()
    """What must be answered (or left out) before the proposal is applied."""
    unrecognised: tuple[Unrecognised, ...] = ()
    """Lines and values not taken, with the reasons."""
    units: UnitSystem | None = None
    """The unit system bare numbers were read in (None: bare ambiguous numbers were asked)."""

    @property
    def complete(self) -> bool:
        """True when nothing is left to answer."""
        return not self.questions

    def cautions(self) -> list[tuple[Entry, str]]:
        """Recognised values outside the usual clinical range, with the caution to show."""
        out = []
        for e in self.entries:
            note = unusual(e.analyte, e.measurement)
            if note:
                out.append((e, note))
        return out

    def resolve(self, choices: Mapping[str, int | None]) -> Proposal:
        """A new proposal with the answered questions applied.

        ``choices`` maps a question id to the index of the chosen option, or to None to leave the
        item out (it is then listed as unrecognised). Unanswered questions stay open. A chosen
        value replaces a recognised value of the same field.
        """
        entries = list(self.entries)
        open_questions = []
        unrecognised = list(self.unrecognised)
        taken = self.taken
        for q in self.questions:
            if q.id not in choices:
                open_questions.append(q)
                continue
            pick = choices[q.id]
            if pick is None:
                unrecognised.append(Unrecognised(q.sources[0], f"left out at review: {q.text}"))
                continue
            if not 0 <= pick < len(q.options):
                raise ValueError(f"{q.id} has options 0–{len(q.options) - 1}, not {pick}")
            option = q.options[pick]
            if option.taken is not None:
                taken = option.taken
            if option.entry is not None:
                e = option.entry
                entries = [x for x in entries if (x.panel, x.key) != (e.panel, e.key)]
                entries.append(e)
        return build_proposal(
            entries, taken, self.gas_sample, open_questions, unrecognised, self.units
        )


def tidy_number(x: float) -> float | int:
    """``x`` as an int when it is a whole number, so that 140.0 reads "140"."""
    return int(x) if float(x).is_integer() and abs(x) < 1e15 else x


def build_proposal(
    entries: list[Entry],
    taken: datetime | None,
    gas_sample: str | None,
    questions: list[Question],
    unrecognised: list[Unrecognised],
    units: UnitSystem | None,
) -> Proposal:
    """The proposal holding ``entries`` (indexed by panel and field) and the rest as given."""
    values: dict[str, dict[str, Measurement]] = {}
    sources: dict[str, dict[str, SourceLine]] = {}
    for e in entries:
        values.setdefault(e.panel, {})[e.key] = e.measurement
        sources.setdefault(e.panel, {})[e.key] = e.source
    return Proposal(
        values=values,
        sources=sources,
        entries=tuple(entries),
        taken=taken,
        gas_sample=gas_sample,
        questions=tuple(questions),
        unrecognised=tuple(unrecognised),
        units=units,
    )
