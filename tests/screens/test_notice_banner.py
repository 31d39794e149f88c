"""Warnings on opening a case sit on a one-line banner with their fix, never over the findings."""

from __future__ import annotations

import os
from pathlib import Path

from textual.widgets import Static

from screens.case_screen import CaseScreen
from tests.screens.support import SIZE
from tests.screens.support import make_app as _app


async def test_open_folder_warning_is_a_banner_with_its_fix_not_a_toast(demo: Path) -> None:
    os.chmod(demo.parent, 0o755)  # others can list and read the case folder
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        line = screen.query_one("#notice-line", Static)
        text = str(line.render())
        assert line.display and "others can read this case" in text
        assert f"chmod 700 {demo.parent}" in text and "F1" in text
        assert line.region.height <= 2  # a line, not a box over the table
        assert not any("not private" in (n.title or "") for n in app._notifications)
        # F1 keeps the full text.
        from screens.case.keys import help_context

        assert "Privacy: other users of this machine can reach this case" in help_context(screen)[3]


async def test_private_folder_shows_no_banner(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        line = app.screen.query_one("#notice-line", Static)
        assert not line.display
