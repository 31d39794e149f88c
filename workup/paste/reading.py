"""The reading pass: pasted text, line by line, into placed values, questions and refusals.

:func:`propose` splits each line into one segment per analyte and reads the value beside the name;
lines without a name go to :mod:`workup.paste.context_lines`, the fields a name may fill come from
:mod:`workup.paste.targets`, and :func:`workup.paste.pending.finish` settles it all into a proposal.
"""

from __future__ import annotations

import re

from workup.analytes import Panel, UnitSystem, analyte
from workup.labtext.cells import NO_RESULT_WORDS, QUALITY_WORDS, Reading, is_unit, read_cells
from workup.labtext.dates import find_time
from workup.labtext.vocabulary import match_name
from workup.paste.context_lines import read_context_line
from workup.paste.model import PANEL_WORD, Entry, Proposal, SourceLine, Unrecognised
from workup.paste.pending import Pending, ReadState, finish
from workup.paste.targets import question_kind, question_text, value_targets
from workup.quantity import Measurement, ValueProblem, read_value

MAX_LINES = 2000
"""A lab report is tens of lines; longer pastes are read up to this many lines."""
MAX_LINE_CHARS = 500
"""Characters of one line that are read; a longer line is not a report row."""


def _clean(line: str) -> str:
    line = line.replace("\u00a0", " ").replace("\u2212", "-").replace("\r", "")
    line = "".join(ch if ch.isprintable() or ch == "\t" else " " for ch in line)
    return line.rstrip()[:MAX_LINE_CHARS]


def propose(text: str, units: UnitSystem | None = None) -> Proposal:
    """Read pasted lab-report text into a proposal; never raises for any text."""
    if not isinstance(text, str):
        text = str(text)
    ctx = ReadState()
    entries: list[Entry] = []
    questions: list[Pending] = []
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
    return finish(entries, questions, unrecognised, ctx, units)


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
    ctx: ReadState,
    units: UnitSystem | None,
    entries: list[Entry],
    questions: list[Pending],
    unrecognised: list[Unrecognised],
) -> None:
    name = match_name(line)
    if name is None:
        read_context_line(line, src, ctx, unrecognised)
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
    targets, confirm, refusal = value_targets(ident, name, ctx.heading)
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
    # Values under time columns are one reading per time: each is kept, and finish() asks only
    # when the times disagree. One option is taken as read only when nothing was inferred: a
    # panel or unit is never chosen because the others would make the number impossible.
    if settled and (len(options) == 1 or columns is not None):
        entries.extend(options)
        return
    several_readings = len(readings) > 1 and len({o.measurement.canonical for o in options}) > 1
    questions.append(
        Pending(
            question_kind(ident, targets, units_asked, confirm, several_readings),
            question_text(line, ident, targets, units_asked, confirm, several_readings, src),
            (src,),
            options,
            problems,
        )
    )


def _columns_for(ctx: ReadState, readings: list[Reading]) -> list[str] | None:
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
