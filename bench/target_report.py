"""The list of every target under the table: met, missed or not measured, one line each.

The table packs several targets into one cell; this list names each target of each row with the
statistic it was judged on, so a miss is read as a miss. ``make bench`` prints it last.
"""

from __future__ import annotations

from collections.abc import Sequence

from bench.table import Row, number_text

WORDS = {"pass": "met", "FAIL": "MISSED", "n/a": "not measured"}
"""How a verdict reads in the list (a miss in capitals, so it is not overlooked)."""


def target_lines(rows: Sequence[Row]) -> list[str]:
    """A count line, then one line per target of every row, in table order."""
    lines: list[str] = []
    counts = dict.fromkeys(WORDS.values(), 0)
    for row in rows:
        for target in row.targets:
            word = WORDS[row.judge(target)]
            counts[word] += 1
            x = row.judged(target)
            stat = {"median": "median", "p99": "p99", "high": "max"}[target.statistic]
            got = (
                ""
                if x is None
                else f" (got {stat} {number_text(x)}{'×' if target.of == 'ratio' else ''})"
            )
            lines.append(f"- {word}: {row.figure}: {target.text(row.unit)}{got}")
    head = ", ".join(f"{n} {word}" for word, n in counts.items())
    return [f"Targets: {head}.", *lines]
