"""Properties of every calculator over any mix of present, missing and extreme values.

Values are drawn within each analyte's hard plausibility limits (what a case file can hold),
with the limits themselves over-represented; context flags, the gas sample, the loading test,
age and sex vary too. Example counts stay modest so the suite stays fast.
"""

from __future__ import annotations

import math

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from workup.analytes import CATALOGUE, KETONE_GRADES, Panel, all_analytes
from workup.context import Flag
from workup.findings import Finding, Status
from workup.indices import REGISTRY, compute_all
from workup.inputs import DrawInputs
from workup.model import GasSample, LoadingTest, Sex
from workup.quantity import convert, read_value

IDS = [calc.__name__ for calc in REGISTRY]


def _value(a) -> st.SearchStrategy[float]:
    if a.words:
        return st.sampled_from(sorted(set(KETONE_GRADES.values())))
    low, high = a.hard
    return st.one_of(
        st.sampled_from([float(low), float(high)]),
        st.floats(min_value=low, max_value=high, allow_nan=False, allow_infinity=False),
    )


def _panel(panel: Panel) -> st.SearchStrategy[dict[str, float]]:
    return st.fixed_dictionaries({}, optional={k: _value(a) for k, a in CATALOGUE[panel].items()})


draws = st.builds(
    DrawInputs,
    serum=_panel(Panel.serum),
    gas=_panel(Panel.blood_gas),
    urine=_panel(Panel.urine),
    sample=st.sampled_from(list(GasSample)),
    during=st.none() | st.sampled_from(list(LoadingTest)),
    age=st.none() | st.integers(min_value=0, max_value=120),
    sex=st.none() | st.sampled_from(list(Sex)),
    height_cm=st.none() | st.floats(min_value=20, max_value=272),
    context=st.frozensets(st.sampled_from(list(Flag)), max_size=4),
)


def _check(f: Finding) -> None:
    assert isinstance(f.status, Status)
    assert (f.value is None) == (f.status is Status.needs_input), (f.id, f.status, f.value)
    if f.value is None:
        assert f.needs and f.interpretation is None
    else:
        assert math.isfinite(f.value), f.id
        assert f.reasons, f"{f.id} gives no reason for its status"
        assert f.interpretation, f.id
    assert f.source, f.id
    for bound in (f.low, f.high):
        assert bound is None or math.isfinite(bound)


@settings(max_examples=200, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(draws)
def test_every_index_returns_a_sound_finding(x: DrawInputs):
    out = compute_all(x)
    assert list(out) == IDS
    for f in out.values():
        _check(f)


@settings(max_examples=100, deadline=None)
@given(st.builds(DrawInputs, serum=_panel(Panel.serum), gas=_panel(Panel.blood_gas)))
def test_dense_serum_and_gas(x: DrawInputs):
    # A second pass with only blood values, so the gas and serum branches meet more often.
    for f in compute_all(x).values():
        _check(f)


def test_full_draw_computes_every_index():
    # With every analyte present, nothing should be left needing input.
    values = {p: {k: a.usual[1] for k, a in CATALOGUE[p].items()} for p in Panel}
    x = DrawInputs(
        serum=values[Panel.serum], gas=values[Panel.blood_gas], urine=values[Panel.urine],
        age=50, sex=Sex.female, height_cm=165.0,
    )  # fmt: skip
    out = compute_all(x)
    assert [fid for fid, f in out.items() if f.status is Status.needs_input] == []


_numeric_units = [
    (a, u) for a in all_analytes() if not a.words for u in a.units if u.symbol
]  # fmt: skip


@settings(max_examples=200, deadline=None)
# Strictly inside the hard limits: at the limit itself float rounding in the factor may step out.
@given(st.sampled_from(_numeric_units), st.floats(min_value=0.001, max_value=0.999))
def test_read_then_convert_round_trips(pair, t):
    a, unit = pair
    low, high = a.hard
    written = (low + t * (high - low)) / unit.factor
    m = read_value(a, f"{written!r} {unit.symbol}", None)
    assert convert(a, m.canonical, unit.symbol) == pytest.approx(written, rel=1e-9)
