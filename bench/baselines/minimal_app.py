"""A minimal Textual app: a header, four inputs, a data table and a footer; nothing else.

The fixed yardstick for the first screens of `workup CASE.yaml` and `workup`: what Textual itself
costs to start and paint a small screen, whatever the app mounts. Unlike the bare form it is not
sized to the app, so a screen that mounts many widgets before its first paint pays for them in
the ratio. Run: ``python bench/baselines/minimal_app.py``. Ctrl+Q quits (Textual's default).
"""

from __future__ import annotations

from textual.app import App, ComposeResult
from textual.widgets import DataTable, Footer, Header, Input

TABLE_ROWS = 9
"""Rows of invented text in the table: as many as the demo library lists, so it paints as much."""


class MinimalApp(App[None]):
    """Header, four inputs, a data table, footer; Textual's default settings."""

    def compose(self) -> ComposeResult:
        yield Header()
        for i in range(4):
            yield Input(placeholder=f"value {i + 1}")
        yield DataTable()
        yield Footer()

    def on_mount(self) -> None:
        table = self.query_one(DataTable)
        table.add_columns("Label", "Draws", "Last taken", "File")
        for i in range(TABLE_ROWS):
            table.add_row(f"Row {i + 1}", str(i % 3 + 1), f"2026-11-{i + 10}", f"row-{i + 1}.yaml")


def main() -> int:
    """Run the app until Ctrl+Q."""
    MinimalApp().run(mouse=False)
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
