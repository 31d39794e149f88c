"""SVG snapshots of every screen of the workspace at 80 × 24 and 120 × 40.

Repeatable: fixed clock, explicit theme, no cursor blink, NO_COLOR cleared (tests/conftest.py).
The demo case is an invented scenario. Re-render after an intended change with
``make snapshots`` and review the diff.
"""

from __future__ import annotations

import shutil
from datetime import datetime
from pathlib import Path

import pytest

from screens.app import build_app

ROOT = Path(__file__).resolve().parents[2]
DEMO_NAME = "distal-rta-classic.yaml"
SIZES = [(80, 24), (120, 40)]
_FOLDER: list[Path] = []


@pytest.fixture(autouse=True)
def _private_copy(tmp_path: Path):
    """Each snapshot opens a private copy of the demo cases: no path, permission or lock of the
    checkout (a world-readable clone would add a privacy warning naming its absolute path)."""
    folder = tmp_path / "cases"
    folder.mkdir(mode=0o700)
    for src in (ROOT / "cases").glob("*.yaml"):
        shutil.copy(src, folder / src.name)
        (folder / src.name).chmod(0o600)
    _FOLDER[:] = [folder]
    yield


def _app(file: str | None = DEMO_NAME):
    folder = _FOLDER[0]
    return build_app(
        folder, folder / file if file else None, clock=lambda: datetime(2026, 12, 1, 8, 0)
    )


@pytest.mark.parametrize("size", SIZES, ids=lambda s: f"{s[0]}x{s[1]}")
@pytest.mark.parametrize(
    "keys",
    [[], ["f2"], ["f3"], ["f5"], ["f6"], ["f7"], ["f1"]],
    ids=["findings", "draw", "case", "causes", "diagram", "note", "help"],
)
def test_screen(snap_compare, keys: list[str], size: tuple[int, int]) -> None:
    assert snap_compare(_app(), press=keys, terminal_size=size)


def test_refused_value_and_unsaved_dialog(snap_compare) -> None:
    async def refuse_then_close(pilot) -> None:
        await pilot.press("f2")
        field = pilot.app.screen.query_one("#in-serum-sodium")
        field.value = "1380"
        await pilot.pause()
        await pilot.press("ctrl+o")

    assert snap_compare(_app(), run_before=refuse_then_close, terminal_size=(80, 24))


def test_refused_value_inline(snap_compare) -> None:
    async def refuse(pilot) -> None:
        await pilot.press("f2")
        pilot.app.screen.query_one("#in-serum-sodium").value = "1380"
        pilot.app.screen.query_one("#in-serum-potassium").value = "7.5"
        await pilot.pause()

    assert snap_compare(_app(), run_before=refuse, terminal_size=(80, 24))


def test_terminal_too_small(snap_compare) -> None:
    assert snap_compare(_app(None), terminal_size=(60, 20))


def test_findings_without_colour(snap_compare, monkeypatch) -> None:
    # NO_COLOR: status must still read from its mark and word alone.
    monkeypatch.setenv("NO_COLOR", "1")
    app = _app()
    assert app.no_color
    assert snap_compare(app, terminal_size=(80, 24))
