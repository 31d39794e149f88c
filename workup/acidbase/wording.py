"""How numbers read in the acid-base evidence sentences; shared by every step of the analysis
and by the cause rules that quote a cut-off."""

from __future__ import annotations


def fmt_ph(value: float) -> str:
    """A pH for an evidence sentence, always with two decimals."""
    return f"{value:.2f}"


def fmt(value: float) -> str:
    """A number for an evidence sentence: at most two decimals, trailing zeros dropped."""
    text = f"{value:.2f}".rstrip("0").rstrip(".")
    return "0" if text in ("-0", "") else text
