"""CaseSession: open, journal, save with conflict detection and backup, restore, close."""

from __future__ import annotations

import os
from pathlib import Path

import pytest

from workup.caseio import CaseFileError, load_case
from workup.journal import draft_for, list_drafts, pending_drafts, write_draft
from workup.locking import CaseLock
from workup.session import CaseLockedError, CaseSession, ReadOnlyError, SaveConflict
from workup.storage import list_backups


@pytest.fixture
def case_file(tmp_path, cases_dir) -> Path:
    """A copy of an invented demo case (comments included) in a private library."""
    lib = tmp_path / "lib"
    lib.mkdir(mode=0o700)
    target = lib / "case.yaml"
    target.write_bytes((cases_dir / "type4-hypoaldosteronism.yaml").read_bytes())
    os.chmod(target, 0o600)
    return target


def _with_notes(session: CaseSession, notes: str):
    case = session.case.model_copy(deep=True)
    case.notes = notes
    return case


def _crash(session: CaseSession) -> None:
    """What a kill leaves: the kernel drops the flock; the lock file and the draft stay."""
    assert session.lock is not None and session.lock._fd is not None
    os.close(session.lock._fd)
    session.lock._fd = None


def test_open_reads_the_case_and_holds_the_lock(case_file):
    with CaseSession.open(case_file) as s:
        assert s.case == load_case(case_file)
        assert not s.dirty and not s.disk_changed()
        with pytest.raises(CaseLockedError):
            CaseSession.open(case_file)
        ro = CaseSession.open(case_file, read_only=True)
        assert ro.read_only and ro.holder is not None
        with pytest.raises(ReadOnlyError):
            ro.save()
        assert ro.journal(_with_notes(ro, "x")) is False
    assert not (case_file.parent / ".case.yaml.lock").exists()


def test_a_bad_file_raises_case_file_error_and_releases_the_lock(case_file):
    case_file.write_text("label: [unclosed\n")
    with pytest.raises(CaseFileError):
        CaseSession.open(case_file)
    with pytest.raises(CaseFileError, match="no such file"):
        CaseSession.open(case_file.parent / "absent.yaml")
    CaseLock.acquire(case_file).release()  # nobody kept it


def test_journal_writes_only_changes_and_removes_the_draft_when_back_to_saved(case_file):
    with CaseSession.open(case_file) as s:
        original = s.case
        assert s.journal(original) is False
        assert draft_for(case_file) is None
        edit = _with_notes(s, "one")
        assert s.journal(edit) is True
        assert s.journal(edit.model_copy(deep=True)) is False  # same content: no write
        assert draft_for(case_file).case == edit
        assert s.dirty
        assert s.journal(original) is False  # undone back to the saved version
        assert draft_for(case_file) is None
        assert not s.dirty


def test_save_keeps_a_backup_and_removes_the_draft(case_file):
    before = case_file.read_text()
    with CaseSession.open(case_file) as s:
        edit = _with_notes(s, "saved edit")
        s.journal(edit)
        result = s.save(edit)
        assert result.kept_comments and result.backup is not None
        assert result.backup.path.read_text() == before
        assert load_case(case_file) == edit
        assert draft_for(case_file) is None
        assert not s.dirty and not s.disk_changed()
        assert case_file.read_text().startswith("# Invented demo case")


def test_a_file_changed_on_disk_is_never_overwritten_silently(case_file):
    with CaseSession.open(case_file) as s:
        hand = case_file.read_text().replace("potassium: 5.9", "potassium: 6.2")
        case_file.write_text(hand)
        edit = _with_notes(s, "my edit")
        with pytest.raises(SaveConflict) as err:
            s.save(edit)
        assert case_file.read_text() == hand  # nothing written
        diff = err.value.diff
        assert "(on disk now)" in diff and "(your version)" in diff
        assert "-notes:" in diff and "+notes: my edit" in diff
        assert "potassium: 6.2" in diff and "potassium: 5.9" in diff
        assert s.disk_changed()

        result = s.save(edit, force=True)
        assert load_case(case_file) == edit
        assert result.backup.path.read_text() == hand  # their version is kept
        assert not s.disk_changed()
        s.save(_with_notes(s, "next"))  # the base moved to what we wrote: no conflict now


def test_a_deleted_file_is_a_conflict_too(case_file):
    with CaseSession.open(case_file) as s:
        case_file.unlink()
        with pytest.raises(SaveConflict, match="deleted") as err:
            s.save()
        assert err.value.disk_text is None
        s.save(force=True)
        assert load_case(case_file) == s.case


def test_a_touch_without_a_change_is_not_a_conflict(case_file):
    with CaseSession.open(case_file) as s:
        os.utime(case_file, (1, 1))
        s.save(_with_notes(s, "fine"))


def test_create_a_new_case(tmp_path, case_file):
    case = load_case(case_file)
    new = tmp_path / "lib" / "new.yaml"
    with CaseSession.create(new, case) as s:
        assert s.dirty
        assert s.journal(case) is True
        result = s.save()
        assert result.backup is None and not result.kept_comments
    assert load_case(new) == case
    with pytest.raises(FileExistsError):
        CaseSession.create(new, case)


def test_a_created_case_whose_file_appears_meanwhile_conflicts(tmp_path, case_file):
    new = tmp_path / "lib" / "new.yaml"
    with CaseSession.create(new, load_case(case_file)) as s:
        new.write_text("label: someone else's\n")
        with pytest.raises(SaveConflict):
            s.save()


def test_clean_close_deletes_the_draft(case_file):
    s = CaseSession.open(case_file)
    s.journal(_with_notes(s, "discarded by the user"))
    s.close()
    assert list_drafts() == []


def test_an_exception_inside_with_keeps_the_draft(case_file):
    with pytest.raises(RuntimeError), CaseSession.open(case_file) as s:
        s.journal(_with_notes(s, "kept"))
        raise RuntimeError("the app failed")
    assert [d.case.notes for d in pending_drafts()] == ["kept"]


def test_after_a_crash_the_draft_is_offered_and_restored(case_file):
    s = CaseSession.open(case_file)
    edit = _with_notes(s, "typed before the line dropped")
    s.journal(edit)
    _crash(s)

    (draft,) = pending_drafts()
    assert draft.case == edit
    r = CaseSession.restore(draft)
    assert r.case == edit and r.dirty
    assert "ended without closing" in r.notes[0]
    r.save()
    r.close()
    assert load_case(case_file) == edit
    assert pending_drafts() == []


def test_restoring_a_draft_whose_file_changed_meanwhile_conflicts(case_file):
    s = CaseSession.open(case_file)
    s.journal(_with_notes(s, "mine"))
    _crash(s)
    case_file.write_text(case_file.read_text().replace("sodium: 137", "sodium: 139"))
    (draft,) = pending_drafts()
    assert draft.disk_changed()
    with CaseSession.restore(draft) as r, pytest.raises(SaveConflict) as err:
        r.save()
    assert "sodium: 139" in err.value.diff


def test_opening_a_case_with_left_over_edits_sets_them_aside(case_file):
    s = CaseSession.open(case_file)
    s.journal(_with_notes(s, "left over"))
    _crash(s)

    s2 = CaseSession.open(case_file)
    assert s2.pending_draft is not None and s2.pending_draft.case.notes == "left over"
    assert any("were found" in n for n in s2.notes)
    s2.journal(_with_notes(s2, "new session"))  # must not overwrite the left-over edits
    notes = sorted(d.case.notes for d in list_drafts())
    assert notes == ["left over", "new session"]
    restored = s2.restore_pending()
    assert restored.notes == "left over"
    assert [d.case.notes for d in list_drafts()] == ["left over"]
    s2.close()
    assert list_drafts() == []


def test_discarding_left_over_edits_on_open(case_file):
    s = CaseSession.open(case_file)
    s.journal(_with_notes(s, "unwanted"))
    _crash(s)
    with CaseSession.open(case_file) as s2:
        s2.discard_pending()
        assert s2.pending_draft is None
        assert list_drafts() == []


def test_a_left_over_draft_equal_to_the_file_is_dropped_quietly(case_file):
    s = CaseSession.open(case_file)
    edit = _with_notes(s, "saved")
    s.save(edit)
    write_draft(case_file, edit, s.base)  # killed between the save and the draft's removal
    _crash(s)
    with CaseSession.open(case_file) as s2:
        assert s2.pending_draft is None
        assert not any("were found" in n for n in s2.notes)
        assert list_drafts() == []


def test_saving_into_a_file_with_comments_keeps_them_and_reads_back(case_file):
    text = case_file.read_text()
    comments = [line for line in text.splitlines() if line.lstrip().startswith("#")]
    with CaseSession.open(case_file) as s:
        case = s.case.model_copy(deep=True)
        from workup.analytes import Panel, analyte
        from workup.quantity import read_value

        case.draws[0].urine.potassium = read_value(analyte(Panel.urine, "potassium"), 30, None)
        s.save(case)
    saved = case_file.read_text()
    assert all(c in saved for c in comments)
    assert load_case(case_file) == case


def test_a_broken_hand_edit_is_replaced_in_full_when_forced(case_file):
    with CaseSession.open(case_file) as s:
        case_file.write_text("label: [broken\n")
        with pytest.raises(SaveConflict):
            s.save()
        result = s.save(force=True)
        assert not result.kept_comments and result.note
        assert load_case(case_file) == s.case
        assert list_backups(case_file)[0].path.read_text() == "label: [broken\n"


def test_open_reports_a_folder_other_users_can_read(case_file):
    with CaseSession.open(case_file) as s:
        assert s.privacy == []
    os.chmod(case_file.parent, 0o755)
    os.chmod(case_file, 0o644)
    with CaseSession.open(case_file) as s:
        commands = [w.command for w in s.privacy]
        assert commands == [f"chmod 700 {case_file.parent}", f"chmod 600 {case_file}"]
        assert any("chmod 700" in n for n in s.notes)
        s.save(_with_notes(s, "saved privately"))
    assert os.stat(case_file).st_mode & 0o077 == 0  # a save makes the file itself private


def test_open_sweeps_old_temp_files_of_this_case_only(case_file):
    old = case_file.parent / ".case.yaml.x1.tmp"
    other = case_file.parent / ".other.yaml.x2.tmp"
    for p in (old, other):
        p.write_text("partial")
        os.utime(p, (0, 0))
    with CaseSession.open(case_file):
        assert not old.exists() and other.exists()


def test_restoring_one_draft_never_overwrites_another_of_the_same_case(case_file):
    s = CaseSession.open(case_file)
    s.journal(_with_notes(s, "first crash"))
    _crash(s)
    s2 = CaseSession.open(case_file)  # sets "first crash" aside
    s2.journal(_with_notes(s2, "second crash"))
    _crash(s2)

    offered = {d.case.notes: d for d in pending_drafts()}
    assert set(offered) == {"first crash", "second crash"}
    r = CaseSession.restore(offered["first crash"])
    assert r.case.notes == "first crash"
    assert sorted(d.case.notes for d in list_drafts()) == ["first crash", "second crash"]
    r.close()
    assert [d.case.notes for d in pending_drafts()] == ["second crash"]


def test_a_forced_save_over_a_file_with_a_huge_number_still_writes(case_file):
    with CaseSession.open(case_file) as s:
        text = case_file.read_text().replace("sodium: 137", "sodium: " + "9" * 400)
        case_file.write_text(text)
        result = s.save(force=True)
        assert load_case(case_file) == s.case
        assert "9" * 400 not in case_file.read_text()
        assert result.backup.path.read_text() == text
