"""``python -m bench`` (what ``make bench`` runs): measure, print one table, write the JSON.

Options: ``--quick`` for fewer repetitions, ``--only SECTION`` to run some sections (their JSON
is written only with ``--out``), and ``--write-docs`` to put the table into docs/benchmarks.md.
"""

from __future__ import annotations

import argparse
import sys
from pathlib import Path

from bench import report, runner


def main(argv: list[str] | None = None) -> int:
    """Run the benchmarks; exit status 0 even when a target is missed (this is not a test)."""
    p = argparse.ArgumentParser(prog="python -m bench", description=__doc__)
    p.add_argument("--quick", action="store_true", help="fewer repetitions")
    p.add_argument(
        "--only",
        action="append",
        choices=list(runner.SECTIONS),
        help="run only this section (repeatable)",
    )
    p.add_argument(
        "--write-docs", action="store_true", help="also write the table into docs/benchmarks.md"
    )
    p.add_argument(
        "--out",
        type=Path,
        default=None,
        help="write the JSON here (default bench/results/latest.json; with --only, none)",
    )
    args = p.parse_args(argv)
    plan = runner.QUICK if args.quick else runner.FULL

    def log(msg: str) -> None:
        print(msg, file=sys.stderr, flush=True)

    if args.only and args.write_docs:
        p.error("--write-docs needs every section; drop --only")
    doc = runner.run(plan, only=args.only, log=log)
    print(report.machine_line(doc["machine"]))
    print()
    print(doc["table"])
    print()
    print("\n".join(doc["targets"]))
    # A partial run must not replace the full results the docs table was made from.
    out = args.out if args.out is not None else (None if args.only else runner.RESULTS)
    if out is not None:
        print(f"\nresults: {runner.write_results(doc, out)}")
    if args.write_docs:
        print(f"docs: {report.write_docs(doc).relative_to(runner.ROOT)}")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
