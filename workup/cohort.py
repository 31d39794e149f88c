"""Cohort summary for audits: how many cases led with each pattern, and in which month.

A case counts once, under its leading cause of a normal-gap acidosis (with that cause's verdict)
and under the month of its first dated draw, when the workup began. Cases with no ranked cause
count under "none"; files that did not load under "unreadable", so the totals always add up to
the number of files listed.
"""

from __future__ import annotations

import csv
import io
from collections import Counter
from collections.abc import Iterable
from dataclasses import dataclass

from workup.library import LibraryEntry

NO_PATTERN = "none"
"""Pattern id for cases whose assessment ranked no cause."""
UNREADABLE = "unreadable"
"""Pattern id (and month) for files that did not load."""
UNDATED = "undated"
"""Month for cases without any dated draw."""

CSV_HEADER = ("month", "leading_pattern", "pattern_name", "verdict", "cases")
"""Columns of the CSV export, one row per month, pattern and verdict."""


@dataclass(frozen=True, slots=True)
class CohortCell:
    """How many cases share one month, leading pattern and verdict."""

    month: str
    """``YYYY-MM`` of the first dated draw, "undated" or "unreadable"."""
    pattern_id: str
    """Leading pattern id, "none" or "unreadable"."""
    pattern_name: str
    """Its human name."""
    verdict: str
    """The leading pattern's verdict ("" when there is none)."""
    cases: int
    """Number of cases."""


@dataclass(frozen=True)
class Cohort:
    """Counts over a set of library entries."""

    cells: tuple[CohortCell, ...]
    """Every non-empty (month, pattern, verdict) combination, by month then pattern."""
    total: int
    """Number of files counted."""

    def by_pattern(self) -> list[tuple[str, str, Counter[str]]]:
        """(pattern id, name, verdict counts) for each pattern, most cases first."""
        names: dict[str, str] = {}
        counts: dict[str, Counter[str]] = {}
        for c in self.cells:
            names[c.pattern_id] = c.pattern_name
            counts.setdefault(c.pattern_id, Counter())[c.verdict] += c.cases
        order = sorted(counts, key=lambda p: (-sum(counts[p].values()), p))
        return [(p, names[p], counts[p]) for p in order]

    def by_month(self) -> list[tuple[str, int]]:
        """(month, cases) in calendar order; "undated" and "unreadable" last."""
        counts: Counter[str] = Counter()
        for c in self.cells:
            counts[c.month] += c.cases
        return sorted(counts.items(), key=lambda kv: (not kv[0][:1].isdigit(), kv[0]))

    def to_csv(self) -> str:
        """The cells as CSV text with a header row (columns: CSV_HEADER)."""
        out = io.StringIO()
        w = csv.writer(out, lineterminator="\n")
        w.writerow(CSV_HEADER)
        for c in self.cells:
            w.writerow((c.month, c.pattern_id, c.pattern_name, c.verdict, c.cases))
        return out.getvalue()

    def render(self) -> str:
        """Plain-text tables by pattern and by month, 80 columns wide."""
        lines = [f"Cohort of {self.total} case file(s)", "", "By leading pattern"]
        lines.append(
            f"  {'pattern':<40} {'cases':>6} {'likely':>7} {'possible':>9} {'unlikely':>9}"
        )
        for _pid, name, counts in self.by_pattern():
            n = sum(counts.values())
            lines.append(
                f"  {name[:40]:<40} {n:>6} {counts['likely']:>7} {counts['possible']:>9} "
                f"{counts['unlikely']:>9}"
            )
        lines += ["", "By month of the first draw"]
        for month, n in self.by_month():
            lines.append(f"  {month:<12} {n:>6}")
        return "\n".join(lines) + "\n"


def cohort(entries: Iterable[LibraryEntry]) -> Cohort:
    """Count ``entries`` by month of first draw, leading pattern and verdict."""
    counts: Counter[tuple[str, str, str, str]] = Counter()
    total = 0
    for e in entries:
        total += 1
        if not e.ok:
            key = (UNREADABLE, UNREADABLE, "file did not load", "")
        else:
            month = e.first_taken[:7] if e.first_taken else UNDATED
            if e.leading_id:
                key = (month, e.leading_id, e.leading_name or e.leading_id, e.verdict or "")
            else:
                key = (month, NO_PATTERN, "no cause ranked", "")
        counts[key] += 1
    cells = tuple(
        CohortCell(m, p, n, v, k)
        for (m, p, n, v), k in sorted(
            counts.items(), key=lambda kv: (not kv[0][0][:1].isdigit(), kv[0])
        )
    )
    return Cohort(cells, total)
