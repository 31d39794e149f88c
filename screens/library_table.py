"""The library's table of cases: its two column sets and the cells of one case's row.

Pure functions of a LibraryEntry (workup.library); LibraryScreen (screens/library.py) picks the
column set for the terminal's width and fills its DataTable with these rows.
"""

from __future__ import annotations

from textual.widgets import DataTable

from workup.library import LibraryEntry, describe_pending, leading_cells

COLUMNS = (
    ("File", 22), ("Case", 26), ("Latest draw", 16), ("Leading cause", 22), ("Verdict", 8),
    ("Pending", 12),
)  # fmt: skip
NARROW_COLUMNS = (("File", 16), ("Case", 19), ("Latest", 10), ("Leading cause", 15), ("Verdict", 8))
"""Below WIDE_AT columns the pending column goes (the preview says it) and cells shorten; at
WIDE_AT the six columns fit without scrolling sideways."""
WIDE_AT = 110


def cut(text: str, width: int) -> str:
    """``text`` shortened to ``width`` characters, with an ellipsis when it was longer."""
    return text if len(text) <= width else text[: width - 1] + "…"


def add_columns(table: DataTable, narrow: bool) -> None:
    """Give ``table`` the narrow (80 columns) or the wide column set."""
    # Fixed widths (the cells are cut to them): an auto-sized column keeps the widest content it
    # ever held, so the layout depended on what was shown before.
    for label, width in NARROW_COLUMNS if narrow else COLUMNS:
        table.add_column(label, width=width)


def row_cells(e: LibraryEntry, narrow: bool = False) -> tuple[str, ...]:
    """The table cells of one case (narrow: five short cells that fit 80 columns)."""
    if not e.ok:
        first = (e.error or "").splitlines()[0].removeprefix(e.name).lstrip(":0123456789 ")
        if narrow:
            return (cut(e.name, 16), cut(first, 19), "", "DID NOT LOAD", "")
        return (cut(e.name, 22), cut(first, 26), "", "DID NOT LOAD", "", "")
    cause, verdict = leading_cells(e)
    if narrow:
        when = (e.latest_taken or "undated")[:10]
        return (cut(e.name, 16), cut(e.label, 19), when, cut(cause, 15), verdict)
    when = (e.latest_taken or "undated").replace("T", " ")
    return (
        cut(e.name, 22),
        cut(e.label, 26),
        when,
        cut(cause, 22),
        verdict,
        describe_pending(e),
    )
