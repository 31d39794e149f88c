"""At 80 x 24 a scrollbar never touches text: a blank column always parts them, so its marks do
not read as part of a word (invented demo cases)."""

from __future__ import annotations

import os
import shutil
from pathlib import Path

import pytest

from tests.screens.support import SIZE, screen_rows
from tests.screens.support import make_app as _app

ROOT = Path(__file__).resolve().parents[2]


def _touching(app) -> list[str]:
    """Rows where text runs up to a visible vertical scrollbar, as "widget: text" lines."""
    rows = screen_rows(app)
    out = []
    for w, (_, clip) in app.screen._compositor.visible_widgets.items():
        if not getattr(w, "show_vertical_scrollbar", False):
            continue
        bar = w.vertical_scrollbar.region.intersection(clip)
        for y in range(bar.y, bar.bottom):
            if bar.x > 0 and rows[y][bar.x - 1] != " ":
                out.append(f"{w}: {rows[y][max(bar.x - 20, 0) : bar.right]!r}")
    return out


@pytest.mark.parametrize("name", ["distal-rta-classic.yaml", "gi-loss-diarrhea.yaml"])
@pytest.mark.parametrize("keys", [[], ["f2"], ["f3"], ["f5"], ["f1"]], ids=str)
async def test_no_scrollbar_touches_text(tmp_path: Path, name: str, keys: list[str]) -> None:
    folder = tmp_path / "cases"
    folder.mkdir(mode=0o700)
    os.chmod(folder, 0o700)
    shutil.copy(ROOT / "cases" / name, folder / name)
    os.chmod(folder / name, 0o600)
    app = _app(folder, folder / name)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        await pilot.press(*keys)
        await pilot.pause()
        assert _touching(app) == []
