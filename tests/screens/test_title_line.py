"""The case title line at 80 columns: fields dropped or shortened whole, never cut mid-word.

The demo case is an invented scenario.
"""

from __future__ import annotations

from pathlib import Path

from screens.case.titlebar import Field, fit_fields, title_text
from tests.screens.support import SIZE, screen_rows
from tests.screens.support import make_app as _app


async def test_title_line_at_80_columns_has_whole_fields(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        title = screen_rows(app)[0].strip()
        full = str(app.screen.query_one("#titlebar").render())
        assert not title.endswith("|"), title
        # Every field shown is a field of the whole line, shown whole.
        fields = full.split(" | ")
        for part in title.split(" | "):
            assert part in fields, (part, fields)
        # What went is the file name (lowest priority); save state, label and draw stay.
        assert title == " | ".join(fields[:3])


def test_fields_go_lowest_priority_first_and_shrink_by_whole_words() -> None:
    fields = [
        Field(("saved",), 4),
        Field(("a long case label here", "a long case…", "a…"), 2),
        Field(("draw 1/2: baseline", "draw 1/2"), 3),
        Field(("file.yaml",), 1),
    ]
    assert (
        fit_fields(fields, 80) == "saved | a long case label here | draw 1/2: baseline | file.yaml"
    )
    # The file name goes first, whole; then the label shrinks by whole words, then goes; then
    # the draw loses its label; the save state stays.
    assert fit_fields(fields, 51) == "saved | a long case label here | draw 1/2: baseline"
    assert fit_fields(fields, 41) == "saved | a long case… | draw 1/2: baseline"
    assert fit_fields(fields, 40) == "saved | a… | draw 1/2: baseline"
    assert fit_fields(fields, 30) == "saved | draw 1/2: baseline"
    assert fit_fields(fields, 25) == "saved | draw 1/2"
    assert fit_fields(fields, 15) == "saved"


def test_read_only_title_keeps_its_mark_when_narrow() -> None:
    line = title_text(
        dirty=False,
        read_only=True,
        label="Demo label",
        draw_number=1,
        draw_count=1,
        draw_label="admission",
        path=Path("case.yaml"),
    )
    assert "READ-ONLY (open elsewhere)" in str(line)
    assert fit_fields(line.fields, 12) == "READ-ONLY"
