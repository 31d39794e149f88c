"""Kidney function: eGFR by CKD-EPI 2021 (adults, no race term) or bedside Schwartz (under 18).

Both findings are always computed so each shows its own status; :func:`egfr_id` says which one
applies to a patient of a given age, and everything downstream (readings, notes, the tubular
indices' kidney-function caution) reads that one.
"""

from __future__ import annotations

from workup.analytes import analyte
from workup.context import Flag
from workup.findings import Finding, Status, missing, new_finding
from workup.indices._common import Judge, finding, fmt
from workup.inputs import DrawInputs
from workup.model import Sex

FORMULA = (
    "eGFR = 142 × min(Scr/κ, 1)^α × max(Scr/κ, 1)^−1.200 × 0.9938^age × 1.012 [female]; "
    "Scr mg/dL; κ 0.7 (F) / 0.9 (M); α −0.241 (F) / −0.302 (M)"
)
SOURCE = "Inker et al., NEJM 2021;385:1737 (CKD-EPI 2021); categories KDIGO 2012"

SCHWARTZ_K = 0.413
"""Bedside Schwartz coefficient for height in cm and creatinine in mg/dL (Schwartz et al., JASN
2009)."""
SCHWARTZ_FORMULA = "eGFR = 0.413 × height (cm) / Scr (mg/dL); Scr µmol/L ÷ 88.4 = mg/dL"
SCHWARTZ_SOURCE = "Schwartz et al., JASN 2009;20:629 (bedside CKiD equation); categories KDIGO 2012"
ADULT_AGE = 18
"""From this age CKD-EPI 2021 applies; below it the bedside Schwartz equation does."""
SCHWARTZ_AGE_RANGE = (1, 16)
"""Ages (years) of the children the bedside equation was derived in (CKiD cohort, Schwartz et al.,
JASN 2009; range from memory)."""
KDIGO_MIN_AGE = 2
"""KDIGO 2012 GFR categories are not meant for children under 2 (from memory)."""

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


def egfr_id(age: int | None) -> str:
    """The id of the eGFR finding that applies at ``age``: ``egfr_schwartz`` under 18, else
    ``egfr`` (also when age is unknown: that finding then asks for it)."""
    return "egfr_schwartz" if age is not None and age < ADULT_AGE else "egfr"


def bedside_schwartz(height_cm: float, creatinine_mg_dl: float) -> float:
    """The bedside Schwartz eGFR in mL/min/1.73 m2 (height in cm, creatinine in mg/dL, > 0)."""
    return SCHWARTZ_K * height_cm / creatinine_mg_dl


def egfr_estimate(x: DrawInputs) -> float | None:
    """The eGFR by the equation that applies to the patient's age, or None when it cannot be
    computed (for the indices that only need "is kidney function low")."""
    if x.age is None or "creatinine" not in x.serum:
        return None
    scr = creatinine_mg_dl(x.serum["creatinine"])
    if scr <= 0:
        return None
    if x.age < ADULT_AGE:
        return None if x.height_cm is None else bedside_schwartz(x.height_cm, scr)
    return None if x.sex is None else ckd_epi_2021(scr, x.age, x.sex)


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
    # The acute-kidney-injury reason comes first: it holds for every creatinine equation, so it
    # is the one a child's case cautions should repeat.
    _steady_state(x, j)
    if x.age < ADULT_AGE:
        j.not_valid(
            f"age {x.age}: CKD-EPI 2021 was developed in adults; under 18 read the bedside "
            "Schwartz eGFR"
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


def _steady_state(x: DrawInputs, j: Judge) -> None:
    if x.has(Flag.acute_kidney_injury):
        j.not_valid(
            "acute kidney injury is flagged: creatinine is not in a steady state, so the "
            "equation does not estimate the GFR"
        )


def egfr_schwartz(x: DrawInputs) -> Finding:
    """Estimated GFR of a child from height and serum creatinine (bedside Schwartz, 2009)."""
    fid, name, unit = "egfr_schwartz", "eGFR (bedside Schwartz)", "mL/min/1.73 m2"
    meta = (fid, name, unit, SCHWARTZ_FORMULA, SCHWARTZ_SOURCE)
    need = [] if "creatinine" in x.serum else ["serum.creatinine"]
    if x.age is None:
        need.append("patient.age")
    if x.height_cm is None:
        need.append("patient.height")
    adult = x.age is not None and x.age >= ADULT_AGE
    if need and adult:
        # The row is for children: say so, rather than plainly asking an adult for a height.
        why = f"used only under 18 (needs {', '.join(need)}); an adult's eGFR is CKD-EPI 2021"
        return new_finding(fid, name, None, unit, Status.needs_input, (why,), tuple(need),
                           SCHWARTZ_FORMULA, SCHWARTZ_SOURCE)  # fmt: skip
    if need:
        return missing(fid, name, unit, need, SCHWARTZ_FORMULA, SCHWARTZ_SOURCE)
    assert x.age is not None and x.height_cm is not None
    scr = creatinine_mg_dl(x.serum["creatinine"])
    j = Judge()
    if scr <= 0:
        j.not_valid("creatinine must be above zero")
        return finding(meta, 0.0, j, "G5")
    value = bedside_schwartz(x.height_cm, scr)
    _steady_state(x, j)
    low_age, high_age = SCHWARTZ_AGE_RANGE
    if adult:
        j.not_valid(
            f"age {x.age}: the bedside Schwartz equation is for children; read CKD-EPI 2021"
        )
    elif x.age < low_age:
        j.not_valid(
            f"age {x.age}: under 1 year GFR is still maturing and the equation was derived in "
            f"children aged {low_age}–{high_age}; compare with age-specific values"
        )
    elif x.age > high_age:
        j.caution(
            f"age {x.age}: above the ages the equation was derived in ({low_age}–{high_age} "
            "years, from memory)"
        )
    if x.age < KDIGO_MIN_AGE:
        j.caution("the KDIGO GFR categories are not meant for children under 2 (from memory)")
    j.note(
        f"creatinine {fmt(scr, 2)} mg/dL, height {fmt(x.height_cm)} cm, age {x.age}: "
        f"{category(value)} (KDIGO)"
    )
    j.note(
        "assumes an enzymatic (IDMS-traceable) creatinine and a steady state; derived in children "
        "with chronic kidney disease, so less certain near a normal GFR (from memory)"
    )
    return finding(meta, value, j, category(value),
                   extra={"creatinine_mg_dl": scr, "height_cm": x.height_cm})  # fmt: skip
