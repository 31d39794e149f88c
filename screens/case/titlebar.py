"""The case screen's one-line title: save state, draw, file and case label."""

from __future__ import annotations

from pathlib import Path


def title_text(
    *,
    dirty: bool,
    read_only: bool,
    label: str,
    draw_number: int,
    draw_count: int,
    draw_label: str,
    path: Path | None,
) -> str:
    """The title line's text for the case screen."""
    where = path.name if path else "not saved yet"
    mark = "* UNSAVED" if dirty else "saved"
    if read_only:
        mark = "READ-ONLY (open elsewhere)"
    return f"{mark} | {label} | draw {draw_number}/{draw_count}: {draw_label} | {where}"
