"""Assembling one draw's disorders: the primary one first, then every process added to it.

:func:`with_gas` walks a believable gas through the primary process, its compensation and the gap;
a compensation out of band adds a second disorder, as does the delta ratio or a masked high gap.
:func:`chemistry_only` says what the bicarbonate and the gap can say when there is no usable gas.
"""

from __future__ import annotations

from workup.acidbase.compensation import (
    CHRONIC_RESP_ALK_HCO3_FLOOR,
    bicarbonate_for_respiratory,
    pco2_for_metabolic_acidosis,
    pco2_for_metabolic_alkalosis,
)
from workup.acidbase.disorder_list import NAMES, DisorderList
from workup.acidbase.gap_reading import add_masked_high_gap, add_metabolic_acidosis
from workup.acidbase.gas_check import Picture
from workup.acidbase.primary import primary_process
from workup.acidbase.wording import fmt, fmt_ph
from workup.findings import Disorder, Evidence, Finding, new_disorder, new_evidence
from workup.inputs import DrawInputs

_WINTERS_WORDS = {
    "appropriate": "appropriate respiratory compensation",
    "insufficient": "higher than expected, so a respiratory acidosis is added",
    "excessive": "lower than expected, so a respiratory alkalosis is added",
}


def with_gas(pic: Picture, x: DrawInputs, findings: dict[str, Finding]) -> list[Disorder]:
    """The disorders of a draw whose gas passed the check, primary first."""
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
    b = DisorderList(common)
    state = "acidemia" if ph < s.ph_low else "alkalemia" if ph > s.ph_high else "a normal pH"
    ph_ev = new_evidence(f"pH {fmt_ph(ph)}: {state}")
    primary = primary_process(pic, x)
    if primary is None:
        add_masked_high_gap(b, pic, x)
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
        r = pco2_for_metabolic_acidosis(hco3, pco2, findings)
        lo, hi = r.low, r.high
        lead = [
            ph_ev,
            new_evidence(f"{pic.hco3_words} {fmt(hco3)} is low: a metabolic acidosis"),
            new_evidence(
                f"pCO2 {fmt(pco2)} against Winters' expected {fmt(lo)}–{fmt(hi)}: "
                + _WINTERS_WORDS[r.word],
                "expected_pco2",
            ),
        ]
        add_metabolic_acidosis(b, pic, x, findings, True, lead, None, r.word)
        if r.added is not None:
            b.add(
                r.added,
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
        r = pco2_for_metabolic_alkalosis(hco3, pco2, findings, s)
        lo, hi = r.low, r.high
        ev = [
            ph_ev,
            new_evidence(f"{pic.hco3_words} {fmt(hco3)} is high: a metabolic alkalosis"),
            new_evidence(
                f"pCO2 {fmt(pco2)} against the expected {fmt(lo)}–{fmt(hi)} (ΔpCO2 = 0.7 × ΔHCO3, "
                f"Berend et al. 2014): {r.word}",
                "expected_pco2_metabolic_alkalosis",
            ),
        ]
        b.add("metabolic_alkalosis", True, ev, None, r.word)
        if r.added is not None:
            b.add(r.added, False, [new_evidence(
                f"pCO2 {fmt(pco2)} is outside the expected {fmt(lo)}–{fmt(hi)}",
                "expected_pco2_metabolic_alkalosis")])  # fmt: skip
        add_masked_high_gap(b, pic, x)
        return b.out

    # A primary respiratory disorder: the bicarbonate is judged as compensation first, so a low
    # bicarbonate that fits a respiratory alkalosis is not called a metabolic acidosis.
    detail, comp, added, fit = bicarbonate_for_respiratory(primary, pic, x, findings)
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
        add_metabolic_acidosis(
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
    add_masked_high_gap(b, pic, x)
    return b.out


def chemistry_only(pic: Picture, x: DrawInputs, findings: dict[str, Finding]) -> list[Disorder]:
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
    b = DisorderList(common)
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
        add_metabolic_acidosis(b, pic, x, findings, True, lead, detail, None)
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
        add_masked_high_gap(b, pic, x)
        return b.out
    add_masked_high_gap(b, pic, x)
    if b.out:
        first = b.out[0]
        b.out[0] = new_disorder(first.id, first.name, True, (*first.evidence, *common),
                            "no usable gas", None)  # fmt: skip
    return b.out
