"""Ordering draw times that may mix local times with and without a UTC offset.

A low-level helper: the library listing and the per-case trends both sort draws by time, and
neither should have to import the other to do it.
"""

from __future__ import annotations

from datetime import UTC
from typing import Any


def comparable_time(t: Any) -> Any:
    """``t`` as a naive datetime that sorts with naive ones (a time with an offset goes to UTC).

    Case files may mix local times with and without an offset; comparing those raises.
    """
    if t is None or t.tzinfo is None:
        return t
    return t.astimezone(UTC).replace(tzinfo=None)
