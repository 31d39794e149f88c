"""Which process explains the pH of one draw: the primary disorder, read from a believable gas.

Called by :mod:`~workup.acidbase.mixed_disorders` once :mod:`~workup.acidbase.gas_check` has
passed the gas; compensation for the answer is judged next, in :mod:`~workup.acidbase.compensation`.
"""

from __future__ import annotations

from typing import TYPE_CHECKING

from workup.inputs import DrawInputs

if TYPE_CHECKING:
    from workup.acidbase.gas_check import Picture

PCO2_LOW = 35.0
"""Lower limit of normal arterial pCO2, mmHg (common practice)."""
PCO2_HIGH = 45.0
"""Upper limit of normal arterial pCO2, mmHg (common practice)."""
PH_MIDPOINT = 7.40
"""With a normal pH, the side of 7.40 tells which of two opposing processes leads (common practice)."""


def primary_process(pic: Picture, x: DrawInputs) -> str | None:
    """Which process explains the pH: the primary disorder, or None when nothing is off."""
    s = x.settings
    ph, pco2, hco3 = pic.ph, pic.pco2, pic.hco3
    assert ph is not None and pco2 is not None and hco3 is not None
    met = (s.bicarbonate_normal - hco3) / s.bicarbonate_normal  # > 0 pushes acid
    resp = (pco2 - s.pco2_normal) / s.pco2_normal  # > 0 pushes acid
    if ph < s.ph_low:
        cands = {"metabolic_acidosis": met, "respiratory_acidosis": resp}
    elif ph > s.ph_high:
        cands = {"metabolic_alkalosis": -met, "respiratory_alkalosis": -resp}
    else:
        low_h, high_h = hco3 < s.bicarbonate_low, hco3 > s.bicarbonate_high
        low_p, high_p = pco2 < PCO2_LOW, pco2 > PCO2_HIGH
        if low_h and (ph <= PH_MIDPOINT or not low_p):
            return "metabolic_acidosis"
        if low_p:
            return "respiratory_alkalosis"
        if high_h and (ph >= PH_MIDPOINT or not high_p):
            return "metabolic_alkalosis"
        if high_p:
            return "respiratory_acidosis"
        return None
    cands = {k: v for k, v in cands.items() if v > 0}
    return max(cands, key=lambda k: cands[k]) if cands else None
