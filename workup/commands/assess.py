"""``workup assess FILE [--draw LABEL] [--json]``: the assessment as text or one JSON object."""

from __future__ import annotations

import argparse
import json
import sys
import textwrap
from pathlib import Path

from workup.assess import Assessment
from workup.commands._common import assess_or_report, user_overrides
from workup.draw_focus import DrawFocus, focused_assessment, header
from workup.findings import STATUS_MARK, STATUS_WORD
from workup.formatting import fmt_value


def add_arguments(p: argparse.ArgumentParser) -> None:
    """Arguments of ``workup assess``."""
    p.add_argument("file", type=Path, help="case file (YAML)")
    p.add_argument(
        "--draw",
        help="label of the draw to assess (default: the latest draw showing the acidosis "
        "that is not a loading test, else the latest)",
    )
    p.add_argument("--json", action="store_true", help="print one JSON object")


def run(args: argparse.Namespace) -> int:
    """Print the assessment; 2 when the file or draw is bad."""
    got = assess_or_report(args.file, args.draw)
    if got is None:
        return 2
    case, result = got
    result, focus = focused_assessment(case, args.draw, user_overrides())
    if args.json:
        json.dump(result.to_json(), sys.stdout, indent=2, ensure_ascii=False)
        sys.stdout.write("\n")
    else:
        sys.stdout.write(render_text(result, focus if len(case.draws) > 1 else None))
    return 0


def _wrap(text: str, indent: str = "    ") -> str:
    return textwrap.fill(text, 80, initial_indent=indent, subsequent_indent=indent)


def render_text(a: Assessment, focus: DrawFocus | None = None) -> str:
    """The assessment as plain text, 80 columns wide; ``focus`` adds a line saying which draw
    is shown and why the others matter."""
    lines = [f"{a.case_label} - draw: {a.draw_label or 'none'}"]
    if focus is not None:
        lines.append(_wrap(header(a, focus), ""))
    lines.append("")
    lines.append("Acid-base disorders")
    if not a.disorders:
        lines.append("    none identified from the values entered")
    for d in a.disorders:
        role = "primary" if d.primary else "added"
        extra = ", ".join(
            x for x in (d.detail, d.compensation and f"compensation {d.compensation}") if x
        )
        lines.append(f"  {d.name} ({role}{', ' + extra if extra else ''})")
        for e in d.evidence:
            lines.append(_wrap("- " + e.text, "      "))
    lines += ["", "Indices   (+ valid, ! caution, x NOT VALID, ? needs input)"]
    for f in a.indices.values():
        mark = STATUS_MARK[f.status]
        line = f"  {mark} {f.name:<34} {fmt_value(f):>16}  {STATUS_WORD[f.status]}"
        # A reading is stated only for a value that may be relied on (never for NOT VALID).
        if f.usable and f.interpretation:
            reading = f.interpretation.replace("_", " ")
            if len(line) + 2 + len(reading) <= 80:
                line += "  " + reading
            else:
                lines.append(line)
                line = " " * 40 + reading
        lines.append(line)
        if f.status.value != "ok" and f.reasons:
            lines.append(_wrap(f.reasons[0], "        "))
    lines += ["", "Causes of a normal-gap acidosis (all draws)"]
    for note in a.ranking_notes:
        lines.append(_wrap(note, "    "))
    for p in a.patterns:
        lines.append(f"  {p.verdict.value:<9} {p.name}")
        for e in p.support:
            lines.append(_wrap("for: " + e.text, "        "))
        for e in p.against:
            lines.append(_wrap("against: " + e.text, "        "))
        if p.missing:
            lines.append(_wrap("missing: " + ", ".join(p.missing), "        "))
    if a.next_tests:
        lines += ["", "Suggested next tests"]
        for t in a.next_tests:
            lines.append(_wrap(f"- {t.text}: {t.why}", "  "))
    lines += ["", "Cautions"]
    lines += [_wrap("- " + c, "  ") for c in a.cautions]
    return "\n".join(lines) + "\n"
