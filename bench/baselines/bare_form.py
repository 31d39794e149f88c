"""A bare Textual form: a header, rows of label + input, a footer; no logic, default settings.

The benchmark sizes it to about as many widgets as the app's first screen (``--rows``), so the
startup and keystroke ratios compare the app against what Textual itself costs for that screen.
Run: ``python bench/baselines/bare_form.py --rows 12``. Ctrl+Q quits (Textual's default binding).
"""

from __future__ import annotations

import argparse

from textual.app import App, ComposeResult
from textual.containers import Horizontal, VerticalScroll
from textual.widgets import Footer, Header, Input, Label


class BareForm(App[None]):
    """``rows`` label/input pairs between a header and a footer."""

    # The scroll container is focusable and would take the first focus; the form starts in a field.
    AUTO_FOCUS = "Input"

    CSS = """
    Horizontal { height: 1; }
    Label { width: 24; }
    Input { width: 1fr; height: 1; border: none; padding: 0 1; }
    """

    def __init__(self, rows: int) -> None:
        super().__init__()
        self.rows = rows

    def compose(self) -> ComposeResult:
        yield Header()
        with VerticalScroll():
            for i in range(self.rows):
                with Horizontal():
                    yield Label(f"Field {i + 1}")
                    yield Input(placeholder="value", id=f"f{i}")
        yield Footer()


def main(argv: list[str] | None = None) -> int:
    """Run the form until Ctrl+Q."""
    p = argparse.ArgumentParser(description=__doc__)
    p.add_argument("--rows", type=int, default=12, help="label/input pairs (default 12)")
    args = p.parse_args(argv)
    BareForm(args.rows).run(mouse=False)
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
