"""Under NO_COLOR the focused field, row or pane still shows: by reverse video or a glyph, not by
a tint alone (invented demo cases)."""

from __future__ import annotations

from pathlib import Path

import pytest

from tests.screens.support import SIZE, screen_strips
from tests.screens.support import make_app as _app


def _marks(app, widget) -> set[tuple[int, int, str, bool, bool]]:
    """(x, y, character, reverse, underline) of every cell of ``widget`` as a monochrome
    terminal gets it (bold alone is left out: status words and headings are bold anyway)."""
    region = widget.region
    cells = set()
    for y, strip in enumerate(screen_strips(app)):
        if not region.y <= y < region.bottom:
            continue
        x = 0
        for seg in strip:
            for ch in seg.text:
                if region.x <= x < region.right:
                    style = seg.style
                    cells.add(
                        (x, y, ch, bool(style and style.reverse), bool(style and style.underline))
                    )
                x += 1
    return cells


CASE_TARGETS = {
    "findings table": ([], "#indices"),
    "causes": (["f5"], "#causes"),
    "tab bar": (["f6"], "ContentTabs"),
    "context flags": (["f3"], "#case-context"),
    "note": (["f7"], "#note-text"),
}


@pytest.mark.parametrize("what", list(CASE_TARGETS))
async def test_focus_shows_without_colour(demo: Path, monkeypatch, what: str) -> None:
    monkeypatch.setenv("NO_COLOR", "1")
    keys, selector = CASE_TARGETS[what]
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        assert app.no_color
        await pilot.pause()
        await pilot.press(*keys)
        await pilot.pause()
        widget = app.screen.query_one(selector)
        widget.focus()
        await pilot.pause()
        focused = _marks(app, widget)
        app.screen.set_focus(None)
        await pilot.pause()
        assert _marks(app, widget) != focused, f"{what}: focus shows only in colour"


@pytest.mark.parametrize("selector", ["#cases", "#lib-search"])
async def test_library_focus_shows_without_colour(
    tmp_path: Path, monkeypatch, demo: Path, selector: str
) -> None:
    monkeypatch.setenv("NO_COLOR", "1")
    app = _app(demo.parent)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        widget = app.screen.query_one(selector)
        widget.focus()
        await pilot.pause()
        focused = _marks(app, widget)
        app.screen.set_focus(None)
        await pilot.pause()
        assert _marks(app, widget) != focused
