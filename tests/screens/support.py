"""Helpers shared by the Pilot flow tests: one app factory with a fixed clock, field lookup."""

from __future__ import annotations

from datetime import datetime
from pathlib import Path

from screens.app import build_app
from screens.case_screen import CaseScreen
from screens.entry import ValueField

CLOCK = datetime(2026, 12, 1, 8, 0)
SIZE = (80, 24)


def make_app(cases: Path, file: Path | None = None):
    """The app as the command line builds it, with a fixed clock."""
    return build_app(cases, file, clock=lambda: CLOCK)


async def field(screen: CaseScreen, fid: str) -> ValueField:
    """The entry row of ``fid`` (e.g. ``serum-sodium``), the draw form built first.

    The form is built on its first visit (F2, or a key that needs it); a test that sets a
    field without opening the tab builds it as that visit would."""
    await screen.draw_pane.build()
    return screen.query_one(f"#row-{fid}", ValueField)


async def forms(screen: CaseScreen) -> CaseScreen:
    """``screen`` with both its forms built (as after a visit to F2 and F3)."""
    await screen.build_all()
    return screen


def screen_strips(app) -> list:
    """The app's current screen as drawn, one Strip per terminal row, after the app's own
    filters (so under NO_COLOR the styles are what a monochrome terminal gets)."""
    from textual.color import Color

    strips = []
    for strip in app.screen._compositor.render_strips():
        for f in app._filters:
            strip = strip.apply_filter(f, Color(0, 0, 0))
        strips.append(strip)
    return strips


def screen_rows(app) -> list[str]:
    """The text of every terminal row of the app's current screen."""
    return [strip.text for strip in screen_strips(app)]
