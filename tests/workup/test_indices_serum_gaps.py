"""Serum gaps: anion gap, albumin correction, delta ratio and osmolal gap, each against its source."""

from __future__ import annotations

import pytest

from workup.context import Flag
from workup.findings import Status
from workup.indices import serum_gaps
from workup.inputs import UREA_MMOL_PER_BUN_MG_DL, DrawInputs
from workup.settings import resolve


def serum(**values) -> DrawInputs:
    return DrawInputs(serum=values)


@pytest.mark.parametrize(
    ("na", "cl", "hco3", "value", "reading"),
    [(140, 106, 24, 10, "normal"), (140, 100, 12, 28, "high"), (140, 115, 24, 1, "low")],
)
def test_anion_gap(na, cl, hco3, value, reading):
    # AG = Na − (Cl + HCO3), common practice; upper limit 14 a setting (Kraut & Madias, CJASN 2007).
    f = serum_gaps.anion_gap(serum(sodium=na, chloride=cl, bicarbonate=hco3))
    assert f.value == pytest.approx(value) and f.interpretation == reading


def test_albumin_correction_figge():
    # Figge, Jabor, Kazda & Fencl, Crit Care Med 1998: + 0.25 × (40 − albumin g/L);
    # AG 10 with albumin 20 g/L (2.0 g/dL, normal 4.0) → 15 (arithmetic [D]).
    f = serum_gaps.anion_gap_albumin_corrected(
        serum(sodium=140, chloride=106, bicarbonate=24, albumin=20)
    )
    assert f.value == pytest.approx(15.0) and f.extra["uncorrected"] == pytest.approx(10)
    assert f.interpretation == "high" and f.status is Status.ok


# --- Delta ratio (bands of Brandis, Acid-Base Physiology) -----------------------------------


@pytest.mark.parametrize(
    ("chloride", "value", "reading"),
    [
        (112, 0.0, "pure_normal_gap"),  # AG 10: no rise over the mean of 10
        (109, 0.3, "pure_normal_gap"),  # < 0.4
        (106, 0.6, "mixed_high_and_normal_gap"),  # 0.4–0.8
        (100, 1.2, "high_gap"),  # 0.8–2
        (90, 2.2, "high_gap_plus_alkalosis"),  # > 2
    ],
)
def test_delta_ratio_bands(chloride, value, reading):
    x = serum(sodium=136, chloride=chloride, bicarbonate=14, albumin=40)
    f = serum_gaps.delta_ratio(x)
    assert f.value == pytest.approx(value)
    assert (f.status, f.interpretation) == (Status.ok, reading)


def test_delta_ratio_uses_the_albumin_corrected_gap():
    # Albumin 20 g/L adds 5 to the gap (Figge 1998): 0.0 becomes 0.5, "mixed" instead of "pure".
    f = serum_gaps.delta_ratio(serum(sodium=136, chloride=112, bicarbonate=14, albumin=20))
    assert f.value == pytest.approx(0.5) and f.interpretation == "mixed_high_and_normal_gap"


def test_delta_ratio_needs_albumin():
    f = serum_gaps.delta_ratio(serum(sodium=136, chloride=112, bicarbonate=14))
    assert f.status is Status.needs_input and f.needs == ("serum.albumin",)


def test_delta_ratio_not_valid_when_bicarbonate_not_low():
    f = serum_gaps.delta_ratio(serum(sodium=140, chloride=104, bicarbonate=23, albumin=40))
    assert f.status is Status.not_valid and "not low" in f.reasons[0]


def test_delta_ratio_not_valid_when_bicarbonate_fell_less_than_the_setting():
    # Common practice: the ratio is not read when HCO3 fell < 4. A raised lower limit lets
    # HCO3 21 count as low, so only the size of the fall makes it not valid.
    s = resolve({"bicarbonate_low": 25.0})
    f = serum_gaps.delta_ratio(
        DrawInputs(
            serum={"sodium": 140, "chloride": 105, "bicarbonate": 21, "albumin": 40}, settings=s
        )
    )
    assert f.status is Status.not_valid and "fallen only 3" in f.reasons[0]


def test_delta_ratio_zero_fall_never_raises():
    s = resolve({"bicarbonate_low": 30.0})
    f = serum_gaps.delta_ratio(
        DrawInputs(
            serum={"sodium": 140, "chloride": 100, "bicarbonate": 24, "albumin": 40}, settings=s
        )
    )
    assert f.status is Status.not_valid and f.value is not None


# --- Serum osmolal gap ------------------------------------------------------------------------


@pytest.mark.parametrize(
    ("measured", "ethanol", "gap", "reading"),
    [
        (300, None, 10, "normal"),  # 2 × 140 + 5 + 5 = 290
        (320, None, 30, "raised"),
        # Purssell's 1.25 × ethanol (mmol/L), as tabulated by Lynd et al., BMC Emerg Med 2008:
        (320, 16, 10, "normal"),
    ],
)
def test_serum_osmolal_gap(measured, ethanol, gap, reading):
    values = {"sodium": 140, "glucose": 5, "urea": 5, "osmolality": measured}
    if ethanol is not None:
        values["ethanol"] = ethanol
    f = serum_gaps.serum_osmolal_gap(DrawInputs(serum=values))
    assert f.value == pytest.approx(gap) and f.interpretation == reading


def test_serum_osmolal_gap_from_bun():
    # BUN 14 mg/dL × 10/28.01 = 5.0 mmol/L urea (2 N per urea; Lynd et al. 2008 use BUN/2.8).
    x = DrawInputs(serum={"sodium": 140, "glucose": 5, "urea_nitrogen": 14, "osmolality": 300})
    f = serum_gaps.serum_osmolal_gap(x)
    assert f.value == pytest.approx(300 - 285 - 14 * UREA_MMOL_PER_BUN_MG_DL)
    assert f.value == pytest.approx(10.0, abs=0.01)


def test_raised_gap_without_ethanol_is_a_caution():
    f = serum_gaps.serum_osmolal_gap(
        DrawInputs(serum={"sodium": 140, "glucose": 5, "urea": 5, "osmolality": 320})
    )
    assert f.status is Status.caution and "ethanol" in f.reasons[0]
    measured = serum_gaps.serum_osmolal_gap(
        DrawInputs(serum={"sodium": 140, "glucose": 5, "urea": 5, "osmolality": 320, "ethanol": 0})
    )
    assert measured.status is Status.ok


def test_serum_osmolal_gap_needs_its_inputs():
    f = serum_gaps.serum_osmolal_gap(DrawInputs(serum={"sodium": 140}))
    assert f.status is Status.needs_input
    assert set(f.needs) == {"serum.osmolality", "serum.glucose", "serum.urea"}


@pytest.mark.parametrize("flag", [Flag.paraprotein, Flag.lithium])
def test_normal_gap_with_paraprotein_or_lithium_is_a_caution(flag):
    # Kraut & Madias, CJASN 2007: a paraprotein or lithium lowers the gap.
    values = {"sodium": 140, "chloride": 106, "bicarbonate": 24}
    assert serum_gaps.anion_gap(serum(**values)).status is Status.ok
    f = serum_gaps.anion_gap(DrawInputs(serum=values, context=frozenset({flag})))
    assert f.status is Status.caution and "lowers the measured gap" in f.reasons[0]


def test_delta_ratio_with_a_gap_inside_its_reference_limit_reads_as_normal_gap() -> None:
    # Brandis's bands (0.4–0.8 mixed) presume a high gap; a gap within the laboratory's limit
    # is not a high-gap acidosis (common practice). AG 12.5 (limit 14, mean 10), HCO3 18:
    # ratio (12.5 − 10)/(24 − 18) = 0.42 would fall in the "mixed" band.
    from workup.indices.serum_gaps import delta_ratio
    from workup.inputs import DrawInputs

    f = delta_ratio(
        DrawInputs(serum={"sodium": 140, "chloride": 110, "bicarbonate": 18, "albumin": 38})
    )
    assert f.value == pytest.approx(0.42, abs=0.01)
    assert f.interpretation == "pure_normal_gap"
    assert f.status.value == "caution"
    assert any("reference limit" in r for r in f.reasons)
