"""Cohort counts by leading pattern and month, and their CSV export."""

from __future__ import annotations

import csv
import io
from pathlib import Path

from workup.cohort import CSV_HEADER, cohort
from workup.library import LibraryEntry, list_library


def _e(name: str, month: str | None, lead: str | None, verdict: str | None, ok: bool = True):
    return LibraryEntry(
        name=name,
        folder=Path(),
        size=1,
        mtime_ns=1,
        ok=ok,
        first_taken=f"{month}-03T10:00" if month else None,
        leading_id=lead,
        leading_name=lead.replace("_", " ") if lead else None,
        verdict=verdict,
    )


ENTRIES = [
    _e("1", "2026-10", "distal_rta", "likely"),
    _e("2", "2026-11", "distal_rta", "likely"),
    _e("3", "2026-11", "distal_rta", "possible"),
    _e("4", "2026-11", "gi_bicarbonate_loss", "likely"),
    _e("5", None, "gi_bicarbonate_loss", "likely"),
    _e("6", "2026-09", None, None),
    _e("7", None, None, None, ok=False),
]


def test_counts_add_up_by_pattern_and_by_month() -> None:
    c = cohort(ENTRIES)
    assert c.total == 7 and sum(cell.cases for cell in c.cells) == 7
    by_pattern = {pid: counts for pid, _name, counts in c.by_pattern()}
    assert by_pattern["distal_rta"] == {"likely": 2, "possible": 1}
    assert by_pattern["gi_bicarbonate_loss"] == {"likely": 2}
    assert sum(by_pattern["none"].values()) == 1 and sum(by_pattern["unreadable"].values()) == 1
    assert c.by_pattern()[0][0] == "distal_rta"  # most cases first
    assert c.by_month() == [
        ("2026-09", 1),
        ("2026-10", 1),
        ("2026-11", 3),
        ("undated", 1),
        ("unreadable", 1),
    ]


def test_csv_export_round_trips() -> None:
    rows = list(csv.reader(io.StringIO(cohort(ENTRIES).to_csv())))
    assert tuple(rows[0]) == CSV_HEADER
    body = {(r[0], r[1], r[3]): int(r[4]) for r in rows[1:]}
    assert body[("2026-11", "distal_rta", "likely")] == 1
    assert body[("2026-11", "distal_rta", "possible")] == 1
    assert body[("undated", "gi_bicarbonate_loss", "likely")] == 1
    assert sum(body.values()) == 7
    text = cohort(ENTRIES).render()
    assert "Cohort of 7 case file(s)" in text and "2026-11" in text


def test_cohort_of_the_demo_cases_matches_their_listing(cases_dir: Path, tmp_path: Path) -> None:
    entries = list_library(cases_dir, tmp_path / "i.sqlite", workers=1)
    c = cohort(entries)
    assert c.total == len(entries)
    for pid, _name, counts in c.by_pattern():
        assert sum(counts.values()) == sum(
            1 for e in entries if (e.leading_id or ("none" if e.ok else "unreadable")) == pid
        )
