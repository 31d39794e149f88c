"""Adults unchanged: the children's reference values must not move any adult finding.

``tests/workup/golden/adult_findings.json`` was written from the code before the paediatric
reference values were added (commit 31abcf3) and is compared field by field: status, value,
reading, reasons, band, borderline flag and extras. It covers every draw of every adult demo
case (invented scenarios) and invented inputs at ages 18, 40, 75 and unknown that reach the
indices the paediatric values touch (TmP/GFR, TTKG, urine K/creatinine, the readings "during an
acidosis"). Regenerate only when an adult change is intended, with

    WORKUP_UPDATE_GOLDEN=1 .venv/bin/python -m pytest tests/workup/test_paediatric_adults.py -q
"""

from __future__ import annotations

import json
import math
import os
from pathlib import Path
from typing import Any

import pytest

from workup.caseio import load_case
from workup.findings import Finding
from workup.indices import compute_all
from workup.inputs import DrawInputs, inputs_for
from workup.model import Sex

ROOT = Path(__file__).resolve().parents[2]
GOLDEN = Path(__file__).resolve().parent / "golden" / "adult_findings.json"
UPDATE = os.environ.get("WORKUP_UPDATE_GOLDEN") == "1"

# Invented inputs (not patients): a low, a mid and a high TmP/GFR; hypo- and hyperkalemia for
# TTKG and urine K/creatinine; a low bicarbonate so the urine readings are "during an acidosis".
_SERUM = {"sodium": 138.0, "chloride": 112.0, "bicarbonate": 16.0, "creatinine": 80.0,
          "osmolality": 290.0}  # fmt: skip
_URINE = {"ph": 6.4, "sodium": 60.0, "chloride": 50.0, "creatinine": 8000.0,
          "osmolality": 450.0, "urea": 200.0, "glucose": 0.0}  # fmt: skip
SYNTHETIC = {
    "tmp_low": ({"phosphate": 0.6}, {"phosphate": 12.0}),
    "tmp_mid": ({"phosphate": 1.1}, {"phosphate": 8.0}),
    "tmp_high": ({"phosphate": 1.6}, {"phosphate": 4.0}),
    "hypokalemia": ({"potassium": 2.8}, {"potassium": 35.0}),
    "hyperkalemia": ({"potassium": 6.1}, {"potassium": 20.0}),
}
AGES = (18, 40, 75, None)


def _adult_case_inputs() -> dict[str, DrawInputs]:
    out = {}
    for path in sorted((ROOT / "cases").glob("*.yaml")):
        case = load_case(path)
        if case.patient.age is not None and case.patient.age < 18:
            continue
        for i, draw in enumerate(case.draws):
            out[f"{path.stem}[{i}]"] = inputs_for(case, draw)
    return out


def _synthetic_inputs() -> dict[str, DrawInputs]:
    out = {}
    for name, (serum, urine) in SYNTHETIC.items():
        for age in AGES:
            out[f"{name}@{age}"] = DrawInputs(
                serum={**_SERUM, **serum}, urine={**_URINE, **urine}, age=age, sex=Sex.female
            )
    return out


ALL = {**_adult_case_inputs(), **_synthetic_inputs()}


def _plain(v: Any) -> Any:
    """JSON-safe, rounded to 9 places so float noise cannot fail the comparison."""
    if isinstance(v, float):
        return round(v, 9) if math.isfinite(v) else str(v)
    if isinstance(v, dict):
        return {str(k): _plain(x) for k, x in sorted(v.items())}
    if isinstance(v, (list, tuple)):
        return [_plain(x) for x in v]
    return v if v is None or isinstance(v, (str, int, bool)) else str(v)


def _record(f: Finding) -> dict[str, Any]:
    return _plain({
        "status": str(f.status), "value": f.value, "interpretation": f.interpretation,
        "reasons": list(f.reasons), "low": f.low, "high": f.high, "borderline": f.borderline,
        "needs": list(f.needs), "source": f.source, "extra": f.extra,
    })  # fmt: skip


def _now() -> dict[str, dict[str, Any]]:
    return {k: {fid: _record(f) for fid, f in compute_all(x).items()} for k, x in ALL.items()}


def test_golden_covers_every_adult_input():
    if UPDATE:
        GOLDEN.write_text(json.dumps(_now(), indent=1, ensure_ascii=False) + "\n", "utf-8")
    golden = json.loads(GOLDEN.read_text("utf-8"))
    assert sorted(golden) == sorted(ALL)
    # The synthetic rows must reach the indices the children's values change.
    assert golden["tmp_low@40"]["tmp_gfr"]["interpretation"] == "low"
    assert golden["tmp_high@40"]["tmp_gfr"]["interpretation"] == "normal"
    assert golden["hyperkalemia@40"]["ttkg"]["value"] is not None


@pytest.mark.parametrize("key", sorted(ALL))
def test_adult_findings_are_unchanged(key: str) -> None:
    golden = json.loads(GOLDEN.read_text("utf-8"))[key]
    now = {fid: _record(f) for fid, f in compute_all(ALL[key]).items()}
    assert now == golden
