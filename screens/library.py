"""The library screen: the saved cases of one folder, to open or start a new one.

First version: lists the folder's files directly. The case-library issue replaces the listing
with the cached index, filter-as-you-type, sorting and a preview.
"""

from __future__ import annotations

from pathlib import Path

from textual.app import ComposeResult
from textual.binding import Binding
from textual.screen import Screen
from textual.widgets import DataTable, Footer, Header

from screens.messages import NewCase, OpenCase
from workup.caseio import CaseFileError, load_case


class LibraryScreen(Screen):
    """Cases in ``cases_dir``; Enter opens one (posts OpenCase), n starts a new one (NewCase)."""

    BINDINGS = [
        Binding("enter", "open", "Open", show=True),
        Binding("n", "new", "New case"),
    ]

    def __init__(self, cases_dir: Path) -> None:
        super().__init__()
        self.cases_dir = cases_dir
        self._paths: list[Path] = []

    def compose(self) -> ComposeResult:
        yield Header()
        yield DataTable(id="cases", cursor_type="row")
        yield Footer()

    def on_mount(self) -> None:
        table = self.query_one(DataTable)
        table.add_columns("Case", "File", "Status")
        for path in sorted(self.cases_dir.glob("*.yaml")):
            try:
                label, status = load_case(path).label, "ok"
            except CaseFileError as exc:
                label, status = "(unreadable)", exc.problems[0].message[:40]
            self._paths.append(path)
            table.add_row(label, path.name, status)
        table.focus()

    def action_open(self) -> None:
        table = self.query_one(DataTable)
        if self._paths:
            self.post_message(OpenCase(self._paths[table.cursor_row]))

    def on_data_table_row_selected(self, event: DataTable.RowSelected) -> None:
        self.post_message(OpenCase(self._paths[event.cursor_row]))

    def action_new(self) -> None:
        self.post_message(NewCase())
