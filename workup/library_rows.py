"""The library's row model: a :class:`LibraryEntry` per case file and the index row behind it.

The summaries (workup.library_summary) are rows in ``ROW_FIELDS`` order, the index
(workup.library_index) stores and returns them, and :func:`entry_from_row` makes the entry.
Nothing here imports anything heavy: a warm listing only reads rows.
"""

from __future__ import annotations

import functools
import json
from collections.abc import Callable
from dataclasses import dataclass
from pathlib import Path
from typing import Any


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


_ENCODE = json.JSONEncoder(ensure_ascii=False).encode


def listing_json(entry: LibraryEntry) -> str:
    """The entry's ``workup list --json`` object as JSON text (the index keeps it per row, so a
    repeat listing writes it out without building the entry again)."""
    return _ENCODE(entry.to_json())


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
