"""The recompute benchmark edits a real value, and the assessment sees the edit."""

from __future__ import annotations

import pytest

from bench.recompute import apply_edit, pick_edit, run
from workup.assess import assess
from workup.caseio import load_case


def test_edit_changes_the_value_and_the_recompute_sees_it(cases_dir):
    case = load_case(cases_dir / "distal-rta-classic.yaml")  # invented demo case
    edit = pick_edit(case)
    assert edit is not None and edit.key == "bicarbonate" and edit.draw is case.draws[-1]
    apply_edit(case, edit, 1)
    nudged = case.draws[-1].serum.bicarbonate.canonical
    gap_nudged = assess(case).indices["anion_gap"].value
    apply_edit(case, edit, 0)
    original = case.draws[-1].serum.bicarbonate.canonical
    assert nudged != original
    # Anion gap = Na - (Cl + HCO3) (common practice; the contract in docs/indices.md), so it
    # moves by exactly the change in bicarbonate.
    gap_original = assess(case).indices["anion_gap"].value
    assert gap_original - gap_nudged == pytest.approx(nudged - original)


def test_run_times_every_demo_case(cases_dir):
    r = run(cases_dir, sweeps=2, warmup=1)
    n = len(list(cases_dir.glob("*.yaml")))
    assert r.cases + len(r.skipped) == n
    assert len(r.per_case_ms) == 2 * r.cases and len(r.sweep_ms) == 2
    assert all(t > 0 for t in r.per_case_ms)
