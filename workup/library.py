"""The case library: one summary row per case file, kept fast by a rebuildable index.

The YAML files stay the source of truth. :func:`list_library` scans a folder, re-reads only the
files whose size or modification time changed since the index last saw them (see
:mod:`workup.library_index`), and returns one :class:`LibraryEntry` per file. A file that fails
to load becomes an entry with its error; it never stops the listing.

A cold build reads every file, so the per-file work is kept lean: one YAML pass (compose, then
construct from the same node tree) instead of the checking loader's three, falling back to
:func:`workup.caseio.load_case` whenever a file could hold an anchor, alias or tag, or fails in any
way, so that the verdict on a file and its error message are exactly the loader's. Large builds
are spread over a process pool.

This module imports nothing heavy at import time: an unchanged repeat listing must not pay for
pydantic or the calculators.
"""

from __future__ import annotations

import functools
import json
import math
import operator
import os
import sys
import threading
from array import array
from collections.abc import Callable, Iterable
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

CASE_SUFFIXES = (".yaml", ".yml")
"""File name endings the library lists."""

POOL_THRESHOLD = 150
"""Fewer files than this to (re)index are read in-process: a pool costs more than it saves."""

ANALYTE_STATUS_MEASURED = "measured"
"""Status of a measured value inside the usual clinical range."""
ANALYTE_STATUS_UNUSUAL = "unusual"
"""Status of a measured value outside the usual clinical range (accepted, with a caution)."""


@dataclass(frozen=True, slots=True)
class LibraryEntry:
    """One case file as the library lists it."""

    name: str
    """The file's path relative to the library folder, with forward slashes."""
    folder: Path
    """The library folder the entry was listed from."""
    size: int
    """File size in bytes when it was indexed."""
    mtime_ns: int
    """Modification time (ns) when it was indexed."""
    ok: bool
    """True when the file loaded as a case."""
    error: str | None = None
    """The loader's message for a file that did not load (or an assessment that failed)."""
    label: str = ""
    """The case's label ("" for a file that did not load)."""
    notes: str = ""
    """The case's free-text notes."""
    first_taken: str | None = None
    """ISO time of the earliest dated draw, if any draw is dated."""
    latest_taken: str | None = None
    """ISO time of the latest draw (None when the latest draw has no time)."""
    latest_draw: str | None = None
    """Label of the latest draw."""
    n_draws: int = 0
    """How many draws the case has."""
    leading_id: str | None = None
    """Id of the best-ranked cause of a normal-gap acidosis, if any was ranked."""
    leading_name: str | None = None
    """Its human name."""
    verdict: str | None = None
    """Its verdict (likely, possible, unlikely)."""
    pending: bool = False
    """True when the assessment still suggests a next test."""
    next_test: str | None = None
    """The most useful next test, in words."""
    loading_expected: bool = False
    """True when a suggested next test is a loading test not yet drawn."""
    has_loading: bool = False
    """True when some draw was taken during a loading test."""
    ranking_note: str | None = None
    """The ranking's first statement about the case as a whole (e.g. why nothing leads)."""
    text: str = ""
    """Lower-cased searchable text: label, notes, draw labels and draw notes (the error text for a
    file that did not load)."""
    dates: tuple[str, ...] = ()
    """ISO times of every dated draw, oldest first."""

    @property
    def path(self) -> Path:
        """The file's full path (made when asked: a listing of thousands needs few of them)."""
        return self.folder / self.name

    def to_json(self) -> dict[str, Any]:
        """The JSON object of ``workup list --json`` (documented in docs/search.md)."""
        return {
            "file": self.name,
            "ok": self.ok,
            "error": self.error,
            "label": self.label or None,
            "draws": self.n_draws,
            "latest_draw": self.latest_draw,
            "latest_taken": self.latest_taken,
            "leading": (
                {"id": self.leading_id, "name": self.leading_name, "verdict": self.verdict}
                if self.leading_id
                else None
            ),
            "ranking_note": self.ranking_note,
            "pending": self.pending,
            "next_test": self.next_test,
            "loading_expected": self.loading_expected,
        }


@dataclass(frozen=True, slots=True)
class DrawValues:
    """The numbers of one draw as the index stores them, for search conditions."""

    label: str
    """The draw's label."""
    taken: str | None
    """ISO time the draw was taken, if known."""
    during: str | None
    """The loading test under way, if any."""
    values: dict[str, tuple[float | None, str]] = field(default_factory=dict)
    """``panel.analyte`` and index id → (value, status). Analytes: measured/unusual; indices:
    the Finding's status (ok, caution, not_valid, needs_input)."""


# Column order shared with workup.library_index (the index stores rows as these tuples).
ROW_FIELDS = (
    "name",
    "size",
    "mtime_ns",
    "ok",
    "error",
    "label",
    "notes",
    "first_taken",
    "latest_taken",
    "latest_draw",
    "n_draws",
    "leading_id",
    "leading_name",
    "verdict",
    "pending",
    "next_test",
    "loading_expected",
    "has_loading",
    "ranking_note",
    "text",
    "dates",
    "draws",
    "numbers",
)


@functools.lru_cache(maxsize=1)
def _entry_builder() -> Callable[..., LibraryEntry]:
    from workup.frozen import builder

    return builder(LibraryEntry)


def entry_from_row(folder: Path, row: tuple[Any, ...]) -> LibraryEntry:
    """A LibraryEntry from an index row (ROW_FIELDS order, ``draws`` and ``numbers`` left out)."""
    (name, size, mtime, ok, error, label, notes, first, latest, latest_draw, n, lid, lname,
     verdict, pending, next_test, loading_exp, has_loading, note, text, dates) = row[:21]  # fmt: skip
    return _entry_builder()(
        name=name,
        folder=folder,
        size=size,
        mtime_ns=mtime,
        ok=bool(ok),
        error=error,
        label=label or "",
        notes=notes or "",
        first_taken=first,
        latest_taken=latest,
        latest_draw=latest_draw,
        n_draws=n or 0,
        leading_id=lid,
        leading_name=lname,
        verdict=verdict,
        pending=bool(pending),
        next_test=next_test,
        loading_expected=bool(loading_exp),
        has_loading=bool(has_loading),
        ranking_note=note,
        text=text or "",
        dates=tuple(dates.split()) if dates else (),
    )


# The ``draws`` column holds each draw's label, time, loading test and one status letter per
# stored value (JSON); the ``numbers`` column holds the values themselves as machine doubles,
# after the numbers of their names (see _value_names): writing a float as text costs more than
# the rest of a row, and a cold build writes tens of thousands.
STATUS_CODE = {
    ANALYTE_STATUS_MEASURED: "m",
    ANALYTE_STATUS_UNUSUAL: "u",
    "ok": "o",
    "caution": "c",
    "not_valid": "x",
    "needs_input": "n",
}
"""Stored status → its one-letter code in the index (every Finding status has one)."""
_STATUS_OF_CODE = {c: s for s, c in STATUS_CODE.items()}


@functools.lru_cache(maxsize=1)
def _value_names() -> tuple[tuple[str, ...], dict[str, int]]:
    """Every name a stored value can have (``panel.analyte``, then each index id) and its number.

    Fixed by the code (the catalogue and the calculators), which the index's engine stamp
    covers, so every process of a build numbers them alike.
    """
    from workup.indices import compute_all
    from workup.inputs import DrawInputs

    names = [name for _, analytes in _stored_analytes() for _, name, _, _ in analytes]
    names += [fid for fid in compute_all(DrawInputs()) if fid not in names]
    return tuple(names), {n: i for i, n in enumerate(names)}


class _Draw:
    """One draw's stored values while a row is built: numbers of names, values, status letters."""

    __slots__ = ("codes", "head", "keys", "nums", "other")

    def __init__(self, label: str, taken: str | None, during: str | None) -> None:
        self.head: dict[str, Any] = {"label": label, "taken": taken, "during": during}
        self.keys: list[int] = []
        self.nums: list[float] = []
        self.codes: list[str] = []
        self.other: dict[str, list[Any]] = {}

    def add(self, name: str, value: float | None, status: str) -> None:
        i = _value_names()[1].get(name)
        if i is None:  # not a name the code knows (cannot happen today): keep it as JSON
            self.other[name] = [value, status]
            return
        self.keys.append(i)
        self.nums.append(math.nan if value is None else value)
        self.codes.append(STATUS_CODE[status])


def _pack(draws: list[_Draw]) -> tuple[str, bytes]:
    """The ``draws`` and ``numbers`` columns (the one place that lays them out)."""
    heads = []
    keys, nums = array("H"), array("d")
    for d in draws:
        head = {**d.head, "s": "".join(d.codes)}
        if d.other:
            head["x"] = d.other
        heads.append(head)
        keys.fromlist(d.keys)
        nums.fromlist(d.nums)
    return _COMPACT_JSON.encode(heads), keys.tobytes() + nums.tobytes()


_COMPACT_JSON = json.JSONEncoder(separators=(",", ":"))


def encode_draws(draws: list[dict[str, Any]]) -> tuple[str, bytes]:
    """The ``draws`` and ``numbers`` columns for draws given as dicts with ``label``, ``taken``,
    ``during`` and ``v`` (name → (value, status)), in order."""
    packed = []
    for d in draws:
        pd = _Draw(d["label"], d["taken"], d["during"])
        for name, (value, status) in d["v"].items():
            pd.add(name, value, status)
        packed.append(pd)
    return _pack(packed)


def draws_from_json(text: str | None, numbers: bytes | None = None) -> list[DrawValues]:
    """Decode the ``draws`` and ``numbers`` columns of the index."""
    if not text:
        return []
    heads = json.loads(text)
    total = sum(len(h["s"]) for h in heads)
    keys, nums = array("H"), array("d")
    raw = numbers or b""
    keys.frombytes(raw[: 2 * total])
    nums.frombytes(raw[2 * total :])
    if len(keys) != total or len(nums) != total:
        raise ValueError("the stored numbers do not match the stored draws")
    names, _ = _value_names()
    out, at = [], 0
    for h in heads:
        values: dict[str, tuple[float | None, str]] = {}
        for code in h["s"]:
            v = nums[at]
            values[names[keys[at]]] = (None if math.isnan(v) else v, _STATUS_OF_CODE[code])
            at += 1
        for name, (v, status) in h.get("x", {}).items():
            values[name] = (v, status)
        out.append(DrawValues(h["label"], h.get("taken"), h.get("during"), values))
    return out


# --- reading one file (runs in pool workers) ------------------------------------------------


def _read_case(path: Path | str, size: int | None = None) -> Any:
    """Load the case at ``path`` by the cheapest reader that is provably equivalent.

    First :func:`workup.quickread.parse`, which reads the plain subset case files are written in
    (or declines), then one libyaml pass (compose, then construct from the same node tree). A
    file with ``&``, ``*`` or ``!`` anywhere could hold an anchor, alias or tag, which the
    checking loader must judge; so could anything unusual. Those, and every failure or doubt of
    the lean paths, go through :func:`workup.caseio.load_case`, which raises the canonical error.
    ``size`` is the size the folder scan saw, if known.
    """
    caseio, quickread = _readers()
    limit = caseio.MAX_FILE_BYTES
    raw = None
    if size is None or size <= limit:
        try:
            with open(path, "rb") as fh:
                raw = fh.read()  # sized from the open file; a file that grew is refused below
        except OSError:
            raw = None
    if raw is None or len(raw) > limit or any(c in raw for c in _SUSPECT):
        return caseio.load_case(Path(path))
    try:
        text = raw.decode("utf-8-sig")
    except UnicodeDecodeError:
        return caseio.load_case(Path(path))
    data = quickread.parse(text)
    if isinstance(data, dict):
        try:
            return caseio.case_from_data(data, str(path))
        except caseio.CaseFileError:
            # The message must carry line numbers, which only the checking loader's nodes know.
            return caseio.load_case(Path(path))
    try:
        loader = _lean_loader()(text)
        try:
            node = loader.get_single_node()
            data = _build(node, loader) if node is not None else None
        finally:
            loader.dispose()
    except Exception:  # _Slow, or anything odd: the checking loader decides and words the error
        return caseio.load_case(Path(path))
    if not isinstance(data, dict):
        return caseio.load_case(Path(path))
    return caseio.case_from_data(data, str(Path(path)), node)  # named as load_case names it


@functools.lru_cache(maxsize=1)
def _readers() -> tuple[Any, Any]:
    """The checking loader's module and the quick reader, imported on first use (an unchanged
    listing never needs them)."""
    from workup import caseio, quickread

    return caseio, quickread


_SUSPECT = (b"&", b"*", b"!", b"\x00")


class _Slow(Exception):
    """The lean reader met something only the checking loader may judge."""


@functools.lru_cache(maxsize=1)
def _lean_loader() -> Any:
    """CSafeLoader with a memo on tag resolution (a pure function of kind, text and style)."""
    import yaml

    base = getattr(yaml, "CSafeLoader", yaml.SafeLoader)
    memo: dict[tuple[Any, Any, Any], str] = {}

    class LeanLoader(base):  # type: ignore[misc, valid-type]
        def resolve(self, kind: Any, value: Any, implicit: Any) -> str:
            key = (kind, value, implicit)
            tag = memo.get(key)
            if tag is None:
                tag = super().resolve(kind, value, implicit)
                if len(memo) < 200_000:
                    memo[key] = tag
            return tag

    return LeanLoader


_T = "tag:yaml.org,2002:"
_STR, _INT, _FLOAT, _BOOL, _NULL, _TIME, _MAP, _SEQ = (
    _T + t for t in ("str", "int", "float", "bool", "null", "timestamp", "map", "seq")
)


def _build(node: Any, ctor: Any) -> Any:
    """Plain data from a node tree, as SafeConstructor builds it for the tags a case file uses.

    Raises _Slow for anything else (merge keys, sets, binary, non-string or repeated keys), so
    that the checking loader handles it.
    """
    kind = node.id
    tag = node.tag
    if kind == "scalar":
        if tag == _STR:
            return node.value
        if tag == _INT:
            return ctor.construct_yaml_int(node)
        if tag == _FLOAT:
            return ctor.construct_yaml_float(node)
        if tag == _NULL:
            return None
        if tag == _BOOL:
            return ctor.construct_yaml_bool(node)
        if tag == _TIME:
            return ctor.construct_yaml_timestamp(node)
        raise _Slow(tag)
    if kind == "mapping" and tag == _MAP:
        out: dict[str, Any] = {}
        for k, v in node.value:
            if k.id != "scalar" or k.tag != _STR or k.value in out:
                raise _Slow("key")
            out[k.value] = _build(v, ctor)
        return out
    if kind == "sequence" and tag == _SEQ:
        return [_build(v, ctor) for v in node.value]
    raise _Slow(tag)


def comparable_time(t: Any) -> Any:
    """``t`` as a naive datetime that sorts with naive ones (a time with an offset goes to UTC).

    Case files may mix local times with and without an offset; comparing those raises.
    """
    if t is None or t.tzinfo is None:
        return t
    from datetime import UTC

    return t.astimezone(UTC).replace(tzinfo=None)


@functools.lru_cache(maxsize=1)
def _stored_analytes() -> tuple[tuple[str, tuple[tuple[str, str, float, float], ...]], ...]:
    """For each panel attribute of a draw: (analyte key, stored name, usual low, usual high), in
    catalogue order (the order the index stores values in)."""
    from workup.analytes import CATALOGUE, Panel

    attr = {Panel.serum: "serum", Panel.blood_gas: "blood_gas", Panel.urine: "urine"}
    return tuple(
        (attr[p], tuple((k, f"{p.value}.{k}", *a.usual) for k, a in keys.items()))
        for p, keys in CATALOGUE.items()
    )


@functools.lru_cache(maxsize=1)
def _panel_specs() -> tuple[tuple[str, dict[str, tuple[int, float, float]]], ...]:
    """For each panel attribute of a draw: analyte key → (number of its stored name, usual low,
    usual high)."""
    number_of = _value_names()[1]
    return tuple(
        (attr, {k: (number_of[name], low, high) for k, name, low, high in analytes})
        for attr, analytes in _stored_analytes()
    )


# Words that name each loading test in a suggested test's id or text.
_LOADING_WORDS = {
    "bicarbonate_loading": ("bicarbonate_loading", "bicarbonate loading"),
    "furosemide_fludrocortisone": ("furosemide",),
    "ammonium_chloride": ("ammonium_chloride", "ammonium chloride", "nh4cl"),
}


@functools.lru_cache(maxsize=512)
def _loading_kind(text: str) -> str | None:
    """The loading test a suggested test's id and text name, if any (the texts are few and
    fixed, so the answer is kept)."""
    t = text.lower()
    for kind, words in _LOADING_WORDS.items():
        if any(w in t for w in words):
            return kind
    return None


def summarize_case(
    case: Any, assess_fn: Callable[..., Any], overrides: dict[str, float]
) -> dict[str, Any]:
    """The index fields of a loaded case (everything but file name, size, mtime and errors).

    ``assess_fn(case, overrides)`` returns the draw results and the ranking, as
    :func:`workup.assess.rank_case` does.
    """
    panels = _panel_specs()
    draws = case.draws
    timed = sorted((d.taken for d in draws if d.taken is not None), key=comparable_time)
    try:
        latest = case.latest_draw() if draws else None
    except TypeError:  # times with and without a UTC offset in one case cannot be compared
        latest = max(draws, key=lambda d: comparable_time(d.taken)) if timed else draws[-1]
    parts = [case.label, case.notes or ""]
    packed = []
    number_of = _value_names()[1]
    for d in draws:
        parts += [d.label, d.notes or ""]
        pd = _Draw(
            d.label,
            d.taken.isoformat(timespec="minutes") if d.taken else None,
            d.during.value if d.during else None,
        )
        keys, nums, codes = pd.keys, pd.nums, pd.codes
        for attr, specs in panels:
            # The panel's own fields in catalogue order; most are empty, and the gas sample
            # type is not a value.
            for key, m in getattr(d, attr).__dict__.items():
                spec = specs.get(key) if m is not None else None
                if spec is not None:
                    i, low, high = spec
                    c = m.canonical
                    keys.append(i)
                    nums.append(c)
                    codes.append("m" if low <= c <= high else "u")
        packed.append(pd)
    out: dict[str, Any] = {
        "label": case.label,
        "notes": case.notes or "",
        "first_taken": timed[0].isoformat(timespec="minutes") if timed else None,
        "latest_taken": (
            latest.taken.isoformat(timespec="minutes")
            if latest is not None and latest.taken
            else None
        ),
        "latest_draw": latest.label if latest is not None else None,
        "n_draws": len(draws),
        "has_loading": any(d.during is not None for d in draws),
        "text": " ".join(p for p in parts if p).lower(),
        "dates": " ".join(t.isoformat(timespec="minutes") for t in timed),
        "error": None,
        "leading_id": None,
        "leading_name": None,
        "verdict": None,
        "pending": False,
        "next_test": None,
        "loading_expected": False,
        "ranking_note": None,
    }
    try:
        results, ranking = assess_fn(case, overrides)
    except Exception as exc:  # others' calculators must never stop a listing
        out["error"] = f"the assessment failed: {type(exc).__name__}: {exc}"
    else:
        nan = math.nan
        for pd, result in zip(packed, results, strict=False):
            keys, nums, codes = pd.keys, pd.nums, pd.codes
            for fid, f in result.findings.items():
                i = number_of.get(fid)
                if i is None:
                    pd.add(fid, f.value, f.status.value)
                    continue
                v = f.value
                keys.append(i)
                nums.append(nan if v is None else v)
                codes.append(STATUS_CODE[f.status])  # a StrEnum member looks up as its value
        if ranking.calls:
            lead = ranking.calls[0]
            out.update(leading_id=lead.id, leading_name=lead.name, verdict=lead.verdict.value)
        if ranking.next_tests:
            first = ranking.next_tests[0]
            done = {d.during.value for d in draws if d.during is not None}
            kinds = [_loading_kind(f"{t.id} {t.text}") for t in ranking.next_tests]
            loading = [k for k in kinds if k is not None and k not in done]
            out.update(pending=True, next_test=first.text, loading_expected=bool(loading))
        if ranking.notes:
            out["ranking_note"] = ranking.notes[0]
    out["draws"], out["numbers"] = _pack(packed)
    return out


def _relative_error(exc: Exception, full: str, name: str) -> str:
    """The loader's message with the full path replaced by the library-relative name."""
    return str(exc).replace(full, name)


def summarize_file(
    folder: Path | str,
    name: str,
    size: int,
    mtime_ns: int,
    overrides: dict[str, float] | None = None,
    assess_fn: Callable[..., Any] | None = None,
) -> tuple[Any, ...]:
    """The index row (ROW_FIELDS order) of file ``name`` in ``folder``."""
    caseio, _ = _readers()
    if assess_fn is None:
        assess_fn = _rank_case()
    base: dict[str, Any] = {"name": name, "size": size, "mtime_ns": mtime_ns}
    try:
        case = _read_case(os.path.join(folder, name), size)
    except caseio.CaseFileError as exc:
        error = _relative_error(exc, str(Path(folder) / name), name)
        row = {**base, "ok": 0, "error": error, "n_draws": 0, "text": error.lower()}
    except Exception as exc:  # a loader bug must not stop the listing either
        error = f"{name}: cannot read: {type(exc).__name__}: {exc}"
        row = {**base, "ok": 0, "error": error, "n_draws": 0, "text": error.lower()}
    else:
        try:
            row = summarize_case(case, assess_fn, overrides or {})
        except Exception as exc:  # the file loaded; say what failed and keep listing
            error = f"{name}: cannot summarize the case: {type(exc).__name__}: {exc}"
            row = {**base, "ok": 1, "label": case.label, "error": error, "n_draws": len(case.draws),
                   "text": f"{case.label} {error}".lower()}  # fmt: skip
        else:
            row.update(base, ok=1)
            return _ROW_OF(row)  # every field is there
    return tuple(row.get(f) for f in ROW_FIELDS)


_ROW_OF = operator.itemgetter(*ROW_FIELDS)


@functools.lru_cache(maxsize=1)
def _rank_case() -> Callable[..., Any]:
    from workup.assess import rank_case

    return rank_case


def _summarize_chunk(
    folder: str, items: list[tuple[str, int, int]], overrides: dict[str, float]
) -> list[tuple[Any, ...]]:
    """Pool worker: rows for a chunk of (name, size, mtime_ns)."""
    return [summarize_file(folder, n, s, m, overrides) for n, s, m in items]


def pool_allowed() -> bool:
    """True when this process may start a process pool itself.

    Not from a process running other threads (the terminal app): forking it can deadlock a
    child, and spawning fails under the app's captured standard streams. Such a process builds
    a large index in a helper process instead (see workup.library_index).
    """
    return threading.active_count() == 1


def _guided_chunks(items: list[Any], workers: int, size: int = 100) -> list[list[Any]]:
    """``items`` in chunks of ``size`` that shrink towards the end, so that every process
    finishes within a few files of the others; even the smallest costs far more than its trip
    through the pool."""
    out, i, n = [], 0, len(items)
    while i < n:
        step = max(8, min(size, (n - i) // (4 * workers)))
        out.append(items[i : i + step])
        i += step
    return out


def summarize_many(
    folder: Path,
    items: list[tuple[str, int, int]],
    overrides: dict[str, float],
    workers: int | None = None,
) -> Iterable[list[tuple[Any, ...]]]:
    """Rows for ``items``, in chunks as they finish; with a process pool when there are many.

    ``workers`` counts this process: it reads its share of the chunks between storing the
    others' results, so a pool for two cores is one child. A third process would only compete
    with the two readers for the cores and hold memory of its own.
    """
    cpus = os.cpu_count() or 1
    workers = cpus if workers is None else workers
    if workers <= 1 or len(items) < POOL_THRESHOLD or not pool_allowed():
        # Chunks, so that an interrupted build keeps what it has done.
        for i in range(0, len(items), 400):
            yield _summarize_chunk(str(folder), items[i : i + 400], overrides)
        return
    import multiprocessing
    from collections import deque
    from concurrent.futures import ProcessPoolExecutor

    # fork shares the already-imported core for free (Linux); elsewhere spawn.
    method = "fork" if sys.platform.startswith("linux") else "spawn"
    # Warm the imports once before forking, so each child starts ready.
    if method == "fork":
        import workup.assess
        import workup.caseio  # noqa: F401
    chunks = deque(_guided_chunks(items, workers))
    children = workers - 1
    ctx = multiprocessing.get_context(method)
    with ProcessPoolExecutor(max_workers=children, mp_context=ctx) as pool:
        queued: deque[tuple[Any, list[tuple[str, int, int]]]] = deque()
        while chunks or queued:
            while queued and queued[0][0].done():
                yield queued.popleft()[0].result()
            # Keep every child several chunks ahead: it is fed only between this process's own
            # chunks, and a child left waiting is a core lost.
            while chunks and len(queued) < 4 * children:
                chunk = chunks.popleft()
                queued.append((pool.submit(_summarize_chunk, str(folder), chunk, overrides), chunk))
            if chunks:
                yield _summarize_chunk(str(folder), chunks.popleft(), overrides)
            elif queued:
                # Nothing left to take here: take back a queued chunk no child has started yet
                # rather than wait for it.
                fut, chunk = queued[-1]
                if fut.cancel():
                    queued.pop()
                    yield _summarize_chunk(str(folder), chunk, overrides)
                else:
                    yield queued.popleft()[0].result()


# --- listing ---------------------------------------------------------------------------------

SORT_KEYS = ("file", "label", "date", "pattern")
"""Orders the listing and the library screen offer."""

_VERDICT_RANK = {"likely": 0, "possible": 1, "unlikely": 2}


def sort_entries(
    entries: list[LibraryEntry], key: str = "file", reverse: bool = False
) -> list[LibraryEntry]:
    """``entries`` ordered by file name, label, latest draw time (newest first) or leading pattern.

    Undated cases and files that did not load go last whatever the direction.
    """
    if key == "file":
        out = sorted(entries, key=lambda e: e.name)
    elif key == "label":
        out = sorted(entries, key=lambda e: (e.label.lower(), e.name))
    elif key == "date":
        out = sorted(entries, key=lambda e: (e.latest_taken or "", e.name), reverse=True)
    elif key == "pattern":
        out = sorted(
            entries,
            key=lambda e: (
                e.leading_name is None,
                (e.leading_name or "").lower(),
                _VERDICT_RANK.get(e.verdict or "", 3),
                e.name,
            ),
        )
    else:
        raise ValueError(f"unknown sort key {key!r}; use one of {', '.join(SORT_KEYS)}")
    if reverse:
        out.reverse()
    last = {id(e) for e in out if not e.ok or (key == "date" and not e.latest_taken)}
    if not last:
        return out
    return [e for e in out if id(e) not in last] + [e for e in out if id(e) in last]


def leading_cells(e: LibraryEntry) -> tuple[str, str]:
    """(cause, verdict) for a listing row: a best-ranked cause that is unlikely is not named
    as the leading one (no normal-gap acidosis, or nothing fits)."""
    if e.leading_id is None:
        return "no cause ranked", "—"
    if e.verdict == "unlikely":
        return "none likely", "—"
    return e.leading_name or e.leading_id, e.verdict or "—"


def describe_leading(e: LibraryEntry) -> str:
    """The leading cause and its verdict in words, e.g. "distal RTA (likely)"."""
    if not e.ok:
        return "did not load"
    if e.leading_id is None:
        return "no cause ranked"
    return f"{e.leading_name or e.leading_id} ({e.verdict})"


def describe_pending(e: LibraryEntry) -> str:
    """Whether a test is still pending, in words."""
    if not e.ok:
        return ""
    if e.loading_expected:
        return "loading test"
    if e.pending:
        return "next test"
    return "none"


def status_word(status: str) -> str:
    """The word for a stored status: the Finding status words, or measured / unusual."""
    from workup.findings import STATUS_WORD, Status

    try:
        return STATUS_WORD[Status(status)]
    except ValueError:
        return status


def scan_folder(folder: Path) -> dict[str, tuple[int, int]]:
    """Every case file under ``folder`` (sub-folders too, hidden ones skipped): name → (size,
    mtime_ns)."""
    out: dict[str, tuple[int, int]] = {}
    stack = [("", str(folder))]
    while stack:
        prefix, where = stack.pop()
        try:
            it = os.scandir(where)
        except OSError:
            continue
        with it:
            for e in it:
                if e.name.startswith("."):
                    continue
                try:
                    if e.is_dir(follow_symlinks=False):  # a linked folder could loop
                        stack.append((prefix + e.name + "/", e.path))
                    elif e.name.endswith(CASE_SUFFIXES) and e.is_file():
                        st = e.stat()
                        out[prefix + e.name] = (st.st_size, st.st_mtime_ns)
                except OSError:
                    continue
    return out


def open_library(
    folder: Path,
    cache_file: Path | None = None,
    overrides: dict[str, float] | None = None,
    workers: int | None = None,
) -> Any:
    """The index of ``folder``, open and brought up to date (a LibraryIndex; close it after use).

    ``cache_file`` defaults to the per-user cache (see :func:`workup.library_index.cache_path`);
    ``overrides`` are the user's settings (the leading pattern depends on them).
    """
    import sqlite3

    from workup.library_index import LibraryIndex, cache_path, remove_index

    index = None
    for attempt in range(2):
        try:
            index = LibraryIndex.open(folder, cache_file, overrides or {})
            index.refresh(workers=workers)
            return index
        except sqlite3.DatabaseError:
            # Damaged while open (another process, a full disk): drop the cache and rebuild once.
            if index is not None:
                index.close()
            if attempt:
                raise
            remove_index(cache_file or cache_path(folder, overrides))
    raise AssertionError("unreachable")


def list_library(
    folder: Path,
    cache_file: Path | None = None,
    overrides: dict[str, float] | None = None,
    workers: int | None = None,
) -> list[LibraryEntry]:
    """Every case file under ``folder``, by name, re-reading only what changed since last time."""
    index = open_library(folder, cache_file, overrides, workers)
    try:
        return index.entries()
    finally:
        index.close()
