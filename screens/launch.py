"""Start the terminal app (the only entry the core's command line calls, by module name)."""

from __future__ import annotations

from pathlib import Path


def launch(cases_dir: Path, file: Path | None = None) -> int:
    """Run the app on ``cases_dir``, opening ``file`` when given; returns the exit code."""
    from screens.app import build_app

    app = build_app(cases_dir=cases_dir, file=file)
    app.run(mouse=False)
    return int(app.return_code or 0)
