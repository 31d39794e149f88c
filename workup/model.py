"""The case model: a patient, clinical context and one or more draws of serum, gas and urine.

A case file is plain YAML (see docs/case-format.md). Values are read into :class:`Measurement`s at
validation time, which needs the case-level unit system; :func:`workup.caseio.case_from_data` passes
it as validation context. Models built in code (the app) may pass Measurements directly.
"""

from __future__ import annotations

import re
from datetime import datetime
from enum import StrEnum
from typing import Any, ClassVar

from pydantic import (
    BaseModel,
    ConfigDict,
    Field,
    ValidationInfo,
    create_model,
    field_validator,
    model_validator,
)

from workup.analytes import CATALOGUE, Panel, UnitSystem, analyte
from workup.context import Flag
from workup.quantity import Measurement, ValueProblem, read_value

SCHEMA_VERSION = 1
"""The newest case-file schema this version reads and writes."""


class Sex(StrEnum):
    """Sex as the eGFR equation uses it."""

    female = "female"
    male = "male"


class LoadingTest(StrEnum):
    """A provocative test during which a draw was taken."""

    bicarbonate_loading = "bicarbonate_loading"
    furosemide_fludrocortisone = "furosemide_fludrocortisone"
    ammonium_chloride = "ammonium_chloride"


class GasSample(StrEnum):
    """Where the blood gas came from; the compensation rules were derived on arterial blood."""

    arterial = "arterial"
    venous = "venous"
    capillary = "capillary"


_WEIGHT = re.compile(r"^\s*(\d+(?:\.\d+)?)\s*(kg|lb|lbs)\s*$", re.IGNORECASE)
_HEIGHT = re.compile(r"^(\d+(?:\.\d+)?)\s*(?:cm)?$", re.IGNORECASE)

HEIGHT_MIN_CM = 20.0
"""Shortest height accepted: below the length of the most premature live-born infant."""
HEIGHT_MAX_CM = 272.0
"""Tallest height accepted: about the tallest person recorded; more is a typing error."""


class Patient(BaseModel):
    """What the calculators need to know about the patient; no identifiers."""

    model_config = ConfigDict(extra="forbid", use_attribute_docstrings=True)

    age: int | None = Field(default=None, ge=0, le=120)
    """Age in whole years (the eGFR equation needs it)."""
    sex: Sex | None = None
    """Sex as the eGFR equation uses it."""
    weight: str | None = None
    """Body weight with its unit, e.g. "70 kg" or "154 lb" (for loading-test doses)."""
    height: float | None = None
    """Height (length in infants) in centimetres, e.g. 116; the bedside Schwartz eGFR of a child
    under 18 needs it. Optional: files written before it existed open unchanged."""

    @field_validator("height", mode="before")
    @classmethod
    def _height(cls, v: Any) -> Any:
        if v is None:
            return v
        if isinstance(v, bool):
            raise ValueError(f"cannot read height {v!r}; write centimetres, e.g. 116")
        text = str(v).strip()
        # "116 cm" is accepted as well as a bare number; any other unit is refused, not guessed.
        m = _HEIGHT.match(text)
        if not m:
            raise ValueError(
                f'cannot read height {v!r}; write it in centimetres, e.g. 116 or "116 cm"'
            )
        cm = float(m.group(1))
        if not HEIGHT_MIN_CM <= cm <= HEIGHT_MAX_CM:
            raise ValueError(
                f"height {cm:g} cm is not possible; write centimetres between "
                f"{HEIGHT_MIN_CM:g} and {HEIGHT_MAX_CM:g} (a height in metres or inches must be "
                "converted to cm)"
            )
        return cm

    @field_validator("weight", mode="before")
    @classmethod
    def _weight(cls, v: Any) -> Any:
        if v is None:
            return v
        if isinstance(v, int | float) and not isinstance(v, bool):
            raise ValueError(f'write the unit with the weight, e.g. "{v} kg"')
        m = _WEIGHT.match(str(v))
        if not m:
            raise ValueError(f'cannot read weight {v!r}; write e.g. "70 kg" or "154 lb"')
        kg = float(m.group(1)) * (0.45359237 if m.group(2).lower().startswith("lb") else 1.0)
        if not 0.3 <= kg <= 400:
            raise ValueError(f"{v!r} is not a possible body weight")
        return str(v).strip()

    @property
    def weight_kg(self) -> float | None:
        """The weight in kilograms, or None when not given."""
        if self.weight is None:
            return None
        m = _WEIGHT.match(self.weight)
        assert m is not None  # validated on entry
        kg = float(m.group(1))
        return kg * 0.45359237 if m.group(2).lower().startswith("lb") else kg


_READ_MEMO: dict[tuple[Any, ...], Measurement] = {}
_READ_MEMO_MAX = 50_000
"""Bound on the memo of read values (a few MB at most)."""


class PanelBase(BaseModel):
    """Common behaviour of the three panels: read written values into measurements."""

    model_config = ConfigDict(extra="forbid", frozen=False)
    PANEL: ClassVar[Panel]

    @field_validator("*", mode="before")
    @classmethod
    def _read(cls, v: Any, info: ValidationInfo) -> Any:
        if v is None or isinstance(v, Measurement) or info.field_name == "sample":
            return v
        ctx = info.context
        system = ctx.get("units") if ctx else None
        if system is not None and system.__class__ is not UnitSystem:
            system = UnitSystem(system) if system in UnitSystem.__members__ else None
        # Reading is a pure function of these and Measurements are frozen, so a value seen
        # before is shared: a library of thousands of cases repeats the same few written values.
        key = (cls.PANEL, info.field_name, v.__class__, v, system)
        try:
            return _READ_MEMO[key]
        except KeyError:
            pass
        except TypeError:  # an unhashable value (a list, a mapping): read_value words the error
            key = None
        try:
            m = read_value(analyte(cls.PANEL, info.field_name), v, system)
        except ValueProblem as exc:
            raise ValueError(str(exc)) from None
        if key is not None and len(_READ_MEMO) < _READ_MEMO_MAX:
            _READ_MEMO[key] = m
        return m

    def measurements(self) -> dict[str, Measurement]:
        """The values present in this panel, by analyte key, in catalogue order."""
        out = {}
        for key in CATALOGUE[self.PANEL]:
            m = getattr(self, key)
            if m is not None:
                out[key] = m
        return out

    def canonical(self, key: str) -> float | None:
        """The canonical value of ``key``, or None when absent."""
        m = getattr(self, key, None)
        return None if m is None else m.canonical


def _panel_model(panel: Panel, name: str, doc: str, extra: dict[str, Any] | None = None):
    fields: dict[str, Any] = {}
    for key, a in CATALOGUE[panel].items():
        unit = a.canonical or "no unit"
        fields[key] = (
            Measurement | None,
            Field(default=None, description=f"{a.name}; canonical unit {unit}"),
        )
    fields.update(extra or {})
    model = create_model(name, __base__=PanelBase, __doc__=doc, **fields)
    model.PANEL = panel
    return model


SerumPanel = _panel_model(
    Panel.serum, "SerumPanel", "Serum (or plasma) chemistry drawn with the gas and urine."
)
BloodGasPanel = _panel_model(
    Panel.blood_gas,
    "BloodGasPanel",
    "The blood gas: pH, pCO2 and the analyzer's calculated bicarbonate.",
    {
        "sample": (
            GasSample,
            Field(default=GasSample.arterial, description="arterial, venous or capillary"),
        )
    },
)
UrinePanel = _panel_model(Panel.urine, "UrinePanel", "A spot urine collected with the blood.")

PANEL_MODELS: dict[Panel, type[PanelBase]] = {
    Panel.serum: SerumPanel,
    Panel.blood_gas: BloodGasPanel,
    Panel.urine: UrinePanel,
}


class Draw(BaseModel):
    """One set of samples taken at (about) the same time."""

    model_config = ConfigDict(
        extra="forbid", validate_assignment=True, use_attribute_docstrings=True
    )

    label: str = Field(min_length=1, max_length=80)
    """A short name for the draw: "admission", "day 3", "bicarbonate 2 h"."""
    taken: datetime | None = None
    """When the samples were taken (local time, ISO 8601: 2026-11-30T08:15)."""
    during: LoadingTest | None = None
    """The loading test under way when the samples were taken, if any."""
    serum: SerumPanel = Field(default_factory=SerumPanel)  # type: ignore[valid-type]
    """Serum chemistry."""
    blood_gas: BloodGasPanel = Field(default_factory=BloodGasPanel)  # type: ignore[valid-type]
    """Blood gas."""
    urine: UrinePanel = Field(default_factory=UrinePanel)  # type: ignore[valid-type]
    """Spot urine."""
    notes: str | None = None
    """Free text about this draw (timing, sample problems)."""

    def panel(self, panel: Panel | str) -> PanelBase:
        """The panel object for ``panel``."""
        return getattr(self, Panel(panel).value)


class Case(BaseModel):
    """One patient's acidosis workup: context and the draws taken over time."""

    model_config = ConfigDict(
        extra="forbid",
        populate_by_name=True,
        validate_assignment=True,
        use_attribute_docstrings=True,
    )

    schema_version: int = Field(default=SCHEMA_VERSION, alias="schema")
    """Version of the case-file format (``schema:`` in the file)."""
    label: str = Field(min_length=1, max_length=120)
    """A pseudonymous label such as "Bed 12, new acidosis"; no names or record numbers."""
    patient: Patient = Field(default_factory=Patient)
    """Age, sex, weight and height as the calculators need them."""
    units: UnitSystem | None = None
    """Default unit system for bare numbers of analytes whose unit differs between countries."""
    context: list[Flag] = Field(default_factory=list)
    """Clinical-context flags (see docs/case-format.md for the vocabulary)."""
    notes: str | None = None
    """Free text about the case."""
    settings: dict[str, float] = Field(default_factory=dict)
    """Per-case overrides of reference values and cut-offs (see workup.settings)."""
    draws: list[Draw] = Field(default_factory=list)
    """The draws, oldest first."""

    @field_validator("schema_version")
    @classmethod
    def _schema(cls, v: int) -> int:
        if v < 1:
            raise ValueError("schema must be 1 or later")
        if v > SCHEMA_VERSION:
            raise ValueError(
                f"this file uses schema {v}, newer than this version of workup reads "
                f"({SCHEMA_VERSION}); upgrade workup to open it"
            )
        return v

    @field_validator("context", mode="after")
    @classmethod
    def _unique_flags(cls, v: list[Flag]) -> list[Flag]:
        return list(dict.fromkeys(v))

    @field_validator("settings", mode="after")
    @classmethod
    def _known_settings(cls, v: dict[str, float]) -> dict[str, float]:
        from workup.settings import Settings

        unknown = [k for k in v if k not in Settings.model_fields]
        if unknown:
            from difflib import get_close_matches

            k = unknown[0]
            near = get_close_matches(k, list(Settings.model_fields), n=1)
            hint = f"; did you mean {near[0]!r}?" if near else ""
            raise ValueError(f"unknown setting {k!r}{hint}")
        return v

    @model_validator(mode="after")
    def _unique_draw_labels(self) -> Case:
        seen: set[str] = set()
        for d in self.draws:
            if d.label in seen:
                raise ValueError(f"two draws are labelled {d.label!r}; labels must differ")
            seen.add(d.label)
        return self

    def draw(self, label: str | None = None) -> Draw:
        """The draw called ``label``, or the latest one; raises KeyError when absent."""
        if not self.draws:
            raise KeyError("the case has no draws")
        if label is None:
            return self.latest_draw()
        for d in self.draws:
            if d.label == label:
                return d
        known = ", ".join(repr(d.label) for d in self.draws)
        raise KeyError(f"no draw labelled {label!r}; the case has {known}")

    def latest_draw(self) -> Draw:
        """The most recent draw by time taken (draws without a time count in file order)."""
        timed = [d for d in self.draws if d.taken is not None]
        if timed and len(timed) == len(self.draws):
            return max(self.draws, key=lambda d: local_naive(d.taken))  # type: ignore[arg-type]
        return self.draws[-1]


def local_naive(moment: datetime) -> datetime:
    """``moment`` as naive local time, so times written with and without an offset compare."""
    return moment.astimezone().replace(tzinfo=None) if moment.tzinfo is not None else moment
