"""Every finding the core computes has a short display name that fits the 80-column table."""

from __future__ import annotations

from pathlib import Path

from workup.assess import assess
from workup.caseio import load_case
from workup.indices import REGISTRY
from workup.short_names import SHORT_NAME_WIDTH, SHORT_NAMES, short_name

CASES = Path(__file__).resolve().parents[2] / "cases"


def _core_ids() -> dict[str, str]:
    # Every calculator returns one finding whatever the draw holds, so any demo case lists them all.
    ids: dict[str, str] = {}
    for path in sorted(CASES.glob("*.yaml")):
        for f in assess(load_case(path)).indices.values():
            ids[f.id] = f.name
    return ids


def test_every_finding_id_has_a_short_name_of_bounded_width() -> None:
    ids = _core_ids()
    assert len(ids) == len(REGISTRY)
    for fid in ids:
        assert fid in SHORT_NAMES, fid
        assert 0 < len(SHORT_NAMES[fid]) <= SHORT_NAME_WIDTH, fid


def test_short_names_are_distinct_and_unknown_ids_keep_their_name() -> None:
    assert len(set(SHORT_NAMES.values())) == len(SHORT_NAMES)
    assert short_name("not_a_finding", "Full name") == "Full name"
