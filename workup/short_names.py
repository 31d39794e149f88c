"""Short display names for findings, keyed by finding id, for narrow (80-column) tables.

The core's ``Finding.name`` is the full name used in notes and JSON; a table at 80x24 has about
26 columns for the name, so long names were cut mid-word. These short names keep whole words.
"""

from __future__ import annotations

SHORT_NAME_WIDTH = 24
"""Widest short name allowed; the findings table's name column is at least this wide at 80."""

SHORT_NAMES: dict[str, str] = {
    "henderson_hasselbalch_ph": "H-H pH check",
    "anion_gap": "Anion gap",
    "anion_gap_albumin_corrected": "Anion gap, alb-corrected",
    "delta_ratio": "Delta ratio",
    "expected_pco2": "Expected pCO2 (Winters)",
    "expected_pco2_metabolic_alkalosis": "pCO2 for met. alkalosis",
    "expected_bicarbonate_respiratory_acidosis_acute": "HCO3 acute resp. acid.",
    "expected_bicarbonate_respiratory_acidosis_chronic": "HCO3 chronic resp. acid.",
    "expected_bicarbonate_respiratory_alkalosis_acute": "HCO3 acute resp. alk.",
    "expected_bicarbonate_respiratory_alkalosis_chronic": "HCO3 chronic resp. alk.",
    "serum_osmolal_gap": "Serum osmolal gap",
    "urine_ph": "Urine pH",
    "urine_anion_gap": "Urine anion gap",
    "urine_osmolal_gap": "Urine osmolal gap",
    "urine_ammonium_estimate": "Urine ammonium",
    "urine_ammonium_creatinine_ratio": "Urine NH4/creatinine",
    "ttkg": "TTKG",
    "urine_potassium_creatinine_ratio": "Urine K/creatinine",
    "fe_bicarbonate": "FEHCO3 (on loading)",
    "urine_blood_pco2": "Urine - blood pCO2",
    "fe_phosphate": "FEPO4",
    "tmp_gfr": "TmP/GFR",
    "fe_urate": "FE urate",
    "egfr": "eGFR (CKD-EPI 2021)",
    "egfr_schwartz": "eGFR (bedside Schwartz)",
}
"""Short name per finding id; every id the core's calculators produce has one."""


def short_name(finding_id: str, name: str) -> str:
    """The short display name for ``finding_id``, or the full ``name`` if none is listed."""
    return SHORT_NAMES.get(finding_id, name)
