"""The numbers one draw offers the analysis, and whether its blood gas is believable.

:func:`picture` reads pH, pCO2 and the bicarbonate, takes the anion gap chosen by
:mod:`~workup.acidbase.gap_reading`, and runs the Henderson–Hasselbalch consistency check that
decides whether the later steps may use the gas at all.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from workup.acidbase.gap_reading import chosen_gap
from workup.acidbase.wording import fmt, fmt_ph
from workup.findings import Finding, Status
from workup.frozen import builder
from workup.inputs import DrawInputs

HH_FACTOR = 24.0
"""[H+] nmol/L = 24 × pCO2 / HCO3 (Kassirer & Bleich, NEJM 1965; from memory)."""

COMPUTED_HCO3_WORDS = "bicarbonate computed from pH and pCO2"
"""How a bicarbonate computed from the gas itself is named; such a value cannot check the gas."""


@dataclass(frozen=True, slots=True)
class Picture:
    """The numbers the analysis reads from one draw."""

    ph: float | None
    """Measured pH."""
    pco2: float | None
    """Measured pCO2, mmHg."""
    hco3: float | None
    """Bicarbonate: serum total CO2, else the gas value, else computed from pH and pCO2."""
    hco3_words: str
    """Where the bicarbonate came from, for evidence."""
    gap: float | None
    """Anion gap, albumin-corrected when possible."""
    gap_words: str
    """Which gap it is, for evidence."""
    gap_index: str | None
    """The finding id the gap comes from."""
    gas_usable: bool
    """True when pH and pCO2 are present and pass the Henderson–Hasselbalch check."""
    gas_words: str | None
    """Why the gas is missing or was set aside, or a caution about it; None when clean."""


_new_picture = builder(Picture)


def _hh_ph(hco3: float, pco2: float) -> float | None:
    """pH from HCO3 and pCO2 (Henderson–Hasselbalch, CO2 solubility 0.03); None when undefined."""
    if hco3 <= 0 or pco2 <= 0:
        return None
    return 6.1 + math.log10(hco3 / (0.03 * pco2))


def picture(x: DrawInputs, findings: dict[str, Finding]) -> Picture:
    """Read pH, pCO2, bicarbonate, the gap and the gas's credibility from one draw."""
    s = x.settings
    ph, pco2 = x.gas.get("ph"), x.gas.get("pco2")
    if "bicarbonate" in x.serum:
        hco3, hco3_words = x.serum["bicarbonate"], "serum total CO2"
    elif "bicarbonate" in x.gas:
        hco3, hco3_words = x.gas["bicarbonate"], "gas bicarbonate (no serum total CO2)"
    elif ph is not None and pco2 is not None and pco2 > 0:
        hco3 = 0.03 * pco2 * 10 ** (ph - 6.1)
        hco3_words = COMPUTED_HCO3_WORDS
    else:
        hco3, hco3_words = None, ""

    gap, gap_words, gap_index = chosen_gap(findings)

    if ph is None or pco2 is None:
        return _new_picture(
            ph, pco2, hco3, hco3_words, gap, gap_words, gap_index, False, "no complete blood gas"
        )
    usable, words = True, None
    hh = findings.get("henderson_hasselbalch_ph")
    if hh is not None and hh.value is not None:
        if hh.interpretation == "inconsistent":
            reason = hh.reasons[0] if hh.reasons else ""
            text = (
                f"the gas fails the Henderson–Hasselbalch check (measured pH {fmt_ph(ph)}, computed "
                f"{fmt_ph(hh.value)}){': ' + reason if reason else ''}"
            )
            usable = hh.status is not Status.not_valid
            words = text + ("; the gas was set aside" if not usable else "; read with caution")
    elif hco3 is not None and hco3_words != COMPUTED_HCO3_WORDS:
        # Without the index (hand-made inputs) the same check is made here from the raw values.
        computed = _hh_ph(hco3, pco2)
        if computed is not None:
            diff = abs(computed - ph)
            if diff > s.hh_ph_tolerance:
                usable = diff <= 2 * s.hh_ph_tolerance
                words = (
                    f"the gas fails the Henderson–Hasselbalch check: measured pH {fmt_ph(ph)}, "
                    f"computed from {hco3_words} {fmt(hco3)} and pCO2 {fmt(pco2)} "
                    f"{fmt_ph(computed)} (tolerance {fmt(s.hh_ph_tolerance)})"
                    + ("; the gas was set aside" if not usable else "; read with caution")
                )
    return _new_picture(ph, pco2, hco3, hco3_words, gap, gap_words, gap_index, usable, words)
