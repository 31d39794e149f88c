"""``workup check FILE...``: validate case files; every problem with file, line and field."""

from __future__ import annotations

import argparse
import sys
from pathlib import Path

from workup.caseio import CaseFileError, load_case


def add_arguments(p: argparse.ArgumentParser) -> None:
    """Arguments of ``workup check``."""
    p.add_argument("files", nargs="+", type=Path, help="case files (YAML)")


def run(args: argparse.Namespace) -> int:
    """0 when every file is good, 2 when any is not (problems on stderr)."""
    bad = 0
    for path in args.files:
        try:
            load_case(path)
        except CaseFileError as exc:
            bad += 1
            print(str(exc), file=sys.stderr)
        else:
            print(f"{path}: ok")
    return 2 if bad else 0
