"""Acid-base disorders of one draw, from the gas, the chemistry and the expected compensation."""

from __future__ import annotations

from workup.findings import Disorder, Finding
from workup.inputs import DrawInputs


def analyse(x: DrawInputs, findings: dict[str, Finding]) -> list[Disorder]:
    """The disorders of the draw, primary first; [] when the gas and chemistry look normal."""
    return []
