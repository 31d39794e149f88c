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
