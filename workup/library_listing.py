"""Ordering and wording of library entries for a listing (the CLI's rows and the library screen).

Works on :class:`workup.library_rows.LibraryEntry` only; nothing here reads files or the index.
"""

from __future__ import annotations

from workup.library_rows import LibraryEntry

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
