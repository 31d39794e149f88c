"""What the anion gap and the delta ratio say about a metabolic acidosis.

:func:`chosen_gap` picks the gap the whole analysis reads (for the gas check's picture);
:func:`add_metabolic_acidosis` types an acidosis by its gap and adds what the delta ratio shows;
:func:`add_masked_high_gap` catches a high gap that the bicarbonate or pH hides.
"""

from __future__ import annotations

from typing import TYPE_CHECKING

from workup.acidbase.disorder_list import METABOLIC_ACIDOSES, DisorderList
from workup.acidbase.wording import fmt
from workup.findings import Evidence, Finding, Status, new_evidence
from workup.inputs import DrawInputs

if TYPE_CHECKING:  # the picture is built from chosen_gap, so it cannot be imported at run time
    from workup.acidbase.gas_check import Picture

DELTA_MIXED_BELOW = 0.8
"""A delta ratio below this with a high gap means an added normal-gap acidosis (Brandis,
Acid-Base Physiology)."""
DELTA_ALKALOSIS_ABOVE = 2.0
"""A delta ratio above this means an added metabolic alkalosis or a pre-existing compensated
respiratory acidosis (Brandis, Acid-Base Physiology)."""

GAP_SOURCES = (
    ("anion_gap_albumin_corrected", "albumin-corrected anion gap"),
    ("anion_gap", "anion gap (not albumin-corrected)"),
)
"""The gap findings in order of preference, with how each is named in evidence."""


def chosen_gap(findings: dict[str, Finding]) -> tuple[float | None, str, str | None]:
    """(gap, its words, its finding id) from the first usable gap finding; (None, "", None)."""
    for fid, words in GAP_SOURCES:
        f = findings.get(fid)
        if f is not None and f.usable:
            caution = " (caution: " + f.reasons[0] + ")" if f.status is Status.caution else ""
            return f.value, words + caution, fid
    return None, "", None


def delta(
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


def add_metabolic_acidosis(
    b: DisorderList,
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
    ratio, word, caution = delta(pic, x, findings)
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


def add_masked_high_gap(b: DisorderList, pic: Picture, x: DrawInputs) -> None:
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
