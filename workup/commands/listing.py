"""``workup list [DIR] [TERMS...] [--json] [--cohort [--csv FILE]]``: list and search the library.

One row per case file: file, label, latest draw time, leading cause and verdict, and whether a
test is still pending. A file that fails to load is listed with its error and never stops the
listing. TERMS use the search syntax of docs/search.md (quote terms holding < or > in a shell).
Exit codes: 0 listed; 1 the CSV file could not be written; 2 a bad folder, query or settings file.
"""

from __future__ import annotations

import argparse
import json
import sys
from pathlib import Path

from workup.library import SORT_KEYS


def add_arguments(p: argparse.ArgumentParser) -> None:
    """Arguments of ``workup list``."""
    # Search terms may follow options (`workup list DIR --json k<3`): plain parse_args cannot
    # take positionals on both sides of an option, the intermixed parser can.
    p.parse_args = p.parse_intermixed_args  # type: ignore[method-assign]
    p.add_argument(
        "words",
        nargs="*",
        metavar="[DIR] TERMS",
        help="an optional library folder (default: $WORKUP_CASES or the per-user data folder), "
        "then search terms, e.g. pattern:distal 'uag>0' date:2026-11 (see docs/search.md)",
    )
    p.add_argument("--json", action="store_true", help="print a JSON array, one object per case")
    p.add_argument("--sort", choices=SORT_KEYS, default="file", help="row order (default: file)")
    p.add_argument("--reverse", action="store_true", help="reverse the row order")
    p.add_argument(
        "--cohort",
        action="store_true",
        help="print counts by leading pattern and by month of the first draw instead of rows",
    )
    p.add_argument(
        "--csv",
        metavar="FILE",
        help="with --cohort: write the counts as CSV to FILE ('-' for standard output)",
    )
    p.add_argument(
        "--rebuild", action="store_true", help="discard the cached index and read every file"
    )


def _split(words: list[str]) -> tuple[Path | None, list[str]]:
    """The folder (the first word, when it is one or is written like a path) and the terms."""
    if words:
        first = words[0]
        path = Path(first).expanduser()
        if path.is_dir() or (":" not in first and first.startswith(("/", ".", "~"))):
            return path, words[1:]
        if "/" in first and ":" not in first and not any(c in first for c in "<>="):
            return path, words[1:]
    return None, words


def run(args: argparse.Namespace) -> int:
    """List (or count) the cases; see the module docstring for exit codes."""
    from workup.commands._common import default_cases_dir, user_overrides
    from workup.library import open_library, sort_entries
    from workup.search import SearchError, parse, search

    folder, terms = _split(args.words)
    folder = folder or default_cases_dir()
    if args.csv and not args.cohort:
        print("workup list: --csv needs --cohort", file=sys.stderr)
        return 2
    if not folder.is_dir():
        print(f"workup list: {folder}: no such folder", file=sys.stderr)
        return 2
    try:
        query = parse(" ".join(terms))
    except SearchError as exc:
        print(f"workup list: search: {exc}", file=sys.stderr)
        return 2
    overrides = user_overrides()
    if overrides is None:
        return 2
    if args.rebuild:
        from workup.library_index import cache_path, remove_index

        remove_index(cache_path(folder, overrides))
    with open_library(folder, None, overrides) as index:
        if args.json and not args.cohort and not query.terms and args.sort == "file":
            # The plain listing, the one run most: the index keeps each row's JSON text.
            return _write_stored(index.listing(args.reverse), folder)
        entries = sort_entries(index.entries(), args.sort, args.reverse)
        matches = search(entries, query, index.draws)
    if args.cohort:
        return _cohort(matches, args.csv)
    if args.json:
        out = []
        for m in matches:
            obj = m.entry.to_json()
            if m.draw is not None:
                obj["match"] = {
                    "draw": m.draw,
                    "values": [{"field": f, "value": v, "status": s} for f, v, s in m.values],
                }
            out.append(obj)
        # One case per line: the C encoder writes each (an indented dump is pure Python, and
        # for a library of 10,000 cases it took longer than the listing itself).
        encode = json.JSONEncoder(ensure_ascii=False).encode  # one encoder for every row
        lines = ",\n".join(encode(o) for o in out)
        sys.stdout.write("[\n" + lines + "\n]\n" if out else "[]\n")
    else:
        sys.stdout.write(render_rows(matches))
    _report_count(len(matches), len(entries), sum(1 for m in matches if not m.entry.ok), folder)
    return 0


def _write_stored(rows: list[tuple[str, bool]], folder: Path) -> int:
    """Write stored listing objects as ``--json`` does (one case per line) and the count line."""
    sys.stdout.write("[\n" + ",\n".join(t for t, _ in rows) + "\n]\n" if rows else "[]\n")
    _report_count(len(rows), len(rows), sum(1 for _, ok in rows if not ok), folder)
    return 0


def _report_count(shown: int, total: int, bad: int, folder: Path) -> None:
    """The count line on standard error, naming the files that did not load."""
    tail = f"; {bad} did not load" if bad else ""
    print(f"{shown} of {total} case file(s) in {folder}{tail}", file=sys.stderr)


def _cohort(matches: list, csv_path: str | None) -> int:
    from workup.cohort import cohort

    c = cohort(m.entry for m in matches)
    if csv_path is None:
        sys.stdout.write(c.render())
        return 0
    if csv_path == "-":
        sys.stdout.write(c.to_csv())
        return 0
    try:
        from workup.storage import atomic_write_text

        atomic_write_text(Path(csv_path), c.to_csv())
    except OSError as exc:
        print(f"workup list: cannot write {csv_path}: {exc.strerror or exc}", file=sys.stderr)
        return 1
    print(f"wrote {csv_path} ({len(c.cells)} rows, {c.total} cases)", file=sys.stderr)
    return 0


def _cut(text: str, width: int) -> str:
    return text if len(text) <= width else text[: width - 1] + "…"


def render_rows(matches: list) -> str:
    """The matches as a plain-text table with one row per case (and its matched values)."""
    from workup.formatting import fmt_number
    from workup.library import describe_pending, leading_cells, status_word

    width = min(26, max([4, *(len(m.entry.name) for m in matches)]))
    head = (
        f"{'FILE':<{width}}  {'CASE':<28}  {'LATEST DRAW':<16}  {'LEADING CAUSE':<28}  "
        f"{'VERDICT':<8}  PENDING"
    )
    lines = [head]
    for m in matches:
        e = m.entry
        name = _cut(e.name, width)
        if not e.ok:
            first = (e.error or "").splitlines()[0] if e.error else "did not load"
            lines.append(f"{name:<{width}}  DID NOT LOAD: {first}")
            continue
        when = (e.latest_taken or "undated").replace("T", " ")
        cause, verdict = leading_cells(e)
        lines.append(
            f"{name:<{width}}  {_cut(e.label, 28):<28}  {when:<16}  {_cut(cause, 28):<28}  "
            f"{verdict:<8}  {describe_pending(e)}"
        )
        if e.error:
            lines.append(f"{'':<{width}}  ! {e.error}")
        if m.draw is not None:
            vals = ", ".join(
                f"{f} {fmt_number(v, decimals=2 if abs(v or 0) < 10 else 1)} [{status_word(s)}]"
                for f, v, s in m.values
            )
            lines.append(f"{'':<{width}}  at draw {m.draw!r}: {vals}")
    return "\n".join(lines) + "\n"
