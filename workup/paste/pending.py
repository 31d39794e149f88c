"""What the reading pass carries from line to line, and how it is settled into a proposal.

:mod:`workup.paste.reading` fills a :class:`ReadState` and a list of :class:`Pending` questions;
:func:`finish` then asks about fields read twice and about several collection times, numbers the
questions and builds the :class:`~workup.paste.model.Proposal`.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from datetime import datetime

from workup.analytes import UnitSystem
from workup.labtext.vocabulary import Heading
from workup.paste.model import (
    PANEL_WORD,
    Entry,
    Option,
    Proposal,
    Question,
    SourceLine,
    Unrecognised,
    build_proposal,
)


@dataclass
class ReadState:
    """The context the lines read so far set for the lines below them."""

    heading: Heading | None = None
    """The last section heading (serum, urine, blood gas...), or None before any."""
    when_text: str = ""
    """The last collection time written on a line of its own, as written."""
    columns: list[str] = field(default_factory=list)
    """The time-column titles of the current table, in order (empty when none)."""
    gas_samples: list[tuple[str, SourceLine]] = field(default_factory=list)
    """Every gas sample type a heading or name gave, with its line."""
    times: list[tuple[datetime, str, SourceLine]] = field(default_factory=list)
    """Every collection time read, as a datetime and as written, with its line."""


@dataclass
class Pending:
    """A question found on one line, before the proposal numbers it and labels its options."""

    kind: str
    """The question kind (see :attr:`workup.paste.model.Question.kind`)."""
    text: str
    """The question to ask, in words."""
    sources: tuple[SourceLine, ...]
    """The lines it is about."""
    options: list[Entry]
    """The values it may be answered with."""
    problems: list[str]
    """Why some readings of the line could not be taken (carried along, not shown)."""


def finish(
    entries: list[Entry],
    pending: list[Pending],
    unrecognised: list[Unrecognised],
    ctx: ReadState,
    units: UnitSystem | None,
) -> Proposal:
    """The proposal from what the reading pass found: settled values, questions and refusals."""
    # Two different values for one field (repeated analytes, two times) become one question.
    by_field: dict[tuple[str, str], list[Entry]] = {}
    for e in entries:
        by_field.setdefault((e.panel, e.key), []).append(e)
    kept: list[Entry] = []
    for e in entries:
        group = _dedupe_across(by_field[(e.panel, e.key)])
        if len(group) == 1:
            if e is group[0]:
                kept.append(e)
        elif e is by_field[(e.panel, e.key)][0]:
            sources = tuple(dict.fromkeys(x.source for x in group))
            lines = ", ".join(str(s.number) for s in sources)
            pending.append(
                Pending(
                    "conflict",
                    f"{PANEL_WORD[e.panel]} {e.analyte.name} has different values "
                    f"({'lines' if len(sources) > 1 else 'line'} {lines}): "
                    "which belongs to this draw?",
                    sources,
                    group,
                    [],
                )
            )
    questions: list[Question] = []
    recognised = {(e.panel, e.key): e for e in kept}
    for p in pending:
        timed = len({o.when for o in p.options}) > 1
        opts = tuple(
            Option(_option_label(o, p.kind, recognised, timed), entry=o) for o in p.options
        )
        questions.append(Question(f"q{len(questions) + 1}", p.kind, p.text, p.sources, opts))
    taken = None
    distinct = list(dict.fromkeys(t for t, _, _ in ctx.times))
    if len(distinct) == 1:
        taken = distinct[0]
    elif len(distinct) > 1:
        sources = tuple(dict.fromkeys(s for _, _, s in ctx.times))
        questions.append(
            Question(
                f"q{len(questions) + 1}",
                "time",
                "the text gives more than one collection time: which is the time of this draw?",
                sources,
                tuple(Option(f"collected {t:%Y-%m-%d %H:%M}", taken=t) for t in distinct),
            )
        )
    samples = list(dict.fromkeys(s for s, _ in ctx.gas_samples))
    gas_sample = samples[0] if len(samples) == 1 else None
    if len(samples) > 1:
        unrecognised.append(
            Unrecognised(
                ctx.gas_samples[0][1],
                f"the gas is called {' and '.join(samples)} in different places: "
                "set the sample type by hand",
            )
        )
    return build_proposal(kept, taken, gas_sample, questions, unrecognised, units)


def _dedupe_across(group: list[Entry]) -> list[Entry]:
    out: list[Entry] = []
    for e in group:
        if not any(abs(x.measurement.canonical - e.measurement.canonical) < 1e-9 for x in out):
            out.append(e)
    return out


def _option_label(
    e: Entry, kind: str, recognised: dict[tuple[str, str], Entry], timed: bool
) -> str:
    label = e.describe()
    if e.when and timed:
        label += f" (collected {e.when})"
    if kind == "conflict":
        label += f" from line {e.source.number}"
    other = recognised.get((e.panel, e.key))
    if other is not None and other.measurement.canonical != e.measurement.canonical:
        label += f"; replaces {other.describe()} from line {other.source.number}"
    return label
