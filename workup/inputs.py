"""The calculators' view of one draw: canonical numbers, patient facts, context and settings.

Calculators are pure functions of a :class:`DrawInputs`; they never see YAML, units as written or
the app. Values are in each analyte's canonical unit (see workup.analytes).
"""

from __future__ import annotations

from dataclasses import dataclass, field

from workup.analytes import Panel
from workup.context import Flag
from workup.frozen import builder
from workup.model import Case, Draw, GasSample, LoadingTest, Sex
from workup.quantity import Measurement
from workup.settings import DEFAULTS, Settings

UREA_MMOL_PER_BUN_MG_DL = 10.0 / 28.01
"""mmol/L of urea per mg/dL of urea nitrogen: 1 mol urea carries 2 N (28.01 g)."""


@dataclass(frozen=True, slots=True)
class DrawInputs:
    """Everything a calculator may read for one draw."""

    serum: dict[str, float] = field(default_factory=dict)
    """Serum values by analyte key, canonical units."""
    gas: dict[str, float] = field(default_factory=dict)
    """Blood-gas values by analyte key, canonical units."""
    urine: dict[str, float] = field(default_factory=dict)
    """Urine values by analyte key, canonical units."""
    sample: GasSample = GasSample.arterial
    """Where the gas came from."""
    during: LoadingTest | None = None
    """The loading test under way, if any."""
    age: int | None = None
    """Age in years."""
    sex: Sex | None = None
    """Sex as the eGFR equation uses it."""
    weight_kg: float | None = None
    """Body weight in kg."""
    height_cm: float | None = None
    """Height in cm (the bedside Schwartz eGFR of a child needs it)."""
    context: frozenset[Flag] = frozenset()
    """Clinical-context flags."""
    settings: Settings = DEFAULTS
    """Reference values and cut-offs in force."""

    def get(self, panel: Panel | str, key: str) -> float | None:
        """The canonical value of ``panel.key`` or None."""
        return {"serum": self.serum, "blood_gas": self.gas, "urine": self.urine}[str(panel)].get(
            key
        )

    def urea_mmol(self, panel: Panel | str) -> float | None:
        """Urea in mmol/L from ``urea`` or, failing that, from urea nitrogen (BUN)."""
        values = {"serum": self.serum, "urine": self.urine}[str(panel)]
        if "urea" in values:
            return values["urea"]
        if "urea_nitrogen" in values:
            return values["urea_nitrogen"] * UREA_MMOL_PER_BUN_MG_DL
        return None

    def has(self, flag: Flag) -> bool:
        """True when the context flag is set."""
        return flag in self.context

    @property
    def venous(self) -> bool:
        """True for a venous or capillary gas (compensation rules were derived on arterial blood)."""
        return self.sample is not GasSample.arterial


_new_inputs = builder(DrawInputs)


def inputs_for(case: Case, draw: Draw, settings: Settings = DEFAULTS) -> DrawInputs:
    """Build the calculators' view of ``draw`` in ``case``."""

    def canon(panel) -> dict[str, float]:
        # The panel's fields in catalogue order (as measurements() gives them), read straight
        # from the model: this runs for every draw of every case a library lists.
        return {k: m.canonical for k, m in panel.__dict__.items() if isinstance(m, Measurement)}

    return _new_inputs(
        serum=canon(draw.serum),
        gas=canon(draw.blood_gas),
        urine=canon(draw.urine),
        sample=draw.blood_gas.sample,
        during=draw.during,
        age=case.patient.age,
        sex=case.patient.sex,
        weight_kg=case.patient.weight_kg,
        height_cm=case.patient.height,
        context=frozenset(case.context),
        settings=settings,
    )
