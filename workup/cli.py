"""The ``workup`` command line.

``workup`` alone opens the case library in the terminal app; ``workup FILE.yaml`` opens one case.
Subcommands work without the app and never import Textual (each lives in workup/commands/ and is
imported only when called, so that ``workup assess`` starts fast).
"""

from __future__ import annotations

import argparse
import importlib
import sys
from pathlib import Path

from workup import __version__
from workup.commands._common import default_cases_dir

# name -> (module under workup.commands, one-line help). Modules are imported on use.
COMMANDS: dict[str, tuple[str, str]] = {
    "assess": ("assess", "print the assessment of a case (indices, disorders, causes)"),
    "check": ("check", "validate case files and list every problem with file, line and field"),
    "note": ("note", "draft the consult-note assessment of a case"),
    "list": ("listing", "list and search the case library"),
    "import": ("importer", "propose a draw from pasted lab-report text"),
}

EXIT_OK, EXIT_FAILURE, EXIT_BAD_INPUT = 0, 1, 2


def _app_parser() -> argparse.ArgumentParser:
    p = argparse.ArgumentParser(
        prog="workup",
        description=(
            "Work up a metabolic acidosis from serum, blood gas and urine studies. "
            "Decision support, not a diagnosis."
        ),
        epilog="subcommands: "
        + "; ".join(f"{k}: {v[1]}" for k, v in COMMANDS.items())
        + ". Run 'workup SUBCOMMAND --help' for each.",
    )
    p.add_argument("file", nargs="?", type=Path, help="a case file to open on its findings")
    p.add_argument(
        "--cases",
        type=Path,
        default=None,
        help="case library folder (default: $WORKUP_CASES or the per-user data folder)",
    )
    p.add_argument("--version", action="version", version=f"workup {__version__}")
    return p


def main(argv: list[str] | None = None) -> int:
    """Entry point of the ``workup`` console script."""
    argv = list(sys.argv[1:] if argv is None else argv)
    if argv and argv[0] in COMMANDS:
        name = argv[0]
        module_name, help_text = COMMANDS[name]
        module = importlib.import_module(f"workup.commands.{module_name}")
        parser = argparse.ArgumentParser(prog=f"workup {name}", description=help_text)
        module.add_arguments(parser)
        args = parser.parse_args(argv[1:])
        try:
            return int(module.run(args))
        except BrokenPipeError:  # `workup list | head` must not print a traceback
            return EXIT_OK
    args = _app_parser().parse_args(argv)
    cases = args.cases if args.cases is not None else default_cases_dir()
    if args.file is not None and not args.file.exists():
        print(f"workup: {args.file}: no such file", file=sys.stderr)
        return EXIT_BAD_INPUT
    # The one hand-off from the core to the UI package, by name, so that workup/ has no import
    # of Textual or screens (tests/workup/test_boundary.py checks both statically and at run time).
    launcher = importlib.import_module("screens.launch")
    return int(launcher.launch(cases_dir=cases, file=args.file))


if __name__ == "__main__":  # pragma: no cover
    raise SystemExit(main())
