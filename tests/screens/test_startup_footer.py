"""What a focus move repaints (issue 13: the case screen settles sooner, Tab costs fewer bytes).

Textual rebuilds its footer and repaints the whole screen at every focus move: over 600 and
over 4,000 bytes on an SSH line for one Tab, and at start-up the case screen settled only after
several of them. Now the footer is rebuilt only when the keys it shows change, and only the
widgets whose look depends on the focus are repainted. Run at 80 x 24 on the invented distal
RTA demo case.
"""

from __future__ import annotations

from pathlib import Path

import pytest
from textual.widgets._footer import FooterKey

from screens.case_screen import CaseScreen
from tests.screens.support import SIZE
from tests.screens.support import make_app as _app


def _footer_keys(screen) -> list[FooterKey]:
    return list(screen.query(FooterKey))


async def test_tab_between_fields_keeps_the_footer_as_it_is(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        await pilot.press("f2")
        await pilot.pause()
        before = _footer_keys(screen)
        assert [k.description for k in before][:3] == ["Save", "New draw", "Note"]
        await pilot.press("tab", "tab", "shift+tab")
        await pilot.pause()
        assert app.focused is not None and app.focused.id == "in-serum-potassium"
        after = _footer_keys(screen)
        assert after == before and all(a is b for a, b in zip(after, before, strict=True))
        # When the keys do change, the footer follows.
        app.update_keymap({"save": "f10"})
        await pilot.pause()
        save = next(k for k in _footer_keys(screen) if k.description == "Save")
        assert save.key == "f10"


async def test_tab_between_fields_does_not_repaint_the_whole_screen(
    demo: Path, monkeypatch: pytest.MonkeyPatch
) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        await pilot.press("f2")
        await pilot.pause()
        whole: list[bool] = []
        real = screen.refresh

        def refresh(*regions, **kwargs):
            whole.append(not regions)
            return real(*regions, **kwargs)

        monkeypatch.setattr(screen, "refresh", refresh)
        await pilot.press("tab")
        await pilot.pause()
        assert app.focused is not None and app.focused.id == "in-serum-potassium"
        assert not any(whole)
        # The two fields themselves show the move (the focused one is highlighted).
        assert app.focused.has_focus and not screen.query_one("#in-serum-sodium").has_focus
