"""Expected compensation: the pCO2 a metabolic disorder predicts, the bicarbonate a respiratory one
predicts, and the word (appropriate, insufficient, excessive) for what the draw shows.

Bands come from the matching index when it was computed (so the disorder text agrees with the
index on screen) and from the same published rules here otherwise.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import TYPE_CHECKING

from workup.acidbase.wording import fmt
from workup.findings import Evidence, Finding, new_evidence
from workup.inputs import DrawInputs
from workup.settings import Settings

if TYPE_CHECKING:
    from workup.acidbase.gas_check import Picture

WINTERS_SLOPE, WINTERS_INTERCEPT, WINTERS_BAND = 1.5, 8.0, 2.0
"""Expected pCO2 = 1.5 × HCO3 + 8 ± 2 (Albert, Dell & Winters, Ann Intern Med 1967; citation from
memory)."""
MET_ALK_SLOPE = 0.7
"""ΔpCO2 = 0.7 × ΔHCO3 in metabolic alkalosis (Berend, de Vries & Gans, NEJM 2014)."""
RESP_ACID_ACUTE, RESP_ACID_CHRONIC = 0.1, 0.35
"""ΔHCO3 per mmHg of ΔpCO2 in acute and chronic respiratory acidosis (Narins & Emmett,
Medicine 1980)."""
RESP_ALK_ACUTE = 0.2
"""ΔHCO3 per mmHg of ΔpCO2 in acute respiratory alkalosis (Narins & Emmett, Medicine 1980)."""
RESP_ALK_CHRONIC = (0.4, 0.5)
"""ΔHCO3 per mmHg of ΔpCO2 in chronic respiratory alkalosis, a range (Narins & Emmett 1980)."""
BAND = 2.0
"""Half-width of every expected band, mmol/L or mmHg (Berend, de Vries & Gans, NEJM 2014)."""
CHRONIC_RESP_ALK_HCO3_FLOOR = 12.0
"""Renal compensation for a chronic respiratory alkalosis rarely takes bicarbonate below about
12–15 mmol/L (Narins & Emmett 1980 limits as tabulated; common practice)."""


@dataclass(frozen=True, slots=True)
class PCO2Response:
    """How the pCO2 answered a primary metabolic disorder."""

    low: float
    """Lower end of the expected pCO2, mmHg."""
    high: float
    """Upper end of the expected pCO2, mmHg."""
    word: str
    """``appropriate``, ``insufficient`` or ``excessive``."""
    added: str | None
    """The respiratory disorder a pCO2 outside the band adds, or None."""


def expected_band(
    findings: dict[str, Finding], fid: str, low: float, high: float
) -> tuple[float, float]:
    """The expected band of index ``fid`` when it was computed, else (low, high) computed here."""
    f = findings.get(fid)
    if f is not None and f.value is not None and f.low is not None and f.high is not None:
        return f.low, f.high
    return low, high


def pco2_for_metabolic_acidosis(
    hco3: float, pco2: float, findings: dict[str, Finding]
) -> PCO2Response:
    """pCO2 against Winters' band: too high adds a respiratory acidosis, too low an alkalosis."""
    lo, hi = expected_band(
        findings,
        "expected_pco2",
        WINTERS_SLOPE * hco3 + WINTERS_INTERCEPT - WINTERS_BAND,
        WINTERS_SLOPE * hco3 + WINTERS_INTERCEPT + WINTERS_BAND,
    )
    comp = "appropriate" if lo <= pco2 <= hi else "insufficient" if pco2 > hi else "excessive"
    added = {"insufficient": "respiratory_acidosis", "excessive": "respiratory_alkalosis"}
    return PCO2Response(lo, hi, comp, added.get(comp))


def pco2_for_metabolic_alkalosis(
    hco3: float, pco2: float, findings: dict[str, Finding], s: Settings
) -> PCO2Response:
    """pCO2 against ΔpCO2 = 0.7 × ΔHCO3: too high adds a respiratory acidosis, too low an
    alkalosis."""
    mid = s.pco2_normal + MET_ALK_SLOPE * (hco3 - s.bicarbonate_normal)
    lo, hi = expected_band(findings, "expected_pco2_metabolic_alkalosis", mid - BAND, mid + BAND)
    comp = "appropriate" if lo <= pco2 <= hi else "excessive" if pco2 > hi else "insufficient"
    added = {"excessive": "respiratory_acidosis", "insufficient": "respiratory_alkalosis"}
    return PCO2Response(lo, hi, comp, added.get(comp))


def bicarbonate_for_respiratory(
    kind: str, pic: Picture, x: DrawInputs, findings: dict[str, Finding]
) -> tuple[str | None, str, str | None, Evidence]:
    """Fit the bicarbonate to the acute and chronic expectations of a respiratory disorder.

    Returns (detail, compensation, added metabolic disorder or None, evidence in words).
    """
    s = x.settings
    assert pic.pco2 is not None and pic.hco3 is not None
    dp = abs(pic.pco2 - s.pco2_normal)
    n = s.bicarbonate_normal
    if kind == "respiratory_acidosis":
        a_mid, c_mid = n + RESP_ACID_ACUTE * dp, n + RESP_ACID_CHRONIC * dp
        acute = expected_band(findings, "expected_bicarbonate_respiratory_acidosis_acute",
                              a_mid - BAND, a_mid + BAND)  # fmt: skip
        chronic = expected_band(findings, "expected_bicarbonate_respiratory_acidosis_chronic",
                                c_mid - BAND, c_mid + BAND)  # fmt: skip
    else:
        a_mid = n - RESP_ALK_ACUTE * dp
        c_lo, c_hi = n - RESP_ALK_CHRONIC[1] * dp, n - RESP_ALK_CHRONIC[0] * dp
        acute = expected_band(findings, "expected_bicarbonate_respiratory_alkalosis_acute",
                              a_mid - BAND, a_mid + BAND)  # fmt: skip
        chronic = expected_band(findings, "expected_bicarbonate_respiratory_alkalosis_chronic",
                                c_lo - BAND, c_hi + BAND)  # fmt: skip
    h = pic.hco3
    in_a = acute[0] <= h <= acute[1]
    in_c = chronic[0] <= h <= chronic[1]
    lo, hi = min(acute[0], chronic[0]), max(acute[1], chronic[1])
    bands = (
        f"bicarbonate {fmt(h)} against the acute expectation {fmt(acute[0])}–{fmt(acute[1])} and "
        f"the chronic expectation {fmt(chronic[0])}–{fmt(chronic[1])} for pCO2 {fmt(pic.pco2)} "
        "(Narins & Emmett 1980)"
    )
    acidosis = kind == "respiratory_acidosis"
    if in_a and in_c:
        return "acute or chronic", "appropriate", None, new_evidence(bands + ": fits either")
    if in_a:
        other = "acidosis" if acidosis else "alkalosis"
        return (
            "acute",
            "appropriate",
            None,
            new_evidence(
                bands + f": fits acute; if the history says chronic, a metabolic {other} is added"
            ),
        )
    if in_c:
        other = "alkalosis" if acidosis else "acidosis"
        return (
            "chronic",
            "appropriate",
            None,
            new_evidence(
                bands + f": fits chronic; if the history says acute, a metabolic {other} is added"
            ),
        )
    if lo < h < hi:
        return (
            "between acute and chronic",
            "appropriate",
            None,
            new_evidence(
                bands + ": between the two, as in an evolving or acute-on-chronic disorder (or an "
                "acute disorder with a metabolic process added)"
            ),
        )
    if h < lo:
        comp = "insufficient" if acidosis else "excessive"
        return (
            None,
            comp,
            "metabolic_acidosis",
            new_evidence(bands + ": lower than either, so a metabolic acidosis is added"),
        )
    comp = "excessive" if acidosis else "insufficient"
    return (
        None,
        comp,
        "metabolic_alkalosis",
        new_evidence(bands + ": higher than either, so a metabolic alkalosis is added"),
    )
