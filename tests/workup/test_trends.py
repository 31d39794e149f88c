"""Trends and two-draw comparison on the multi-draw demo cases (invented scenarios).

Expected numbers are the values written in the case files; the anion gap is Na − (Cl + HCO3)
(common practice), worked from those values beside each check.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from workup.assess import assess
from workup.caseio import load_case
from workup.trends import MEASURED, MISSING, POINT_MARK, POINT_WORD, change_status, compare, trends


def _series(case_file: Path) -> dict[str, list[tuple[str, float | None, str]]]:
    case = load_case(case_file)
    return {s.key: [(p.draw, p.value, p.status) for p in s.points] for s in trends(case)}


def test_distal_rta_trends(cases_dir: Path) -> None:
    s = _series(cases_dir / "distal-rta-classic.yaml")
    assert list(s) == [
        "serum.bicarbonate",
        "serum.potassium",
        "blood_gas.ph",
        "anion_gap",
        "urine.ph",
    ]
    assert s["serum.bicarbonate"] == [
        ("baseline", 15.0, MEASURED),
        ("bicarbonate 3 h", 23.0, MEASURED),
    ]
    assert [v for _, v, _ in s["serum.potassium"]] == [2.9, 3.2]
    assert [v for _, v, _ in s["blood_gas.ph"]] == [7.31, 7.40]
    # AG = Na − (Cl + HCO3) (common practice): 139 − (116 + 15) = 8; 141 − (108 + 23) = 10.
    assert [v for _, v, _ in s["anion_gap"]] == [8.0, 10.0]
    assert [v for _, v, _ in s["urine.ph"]] == [6.8, 7.8]


def test_urine_ph_during_loading_carries_the_index_status(cases_dir: Path) -> None:
    case = load_case(cases_dir / "distal-rta-classic.yaml")
    a = assess(case)
    uph = next(s for s in trends(case, a) if s.key == "urine.ph")
    loading = uph.points[-1]
    assert loading.during == "bicarbonate_loading"
    found = a.draws[-1].findings["urine_ph"]
    assert loading.status == found.status.value
    if found.status.value != "ok":
        assert loading.note == found.reasons[0]


def test_proximal_rta_trends(cases_dir: Path) -> None:
    s = _series(cases_dir / "proximal-rta-fanconi.yaml")
    assert [v for _, v, _ in s["serum.bicarbonate"]] == [17.0, 21.0]
    assert [v for _, v, _ in s["serum.potassium"]] == [3.3, 3.0]
    # AG = Na − (Cl + HCO3) (common practice): 138 − (112 + 17) = 9; 140 − (105 + 21) = 14.
    assert [v for _, v, _ in s["anion_gap"]] == [9.0, 14.0]
    assert [v for _, v, _ in s["urine.ph"]] == [5.3, 7.8]


def test_a_single_draw_case_and_missing_values(cases_dir: Path) -> None:
    case = load_case(cases_dir / "ckd-acidosis.yaml")
    for s in trends(case):
        assert len(s.points) == 1
        p = s.points[0]
        assert (p.value is None) == (p.status in (MISSING, "needs_input"))
        assert p.status in POINT_WORD and p.status in POINT_MARK
    with pytest.raises(KeyError, match="two draws"):
        compare(case)


def test_compare_baseline_with_loading(cases_dir: Path) -> None:
    case = load_case(cases_dir / "distal-rta-classic.yaml")
    c = compare(case)
    assert (c.a, c.b) == ("baseline", "bicarbonate 3 h")
    rows = {r.key: r for r in c.rows}
    gap = rows["anion_gap"]
    assert gap.a[0] == 8.0 and gap.b[0] == 10.0 and gap.change == pytest.approx(2.0)
    hco3 = rows["serum.bicarbonate"]
    assert hco3.change == pytest.approx(8.0) and not hco3.index
    for r in c.rows:
        # Every number travels with a status; a change is no more valid than its weaker end.
        assert r.a[1] in POINT_WORD and r.b[1] in POINT_WORD and r.change_status in POINT_WORD
        if r.change is None:
            assert r.change_status == "needs_input"
        else:
            assert r.change == pytest.approx(r.b[0] - r.a[0])
        if "not_valid" in (r.a[1], r.b[1]) and r.change is not None:
            assert r.change_status == "not_valid"
    # Indices come first, in display order, then measured values.
    kinds = [r.index for r in c.rows]
    assert kinds == sorted(kinds, reverse=True)
    back = compare(case, "bicarbonate 3 h", "baseline")
    assert {r.key: r.change for r in back.rows}["anion_gap"] == pytest.approx(-2.0)
    with pytest.raises(KeyError, match="no draw labelled"):
        compare(case, "baseline", "day 9")


@pytest.mark.parametrize(
    ("a", "b", "expected"),
    [
        ("ok", "ok", "ok"),
        ("ok", "caution", "caution"),
        ("caution", "not_valid", "not_valid"),
        ("measured", "unusual", "caution"),
        ("measured", "measured", "measured"),
        ("ok", "missing", "needs_input"),
        ("needs_input", "not_valid", "needs_input"),
    ],
)
def test_change_status_is_the_weaker_end(a: str, b: str, expected: str) -> None:
    assert change_status(a, b) == expected
    assert change_status(b, a) == expected
