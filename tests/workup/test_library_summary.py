"""What the library index stores per case: the assessment's summary, loading tests, sorting,
the ranking as assess makes it, stored numbers, damaged rows, cold against warm listings.

Libraries are generated from the demo cases with varied values (invented data, see
bench/library_bench.py).
"""

from __future__ import annotations

from pathlib import Path

import pytest

from bench.library_bench import generate_library
from tests.workup.helpers.library_files import DEMO, _cache, _write_broken
from workup import library as lib
from workup.caseio import load_case
from workup.library import list_library, open_library, sort_entries, summarize_file


def test_summary_carries_the_assessment(cases_dir: Path, tmp_path: Path) -> None:
    from workup.assess import assess

    row = dict(
        zip(lib.ROW_FIELDS, summarize_file(cases_dir, "distal-rta-classic.yaml", 1, 1), strict=True)
    )
    a = assess(load_case(cases_dir / "distal-rta-classic.yaml"))
    assert row["ok"] == 1 and row["n_draws"] == 2 and row["has_loading"]
    assert row["leading_id"] == (a.leading.id if a.leading else None)
    assert row["pending"] == bool(a.next_tests)
    draws = lib.draws_from_json(row["draws"], row["numbers"])
    assert [d.label for d in draws] == ["baseline", "bicarbonate 3 h"]
    # Every index of every draw is stored with its status, and measured values are marked.
    base = draws[0].values
    for fid, f in a.draws[0].findings.items():
        assert base[fid] == (f.value, f.status.value)
    assert base["serum.potassium"] == (2.9, "measured")


@pytest.mark.parametrize(
    ("text", "kind"),
    [
        (
            "bicarbonate_loading_fehco3 Bicarbonate loading to plasma HCO3 ≥ 20",
            "bicarbonate_loading",
        ),
        ("acidification_test Furosemide–fludrocortisone test", "furosemide_fludrocortisone"),
        ("x Ammonium chloride loading", "ammonium_chloride"),
        ("renin_aldosterone Plasma renin, aldosterone", None),
    ],
)
def test_loading_tests_are_recognised_in_suggestions(text: str, kind: str | None) -> None:
    assert lib._loading_kind(text) == kind


def test_a_loading_test_already_drawn_is_not_expected_again(cases_dir: Path) -> None:
    from workup.findings import NextTest, Ranking

    suggested = [
        NextTest("renin_aldosterone", "Plasma renin, aldosterone", "why"),
        NextTest("bicarbonate_loading_fehco3", "Bicarbonate loading with FEHCO3", "why"),
    ]

    def fixed(case: object, *_a: object) -> tuple[list[object], Ranking]:
        return [], Ranking([], suggested, [])

    drawn = lib.summarize_case(load_case(cases_dir / "distal-rta-classic.yaml"), fixed, {})
    not_drawn = lib.summarize_case(load_case(cases_dir / "ckd-acidosis.yaml"), fixed, {})
    assert drawn["pending"] and not_drawn["pending"]
    assert drawn["next_test"] == "Plasma renin, aldosterone"
    assert not drawn["loading_expected"]  # the case has a bicarbonate-loading draw already
    assert not_drawn["loading_expected"]


def test_times_with_and_without_an_offset_in_one_case(tmp_path: Path) -> None:
    folder = tmp_path / "mixed"
    folder.mkdir()
    (folder / "mixed.yaml").write_text(
        "schema: 1\nlabel: Mixed clocks (invented)\ndraws:\n"
        "  - label: a\n    taken: 2026-11-21T09:10+01:00\n"
        "  - label: b\n    taken: 2026-11-20T09:10\n",
        encoding="utf-8",
    )
    (e,) = list_library(folder, tmp_path / "i.sqlite", workers=1)
    assert e.ok and e.label.startswith("Mixed clocks")
    assert e.first_taken == "2026-11-20T09:10" and e.latest_draw == "a"


def test_an_assessment_that_raises_does_not_stop_the_listing(cases_dir: Path) -> None:
    def broken_assess(*_a: object) -> None:
        raise ZeroDivisionError("boom")

    row = dict(
        zip(
            lib.ROW_FIELDS,
            summarize_file(cases_dir, "ckd-acidosis.yaml", 1, 1, assess_fn=broken_assess),
            strict=True,
        )
    )
    assert row["ok"] == 1 and row["label"]
    assert "assessment failed" in row["error"] and row["leading_id"] is None


def test_sorting(library: Path, tmp_path: Path) -> None:
    _write_broken(library)
    with open_library(library, _cache(tmp_path), workers=1) as idx:
        entries = idx.entries()
    by_date = sort_entries(entries, "date")
    dated = [e.latest_taken for e in by_date if e.ok]
    assert dated == sorted(dated, reverse=True)
    assert all(not e.ok for e in by_date[len(dated) :])
    labels = [e.label.lower() for e in sort_entries(entries, "label") if e.ok]
    assert labels == sorted(labels)
    assert sort_entries(entries, "file", reverse=True)[0].name == max(
        e.name for e in entries if e.ok
    )
    with pytest.raises(ValueError, match="unknown sort key"):
        sort_entries(entries, "size")


@pytest.mark.parametrize("name", sorted(p.name for p in DEMO.glob("*.yaml")))
def test_the_index_stores_what_assess_ranks(name: str) -> None:
    """The lean entry the index uses gives the results and ranking of the full assessment."""
    from workup.assess import assess, rank_case

    case = load_case(DEMO / name)
    full = assess(case)
    results, ranking = rank_case(case)
    assert [r.findings for r in results] == [r.findings for r in full.draws]

    def kept(calls: list) -> list:
        return [(c.id, c.name, c.verdict, c.score) for c in calls]

    # The index keeps the order, scores and verdicts, not each call's evidence in words.
    assert kept(ranking.calls) == kept(full.patterns) and ranking.calls
    assert ranking.next_tests == full.next_tests and ranking.notes == full.ranking_notes


def test_the_index_ranks_generated_cases_as_assess_does(tmp_path: Path) -> None:
    from workup.assess import assess, rank_case

    for path in generate_library(tmp_path, 120, seed=11):
        case = load_case(path)
        full = assess(case)
        _, ranking = rank_case(case)
        assert [(c.id, c.verdict, c.score) for c in ranking.calls] == [
            (c.id, c.verdict, c.score) for c in full.patterns
        ], path.name
        assert ranking.next_tests == full.next_tests and ranking.notes == full.ranking_notes


def test_every_status_has_its_own_letter_in_the_index() -> None:
    from workup.findings import Status

    assert {s.value for s in Status} | {"measured", "unusual"} == set(lib.STATUS_CODE)
    assert len(set(lib.STATUS_CODE.values())) == len(lib.STATUS_CODE)


def test_stored_numbers_round_trip_with_missing_values_and_unknown_names() -> None:
    draws = [
        {
            "label": "a",
            "taken": "2026-11-20T09:10",
            "during": None,
            "v": {
                "serum.sodium": (139.0, "measured"),
                "urine_anion_gap": (None, "needs_input"),
                "ttkg": (2.5, "not_valid"),
                "made_up_name": (1.5, "caution"),
            },
        },
        {"label": "b", "taken": None, "during": "bicarbonate_loading", "v": {}},
    ]
    text, numbers = lib.encode_draws(draws)
    a, b = lib.draws_from_json(text, numbers)
    assert a.values == {k: v for k, v in draws[0]["v"].items()}
    assert (a.label, a.taken, b.label, b.during, b.values) == (
        "a", "2026-11-20T09:10", "b", "bicarbonate_loading", {}
    )  # fmt: skip
    with pytest.raises(ValueError):
        lib.draws_from_json(text, numbers[:-8])


def test_a_damaged_stored_row_is_read_again_from_its_file(library: Path, tmp_path: Path) -> None:
    cache = tmp_path / "i.sqlite"
    with open_library(library, cache, workers=1) as index:
        name = index.entries()[0].name
        good = index.draws([name])[name]
        index.conn.execute("UPDATE cases SET numbers = x'00' WHERE name = ?", (name,))
        assert index.draws([name])[name] == good


def test_a_cold_listing_equals_the_listing_read_back_from_the_index(
    library: Path, tmp_path: Path
) -> None:
    cache = tmp_path / "i.sqlite"
    (library / "broken.yaml").write_text("label: [unclosed\n", encoding="utf-8")
    cold = list_library(library, cache, workers=1)  # rows straight from the files just read
    warm = list_library(library, cache, workers=1)  # rows read back from SQLite
    assert cold == warm and any(e.ok for e in cold) and any(not e.ok for e in cold)
