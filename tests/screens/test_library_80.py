"""The library at 80 x 24: every key of its footer shows whole, Help included (invented demo
cases)."""

from __future__ import annotations

from pathlib import Path

from tests.screens.support import SIZE, screen_rows
from tests.screens.support import make_app as _app


async def test_library_footer_shows_every_key_at_80_columns(demo: Path) -> None:
    app = _app(demo.parent)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        footer = screen_rows(app)[-1]
        for key, what in [
            ("⏎", "Open"),
            ("/", "Search"),
            ("n", "New case"),
            ("s", "Sort"),
            ("t", "Trends"),
            ("f5", "Reload"),
            ("^q", "Quit"),
            ("f1", "Help"),
            ("^p", "palette"),
        ]:
            assert f"{key} {what}" in footer, (key, what, footer)
