"""The value part of a report line: numbers, units, flags and reference ranges beside the name.

Reference ranges ("135-145", "(3.5 - 5.1)", "<1.2" after a value) and flags (H, L, HH, LL, *, !,
"critical") are set aside; what remains is one or more readings, each a number (or dipstick
grade) with the unit written beside it, if any.
"""

from __future__ import annotations

import re
from dataclasses import dataclass

from workup.labtext.dates import find_time

_NUM = r"\d+(?:[.,]\d+)*"
_BRACKETED_RANGE = re.compile(
    r"[(\[]\s*(?:ref(?:erence)?\s*(?:range|interval)?\s*:?\s*)?"
    r"(?:[<>≤≥]=?\s*" + _NUM + r"|" + _NUM + r"\s*(?:-|–|—|to)\s*" + _NUM + r")"
    r"(?P<inside>[^)\]]*)[)\]]"
)
_BARE_RANGE = re.compile(r"(?<![\w.])" + _NUM + r"\s*(?:-|–|—|to)\s*" + _NUM + r"(?![\w.])")
_RANGE_WORDS = re.compile(
    r"\b(?:ref(?:erence)?\.?\s*(?:range|interval|values?)?|normal\s*(?:range)?|range)\s*:?",
    re.IGNORECASE,
)
_TOKEN = re.compile(
    r"(?P<grade>(?<![\w.])(?:[1-4]\s?\+|negative|neg|trace|small|moderate|large)(?![\w+]))"
    r"|(?P<num>(?<![\w.])(?P<lim>[<>≤≥]=?\s*)?" + _NUM + r")(?P<glued>[a-zµμ%*!][\w/%µμ.*!]*)?"
    r"|(?P<word>[a-zµμ%*!][\w/%µμ.*!+\-]*)",
    re.IGNORECASE,
)
FLAGS = frozenset(
    {
        "h",
        "l",
        "hh",
        "ll",
        "a",
        "c",
        "high",
        "low",
        "critical",
        "crit",
        "abnormal",
        "abn",
        "panic",
        "alert",
        "hi",
        "lo",
        "*h",
        "*l",
        "h*",
        "l*",
    }
)
_UNIT_WORDS = frozenset({"mmhg", "kpa", "torr", "%", "mm", "grade"})
QUALITY_WORDS = frozenset(
    {
        "hemolyzed",
        "haemolysed",
        "hemolysed",
        "haemolyzed",
        "hemolysis",
        "haemolysis",
        "lipemic",
        "lipaemic",
        "icteric",
        "clotted",
        "diluted",
        "contaminated",
    }
)
"""Sample-quality remarks: a value beside one of these is asked about, not taken as read."""
NO_RESULT_WORDS = frozenset(
    {
        "pending",
        "cancelled",
        "canceled",
        "see",
        "comment",
        "note",
        "tnp",
        "qns",
        "hemolyzed",
        "haemolysed",
        "hemolysed",
        "invalid",
        "error",
        "unavailable",
    }
)


@dataclass(frozen=True, slots=True)
class Reading:
    """One value written on a line."""

    text: str
    """The number or grade as written (without flags)."""
    unit: str | None
    """The unit written beside it, or None for a bare number."""
    limit: str = ""
    """"<" or ">" when the laboratory reported a limit instead of a number."""
    grade: bool = False
    """True for a dipstick grade word ("trace", "2+")."""


@dataclass(frozen=True, slots=True)
class Cells:
    """What the value part of a line holds."""

    readings: tuple[Reading, ...]
    """The values, in the order written."""
    flags: tuple[str, ...]
    """Abnormal flags as written (H, L, *, critical); shown, never used."""
    words: tuple[str, ...]
    """Other words left over ("final", "hemolyzed")."""
    when_text: str = ""
    """A date and time written in the row itself (a "collected" column), as written."""


def is_unit(word: str) -> bool:
    """True when ``word`` looks like a unit ("mmol/L", "mg/dL", "mmHg", "kPa", "%")."""
    w = word.lower().strip(".")
    return "/" in w or w in _UNIT_WORDS


def _normalise(text: str) -> str:
    text = re.sub(r"(?i)\bkg\s*h2o\b", "kg", text)
    text = re.sub(r"(?i)\bmm\s+hg\b", "mmHg", text)
    text = re.sub(r"(?i)\bm(?:eq|mol)\s*/\s*l\b", lambda m: m.group(0).replace(" ", ""), text)
    return text.replace("\u00a0", " ")


def read_cells(text: str, grades: bool = False) -> Cells:
    """Split the value part of a line into readings, flags and other words."""
    text = _normalise(text)
    when_text = ""
    found = find_time(text)
    if found is not None:
        when_text = found.text
        text = text[: found.start] + " " + text[found.end :]
    range_units: list[str] = []

    def _drop(m: re.Match[str]) -> str:
        inside = m.groupdict().get("inside") or ""
        range_units.extend(w for w in inside.split() if is_unit(w))
        return " "

    text = _BRACKETED_RANGE.sub(_drop, text)
    text = _BARE_RANGE.sub(" ", text)
    text = _RANGE_WORDS.sub(" ", text)
    text = re.sub(r"[()\[\]|:=]", " ", text)

    pending: list[list[str | None]] = []  # [text, unit, limit, grade]
    flags: list[str] = []
    words: list[str] = []
    units_seen: list[str] = []
    for m in _TOKEN.finditer(text):
        if m.group("grade"):
            if grades:
                pending.append([m.group("grade").replace(" ", ""), None, "", "g"])
            else:
                words.append(m.group("grade"))
            continue
        if m.group("num"):
            limit = (m.group("lim") or "").strip()
            number = m.group("num")[len(m.group("lim") or "") :]
            if limit and pending:
                continue  # "<2.0" after a value is the reference limit, not a second value
            glued = m.group("glued")
            unit = None
            if glued:
                if is_unit(glued):
                    unit = glued
                    units_seen.append(glued)
                else:
                    flags.append(glued)
            pending.append([number, unit, limit, ""])
            continue
        word = m.group("word")
        if word.lower().strip("*!") in FLAGS or set(word) <= {"*", "!"}:
            flags.append(word)
        elif is_unit(word):
            units_seen.append(word)
            target = next((p for p in reversed(pending) if p[1] is None and not p[3]), None)
            if target is not None and target is pending[-1]:
                target[1] = word
        else:
            words.append(word)
    lone = {u.lower() for u in units_seen} | {u.lower() for u in range_units}
    only = (units_seen or range_units)[0] if len(lone) == 1 else None
    readings = tuple(
        Reading(
            str(p[0]),
            p[1] if p[1] is not None else (None if p[3] else only),
            limit=str(p[2]),
            grade=bool(p[3]),
        )
        for p in pending
    )
    return Cells(readings, tuple(flags), tuple(words), when_text)
