"""Fixtures for the screen tests."""

from __future__ import annotations

import os
import shutil
from pathlib import Path

import pytest


@pytest.fixture
def demo(tmp_path: Path, cases_dir: Path) -> Path:
    """A private copy (folder 0700, file 0600) of the invented two-draw distal RTA demo case."""
    folder = tmp_path / "cases"
    folder.mkdir(mode=0o700)
    os.chmod(folder, 0o700)
    target = folder / "distal.yaml"
    shutil.copy(cases_dir / "distal-rta-classic.yaml", target)
    os.chmod(target, 0o600)
    return target
