"""Schema migrations: schema-1 files open; the step mechanism is proved with a test-only 1 → 2.

The product stays at schema 1. The imagined schema 2 below (weights always stored in kg) exists
only in this test, to show that a registered step runs before validation.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from workup import model
from workup.caseio import (
    CaseFileError,
    case_from_bytes,
    case_from_data,
    case_from_text,
    load_case,
)
from workup.migrations import (
    MIGRATIONS,
    MigrationError,
    migrate,
    register,
    schema_of,
)

CASES = sorted((Path(__file__).resolve().parents[2] / "cases").glob("*.yaml"))

OLD = """\
schema: 1
label: Invented migration case
patient: {age: 50, weight: 154 lb}
draws:
  - label: one
    serum: {sodium: 140}
"""


def _kg_weights(data):
    """Test-only step 1 → 2: the imagined schema 2 writes every weight in kg."""
    patient = data.get("patient") or {}
    w = patient.get("weight")
    if isinstance(w, str) and w.strip().lower().endswith(("lb", "lbs")):
        pounds = float(w.split()[0])
        patient["weight"] = f"{round(pounds * 0.45359237, 1)} kg"  # the exact pound (by definition)
    data["schema"] = 2
    return data


def test_the_product_is_at_schema_1_with_no_steps():
    assert model.SCHEMA_VERSION == 1
    assert MIGRATIONS == {}


@pytest.mark.parametrize("path", CASES, ids=lambda p: p.name)
def test_every_schema_1_demo_case_opens_unchanged(path):
    text = path.read_text()
    assert case_from_text(text, str(path)) == case_from_text(text)


def test_a_missing_schema_means_1():
    assert schema_of({"label": "x"}) == 1
    assert case_from_text("label: x\n").schema_version == 1


@pytest.mark.parametrize("bad", [0, -1, "1", True, 1.5, None])
def test_migration_refuses_a_schema_that_is_not_a_whole_number(bad):
    with pytest.raises(MigrationError):
        schema_of({"schema": bad})


@pytest.mark.parametrize("bad", [0, -1, 1.5, None])
def test_the_loader_refuses_a_bad_schema_with_a_case_file_error(bad):
    with pytest.raises(CaseFileError, match="schema"):
        case_from_text(f"schema: {bad!r}\nlabel: x\n".replace("None", "null"))


def test_a_newer_schema_asks_for_an_upgrade():
    with pytest.raises(CaseFileError, match="upgrade workup"):
        case_from_text("schema: 2\nlabel: x\n")
    with pytest.raises(MigrationError, match="upgrade"):
        migrate({"schema": 3}, target=2)


def test_a_test_step_1_to_2_runs_before_validation(monkeypatch):
    steps: dict = {}
    register(1, steps)(_kg_weights)
    monkeypatch.setattr(model, "SCHEMA_VERSION", 2)
    case = case_from_text(OLD, "old.yaml", registry=steps)
    assert case.schema_version == 2
    assert case.patient.weight == "69.9 kg"
    assert case.patient.age == 50 and case.draws[0].serum.sodium.value == 140
    same = case_from_bytes(OLD.encode(), "old.yaml", registry=steps)
    assert same == case
    data = {"schema": 1, "label": "d", "patient": {"weight": "10 lb"}}
    assert case_from_data(data, registry=steps).patient.weight == "4.5 kg"
    assert data["patient"]["weight"] == "10 lb"  # the input is not changed


def test_steps_chain_and_must_each_advance_one_version():
    steps: dict = {}
    register(1, steps)(lambda d: {**d, "schema": 2, "a": 1})
    register(2, steps)(lambda d: {**d, "schema": 3, "b": d["a"] + 1})
    assert migrate({"schema": 1}, target=3, registry=steps) == {"schema": 3, "a": 1, "b": 2}
    assert migrate({"schema": 2, "a": 5}, target=3, registry=steps)["b"] == 6
    with pytest.raises(MigrationError, match="from schema 3"):
        migrate({"schema": 1}, target=4, registry=steps)
    bad: dict = {}
    register(1, bad)(lambda d: {**d, "schema": 3})
    with pytest.raises(MigrationError, match="not 2"):
        migrate({"schema": 1}, target=2, registry=bad)
    with pytest.raises(ValueError, match="already registered"):
        register(1, bad)(lambda d: d)


def test_a_missing_step_is_a_clean_case_file_error(monkeypatch):
    monkeypatch.setattr(model, "SCHEMA_VERSION", 2)
    with pytest.raises(CaseFileError, match="no migration from schema 1"):
        case_from_text(OLD, registry={})


def test_load_case_of_a_demo_file_is_schema_1():
    assert all(load_case(p).schema_version == 1 for p in CASES)
