"""The case screen opens on the draw that shows the acidosis and says which draw it shows."""

from __future__ import annotations

from pathlib import Path

from textual.widgets import Static

from screens.case_screen import CaseScreen
from screens.note_screen import draft
from tests.screens.support import SIZE
from tests.screens.support import make_app as _app
from workup.note import draft_note


async def test_opens_on_the_baseline_draw_and_names_the_loading_draw(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        # The demo's latest draw is a bicarbonate-loading draw; the baseline shows the acidosis.
        assert screen.draw.label == "baseline"
        assert screen.assessment is not None and screen.assessment.draw_label == "baseline"
        header = str(screen.query_one("#findings-draw", Static).render())
        # Fitted to 80 columns (tests/screens/test_fit_80.py): shown draw, why, the other's role.
        assert "draw 'baseline' (the acidosis)" in header
        assert "'bicarbonate 3 h': loading test" in " ".join(header.split())
        # The note screen drafts the brief style of the draw on screen.
        note = draft(screen.assessment, screen.case)
        assert note == draft_note(screen.assessment, screen.case, "brief", "text")
