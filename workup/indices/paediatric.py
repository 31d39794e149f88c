"""Children's reference values beside the adult cut-offs an index reads against.

Applied by :func:`workup.indices.compute_all` after every index. Where a paediatric source is
named (workup/settings.py, each value from memory), its numbers are stated: TmP/GFR is read
against the age's band in :func:`workup.indices.tubular.tmp_gfr`; the normal TTKG of infants and
children and the infant's bicarbonate threshold are given in a caution beside the adult reading,
because they describe children without an acidosis or a potassium demand and so cannot serve as
the cut-offs these readings use. The urine K/creatinine has no paediatric source here: its
caution says what is known and why no number is used.
"""

from __future__ import annotations

import dataclasses

from workup.findings import Finding, Status
from workup.indices._common import bicarbonate, fmt
from workup.inputs import DrawInputs
from workup.settings import (
    INFANT_BICARBONATE_SOURCE,
    INFANT_BICARBONATE_THRESHOLD,
    TMP_GFR_CHILD_BANDS,
    TMP_GFR_CHILD_CITE,
    TTKG_CHILD_RANGES,
    TTKG_CHILD_SOURCE,
    age_band,
)

ADULT_AGE = 18
"""Below this age the adult cut-offs are flagged."""
INFANT_AGE = 1
"""Below this age (age 0 in whole years) the infant's lower bicarbonate is flagged."""

UKCR_CHILD = (
    "the urine K/creatinine cut-off is an adult value; children excrete less creatinine, so "
    "their ratios run higher (from memory); no paediatric source is named here, so no "
    "children's cut-off is used"
)
"""The urine K/creatinine caution for a patient under 18 (no paediatric source named)."""

TMP_GFR_BETWEEN_BANDS = (
    "no children's TmP/GFR band covers ages 16-17 (the bands end at 15 years, the adult range "
    f"starts at about 25; {TMP_GFR_CHILD_CITE}): the adult lower limit is used"
)
"""The TmP/GFR caution for the ages no children's band covers."""

INFANT_ACIDOSIS_READINGS = ("urine_ph", "urine_anion_gap", "urine_osmolal_gap")
"""Indices read as "during an acidosis" by the adult bicarbonate cut-off."""


def ttkg_child_text(age: int, value: float | None) -> str | None:
    """The TTKG caution for a child of ``age``: the normal range of the age, stated, not used
    as a cut-off; where ``value`` lies outside it, that is said too."""
    band = age_band(TTKG_CHILD_RANGES, age)
    if band is None:
        return None
    side = ""
    if value is not None and value < band.low:
        side = f"; {fmt(value)} is below even that range"
    elif value is not None and value > band.high:
        side = f"; {fmt(value)} is above even that range"
    others = ", ".join(
        f"{b.label} {fmt(b.low)}-{fmt(b.high)}" for b in TTKG_CHILD_RANGES if b is not band
    )
    return (
        f"the TTKG cut-offs are adult values for a potassium demand; normal {band.label} with a "
        f"normal serum K run {fmt(band.low)}-{fmt(band.high)} ({others}; {TTKG_CHILD_SOURCE}), "
        f"stated for comparison, not used as a cut-off{side}"
    )


def infant_bicarbonate_text(x: DrawInputs) -> str:
    """The infant's caution on a reading "during an acidosis": the threshold, its source and
    the plasma bicarbonate of the draw."""
    plasma, _, _ = bicarbonate(x)
    here = f" (plasma bicarbonate {fmt(plasma)})" if plasma is not None else ""
    return (
        f"age 0: an infant's renal bicarbonate threshold is about "
        f"{fmt(INFANT_BICARBONATE_THRESHOLD)} mmol/L ({INFANT_BICARBONATE_SOURCE}), so a normal "
        "infant's bicarbonate sits near the adult cut-off of "
        f"{fmt(x.settings.bicarbonate_low)} used here to call an acidosis{here}"
    )


def with_caution(f: Finding, text: str) -> Finding:
    """``f`` with caution ``text``: an ok value becomes caution; the first reason still explains
    the status (a not-valid reason stays first)."""
    if f.value is None or f.status is Status.needs_input:
        return f
    reasons = list(f.reasons)
    if f.status is Status.not_valid:
        reasons.insert(1, text)
        return dataclasses.replace(f, reasons=tuple(reasons))
    return dataclasses.replace(f, status=Status.caution, reasons=(text, *reasons))


def _child_texts(age: int, ttkg_value: float | None) -> dict[str, str]:
    """Index id → the caution for a child of ``age`` (TmP/GFR only where no band covers it)."""
    out = {"urine_potassium_creatinine_ratio": UKCR_CHILD}
    ttkg = ttkg_child_text(age, ttkg_value)
    if ttkg is not None:
        out["ttkg"] = ttkg
    if age_band(TMP_GFR_CHILD_BANDS, age) is None:
        out["tmp_gfr"] = TMP_GFR_BETWEEN_BANDS
    return out


def child_cautions(x: DrawInputs, found: dict[str, Finding]) -> dict[str, Finding]:
    """``found`` with the children's cautions added when the patient is under 18 (in place)."""
    if x.age is None or x.age >= ADULT_AGE:
        return found
    ttkg_value = found["ttkg"].value if "ttkg" in found else None
    for fid, text in _child_texts(x.age, ttkg_value).items():
        if fid in found:
            found[fid] = with_caution(found[fid], f"age {x.age}: {text}")
    ttkg = found.get("ttkg")
    band = age_band(TTKG_CHILD_RANGES, x.age)
    if ttkg is not None and ttkg.value is not None and band is not None:
        reference = {"low": band.low, "high": band.high, "source": TTKG_CHILD_SOURCE}
        found["ttkg"] = dataclasses.replace(ttkg, extra={**ttkg.extra, "child_range": reference})
    if x.age < INFANT_AGE:
        text = infant_bicarbonate_text(x)
        for fid in INFANT_ACIDOSIS_READINGS:
            if fid in found:
                found[fid] = with_caution(found[fid], text)
    return found
