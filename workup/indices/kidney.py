"""Kidney function: eGFR by the CKD-EPI 2021 creatinine equation (no race term)."""

from __future__ import annotations

from workup.analytes import analyte
from workup.context import Flag
from workup.findings import Finding, missing
from workup.indices._common import Judge, finding, fmt
from workup.inputs import DrawInputs
from workup.model import Sex

FORMULA = (
    "eGFR = 142 × min(Scr/κ, 1)^α × max(Scr/κ, 1)^−1.200 × 0.9938^age × 1.012 [female]; "
    "Scr mg/dL; κ 0.7 (F) / 0.9 (M); α −0.241 (F) / −0.302 (M)"
)
SOURCE = "Inker et al., NEJM 2021;385:1737 (CKD-EPI 2021); categories KDIGO 2012"

# KDIGO 2012 GFR categories, lower bound first match.
CATEGORIES = ((90.0, "G1"), (60.0, "G2"), (45.0, "G3a"), (30.0, "G3b"), (15.0, "G4"), (0.0, "G5"))


def ckd_epi_2021(creatinine_mg_dl: float, age: float, sex: Sex) -> float:
    """The CKD-EPI 2021 creatinine equation in mL/min/1.73 m2 (creatinine in mg/dL, > 0)."""
    female = sex is Sex.female
    kappa, alpha = (0.7, -0.241) if female else (0.9, -0.302)
    r = creatinine_mg_dl / kappa
    value = 142.0 * min(r, 1.0) ** alpha * max(r, 1.0) ** -1.200 * 0.9938**age
    return value * 1.012 if female else value


def creatinine_mg_dl(umol_l: float) -> float:
    """Serum creatinine in mg/dL from µmol/L, by the catalogue's own factor."""
    return umol_l / analyte("serum", "creatinine").unit("mg/dL").factor  # type: ignore[union-attr]


def category(egfr_value: float) -> str:
    """The KDIGO GFR category (G1, G2, G3a, G3b, G4, G5) of an eGFR."""
    return next(name for low, name in CATEGORIES if egfr_value >= low)


def egfr(x: DrawInputs) -> Finding:
    """Estimated GFR from serum creatinine, age and sex (CKD-EPI 2021)."""
    fid, name, unit = "egfr", "eGFR (CKD-EPI 2021)", "mL/min/1.73 m2"
    need = [] if "creatinine" in x.serum else ["serum.creatinine"]
    if x.age is None:
        need.append("patient.age")
    if x.sex is None:
        need.append("patient.sex")
    if need:
        return missing(fid, name, unit, need, FORMULA, SOURCE)
    assert x.age is not None and x.sex is not None
    scr = creatinine_mg_dl(x.serum["creatinine"])
    j = Judge()
    if scr <= 0:
        j.not_valid("creatinine must be above zero")
        return finding((fid, name, unit, FORMULA, SOURCE), 0.0, j, "G5")
    value = ckd_epi_2021(scr, x.age, x.sex)
    if x.age < 18:
        j.not_valid(f"age {x.age}: the equation was developed in adults; use a paediatric one")
    if x.has(Flag.acute_kidney_injury):
        j.not_valid(
            "acute kidney injury is flagged: creatinine is not in a steady state, so the "
            "equation does not estimate the GFR"
        )
    j.note(f"creatinine {fmt(scr, 2)} mg/dL, age {x.age}, {x.sex.value}: {category(value)} (KDIGO)")
    j.note(
        "assumes a steady-state creatinine: not valid in acute kidney injury or while creatinine "
        "is changing; muscle mass, diet and some drugs also move creatinine"
    )
    return finding(
        (fid, name, unit, FORMULA, SOURCE), value, j, category(value),
        extra={"creatinine_mg_dl": scr},
    )  # fmt: skip
