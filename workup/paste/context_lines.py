"""Lines without an analyte name: collection times, section headings, time-column titles, noise.

Such a line holds no value; it sets the :class:`~workup.paste.pending.ReadState` that the value
lines below it are read in (:mod:`workup.paste.reading`), or is listed as unrecognised.
"""

from __future__ import annotations

import re

from workup.labtext.dates import find_clock, find_time
from workup.labtext.vocabulary import Heading, match_heading
from workup.paste.model import SourceLine, Unrecognised
from workup.paste.pending import ReadState

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


def read_context_line(
    line: str, src: SourceLine, ctx: ReadState, unrecognised: list[Unrecognised]
) -> None:
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


def _set_heading(ctx: ReadState, heading: Heading, src: SourceLine) -> None:
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
