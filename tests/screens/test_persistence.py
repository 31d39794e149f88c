"""The app's one door to case files: names never collide, notes go beside the case."""

from __future__ import annotations

import shutil
from pathlib import Path

import pytest

from screens import persistence


def test_round_trip_through_the_persistence_module(tmp_path: Path, cases_dir: Path) -> None:
    src = tmp_path / "b.yaml"
    shutil.copy(cases_dir / "distal-rta-classic.yaml", src)
    case = persistence.read_case(src)
    out = persistence.write_case(case, tmp_path / "c.yaml")
    again = persistence.read_case(out)
    assert again == case
    assert (out.stat().st_mode & 0o777) == 0o600


def test_new_case_path_does_not_overwrite(tmp_path: Path) -> None:
    first = persistence.new_case_path(tmp_path, "Bed 12: new acidosis!")
    assert first.name == "bed-12-new-acidosis.yaml"
    first.write_text("x")
    second = persistence.new_case_path(tmp_path, "Bed 12: new acidosis!")
    assert second.name == "bed-12-new-acidosis-2.yaml"
    assert persistence.new_case_path(tmp_path, "???").name == "case.yaml"


def test_note_goes_beside_the_case(tmp_path: Path) -> None:
    case_file = tmp_path / "ward" / "demo.yaml"
    path = persistence.note_path(case_file, tmp_path, "Demo")
    assert path == tmp_path / "ward" / "demo.note.txt"
    written = persistence.write_note("line one", path)
    assert written.read_text() == "line one\n"
    assert persistence.note_path(case_file, tmp_path, "Demo").name == "demo.note-2.txt"
    assert persistence.note_path(None, tmp_path, "New case").parent == tmp_path


def test_two_new_cases_with_one_label_never_share_a_file(tmp_path: Path, cases_dir: Path) -> None:
    case = persistence.read_case(cases_dir / "distal-rta-classic.yaml")
    first = persistence.new_session(tmp_path, "New case", case)
    second = persistence.new_session(tmp_path, "New case", case)
    try:
        assert first.path.name == "new-case.yaml"
        assert second.path.name == "new-case-2.yaml"  # the first name is held, not yet a file
        assert persistence.new_session(tmp_path, "New case", case, keep=first) is first
    finally:
        first.close()
        second.close()
    (tmp_path / "new-case.yaml").write_text("x")
    third = persistence.new_session(tmp_path, "New case", case)
    third.close()
    assert third.path.name == "new-case-2.yaml"


def test_a_session_save_keeps_comments_and_a_second_open_is_refused(
    tmp_path: Path, cases_dir: Path
) -> None:
    src = tmp_path / "b.yaml"
    # Hand-edited: the notes moved up above the label, out of the order workup writes.
    lines = (cases_dir / "distal-rta-classic.yaml").read_text().splitlines(keepends=True)
    notes = next(i for i, line in enumerate(lines) if line.startswith("notes:"))
    lines.insert(2, lines.pop(notes))
    src.write_text("".join(lines))
    hand_edited = src.read_bytes()
    s = persistence.open_session(src)
    try:
        with pytest.raises(persistence.CaseLockedError):
            persistence.open_session(src)
        ro = persistence.open_session(src, read_only=True)
        assert ro.read_only and ro.holder is not None
        case = s.case.model_copy(deep=True)
        case.notes = "Invented: changed in a test."
        result = s.save(case)
    finally:
        s.close()
    assert result.kept_comments and result.backup is not None
    assert src.read_text().startswith("# Invented demo case")
    assert _top_keys(src.read_text())[:3] == ["schema", "notes", "label"]  # key order kept
    assert persistence.read_case(src).notes == "Invented: changed in a test."
    [backup] = persistence.backups_of(src)
    persistence.put_back(backup)
    assert src.read_bytes() == hand_edited


def _top_keys(text: str) -> list[str]:
    return [line.split(":")[0] for line in text.splitlines() if line[:1].isalpha()]
