"""Propose a draw from lab-report text copied out of the record, for review before it is applied.

:func:`propose` reads pasted text line by line. Each value it recognises lands in one panel field
with its source line; anything it cannot place without guessing becomes a :class:`Question`
(serum or urine? which unit? two values for one analyte? "CO2" on a gas report?), and anything it
cannot read is listed as :class:`Unrecognised` with the reason. Nothing is applied until the user
has reviewed the proposal: :meth:`Proposal.resolve` takes the answers and :func:`apply_proposal`
merges the values into a new :class:`~workup.model.Draw`.

Units follow the case-file rules (:func:`workup.quantity.read_value`): a unit written in the text
wins; otherwise the explicit ``units`` default; a bare number of an analyte whose unit differs
between countries, with no default, is a question with the possible units as options.
"""

from __future__ import annotations

import re
from collections.abc import Mapping
from dataclasses import dataclass, field
from datetime import datetime

from workup.analytes import Analyte, Panel, UnitSystem, analyte
from workup.labtext.cells import NO_RESULT_WORDS, QUALITY_WORDS, Reading, is_unit, read_cells
from workup.labtext.dates import find_clock, find_time
from workup.labtext.vocabulary import Heading, Identity, NameMatch, match_heading, match_name
from workup.model import PANEL_MODELS, Draw, GasSample
from workup.quantity import Measurement, ValueProblem, read_value, unusual

MAX_LINES = 2000
"""A lab report is tens of lines; longer pastes are read up to this many lines."""
MAX_LINE_CHARS = 500
"""Characters of one line that are read; a longer line is not a report row."""

PANEL_WORD = {"serum": "serum", "blood_gas": "blood gas", "urine": "urine"}


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
        value = m.word if m.word is not None else f"{_tidy(m.value)} {m.unit}".strip()
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
        return _build(entries, taken, self.gas_sample, open_questions, unrecognised, self.units)


def answers_for_panel(proposal: Proposal, panel: str) -> dict[str, int]:
    """Choices answering every "which sample?" question with ``panel`` where it is an option.

    For a block of unlabelled lines the user knows to be, say, all serum. Questions whose
    options hold ``panel`` more than once (a unit is also asked) are left for one-by-one answers.
    """
    out = {}
    for q in proposal.questions:
        if q.kind != "panel":
            continue
        hits = [i for i, o in enumerate(q.options) if o.entry and o.entry.panel == panel]
        if len(hits) == 1:
            out[q.id] = hits[0]
    return out


class UnansweredQuestions(ValueError):
    """Raised by :func:`apply_proposal` when a question has neither an answer nor a leave-out."""

    def __init__(self, questions: tuple[Question, ...]):
        self.questions = questions
        ids = ", ".join(q.id for q in questions)
        super().__init__(f"{len(questions)} question(s) unanswered ({ids}); choose or leave out")


def apply_proposal(
    draw: Draw, proposal: Proposal, choices: Mapping[str, int | None] | None = None
) -> Draw:
    """A new draw: ``draw`` with the proposal's values merged in (``draw`` is not changed).

    ``choices`` answers the open questions as in :meth:`Proposal.resolve`; every question must be
    answered or left out, else :class:`UnansweredQuestions` is raised. A proposed value replaces
    the draw's value of the same field; the proposal's collection time and gas sample are used
    only where the draw has none (a new draw) or where they are given, respectively.
    """
    p = proposal.resolve(choices or {})
    if p.questions:
        raise UnansweredQuestions(p.questions)
    panels = {}
    for panel in Panel:
        current = dict(draw.panel(panel).measurements())
        current.update(p.values.get(panel.value, {}))
        extra = {}
        if panel is Panel.blood_gas:
            extra["sample"] = GasSample(p.gas_sample) if p.gas_sample else draw.blood_gas.sample
        panels[panel.value] = PANEL_MODELS[panel](**current, **extra)
    return Draw(
        label=draw.label,
        taken=draw.taken if draw.taken is not None else p.taken,
        during=draw.during,
        notes=draw.notes,
        **panels,
    )


# ---------------------------------------------------------------------------------------------
# Reading the text


_COLLECTED = re.compile(
    r"\b(collect(ed|ion)?|coll|drawn|draw time|sampled|sample time|specimen time|taken|obtained)\b",
    re.IGNORECASE,
)
_REPORTED = re.compile(
    r"\b(received|reported|resulted|verified|printed|released|report date|ordered)\b",
    re.IGNORECASE,
)
_COLUMN_WORDS = re.compile(
    r"\b(test|tests|analyte|component|name|result|results|value|units?|flag|ref|reference|range|"
    r"interval|status|normal)\b",
    re.IGNORECASE,
)


@dataclass
class _Context:
    heading: Heading | None = None
    when_text: str = ""
    columns: list[str] = field(default_factory=list)
    gas_samples: list[tuple[str, SourceLine]] = field(default_factory=list)
    times: list[tuple[datetime, str, SourceLine]] = field(default_factory=list)


def _tidy(x: float) -> float | int:
    return int(x) if float(x).is_integer() and abs(x) < 1e15 else x


def _clean(line: str) -> str:
    line = line.replace("\u00a0", " ").replace("\u2212", "-").replace("\r", "")
    line = "".join(ch if ch.isprintable() or ch == "\t" else " " for ch in line)
    return line.rstrip()[:MAX_LINE_CHARS]


def propose(text: str, units: UnitSystem | None = None) -> Proposal:
    """Read pasted lab-report text into a proposal; never raises for any text."""
    if not isinstance(text, str):
        text = str(text)
    ctx = _Context()
    entries: list[Entry] = []
    questions: list[_Pending] = []
    unrecognised: list[Unrecognised] = []
    lines = text.split("\n")
    for number, raw in enumerate(lines[:MAX_LINES], start=1):
        line = _clean(raw)
        if not re.search(r"[^\W_]", line):
            continue  # blank lines and rules of dashes
        src = SourceLine(number, line)
        for segment in _segments(line):
            _read_line(segment, src, ctx, units, entries, questions, unrecognised)
    if len(lines) > MAX_LINES:
        unrecognised.append(
            Unrecognised(
                SourceLine(MAX_LINES + 1, ""),
                f"only the first {MAX_LINES} lines were read; paste the report in parts",
            )
        )
    return _finish(entries, questions, unrecognised, ctx, units)


def _segments(line: str) -> list[str]:
    """Several analytes on one line ("Na 138, K 4.1; Cl 105" or "pH 7.31 pCO2 30") split up."""
    first = match_name(line)
    if first is None or first.identity.unused:
        return [line]
    cuts = []
    for m in re.finditer(r"(?<=[\s,;])(?=[^\s,;])", line):
        pos = m.start()
        if pos <= first.end:
            continue
        before = line[:pos].rstrip(" \t,;")
        if not before or not (
            before[-1].isdigit() or is_unit(before.split()[-1]) or before[-1] in "*!+"
        ):
            continue
        nm = match_name(line[pos:])
        if nm is None:
            continue
        after = line[pos + nm.end :].lstrip(" \t:=")
        if after[:1].isdigit() or after[:1] in "<>" or after.lower().startswith(("neg", "trace")):
            cuts.append(pos)
    if not cuts:
        return [line]
    parts, last = [], 0
    for c in cuts:
        parts.append(line[last:c].rstrip(" \t,;"))
        last = c
    parts.append(line[last:])
    return parts


def _read_line(
    line: str,
    src: SourceLine,
    ctx: _Context,
    units: UnitSystem | None,
    entries: list[Entry],
    questions: list[_Pending],
    unrecognised: list[Unrecognised],
) -> None:
    name = match_name(line)
    if name is None:
        _read_other(line, src, ctx, unrecognised)
        return
    ident = name.identity
    if ident.unused:
        unrecognised.append(Unrecognised(src, f"{name.spelling!r}: {ident.unused}"))
        return
    cells = read_cells(line[name.end :], grades=ident.key == "ketones")
    when = ctx.when_text
    if cells.when_text:
        when = cells.when_text
        found = find_time(cells.when_text)
        if found is not None and found.when is not None:
            ctx.times.append((found.when, found.text, src))
    if name.gas_sample:
        ctx.gas_samples.append((name.gas_sample, src))
    readings = list(cells.readings)
    if not readings:
        no_result = [w for w in cells.words if w.lower() in NO_RESULT_WORDS]
        reason = (
            f"no result value ({no_result[0]})" if no_result else "a name without a value beside it"
        )
        unrecognised.append(Unrecognised(src, reason))
        return
    columns = _columns_for(ctx, readings)
    labels = columns or [when] * len(readings)
    targets, confirm, refusal = _targets(ident, name, ctx.heading)
    if refusal:
        unrecognised.append(Unrecognised(src, refusal))
        return
    # A sample-quality remark (hemolyzed, lipemic...) beside a value is asked about.
    remarks = [w.lower() for w in cells.words if w.lower() in QUALITY_WORDS]
    if remarks and not confirm:
        confirm = "quality:" + remarks[0]
    options: list[Entry] = []
    problems: list[str] = []
    units_asked = False
    for reading, label in zip(readings, labels, strict=True):
        problem = _reading_problem(reading)
        if problem:
            problems.append(problem)
            continue
        for panel, key in targets:
            found, asked, probs = _measure(panel, key, reading, units)
            units_asked = units_asked or asked
            problems += probs
            options += [Entry(panel.value, key, m, src, label, cells.flags) for m in found]
    options = _dedupe(options)
    if not options:
        reason = "; ".join(dict.fromkeys(problems)) or "no value could be read"
        unrecognised.append(Unrecognised(src, reason, refused=True))
        return
    settled = len(targets) == 1 and not confirm and not units_asked
    # Values under time columns are one reading per time: each is kept, and _finish asks only
    # when the times disagree. One option is taken as read only when nothing was inferred: a
    # panel or unit is never chosen because the others would make the number impossible.
    if settled and (len(options) == 1 or columns is not None):
        entries.extend(options)
        return
    several_readings = len(readings) > 1 and len({o.measurement.canonical for o in options}) > 1
    questions.append(
        _Pending(
            _kind(ident, targets, units_asked, confirm, several_readings),
            _question_text(line, ident, targets, units_asked, confirm, several_readings, src),
            (src,),
            options,
            problems,
        )
    )


def _columns_for(ctx: _Context, readings: list[Reading]) -> list[str] | None:
    """The time-column titles the readings of a row fall under, or None."""
    if len(readings) > 1 and len(ctx.columns) == len(readings):
        return ctx.columns
    return None


def _reading_problem(reading: Reading) -> str:
    if reading.limit:
        return (
            f"reported as a limit ({reading.limit}{reading.text}), not a number; "
            "enter it by hand if you mean to use it"
        )
    if "," in reading.text:
        return (
            f"{reading.text!r} has a comma: workup does not guess whether it is a decimal comma "
            "or a thousands separator; enter the value by hand"
        )
    return ""


def _measure(
    panel: Panel, key: str, reading: Reading, units: UnitSystem | None
) -> tuple[list[Measurement], bool, list[str]]:
    """Measurements of ``reading`` for one field: one, or one per possible unit when asked."""
    a = analyte(panel, key)
    raw = reading.text if reading.unit is None else f"{reading.text} {reading.unit}"
    try:
        return [read_value(a, raw, units)], False, []
    except ValueProblem as exc:
        if reading.unit is not None or units is not None or not a.ambiguous:
            return [], False, [f"{PANEL_WORD[panel.value]} {a.name}: {exc}"]
    found, problems = [], []
    for u in a.units:
        if u.system is None:
            continue
        try:
            found.append(read_value(a, f"{reading.text} {u.symbol}", None))
        except ValueProblem as exc:
            problems.append(f"{PANEL_WORD[panel.value]} {a.name}: {exc}")
    return found, True, problems


def _dedupe(options: list[Entry]) -> list[Entry]:
    """Drop repeats: the same field and value, or one value printed in two units (within 1%)."""
    out: list[Entry] = []
    for o in options:
        same = False
        for x in out:
            if (x.panel, x.key, x.when) != (o.panel, o.key, o.when):
                continue
            a, b = x.measurement.canonical, o.measurement.canonical
            if x.measurement.unit == o.measurement.unit:
                same = a == b
            else:
                same = x.source == o.source and abs(a - b) <= 0.01 * max(abs(a), abs(b))
            if same:
                break
        if not same:
            out.append(o)
    return out


def _targets(
    ident: Identity, name: NameMatch, heading: Heading | None
) -> tuple[list[tuple[Panel, str]], str, str]:
    """(fields the value may go to, a confirmation to ask, or a refusal)."""
    panels = ident.panels
    what = name.spelling

    def key_for(panel: Panel) -> str:
        if ident.co2:
            return "pco2" if panel is Panel.blood_gas else "bicarbonate"
        return ident.key

    def only(panel: Panel, confirm: str = "") -> tuple[list[tuple[Panel, str]], str, str]:
        if panel not in panels:
            return [], "", f"{what!r}: workup records no {PANEL_WORD[panel.value]} value of this"
        return [(panel, key_for(panel))], confirm, ""

    marker = name.marker
    if marker == "urine":
        return only(Panel.urine)
    if marker == "serum":
        return only(Panel.serum)
    if marker in ("gas", "whole_blood"):
        if Panel.blood_gas in panels and not ident.co2:
            return only(Panel.blood_gas)
        if ident.co2:
            return [(Panel.blood_gas, "pco2"), (Panel.serum, "bicarbonate")], "", ""
        return only(Panel.serum, "gas")
    section = heading.panel if heading else None
    if section == "urine_timed":
        return (
            [],
            "",
            "from a timed (24-hour) urine collection: workup takes spot-urine concentrations",
        )
    if section == "urine":
        return only(Panel.urine)
    if section == "serum":
        return only(Panel.serum)
    if section == "blood_gas":
        if ident.co2:
            return [(Panel.blood_gas, "pco2"), (Panel.serum, "bicarbonate")], "", ""
        if Panel.blood_gas in panels:
            return only(Panel.blood_gas)
        return only(Panel.serum, "gas")
    if ident.co2:
        return [(Panel.serum, "bicarbonate"), (Panel.blood_gas, "pco2")], "", ""
    if panels == (Panel.serum,):
        return only(Panel.serum)
    if panels == (Panel.urine,):
        return only(Panel.urine, "urine")
    return [(p, key_for(p)) for p in panels], "", ""


def _kind(ident, targets, units_asked, confirm, several) -> str:
    if several:
        return "conflict"
    if ident.co2:
        return "co2"
    if len({p for p, _ in targets}) > 1:
        return "panel"
    if confirm:
        return "confirm"
    return "unit" if units_asked else "conflict"


def _question_text(line, ident, targets, units_asked, confirm, several, src) -> str:
    shown = " ".join(line.split())
    if len(shown) > 48:
        shown = shown[:47] + "…"
    head = f"line {src.number} “{shown}”"
    if several:
        return f"{head} holds more than one value: which one belongs to this draw?"
    asks = []
    if ident.co2:
        asks.append(
            "“CO2” may be the total CO2 (serum bicarbonate) or the pCO2 of a blood gas: which is it?"
        )
    if len({p for p, _ in targets}) > 1 and not ident.co2:
        words = " or ".join(PANEL_WORD[p.value] for p, _ in targets)
        asks.append(f"no sample type is given: {words}?")
    if confirm == "gas":
        asks.append("this is from a blood gas report (whole blood): enter it as the serum value?")
    if confirm.startswith("quality:"):
        asks.append(f"the line says “{confirm.split(':', 1)[1]}”: use the value?")
    if confirm == "urine":
        asks.append("workup knows this only in urine, but the line does not say urine: is it?")
    if units_asked:
        asks.append("the number has no unit and no unit system was chosen: which unit?")
    return f"{head}: " + "; ".join(asks)


@dataclass
class _Pending:
    kind: str
    text: str
    sources: tuple[SourceLine, ...]
    options: list[Entry]
    problems: list[str]


def _read_other(line: str, src: SourceLine, ctx: _Context, unrecognised: list[Unrecognised]):
    """A line without an analyte name: a collection time, a heading, column titles, or noise."""
    found = find_time(line)
    rest = line if found is None else line[: found.start] + " " + line[found.end :]
    # A heading holds no value; "24-hour urine" is the one heading with digits in it.
    bare = re.sub(r"(?i)\b24[- ]?h(ou)?r?s?\b", "", rest)
    heading = match_heading(rest) if not re.search(r"\d", bare) else None
    if found is not None and (_COLLECTED.search(line) or heading is not None):
        if found.when is None:
            unrecognised.append(Unrecognised(src, found.problem))
            ctx.when_text = found.text
        else:
            ctx.times.append((found.when, found.text, src))
            ctx.when_text = found.text
        if heading is not None:
            _set_heading(ctx, heading, src)
        return
    if found is not None and _REPORTED.search(line):
        unrecognised.append(Unrecognised(src, "a report time, not the time of collection"))
        return
    if heading is not None:
        _set_heading(ctx, heading, src)
        return
    columns = _time_columns(line)
    if len(columns) >= 2:
        ctx.columns = columns
        for text in columns:
            f = find_time(text)
            if f is not None and f.when is not None:
                ctx.times.append((f.when, f.text, src))
        return
    if len(_COLUMN_WORDS.findall(line)) >= 2 and not re.search(r"\d", line):
        return  # column titles of a copied table ("Test  Result  Units  Range")
    if found is not None:
        unrecognised.append(
            Unrecognised(
                src,
                "a date without “collected” or “drawn”: set the time of the draw by hand "
                "if it is the collection time",
            )
        )
        return
    reason = (
        "no analyte name workup knows at the start of the line"
        if re.search(r"\d", line)
        else "no value and no heading workup knows"
    )
    unrecognised.append(Unrecognised(src, reason))


def _set_heading(ctx: _Context, heading: Heading, src: SourceLine) -> None:
    ctx.heading = heading
    ctx.columns = []
    if heading.gas_sample:
        ctx.gas_samples.append((heading.gas_sample, src))


def _time_columns(line: str) -> list[str]:
    """Column titles that are times ("30/11 08:15", "14:30"), in order."""
    cells = [c.strip() for c in re.split(r"\t|\s{2,}|\s\|\s", line) if c.strip()]
    out = []
    for c in cells:
        f = find_time(c)
        if f is not None:
            out.append(f.text)
        elif find_clock(c) is not None and len(c) <= 20:
            out.append(c)
    return out


def _finish(
    entries: list[Entry],
    pending: list[_Pending],
    unrecognised: list[Unrecognised],
    ctx: _Context,
    units: UnitSystem | None,
) -> Proposal:
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
                _Pending(
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
    return _build(kept, taken, gas_sample, questions, unrecognised, units)


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


def _build(
    entries: list[Entry],
    taken: datetime | None,
    gas_sample: str | None,
    questions: list[Question],
    unrecognised: list[Unrecognised],
    units: UnitSystem | None,
) -> Proposal:
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


__all__ = [
    "Entry",
    "Option",
    "Proposal",
    "Question",
    "SourceLine",
    "UnansweredQuestions",
    "Unrecognised",
    "answers_for_panel",
    "apply_proposal",
    "propose",
]
