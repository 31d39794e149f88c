"""Acid-base disorders of one draw, from the gas, the chemistry and the expected compensation.

The analysis follows the usual order, one module of :mod:`workup.acidbase` per step: is the gas
believable (``gas_check``, Henderson–Hasselbalch), which process explains the direction of the pH
(``primary``), whether the other value moved as compensation predicts (``compensation``), what the
anion gap and delta ratio add (``gap_reading``), and the disorders that together make the draw's
picture (``mixed_disorders``). Expected bands are taken from the matching index when it is present
(so the disorder text agrees with the index on screen) and computed from the same published rules
otherwise.

Without a usable gas only the chemistry speaks, and the evidence says what it cannot settle. This
module is the entry point (:func:`analyse`) and keeps the names other modules import from it.
"""

from __future__ import annotations

from workup.acidbase.compensation import (
    BAND,
    CHRONIC_RESP_ALK_HCO3_FLOOR,
    MET_ALK_SLOPE,
    RESP_ACID_ACUTE,
    RESP_ACID_CHRONIC,
    RESP_ALK_ACUTE,
    RESP_ALK_CHRONIC,
    WINTERS_BAND,
    WINTERS_INTERCEPT,
    WINTERS_SLOPE,
)
from workup.acidbase.disorder_list import METABOLIC_ACIDOSES, NAMES
from workup.acidbase.gap_reading import DELTA_ALKALOSIS_ABOVE, DELTA_MIXED_BELOW
from workup.acidbase.gas_check import HH_FACTOR, Picture, picture
from workup.acidbase.mixed_disorders import chemistry_only, with_gas
from workup.acidbase.primary import PCO2_HIGH, PCO2_LOW, PH_MIDPOINT
from workup.acidbase.wording import fmt, fmt_ph
from workup.findings import Disorder, Finding
from workup.inputs import DrawInputs

__all__ = [
    "BAND",
    "CHRONIC_RESP_ALK_HCO3_FLOOR",
    "DELTA_ALKALOSIS_ABOVE",
    "DELTA_MIXED_BELOW",
    "HH_FACTOR",
    "METABOLIC_ACIDOSES",
    "MET_ALK_SLOPE",
    "NAMES",
    "PCO2_HIGH",
    "PCO2_LOW",
    "PH_MIDPOINT",
    "RESP_ACID_ACUTE",
    "RESP_ACID_CHRONIC",
    "RESP_ALK_ACUTE",
    "RESP_ALK_CHRONIC",
    "WINTERS_BAND",
    "WINTERS_INTERCEPT",
    "WINTERS_SLOPE",
    "Picture",
    "analyse",
    "fmt",
    "fmt_ph",
    "picture",
]


def analyse(x: DrawInputs, findings: dict[str, Finding]) -> list[Disorder]:
    """The disorders of the draw, primary first; [] when the gas and chemistry look normal.

    Each disorder carries its evidence in words with the numbers; the primary one carries
    ``compensation`` (appropriate, insufficient or excessive) and, for respiratory disorders,
    ``detail`` (acute, chronic, acute or chronic, between acute and chronic). Without a usable
    gas the analysis rests on the chemistry and says so in the evidence.
    """
    pic = picture(x, findings)
    if pic.gas_usable and pic.hco3 is not None:
        return with_gas(pic, x, findings)
    return chemistry_only(pic, x, findings)
