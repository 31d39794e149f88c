"""TTKG and urine K/creatinine against published values, with every validity condition."""

from __future__ import annotations

import pytest

from workup.context import Flag
from workup.findings import Status
from workup.indices import potassium
from workup.inputs import DrawInputs


def test_ttkg_porteous_2011():
    # Porteous et al., J Med Case Rep 2011;5:114, Table 4: UNa 59, UK 38, urine osm 405,
    # plasma K 5.1, plasma osm 288 → TTKG 5.3; both validity conditions pass; with hyperkalemia
    # it reads low (type 4 RTA in the authors' case), on the 5–7 margin of the published
    # hyperkalemia cut-offs (Choi & Ziyadeh, JASN 2008, from memory), so borderline.
    x = DrawInputs(
        serum={"potassium": 5.1, "osmolality": 288},
        urine={"sodium": 59, "potassium": 38, "osmolality": 405},
    )
    f = potassium.ttkg(x)
    assert f.value == pytest.approx(5.30, abs=0.005)
    assert f.extra["kalemia"] == "hyper" and f.interpretation == "low (borderline)"
    assert f.borderline
    # Valid, with the standing caution of the Kamel & Halperin critique (from memory).
    assert f.status is Status.caution
    assert any("Kamel & Halperin" in r for r in f.reasons)
    assert not any("below" in r and "osmolality" in r for r in f.reasons)


def ttkg_draw(value: float, k: float, **urine) -> DrawInputs:
    """Urine and plasma osmolality equal (300), so TTKG = urine K / plasma K."""
    return DrawInputs(
        serum={"potassium": k, "osmolality": 300},
        urine={"sodium": 60, "potassium": value * k, "osmolality": 300, **urine},
    )


@pytest.mark.parametrize(
    ("low", "mean", "high", "k", "kalemia", "reading"),
    [
        # Ethier et al., AJKD 1990, mean ± SD: non-renal hypokalemia 0.9 ± 0.2
        (0.7, 0.9, 1.1, 3.0, "hypo", "low"),
        # Ethier 1990: hypokalemia with hyperaldosteronism 6.7 ± 1.3
        (5.4, 6.7, 8.0, 3.0, "hypo", "high"),
        # Ethier 1990: after 50 mmol KCl 13.1 ± 3.8 (a potassium load: read as hyperkalemia)
        (9.3, 13.1, 16.9, 5.5, "hyper", "high"),
    ],
)
def test_ttkg_ethier_group_ranges(low, mean, high, k, kalemia, reading):
    for value in (low, mean, high):
        f = potassium.ttkg(ttkg_draw(value, k))
        assert f.value == pytest.approx(value)
        word = (f.interpretation or "").removesuffix(" (borderline)")
        assert (f.extra["kalemia"], word) == (kalemia, reading)
        assert f.status is Status.caution  # the standing critique, nothing more


@pytest.mark.parametrize(
    ("serum", "urine", "words"),
    [
        # Ethier 1990: valid only when urine osm ≥ plasma osm and urine Na > 25.
        ({"potassium": 5.5, "osmolality": 300}, {"sodium": 60, "potassium": 30, "osmolality": 250},
         "below plasma"),
        ({"potassium": 5.5, "osmolality": 300}, {"sodium": 15, "potassium": 30, "osmolality": 500},
         "urine sodium 15"),
    ],
)  # fmt: skip
def test_ttkg_validity_conditions(serum, urine, words):
    f = potassium.ttkg(DrawInputs(serum=serum, urine=urine))
    assert f.status is Status.not_valid and words in f.reasons[0]


def test_ttkg_calculates_plasma_osmolality_and_says_so():
    x = DrawInputs(
        serum={"potassium": 5.5, "sodium": 140, "glucose": 5, "urea": 5},
        urine={"sodium": 60, "potassium": 30, "osmolality": 580},
    )
    f = potassium.ttkg(x)
    assert f.extra["plasma_osmolality_from"] == "calculated"
    assert f.extra["plasma_osmolality"] == pytest.approx(290)
    assert f.value == pytest.approx((30 / 5.5) / (580 / 290))
    assert any("calculated" in r for r in f.reasons)


def test_ttkg_needs_plasma_osmolality_or_its_parts():
    x = DrawInputs(serum={"potassium": 5.5}, urine={"potassium": 30, "osmolality": 580})
    f = potassium.ttkg(x)
    assert f.status is Status.needs_input and "serum.osmolality" in f.needs


def test_ttkg_without_urine_sodium_is_a_caution_with_that_reason():
    x = DrawInputs(
        serum={"potassium": 5.5, "osmolality": 300}, urine={"potassium": 30, "osmolality": 500}
    )
    f = potassium.ttkg(x)
    assert f.status is Status.caution and "urine sodium not given" in f.reasons[0]


@pytest.mark.parametrize("flag", [Flag.potassium_sparing_diuretic, Flag.trimethoprim])
def test_ttkg_drug_caution(flag):
    x = ttkg_draw(4.0, 5.8)
    f = potassium.ttkg(DrawInputs(serum=x.serum, urine=x.urine, context=frozenset({flag})))
    assert any(r.startswith("on ") for r in f.reasons)


@pytest.mark.parametrize(
    ("uk", "k", "kalemia", "reading", "status"),
    [
        # Halperin, Afr J Nephrol 2017: < 1.5 appropriate in hypokalemia; > 20 in hyperkalemia.
        (10, 3.0, "hypo", "low", Status.ok),  # 10 / 10 mmol = 1.0
        (30, 3.0, "hypo", "high", Status.ok),  # 3.0
        (150, 5.8, "hyper", "low", Status.ok),  # 15
        (250, 5.8, "hyper", "high", Status.ok),  # 25
        (30, 4.2, "normal", "high", Status.caution),
    ],
)
def test_urine_k_creatinine(uk, k, kalemia, reading, status):
    x = DrawInputs(serum={"potassium": k}, urine={"potassium": uk, "creatinine": 10000})
    f = potassium.urine_potassium_creatinine_ratio(x)
    assert f.value == pytest.approx(uk / 10)
    assert (f.extra["kalemia"], f.interpretation, f.status) == (kalemia, reading, status)
