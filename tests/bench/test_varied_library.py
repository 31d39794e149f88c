"""The second library shape: deterministic, shaped as documented, and every file a valid case."""

from __future__ import annotations

import statistics

import pytest
import yaml

from bench.varied_library import (
    SEED,
    case_text,
    generate_varied_library,
    number_text,
    plan_case,
    render_case,
)
from workup.analytes import UnitSystem
from workup.caseio import case_from_text

N = 300  # enough for every draw count and both unit systems to turn up many times


@pytest.fixture(scope="module")
def texts() -> list[str]:
    return [case_text(i) for i in range(N)]


def test_the_same_seed_gives_the_same_files_and_another_seed_others(tmp_path):
    assert case_text(7) == case_text(7, SEED)
    assert case_text(7, seed=SEED + 1) != case_text(7)
    # A case depends on its index only, not on how large the library is.
    small = generate_varied_library(tmp_path / "a", 3)
    large = generate_varied_library(tmp_path / "b", 5)
    assert [p.read_bytes() for p in small] == [p.read_bytes() for p in large[:3]]
    assert [p.name for p in small] == ["ward-00000.yaml", "ward-00001.yaml", "ward-00002.yaml"]


def test_every_file_is_a_valid_case_with_the_planned_draws_and_units(texts):
    for i, text in enumerate(texts):
        plan = plan_case(i)
        case = case_from_text(text, f"<ward-{i}>")
        assert len(case.draws) == len(plan.draws)
        assert case.units is plan.system
        assert case.label.endswith(f"#{i:05d}")
        assert [d.label for d in case.draws] == [d.label for d in plan.draws]


def test_the_shape_is_unlike_the_demo_library(texts):
    plans = [plan_case(i) for i in range(N)]
    draws = [len(p.draws) for p in plans]
    assert set(draws) == {1, 2, 3, 4, 5, 6}
    # Shares over more plans (planning is cheap): SI_SHARE 0.3 and BLOCK_SHARE 0.4, within
    # about three standard errors of 2,000 draws.
    many = [plan_case(i) for i in range(2000)]
    assert 0.27 < sum(p.system is UnitSystem.si for p in many) / 2000 < 0.33
    assert 0.37 < sum(p.block for p in many) / 2000 < 0.43
    # Notes of a few lines in every file, written as a literal block.
    assert all("notes: |\n" in t for t in texts)
    assert all(len(p.notes) >= 2 for p in plans)
    assert statistics.median(len(p.notes) for p in plans) >= 3
    # Comments beyond the opening line in most files.
    comments = [sum(1 for line in t.splitlines() if "#" in line and '"' not in line) for t in texts]
    assert sum(c >= 2 for c in comments) > N // 2
    sizes = [len(t.encode()) for t in texts]
    assert max(sizes) > 5 * min(sizes)


def test_si_and_conventional_files_of_one_case_hold_the_same_quantities():
    for i in range(40):
        plan = plan_case(i)
        conv = case_from_text(render_case(plan, UnitSystem.conventional))
        si = case_from_text(render_case(plan, UnitSystem.si))
        for a, b in zip(conv.draws, si.draws, strict=True):
            for panel in ("serum", "blood_gas", "urine"):
                x, y = a.panel(panel).measurements(), b.panel(panel).measurements()
                if "urea_nitrogen" in x:  # an SI laboratory reports urea, not urea nitrogen
                    assert "urea" in y and "urea_nitrogen" not in y
                    # mg/dL of nitrogen -> mmol/L of urea (two N, 28.01 g/mol, per urea).
                    assert y["urea"].canonical == pytest.approx(
                        x["urea_nitrogen"].canonical * 10 / 28.01, rel=0.01
                    )
                    del x["urea_nitrogen"], y["urea"]
                assert x.keys() == y.keys()
                for key in x:
                    # Three significant figures in each unit: within 1 %, or both zero.
                    assert y[key].canonical == pytest.approx(x[key].canonical, rel=0.01, abs=1e-9)


def test_the_c_loader_reads_the_files_with_their_notes_as_several_lines(texts):
    loader = getattr(yaml, "CSafeLoader", yaml.SafeLoader)
    data = yaml.load(texts[0], Loader=loader)
    assert data["notes"].count("\n") == len(plan_case(0).notes)


def test_numbers_carry_three_significant_figures():
    assert number_text(139.4) == "139"
    assert number_text(7.314) == "7.31"
    assert number_text(0.8456) == "0.846"
    assert number_text(0.0123) == "0.012"  # at most three decimals
    assert number_text(0) == "0"
