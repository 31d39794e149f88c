"""Headless look at a Textual program before it is timed: widget count, focus, where a digit lands.

Run in its own process (``python -m bench.probe app CASES FILE``, ``... library CASES``,
``... baseline ROWS`` or ``... minimal``); prints one JSON object. The pty benchmark uses it to size the bare baseline to the
app's widget count and to check that the digit it types really reaches an input field, so that the
keystroke figure is what it claims to be.
"""

from __future__ import annotations

import argparse
import asyncio
import json
import sys
from pathlib import Path
from typing import Any

from textual.app import App
from textual.widgets import Input


async def probe(app: App[Any], keys: list[str], digit: str = "7") -> dict[str, Any]:
    """Mount ``app`` at 80x24, press ``keys`` then ``digit``; report widgets and focus."""
    async with app.run_test(size=(80, 24)) as pilot:
        await pilot.pause()
        await app.workers.wait_for_complete()
        await pilot.pause()
        widgets = len(list(app.screen.walk_children(with_self=False)))
        first_focus = type(app.focused).__name__ if app.focused else None
        for key in keys:
            await pilot.press(key)
        await app.workers.wait_for_complete()
        await pilot.pause()
        before = {id(w): w.value for w in app.screen.query(Input)}
        focus = app.focused
        await pilot.press(digit)
        await pilot.pause()
        changed = [
            f"{w.id or type(w).__name__}: {before[id(w)]!r} -> {w.value!r}"
            for w in app.screen.query(Input)
            if before.get(id(w)) is not None and w.value != before[id(w)]
        ]
        return {
            "screen": type(app.screen).__name__,
            "widgets": widgets,
            "first_focus": first_focus,
            "focus_before_digit": type(focus).__name__ if focus else None,
            "focus_is_input": isinstance(focus, Input),
            "digit_changed": changed,
        }


def main(argv: list[str] | None = None) -> int:
    """Probe the app or the bare baseline and print the result as JSON."""
    p = argparse.ArgumentParser(description=__doc__)
    sub = p.add_subparsers(dest="which", required=True)
    a = sub.add_parser("app")
    a.add_argument("cases", type=Path)
    a.add_argument("file", type=Path)
    a.add_argument("--keys", default="", help="comma-separated keys pressed before the digit")
    b = sub.add_parser("baseline")
    b.add_argument("rows", type=int)
    lib = sub.add_parser("library")
    lib.add_argument("cases", type=Path)
    sub.add_parser("minimal")
    args = p.parse_args(argv)
    if args.which == "app":
        from screens.app import build_app

        app = build_app(args.cases, args.file)
        keys = [k for k in args.keys.split(",") if k]
    elif args.which == "library":
        from screens.app import build_app

        app, keys = build_app(args.cases), []
    elif args.which == "minimal":
        from bench.baselines.minimal_app import MinimalApp

        app, keys = MinimalApp(), []
    else:
        from bench.baselines.bare_form import BareForm

        app, keys = BareForm(args.rows), []
    result = asyncio.run(probe(app, keys))
    json.dump(result, sys.stdout)
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
