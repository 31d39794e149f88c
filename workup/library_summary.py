"""Summarizing one case file into its library index row (ROW_FIELDS order).

Reads the file (workup.library_read), packs its draw values (workup.library_draws) and asks the
ranking for the leading cause and the next test; a file that fails becomes a row with its error.
The pool (workup.library_pool) calls :func:`summarize_file` for many files at once.
"""

from __future__ import annotations

import functools
import math
import operator
import os
from collections.abc import Callable
from pathlib import Path
from typing import Any

from workup.library_draws import STATUS_CODE, _Draw, _pack, _stored_analytes, _value_names
from workup.library_read import _read_case, _readers
from workup.library_rows import ROW_FIELDS
from workup.timeorder import comparable_time


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
