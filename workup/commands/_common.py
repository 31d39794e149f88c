"""Helpers shared by the subcommands: loading a case with a clean error, user settings."""

from __future__ import annotations

import sys
from pathlib import Path

from workup.caseio import CaseFileError, load_case
from workup.model import Case


def load_or_report(path: Path) -> Case | None:
    """Load ``path`` or print its problems on stderr and return None."""
    try:
        return load_case(path)
    except CaseFileError as exc:
        print(str(exc), file=sys.stderr)
        return None


def user_overrides() -> dict[str, float] | None:
    """The user's settings overrides, or None (after a message on stderr) when the file is bad."""
    from workup.settings import load_user_overrides

    try:
        return load_user_overrides()
    except (ValueError, OSError) as exc:
        print(f"workup: settings: {exc}", file=sys.stderr)
        return None
