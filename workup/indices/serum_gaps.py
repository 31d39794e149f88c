"""Serum gaps: the anion gap, its albumin correction, the delta ratio and the osmolal gap."""

from __future__ import annotations

from workup.findings import Finding, Status, missing
from workup.inputs import DrawInputs

AG_FORMULA = "AG = Na − (Cl + HCO3)"
AG_SOURCE = (
    "common practice; reference interval from the user's laboratory (Kraut & Madias, CJASN 2007)"
)
ALB_FORMULA = "AG(adj) = AG + 0.25 × (normal albumin − albumin) [g/L]"
ALB_SOURCE = "Figge, Jabor, Kazda & Fencl, Crit Care Med 1998;26:1807"


def _gap(x: DrawInputs) -> tuple[float | None, list[str], list[str]]:
    """The uncorrected gap, the inputs it lacks, and notes on which bicarbonate was used."""
    need = [f"serum.{k}" for k in ("sodium", "chloride") if k not in x.serum]
    notes: list[str] = []
    hco3 = x.serum.get("bicarbonate")
    if hco3 is None and "bicarbonate" in x.gas:
        hco3 = x.gas["bicarbonate"]
        notes.append("uses the gas analyzer's bicarbonate in place of serum total CO2")
    if hco3 is None:
        need.append("serum.bicarbonate")
    if need:
        return None, need, notes
    return x.serum["sodium"] - (x.serum["chloride"] + hco3), [], notes  # type: ignore[operator]


def anion_gap(x: DrawInputs) -> Finding:
    """Serum anion gap without potassium, read against the laboratory's upper limit."""
    value, need, notes = _gap(x)
    if value is None:
        return missing("anion_gap", "Anion gap", "mmol/L", need, AG_FORMULA, AG_SOURCE)
    s = x.settings
    reasons = list(notes)
    status = Status.ok if not notes else Status.caution
    if value > s.anion_gap_upper:
        reading = "high"
        reasons.append(f"above the upper limit of {s.anion_gap_upper:g}")
    elif value < 3:
        reading = "low"
        status = Status.caution
        reasons.append(
            "a very low gap suggests a laboratory error, hypoalbuminemia, a paraprotein, or "
            "lithium, bromide or iodide"
        )
    else:
        reading = "normal"
        reasons.append(f"within the reference limit of {s.anion_gap_upper:g}")
    if "albumin" in x.serum and x.serum["albumin"] < s.albumin_normal - 5:
        reasons.append("albumin is low: read the albumin-corrected gap")
    return Finding(
        "anion_gap", "Anion gap", value, "mmol/L", status, tuple(reasons), (),
        AG_FORMULA, AG_SOURCE, reading,
    )  # fmt: skip


def anion_gap_albumin_corrected(x: DrawInputs) -> Finding:
    """Anion gap adjusted for albumin, the version to use for gap and delta analysis."""
    value, need, notes = _gap(x)
    if "albumin" not in x.serum:
        need.append("serum.albumin")
    if value is None or need:
        return missing(
            "anion_gap_albumin_corrected", "Anion gap, albumin-corrected", "mmol/L", need,
            ALB_FORMULA, ALB_SOURCE,
        )  # fmt: skip
    s = x.settings
    alb = x.serum["albumin"]
    adjusted = value + 0.25 * (s.albumin_normal - alb)
    reasons = [*notes, f"normal albumin taken as {s.albumin_normal:g} g/L (a setting)"]
    status = Status.caution if notes else Status.ok
    reading = "high" if adjusted > s.anion_gap_upper else "normal"
    if alb > s.albumin_normal:
        reasons.append("albumin above the normal value lowers the adjusted gap")
    return Finding(
        "anion_gap_albumin_corrected", "Anion gap, albumin-corrected", adjusted, "mmol/L", status,
        tuple(reasons), (), ALB_FORMULA, ALB_SOURCE, reading,
        extra={"uncorrected": value, "albumin_g_l": alb},
    )  # fmt: skip
