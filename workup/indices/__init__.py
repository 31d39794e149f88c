"""Every index: one pure function each, returning a Finding with its validity and source.

``REGISTRY`` lists the calculators in display order (the order a fellow reads a workup: the gas,
the serum gaps, renal acid excretion, potassium, tubular tests, kidney function). Each calculator
takes a :class:`workup.inputs.DrawInputs` and returns exactly one Finding, never raising for any
combination of present, missing or extreme values.
"""

from __future__ import annotations

from collections.abc import Callable

from workup.findings import Finding
from workup.indices import serum_gaps
from workup.inputs import DrawInputs

Calculator = Callable[[DrawInputs], Finding]

REGISTRY: tuple[Calculator, ...] = (
    serum_gaps.anion_gap,
    serum_gaps.anion_gap_albumin_corrected,
)


def compute_all(x: DrawInputs) -> dict[str, Finding]:
    """Run every calculator on ``x``; the dict keeps display order."""
    out: dict[str, Finding] = {}
    for calc in REGISTRY:
        f = calc(x)
        out[f.id] = f
    return out
