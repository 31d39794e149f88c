"""Statistics of the harness, checked against numpy's own percentile and by hand."""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st

from bench.stats import alternating_order, paired_ratios, percentile, summarize

finite = st.floats(min_value=-1e6, max_value=1e6, allow_nan=False)


@given(st.lists(finite, min_size=1, max_size=50), st.floats(min_value=0, max_value=100))
def test_percentile_matches_numpy_linear(values, q):
    assert percentile(values, q) == pytest.approx(np.percentile(values, q), rel=1e-9, abs=1e-6)


def test_summary_of_known_values():
    s = summarize([5.0, 1.0, 3.0, 2.0, 4.0])
    assert (s.n, s.median, s.q1, s.q3, s.low, s.high) == (5, 3.0, 2.0, 4.0, 1.0, 5.0)
    # p99 of 1..5 by linear interpolation: position 0.99 * 4 = 3.96 -> 4 + 0.96.
    assert s.p99 == pytest.approx(4.96)


def test_even_count_median_is_the_mean_of_the_middle_two():
    assert summarize([1.0, 2.0, 10.0, 20.0]).median == 6.0


def test_empty_and_out_of_range_are_refused():
    with pytest.raises(ValueError):
        summarize([])
    with pytest.raises(ValueError):
        percentile([1.0], 101)


def test_ratios_are_pair_by_pair_not_of_medians():
    # A slow moment hits both members of pair 2; pairing keeps the ratio at 1.2 throughout.
    app, base = [1.2, 2.4, 1.2], [1.0, 2.0, 1.0]
    assert paired_ratios(app, base) == pytest.approx([1.2, 1.2, 1.2])


def test_ratios_need_matching_positive_baselines():
    with pytest.raises(ValueError):
        paired_ratios([1.0, 2.0], [1.0])
    with pytest.raises(ValueError):
        paired_ratios([1.0], [0.0])


def test_turns_alternate_who_goes_first():
    order = alternating_order(4)
    assert order[0] == ("measured", "baseline")
    assert order[1] == ("baseline", "measured")
    assert [o[0] for o in order].count("measured") == 2
