"""The case form takes a patient's height, which a child's bedside Schwartz eGFR needs."""

from __future__ import annotations

import os
import shutil
from pathlib import Path

from textual.widgets import Input

from tests.screens.support import SIZE, forms
from tests.screens.support import make_app as _app


async def test_height_is_entered_and_refused_in_the_case_form(tmp_path: Path, cases_dir: Path):
    folder = tmp_path / "cases"
    folder.mkdir(mode=0o700)
    os.chmod(folder, 0o700)
    target = folder / "child.yaml"
    shutil.copy(cases_dir / "child-drta.yaml", target)  # an invented demo case
    os.chmod(target, 0o600)
    app = _app(folder, target)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = await forms(app.screen)  # the case form is built on its first visit
        box = screen.query_one("#case-height", Input)
        assert box.value == "110"
        box.value = "1.2"  # metres, not centimetres
        await pilot.pause()
        assert screen.case.patient.height == 110
        assert "x refused" in str(screen.query_one("#st-height").render())
        box.value = "118 cm"
        await pilot.pause()
        assert screen.case.patient.height == 118
        assert screen.dirty
