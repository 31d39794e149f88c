"""Shared fixtures: the demo-case folder and a private home so no test touches the real one."""

from __future__ import annotations

from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parent.parent
CASES = ROOT / "cases"


@pytest.fixture(autouse=True)
def _private_dirs(tmp_path_factory, monkeypatch):
    """Point platformdirs (XDG) and WORKUP_CASES at a temporary home for every test."""
    home = tmp_path_factory.mktemp("home")
    for var, sub in (
        ("XDG_DATA_HOME", "data"),
        ("XDG_CONFIG_HOME", "config"),
        ("XDG_CACHE_HOME", "cache"),
        ("XDG_STATE_HOME", "state"),
    ):
        monkeypatch.setenv(var, str(home / sub))
    monkeypatch.delenv("WORKUP_CASES", raising=False)
    monkeypatch.delenv("NO_COLOR", raising=False)


@pytest.fixture
def cases_dir() -> Path:
    """The bundled demo cases (invented scenarios)."""
    return CASES
