"""The folder scan: a library folder's case files, with the size and mtime the index keys on.

workup.library_index compares this against what it has stored to find new, changed and gone files.
"""

from __future__ import annotations

import os
from pathlib import Path

CASE_SUFFIXES = (".yaml", ".yml")
"""File name endings the library lists."""


def scan_folder(folder: Path) -> dict[str, tuple[int, int]]:
    """Every case file under ``folder`` (sub-folders too, hidden ones skipped): name → (size,
    mtime_ns)."""
    out: dict[str, tuple[int, int]] = {}
    stack = [("", str(folder))]
    while stack:
        prefix, where = stack.pop()
        try:
            it = os.scandir(where)
        except OSError:
            continue
        with it:
            for e in it:
                if e.name.startswith("."):
                    continue
                try:
                    if e.is_dir(follow_symlinks=False):  # a linked folder could loop
                        stack.append((prefix + e.name + "/", e.path))
                    elif e.name.endswith(CASE_SUFFIXES) and e.is_file():
                        st = e.stat()
                        out[prefix + e.name] = (st.st_size, st.st_mtime_ns)
                except OSError:
                    continue
    return out
