"""The app's one door to case files: names never collide, notes go beside the case."""

from __future__ import annotations

import shutil
from pathlib import Path

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
