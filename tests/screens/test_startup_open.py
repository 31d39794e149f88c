"""Opening a case quickly (issue 13): the first screen waits for nothing it does not show.

A case opened on its findings assesses the case once (the assessment that chose the opening draw
is the one shown), and its two forms are built only on their first visit: a key that asks for a
form builds it first, so nothing typed is lost. The numbers shown are those of
``workup.assess.assess`` either way. Demo cases are invented scenarios (see cases/).
"""

from __future__ import annotations

from pathlib import Path

import pytest

import screens.case_screen as case_screen_module
import workup.assess as assess_module
from screens.case_screen import CaseScreen
from tests.screens.support import CLOCK, SIZE
from tests.screens.support import make_app as _app
from workup.assess import assess
from workup.caseio import load_case
from workup.draw_focus import opening


def _demo_cases(cases_dir: Path) -> list[Path]:
    return sorted(cases_dir.glob("*.yaml"))


def test_opening_assessment_is_the_one_assess_gives_for_that_draw(cases_dir: Path) -> None:
    # Centring the first assessment on the opening draw must not change one number or word:
    # the per-draw results and the ranking read the whole case, not the centre.
    several = 0
    for path in _demo_cases(cases_dir):
        case = load_case(path)
        index, a = opening(case)
        expected = assess(case, case.draws[index].label)
        assert a.to_json() == expected.to_json(), path.name
        assert a.draws == expected.draws and a.settings == expected.settings
        several += len(case.draws) > 1 and case.draws[index] is not case.draws[-1]
    assert several  # at least one demo opens on a draw other than the latest


async def test_a_case_is_assessed_once_when_it_opens(
    demo: Path, monkeypatch: pytest.MonkeyPatch
) -> None:
    calls: list[str | None] = []
    real = assess_module.assess

    def counting(case, draw_label=None, user_overrides=None):
        calls.append(draw_label)
        return real(case, draw_label, user_overrides)

    monkeypatch.setattr(assess_module, "assess", counting)
    monkeypatch.setattr(case_screen_module, "assess", counting)
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        assert len(calls) == 1
        # What is shown is the baseline draw's assessment, as assess gives it.
        assert screen.assessment is not None and screen.assessment.draw_label == "baseline"
        shown = screen.assessment.to_json()
        assert shown == real(screen.case, "baseline", screen.overrides).to_json()


async def test_the_forms_not_shown_first_are_built_only_on_their_first_visit(
    demo: Path, monkeypatch: pytest.MonkeyPatch
) -> None:
    seen: dict[str, object] = {}
    real_mount = CaseScreen.on_mount

    def on_mount(self: CaseScreen) -> None:
        # What the screen holds when it is mounted, before its first paint.
        seen["widgets"] = len(list(self.walk_children(with_self=False)))
        real_mount(self)

    monkeypatch.setattr(CaseScreen, "on_mount", on_mount)
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        # Settled on its findings: neither form was built, before or after the first paint.
        assert not screen.draw_pane.built and not screen.case_pane.built
        assert len(screen.query("#in-serum-sodium")) == 0
        settled = len(list(screen.walk_children(with_self=False)))
        assert settled < 100  # the forms hold most of a full screen's ~300 widgets
        await pilot.press("f2")  # the first visit builds the draw form, holding the shown draw
        await pilot.pause()
        assert screen.draw_pane.built and not screen.case_pane.built
        assert screen.query_one("#in-serum-sodium").value == "139"  # baseline sodium, demo file
        assert len(list(screen.walk_children(with_self=False))) > 150 + seen["widgets"]


async def test_a_key_for_a_form_not_built_yet_builds_it_and_lands_in_it(demo: Path) -> None:
    # F2 and F3 build their form on the spot; the keys typed straight after land in it.
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        assert not screen.draw_pane.built and not screen.case_pane.built
        await pilot.press("f2", "end", "backspace", "backspace", "backspace", *"141")  # was 139
        await pilot.pause()
        assert screen.draw_pane.built and not screen.case_pane.built
        assert app.focused is not None and app.focused.id == "in-serum-sodium"
        assert screen.draw.serum.sodium is not None and screen.draw.serum.sodium.value == 141
        assert screen.dirty
        await pilot.press("f3", *"54")
        await pilot.pause()
        assert screen.case_pane.built and screen.case.patient.age == 54


async def test_a_form_chosen_on_the_tab_bar_is_built_and_tab_enters_it(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        # Up to the tab bar, two tabs left to the draw form, Tab into it: no pause between.
        await pilot.press("shift+tab", "left", "left", "tab")
        await pilot.pause()
        assert screen.query_one("#tabs").active == "tab-draw" and screen.draw_pane.built
        assert app.focused is not None and app.focused.id == "in-serum-sodium"
        assert screen.case_pane.built  # passed over on the tab bar: shown a moment, so built


async def test_a_new_case_opens_on_its_draw_form_built_at_once(tmp_path: Path) -> None:
    app = _app(tmp_path)
    async with app.run_test(size=SIZE) as pilot:
        app.new_case()
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        assert screen.draw_pane.built and screen.draw.taken == CLOCK
        assert app.focused is not None and app.focused.id == "in-serum-sodium"
