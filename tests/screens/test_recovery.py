"""The app side of never losing a case: drafts offered on start, journal timing, save conflicts,
read-only opening of a case held elsewhere, stale locks, privacy notes and backups.

Pilot tests at 80 × 24 on a private copy of an invented demo case (cases/distal-rta-classic.yaml,
Demo B); the draft folder is the per-test XDG_STATE_HOME of tests/conftest.py. Time is never
waited for: the journal timer's callback is called directly.
"""

from __future__ import annotations

import json
import os
from pathlib import Path

import pytest
from textual.widgets import Input, OptionList

from screens.case_screen import JOURNAL_SECONDS, CaseScreen
from screens.dialogs import AskScreen, ChoiceScreen, ConflictScreen
from screens.recovery import BackupsScreen, RecoveryScreen
from tests.screens.support import SIZE, forms
from tests.screens.support import field as _field
from tests.screens.support import make_app as _app
from workup.caseio import load_case
from workup.journal import draft_path, drafts_folder, list_drafts, pending_drafts, read_draft
from workup.locking import CaseLock, current_holder, lock_path
from workup.storage import list_backups


def _messages(app) -> list[str]:
    return [f"{n.title or ''}: {n.message}" for n in app._notifications]


async def _leave_a_draft(demo: Path, sodium: str = "150") -> None:
    """Edit the case in an app that then shuts down without the fellow saving or discarding."""
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        (await _field(screen, "serum-sodium")).input.value = sodium
        await pilot.pause()
        assert screen.journal_now()


# The case opens on the draw that shows the acidosis (workup.draw_focus): the demo's baseline,
# draws[0], where the edits below go; its sodium in the file is 139.

# --------------------------------------------------------------------- drafts offered on start


async def test_unclean_shutdown_keeps_the_draft_and_releases_the_lock(demo: Path) -> None:
    await _leave_a_draft(demo)
    assert current_holder(demo) is None and not lock_path(demo).exists()
    [d] = pending_drafts()
    assert d.case_path == demo.resolve()
    assert d.case is not None and d.case.draws[0].serum.sodium.canonical == 150
    assert load_case(demo).draws[0].serum.sodium.canonical == 139  # the file is untouched


async def test_restore_offer_on_the_library_opens_the_edits_unsaved(demo: Path) -> None:
    await _leave_a_draft(demo)
    app = _app(demo.parent)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        offer = app.screen
        assert isinstance(offer, RecoveryScreen)
        listed = str(offer.query_one(OptionList).get_option_at_index(0).prompt)
        assert "distal.yaml" in listed and "Demo B" in listed
        await pilot.press("enter")
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        assert screen.dirty and "UNSAVED" in str(screen.query_one("#titlebar").render())
        assert screen.case.draws[0].serum.sodium.canonical == 150
        assert load_case(demo).draws[0].serum.sodium.canonical == 139  # still unsaved
        assert current_holder(demo) is not None  # the restored session holds the case
        await pilot.press("ctrl+s")
        await pilot.pause()
        assert not screen.dirty
    assert load_case(demo).draws[0].serum.sodium.canonical == 150
    assert list_drafts() == []  # saved, then closed cleanly: nothing left over
    # The save kept the file's own comment (round-trip save).
    assert demo.read_text().startswith("# Invented demo case")


async def test_later_then_opening_the_file_asks_again_and_discard_deletes(demo: Path) -> None:
    await _leave_a_draft(demo)
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        assert isinstance(app.screen, RecoveryScreen)
        await pilot.press("l")  # later: then the start file opens, and asks about its edits
        await pilot.pause()
        ask = app.screen
        assert isinstance(ask, ChoiceScreen)
        assert "did not close" in ask.question and "distal.yaml" in ask.question
        await pilot.click("#answer-discard")
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen) and not screen.dirty
        assert screen.case.draws[0].serum.sodium.canonical == 139
    assert list_drafts() == []


async def test_drafts_left_for_later_can_be_listed_again_from_the_palette(demo: Path) -> None:
    await _leave_a_draft(demo)
    app = _app(demo.parent)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        await pilot.press("l")
        await pilot.pause()
        assert type(app.screen).__name__ == "LibraryScreen"
        [command] = [c for c in app.get_system_commands(app.screen) if c.title == "Unsaved drafts"]
        command.callback()
        await pilot.pause()
        assert isinstance(app.screen, RecoveryScreen)
        await pilot.press("r")
        await pilot.pause()
        assert isinstance(app.screen, CaseScreen) and app.screen.dirty
        assert app.screen.case.draws[0].serum.sodium.canonical == 150


async def test_a_damaged_draft_is_listed_with_its_problem_and_never_crashes(demo: Path) -> None:
    bad = drafts_folder() / f"{'0' * 24}.draft.json"
    bad.write_text('{"format": 1, "case_path": "/nowhere.yaml", "written": "yesterday"')
    app = _app(demo.parent)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        offer = app.screen
        assert isinstance(offer, RecoveryScreen)
        listed = str(offer.query_one(OptionList).get_option_at_index(0).prompt)
        assert "DAMAGED" in listed and "unreadable draft" in listed
        await pilot.press("enter")  # cannot be restored: says so, stays
        await pilot.pause()
        assert app.screen is offer
        assert any("cannot be restored" in m for m in _messages(app))
        await pilot.press("d")  # discard asks first
        await pilot.pause()
        assert isinstance(app.screen, ChoiceScreen)
        await pilot.click("#answer-discard")
        await pilot.pause()
        assert not isinstance(app.screen, RecoveryScreen)  # none left: the list closes
        assert app.is_running
    assert not bad.exists()


async def test_a_draft_whose_file_changed_since_restores_onto_a_conflict(demo: Path) -> None:
    await _leave_a_draft(demo)
    demo.write_text(demo.read_text().replace("sicca symptoms", "sicca symptoms; seen by renal"))
    app = _app(demo.parent)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        listed = str(app.screen.query_one(OptionList).get_option_at_index(0).prompt)
        assert "changed on disk since" in listed
        await pilot.press("enter")
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen) and screen.dirty
        await pilot.press("ctrl+s")
        await pilot.pause()
        assert isinstance(app.screen, ConflictScreen)  # never overwritten silently
    assert "seen by renal" in demo.read_text()


async def test_a_damaged_draft_of_the_opened_case_can_be_discarded_not_restored(
    demo: Path,
) -> None:
    await _leave_a_draft(demo)
    draft = draft_path(demo)
    record = json.loads(draft.read_text())
    record["checksum"] = "0" * 64  # damaged on disk
    draft.write_text(json.dumps(record))
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        assert isinstance(app.screen, RecoveryScreen)
        await pilot.press("l")
        await pilot.pause()
        ask = app.screen
        assert isinstance(ask, ChoiceScreen) and "checksum is wrong" in ask.question
        assert [k for k, _ in ask.answers] == ["discard", "later"]  # no restore offered
        await pilot.press("escape")  # same as later: the case opens as on disk
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen) and not screen.dirty
    [left] = list_drafts()  # kept for later, under a name of its own
    assert left.problem == "the draft's checksum is wrong" and left.path != draft


# --------------------------------------------------------------------- the journal


async def test_journal_timer_writes_only_when_something_changed(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        assert screen.journal_timer is not None
        assert screen.journal_timer._interval == JOURNAL_SECONDS
        draft = draft_path(demo)
        screen.journal_tick()  # nothing changed: nothing written
        assert not draft.exists()
        (await _field(screen, "serum-chloride")).input.value = "112"
        await pilot.pause()
        assert not draft.exists()  # not on every keystroke: on the timer
        screen.journal_tick()
        first = read_draft(draft)
        assert first.case is not None and first.case.draws[0].serum.chloride.canonical == 112
        stamp = draft.stat().st_mtime_ns
        screen.journal_tick()  # unchanged since: not rewritten
        assert draft.stat().st_mtime_ns == stamp
        (await _field(screen, "serum-chloride")).input.value = "113"
        await pilot.pause()
        screen.journal_tick()
        assert read_draft(draft).case.draws[0].serum.chloride.canonical == 113


async def test_a_draw_change_is_journaled_at_once(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        await pilot.press("ctrl+n")  # new draw: no timer needed
        await pilot.pause()
        d = read_draft(draft_path(demo))
        assert d.case is not None and len(d.case.draws) == 3


async def test_close_after_discard_deletes_the_draft_and_the_lock(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        (await _field(screen, "serum-sodium")).input.value = "143"
        await pilot.pause()
        screen.journal_tick()
        assert draft_path(demo).exists() and lock_path(demo).exists()
        await pilot.press("ctrl+o")
        await pilot.pause()
        await pilot.click("#answer-discard")
        await pilot.pause()
        assert not isinstance(app.screen, CaseScreen)
        assert not draft_path(demo).exists()
        assert not lock_path(demo).exists() and current_holder(demo) is None
    assert load_case(demo).draws[0].serum.sodium.canonical == 139


@pytest.mark.parametrize("answer", ["save", "discard"])
async def test_quit_after_save_or_discard_is_a_clean_close(demo: Path, answer: str) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        (await _field(screen, "serum-sodium")).input.value = "146"
        await pilot.pause()
        screen.journal_tick()
        assert draft_path(demo).exists()
        await pilot.press("ctrl+q")
        await pilot.pause()
        await pilot.click(f"#answer-{answer}")
        await pilot.pause()
    assert not app.is_running
    assert list_drafts() == [] and current_holder(demo) is None
    saved = load_case(demo).draws[0].serum.sodium.canonical
    assert saved == (146 if answer == "save" else 139)


async def test_a_new_case_is_journaled_and_saved_under_its_label(tmp_path: Path) -> None:
    app = _app(tmp_path)
    async with app.run_test(size=SIZE) as pilot:
        app.new_case()
        await pilot.pause()
        screen = app.screen
        screen.journal_tick()
        assert list_drafts() == []  # an untouched new case leaves nothing behind
        (await _field(screen, "serum-sodium")).input.value = "137"
        await pilot.pause()
        screen.journal_tick()
        [d] = list_drafts()
        assert d.case_path == (tmp_path / "new-case.yaml").resolve() and d.base is None
        await forms(screen)  # the case form is built on its first visit
        screen.query_one("#case-label", Input).value = "Bed 9"
        await pilot.pause()
        assert screen.save_now()
        assert screen.path == (tmp_path / "bed-9.yaml").resolve()
        assert list_drafts() == []  # the draft under the first name went with the save
        assert not (tmp_path / ".new-case.yaml.lock").exists()


# --------------------------------------------------------------------- save conflicts


async def _edit_then_change_on_disk(pilot, demo: Path) -> CaseScreen:
    await pilot.pause()
    screen = pilot.app.screen
    (await _field(screen, "serum-sodium")).input.value = "144"
    await pilot.pause()
    # Someone edits the file by hand meanwhile.
    demo.write_text(demo.read_text().replace("Weakness;", "Weakness (hand edit);"))
    await pilot.press("ctrl+s")
    await pilot.pause()
    return screen


async def test_conflict_dialog_shows_the_diff_and_cancel_writes_nothing(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        screen = await _edit_then_change_on_disk(pilot, demo)
        dialog = app.screen
        assert isinstance(dialog, ConflictScreen)
        assert "changed outside this session" in dialog.message
        assert "-notes: Invented scenario for demonstration and tests. Weakness (hand edit)" in (
            dialog.diff
        )
        assert "+notes: Invented scenario for demonstration and tests. Weakness;" in dialog.diff
        assert dialog.query_one("#conflict-diff").can_focus  # scrollable by keys
        for key in ("save_as", "overwrite", "cancel"):  # every answer is on the screen
            button = dialog.query_one(f"#answer-{key}")
            x, y = button.region.center
            assert dialog.get_widget_at(x, y)[0] is button
        await pilot.press("escape")
        await pilot.pause()
        assert app.screen is screen and screen.dirty
    assert "hand edit" in demo.read_text()
    assert load_case(demo).draws[0].serum.sodium.canonical == 139


async def test_conflict_overwrite_keeps_the_disk_version_as_a_backup(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        screen = await _edit_then_change_on_disk(pilot, demo)
        await pilot.click("#answer-overwrite")
        await pilot.pause()
        assert app.screen is screen and not screen.dirty
    assert load_case(demo).draws[0].serum.sodium.canonical == 144
    assert "hand edit" not in demo.read_text()
    assert "hand edit" in list_backups(demo)[0].path.read_text()


async def test_conflict_save_as_writes_a_new_file_and_leaves_the_other(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        screen = await _edit_then_change_on_disk(pilot, demo)
        await pilot.click("#answer-save_as")
        await pilot.pause()
        ask = app.screen
        assert isinstance(ask, AskScreen)
        assert ask.query_one(Input).value == "distal-2.yaml"
        await pilot.press("enter")
        await pilot.pause()
        assert app.screen is screen and not screen.dirty
        assert screen.path == (demo.parent / "distal-2.yaml").resolve()
        assert current_holder(demo) is None  # the old file's lock went with the switch
    assert load_case(demo.parent / "distal-2.yaml").draws[0].serum.sodium.canonical == 144
    assert "hand edit" in demo.read_text()


async def test_a_long_diff_scrolls_by_keys_while_a_button_has_the_focus(tmp_path: Path) -> None:
    diff = "".join(f"-line {i} on disk\n+line {i} yours\n" for i in range(100))
    app = _app(tmp_path)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        answers: list[str] = []
        app.push_screen(ConflictScreen("changed", diff), answers.append)
        await pilot.pause()
        box = app.screen.query_one("#conflict-diff")
        assert box.scroll_y == 0 and box.max_scroll_y > 0
        await pilot.press("pagedown", "down")
        await pilot.pause()
        assert box.scroll_y > 0
        await pilot.press("escape")
        await pilot.pause()
        assert answers == ["cancel"]


# --------------------------------------------------------------------- locks and privacy


async def test_a_case_held_elsewhere_opens_read_only_or_not_at_all(demo: Path) -> None:
    with CaseLock.acquire(demo):  # another session holds the case
        app = _app(demo.parent, demo)
        async with app.run_test(size=SIZE) as pilot:
            await pilot.pause()
            ask = app.screen
            assert isinstance(ask, ChoiceScreen)
            assert f"pid {os.getpid()}" in ask.question and "read-only" in ask.question
            await pilot.click("#answer-read_only")
            await pilot.pause()
            screen = app.screen
            assert isinstance(screen, CaseScreen) and screen.read_only
            assert "READ-ONLY" in str(screen.query_one("#titlebar").render())
            assert (await _field(screen, "serum-sodium")).input.is_disabled  # no edits
            assert screen.case.draws[0].serum.sodium.canonical == 139  # the values show
            before = demo.read_bytes()
            await pilot.press("ctrl+s", "ctrl+n")
            await pilot.pause()
            assert any("Read-only" in m for m in _messages(app))
            assert len(screen.case.draws) == 2
            assert screen.journal_now() is False
            assert demo.read_bytes() == before and list_drafts() == []
        app = _app(demo.parent, demo)
        async with app.run_test(size=SIZE) as pilot:
            await pilot.pause()
            await pilot.press("escape")  # cancel: the library instead
            await pilot.pause()
            assert type(app.screen).__name__ == "LibraryScreen"


async def test_a_stale_lock_is_taken_over_with_a_note(demo: Path) -> None:
    dead = {"pid": 999_999_999, "user": "someone", "host": "ward-pc", "since": "2026-11-30"}
    lock_path(demo).write_text(json.dumps(dead))
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        assert isinstance(app.screen, CaseScreen)
        # A one-line banner says so (no toast over the findings); F1 names the dead session.
        assert "stale lock taken over" in str(app.screen.query_one("#notice-line").render())
        assert not [m for m in _messages(app) if m.startswith("Stale lock")]
        _title, _keys, _cautions, extra = app.screen.help_context()
        assert "someone@ward-pc (pid 999999999)" in extra
        assert current_holder(demo).pid == os.getpid()


async def test_an_open_folder_is_named_with_the_exact_chmod(demo: Path) -> None:
    os.chmod(demo.parent, 0o755)
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        # The fix is on the banner line and in F1, not in a message box over the findings.
        banner = str(app.screen.query_one("#notice-line").render())
        assert f"chmod 700 {demo.parent.resolve()}" in banner
        assert not [m for m in _messages(app) if m.startswith("Case folder not private")]
        _title, _keys, _cautions, extra = app.screen.help_context()
        assert f"chmod 700 {demo.parent.resolve()}" in extra


# --------------------------------------------------------------------- backups


async def test_backups_are_listed_and_one_is_put_back_after_asking(demo: Path) -> None:
    original = demo.read_bytes()
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        await pilot.press("ctrl+r")
        await pilot.pause()
        assert any("No backups" in m for m in _messages(app))
        for value in ("142", "143"):
            (await _field(screen, "serum-sodium")).input.value = value
            await pilot.pause()
            assert screen.save_now()
        await pilot.press("ctrl+r")
        await pilot.pause()
        listing = app.screen
        assert isinstance(listing, BackupsScreen) and len(listing.backups) == 2
        await pilot.press("down", "enter")  # the older one: the file as first opened
        await pilot.pause()
        assert isinstance(app.screen, ChoiceScreen)
        await pilot.click("#answer-restore")
        await pilot.pause()
        reopened = app.screen
        assert isinstance(reopened, CaseScreen) and reopened is not screen
        assert reopened.case.draws[0].serum.sodium.canonical == 139
        assert not reopened.dirty
    assert demo.read_bytes() == original
    # What it replaced (the 143 save) is itself kept.
    assert "143" in list_backups(demo)[0].path.read_text()
    titles = {c.title for c in app.get_system_commands(screen)}
    assert {"Backups…", "Unsaved drafts"} <= titles
