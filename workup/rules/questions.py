"""The questions the causes are judged on: the answer word a case gives to each, and what to enter
when it gives none.

:func:`answers` reads the chosen :mod:`.readings` (and the :mod:`.ammonium` call) into answers such
as ``("urine_ph", "acidified")``; each cause's table in :mod:`workup.rules.causes` has one row per
answer that bears on it. A new answer word belongs in :data:`ANSWERS` and in :func:`answers`.
"""

from __future__ import annotations

from workup.rules.ammonium import AmmoniumCall
from workup.rules.causes import MISSING
from workup.rules.readings import Reading, Readings, new_reading
from workup.settings import Settings

TYPE4_USUAL_HCO3_MIN = 16.0
"""Type 4 RTA runs a mild acidosis, serum HCO3 about 16–22 (Berend et al., Kidney Dis 2017,
Table 1)."""
MILD_ACIDOSIS_HCO3_MIN = 12.0
"""Proximal RTA and CKD acidosis seldom take serum HCO3 below about 12 (Berend 2017 Table 1:
proximal 12–20; common practice for CKD)."""
EGFR_MODERATE_BELOW = 45
"""eGFR (mL/min/1.73 m²) below which kidney function is moderately reduced (common practice)."""
EGFR_MILD_BELOW = 60
"""eGFR below which kidney function is mildly reduced (common practice)."""

ANSWERS: dict[str, tuple[str, ...]] = {
    "ammonium": ("high", "clearly_high", "low"),
    "urine_ph": ("acidified", "not_acidified", "not_acidified_high_ammonium"),
    "acidification_test": ("acidified", "not_acidified"),
    "potassium": ("hypo", "normal", "hyper"),
    "k_response": (
        "too_low_for_hyperkalemia",
        "responds_to_hyperkalemia",
        "wasting_in_hypokalemia",
        "conserving_in_hypokalemia",
    ),
    "fe_bicarbonate": ("low", "intermediate", "high"),
    "urine_blood_pco2": ("low", "normal"),
    "phosphate": ("wasting", "normal"),
    "fe_urate": ("high", "normal"),
    "glucosuria": ("present", "absent"),
    "egfr": ("below_ckd_cutoff", "below_45", "below_60", "60_or_more"),
    "bicarbonate": ("severe", "moderate", "mild"),
}
"""Question → the answer words a case can give, in the order :func:`answers` asks them.
``clearly_high`` ammonium is a high call whose leading reading is over its clearly-high cut-off
(:func:`workup.rules.ammonium.grade`). ``severe``
bicarbonate is below :data:`MILD_ACIDOSIS_HCO3_MIN`, ``moderate`` below
:data:`TYPE4_USUAL_HCO3_MIN`; ``below_ckd_cutoff`` eGFR is below the settings' ``egfr_ckd_below``."""

QUESTION: dict[str, tuple[tuple[str, ...], str]] = {
    "ammonium": (
        ("measured_ammonium", "urine_osmolal_gap", "urine_anion_gap"),
        "urine ammonium during the acidosis (measured NH4, or urine Na, K, Cl, osmolality, "
        "urea and glucose for the urine gaps)",
    ),
    "potassium": (("potassium",), "serum potassium during the acidosis"),
    "k_response": (
        ("ttkg", "urine_potassium_creatinine_ratio"),
        "renal potassium response (urine K with osmolality or creatinine)",
    ),
    "urine_ph": (("urine_ph",), "urine pH during the acidosis (fresh sample, pH meter)"),
    "fe_bicarbonate": (("fe_bicarbonate",), "FEHCO3 during bicarbonate loading"),
    "urine_blood_pco2": (
        ("urine_blood_pco2",),
        "urine-minus-blood pCO2 during bicarbonate loading (urine pH ≥ 7.6)",
    ),
    "phosphate": (("fe_phosphate", "tmp_gfr"), "phosphate handling (FEPO4 or TmP/GFR)"),
    "glucosuria": (("glucosuria",), "urine glucose with plasma glucose"),
    "fe_urate": (("fe_urate",), "FE urate"),
    "egfr": (("egfr",), "eGFR (serum creatinine, age and sex)"),
    "acidification_test": (
        ("acidification_test",),
        "lowest urine pH on a furosemide–fludrocortisone or ammonium-chloride test",
    ),
}
"""Question → (reading keys that answer it, what to enter in words)."""

CHILD_EGFR_WORDS = (
    "eGFR: the child's height (cm) with serum creatinine, for the bedside Schwartz eGFR "
    "(Schwartz et al., JASN 2009; CKD-EPI does not apply under 18)"
)
"""What the ``egfr`` question asks for when a child's eGFR is waiting for a height."""


Answer = tuple[tuple[str, str], Reading]
"""((question, answer word), the reading it rests on): the key the cause tables are looked up
by, and the reading whose text leads each piece of evidence and whose reliability factor scales
each rule's base weight."""


def _k_response(rd: Readings) -> Reading | None:
    """TTKG or urine K/creatinine, whichever is more reliable; K/creatinine on a tie, because
    urea recycling undermines the TTKG (Kamel & Halperin 2011, from memory; Halperin 2017)."""
    a, b = rd.get("urine_potassium_creatinine_ratio"), rd.get("ttkg")
    if a is None or (b is not None and b.factor > a.factor):
        return b
    return a


def answers(rd: Readings, nh4: AmmoniumCall | None, s: Settings) -> list[Answer]:
    """Every question the case answers, in a fixed order (the order evidence is listed in)."""
    out: list[Answer] = []
    get = rd.by_key.get  # a local: this runs for every case of a library index
    if nh4 is not None:
        # The call stands as one reading whose factor is its strength: the ammonium rows of the
        # cause tables are shares of that strength. A clearly high call has rows of its own,
        # heavier against the causes that lower ammonium.
        lead = nh4.lead
        call = new_reading("ammonium", nh4.word, nh4.weight, lead.draw, lead.index, nh4.weight,
                           nh4.text)  # fmt: skip
        word = "clearly_high" if nh4.grade == "clearly_high" else nh4.word
        out.append((("ammonium", word), call))
    r = get("urine_ph")
    if r is not None:
        word = "acidified"
        if r.word == "not_acidified":
            # High ammonium buffers urine and raises its pH (Batlle et al., NEJM 1988), so a
            # high pH then says little about distal H+ secretion.
            high_nh4 = nh4 is not None and nh4.word == "high"
            word = "not_acidified_high_ammonium" if high_nh4 else "not_acidified"
        out.append((("urine_ph", word), r))
    r = get("acidification_test")
    if r is not None:
        out.append((("acidification_test", r.word), r))
    kal = get("potassium")
    if kal is not None:
        out.append((("potassium", kal.word), kal))
    r = _k_response(rd)
    if r is not None and kal is not None and kal.word != "normal":
        # The renal potassium response means something only against the serum potassium.
        if kal.word == "hyper":
            word = "too_low_for_hyperkalemia" if r.word == "low" else "responds_to_hyperkalemia"
        else:
            word = "wasting_in_hypokalemia" if r.word == "high" else "conserving_in_hypokalemia"
        out.append((("k_response", word), r))
    r = get("fe_bicarbonate")
    if r is not None:
        out.append((("fe_bicarbonate", r.word), r))
    r = get("urine_blood_pco2")
    if r is not None:
        out.append((("urine_blood_pco2", "low" if r.word == "low" else "normal"), r))
    phos, tmp = get("fe_phosphate"), get("tmp_gfr")
    if tmp is not None and (phos is None or tmp.factor > phos.factor):
        phos = tmp
    if phos is not None:
        wasting = phos.word in ("wasting", "low")
        out.append((("phosphate", "wasting" if wasting else "normal"), phos))
    r = get("fe_urate")
    if r is not None:
        out.append((("fe_urate", "high" if r.word == "high" else "normal"), r))
    r = get("glucosuria")
    if r is not None:
        out.append((("glucosuria", "present" if r.word == "present" else "absent"), r))
    r = get("egfr")
    if r is not None and r.value is not None:
        g = r.value
        if g < s.egfr_ckd_below:
            word = "below_ckd_cutoff"
        elif g < EGFR_MODERATE_BELOW:
            word = "below_45"
        elif g < EGFR_MILD_BELOW:
            word = "below_60"
        else:
            word = "60_or_more"
        out.append((("egfr", word), r))
    r = get("bicarbonate")
    if r is not None and r.value is not None:
        h = r.value
        if h < MILD_ACIDOSIS_HCO3_MIN:
            word = "severe"
        elif h < TYPE4_USUAL_HCO3_MIN:
            word = "moderate"
        else:
            word = "mild"
        out.append((("bicarbonate", word), r))
    return out


def missing_for(pid: str, rd: Readings) -> tuple[str, ...]:
    """What would bear on pattern ``pid`` but is absent or not valid, in words."""
    out: list[str] = []
    have = rd.by_key
    for q in MISSING[pid]:
        keys, words = QUESTION[q]
        if not have.keys().isdisjoint(keys):  # some reading answers it
            continue
        if q == "egfr" and "patient.height" in rd.egfr_needs:
            words = CHILD_EGFR_WORDS
        aside = [rd.set_aside[k] for k in keys if k in rd.set_aside]
        out.append(words + (" — " + "; ".join(aside) if aside else ""))
    return tuple(out)
