"""Number formatting shared by every output, so a value reads the same in the app, CLI and notes."""

from __future__ import annotations

from workup.findings import STATUS_WORD, Finding

# Decimal places by unit: pH and unitless ratios to 2, everything else to 1, osmolality and eGFR
# whole. mmHg keeps one decimal because Winters' band edges fall on halves (28.5–32.5).
_DECIMALS = {"": 2, "%": 1, "mmHg": 1, "mOsm/kg": 0, "mL/min/1.73 m2": 0}
_ID_DECIMALS = {"tmp_gfr": 2}
"""Findings whose cut-offs sit on hundredths (TmP/GFR 0.80, children's 1.15 mmol/L): one decimal
would print 0.96 as "1.0" beside a limit of 1.15."""


def fmt_number(value: float | None, unit: str = "", decimals: int | None = None) -> str:
    """``value`` rounded for display (no unit); "—" when None."""
    if value is None:
        return "—"
    d = _DECIMALS.get(unit, 1) if decimals is None else decimals
    text = f"{value:.{d}f}"
    if text.startswith("-") and float(text) == 0:
        text = text[1:]
    return text


def fmt_value(f: Finding) -> str:
    """``value unit`` of a finding, e.g. "+23.0 mmol/L"; signed for gaps."""
    if f.value is None:
        return "—"
    text = fmt_number(f.value, f.unit, _ID_DECIMALS.get(f.id))
    if "gap" in f.id and f.value > 0 and "osmolal" not in f.id:
        text = "+" + text
    return f"{text} {f.unit}".strip()


def fmt_finding(f: Finding) -> str:
    """One line: name, value, status word and reading, e.g. "Anion gap 10.0 mmol/L [valid] normal"."""
    parts = [f.name, fmt_value(f), f"[{STATUS_WORD[f.status]}]"]
    if f.interpretation and f.value is not None:
        parts.append(f.interpretation)
    return " ".join(p for p in parts if p)
