"""Dates and times of collection as records print them.

Day and month are never guessed: 03/04/2026 could be either, so it is reported as ambiguous
unless one of the two numbers is above 12 (or both are equal). ISO dates and dates with a month
name are unambiguous.
"""

from __future__ import annotations

import re
from dataclasses import dataclass
from datetime import datetime

_MONTHS = {
    m: i + 1
    for i, m in enumerate(
        ("jan", "feb", "mar", "apr", "may", "jun", "jul", "aug", "sep", "oct", "nov", "dec")
    )
}
_MON = r"(?P<mon>jan|feb|mar|apr|may|jun|jul|aug|sep|oct|nov|dec)[a-z]*\.?"
_TIME = r"(?:[ T,@at]*(?P<h>\d{1,2}):?(?P<mi>\d{2})(?::\d{2})?\s*(?P<ampm>am|pm|a\.m\.|p\.m\.)?(?![\d.]))?"
_PATTERNS = [
    re.compile(r"(?P<y>\d{4})-(?P<m>\d{1,2})-(?P<d>\d{1,2})" + _TIME),
    # One separator twice; with dots only a four-digit year, so "4.5-10.5" is never a date.
    re.compile(
        r"(?P<a>\d{1,2})(?P<sep>[/\-])(?P<b>\d{1,2})(?P=sep)(?P<y>\d{2}|\d{4})(?!\d)" + _TIME
    ),
    re.compile(r"(?P<a>\d{1,2})\.(?P<b>\d{1,2})\.(?P<y>\d{4})(?!\d)" + _TIME),
    re.compile(r"(?P<d>\d{1,2})[\s\-]" + _MON + r"[\s\-,]*(?P<y>\d{4}|\d{2})(?!\d)" + _TIME),
    re.compile(_MON + r"\s+(?P<d>\d{1,2}),?\s+(?P<y>\d{4})" + _TIME),
]
_CLOCK = re.compile(
    r"(?<![\d.:])(?P<h>\d{1,2}):(?P<mi>\d{2})(?::\d{2})?\s*(?P<ampm>am|pm)?(?![\d.])"
)


@dataclass(frozen=True, slots=True)
class FoundTime:
    """A date (and time) written in a line."""

    text: str
    """The characters as written."""
    start: int
    """Offset of the first character in the searched text."""
    end: int
    """Offset just after the last character."""
    when: datetime | None
    """The moment, or None when it cannot be fixed (see ``problem``)."""
    problem: str = ""
    """Why ``when`` is None: an ambiguous day/month, an impossible date, no date."""


def _year(text: str) -> int:
    y = int(text)
    return y + 2000 if y < 100 else y


def _hour(h: str | None, ampm: str | None) -> int:
    hour = int(h) if h else 0
    if ampm:
        pm = ampm.startswith("p")
        if hour == 12:
            hour = 0
        if pm:
            hour += 12
    return hour


def find_time(text: str) -> FoundTime | None:
    """The first date, with its time of day when written, in ``text``; None when there is none."""
    low = text.lower()
    best: tuple[int, re.Match[str], int] | None = None
    for i, pattern in enumerate(_PATTERNS):
        m = pattern.search(low)
        if m and (best is None or m.start() < best[1].start()):
            best = (i, m, i)
    if best is None:
        return None
    kind, m, _ = best
    g = m.groupdict()
    raw = text[m.start() : m.end()].strip()
    if kind == 0:
        year, month, day = int(g["y"]), int(g["m"]), int(g["d"])
    elif kind in (1, 2):
        a, b, year = int(g["a"]), int(g["b"]), _year(g["y"])
        if a > 12 >= b:
            day, month = a, b
        elif b > 12 >= a:
            month, day = a, b
        elif a == b:
            day = month = a
        else:
            return FoundTime(
                raw,
                m.start(),
                m.end(),
                None,
                f"{raw!r} could be day {a} of month {b} or month {a} day {b}; "
                "set the time of the draw by hand",
            )
    else:
        year, month, day = _year(g["y"]), _MONTHS[g["mon"][:3]], int(g["d"])
    if not g.get("h"):
        return FoundTime(
            raw,
            m.start(),
            m.end(),
            None,
            f"{raw!r} has no time of day; set the time of the draw by hand",
        )
    try:
        hour = _hour(g.get("h"), g.get("ampm"))
        minute = int(g["mi"])
        when = datetime(year, month, day, hour, minute)
    except ValueError:
        return FoundTime(raw, m.start(), m.end(), None, f"{raw!r} is not a possible date and time")
    return FoundTime(raw, m.start(), m.end(), when)


def find_clock(text: str) -> str | None:
    """A bare time of day ("08:15", "2:30 pm") in ``text``, as written; None when absent."""
    m = _CLOCK.search(text.lower())
    return text[m.start() : m.end()].strip() if m else None
