"""Fixtures shared by the core's tests."""

from __future__ import annotations

from pathlib import Path

import pytest


@pytest.fixture
def library(tmp_path: Path) -> Path:
    """A folder of 30 invented cases generated from the demo cases (bench/library_bench.py)."""
    from bench.library_bench import generate_library

    folder = tmp_path / "cases"
    generate_library(folder, 30, seed=7)
    return folder
