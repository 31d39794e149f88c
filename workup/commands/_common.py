"""Helpers shared by the subcommands: loading a case with a clean error, user settings."""

from __future__ import annotations

import os
import sys
from pathlib import Path
from typing import TYPE_CHECKING

if TYPE_CHECKING:
    from workup.model import Case


def load_or_report(path: Path) -> Case | None:
    """Load ``path`` or print its problems on stderr and return None."""
    from workup.caseio import CaseFileError, load_case

    try:
        return load_case(path)
    except CaseFileError as exc:
        print(str(exc), file=sys.stderr)
        return None


def user_overrides() -> dict[str, float] | None:
    """The user's settings overrides, or None (after a message on stderr) when the file is bad."""
    from workup.userconfig import settings_file

    path = settings_file()
    if not path.exists():
        return {}  # without a file there is nothing to validate: no need for the settings model
    from workup.settings import load_user_overrides

    try:
        return load_user_overrides(path)
    except (ValueError, OSError) as exc:
        print(f"workup: settings: {exc}", file=sys.stderr)
        return None


def assess_or_report(path: Path, draw: str | None):
    """(case, assessment) of ``path`` at ``draw``, or None after a message on stderr."""
    from workup.assess import assess

    case = load_or_report(path)
    overrides = user_overrides()
    if case is None or overrides is None:
        return None
    try:
        return case, assess(case, draw, overrides)
    except KeyError as exc:
        print(f"workup: {path}: {exc.args[0]}", file=sys.stderr)
        return None


def default_cases_dir() -> Path:
    """The case library: $WORKUP_CASES, else the per-user data folder."""
    env = os.environ.get("WORKUP_CASES")
    if env:
        return Path(env).expanduser()
    from platformdirs import user_data_path

    return user_data_path("workup", appauthor=False) / "cases"
