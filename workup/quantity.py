"""Reading one written value ("14", "1.1 mg/dL", "3.9 kPa") into a measurement with a known unit.

The rule that keeps patients safe: a unit is never guessed from a number's size. A bare number is
accepted only where the analyte has one customary unit everywhere, or where the case names its
unit system; otherwise the value is refused with a message that names the field and the fix.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass, field

from workup.analytes import KETONE_GRADES, Analyte, UnitSystem

_NUMBER_UNIT = re.compile(r"^\s*([-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*?)\s*$")


class ValueProblem(ValueError):
    """A written value that cannot be read; the message says why and how to fix it."""


@dataclass(frozen=True, slots=True)
class Measurement:
    """One value as written, with the unit it was read in and its canonical equivalent."""

    value: float
    """The number as written."""
    unit: str
    """The unit it was read in (the canonical symbol of that unit)."""
    canonical: float
    """The same quantity in the analyte's canonical unit."""
    bare: bool = field(default=False, compare=False)
    """True when the file wrote a bare number (its unit came from the analyte or ``units:``)."""
    word: str | None = None
    """For dipstick analytes, the grade word as written."""

    def written(self, analyte: Analyte) -> float | str:
        """How to write this value back into a case file."""
        if self.word is not None:
            return self.word
        number = _tidy(self.value)
        if not analyte.ambiguous and self.unit == analyte.canonical:
            return number
        if not self.unit:
            return number
        return f"{number} {self.unit}"


def _tidy(x: float) -> float | int:
    return int(x) if float(x).is_integer() and abs(x) < 1e15 else x


def read_value(analyte: Analyte, raw: object, system: UnitSystem | None) -> Measurement:
    """Read ``raw`` (number or "NUMBER UNIT") as a measurement of ``analyte``.

    Raises ValueProblem with a message fit to show the user. Hard plausibility limits are
    checked here; the softer "unusual" range is left to :func:`unusual`.
    """
    if isinstance(raw, bool) or raw is None:
        raise ValueProblem(f"expected a number, got {raw!r}")
    if analyte.words:
        return _read_word(analyte, raw)
    unit = None
    bare = False
    if isinstance(raw, int | float):
        try:
            number = float(raw)
        except OverflowError:
            raise ValueProblem(f"{str(raw)[:12]}… is too large to be a measurement") from None
        bare = True
    elif isinstance(raw, str):
        m = _NUMBER_UNIT.match(raw)
        if not m or "," in raw:
            raise ValueProblem(
                f"cannot read {raw!r}: write a number with an optional unit, "
                f'for example "{_example(analyte)}" (use a point, not a comma, for decimals)'
            )
        number = float(m.group(1))
        text_unit = m.group(2)
        if text_unit:
            unit = analyte.unit(text_unit)
            if unit is None:
                known = ", ".join(u.symbol for u in analyte.units if u.symbol) or "no unit"
                raise ValueProblem(f"unknown unit {text_unit!r} for {analyte.name}; use {known}")
        else:
            bare = True
    else:
        raise ValueProblem(f"expected a number, got {type(raw).__name__}")
    if not math.isfinite(number):
        raise ValueProblem(f"{raw!r} is not a finite number")
    if unit is None:
        unit = _bare_unit(analyte, system)
    canonical = number * unit.factor
    low, high = analyte.hard
    if not (low <= canonical <= high):
        shown = _tidy(round(canonical, 3))
        where = f" ({shown} {analyte.canonical})" if unit.factor != 1.0 else ""
        raise ValueProblem(
            f"{_tidy(number)} {unit.symbol}".rstrip()
            + f"{where} is not a possible {analyte.name}: the limit is {_tidy(low)}–{_tidy(high)}"
            + (f" {analyte.canonical}" if analyte.canonical else "")
            + "; check for a typing slip or a wrong unit"
        )
    return Measurement(number, unit.symbol, canonical, bare=bare)


def _bare_unit(analyte: Analyte, system: UnitSystem | None):
    if not analyte.ambiguous:
        return analyte.canonical_unit
    if system is None:
        choices = " or ".join(f'"{_example(analyte, u)}"' for u in analyte.units if u.system)
        raise ValueProblem(
            f"a bare number is ambiguous for {analyte.name}: write the unit ({choices}), "
            "or set `units: conventional` or `units: si` for the case"
        )
    unit = analyte.unit_for(system)
    if unit is None:
        raise ValueProblem(
            f"{analyte.name} has no {system.value} unit. {analyte.note}".strip()
            if analyte.note
            else f"{analyte.name} has no {system.value} unit; write the unit"
        )
    return unit


def _read_word(analyte: Analyte, raw: object) -> Measurement:
    word = str(raw).strip().lower()
    if word in ("0", "neg", "none"):
        word = "negative"
    if word not in KETONE_GRADES:
        raise ValueProblem(
            f"{raw!r} is not a dipstick grade; use one of {', '.join(analyte.words)}"
        )
    grade = float(KETONE_GRADES[word])
    return Measurement(grade, "grade", grade, word=word)


def _example(analyte: Analyte, unit=None) -> str:
    unit = unit or next((u for u in analyte.units if u.system), analyte.units[0])
    low, high = analyte.usual
    typical = (low * high) ** 0.5 if low > 0 else (low + high) / 2
    mid = typical / unit.factor
    mid = round(mid, 1) if mid < 20 else round(mid)
    return f"{_tidy(mid)} {unit.symbol}".strip()


def unusual(analyte: Analyte, m: Measurement) -> str | None:
    """A caution when the value is possible but outside the usual clinical range, else None."""
    low, high = analyte.usual
    if low <= m.canonical <= high:
        return None
    side = "low" if m.canonical < low else "high"
    return (
        f"{analyte.name} {_tidy(round(m.value, 3))} {m.unit}".rstrip()
        + f" is unusually {side}: confirm it with the laboratory"
    )


def convert(analyte: Analyte, canonical: float, unit_symbol: str) -> float:
    """Express a canonical value of ``analyte`` in ``unit_symbol`` (round-trip of read_value)."""
    unit = analyte.unit(unit_symbol) if unit_symbol else analyte.canonical_unit
    if unit is None:
        raise ValueProblem(f"unknown unit {unit_symbol!r} for {analyte.name}")
    return canonical / unit.factor
