"""Shared pieces of the calculators: a status judge, safe arithmetic and the serum acid-base picture.

Kept here so every index reads bicarbonate, acidosis and the anion gap the same way; a fellow who
sees "the gas bicarbonate was used" on one index should see the same choice on the next.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from typing import Any

from workup.findings import BORDERLINE_SUFFIX, Finding, Status, new_finding
from workup.frozen import builder
from workup.inputs import DrawInputs

_RANK = {Status.ok: 0, Status.caution: 1, Status.not_valid: 2}


@dataclass(slots=True)
class Judge:
    """Collects the reasons for a finding and keeps the worst status they imply.

    Reasons that make the value not valid come first, then cautions, then plain readings: the
    assessment shows the first reason of a not-valid finding as a case caution, so it must be
    the one that explains why.
    """

    status: Status = Status.ok
    """The worst status implied so far."""
    invalid: list[str] = field(default_factory=list)
    """Reasons the value is not valid."""
    cautions: list[str] = field(default_factory=list)
    """Caveats that leave the value usable."""
    notes: list[str] = field(default_factory=list)
    """Readings and stated assumptions."""

    def note(self, text: str) -> None:
        """A reading or an assumption that does not change the status."""
        self.notes.append(text)

    def caution(self, text: str) -> None:
        """A caveat: the value holds, but read it with this in mind."""
        self.cautions.append(text)
        self._raise(Status.caution)

    def not_valid(self, text: str) -> None:
        """A failed validity condition: the value must not be read as a fact."""
        self.invalid.append(text)
        self._raise(Status.not_valid)

    def _raise(self, status: Status) -> None:
        if _RANK[status] > _RANK[self.status]:
            self.status = status

    @property
    def reasons(self) -> tuple[str, ...]:
        """Every reason, the most serious first."""
        return (*self.invalid, *self.cautions, *self.notes)


def finding(
    meta: tuple[str, str, str, str, str],
    value: float,
    judge: Judge,
    interpretation: str | None,
    *,
    low: float | None = None,
    high: float | None = None,
    extra: dict[str, Any] | None = None,
    borderline: str | None = None,
) -> Finding:
    """Build a computed Finding from ``meta`` = (id, name, unit, formula, source).

    ``borderline``, when given, is a reason naming the margin and its source: the value is then
    flagged borderline and its interpretation gains the suffix :data:`BORDERLINE_SUFFIX`.
    """
    fid, name, unit, formula, source = meta
    reasons = (*judge.invalid, *judge.cautions, *judge.notes)
    if borderline is not None:
        reasons = (*reasons, borderline)
        if interpretation is not None:
            interpretation += BORDERLINE_SUFFIX
    return new_finding(
        fid, name, float(value), unit, judge.status, reasons, (), formula, source,
        interpretation, low, high, dict(extra) if extra else {}, borderline is not None,
    )  # fmt: skip


def within(value: float, low: float, high: float) -> bool:
    """True when ``low <= value <= high`` (a borderline margin)."""
    return low <= value <= high


def ratio(num: float, den: float) -> float | None:
    """``num / den``, or None when the denominator is zero or the result is not finite."""
    if den == 0:
        return None
    out = num / den
    return out if math.isfinite(out) else None


def fmt(value: float, decimals: int = 1) -> str:
    """A number for a reason sentence: trailing zeros dropped."""
    memo = _FMT_MEMO.get(decimals)
    if memo is None:
        memo = _FMT_MEMO[decimals] = {}
    text = memo.get(value)
    if text is not None:
        return text
    text = f"{value:.{decimals}f}"
    if "." in text:
        text = text.rstrip("0").rstrip(".")
    if text in ("-0", ""):
        text = "0"
    # Reasons are built for every index of every draw, mostly from the same few numbers
    # (settings, limits, common values), so the memo answers most calls.
    if len(memo) < 20_000:
        memo[value] = text
    return text


_FMT_MEMO: dict[int, dict[float, str]] = {}
"""Decimals → value → text."""


def bicarbonate(x: DrawInputs) -> tuple[float | None, str | None, str | None]:
    """The plasma bicarbonate to use: serum total CO2, else the gas analyzer's value.

    Returns (value, where it came from, a note when the gas value stands in for serum). Serum total
    CO2 is measured while the gas value is calculated from pH and pCO2, so serum is preferred.
    """
    if "bicarbonate" in x.serum:
        return x.serum["bicarbonate"], "serum", None
    if "bicarbonate" in x.gas:
        return (
            x.gas["bicarbonate"],
            "blood_gas",
            "uses the gas analyzer's calculated bicarbonate in place of serum total CO2",
        )
    return None, None, None


def corrected_gap(x: DrawInputs) -> tuple[float | None, bool]:
    """The anion gap (albumin-corrected when albumin is given) and whether it was corrected."""
    hco3, _, _ = bicarbonate(x)
    na, cl = x.serum.get("sodium"), x.serum.get("chloride")
    if hco3 is None or na is None or cl is None:
        return None, False
    gap = na - (cl + hco3)
    if "albumin" in x.serum:
        return gap + 0.25 * (x.settings.albumin_normal - x.serum["albumin"]), True
    return gap, False


@dataclass(frozen=True, slots=True)
class SerumPicture:
    """Whether the draw shows a metabolic acidosis and of which kind, with the reason in words."""

    acidosis: bool | None
    """True when bicarbonate is low; None when no bicarbonate was given."""
    normal_gap: bool | None
    """True when the gap (corrected if possible) is not high; None when it cannot be computed."""
    words: str
    """The picture in words, for reasons."""


_new_picture = builder(SerumPicture)


def serum_picture(x: DrawInputs) -> SerumPicture:
    """The serum acid-base picture the urine indices are read against."""
    # Several indices of one draw ask in turn; the inputs of a draw are not changed once built.
    global _LAST_PICTURE
    last_x, last = _LAST_PICTURE
    if last_x is x and last is not None:
        return last
    picture = _serum_picture(x)
    _LAST_PICTURE = (x, picture)
    return picture


_LAST_PICTURE: tuple[DrawInputs | None, SerumPicture | None] = (None, None)


def _serum_picture(x: DrawInputs) -> SerumPicture:
    s = x.settings
    hco3, _, _ = bicarbonate(x)
    if hco3 is None:
        return _new_picture(None, None, "no plasma bicarbonate was given to confirm an acidosis")
    gap, corrected = corrected_gap(x)
    kind = "an albumin-corrected anion gap" if corrected else "an anion gap"
    if hco3 >= s.bicarbonate_low:
        return _new_picture(False, None, f"plasma bicarbonate {fmt(hco3)} is not low")
    ph = x.gas.get("ph")
    if ph is not None and ph > s.ph_high:
        return _new_picture(
            False,
            None,
            f"bicarbonate {fmt(hco3)} is low but pH {fmt(ph, 2)} is alkalemic: more likely renal "
            "compensation of a respiratory alkalosis than a metabolic acidosis",
        )
    if gap is None:
        return _new_picture(
            True, None, f"plasma bicarbonate {fmt(hco3)} is low but the anion gap is unknown"
        )
    if gap > s.anion_gap_upper:
        return _new_picture(
            True,
            False,
            f"bicarbonate {fmt(hco3)} with a high {kind.split(' ', 1)[1]} of {fmt(gap)}: unmeasured anions are "
            "present",
        )
    return _new_picture(
        True, True, f"bicarbonate {fmt(hco3)} with {kind} of {fmt(gap)}: a normal-gap acidosis"
    )


def ketones_present(x: DrawInputs) -> bool:
    """True when the urine dipstick shows ketones (trace or more)."""
    return x.urine.get("ketones", 0.0) > 0


def plasma_osmolality(x: DrawInputs) -> tuple[float | None, str, list[str]]:
    """Measured plasma osmolality, else 2 Na + glucose + urea; (value, how, missing inputs)."""
    if "osmolality" in x.serum:
        return x.serum["osmolality"], "measured", []
    need = []
    na, glu, urea = x.serum.get("sodium"), x.serum.get("glucose"), x.urea_mmol("serum")
    if na is None:
        need.append("serum.sodium")
    if glu is None:
        need.append("serum.glucose")
    if urea is None:
        need.append("serum.urea")
    if need:
        return None, "", ["serum.osmolality", *need]
    return 2 * na + glu + urea, "calculated", []  # type: ignore[operator]


def need_urea(x: DrawInputs, panel: str) -> list[str]:
    """[] when urea (or urea nitrogen) of ``panel`` is present, else its label."""
    return [] if x.urea_mmol(panel) is not None else [f"{panel}.urea"]
