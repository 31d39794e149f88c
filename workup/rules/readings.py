"""The readings the cause rules rest on: one reading per question, chosen from the draw that can
answer it.

Steady-state questions come from draws taken during the normal-gap acidosis without a loading
test, loading questions from bicarbonate-loading draws, acidification from furosemide–fludrocortisone
or ammonium-chloride draws. Only findings with status ok or caution become readings; a not-valid one
is kept as "set aside" with its reason, so it can never drive a verdict. :mod:`.questions` turns
the readings into the answers the cause tables look up.
"""

from __future__ import annotations

from collections.abc import Iterable
from dataclasses import dataclass, field

from workup.context import Flag
from workup.findings import BORDERLINE_SUFFIX, DrawResult, Finding, Status
from workup.formatting import fmt_number
from workup.frozen import builder
from workup.indices.kidney import egfr_id
from workup.model import LoadingTest
from workup.settings import Settings

STATUS_FACTOR = {Status.ok: 1.0, Status.caution: 0.5}
"""Reliability multiplier of a reading: a caution-status finding weighs half an ok one."""
BORDERLINE_FACTOR = 0.0
"""Further multiplier of a borderline reading (a value within its cut-off's imprecision): it is
listed as evidence but adds no weight, because halving was not enough to stop one value on its
threshold deciding between two causes that nothing else separates."""

FURO_ACIDIFIED_BELOW = 5.3
"""Urine pH below this in any sample of a furosemide–fludrocortisone or short ammonium-chloride
test means normal distal acidification (Walsh et al., Kidney Int 2007; Wrong & Davies, QJM 1959;
both from memory)."""
GLUCOSURIA_ABOVE = 1.0
"""Urine glucose above this (mmol/L) is glucosuria (common practice)."""
RENAL_GLUCOSE_THRESHOLD = 10.0
"""Plasma glucose (mmol/L, 180 mg/dL) above which glucosuria is expected from filtered load alone
(common practice)."""


@dataclass(frozen=True, slots=True)
class Reading:
    """One answer to one question, from one draw."""

    key: str
    """The question: ``urine_ph``, ``urine_osmolal_gap``, ``potassium``, ``fe_bicarbonate``..."""
    word: str
    """The reading in words: an index interpretation, or ``hypo``/``normal``/``hyper``..."""
    value: float | None
    """The number it rests on."""
    draw: str
    """The draw's label."""
    index: str | None
    """The finding id, or None for a raw value."""
    factor: float
    """Reliability multiplier (see STATUS_FACTOR)."""
    text: str
    """The number in words, e.g. "urine pH 6.8 (baseline)"."""


@dataclass
class Readings:
    """Every reading chosen for the case, and the findings set aside as not valid."""

    by_key: dict[str, Reading] = field(default_factory=dict)
    """The chosen reading of each question."""
    set_aside: dict[str, str] = field(default_factory=dict)
    """Question key → why its finding could not be used (not valid), in words."""
    acidosis_draws: list[str] = field(default_factory=list)
    """Labels of the draws with a normal-gap acidosis and no loading test."""
    context: frozenset[Flag] = frozenset()
    """The case's context flags."""
    egfr_needs: tuple[str, ...] = ()
    """What the eGFR of the patient's age still needs when no draw gives one (e.g.
    ``patient.height`` for a child's bedside Schwartz eGFR), so the question can ask for it."""
    unmeasured_anions: str | None = None
    """When a positive or near-zero urine anion gap sits beside ample ammonium in an acidosis
    draw (anions the gap does not count), the two readings in words; else None."""

    def get(self, key: str) -> Reading | None:
        """The reading of ``key``, if any."""
        return self.by_key.get(key)


new_reading = builder(Reading)
"""A fast constructor of :class:`Reading` (see workup.frozen): readings are made for every case
of a library index."""

# Which finding answers which question, and in what kind of draw.
STEADY_INDICES = {
    "urine_ph": "urine_ph",
    "urine_osmolal_gap": "urine_osmolal_gap",
    "urine_anion_gap": "urine_anion_gap",
    "ttkg": "ttkg",
    "urine_potassium_creatinine_ratio": "urine_potassium_creatinine_ratio",
    "fe_phosphate": "fe_phosphate",
    "tmp_gfr": "tmp_gfr",
    "fe_urate": "fe_urate",
}
LOADING_INDICES = {"fe_bicarbonate": "fe_bicarbonate", "urine_blood_pco2": "urine_blood_pco2"}
NAME = {
    "urine_ph": "urine pH",
    "urine_osmolal_gap": "urine osmolal gap",
    "urine_anion_gap": "urine anion gap",
    "measured_ammonium": "measured urine ammonium",
    "ttkg": "TTKG",
    "urine_potassium_creatinine_ratio": "urine K/creatinine",
    "fe_phosphate": "FEPO4",
    "tmp_gfr": "TmP/GFR",
    "fe_urate": "FE urate",
    "fe_bicarbonate": "FEHCO3 on bicarbonate loading",
    "urine_blood_pco2": "urine-minus-blood pCO2",
    "egfr": "eGFR",
}


def _has_normal_gap_acidosis(r: DrawResult) -> bool:
    return any(d.id == "normal_gap_metabolic_acidosis" for d in r.disorders)


def _unit(f: Finding) -> str:
    return f" {f.unit}" if f.unit else ""


def _num(f: Finding) -> str:
    """A reading's number rounded as everywhere else (app, CLI, note): workup.formatting."""
    return fmt_number(f.value, f.unit)


def _better(new: Reading, old: Reading | None) -> bool:
    """An ok reading beats a caution one; among equals the later draw wins."""
    return old is None or new.factor >= old.factor


def _offer(out: Readings, key: str, f: Finding | None, draw: str) -> None:
    """Take finding ``f`` as the reading of ``key`` if usable and better than what is there."""
    if f is None or f.value is None:
        return
    if not f.usable or f.interpretation is None:
        if f.status is Status.not_valid and key not in out.by_key:
            why = f.reasons[0] if f.reasons else "a validity condition fails"
            out.set_aside[key] = f"{NAME.get(key, f.name)} ({draw}) not valid: {why}"
        return
    # A borderline value keeps its side's answer word but adds no weight, so that no cause
    # leads or falls on one value sitting on its threshold.
    word = f.interpretation.removesuffix(BORDERLINE_SUFFIX)
    factor = STATUS_FACTOR[f.status] * (BORDERLINE_FACTOR if f.borderline else 1.0)
    flags = (", caution" if f.status is Status.caution else "") + (
        ", borderline" if f.borderline else ""
    )
    r = new_reading(
        key, word, f.value, draw, f.id, factor,
        f"{NAME.get(key, f.name)} {_num(f)}{_unit(f)} ({draw}{flags})",
    )  # fmt: skip
    if _better(r, out.by_key.get(key)):
        out.by_key[key] = r
        out.set_aside.pop(key, None)


def gather(draws: Iterable[DrawResult], context: Iterable[Flag], s: Settings) -> Readings:
    """Choose one reading per question from the draws that can answer it (see module doc)."""
    out = Readings(context=frozenset(context))
    acid_test_ph: list[tuple[float, str]] = []
    for r in draws:
        x, found = r.inputs, r.findings
        during = x.during
        if during is LoadingTest.bicarbonate_loading:
            for key, fid in LOADING_INDICES.items():
                _offer(out, key, found.get(fid), r.label)
            continue
        if during is not None:
            if "ph" in x.urine:
                acid_test_ph.append((x.urine["ph"], r.label))
            continue
        kidney = found.get(egfr_id(x.age))
        _offer(out, "egfr", kidney, r.label)
        if kidney is not None and kidney.value is None and not out.egfr_needs:
            out.egfr_needs = kidney.needs
        if not _has_normal_gap_acidosis(r):
            continue
        out.acidosis_draws.append(r.label)
        for key, fid in STEADY_INDICES.items():
            _offer(out, key, found.get(fid), r.label)
        uag = found.get("urine_anion_gap")
        if uag is not None and uag.value is not None and "unmeasured_anions" in uag.extra:
            out.unmeasured_anions = (
                f"urine anion gap {_num(uag)} mmol/L ({r.label}) beside "
                f"{uag.extra['unmeasured_anions'].removeprefix('the ')}"
            )
        if "ammonium" in x.urine:
            # A measured ammonium is the reference; the ratio to creatinine is preferred because
            # it does not depend on how concentrated the urine is.
            for fid in ("urine_ammonium_creatinine_ratio", "urine_ammonium_estimate"):
                f = found.get(fid)
                if f is not None and f.usable:
                    _offer(out, "measured_ammonium", f, r.label)
                    break
        k = x.serum.get("potassium")
        if k is not None:
            word = "hypo" if k < s.potassium_low else "hyper" if k > s.potassium_high else "normal"
            out.by_key["potassium"] = new_reading(
                "potassium",
                word,
                k,
                r.label,
                None,
                1.0,
                f"serum potassium {fmt_number(k, 'mmol/L')} ({r.label})",
            )
        hco3 = x.serum.get("bicarbonate", x.gas.get("bicarbonate"))
        if hco3 is not None and (
            "bicarbonate" not in out.by_key or hco3 < (out.by_key["bicarbonate"].value or 0)
        ):
            out.by_key["bicarbonate"] = new_reading(
                "bicarbonate", "low", hco3, r.label, None, 1.0,
                f"plasma bicarbonate {fmt_number(hco3, 'mmol/L')} ({r.label})",
            )  # fmt: skip
        ug, sg = x.urine.get("glucose"), x.serum.get("glucose")
        if ug is not None and sg is not None and sg <= RENAL_GLUCOSE_THRESHOLD:
            word = "present" if ug > GLUCOSURIA_ABOVE else "absent"
            out.by_key["glucosuria"] = new_reading(
                "glucosuria", word, ug, r.label, None, 1.0,
                f"urine glucose {fmt_number(ug, 'mmol/L')} mmol/L with plasma glucose "
                f"{fmt_number(sg, 'mmol/L')} "
                f"({r.label})",
            )  # fmt: skip
    if acid_test_ph:
        low, label = min(acid_test_ph)
        word = "acidified" if low < FURO_ACIDIFIED_BELOW else "not_acidified"
        out.by_key["acidification_test"] = new_reading(
            "acidification_test", word, low, label, None, 1.0,
            f"lowest urine pH {low:.2f} during an acidification test ({label})",
        )  # fmt: skip
    return out
