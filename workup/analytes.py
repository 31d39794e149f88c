"""The analyte catalogue: what each panel of a draw may hold, in which units, and what is plausible.

Every analyte has one *canonical* unit that the calculators use. A value written in another unit is
converted on load by a factor defined here and nowhere else. Factors come from molar masses
(IUPAC standard atomic weights); the tests check each against an independent molar-mass library.

Plausibility limits are of two kinds:

* ``hard``: outside it no living patient has the value, so the file or the field is rejected
  (sodium 1380 is a typo for 138, pH 74 for 7.4). These are wide on purpose.
* ``usual``: outside it the value is possible but unusual, so it is accepted with a caution.

Both limits are common clinical practice, chosen from memory to be generous; they are not
laboratory reference intervals, which belong to the user's laboratory.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from enum import StrEnum
from typing import Any

# Molar masses in g/mol (IUPAC standard atomic weights, rounded to 0.01).
MOLAR_MASS = {
    "glucose": 180.16,  # C6H12O6
    "urea": 60.06,  # CH4N2O
    "urea_nitrogen": 28.01,  # N2, the nitrogen in one mole of urea
    "creatinine": 113.12,  # C4H7N3O
    "phosphorus": 30.97,  # P, phosphate reported as elemental phosphorus
    "calcium": 40.08,  # Ca
    "uric_acid": 168.11,  # C5H4N4O3
    "ethanol": 46.07,  # C2H6O
    "lactate": 89.07,  # C3H5O3- (lactate anion)
    "citrate": 189.10,  # C6H5O7 3- (citrate anion)
    "beta_hydroxybutyrate": 103.10,  # C4H7O3- (anion)
}

MMHG_PER_KPA = 7.50062  # 1 kPa = 1000 Pa; 1 mmHg = 133.322 Pa


class Panel(StrEnum):
    """The three sample types of a draw."""

    serum = "serum"
    blood_gas = "blood_gas"
    urine = "urine"


class UnitSystem(StrEnum):
    """The case-level default for analytes whose customary unit differs between countries."""

    conventional = "conventional"
    si = "si"


@dataclass(frozen=True, slots=True)
class Unit:
    """A unit an analyte may be written in, with its factor to the canonical unit."""

    symbol: str
    factor: float
    """Multiply a value in this unit by ``factor`` to get the canonical unit."""
    system: UnitSystem | None = None
    """The system whose bare numbers mean this unit, for ambiguous analytes."""
    aliases: tuple[str, ...] = ()


@dataclass(frozen=True, slots=True)
class Analyte:
    """One measurable quantity in one panel."""

    key: str
    panel: Panel
    name: str
    canonical: str
    units: tuple[Unit, ...]
    hard: tuple[float, float]
    usual: tuple[float, float]
    ambiguous: bool = False
    """True when the customary unit differs between countries: a bare number needs ``units:``."""
    note: str = ""
    """Shown with errors: for example which analyte to use instead."""
    decimals: int = 1
    words: tuple[str, ...] = field(default=())
    """Accepted word values (dipstick grades); empty for numeric analytes."""

    def unit(self, text: str) -> Unit | None:
        """The unit called ``text`` (case-insensitive, with common spellings), or None."""
        key = (self.panel, self.key, text)
        if key in _UNIT_MEMO:
            return _UNIT_MEMO[key]
        wanted = _norm_unit(text)
        found = None
        for u in self.units:
            if _norm_unit(u.symbol) == wanted or wanted in (_norm_unit(a) for a in u.aliases):
                found = u
                break
        if len(_UNIT_MEMO) < 10_000:  # a pure lookup; the bound keeps odd input from growing it
            _UNIT_MEMO[key] = found
        return found

    def unit_for(self, system: UnitSystem) -> Unit | None:
        """The unit that a bare number means under ``system``."""
        for u in self.units:
            if u.system is system:
                return u
        return None

    @property
    def canonical_unit(self) -> Unit:
        """The canonical unit (factor 1)."""
        return next(u for u in self.units if u.factor == 1.0 and u.symbol == self.canonical)

    @property
    def label(self) -> str:
        """A short label naming the panel and analyte, e.g. ``urine.sodium``."""
        return f"{self.panel.value}.{self.key}"


_UNIT_MEMO: dict[tuple[Any, str, str], Any] = {}


def _norm_unit(text: str) -> str:
    return text.strip().lower().replace("μ", "u").replace("µ", "u").replace(" ", "")


# Units shared by many analytes.
MMOL = Unit("mmol/L", 1.0, aliases=("meq/l", "mm", "mmol/l"))
MOSM = Unit("mOsm/kg", 1.0, aliases=("mosm/kg", "mmol/kg", "mosm/kgh2o", "mosmol/kg"))
PH = Unit("", 1.0, aliases=("ph",))


def _mg_dl(molar_mass: float, to: str = "mmol/L") -> float:
    """Factor from mg/dL to mmol/L (or µmol/L) for a molar mass in g/mol."""
    per_mmol = 10.0 / molar_mass  # mg/dL x 10 = mg/L; / (g/mol) = mmol/L
    return per_mmol * 1000.0 if to == "umol/L" else per_mmol


def _electrolyte(key: str, panel: Panel, name: str, hard, usual) -> Analyte:
    return Analyte(key, panel, name, "mmol/L", (MMOL,), hard, usual)


def _build() -> dict[Panel, dict[str, Analyte]]:
    s, g, u = Panel.serum, Panel.blood_gas, Panel.urine
    conv, si = UnitSystem.conventional, UnitSystem.si
    urea_n_note = (
        "urea_nitrogen (BUN) is reported in mg/dL; laboratories reporting in mmol/L report urea, "
        "so write it under `urea:`"
    )
    urea_note = (
        "urea (not urea nitrogen): mmol/L, or mg/dL of urea; BUN belongs under `urea_nitrogen:`"
    )

    def bun(panel, hard, usual):
        return Analyte(
            "urea_nitrogen",
            panel,
            "urea nitrogen (BUN)",
            "mg/dL",
            (Unit("mg/dL", 1.0, conv), Unit("mg/L", 0.1)),
            hard,
            usual,
            ambiguous=True,
            note=urea_n_note,
            decimals=0,
        )

    def urea(panel, hard, usual):
        return Analyte(
            "urea",
            panel,
            "urea",
            "mmol/L",
            (Unit("mmol/L", 1.0, si), Unit("mg/dL", _mg_dl(MOLAR_MASS["urea"]), conv)),
            hard,
            usual,
            ambiguous=True,
            note=urea_note,
        )

    def creat(panel, hard, usual):
        return Analyte(
            "creatinine",
            panel,
            "creatinine",
            "umol/L",
            (
                Unit("umol/L", 1.0, si, aliases=("µmol/l", "μmol/l")),
                Unit("mg/dL", _mg_dl(MOLAR_MASS["creatinine"], "umol/L"), conv),
                Unit("mmol/L", 1000.0),
            ),
            hard,
            usual,
            ambiguous=True,
            decimals=0,
        )

    def glucose(panel, hard, usual):
        return Analyte(
            "glucose",
            panel,
            "glucose",
            "mmol/L",
            (Unit("mmol/L", 1.0, si), Unit("mg/dL", _mg_dl(MOLAR_MASS["glucose"]), conv)),
            hard,
            usual,
            ambiguous=True,
        )

    def phosphate(panel, hard, usual):
        return Analyte(
            "phosphate",
            panel,
            "phosphate (as phosphorus)",
            "mmol/L",
            (Unit("mmol/L", 1.0, si), Unit("mg/dL", _mg_dl(MOLAR_MASS["phosphorus"]), conv)),
            hard,
            usual,
            ambiguous=True,
            decimals=2,
        )

    def urate(panel, hard, usual):
        return Analyte(
            "uric_acid",
            panel,
            "uric acid",
            "umol/L",
            (
                Unit("umol/L", 1.0, si, aliases=("µmol/l", "μmol/l")),
                Unit("mg/dL", _mg_dl(MOLAR_MASS["uric_acid"], "umol/L"), conv),
                Unit("mmol/L", 1000.0),
            ),
            hard,
            usual,
            ambiguous=True,
            decimals=0,
        )

    def calcium(panel, hard, usual):
        return Analyte(
            "calcium",
            panel,
            "calcium (total)",
            "mmol/L",
            (
                Unit("mmol/L", 1.0, si),
                Unit("mg/dL", _mg_dl(MOLAR_MASS["calcium"]), conv),
                Unit("mEq/L", 0.5),
            ),
            hard,
            usual,
            ambiguous=True,
            decimals=2,
        )

    def pco2(panel, hard, usual):
        return Analyte(
            "pco2",
            panel,
            "pCO2",
            "mmHg",
            (
                Unit("mmHg", 1.0, conv, aliases=("mm hg", "torr")),
                Unit("kPa", MMHG_PER_KPA, si),
            ),
            hard,
            usual,
            ambiguous=True,
            decimals=0,
        )

    def ph(panel, hard, usual):
        return Analyte("ph", panel, "pH", "", (PH,), hard, usual, decimals=2)

    def osm(panel, hard, usual):
        return Analyte(
            "osmolality", panel, "osmolality (measured)", "mOsm/kg", (MOSM,), hard, usual
        )

    serum = [
        _electrolyte("sodium", s, "sodium", (80, 200), (120, 160)),
        _electrolyte("potassium", s, "potassium", (0.8, 12), (2.0, 7.0)),
        _electrolyte("chloride", s, "chloride", (40, 160), (80, 135)),
        _electrolyte("bicarbonate", s, "bicarbonate (total CO2)", (1, 70), (5, 45)),
        bun(s, (0.5, 400), (3, 150)),
        urea(s, (0.2, 150), (1, 55)),
        creat(s, (5, 3000), (20, 1200)),
        glucose(s, (0.3, 200), (2.5, 35)),
        Analyte(
            "albumin",
            s,
            "albumin",
            "g/L",
            (Unit("g/L", 1.0, si), Unit("g/dL", 10.0, conv)),
            (3, 80),
            (15, 55),
            ambiguous=True,
        ),
        osm(s, (180, 500), (250, 350)),
        phosphate(s, (0.05, 8), (0.3, 3)),
        urate(s, (5, 3000), (60, 900)),
        calcium(s, (0.5, 6), (1.5, 3.5)),
        Analyte(
            "lactate",
            s,
            "lactate",
            "mmol/L",
            (MMOL, Unit("mg/dL", _mg_dl(MOLAR_MASS["lactate"]))),
            (0, 40),
            (0, 15),
        ),
        Analyte(
            "beta_hydroxybutyrate",
            s,
            "beta-hydroxybutyrate",
            "mmol/L",
            (MMOL, Unit("mg/dL", _mg_dl(MOLAR_MASS["beta_hydroxybutyrate"]))),
            (0, 30),
            (0, 10),
        ),
        Analyte(
            "ethanol",
            s,
            "ethanol",
            "mmol/L",
            (Unit("mmol/L", 1.0, si), Unit("mg/dL", _mg_dl(MOLAR_MASS["ethanol"]), conv)),
            (0, 250),
            (0, 100),
            ambiguous=True,
        ),
    ]
    gas = [
        ph(g, (6.5, 8.0), (6.9, 7.7)),
        pco2(g, (5, 200), (10, 100)),
        _electrolyte(
            "bicarbonate", g, "bicarbonate (calculated by the analyzer)", (1, 70), (5, 45)
        ),
    ]
    urine = [
        _electrolyte("sodium", u, "sodium", (0, 400), (5, 250)),
        _electrolyte("potassium", u, "potassium", (0, 300), (5, 150)),
        _electrolyte("chloride", u, "chloride", (0, 400), (5, 250)),
        ph(u, (4.0, 9.0), (4.5, 8.0)),
        osm(u, (20, 1600), (50, 1200)),
        bun(u, (5, 5000), (50, 2500)),
        urea(u, (2, 2000), (20, 900)),
        glucose(u, (0, 300), (0, 60)),
        creat(u, (100, 100000), (1000, 40000)),
        _electrolyte("bicarbonate", u, "bicarbonate", (0, 300), (0, 200)),
        pco2(u, (0, 300), (5, 200)),
        _electrolyte("ammonium", u, "ammonium (measured)", (0, 500), (0, 250)),
        phosphate(u, (0, 150), (0, 80)),
        urate(u, (0, 30000), (200, 10000)),
        calcium(u, (0, 30), (0, 15)),
        Analyte(
            "citrate",
            u,
            "citrate",
            "mmol/L",
            (Unit("mmol/L", 1.0, si), Unit("mg/dL", _mg_dl(MOLAR_MASS["citrate"]), conv)),
            (0, 30),
            (0, 15),
            ambiguous=True,
            decimals=2,
        ),
        Analyte(
            "ketones",
            u,
            "ketones (dipstick)",
            "grade",
            (Unit("grade", 1.0),),
            (0, 4),
            (0, 4),
            decimals=0,
            words=("negative", "trace", "1+", "2+", "3+", "4+"),
        ),
    ]
    return {
        Panel.serum: {a.key: a for a in serum},
        Panel.blood_gas: {a.key: a for a in gas},
        Panel.urine: {a.key: a for a in urine},
    }


CATALOGUE: dict[Panel, dict[str, Analyte]] = _build()

KETONE_GRADES = {"negative": 0, "trace": 0.5, "1+": 1, "2+": 2, "3+": 3, "4+": 4}


def analyte(panel: Panel | str, key: str) -> Analyte:
    """The analyte ``key`` of ``panel``; raises KeyError for an unknown one."""
    return CATALOGUE[Panel(panel)][key]


def all_analytes() -> list[Analyte]:
    """Every analyte of every panel, in entry order (serum, gas, urine)."""
    return [a for panel in CATALOGUE.values() for a in panel.values()]
