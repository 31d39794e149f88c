"""The wording of what the app says on opening a case (screens/app_notices.py), without an app.

The sessions are stand-ins with only the fields the notices read; the problems and privacy
warnings are the core's own types.
"""

from __future__ import annotations

from pathlib import Path
from types import SimpleNamespace

from screens.app_notices import (
    MAX_PROBLEMS_SHOWN,
    case_file_problems,
    read_only_question,
    session_notices,
)
from workup.caseio import Problem
from workup.privacy import PrivacyWarning


def _warning(n: int) -> PrivacyWarning:
    return PrivacyWarning((Path(f"/cases/{n}"),), f"folder {n} is open", f"chmod 700 /cases/{n}")


def _session(note: str | None = None, privacy: int = 0) -> SimpleNamespace:
    lock = SimpleNamespace(note=note) if note is not None else None
    return SimpleNamespace(lock=lock, privacy=[_warning(i) for i in range(privacy)])


def test_a_long_problem_list_shows_the_first_few_and_counts_the_rest() -> None:
    problems = [Problem(f"draws[{i}].serum.sodium", "not a number", i + 1) for i in range(8)]
    text = case_file_problems(problems, "a.yaml")
    lines = text.splitlines()
    assert lines[0] == "a.yaml:1: draws[0].serum.sodium: not a number"
    assert len(lines) == MAX_PROBLEMS_SHOWN + 1
    assert lines[-1] == f"(+{8 - MAX_PROBLEMS_SHOWN} more)"


def test_a_short_problem_list_has_no_count() -> None:
    text = case_file_problems([Problem("", "not a case file")], "b.yaml")
    assert text == "b.yaml: not a case file"


def test_a_clean_session_says_nothing() -> None:
    assert session_notices(_session()) == []


def test_a_stale_lock_and_open_folders_give_one_warning_each() -> None:
    notices = session_notices(_session(note="someone's session ended", privacy=3))
    assert [n.title for n in notices] == ["Stale lock taken over", "Case folder not private"]
    assert all(n.severity == "warning" for n in notices)
    privacy = notices[1].message
    assert privacy.startswith("folder 0 is open\n  fix: chmod 700 /cases/0")
    assert "(+2 more warnings: F1)" in privacy and "folder 1" not in privacy
    assert privacy.endswith("ctrl+d closes this message")


def test_one_more_privacy_warning_is_singular() -> None:
    (notice,) = session_notices(_session(privacy=2))
    assert "(+1 more warning: F1)" in notice.message


def test_the_read_only_question_names_the_holder_or_says_it_is_unknown() -> None:
    holder = SimpleNamespace(describe=lambda: "ana@ward-pc (pid 42)")
    named = read_only_question("c.yaml", SimpleNamespace(holder=holder))  # type: ignore[arg-type]
    assert named.startswith("c.yaml is open in ana@ward-pc (pid 42).\n")
    unknown = read_only_question("c.yaml", RuntimeError("held"))
    assert "another session (its details are unreadable)" in unknown
