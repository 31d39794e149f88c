"""A child's TmP/GFR read against the age's reference band, not the adult lower limit.

Bands (mmol/L), from memory, as tabulated by Payne (Ann Clin Biochem 1998;35:201) after Brodehl
et al. (Pediatr Nephrol 1988): birth 1.43-3.43, 3 months 1.48-3.30, 6 months 1.15-2.60,
2-15 years 1.15-2.44; adults from 25 years about 0.8-1.35. Age is held in whole years, so age 0
joins the three infant bands (1.15-3.43) and age 1 uses the 6-month band (1.15-2.60).
Expected TmP/GFR values are worked by hand from the Walton & Bijvoet algebra (Payne 1998,
from memory): TRP = 1 - FEPO4/100; TmP/GFR = TRP x plasma P when TRP <= 0.86, else
0.3 x TRP / (1 - 0.8 x TRP) x plasma P. Inputs are invented, not patients.
"""

from __future__ import annotations

import pytest

from workup.findings import Status
from workup.indices import compute_all
from workup.indices.tubular import tmp_gfr
from workup.inputs import DrawInputs
from workup.model import Sex

# Serum creatinine 50 and urine creatinine 5000 µmol/L: FEPO4 (%) = urine P / plasma P.
_SCR, _UCR = 50.0, 5000.0


def _x(age: int | None, plasma_p: float, urine_p: float) -> DrawInputs:
    return DrawInputs(
        serum={"creatinine": _SCR, "phosphate": plasma_p},
        urine={"creatinine": _UCR, "phosphate": urine_p},
        age=age, sex=Sex.female, height_cm=110,
    )  # fmt: skip


@pytest.mark.parametrize(
    ("age", "plasma_p", "urine_p", "expected", "reading", "band"),
    [
        # FE 20%, TRP 0.80: 0.80 x 1.2 = 0.96, below the 2-15-year lower limit 1.15 (Payne 1998
        # after Brodehl 1988, from memory); the adult limit 0.8 would have called it normal.
        (6, 1.2, 24.0, 0.96, "low", (1.15, 2.44)),
        # FE 5%, TRP 0.95: 0.285 / 0.24 x 1.6 = 1.90, inside 1.15-2.44 (Payne 1998, from memory).
        (6, 1.6, 8.0, 1.90, "normal", (1.15, 2.44)),
        # FE 2%, TRP 0.98: 0.294 / 0.216 x 2.2 = 2.994, above 2.44 (Payne 1998, from memory).
        (6, 2.2, 4.4, 2.994, "high", (1.15, 2.44)),
        (15, 2.2, 4.4, 2.994, "high", (1.15, 2.44)),  # last year of the 2-15 band, same source
        (2, 1.2, 24.0, 0.96, "low", (1.15, 2.44)),  # first year of the 2-15 band, same source
        # Age 1: the 6-month band 1.15-2.60 (Payne 1998, from memory): 2.994 is above it.
        (1, 2.2, 4.4, 2.994, "high", (1.15, 2.60)),
        (1, 1.6, 8.0, 1.90, "normal", (1.15, 2.60)),
        # Age 0: birth to 6 months joined, 1.15-3.43 (Payne 1998, from memory): 2.994 is inside.
        (0, 2.2, 4.4, 2.994, "normal", (1.15, 3.43)),
        # FE 20%, TRP 0.80: 0.80 x 1.4 = 1.12, below 1.15 (Payne 1998, from memory).
        (0, 1.4, 28.0, 1.12, "low", (1.15, 3.43)),
    ],
)
def test_child_tmp_gfr_reads_the_age_band(age, plasma_p, urine_p, expected, reading, band):
    f = compute_all(_x(age, plasma_p, urine_p))["tmp_gfr"]
    assert f.value == pytest.approx(expected, abs=0.001)
    assert f.interpretation == reading
    assert (f.low, f.high) == band
    # The first reason names the band, its numbers and the source, marked from memory.
    first = f.reasons[0]
    assert first.startswith(f"age {age}: read against the children's band")
    assert f"{band[0]:.2f}-{band[1]:.2f} mmol/L" in first
    assert "Payne 1998, from memory" in first
    assert "Brodehl" in f.source and "Payne" in f.source
    assert f.status is Status.caution


@pytest.mark.parametrize("age", [16, 17])
def test_ages_between_the_bands_keep_the_adult_limit_with_a_caution(age):
    # No band covers 16-17: Payne's children's bands stop at 15 years and the adult range starts
    # at about 25 (Payne 1998, from memory). 0.96 is normal against the adult 0.8.
    f = compute_all(_x(age, 1.2, 24.0))["tmp_gfr"]
    assert f.value == pytest.approx(0.96, abs=0.001)
    assert f.interpretation == "normal"
    assert f.low is None and f.high is None
    assert f.reasons[0].startswith(f"age {age}: no children's TmP/GFR band covers ages 16-17")


def test_the_band_comes_from_the_calculator_itself():
    # tmp_gfr alone (without compute_all's cautions) reads the band: the reading is the index's.
    f = tmp_gfr(_x(6, 1.2, 24.0))
    assert f.interpretation == "low" and (f.low, f.high) == (1.15, 2.44)
    adult = tmp_gfr(_x(40, 1.2, 24.0))
    # Adult lower limit 0.8 (Payne 1998, from memory): 0.96 is normal, no band on the finding.
    assert adult.interpretation == "normal" and adult.low is None


def test_tmp_gfr_is_printed_to_hundredths_beside_its_limits():
    # 0.96 against the 2-15-year band 1.15-2.44 (Payne 1998, from memory): one decimal printed it
    # as "1.0 mmol/L", which reads as inside the adult range and blurs the 1.15 limit.
    from workup.formatting import fmt_value

    f = compute_all(_x(6, 1.2, 24.0))["tmp_gfr"]
    assert fmt_value(f) == "0.96 mmol/L"
