"""The library screen: rows from the index, filter as you type, sort, preview, open, snapshots.

The library is a private copy of the demo cases (invented scenarios) plus one broken file. A
small host app stands in for the real one: it shows the screen and records the messages.
"""

from __future__ import annotations

import shutil
from pathlib import Path

import pytest
from textual.app import App
from textual.widgets import DataTable, Input, Static

from screens.library import FILTER_DELAY, SEARCH_HELP, LibraryScreen
from screens.messages import NewCase, OpenCase
from screens.trends import CompareScreen, TrendsScreen


class Host(App[None]):
    """Shows one LibraryScreen and keeps the messages it posts."""

    def __init__(self, folder: Path) -> None:
        super().__init__()
        self.folder = folder
        self.opened: list[Path] = []
        self.new_cases = 0

    def on_mount(self) -> None:
        self.theme = "textual-dark"
        self.push_screen(LibraryScreen(self.folder))

    def on_open_case(self, message: OpenCase) -> None:
        self.opened.append(Path(message.path))

    def on_new_case(self, message: NewCase) -> None:
        self.new_cases += 1


@pytest.fixture
def folder(tmp_path: Path, cases_dir: Path) -> Path:
    out = tmp_path / "cases"
    out.mkdir()
    for p in sorted(cases_dir.glob("*.yaml")):
        shutil.copy(p, out / p.name)
    (out / "zz-broken.yaml").write_text("schema: 1\nlabel: [unclosed\n", encoding="utf-8")
    return out


async def _ready(pilot) -> LibraryScreen:
    await pilot.app.workers.wait_for_complete()
    await pilot.pause()
    screen = pilot.app.screen
    assert isinstance(screen, LibraryScreen)
    return screen


def _names(screen: LibraryScreen) -> list[str]:
    return [e.name for e in screen.shown]


async def test_lists_every_file_including_the_broken_one(folder: Path) -> None:
    app = Host(folder)
    async with app.run_test(size=(80, 24)) as pilot:
        screen = await _ready(pilot)
        files = sorted(p.name for p in folder.glob("*.yaml"))
        assert _names(screen) == files
        table = screen.query_one(DataTable)
        assert table.row_count == len(files)
        broken = [str(c) for c in table.get_row_at(len(files) - 1)]
        assert broken[0] == "zz-broken.yaml" and "DID NOT LOAD" in broken
        status = str(screen.query_one("#lib-status", Static).content)
        assert f"{len(files)} of {len(files)} cases" in status and "1 did not load" in status


async def test_filter_as_you_type(folder: Path) -> None:
    app = Host(folder)
    async with app.run_test(size=(80, 24)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("slash")
        assert screen.focused is screen.query_one("#lib-search", Input)
        await pilot.press(*"sicca")  # in the notes of the distal RTA demo case
        await pilot.pause(FILTER_DELAY * 3)
        assert _names(screen) == ["distal-rta-classic.yaml"]
        await pilot.press("escape")  # clears the search and returns to the list
        await pilot.pause()
        assert len(screen.shown) == len(list(folder.glob("*.yaml")))
        assert screen.focused is screen.query_one(DataTable)


async def test_enter_in_the_search_line_searches_and_does_not_open(folder: Path) -> None:
    app = Host(folder)
    async with app.run_test(size=(80, 24)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("slash")
        screen.query_one("#lib-search", Input).value = "pattern:proximal"
        await pilot.press("enter")
        await pilot.pause()
        assert app.opened == []
        # The toluene-like demo ranks proximal RTA first too (possible, nothing likely).
        assert _names(screen) == ["proximal-rta-fanconi.yaml", "toluene-like.yaml"]
        assert screen.focused is screen.query_one(DataTable)
        await pilot.press("enter")
        await pilot.pause()
        assert app.opened == [folder / "proximal-rta-fanconi.yaml"]


async def test_conditions_and_bad_queries(folder: Path) -> None:
    app = Host(folder)
    async with app.run_test(size=(80, 24)) as pilot:
        screen = await _ready(pilot)
        screen.query_text = "k<3.0"
        screen.apply_search()
        low_k = _names(screen)
        assert low_k and "distal-rta-classic.yaml" in low_k  # baseline K 2.9 in the demo file
        preview = str(screen.query_one("#lib-preview", Static).content)
        assert "Search matched draw" in preview and "serum.potassium" in preview
        assert "[measured]" in preview or "[unusual]" in preview
        screen.query_text = "uga>0"
        screen.apply_search()
        status = screen.query_one("#lib-status", Static)
        assert "unknown index or analyte" in str(status.content) and status.has_class("error")
        assert _names(screen) == low_k  # a bad query keeps the last good rows
        screen.query_text = "is:broken"
        screen.apply_search()
        assert _names(screen) == ["zz-broken.yaml"]


async def test_enter_posts_open_case_and_n_posts_new_case(folder: Path) -> None:
    app = Host(folder)
    async with app.run_test(size=(80, 24)) as pilot:
        await _ready(pilot)
        await pilot.press("down", "enter")
        await pilot.pause()
        assert app.opened == [folder / sorted(p.name for p in folder.glob("*.yaml"))[1]]
        await pilot.press("n")
        await pilot.pause()
        assert app.new_cases == 1


async def test_sort_and_preview(folder: Path) -> None:
    app = Host(folder)
    async with app.run_test(size=(80, 24)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("s")  # file -> case label
        labels = [e.label for e in screen.shown if e.ok]
        assert labels == sorted(labels, key=str.lower)
        assert not screen.shown[-1].ok  # a broken file sorts last
        current = screen.current()
        assert current is not None and current.name == "child-drta.yaml"  # the cursor stays put
        preview = str(screen.query_one("#lib-preview", Static).content)
        assert current.label in preview
        # Every index number in the preview is followed by its status word.
        for line in preview.splitlines():
            if line.startswith((" + ", " ! ", " x ")):
                assert line.rstrip().split("[")[-1].split("]")[0] in (
                    "valid",
                    "caution",
                    "NOT VALID",
                )


async def test_trends_and_compare_open_from_the_library(folder: Path) -> None:
    app = Host(folder)
    async with app.run_test(size=(80, 24)) as pilot:
        screen = await _ready(pilot)
        screen.query_text = "pattern:distal dry"
        screen.apply_search()
        await pilot.press("t")
        await pilot.pause()
        assert isinstance(app.screen, TrendsScreen)
        await pilot.press("c")
        await pilot.pause()
        assert isinstance(app.screen, CompareScreen)
        await pilot.press("escape", "escape")
        await pilot.pause()
        assert app.screen is screen


async def test_coming_back_to_the_library_rereads_changed_files(folder: Path) -> None:
    app = Host(folder)
    async with app.run_test(size=(80, 24)) as pilot:
        screen = await _ready(pilot)
        await pilot.press("down", "down", "down")  # gi-loss-diarrhea, fourth by file name
        await app.push_screen(TrendsScreen(screen.current_case()))
        target = folder / "gi-loss-diarrhea.yaml"
        text = target.read_text(encoding="utf-8")
        target.write_text(text.replace("Demo A - ", "Demo A (seen again) - "), encoding="utf-8")
        app.pop_screen()
        await _ready(pilot)
        assert any(e.label.startswith("Demo A (seen again)") for e in screen.entries)
        assert screen.current().name == "gi-loss-diarrhea.yaml"


def test_help_lists_the_search_syntax(folder: Path) -> None:
    title, keys, _cautions, extra = LibraryScreen(folder).help_context()
    assert title == "library" and extra == SEARCH_HELP
    assert any(k == "/" for k, _ in keys)
    for word in ("pattern:", "verdict:", "date:", "is:pending", "uag>0", "not_valid"):
        assert word in SEARCH_HELP


async def _settle(pilot) -> None:
    # The index is read in a worker started from on_mount; under load the snapshot could be
    # taken before that worker even starts, so wait until the rows have landed.
    for _ in range(200):
        await pilot.app.workers.wait_for_complete()
        await pilot.pause()
        screen = pilot.app.screen
        if isinstance(screen, LibraryScreen) and screen._loaded_once:
            break
    # The table sizes its columns on a later refresh than the one that shows the rows.
    for _ in range(3):
        await pilot.pause()
        await pilot.wait_for_scheduled_animations()


def test_snapshot_80x24(folder: Path, snap_compare) -> None:
    assert snap_compare(Host(folder), terminal_size=(80, 24), run_before=_settle)


def test_snapshot_120x40(folder: Path, snap_compare) -> None:
    assert snap_compare(Host(folder), terminal_size=(120, 40), run_before=_settle)
