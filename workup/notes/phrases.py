"""Words for findings: one clause per index that always carries its validity.

The rule these helpers keep: a value is written only when its finding is usable (``ok`` or
``caution``); a ``caution`` value always travels with its caveat; a ``not_valid`` finding is said
to be not interpretable, with the reason and without its number; a ``needs_input`` finding is
"not available" and names what to enter.
"""

from __future__ import annotations

import math

from workup.analytes import CATALOGUE, Panel
from workup.findings import BORDERLINE_SUFFIX, Finding, Status
from workup.formatting import fmt_number, fmt_value

# How each index's interpretation word reads in a sentence (docs/indices.md fixes the words).
# A word not listed here is written as it stands, with underscores as spaces.
READING: dict[str, dict[str, str]] = {
    "anion_gap": {"low": "low", "normal": "normal", "high": "high"},
    "anion_gap_albumin_corrected": {"normal": "normal", "high": "high"},
    "delta_ratio": {
        "pure_normal_gap": "in keeping with a pure normal-gap acidosis",
        # The 0.4-0.8 band also holds the acidosis of kidney failure (Brandis, Acid-Base
        # Physiology), so the words leave both readings open.
        "mixed_high_and_normal_gap": "in the range of a combined high-gap and normal-gap "
        "acidosis, also seen in the acidosis of kidney failure",
        "high_gap": "in keeping with an uncomplicated high-gap acidosis",
        "high_gap_plus_alkalosis": "suggesting a high-gap acidosis with an added metabolic "
        "alkalosis (or a pre-existing compensated respiratory acidosis)",
    },
    "serum_osmolal_gap": {"normal": "normal", "raised": "raised"},
    "urine_ph": {
        "acidified": "appropriately acidified",
        "not_acidified": "not acidified despite the acidosis",
    },
    "urine_anion_gap": {
        "negative": "negative, in keeping with adequate ammonium excretion",
        "indeterminate": "indeterminate",
        "positive": "positive, in keeping with low ammonium excretion",
    },
    "urine_osmolal_gap": {
        "adequate": "in keeping with adequate ammonium excretion",
        "indeterminate": "indeterminate for ammonium excretion",
        "low": "in keeping with low ammonium excretion",
    },
    "urine_ammonium_estimate": {
        "adequate": "adequate",
        "indeterminate": "indeterminate",
        "low": "low for the acidosis",
    },
    "urine_ammonium_creatinine_ratio": {
        "adequate": "adequate",
        "indeterminate": "indeterminate",
        "low": "low for the acidosis",
    },
    "fe_bicarbonate": {"low": "low", "intermediate": "intermediate", "high": "high"},
    "urine_blood_pco2": {
        "normal": "normal, in keeping with intact distal proton secretion",
        "low": "low, in keeping with impaired distal proton secretion",
    },
    "fe_phosphate": {"wasting": "in keeping with renal phosphate wasting", "normal": "normal"},
    "tmp_gfr": {"low": "low", "normal": "normal", "high": "high"},
    "fe_urate": {"high": "high", "normal": "normal"},
    "expected_pco2": {
        "appropriate": "appropriate",
        "respiratory_acidosis_added": "measured pCO2 above it (added respiratory acidosis)",
        "respiratory_alkalosis_added": "measured pCO2 below it (added respiratory alkalosis)",
    },
}

# The daily note's shorter words for the same readings (anything not listed reads as in READING).
BRIEF_READING: dict[str, dict[str, str]] = {
    "delta_ratio": {
        "pure_normal_gap": "pure normal gap",
        "mixed_high_and_normal_gap": "mixed-gap range, also seen in kidney failure",
        "high_gap": "high gap",
        "high_gap_plus_alkalosis": "high gap with added alkalosis",
    },
    "urine_ph": {"acidified": "acidified", "not_acidified": "not acidified"},
    "urine_anion_gap": {
        "negative": "negative",
        "indeterminate": "indeterminate",
        "positive": "positive",
    },
    "urine_osmolal_gap": {
        "adequate": "adequate NH4",
        "indeterminate": "indeterminate",
        "low": "low NH4",
    },
    "urine_ammonium_estimate": {"low": "low"},
    "urine_ammonium_creatinine_ratio": {"low": "low"},
    "urine_blood_pco2": {"normal": "normal", "low": "low"},
    "fe_phosphate": {"wasting": "wasting"},
}

# The daily note's names for the indices; trade abbreviations keep their usual spelling.
BRIEF_LABEL: dict[str, str] = {
    "anion_gap": "AG",
    "anion_gap_albumin_corrected": "albumin-corrected AG",
    "delta_ratio": "delta ratio",
    "urine_ph": "urine pH",
    "urine_anion_gap": "UAG",
    "urine_osmolal_gap": "UOG",
    "urine_ammonium_creatinine_ratio": "urine NH4/creatinine",
    "ttkg": "TTKG",
    "urine_potassium_creatinine_ratio": "urine K/creatinine",
    "egfr": "eGFR",
    "fe_bicarbonate": "FEHCO3",
}

# Which way an index points on renal ammonium excretion, for spotting discordant measures.
AMMONIUM_DIRECTION: dict[str, dict[str, str]] = {
    "urine_anion_gap": {"negative": "adequate", "positive": "low"},
    "urine_osmolal_gap": {"adequate": "adequate", "low": "low"},
    "urine_ammonium_estimate": {"adequate": "adequate", "low": "low"},
    "urine_ammonium_creatinine_ratio": {"adequate": "adequate", "low": "low"},
}

_PANEL_WORDS = {"serum": "serum", "blood_gas": "blood gas", "urine": "urine"}


def reading(f: Finding, brief: bool = False) -> str | None:
    """The interpretation of ``f`` in words (shorter when ``brief``), or None when it has none."""
    if f.interpretation is None:
        return None
    if f.id in ("egfr", "egfr_schwartz"):
        return f.interpretation if brief else f"KDIGO category {f.interpretation}"
    word = plain_word(f)
    if "unmeasured_anions" in f.extra:
        # Beside ample ammonium the urine anion gap is not read as low ammonium; the caution
        # that follows says why.
        return word.replace("_", " ")
    # A borderline reading keeps its side's phrase and says it sits on the cut-off.
    mark = " (borderline)" if f.borderline else ""
    if brief and word in BRIEF_READING.get(f.id, {}):
        return BRIEF_READING[f.id][word] + mark
    return READING.get(f.id, {}).get(word, word.replace("_", " ")) + mark


def plain_word(f: Finding) -> str:
    """``f``'s interpretation word without the borderline suffix ("" when it has none)."""
    word = f.interpretation or ""
    return word.removesuffix(BORDERLINE_SUFFIX) if f.borderline else word


def input_words(label: str) -> str:
    """A ``panel.analyte`` label in words ("urine.sodium" -> "urine sodium")."""
    panel, _, key = label.partition(".")
    if panel in _PANEL_WORDS and key:
        a = CATALOGUE[Panel(panel)].get(key)
        # "osmolality (measured)" reads as plain "osmolality" inside a parenthesis of its own.
        name = a.name.split(" (")[0] if a is not None else key.replace("_", " ")
        return f"{_PANEL_WORDS[panel]} {name}"
    return label.replace("_", " ").replace(".", " ")


def tidy(reason: str) -> str:
    """A reason or evidence text ready to sit inside a sentence (no closing full stop)."""
    return reason.strip().rstrip(".").strip()


def stated(f: Finding) -> bool:
    """True when the note may write ``f``'s number: usable and a finite number."""
    return f.usable and f.value is not None and math.isfinite(f.value)


def value_of(f: Finding) -> str:
    """The finding's value with unit, the way every other output writes it."""
    return fmt_value(f)


def band_of(f: Finding) -> str | None:
    """The finding's expected range, e.g. "24-28 mmHg", when it has one.

    Bounds keep one decimal where the unit's whole-number rounding would move them (a Winters band
    of 28.5-32.5 must not read 28-32).
    """
    if f.low is None or f.high is None:
        return None
    if not (math.isfinite(f.low) and math.isfinite(f.high)):
        return None

    def bound(x: float) -> str:
        text = fmt_number(x, f.unit)
        return text if float(text) == round(x, 6) else fmt_number(x, f.unit, 1)

    return f"{bound(f.low)}-{bound(f.high)} {f.unit}".strip()


def caveat(f: Finding) -> str | None:
    """The reason to print beside a caution or not-valid finding: the first one.

    Calculators put the reasons that make a value not valid first, then caveats, then plain
    readings (workup.indices._common.Judge), so the first reason is the one that explains the
    status; the rest restate the reading and stay in the assessment.
    """
    reasons = [tidy(r) for r in f.reasons if tidy(r)]
    return reasons[0] if reasons else None


def _once(text: str | None, seen: set[str] | None) -> str | None:
    """``text``, or "as above" when the note has already said it (``seen`` is updated)."""
    if text is None or seen is None:
        return text
    if text in seen:
        return "as above"
    seen.add(text)
    return text


def clause(
    f: Finding,
    label: str,
    brief: bool,
    with_reading: bool = True,
    seen: set[str] | None = None,
    words_for: str | None = None,
) -> str:
    """One clause (no capital, no full stop) stating ``f`` with its validity.

    ``label`` names the index in the sentence, e.g. "the urine anion gap". ``seen`` collects the
    caveats already written, so a caveat shared by two indices is written once. ``words_for``
    replaces the usual words for the reading when the context changes them.
    """
    if stated(f):
        words = (words_for or reading(f, brief)) if with_reading else None
        return f"{label} is {value_of(f)}" + caution_suffix(f, words, seen, brief)
    if f.status is Status.not_valid:
        why = _gist(_once(caveat(f), seen), brief)
        return f"{label} was not interpretable" + (f" ({why})" if why else "")
    return unavailable(f, label, brief)


def _gist(why: str | None, brief: bool) -> str | None:
    # A short note keeps the first clause of a caveat (the fact); the full note explains it.
    if not why or not brief:
        return why
    return why.split(": ")[0]


def caution_suffix(
    f: Finding, words: str | None = None, seen: set[str] | None = None, brief: bool = False
) -> str:
    """The parenthesis after a stated value: its reading and, for a caution, the caveat
    (its first clause only when ``brief``)."""
    inner = [words] if words else []
    if f.borderline and "borderline" not in (words or ""):
        inner.append("borderline: within the margin of its cut-off")
    if f.status is Status.caution:
        why = _gist(_once(caveat(f), seen), brief)
        inner.append(f"read with caution: {why}" if why else "read with caution")
    return f" ({'; '.join(inner)})" if inner else ""


def unavailable(f: Finding, label: str, brief: bool) -> str:
    """The clause for a finding without a usable number: not available, and what it needs."""
    if f.needs and not brief:
        return f"{label} is not available (needs {', '.join(input_words(n) for n in f.needs)})"
    return f"{label} is not available"


def sentence(text: str) -> str:
    """``text`` with a capital first letter and one closing full stop."""
    text = text.strip()
    if not text:
        return ""
    if not (len(text) > 1 and text[1].isupper()):  # "pH", "pCO2", "eGFR" keep their case
        text = text[0].upper() + text[1:]
    return text if text.endswith((".", "?", "!")) else text + "."


def join_clauses(parts: list[str]) -> str:
    """Clauses joined into one sentence body with semicolons."""
    return "; ".join(p for p in parts if p)
