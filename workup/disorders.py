"""Acid-base disorders of one draw, from the gas, the chemistry and the expected compensation.

The analysis follows the usual order: is the gas believable (Henderson–Hasselbalch), which way
the pH points, which process explains that direction (the primary disorder), whether the other
value moved as compensation predicts, and what the anion gap and delta ratio add. Expected bands
are taken from the matching index when it is present (so the disorder text agrees with the index
on screen) and computed here from the same published rules otherwise.

Without a usable gas only the chemistry speaks, and the evidence says what it cannot settle.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from workup.findings import Disorder, Evidence, Finding, Status, new_disorder, new_evidence
from workup.frozen import builder
from workup.inputs import DrawInputs

PCO2_LOW = 35.0
"""Lower limit of normal arterial pCO2, mmHg (common practice)."""
PCO2_HIGH = 45.0
"""Upper limit of normal arterial pCO2, mmHg (common practice)."""
PH_MIDPOINT = 7.40
"""With a normal pH, the side of 7.40 tells which of two opposing processes leads (common practice)."""

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

DELTA_MIXED_BELOW = 0.8
"""A delta ratio below this with a high gap means an added normal-gap acidosis (Brandis,
Acid-Base Physiology)."""
DELTA_ALKALOSIS_ABOVE = 2.0
"""A delta ratio above this means an added metabolic alkalosis or a pre-existing compensated
respiratory acidosis (Brandis, Acid-Base Physiology)."""
HH_FACTOR = 24.0
"""[H+] nmol/L = 24 × pCO2 / HCO3 (Kassirer & Bleich, NEJM 1965; from memory)."""
CHRONIC_RESP_ALK_HCO3_FLOOR = 12.0
"""Renal compensation for a chronic respiratory alkalosis rarely takes bicarbonate below about
12–15 mmol/L (Narins & Emmett 1980 limits as tabulated; common practice)."""

NAMES = {
    "normal_gap_metabolic_acidosis": "Normal-gap metabolic acidosis",
    "high_gap_metabolic_acidosis": "High-gap metabolic acidosis",
    "metabolic_acidosis": "Metabolic acidosis, gap not known",
    "metabolic_alkalosis": "Metabolic alkalosis",
    "respiratory_acidosis": "Respiratory acidosis",
    "respiratory_alkalosis": "Respiratory alkalosis",
}
"""Disorder ids and names. ``metabolic_acidosis`` is used only when the anion gap cannot be
computed (serum sodium or chloride missing), so the gap type is not guessed."""

METABOLIC_ACIDOSES = frozenset(
    {"normal_gap_metabolic_acidosis", "high_gap_metabolic_acidosis", "metabolic_acidosis"}
)
"""The ids that mean a metabolic acidosis of some kind."""


def fmt_ph(value: float) -> str:
    """A pH for an evidence sentence, always with two decimals."""
    return f"{value:.2f}"


def fmt(value: float) -> str:
    """A number for an evidence sentence: at most two decimals, trailing zeros dropped."""
    text = f"{value:.2f}".rstrip("0").rstrip(".")
    return "0" if text in ("-0", "") else text


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
        hco3_words = "bicarbonate computed from pH and pCO2"
    else:
        hco3, hco3_words = None, ""

    gap, gap_words, gap_index = None, "", None
    for fid, words in (
        ("anion_gap_albumin_corrected", "albumin-corrected anion gap"),
        ("anion_gap", "anion gap (not albumin-corrected)"),
    ):
        f = findings.get(fid)
        if f is not None and f.usable:
            caution = " (caution: " + f.reasons[0] + ")" if f.status is Status.caution else ""
            gap, gap_words, gap_index = f.value, words + caution, fid
            break

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
    elif hco3 is not None and hco3_words != "bicarbonate computed from pH and pCO2":
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


def _band(findings: dict[str, Finding], fid: str, low: float, high: float) -> tuple[float, float]:
    """The expected band of index ``fid`` when it was computed, else (low, high) computed here."""
    f = findings.get(fid)
    if f is not None and f.value is not None and f.low is not None and f.high is not None:
        return f.low, f.high
    return low, high


class _Builder:
    """Collects disorders in order, primary first, without duplicates."""

    def __init__(self, common: list[Evidence]):
        self.out: list[Disorder] = []
        self.common = common

    def add(
        self,
        did: str,
        primary: bool,
        evidence: list[Evidence],
        detail: str | None = None,
        compensation: str | None = None,
    ) -> None:
        if any(d.id == did for d in self.out):
            return
        ev = [*evidence, *self.common] if primary else evidence
        self.out.append(new_disorder(did, NAMES[did], primary, tuple(ev), detail, compensation))

    def has(self, ids: frozenset[str] | set[str]) -> bool:
        return any(d.id in ids for d in self.out)


def _delta(
    pic: Picture, x: DrawInputs, findings: dict[str, Finding]
) -> tuple[float | None, str | None, bool]:
    """The delta ratio, its reading (contract words) and whether the index is in caution."""
    f = findings.get("delta_ratio")
    if f is not None and f.usable and f.interpretation:
        return f.value, f.interpretation, f.status is Status.caution
    s = x.settings
    if pic.gap is None or pic.hco3 is None:
        return None, None, False
    fall = s.bicarbonate_normal - pic.hco3
    if fall < s.delta_min_bicarbonate_fall:
        return None, None, False
    ratio = (pic.gap - s.anion_gap_mean) / fall
    if ratio < 0.4:
        word = "pure_normal_gap"
    elif ratio < DELTA_MIXED_BELOW:
        word = "mixed_high_and_normal_gap"
    elif ratio <= DELTA_ALKALOSIS_ABOVE:
        word = "high_gap"
    else:
        word = "high_gap_plus_alkalosis"
    return ratio, word, False


def _metabolic_acidosis(
    b: _Builder,
    pic: Picture,
    x: DrawInputs,
    findings: dict[str, Finding],
    primary: bool,
    lead: list[Evidence],
    detail: str | None,
    compensation: str | None,
) -> None:
    """Add the metabolic acidosis typed by its gap, and what the delta ratio adds."""
    s = x.settings
    if pic.gap is None:
        ev = new_evidence("the anion gap cannot be computed: enter serum sodium and chloride")
        b.add("metabolic_acidosis", primary, [*lead, ev], detail, compensation)
        return
    gap_index = pic.gap_index
    if pic.gap <= s.anion_gap_upper:
        ev = new_evidence(
            f"{pic.gap_words} {fmt(pic.gap)} is within the upper limit of "
            f"{fmt(s.anion_gap_upper)}: a normal gap",
            gap_index,
        )
        b.add("normal_gap_metabolic_acidosis", primary, [*lead, ev], detail, compensation)
        return
    ev = new_evidence(
        f"{pic.gap_words} {fmt(pic.gap)} is above the upper limit of {fmt(s.anion_gap_upper)}",
        gap_index,
    )
    b.add("high_gap_metabolic_acidosis", primary, [*lead, ev], detail, compensation)
    ratio, word, caution = _delta(pic, x, findings)
    if ratio is None:
        return
    shown = f"delta ratio {fmt(ratio)}" + (" (caution status)" if caution else "")
    if word in ("pure_normal_gap", "mixed_high_and_normal_gap"):
        b.add(
            "normal_gap_metabolic_acidosis",
            False,
            [
                new_evidence(
                    f"{shown} is below {fmt(DELTA_MIXED_BELOW)}: bicarbonate "
                    "fell more than the gap rose, so a normal-gap acidosis is added (Brandis)",
                    "delta_ratio",
                )
            ],
        )
    elif word == "high_gap_plus_alkalosis":
        b.add(
            "metabolic_alkalosis",
            False,
            [
                new_evidence(
                    f"{shown} is above {fmt(DELTA_ALKALOSIS_ABOVE)}: bicarbonate "
                    "fell less than the gap rose, so a metabolic alkalosis is added (or a "
                    "compensated respiratory acidosis was there before; Brandis)",
                    "delta_ratio",
                )
            ],
        )


def _masked_high_gap(b: _Builder, pic: Picture, x: DrawInputs) -> None:
    """A high gap means a high-gap acidosis even when the bicarbonate or pH hides it."""
    if (
        pic.gap is not None
        and pic.gap > x.settings.anion_gap_upper
        and not b.has(METABOLIC_ACIDOSES)
    ):
        b.add(
            "high_gap_metabolic_acidosis",
            False,
            [
                new_evidence(
                    f"{pic.gap_words} {fmt(pic.gap)} is above {fmt(x.settings.anion_gap_upper)}: "
                    "unmeasured anions point to a high-gap acidosis even though the "
                    "bicarbonate does not show it",
                    pic.gap_index,
                )
            ],
        )


def _respiratory(
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
        acute = _band(findings, "expected_bicarbonate_respiratory_acidosis_acute",
                      a_mid - BAND, a_mid + BAND)  # fmt: skip
        chronic = _band(findings, "expected_bicarbonate_respiratory_acidosis_chronic",
                        c_mid - BAND, c_mid + BAND)  # fmt: skip
    else:
        a_mid = n - RESP_ALK_ACUTE * dp
        c_lo, c_hi = n - RESP_ALK_CHRONIC[1] * dp, n - RESP_ALK_CHRONIC[0] * dp
        acute = _band(findings, "expected_bicarbonate_respiratory_alkalosis_acute",
                      a_mid - BAND, a_mid + BAND)  # fmt: skip
        chronic = _band(findings, "expected_bicarbonate_respiratory_alkalosis_chronic",
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


def _primary_with_gas(pic: Picture, x: DrawInputs) -> str | None:
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


def _with_gas(pic: Picture, x: DrawInputs, findings: dict[str, Finding]) -> list[Disorder]:
    s = x.settings
    ph, pco2, hco3 = pic.ph, pic.pco2, pic.hco3
    assert ph is not None and pco2 is not None and hco3 is not None
    common: list[Evidence] = []
    if pic.gas_words:
        common.append(new_evidence(pic.gas_words, "henderson_hasselbalch_ph"))
    if x.venous:
        common.append(
            new_evidence(
                f"the gas is {x.sample.value}: the compensation rules were derived on arterial "
                "blood (venous pCO2 runs about 4–6 mmHg higher)"
            )
        )
    b = _Builder(common)
    state = "acidemia" if ph < s.ph_low else "alkalemia" if ph > s.ph_high else "a normal pH"
    ph_ev = new_evidence(f"pH {fmt_ph(ph)}: {state}")
    primary = _primary_with_gas(pic, x)
    if primary is None:
        _masked_high_gap(b, pic, x)
        if b.out:
            b.add(
                "metabolic_alkalosis",
                False,
                [
                    new_evidence(
                        f"bicarbonate {fmt(hco3)} and pH {fmt_ph(ph)} are normal despite the high "
                        "gap: a metabolic alkalosis offsets the acidosis"
                    )
                ],
            )
            # The high-gap acidosis leads: rebuild it as the primary disorder.
            first = b.out[0]
            b.out[0] = new_disorder(first.id, first.name, True, (*first.evidence, ph_ev, *common))
        return b.out

    if primary == "metabolic_acidosis":
        lo, hi = _band(
            findings,
            "expected_pco2",
            WINTERS_SLOPE * hco3 + WINTERS_INTERCEPT - WINTERS_BAND,
            WINTERS_SLOPE * hco3 + WINTERS_INTERCEPT + WINTERS_BAND,
        )
        comp = "appropriate" if lo <= pco2 <= hi else "insufficient" if pco2 > hi else "excessive"
        lead = [
            ph_ev,
            new_evidence(f"{pic.hco3_words} {fmt(hco3)} is low: a metabolic acidosis"),
            new_evidence(
                f"pCO2 {fmt(pco2)} against Winters' expected {fmt(lo)}–{fmt(hi)}: "
                + {
                    "appropriate": "appropriate respiratory compensation",
                    "insufficient": "higher than expected, so a respiratory acidosis is added",
                    "excessive": "lower than expected, so a respiratory alkalosis is added",
                }[comp],
                "expected_pco2",
            ),
        ]
        _metabolic_acidosis(b, pic, x, findings, True, lead, None, comp)
        added = {"insufficient": "respiratory_acidosis", "excessive": "respiratory_alkalosis"}
        if comp in added:
            b.add(
                added[comp],
                False,
                [
                    new_evidence(
                        f"pCO2 {fmt(pco2)} is outside Winters' band {fmt(lo)}–{fmt(hi)}",
                        "expected_pco2",
                    )
                ],
            )
        return b.out

    if primary == "metabolic_alkalosis":
        mid = s.pco2_normal + MET_ALK_SLOPE * (hco3 - s.bicarbonate_normal)
        lo, hi = _band(findings, "expected_pco2_metabolic_alkalosis", mid - BAND, mid + BAND)
        comp = "appropriate" if lo <= pco2 <= hi else "excessive" if pco2 > hi else "insufficient"
        ev = [
            ph_ev,
            new_evidence(f"{pic.hco3_words} {fmt(hco3)} is high: a metabolic alkalosis"),
            new_evidence(
                f"pCO2 {fmt(pco2)} against the expected {fmt(lo)}–{fmt(hi)} (ΔpCO2 = 0.7 × ΔHCO3, "
                f"Berend et al. 2014): {comp}",
                "expected_pco2_metabolic_alkalosis",
            ),
        ]
        b.add("metabolic_alkalosis", True, ev, None, comp)
        added = {"excessive": "respiratory_acidosis", "insufficient": "respiratory_alkalosis"}
        if comp in added:
            b.add(added[comp], False, [new_evidence(
                f"pCO2 {fmt(pco2)} is outside the expected {fmt(lo)}–{fmt(hi)}",
                "expected_pco2_metabolic_alkalosis")])  # fmt: skip
        _masked_high_gap(b, pic, x)
        return b.out

    # A primary respiratory disorder: the bicarbonate is judged as compensation first, so a low
    # bicarbonate that fits a respiratory alkalosis is not called a metabolic acidosis.
    detail, comp, added, fit = _respiratory(primary, pic, x, findings)
    word = "high" if primary == "respiratory_acidosis" else "low"
    ev = [ph_ev, new_evidence(f"pCO2 {fmt(pco2)} is {word}: a {NAMES[primary].lower()}"), fit]
    if primary == "respiratory_alkalosis" and hco3 < CHRONIC_RESP_ALK_HCO3_FLOOR:
        ev.append(
            new_evidence(
                f"bicarbonate {fmt(hco3)} is below about {fmt(CHRONIC_RESP_ALK_HCO3_FLOOR)}, "
                "lower than renal compensation usually reaches"
            )
        )
        if added is None:
            added, comp = "metabolic_acidosis", "excessive"
    b.add(primary, True, ev, detail, comp)
    if added == "metabolic_acidosis":
        _metabolic_acidosis(
            b, pic, x, findings, False,
            [new_evidence(f"bicarbonate {fmt(hco3)} is lower than the respiratory disorder explains")],
            None, None,
        )  # fmt: skip
    elif added == "metabolic_alkalosis":
        b.add(
            "metabolic_alkalosis",
            False,
            [
                new_evidence(
                    f"bicarbonate {fmt(hco3)} is higher than the respiratory disorder explains"
                )
            ],
        )
    _masked_high_gap(b, pic, x)
    return b.out


def _chemistry_only(pic: Picture, x: DrawInputs, findings: dict[str, Finding]) -> list[Disorder]:
    """Without a usable gas: what the bicarbonate and the gap can say, and what they cannot."""
    s = x.settings
    hco3 = pic.hco3
    if hco3 is None:
        return []
    why = pic.gas_words or "no complete blood gas"
    common = [
        new_evidence(
            f"{why}: compensation and respiratory disorders cannot be judged",
            "henderson_hasselbalch_ph" if pic.gas_words else None,
        )
    ]
    if pic.gas_words and "set aside" in pic.gas_words:
        common.append(new_evidence("recheck the gas (sample, timing, transcription) before relying "
                               "on an acid-base reading", "henderson_hasselbalch_ph"))  # fmt: skip
    b = _Builder(common)
    ph = pic.ph
    acidemic = ph is not None and ph < s.ph_low
    if hco3 < s.bicarbonate_low:
        lead = [new_evidence(f"{pic.hco3_words} {fmt(hco3)} is below {fmt(s.bicarbonate_low)}")]
        high_gap = pic.gap is not None and pic.gap > s.anion_gap_upper
        if acidemic:
            lead.append(new_evidence(f"pH {fmt_ph(ph)}: acidemia confirms a metabolic acidosis"))  # type: ignore[arg-type]
            # pCO2 may be present but set aside with an inconsistent gas: say which.
            missing_part = "gas set aside" if "pco2" in x.gas else "no pCO2"
            detail = f"compensation not assessed ({missing_part})"
        elif high_gap:
            detail = "compensation not assessed (no usable gas)"
        else:
            detail = "presumed: no usable gas"
            floor = (
                f"; a bicarbonate below about {fmt(CHRONIC_RESP_ALK_HCO3_FLOOR)} is more than "
                "that compensation reaches"
                if hco3 < CHRONIC_RESP_ALK_HCO3_FLOOR
                else ""
            )
            lead.append(
                new_evidence(
                    "without a usable pH and pCO2 a low bicarbonate may also be renal compensation for a "
                    "chronic respiratory alkalosis" + floor + "; enter the gas to confirm"
                )
            )
        _metabolic_acidosis(b, pic, x, findings, True, lead, detail, None)
        return b.out
    if hco3 > s.bicarbonate_high:
        lead = [
            new_evidence(f"{pic.hco3_words} {fmt(hco3)} is above {fmt(s.bicarbonate_high)}"),
            new_evidence(
                "without a usable pH and pCO2 a high bicarbonate may also be renal compensation for a "
                "chronic respiratory acidosis; enter the gas to confirm"
            ),
        ]
        b.add("metabolic_alkalosis", True, lead, "presumed: no usable gas", None)
        _masked_high_gap(b, pic, x)
        return b.out
    _masked_high_gap(b, pic, x)
    if b.out:
        first = b.out[0]
        b.out[0] = new_disorder(first.id, first.name, True, (*first.evidence, *common),
                            "no usable gas", None)  # fmt: skip
    return b.out


def analyse(x: DrawInputs, findings: dict[str, Finding]) -> list[Disorder]:
    """The disorders of the draw, primary first; [] when the gas and chemistry look normal.

    Each disorder carries its evidence in words with the numbers; the primary one carries
    ``compensation`` (appropriate, insufficient or excessive) and, for respiratory disorders,
    ``detail`` (acute, chronic, acute or chronic, between acute and chronic). Without a usable
    gas the analysis rests on the chemistry and says so in the evidence.
    """
    pic = picture(x, findings)
    if pic.gas_usable and pic.hco3 is not None:
        return _with_gas(pic, x, findings)
    return _chemistry_only(pic, x, findings)
