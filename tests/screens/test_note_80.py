"""The note screen (F7) at 80 x 24: its title and footer whole, no scrollbar over the note
(invented demo case)."""

from __future__ import annotations

from pathlib import Path

from screens.note_screen import NoteScreen
from tests.screens.support import SIZE, screen_rows
from tests.screens.support import make_app as _app


async def test_note_title_and_footer_are_whole_at_80_columns(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        await pilot.press("f7")
        await pilot.pause()
        assert isinstance(app.screen, NoteScreen)
        rows = screen_rows(app)
        label = app.screen.case.label
        title = rows[0].strip()
        # The label whole; the remark on where edits go in its short wording, not cut.
        assert title == f"Note: {label} (edits stay here)", title
        footer = rows[-1]
        for key, what in [
            ("f2", "Copy"),
            ("f3", "Write file"),
            ("f4", "Redraft"),
            ("esc", "Back"),
            ("^q", "Quit"),
            ("f1", "Help"),
        ]:
            assert f"{key} {what} " in footer, (key, what, footer)
        # The note is wrapped at 80 already: no scrollbar drawn over its last lines.
        body = rows[1:-1]
        assert not any(ch in line for line in body for ch in "▏▕▁▂▃▄▅▆▇█"), body
