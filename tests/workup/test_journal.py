"""The draft journal: where drafts live, what they hold, and which ones are offered on start."""

from __future__ import annotations

import json
import os
import stat
from pathlib import Path

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from workup.caseio import load_case, save_case
from workup.journal import (
    discard_draft,
    draft_for,
    draft_path,
    drafts_folder,
    list_drafts,
    pending_drafts,
    read_draft,
    write_draft,
)
from workup.locking import CaseLock
from workup.storage import read_with_fingerprint


@pytest.fixture
def case_file(tmp_path, cases_dir) -> Path:
    """A copy of an invented demo case in a private library."""
    lib = tmp_path / "lib"
    lib.mkdir(mode=0o700)
    target = lib / "case.yaml"
    target.write_bytes((cases_dir / "gi-loss-diarrhea.yaml").read_bytes())
    return target


def _edited(case_file: Path, note: str):
    case = load_case(case_file)
    case.notes = note
    return case


def test_drafts_live_privately_in_the_user_state_folder():
    folder = drafts_folder()
    assert folder == Path(os.environ["XDG_STATE_HOME"]) / "workup" / "drafts"
    assert stat.S_IMODE(folder.stat().st_mode) == 0o700


def test_a_draft_holds_the_case_its_file_and_the_base(case_file):
    case = _edited(case_file, "unsaved")
    base = read_with_fingerprint(case_file)[1]
    path = write_draft(case_file, case, base)
    assert path == draft_path(case_file)
    assert stat.S_IMODE(path.stat().st_mode) == 0o600
    d = read_draft(path)
    assert d.problem is None
    assert d.case == case
    assert d.case_path == case_file.resolve()
    assert d.base == base
    assert not d.disk_changed()
    assert not d.same_as_disk()
    case_file.write_text(case_file.read_text() + "# edited by hand\n")
    assert d.disk_changed()


def test_the_draft_key_is_the_resolved_path(case_file, monkeypatch):
    monkeypatch.chdir(case_file.parent)
    assert draft_path("case.yaml") == draft_path(case_file)
    assert draft_path("../lib/./case.yaml") == draft_path(case_file)


def test_pending_drafts_offers_left_over_edits(case_file):
    write_draft(case_file, _edited(case_file, "left over"), None)
    offered = pending_drafts()
    assert [d.case.notes for d in offered] == ["left over"]


def test_pending_drafts_skips_a_case_a_running_session_holds(case_file):
    write_draft(case_file, _edited(case_file, "live"), None)
    with CaseLock.acquire(case_file):
        assert pending_drafts() == []
        assert len(list_drafts()) == 1
    assert len(pending_drafts()) == 1


def test_pending_drafts_skips_a_draft_that_is_already_on_disk(case_file):
    case = _edited(case_file, "saved already")
    write_draft(case_file, case, None)
    save_case(case, case_file)  # a crash between the save and the draft's removal
    assert pending_drafts() == []
    assert draft_for(case_file).same_as_disk()


def test_damaged_drafts_are_reported_not_restored(case_file):
    path = write_draft(case_file, _edited(case_file, "x"), None)
    record = json.loads(path.read_text())
    record["case"]["notes"] = "tampered"
    path.write_text(json.dumps(record))
    d = read_draft(path)
    assert d.case is None and "checksum" in d.problem

    junk = drafts_folder() / "junk.draft.json"
    junk.write_text("{not json")
    assert "unreadable" in read_draft(junk).problem
    problems = sorted(d.problem is not None for d in pending_drafts())
    assert problems == [True, True]


def test_a_draft_with_an_invalid_case_is_reported(case_file):
    path = write_draft(case_file, _edited(case_file, "x"), None)
    record = json.loads(path.read_text())
    record["case"]["draws"][0]["serum"]["sodium"] = "lots"
    from workup.journal import _checksum

    record["checksum"] = _checksum(record["case"])
    path.write_text(json.dumps(record))
    d = read_draft(path)
    assert d.case is None and "sodium" in d.problem


def test_discard_removes_the_draft(case_file):
    write_draft(case_file, _edited(case_file, "x"), None)
    (d,) = pending_drafts()
    discard_draft(d)
    assert pending_drafts() == [] and draft_for(case_file) is None
    discard_draft(d)  # already gone: harmless


JSON = st.recursive(
    st.none() | st.booleans() | st.integers() | st.floats() | st.text(max_size=20),
    lambda inner: (
        st.lists(inner, max_size=4) | st.dictionaries(st.text(max_size=10), inner, max_size=4)
    ),
    max_leaves=30,
)


@settings(max_examples=200, deadline=None)
@given(st.binary(max_size=2000))
def test_any_bytes_in_a_draft_file_are_reported_not_raised(raw):
    path = drafts_folder() / "fuzz.draft.json"
    path.write_bytes(raw)
    d = read_draft(path)
    assert d.case is None and d.problem


@settings(max_examples=200, deadline=None)
@given(JSON, st.booleans())
def test_any_case_data_in_a_well_formed_draft_is_reported_not_raised(data, right_checksum):
    from workup.journal import _checksum

    record = {
        "format": 1,
        "case_path": "/nowhere/case.yaml",
        "base": None,
        "written": "2026-12-01T10:00:00+00:00",
        "owner": "x",
        "checksum": _checksum(data) if right_checksum else "0",
        "case": data,
    }
    path = drafts_folder() / "fuzz.draft.json"
    path.write_text(json.dumps(record))
    d = read_draft(path)
    assert (d.case is None) == (d.problem is not None)
