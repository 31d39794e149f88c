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


def field(screen: CaseScreen, fid: str) -> ValueField:
    """The entry row of ``fid`` (e.g. ``serum-sodium``)."""
    return screen.query_one(f"#row-{fid}", ValueField)


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
