"""The calculators keep the contract of docs/indices.md: ids, order, units, interpretation words."""

from __future__ import annotations

import re
from pathlib import Path

import pytest
from hypothesis import given, settings

from tests.workup.test_calculator_properties import draws
from workup.caseio import load_case
from workup.findings import Finding
from workup.indices import REGISTRY, compute_all
from workup.inputs import DrawInputs, inputs_for

ROOT = Path(__file__).resolve().parents[2]
DOC = ROOT / "docs" / "indices.md"
KDIGO = {"G1", "G2", "G3a", "G3b", "G4", "G5"}


def _contract() -> dict[str, tuple[str, set[str]]]:
    rows: dict[str, tuple[str, set[str]]] = {}
    previous: set[str] = set()
    # Only the first table is the contract; later tables (validity) reuse the id column.
    text = DOC.read_text(encoding="utf-8").split("\n## ")[0]
    for line in text.splitlines():
        m = re.match(r"^\| `([a-z0-9_]+)` \| ([^|]*) \| ([^|]*) \|", line)
        if not m:
            continue
        fid, unit, words = m.groups()
        unit = unit.strip()
        unit = "" if unit.startswith('""') else unit
        found = set(re.findall(r"`([^`]+)`", words))
        if fid == "egfr":
            found = KDIGO
        elif not found and words.strip().startswith("same"):
            found = previous
        rows[fid] = (unit, found)
        previous = found
    return rows


CONTRACT = _contract()


def test_registry_holds_every_documented_id_in_order():
    assert [c.__name__ for c in REGISTRY] == list(CONTRACT)


def _check(f: Finding) -> None:
    unit, words = CONTRACT[f.id]
    assert f.unit == unit, f.id
    if f.value is None:
        assert f.interpretation is None
    else:
        assert f.interpretation in words, (f.id, f.interpretation)


@pytest.mark.parametrize("path", sorted((ROOT / "cases").glob("*.yaml")), ids=lambda p: p.stem)
def test_demo_cases_use_only_contract_words(path):
    case = load_case(path)
    for d in case.draws:
        for f in compute_all(inputs_for(case, d)).values():
            _check(f)


@settings(max_examples=100, deadline=None)
@given(draws)
def test_random_draws_use_only_contract_words(x):
    for f in compute_all(x).values():
        _check(f)


def test_names_fit_a_terminal_column():
    # The text outputs give a name 34 columns; a longer name pushes the status off the line.
    for f in compute_all(DrawInputs()).values():
        assert len(f.name) <= 34, f.name
