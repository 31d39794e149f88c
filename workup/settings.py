"""Reference values and cut-offs: documented defaults, overridable per user and per case.

Reference intervals belong to the user's laboratory; the defaults below are starting points, each
with its source. Precedence: a case's ``settings:`` over the user's settings file over the
defaults. The user's file is ``settings.yaml`` in the platformdirs user config folder
(``~/.config/workup/settings.yaml`` on Linux), a flat mapping of the names below.
It may also hold ``unit_system`` (conventional, si or none): the units a new case starts with.
"""

from __future__ import annotations

from dataclasses import dataclass
from pathlib import Path
from typing import Any

from pydantic import BaseModel, ConfigDict, Field, ValidationError


class Settings(BaseModel):
    """Every tunable number the calculators use. Units as in each field's description."""

    model_config = ConfigDict(extra="forbid", frozen=True, use_attribute_docstrings=True)

    anion_gap_mean: float = Field(10.0, json_schema_extra={"unit": "mmol/L"})
    """Laboratory mean anion gap (without K). Common practice; ion-selective-electrode analyzers
    run lower (mean 7.2, Sadjadi et al., Int J Nephrol Renovasc Dis 2013) and Kraut & Madias
    (CJASN 2007) stress method-to-method variation, so set your laboratory's value."""
    anion_gap_upper: float = Field(14.0, json_schema_extra={"unit": "mmol/L"})
    """Upper reference limit of the anion gap (without K); above it the gap is called high.
    Common practice; set your laboratory's."""
    albumin_normal: float = Field(40.0, json_schema_extra={"unit": "g/L"})
    """Normal albumin for the anion-gap correction (4.0 g/dL). Common practice; 44 g/L is also used
    (Figge et al., Crit Care Med 1998)."""
    bicarbonate_normal: float = Field(24.0, json_schema_extra={"unit": "mmol/L"})
    """Normal bicarbonate for compensation rules and the delta ratio (Narins & Emmett 1980)."""
    pco2_normal: float = Field(40.0, json_schema_extra={"unit": "mmHg"})
    """Normal arterial pCO2 for compensation rules (Narins & Emmett 1980)."""
    ph_low: float = Field(7.35, json_schema_extra={"unit": "pH"})
    """Lower limit of normal arterial pH (common practice)."""
    ph_high: float = Field(7.45, json_schema_extra={"unit": "pH"})
    """Upper limit of normal arterial pH (common practice)."""
    bicarbonate_low: float = Field(22.0, json_schema_extra={"unit": "mmol/L"})
    """Lower limit of normal serum bicarbonate (common practice)."""
    bicarbonate_high: float = Field(28.0, json_schema_extra={"unit": "mmol/L"})
    """Upper limit of normal serum bicarbonate (common practice)."""
    potassium_low: float = Field(3.5, json_schema_extra={"unit": "mmol/L"})
    """Lower limit of normal serum potassium (common practice)."""
    potassium_high: float = Field(5.0, json_schema_extra={"unit": "mmol/L"})
    """Upper limit of normal serum potassium (common practice)."""
    hh_ph_tolerance: float = Field(0.03, json_schema_extra={"unit": "pH units"})
    """Largest acceptable gap between measured and Henderson–Hasselbalch pH (common practice)."""
    gas_serum_bicarbonate_tolerance: float = Field(4.0, json_schema_extra={"unit": "mmol/L"})
    """Largest acceptable gap between gas and serum bicarbonate (common practice)."""
    uag_negative_below: float = Field(-10.0, json_schema_extra={"unit": "mmol/L"})
    """A urine anion gap at or below this is called negative (common practice)."""
    uag_positive_above: float = Field(10.0, json_schema_extra={"unit": "mmol/L"})
    """A urine anion gap at or above this is called positive (common practice)."""
    urine_sodium_min: float = Field(25.0, json_schema_extra={"unit": "mmol/L"})
    """Urine sodium below this makes distal delivery too low for the urine anion gap and TTKG
    (common practice; 20 is also used)."""
    urine_ph_bicarbonaturia: float = Field(6.5, json_schema_extra={"unit": "pH"})
    """Urine pH above this suggests bicarbonaturia, which makes the urine anion gap unreliable
    (Berend et al., Kidney Dis 2017)."""
    uog_low_below: float = Field(100.0, json_schema_extra={"unit": "mOsm/kg"})
    """In acidosis a urine osmolal gap below this means low ammonium (Kamel et al., AJKD 1997)."""
    uog_high_above: float = Field(150.0, json_schema_extra={"unit": "mOsm/kg"})
    """In acidosis a urine osmolal gap above this means adequate ammonium (Berend et al. 2017,
    Table 1: distal and type 4 RTA below 150, diarrhea above 200)."""
    nh4_creatinine_low_below: float = Field(3.0, json_schema_extra={"unit": "mmol/mmol"})
    """Urine NH4/creatinine below this during acidosis is inappropriately low. Derived, common
    practice: the expected > 200 mmol/day of NH4 over 10–15 mmol/day of creatinine is > 13."""
    nh4_creatinine_adequate_above: float = Field(10.0, json_schema_extra={"unit": "mmol/mmol"})
    """Urine NH4/creatinine above this during acidosis is an adequate renal response (derived,
    common practice; see nh4_creatinine_low_below)."""
    urine_ph_distal_max: float = Field(5.5, json_schema_extra={"unit": "pH"})
    """During acidosis a urine pH above this suggests a distal acidification defect
    (Berend et al. 2017; Rodríguez Soriano, JASN 2002)."""
    ttkg_low_hypokalemia: float = Field(3.0, json_schema_extra={"unit": "ratio"})
    """In hypokalemia a TTKG below this is appropriate renal conservation (Ethier et al., AJKD 1990;
    common practice cut-off 2–3)."""
    ttkg_low_hyperkalemia: float = Field(7.0, json_schema_extra={"unit": "ratio"})
    """In hyperkalemia a TTKG below this suggests mineralocorticoid deficiency or resistance
    (common practice; from memory, Choi & Ziyadeh, JASN 2008)."""
    ukcr_low: float = Field(1.5, json_schema_extra={"unit": "mmol/mmol"})
    """In hypokalemia urine K/creatinine below this is appropriate conservation (Halperin,
    Afr J Nephrol 2017)."""
    ukcr_high: float = Field(20.0, json_schema_extra={"unit": "mmol/mmol"})
    """In hyperkalemia urine K/creatinine above this is an appropriate renal response (Halperin,
    Afr J Nephrol 2017)."""
    fehco3_distal_max: float = Field(5.0, json_schema_extra={"unit": "%"})
    """FEHCO3 on bicarbonate loading below this fits classic distal RTA (Rodríguez Soriano 2002)."""
    fehco3_proximal_min: float = Field(15.0, json_schema_extra={"unit": "%"})
    """FEHCO3 on bicarbonate loading above this fits proximal RTA (Rodríguez Soriano 2002:
    > 10–15%)."""
    loading_bicarbonate_min: float = Field(20.0, json_schema_extra={"unit": "mmol/L"})
    """Plasma bicarbonate must be raised to at least this for FEHCO3 on loading to be read
    (Rodríguez Soriano 2002: 20–22)."""
    ub_pco2_normal_min: float = Field(20.0, json_schema_extra={"unit": "mmHg"})
    """Urine-minus-blood pCO2 above this after bicarbonate loading is normal distal H+ secretion
    (Rodríguez Soriano 2002; Berend et al. 2017 use 30)."""
    ub_pco2_urine_ph_min: float = Field(7.6, json_schema_extra={"unit": "pH"})
    """The urine-minus-blood pCO2 is read only once urine pH exceeds this (Rodríguez Soriano 2002)."""
    serum_osmolal_gap_upper: float = Field(10.0, json_schema_extra={"unit": "mOsm/kg"})
    """A serum osmolal gap above this is raised (common practice)."""
    fe_phosphate_wasting_above: float = Field(15.0, json_schema_extra={"unit": "%"})
    """FEPO4 above this with a low plasma phosphate suggests renal wasting (common practice 5–15%)."""
    phosphate_low: float = Field(0.8, json_schema_extra={"unit": "mmol/L"})
    """Lower limit of normal plasma phosphate (common practice)."""
    tmp_gfr_low: float = Field(0.8, json_schema_extra={"unit": "mmol/L"})
    """Lower limit of adult TmP/GFR (from memory, Payne, Ann Clin Biochem 1998: 0.8–1.35)."""
    fe_urate_high_above: float = Field(15.0, json_schema_extra={"unit": "%"})
    """FE urate above this supports proximal tubulopathy (common practice 10–15%)."""
    egfr_ckd_below: float = Field(30.0, json_schema_extra={"unit": "mL/min/1.73 m2"})
    """eGFR below this makes CKD a sufficient cause of acidosis (common practice; acidosis is
    uncommon above 30–40)."""
    delta_min_bicarbonate_fall: float = Field(4.0, json_schema_extra={"unit": "mmol/L"})
    """The delta ratio is not read when bicarbonate has fallen less than this (common practice)."""

    # --- added with the calculators of workup/indices ---
    anion_gap_low_below: float = Field(3.0, json_schema_extra={"unit": "mmol/L"})
    """An anion gap below this is called low and prompts a check for laboratory error, a
    paraprotein, lithium, bromide or iodide (common practice; Kraut & Madias, CJASN 2007)."""
    pco2_low: float = Field(35.0, json_schema_extra={"unit": "mmHg"})
    """Lower limit of normal arterial pCO2; below it a respiratory alkalosis is considered (common
    practice)."""
    pco2_high: float = Field(45.0, json_schema_extra={"unit": "mmHg"})
    """Upper limit of normal arterial pCO2; above it a respiratory acidosis is considered (common
    practice)."""
    hh_h_tolerance_fraction: float = Field(0.10, json_schema_extra={"unit": "fraction"})
    """Largest acceptable relative gap between the [H+] from 24 × pCO2/HCO3 (Kassirer & Bleich,
    NEJM 1965, from memory) and the measured [H+] (common practice: about 10%)."""
    winters_band: float = Field(2.0, json_schema_extra={"unit": "mmHg"})
    """Half-width of the expected pCO2 band of Winters' formula, 1.5 × HCO3 + 8 ± 2 (Albert, Dell
    & Winters, Ann Intern Med 1967, from memory)."""
    compensation_pco2_floor: float = Field(10.0, json_schema_extra={"unit": "mmHg"})
    """Respiratory compensation of a metabolic acidosis rarely takes pCO2 below this (common
    practice; sources give 10–15)."""
    metabolic_alkalosis_pco2_band: float = Field(5.0, json_schema_extra={"unit": "mmHg"})
    """Half-width of the expected pCO2 band in metabolic alkalosis, 40 + 0.7 × ΔHCO3 (common
    practice ±2–5; Berend, de Vries & Gans, NEJM 2014 use ±2)."""
    metabolic_alkalosis_pco2_ceiling: float = Field(55.0, json_schema_extra={"unit": "mmHg"})
    """Respiratory compensation of a metabolic alkalosis rarely takes pCO2 above this (common
    practice; sources give 55–60)."""
    respiratory_bicarbonate_band: float = Field(2.0, json_schema_extra={"unit": "mmol/L"})
    """Half-width of the expected bicarbonate band of the respiratory compensation rules (common
    practice; the ±2 bands of Berend, de Vries & Gans, NEJM 2014)."""
    acute_respiratory_acidosis_bicarbonate_max: float = Field(
        32.0, json_schema_extra={"unit": "mmol/L"}
    )
    """Acute respiratory acidosis rarely raises bicarbonate above this (common practice 30–32; one
    published table gives 38)."""
    chronic_respiratory_acidosis_bicarbonate_max: float = Field(
        45.0, json_schema_extra={"unit": "mmol/L"}
    )
    """Chronic respiratory acidosis rarely raises bicarbonate above this (common practice)."""
    acute_respiratory_alkalosis_bicarbonate_min: float = Field(
        18.0, json_schema_extra={"unit": "mmol/L"}
    )
    """Acute respiratory alkalosis rarely lowers bicarbonate below this (common practice)."""
    chronic_respiratory_alkalosis_bicarbonate_min: float = Field(
        12.0, json_schema_extra={"unit": "mmol/L"}
    )
    """Chronic respiratory alkalosis rarely lowers bicarbonate below this (common practice 12–15)."""
    delta_ratio_normal_gap_below: float = Field(0.4, json_schema_extra={"unit": "ratio"})
    """A delta ratio below this is a pure normal-gap acidosis (Brandis, Acid-Base Physiology)."""
    delta_ratio_mixed_below: float = Field(0.8, json_schema_extra={"unit": "ratio"})
    """A delta ratio from 0.4 up to this is a mixed high- and normal-gap acidosis (Brandis,
    Acid-Base Physiology; some use 1)."""
    delta_ratio_alkalosis_above: float = Field(2.0, json_schema_extra={"unit": "ratio"})
    """A delta ratio above this is a high-gap acidosis with a metabolic alkalosis or a compensated
    respiratory acidosis (Brandis, Acid-Base Physiology)."""
    ethanol_osmolal_factor: float = Field(1.25, json_schema_extra={"unit": "per mmol/L"})
    """Multiplier of ethanol (mmol/L) in the calculated serum osmolality (Purssell's factor, as
    tabulated by Lynd et al., BMC Emerg Med 2008)."""
    uag_urine_ph_invalid_above: float = Field(7.0, json_schema_extra={"unit": "pH"})
    """Above this urine pH a positive urine anion gap is not read: with a urine pCO2 near 40 mmHg
    the urine carries about 10 mmol/L of bicarbonate at pH 7.0 and more above it (arithmetic from
    Henderson–Hasselbalch, not published; between urine_ph_bicarbonaturia and this, a caution)."""
    urine_ammonium_low_below: float = Field(50.0, json_schema_extra={"unit": "mmol/L"})
    """During acidosis a urine ammonium below this is low (half the urine osmolal gap of 100,
    Kamel et al., AJKD 1997)."""
    urine_ammonium_adequate_above: float = Field(75.0, json_schema_extra={"unit": "mmol/L"})
    """During acidosis a urine ammonium above this is adequate (derived: half the urine osmolal
    gap cut-off of 150, Berend et al., Kidney Dis 2017; arithmetic, not published)."""
    uog_clearly_high_above: float = Field(200.0, json_schema_extra={"unit": "mOsm/kg"})
    """In acidosis a urine osmolal gap above this is clearly high ammonium, twice the low cut-off:
    it counts strongly against the low-ammonium causes (distal RTA, type 4, CKD). Berend et al.,
    Kidney Dis 2017, Table 1: diarrhea above 200, distal and type 4 RTA below 150; Kim et al.,
    AJKD 1996: distal RTA 129.7 ± 17.0 against NH4Cl-loaded controls 319.7 ± 58.4."""
    urine_ammonium_clearly_high_above: float = Field(100.0, json_schema_extra={"unit": "mmol/L"})
    """During acidosis a urine ammonium above this is clearly high, twice the low cut-off (half
    the urine osmolal gap of 200, the same relation as ``urine_ammonium_low_below``; Kamel et al.,
    AJKD 1997; Berend et al., Kidney Dis 2017, Table 1; arithmetic, not published)."""
    nh4_creatinine_clearly_high_above: float = Field(20.0, json_schema_extra={"unit": "mmol/mmol"})
    """During acidosis a urine NH4/creatinine above this is clearly high: the > 200 mmol/day of
    ammonium expected in chronic acidosis over 10 mmol/day of creatinine, several times the low
    cut-off (derived, common practice; see nh4_creatinine_low_below)."""
    acidification_test_ph_max: float = Field(5.3, json_schema_extra={"unit": "pH"})
    """During a furosemide–fludrocortisone or ammonium chloride test, any urine pH below this is
    normal acidification (from memory: Walsh et al., Kidney Int 2007; Wrong & Davies, QJM 1959)."""
    glucosuria_serum_glucose_above: float = Field(10.0, json_schema_extra={"unit": "mmol/L"})
    """Above this plasma glucose, glucose spills into urine and must be measured for the urine
    osmolal gap (common practice: renal threshold about 180 mg/dL)."""
    ub_pco2_urine_bicarbonate_min: float = Field(80.0, json_schema_extra={"unit": "mmol/L"})
    """The urine-minus-blood pCO2 needs a urine bicarbonate of at least about this (from memory:
    80–100 mmol/L)."""
    uric_acid_low: float = Field(120.0, json_schema_extra={"unit": "umol/L"})
    """Plasma urate below this is hypouricemia (common practice, about 2 mg/dL; from memory)."""


DEFAULTS = Settings()

USER_CHOICES = ("unit_system",)
"""Names in the user's settings file that are choices, not numbers; read by their own loader."""

UNIT_SYSTEMS = ("conventional", "si", "none")
"""Values of ``unit_system``: the unit system of a new case ("none": ask on every field)."""


# --- children's reference values (read by workup/indices/paediatric.py and tubular.py) ---
# Fixed constants, not Settings fields: a band is a table, not one number, and a user's settings
# file holds flat numbers. Each value names its source; "from memory" where it was recalled
# rather than read from the paper.


@dataclass(frozen=True, slots=True)
class AgeBand:
    """A children's reference range over whole years of age, both ends included."""

    first_age: int
    """Youngest age (whole years) the band covers."""
    last_age: int
    """Oldest age (whole years) the band covers."""
    low: float
    """Lower reference limit."""
    high: float
    """Upper reference limit."""
    label: str
    """How reasons name the band, e.g. "2-15 years"."""
    detail: str = ""
    """How the band was drawn from the source, when not read straight from it."""


TMP_GFR_CHILD_SOURCE = (
    "Payne, Ann Clin Biochem 1998;35:201 (age-related ranges after Brodehl et al., "
    "Pediatr Nephrol 1988), from memory"
)
"""Where the children's TmP/GFR bands come from."""
TMP_GFR_CHILD_CITE = "Payne 1998, from memory"
"""The short citation a reason carries (the finding's source gives it in full)."""

TMP_GFR_CHILD_BANDS: tuple[AgeBand, ...] = (
    AgeBand(0, 0, 1.15, 3.43, "under 1 year",
            "the bands at birth (1.43-3.43), 3 months (1.48-3.30) and 6 months (1.15-2.60) "
            "joined, as age is held in whole years"),
    AgeBand(1, 1, 1.15, 2.60, "age 1",
            "no band between 6 months and 2 years: the 6-month band (1.15-2.60), the wider "
            "of its neighbours, is used"),
    AgeBand(2, 15, 1.15, 2.44, "2-15 years"),
)  # fmt: skip
"""TmP/GFR (mmol/L) reference bands of children (:data:`TMP_GFR_CHILD_SOURCE`, from memory).

Ages 16 and 17 fall between the 2-15-year band and the adult range (from about 25 years), so no
band is used there: the adult lower limit ``tmp_gfr_low`` stays, with a caution."""

INFANT_BICARBONATE_THRESHOLD = 22.0
"""Renal bicarbonate threshold of infants, mmol/L: plasma bicarbonate above it spills into the
urine, so an infant's normal plasma bicarbonate sits at or a little below it (Edelmann et al.,
J Clin Invest 1967: about 22 in infants, lower than in older children and adults; from memory)."""

INFANT_BICARBONATE_SOURCE = "Edelmann et al., J Clin Invest 1967, from memory"
"""Where :data:`INFANT_BICARBONATE_THRESHOLD` comes from (also the short citation)."""

TTKG_CHILD_RANGES: tuple[AgeBand, ...] = (
    AgeBand(0, 0, 4.9, 15.5, "infants"),
    AgeBand(1, 17, 4.1, 10.5, "children"),
)
"""Normal TTKG (ratio) of infants and children on their usual diet with a normal serum
potassium (Rodríguez-Soriano et al., Pediatr Nephrol 1990; ranges from memory). They describe
children without a potassium demand, so they are stated beside the reading, not used as the
hypo-/hyperkalemia cut-offs, which judge the response to a demand."""

TTKG_CHILD_SOURCE = "Rodríguez-Soriano et al., Pediatr Nephrol 1990;4:105, from memory"
"""Where :data:`TTKG_CHILD_RANGES` come from."""


def age_band(bands: tuple[AgeBand, ...], age: int | None) -> AgeBand | None:
    """The band of ``bands`` covering ``age`` (whole years), or None."""
    if age is None:
        return None
    return next((b for b in bands if b.first_age <= age <= b.last_age), None)


def describe(name: str) -> str:
    """The documentation of setting ``name`` (its source) as one line."""
    info = Settings.model_fields[name]
    unit = (info.json_schema_extra or {}).get("unit", "")  # type: ignore[union-attr]
    return f"{name} = {info.default} {unit}: " + " ".join((info.description or "").split())


def user_settings_path() -> Path:
    """Where the user's settings file lives."""
    from workup.userconfig import settings_file

    return settings_file()


def load_user_overrides(path: Path | None = None) -> dict[str, float]:
    """The user's overrides, or {} when there is no settings file. Raises ValueError when bad."""
    import yaml

    path = path or user_settings_path()
    if not path.exists():
        return {}
    data = yaml.safe_load(path.read_text(encoding="utf-8")) or {}
    if not isinstance(data, dict):
        raise ValueError(f"{path}: expected a mapping of setting names to numbers")
    data = {k: v for k, v in data.items() if k not in USER_CHOICES}
    try:
        Settings(**data)
    except ValidationError as exc:
        first = exc.errors()[0]
        raise ValueError(f"{path}: {'.'.join(map(str, first['loc']))}: {first['msg']}") from None
    return {k: float(v) for k, v in data.items()}


def resolve(*overrides: dict[str, Any]) -> Settings:
    """Defaults with each mapping of overrides applied in turn (later wins)."""
    merged: dict[str, Any] = {}
    for o in overrides:
        merged.update(o)
    return Settings(**merged) if merged else DEFAULTS


def load_user_unit_system(path: Path | None = None) -> str:
    """The unit system a new case starts with: the file's ``unit_system``, else "conventional".

    One of UNIT_SYSTEMS. Raises ValueError when the file or the value is bad.
    """
    import yaml

    path = path or user_settings_path()
    if not path.exists():
        return "conventional"
    data = yaml.safe_load(path.read_text(encoding="utf-8")) or {}
    if not isinstance(data, dict):
        raise ValueError(f"{path}: expected a mapping of setting names to values")
    value = str(data.get("unit_system", "conventional")).strip().lower()
    if value not in UNIT_SYSTEMS:
        raise ValueError(f"{path}: unit_system: expected one of {', '.join(UNIT_SYSTEMS)}")
    return value
