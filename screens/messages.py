"""Messages that screens post up to the app (attributes down, messages up)."""

from __future__ import annotations

from pathlib import Path

from textual.message import Message


class OpenCase(Message):
    """Open the case file at ``path`` in the case workspace."""

    def __init__(self, path: Path) -> None:
        super().__init__()
        self.path = path


class NewCase(Message):
    """Start a new, empty case (saved into the library folder on first save)."""
