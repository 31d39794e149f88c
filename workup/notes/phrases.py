"""Words for findings: one clause per index that always carries its validity.

The rule these helpers keep: a value is written only when its finding is usable (``ok`` or
``caution``); a ``caution`` value always travels with its caveat; a ``not_valid`` finding is said
to be not interpretable, with the reason and without its number; a ``needs_input`` finding is
"not available" and names what to enter.
"""

from __future__ import annotations

import math

from workup.analytes import CATALOGUE, Panel
from workup.findings import Finding, Status
from workup.formatting import fmt_number, fmt_value

# How each index's interpretation word reads in a sentence (docs/indices.md fixes the words).
# A word not listed here is written as it stands, with underscores as spaces.
READING: dict[str, dict[str, str]] = {
    "anion_gap": {"low": "low", "normal": "normal", "high": "high"},
    "anion_gap_albumin_corrected": {"normal": "normal", "high": "high"},
    "delta_ratio": {
        "pure_normal_gap": "in keeping with a pure normal-gap acidosis",
        "mixed_high_and_normal_gap": "suggesting a high-gap acidosis combined with a normal-gap "
        "acidosis",
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
    "tmp_gfr": {"low": "low", "normal": "normal"},
    "fe_urate": {"high": "high", "normal": "normal"},
    "expected_pco2": {
        "appropriate": "appropriate",
        "respiratory_acidosis_added": "measured pCO2 above it (added respiratory acidosis)",
        "respiratory_alkalosis_added": "measured pCO2 below it (added respiratory alkalosis)",
    },
}

# Which way an index points on renal ammonium excretion, for spotting discordant measures.
AMMONIUM_DIRECTION: dict[str, dict[str, str]] = {
    "urine_anion_gap": {"negative": "adequate", "positive": "low"},
    "urine_osmolal_gap": {"adequate": "adequate", "low": "low"},
    "urine_ammonium_estimate": {"adequate": "adequate", "low": "low"},
    "urine_ammonium_creatinine_ratio": {"adequate": "adequate", "low": "low"},
}

_PANEL_WORDS = {"serum": "serum", "blood_gas": "blood gas", "urine": "urine"}


def reading(f: Finding) -> str | None:
    """The interpretation of ``f`` in words, or None when it has none."""
    if f.interpretation is None:
        return None
    if f.id == "egfr":
        return f"KDIGO category {f.interpretation}"
    return READING.get(f.id, {}).get(f.interpretation, f.interpretation.replace("_", " "))


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
    """The finding's expected range, e.g. "24-28 mmHg", when it has one."""
    if f.low is None or f.high is None:
        return None
    if not (math.isfinite(f.low) and math.isfinite(f.high)):
        return None
    lo, hi = fmt_number(f.low, f.unit), fmt_number(f.high, f.unit)
    return f"{lo}-{hi} {f.unit}".strip()


def caveats(f: Finding, brief: bool) -> list[str]:
    """The reasons to print beside a caution or not-valid finding (the first only when brief)."""
    reasons = [tidy(r) for r in f.reasons if tidy(r)]
    return reasons[:1] if brief else reasons


def clause(f: Finding, label: str, brief: bool, with_reading: bool = True) -> str:
    """One clause (no capital, no full stop) stating ``f`` with its validity.

    ``label`` names the index in the sentence, e.g. "the urine anion gap".
    """
    if stated(f):
        words = reading(f) if with_reading else None
        return f"{label} is {value_of(f)}" + caution_suffix(f, brief, words)
    if f.status is Status.not_valid:
        why = caveats(f, brief)
        return f"{label} was not interpretable" + (f" ({'; '.join(why)})" if why else "")
    return unavailable(f, label, brief)


def caution_suffix(f: Finding, brief: bool, words: str | None = None) -> str:
    """The parenthesis after a stated value: its reading and, for a caution, the caveat."""
    inner = [words] if words else []
    if f.status is Status.caution:
        why = caveats(f, brief)
        inner.append("read with caution: " + "; ".join(why) if why else "read with caution")
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
    text = text[0].upper() + text[1:]
    return text if text.endswith((".", "?", "!")) else text + "."


def join_clauses(parts: list[str]) -> str:
    """Clauses joined into one sentence body with semicolons."""
    return "; ".join(p for p in parts if p)
