"""Serum gaps: the anion gap, its albumin correction, the delta ratio and the osmolal gap."""

from __future__ import annotations

from workup.context import Flag
from workup.findings import Finding, Status, missing
from workup.indices._common import Judge, finding, fmt, ratio
from workup.inputs import DrawInputs
from workup.model import LoadingTest

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
    elif value < s.anion_gap_low_below:
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
    if reading != "high" and (x.has(Flag.paraprotein) or x.has(Flag.lithium)):
        # A cationic paraprotein or lithium lowers the gap and can hide a high-gap acidosis.
        status = Status.caution
        reasons.insert(
            0,
            "a paraprotein or lithium lowers the measured gap: a normal value may hide "
            "unmeasured anions",
        )
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


DELTA_FORMULA = "delta ratio = (AG(adj) − mean AG) / (normal HCO3 − HCO3)"
DELTA_SOURCE = (
    "bands from Brandis, Acid-Base Physiology; validity common practice (Kraut & Madias, "
    "CJASN 2007)"
)
DELTA_WORDS = {
    "pure_normal_gap": "a pure normal-gap (hyperchloremic) acidosis",
    "mixed_high_and_normal_gap": "a high-gap acidosis with an added normal-gap acidosis (also seen "
    "in the acidosis of kidney failure)",
    "high_gap": "an uncomplicated high-gap acidosis (ketoacidosis tends to run lower than lactic)",
    "high_gap_plus_alkalosis": "a high-gap acidosis with an added metabolic alkalosis or a "
    "pre-existing compensated respiratory acidosis",
}


def delta_ratio(x: DrawInputs) -> Finding:
    """Rise of the albumin-corrected gap over the fall of bicarbonate (the delta ratio)."""
    fid, name = "delta_ratio", "Delta ratio"
    gap, need, notes = _gap(x)
    if "albumin" not in x.serum:
        need.append("serum.albumin")
    if gap is None or need:
        return missing(fid, name, "", need, DELTA_FORMULA, DELTA_SOURCE)
    s = x.settings
    hco3 = x.serum.get("bicarbonate", x.gas.get("bicarbonate"))
    assert hco3 is not None
    adjusted = gap + 0.25 * (s.albumin_normal - x.serum["albumin"])
    rise = adjusted - s.anion_gap_mean
    fall = s.bicarbonate_normal - hco3
    j = Judge()
    for n in notes:
        j.caution(n)
    if x.during is LoadingTest.bicarbonate_loading:
        j.not_valid("bicarbonate is being infused: its fall no longer mirrors the gap")
    if hco3 >= s.bicarbonate_low:
        j.not_valid(
            f"bicarbonate {fmt(hco3)} is not low: there is no acidosis whose gap can be split"
        )
    if fall < s.delta_min_bicarbonate_fall:
        j.not_valid(
            f"bicarbonate has fallen only {fmt(fall)} from {fmt(s.bicarbonate_normal)} (less than "
            f"{fmt(s.delta_min_bicarbonate_fall)}): the ratio of two small numbers is unstable"
        )
    ph = x.gas.get("ph")
    if ph is not None and ph > s.ph_high:
        j.caution(
            f"pH {fmt(ph, 2)} is alkalemic: the fall in bicarbonate may be compensation of a "
            "respiratory alkalosis rather than an acidosis"
        )
    value = ratio(rise, fall)
    if value is None:
        value = 0.0
        j.not_valid("bicarbonate has not fallen at all: the ratio cannot be formed")
    if value < s.delta_ratio_normal_gap_below:
        reading = "pure_normal_gap"
    elif value < s.delta_ratio_mixed_below:
        reading = "mixed_high_and_normal_gap"
    elif value <= s.delta_ratio_alkalosis_above:
        reading = "high_gap"
    else:
        reading = "high_gap_plus_alkalosis"
    if adjusted <= s.anion_gap_upper and reading != "pure_normal_gap":
        # A ratio read against the gap's mean turns the normal scatter of the gap into a "second
        # process"; with the gap inside its reference limit there is no high-gap acidosis to mix.
        j.caution(
            f"the corrected gap {fmt(adjusted)} is within the reference limit of "
            f"{fmt(s.anion_gap_upper)}: the ratio reflects the gap's normal scatter, not a "
            "high-gap process"
        )
        reading = "pure_normal_gap"
    j.note(
        f"the gap changed by {fmt(rise)} (corrected gap {fmt(adjusted)} over a mean of "
        f"{fmt(s.anion_gap_mean)}) while bicarbonate fell {fmt(fall)}: fits " + DELTA_WORDS[reading]
    )
    j.note("the stoichiometry varies between patients: read the bands as a guide, not a rule")
    return finding(
        (fid, name, "", DELTA_FORMULA, DELTA_SOURCE), value, j, reading,
        extra={"gap_rise": rise, "bicarbonate_fall": fall, "corrected_gap": adjusted},
    )  # fmt: skip


OSM_FORMULA = "gap = measured osm − (2 Na + glucose + urea + 1.25 × ethanol), mmol/L"
OSM_SOURCE = (
    "calculated osmolality with Purssell's ethanol factor as tabulated by Lynd et al., BMC Emerg "
    "Med 2008;8:5; upper limit common practice"
)


def serum_osmolal_gap(x: DrawInputs) -> Finding:
    """Measured minus calculated serum osmolality: unmeasured osmoles such as toxic alcohols."""
    fid, name, unit = "serum_osmolal_gap", "Serum osmolal gap", "mOsm/kg"
    need = [f"serum.{k}" for k in ("osmolality", "sodium", "glucose") if k not in x.serum]
    urea = x.urea_mmol("serum")
    if urea is None:
        need.append("serum.urea")
    if need:
        return missing(fid, name, unit, need, OSM_FORMULA, OSM_SOURCE)
    assert urea is not None
    s = x.settings
    ethanol = x.serum.get("ethanol")
    calculated = 2 * x.serum["sodium"] + x.serum["glucose"] + urea
    calculated += s.ethanol_osmolal_factor * (ethanol or 0.0)
    gap = x.serum["osmolality"] - calculated
    raised = gap > s.serum_osmolal_gap_upper
    j = Judge()
    if raised and ethanol is None:
        j.caution(
            "ethanol was not entered and is taken as zero: measure it before reading a raised gap "
            "as a toxic alcohol"
        )
    elif ethanol is None:
        j.note("ethanol not entered, taken as zero")
    if raised and (x.has(Flag.ketoacidosis) or x.serum.get("lactate", 0.0) > 4):
        j.caution("ketoacidosis and lactic acidosis raise the gap modestly by themselves")
    if raised and x.has(Flag.unmeasured_urine_osmoles):
        j.caution("mannitol, glycine, contrast or glycols given recently raise the gap")
    if raised and x.has(Flag.known_ckd):
        j.caution("chronic kidney disease raises the gap modestly")
    if x.serum["sodium"] < 130 and x.has(Flag.paraprotein):
        j.caution("with a paraprotein, a low sodium may be pseudohyponatremia and inflate the gap")
    j.note(
        f"measured {fmt(x.serum['osmolality'])} minus calculated {fmt(calculated)} mOsm/kg; "
        f"{'above' if raised else 'within'} the limit of {fmt(s.serum_osmolal_gap_upper)}"
    )
    j.note(
        "needs a freezing-point osmometer (vapour-pressure osmometers miss alcohols); a late "
        "toxic-alcohol ingestion can have a normal gap"
    )
    return finding(
        (fid, name, unit, OSM_FORMULA, OSM_SOURCE), gap, j, "raised" if raised else "normal",
        extra={"calculated": calculated},
    )  # fmt: skip
