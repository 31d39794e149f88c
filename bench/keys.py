"""The bytes a terminal sends for a key, so the pty harness can type as a fellow would."""

from __future__ import annotations

# xterm's bytes for the keys the harness may need (TERM=xterm-256color).
_KEY_BYTES = {
    "tab": b"\t",
    "enter": b"\r",
    "escape": b"\x1b",
    "down": b"\x1b[B",
    "up": b"\x1b[A",
    "f1": b"\x1bOP",
    "f2": b"\x1bOQ",
    "f3": b"\x1bOR",
    "f4": b"\x1bOS",
}


def key_bytes(key: str) -> bytes:
    """What a terminal sends for ``key`` (a Textual key name or a single character)."""
    if key in _KEY_BYTES:
        return _KEY_BYTES[key]
    if key.startswith("ctrl+") and len(key) == 6:
        return bytes([ord(key[-1].lower()) - 96])
    if len(key) == 1:
        return key.encode()
    raise ValueError(f"no terminal bytes known for key {key!r}")
