"""The footer is rebuilt only when the keys it shows change (issue 13: a screen settles sooner).

Textual rebuilds its footer at every focus move; each rebuild repaints the bottom line, over 600
bytes on an SSH line, and at start-up the case screen settled only after two or three of them.
Run at 80 x 24 on the invented distal RTA demo case.
"""

from __future__ import annotations

from pathlib import Path

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
