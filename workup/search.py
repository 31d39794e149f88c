"""The library search syntax (documented in docs/search.md): words, filters and value conditions.

A query is a list of terms separated by spaces; a case must satisfy every term. A term is free
text (``sicca``, ``"dry eyes"``), a filter (``pattern:distal``, ``verdict:likely``,
``date:2026-11``, ``is:pending``, ``file:2025/``), or a condition on an index or analyte
(``uag>0``, ``serum.potassium<3.5``, ``uag:not_valid``). A leading ``-`` negates a term.

Conditions on numbers only use values that may be read (an index whose status is valid or
caution; a measured value); every condition of one query must hold in the same draw, and the
match reports that draw's values with their status.
"""

from __future__ import annotations

import difflib
import re
from collections.abc import Callable, Iterable
from dataclasses import dataclass, field
from datetime import date

from workup.library import (
    ANALYTE_STATUS_MEASURED,
    ANALYTE_STATUS_UNUSUAL,
    DrawValues,
    LibraryEntry,
)


class SearchError(ValueError):
    """A query that cannot be read; the message says why and what would work."""


# The index ids of docs/indices.md (the contract every module relies on).
INDEX_IDS = (
    "henderson_hasselbalch_ph",
    "anion_gap",
    "anion_gap_albumin_corrected",
    "delta_ratio",
    "expected_pco2",
    "expected_pco2_metabolic_alkalosis",
    "expected_bicarbonate_respiratory_acidosis_acute",
    "expected_bicarbonate_respiratory_acidosis_chronic",
    "expected_bicarbonate_respiratory_alkalosis_acute",
    "expected_bicarbonate_respiratory_alkalosis_chronic",
    "serum_osmolal_gap",
    "urine_ph",
    "urine_anion_gap",
    "urine_osmolal_gap",
    "urine_ammonium_estimate",
    "urine_ammonium_creatinine_ratio",
    "ttkg",
    "urine_potassium_creatinine_ratio",
    "fe_bicarbonate",
    "urine_blood_pco2",
    "fe_phosphate",
    "tmp_gfr",
    "fe_urate",
    "egfr",
    "egfr_schwartz",
)

SHORT_NAMES: dict[str, str] = {
    "ag": "anion_gap",
    "agc": "anion_gap_albumin_corrected",
    "dr": "delta_ratio",
    "sog": "serum_osmolal_gap",
    "uag": "urine_anion_gap",
    "uog": "urine_osmolal_gap",
    "unh4": "urine_ammonium_estimate",
    "nh4cr": "urine_ammonium_creatinine_ratio",
    "ukcr": "urine_potassium_creatinine_ratio",
    "fehco3": "fe_bicarbonate",
    "ubpco2": "urine_blood_pco2",
    "fepo4": "fe_phosphate",
    "feua": "fe_urate",
    "na": "serum.sodium",
    "k": "serum.potassium",
    "cl": "serum.chloride",
    "hco3": "serum.bicarbonate",
    "alb": "serum.albumin",
    "cr": "serum.creatinine",
    "ph": "blood_gas.ph",
    "pco2": "blood_gas.pco2",
    "uph": "urine.ph",
    "una": "urine.sodium",
    "uk": "urine.potassium",
    "ucl": "urine.chloride",
}
"""Short names a fellow types, for the fields asked about most."""

STATUS_WORDS: dict[str, frozenset[str]] = {
    "valid": frozenset({"ok"}),
    "ok": frozenset({"ok"}),
    "caution": frozenset({"caution"}),
    "not_valid": frozenset({"not_valid"}),
    "invalid": frozenset({"not_valid"}),
    "needs_input": frozenset({"needs_input"}),
    "missing": frozenset({"needs_input"}),
    "measured": frozenset({ANALYTE_STATUS_MEASURED, ANALYTE_STATUS_UNUSUAL}),
    "unusual": frozenset({ANALYTE_STATUS_UNUSUAL}),
}
"""``FIELD:WORD`` status filters and the stored statuses each one accepts."""

USABLE = frozenset({"ok", "caution", ANALYTE_STATUS_MEASURED, ANALYTE_STATUS_UNUSUAL})
"""Statuses whose value a number condition may use."""

IS_WORDS = ("pending", "loading", "expected", "broken", "ok")
FILTERS = ("pattern", "verdict", "date", "is", "file")
_FILTER_ALIASES = {"p": "pattern", "v": "verdict", "d": "date"}
VERDICTS = ("likely", "possible", "unlikely")

_OPS: dict[str, Callable[[float, float], bool]] = {
    ">=": lambda a, b: a >= b,
    "<=": lambda a, b: a <= b,
    ">": lambda a, b: a > b,
    "<": lambda a, b: a < b,
    "=": lambda a, b: abs(a - b) < 1e-9,
}
_COND = re.compile(r"^([a-z][a-z0-9_.]*)(>=|<=|>|<|=)([-+]?(?:\d+\.?\d*|\.\d+))$")
_TOKEN = re.compile(r'-?"[^"]*"?|\S+')
_SPACED_OP = re.compile(r"\s*(>=|<=|>|<|=)\s*")
_DAY = re.compile(r"^(\d{4})(?:-(\d{2})(?:-(\d{2}))?)?$")


@dataclass(frozen=True, slots=True)
class Condition:
    """A test on one field of a draw: a comparison with a number, or a status."""

    field: str
    """Canonical key: an index id or ``panel.analyte``."""
    op: str | None = None
    """Comparison (>, >=, <, <=, =), or None for a status test."""
    number: float | None = None
    """The number compared with."""
    statuses: frozenset[str] = frozenset()
    """For a status test, the statuses that satisfy it."""
    written: str = ""
    """The term as typed."""

    def test(self, draw: DrawValues) -> tuple[float | None, str] | None:
        """The (value, status) that satisfies the condition in ``draw``, else None."""
        got = draw.values.get(self.field)
        if got is None:
            return None
        value, status = got
        if self.op is None:
            return got if status in self.statuses else None
        if value is None or status not in USABLE:
            return None
        return got if _OPS[self.op](value, self.number) else None  # type: ignore[arg-type]


@dataclass(frozen=True, slots=True)
class Term:
    """One term of a query."""

    kind: str
    """``text``, ``pattern``, ``verdict``, ``date``, ``is``, ``file`` or ``condition``."""
    value: str = ""
    """The word, phrase or filter value (lower case)."""
    negate: bool = False
    """True for a term written with a leading ``-``."""
    span: tuple[str, str] | None = None
    """For ``date``: ISO start (inclusive) and end (exclusive) dates; "" for an open end."""
    condition: Condition | None = None
    """For ``condition``: the test."""


@dataclass(frozen=True, slots=True)
class Match:
    """A case that satisfies a query, with the draw and values that satisfied its conditions."""

    entry: LibraryEntry
    """The case."""
    draw: str | None = None
    """Label of the draw where the conditions held (None for a query without conditions)."""
    values: tuple[tuple[str, float | None, str], ...] = ()
    """(field, value, status) of each condition in that draw."""


@dataclass(frozen=True)
class Query:
    """A parsed search."""

    text: str
    """The query as typed."""
    terms: tuple[Term, ...] = ()
    """Every term."""
    conditions: tuple[Condition, ...] = field(default=())
    """The conditions that must hold together in one draw (the non-negated ones)."""

    @property
    def needs_draws(self) -> bool:
        """True when matching needs the stored per-draw values."""
        return any(t.kind == "condition" for t in self.terms)

    def match(self, entry: LibraryEntry, draws: list[DrawValues] | None = None) -> Match | None:
        """A Match when ``entry`` satisfies every term, else None."""
        for t in self.terms:
            if t.kind != "condition" and _term_holds(t, entry) == t.negate:
                return None
        if not self.needs_draws:
            return Match(entry)
        if not entry.ok:
            return None
        draws = draws or []
        for t in self.terms:
            if t.negate and any(t.condition.test(d) for d in draws):  # type: ignore[union-attr]
                return None
        if not self.conditions:
            return Match(entry)
        for d in reversed(draws):  # the latest draw that satisfies everything
            got = [c.test(d) for c in self.conditions]
            if all(g is not None for g in got):
                values = tuple(
                    (c.field, g[0], g[1]) for c, g in zip(self.conditions, got, strict=True)
                )  # type: ignore[index]
                return Match(entry, d.label, values)
        return None


def _term_holds(t: Term, e: LibraryEntry) -> bool:
    if t.kind == "text":
        return t.value in e.text or t.value in e.name.lower()
    if t.kind == "file":
        return t.value in e.name.lower()
    if t.kind == "verdict":
        return e.verdict == t.value
    if t.kind == "pattern":
        if t.value == "none":
            return e.ok and e.leading_id is None
        squash = _squash(t.value)
        return e.leading_id is not None and (
            squash in _squash(e.leading_id) or squash in _squash(e.leading_name or "")
        )
    if t.kind == "date":
        start, end = t.span  # type: ignore[misc]
        return any((not start or d[:10] >= start) and (not end or d[:10] < end) for d in e.dates)
    if t.kind == "is":
        return {
            "pending": e.pending,
            "loading": e.has_loading,
            "expected": e.loading_expected,
            "broken": not e.ok,
            "ok": e.ok,
        }[t.value]
    raise AssertionError(t.kind)


def _squash(text: str) -> str:
    return re.sub(r"[\s_\-]+", "", text.lower())


def known_fields() -> dict[str, str]:
    """Every field name a condition may use → its canonical key."""
    from workup.analytes import CATALOGUE

    out = {k: k for k in INDEX_IDS}
    for panel, keys in CATALOGUE.items():
        for key in keys:
            out[f"{panel.value}.{key}"] = f"{panel.value}.{key}"
            if panel.value == "blood_gas":
                out[f"gas.{key}"] = f"blood_gas.{key}"
    out.update(SHORT_NAMES)
    return out


def _field(name: str, fields: dict[str, str]) -> str:
    if name in fields:
        return fields[name]
    near = difflib.get_close_matches(name, list(fields), n=3, cutoff=0.6)
    hint = f"; did you mean {', '.join(near)}?" if near else "; see docs/search.md for the names"
    raise SearchError(f"unknown index or analyte {name!r}{hint}")


def _next_start(y: int, m: int | None, d: int | None) -> str:
    if d is not None:
        return date.fromordinal(date(y, m or 1, d).toordinal() + 1).isoformat()
    if m is not None:
        return date(y + (m == 12), m % 12 + 1, 1).isoformat()
    return date(y + 1, 1, 1).isoformat()


def _day(text: str, end: bool) -> str:
    m = _DAY.match(text)
    if m is None:
        raise SearchError(f"cannot read date {text!r}; write 2026, 2026-11 or 2026-11-30")
    y, mo, d = int(m.group(1)), m.group(2), m.group(3)
    try:
        first = date(y, int(mo or 1), int(d or 1))
        return (
            _next_start(y, int(mo) if mo else None, int(d) if d else None)
            if end
            else first.isoformat()
        )
    except ValueError:
        raise SearchError(f"{text!r} is not a date") from None


def _span(value: str) -> tuple[str, str]:
    if ".." in value:
        a, _, b = value.partition("..")
        if not a and not b:
            raise SearchError("a date range needs at least one end, e.g. date:2026-11..")
        span = (_day(a, False) if a else "", _day(b, True) if b else "")
        if span[0] and span[1] and span[0] >= span[1]:
            raise SearchError(f"date range {value!r} ends before it starts")
        return span
    return _day(value, False), _day(value, True)


def _tokens(text: str) -> list[str]:
    # Join "uag > 0" into "uag>0" outside quotes, so spaces around an operator do not matter.
    parts = re.split(r'("[^"]*"?)', text)
    joined = "".join(p if p.startswith('"') else _SPACED_OP.sub(r"\1", p) for p in parts)
    return _TOKEN.findall(joined)


def parse(text: str) -> Query:
    """Read a query; raises SearchError with a message fit to show the user."""
    fields: dict[str, str] | None = None
    terms: list[Term] = []
    for raw in _tokens(text):
        negate = raw.startswith("-") and len(raw) > 1
        tok = raw[1:] if negate else raw
        if tok.startswith('"'):
            phrase = tok.strip('"').lower()
            if phrase:
                terms.append(Term("text", phrase, negate))
            continue
        low = tok.lower()
        cond = _COND.match(low)
        if cond:
            fields = fields or known_fields()
            c = Condition(
                _field(cond.group(1), fields), cond.group(2), float(cond.group(3)), written=tok
            )
            terms.append(Term("condition", low, negate, condition=c))
            continue
        if re.match(r"^[a-z][a-z0-9_.]*:.", low):
            key, _, value = low.partition(":")
            key = _FILTER_ALIASES.get(key, key)
            if key in FILTERS:
                terms.append(_filter(key, value, negate))
                continue
            fields = fields or known_fields()
            if key in fields or "." in key or value in STATUS_WORDS:
                if value not in STATUS_WORDS:
                    raise SearchError(
                        f"{tok!r}: after {key}: write a status ({', '.join(STATUS_WORDS)}) "
                        f"or compare with a number, e.g. {key}>0"
                    )
                c = Condition(_field(key, fields), statuses=STATUS_WORDS[value], written=tok)
                terms.append(Term("condition", low, negate, condition=c))
                continue
            raise SearchError(
                f"unknown filter {key + ':'!r}; filters are {', '.join(f + ':' for f in FILTERS)}"
            )
        if any(op in low for op in ("<", ">", "=")):
            raise SearchError(f"cannot read condition {tok!r}; write e.g. uag>0 or k<3.5")
        terms.append(Term("text", low, negate))
    conditions = tuple(t.condition for t in terms if t.kind == "condition" and not t.negate)
    return Query(text, tuple(terms), conditions)  # type: ignore[arg-type]


def _filter(key: str, value: str, negate: bool) -> Term:
    if key == "verdict":
        if value not in VERDICTS:
            raise SearchError(f"verdict:{value}: write one of {', '.join(VERDICTS)}")
        return Term("verdict", value, negate)
    if key == "is":
        if value not in IS_WORDS:
            raise SearchError(f"is:{value}: write one of {', '.join(IS_WORDS)}")
        return Term("is", value, negate)
    if key == "date":
        return Term("date", value, negate, span=_span(value))
    return Term(key, value, negate)


def search(
    entries: Iterable[LibraryEntry],
    query: Query | str,
    draws_of: Callable[[list[str]], dict[str, list[DrawValues]]] | None = None,
) -> list[Match]:
    """The entries that satisfy ``query``, in the given order.

    ``draws_of(names)`` supplies stored per-draw values; it is called once, only when the query
    has conditions (see :meth:`workup.library_index.LibraryIndex.draws`).
    """
    q = parse(query) if isinstance(query, str) else query
    entries = list(entries)
    if not q.needs_draws:
        return [m for e in entries if (m := q.match(e)) is not None]
    # Narrow by the cheap terms first, then fetch draws only for the survivors.
    cheap = Query(q.text, tuple(t for t in q.terms if t.kind != "condition"))
    survivors = [e for e in entries if e.ok and cheap.match(e) is not None]
    draws = draws_of([e.name for e in survivors]) if draws_of and survivors else {}
    return [m for e in survivors if (m := q.match(e, draws.get(e.name, []))) is not None]
