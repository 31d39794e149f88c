"""``workup note FILE [--draw LABEL] [--style brief|full] [--format text|markdown]``."""

from __future__ import annotations

import argparse
import sys
from pathlib import Path

from workup.commands._common import assess_or_report, user_overrides
from workup.draw_focus import focused_assessment
from workup.note import FORMATS, STYLES, draft_note


def add_arguments(p: argparse.ArgumentParser) -> None:
    """Arguments of ``workup note``."""
    p.add_argument("file", type=Path, help="case file (YAML)")
    p.add_argument(
        "--draw",
        metavar="LABEL",
        help="label of the draw to assess (default: the latest draw showing the acidosis that is not "
        "a loading test, else the latest)",
    )
    p.add_argument(
        "--style",
        choices=STYLES,
        default="brief",
        help="brief: about 15 lines for a consult (default); full: every value and every cause",
    )
    p.add_argument(
        "--format",
        dest="fmt",
        choices=FORMATS,
        default="text",
        help="text: 80 columns, plain punctuation (default); markdown: headings and a table",
    )


def run(args: argparse.Namespace) -> int:
    """Print the drafted note; 2 when the file or draw is bad."""
    got = assess_or_report(args.file, args.draw)
    if got is None:
        return 2
    case, result = got
    if args.draw is None:
        result, _focus = focused_assessment(case, None, user_overrides())
    sys.stdout.write(draft_note(result, case, args.style, args.fmt))
    return 0
