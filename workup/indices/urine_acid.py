"""Renal acid excretion: urine pH, the urine anion and osmolal gaps, and urine ammonium.

All of these answer one question, "is the kidney excreting enough ammonium for this acidosis?", and
all are only readable during a metabolic acidosis, in fresh urine, with enough distal sodium
delivery and without unmeasured anions, cations or osmoles. Each failed condition is named.
"""

from __future__ import annotations

from typing import Any

from workup.context import GI_LOSS, KETOANIONS, SOLVENT, Flag
from workup.findings import Finding, Status, missing
from workup.indices._common import (
    Judge,
    finding,
    fmt,
    ketones_present,
    serum_picture,
    within,
)
from workup.inputs import DrawInputs
from workup.model import LoadingTest

UPH_SOURCE = (
    "Berend, Kidney Dis 2017;3:149; Rodríguez Soriano, JASN 2002;13:2160; diarrhea pitfall from "
    "Batlle et al., NEJM 1988;318:594"
)
UAG_FORMULA = "UAG = urine Na + urine K − urine Cl"
UAG_SOURCE = (
    "Goldstein et al., Am J Med Sci 1986; Batlle et al., NEJM 1988;318:594; cut-offs common "
    "practice; critique Uribarri & Oh, JASN 2021"
)
UOG_FORMULA = "UOG = measured urine osm − (2 × (Na + K) + urea + glucose), mmol/L"
UOG_SOURCE = "Kamel et al., AJKD 1997;29:136; cut-offs Berend et al., Kidney Dis 2017, Table 1"


def _acidosis_context(x: DrawInputs, j: Judge, what: str) -> None:
    """Caution when the serum shows no metabolic acidosis, or one whose gap is unknown."""
    pic = serum_picture(x)
    if not pic.acidosis:
        j.caution(f"{pic.words}: {what} is read only during a metabolic acidosis")
    elif pic.normal_gap is None:
        j.caution(f"{pic.words}: {what} is read in a normal-gap acidosis")
    else:
        j.note(pic.words)


def urine_ph(x: DrawInputs) -> Finding:
    """Urine pH read against the distal acidification threshold during acidosis or a test."""
    fid, name = "urine_ph", "Urine pH"
    formula = "urine pH ≤ 5.5 during acidosis = acidified"
    if "ph" not in x.urine:
        return missing(fid, name, "", ["urine.ph"], formula, UPH_SOURCE)
    s = x.settings
    uph = x.urine["ph"]
    j = Judge()
    test = x.during in (LoadingTest.furosemide_fludrocortisone, LoadingTest.ammonium_chloride)
    cut = s.acidification_test_ph_max if test else s.urine_ph_distal_max
    acidified = uph < cut if test else uph <= cut
    if x.during is LoadingTest.bicarbonate_loading:
        j.not_valid("taken during bicarbonate loading, when the urine is meant to be alkaline")
    elif test:
        j.note(
            f"taken during a {x.during.value.replace('_', ' ')} test: any sample below "  # type: ignore[union-attr]
            f"{fmt(cut)} is normal acidification"
        )
        if x.during is LoadingTest.ammonium_chloride and x.has(Flag.liver_disease):
            j.caution("ammonium chloride is contraindicated in advanced liver disease")
    else:
        pic = serum_picture(x)
        if pic.acidosis:
            j.note(pic.words)
        else:
            j.caution(
                f"{pic.words}: outside an acidosis a urine pH above {fmt(cut)} shows no defect"
            )
    if not acidified:
        if x.has(Flag.urease_infection):
            j.not_valid(
                "a urease-producing infection makes urine alkaline whatever the tubule does"
            )
        if "sodium" in x.urine and x.urine["sodium"] < s.urine_sodium_min:
            j.caution(
                f"urine sodium {fmt(x.urine['sodium'])} is below {fmt(s.urine_sodium_min)}: low "
                "distal sodium delivery can keep urine pH up without a tubular defect"
            )
        if x.context & GI_LOSS:
            j.caution(
                "with diarrhea, a high ammonium excretion can hold urine pH above 5.5 (Batlle "
                "1988: 5.64 ± 0.14); check the urine anion or osmolal gap"
            )
        if not test and _ammonium_looks_high(x):
            j.caution(
                "the urine anion or osmolal gap shows plenty of ammonium, which buffers urine pH "
                "upward (as in diarrhea, Batlle 1988); a pH above 5.5 is then no sign of a "
                "distal defect"
            )
        if uph > s.urine_ph_bicarbonaturia and not test:
            j.note(
                f"above {fmt(s.urine_ph_bicarbonaturia)} also fits bicarbonaturia, as in proximal "
                "RTA above its threshold"
            )
    j.note(
        f"urine pH {fmt(uph, 2)} {'below' if acidified else 'above'} {fmt(cut)}: "
        + ("distal acidification works" if acidified else "urine not acidified")
    )
    j.note("measure with a pH meter on fresh urine; dipstick pH is coarse")
    edge = None
    if not test and within(uph, *UPH_BORDERLINE):
        edge = (
            f"borderline: urine pH {fmt(uph, 2)} lies within {fmt(UPH_BORDERLINE[0])}–"
            f"{fmt(UPH_BORDERLINE[1])}, the spread of the published cut-offs (< 5.3–5.5 intact, "
            "> 5.5 defect; Berend et al., Kidney Dis 2017; Rodríguez Soriano, JASN 2002), so it "
            "weighs little either way"
        )
    return finding(
        (fid, name, "", formula, UPH_SOURCE),
        uph,
        j,
        "acidified" if acidified else "not_acidified",
        borderline=edge,
    )


UPH_BORDERLINE = (5.3, 5.7)
"""Steady-state urine pH margin read as borderline: the published cut-offs run from 5.3 to 5.5
(Berend 2017; Rodríguez Soriano 2002) and meter imprecision adds about 0.1–0.2 (common practice)."""


def _ammonium_looks_high(x: DrawInputs) -> bool:
    """True when a negative urine anion gap or an adequate osmolal gap shows ample ammonium."""
    u, s = x.urine, x.settings
    has_uag = all(k in u for k in ("sodium", "potassium", "chloride"))
    if has_uag and u["sodium"] + u["potassium"] - u["chloride"] <= s.uag_negative_below:
        return True
    gap, _, _ = _uog(x)
    return gap is not None and gap > s.uog_high_above


def _gap_reading(value: float, x: DrawInputs) -> str:
    s = x.settings
    if value <= s.uag_negative_below:
        return "negative"
    if value >= s.uag_positive_above:
        return "positive"
    return "indeterminate"


def urine_anion_gap(x: DrawInputs) -> Finding:
    """Urine anion gap: an indirect sign of urine ammonium in a normal-gap acidosis."""
    fid, name, unit = "urine_anion_gap", "Urine anion gap", "mmol/L"
    need = [f"urine.{k}" for k in ("sodium", "potassium", "chloride") if k not in x.urine]
    if need:
        return missing(fid, name, unit, need, UAG_FORMULA, UAG_SOURCE)
    s = x.settings
    u = x.urine
    value = u["sodium"] + u["potassium"] - u["chloride"]
    reading = _gap_reading(value, x)
    negative = reading == "negative"
    j = Judge()

    # Most confounders add unmeasured anions (or remove distal Na), pushing the gap up: a
    # positive gap is then unreadable, but a negative one still shows ammonium, with a caveat.
    def falsely_positive(why: str) -> None:
        if negative:
            j.caution(f"{why}; a negative gap despite this still points to ammonium excretion")
        else:
            j.not_valid(f"{why}, so a positive or borderline gap does not show low ammonium")

    pic = serum_picture(x)
    if x.during is LoadingTest.bicarbonate_loading:
        j.not_valid("taken during bicarbonate loading: urine bicarbonate is an unmeasured anion")
    if pic.acidosis is None or pic.acidosis is False:
        j.caution(
            f"{pic.words}: the urine anion gap is read only in a normal-gap acidosis; otherwise "
            "it mostly reflects diet"
        )
    elif pic.normal_gap is False:
        falsely_positive(f"{pic.words}, which also appear in urine with ammonium")
    elif pic.normal_gap is None:
        j.caution(f"{pic.words}: confirm a normal-gap acidosis before reading the urine gap")
    else:
        j.note(pic.words)
    if u["sodium"] < s.urine_sodium_min:
        falsely_positive(
            f"urine sodium {fmt(u['sodium'])} is below {fmt(s.urine_sodium_min)}: low distal "
            "sodium delivery limits acidification"
        )
    uph = u.get("ph")
    if uph is not None and uph > s.uag_urine_ph_invalid_above:
        falsely_positive(
            f"urine pH {fmt(uph, 2)} is above {fmt(s.uag_urine_ph_invalid_above)}: bicarbonate is "
            "an unmeasured urine anion"
        )
    elif uph is None and not negative:
        j.caution(
            f"urine pH not given: above {fmt(s.urine_ph_bicarbonaturia)} urine bicarbonate adds "
            "to a positive gap; enter the urine pH"
        )
    elif uph is not None and uph > s.urine_ph_bicarbonaturia and not negative:
        j.caution(
            f"urine pH {fmt(uph, 2)} is above {fmt(s.urine_ph_bicarbonaturia)}: some urine "
            "bicarbonate adds to the gap"
        )
    # Another reason for a high gap (low distal sodium, bicarbonaturia, a high serum gap, a
    # loading test) is named above; only an unexplained one points to unmeasured anions.
    explained = j.status is Status.not_valid or (
        uph is not None and uph > s.urine_ph_bicarbonaturia
    )
    if x.context & KETOANIONS or ketones_present(x):
        falsely_positive("ketoanions are excreted with ammonium and are not measured")
        explained = True
    if x.context & SOLVENT:
        falsely_positive("toluene's hippurate is excreted with ammonium and is not measured")
        explained = True
    hidden = None if negative or explained else _plenty_of_ammonium(x)
    if hidden is not None:
        j.caution(
            f"{hidden} shows plenty of ammonium, yet this gap is "
            f"{'positive' if reading == 'positive' else 'near zero'}: ammonium is leaving with "
            "anions the gap does not count (hippurate after toluene, ketoanions, D-lactate, some "
            "antibiotics such as penicillins), so the osmolal gap is trusted; ask about solvent "
            "sniffing and ketosis"
        )
    if x.has(Flag.lithium):
        j.caution("lithium is an unmeasured urine cation and lowers the gap")
    if "ammonium" in u:
        j.caution("a measured urine ammonium is available: prefer it to this indirect sign")
    j.note(
        f"{fmt(value)} mmol/L: "
        + {
            "negative": "ammonium excretion looks adequate (as in GI bicarbonate loss)",
            "positive": "ammonium excretion looks low (as in distal or type 4 RTA)",
            "indeterminate": f"between {fmt(s.uag_negative_below)} and "
            f"{fmt(s.uag_positive_above)}, no conclusion",
        }[reading]
    )
    j.note(
        "in steady state the urine gap tracks diet more than ammonium (Uribarri & Oh, JASN 2021) "
        "and correlates poorly with measured ammonium in CKD (Raphael et al., CJASN 2018)"
    )
    extra = {"unmeasured_anions": hidden} if hidden is not None else None
    return finding((fid, name, unit, UAG_FORMULA, UAG_SOURCE), value, j, reading, extra=extra)


def _plenty_of_ammonium(x: DrawInputs) -> str | None:
    """The reading that shows ample ammonium (a measured urine ammonium or a usable urine osmolal
    gap above their adequate cut-offs), in words; None when neither does. A positive or near-zero
    urine anion gap beside it means unmeasured urine anions (Kamel et al., AJKD 1997; Berend et
    al., Kidney Dis 2017, Table 1: toluene, positive UAG with high ammonium)."""
    s = x.settings
    nh4 = x.urine.get("ammonium")
    if nh4 is not None and nh4 > s.urine_ammonium_adequate_above:
        return f"the measured urine ammonium {fmt(nh4)} mmol/L"
    gap, _, j = _uog(x)
    if gap is not None and gap > s.uog_high_above and j.status is not Status.not_valid:
        return f"the urine osmolal gap {fmt(gap, 0)} mOsm/kg"
    return None


def _uog(x: DrawInputs) -> tuple[float | None, list[str], Judge]:
    """The urine osmolal gap, its missing inputs, and a judge holding its validity.

    Three indices of a draw ask in turn (the inputs of a draw are not changed once built), so
    the last answer is kept; each caller gets its own copies to add to.
    """
    global _LAST_UOG
    last_x, gap, need, j = _LAST_UOG
    if last_x is not x:
        gap, need, j = _uog_of(x)
        _LAST_UOG = (x, gap, need, j)
    return gap, list(need), Judge(j.status, list(j.invalid), list(j.cautions), list(j.notes))


_LAST_UOG: tuple[Any, Any, Any, Any] = (None, None, None, None)


def _uog_of(x: DrawInputs) -> tuple[float | None, list[str], Judge]:
    need = [f"urine.{k}" for k in ("osmolality", "sodium", "potassium") if k not in x.urine]
    urea = x.urea_mmol("urine")
    if urea is None:
        need.append("urine.urea")
    j = Judge()
    if need:
        return None, need, j
    assert urea is not None
    s = x.settings
    u = x.urine
    glucose = u.get("glucose")
    calculated = 2 * (u["sodium"] + u["potassium"]) + urea + (glucose or 0.0)
    gap = u["osmolality"] - calculated
    if glucose is None:
        serum_glucose = x.serum.get("glucose")
        if serum_glucose is not None and serum_glucose <= s.glucosuria_serum_glucose_above:
            j.note(
                f"urine glucose not entered, taken as zero (plasma glucose {fmt(serum_glucose)} is "
                "below the renal threshold)"
            )
        else:
            j.caution(
                "urine glucose not entered and taken as zero: glucosuria would inflate the gap"
            )
    high = gap > s.uog_low_below
    if x.has(Flag.unmeasured_urine_osmoles):
        if high:
            j.not_valid(
                "mannitol, contrast, glycols or other unmeasured osmoles inflate the urine gap"
            )
        else:
            j.caution("unmeasured urine osmoles are flagged, yet the gap is low")
    if x.has(Flag.urease_infection):
        if high:
            j.not_valid(
                "a urease-producing infection splits urea into ammonium: the gap no longer shows "
                "what the kidney made"
            )
        else:
            j.caution("a urease-producing infection is flagged; use fresh urine")
    if x.during is LoadingTest.bicarbonate_loading:
        j.not_valid("taken during bicarbonate loading: not an acidosis")
    j.note(
        f"measured {fmt(u['osmolality'])} minus calculated {fmt(calculated)} mOsm/kg "
        f"(urea {fmt(urea)}, glucose {fmt(glucose or 0.0)} mmol/L)"
    )
    return gap, [], j


def _ammonium_reading(gap_like: float, low_below: float, adequate_above: float) -> str:
    if gap_like < low_below:
        return "low"
    if gap_like > adequate_above:
        return "adequate"
    return "indeterminate"


def urine_osmolal_gap(x: DrawInputs) -> Finding:
    """Urine osmolal gap: twice the urine ammonium salts, read during acidosis."""
    fid, name, unit = "urine_osmolal_gap", "Urine osmolal gap", "mOsm/kg"
    gap, need, j = _uog(x)
    if gap is None:
        return missing(fid, name, unit, need, UOG_FORMULA, UOG_SOURCE)
    s = x.settings
    _acidosis_context(x, j, "the urine osmolal gap")
    reading = _ammonium_reading(gap, s.uog_low_below, s.uog_high_above)
    j.note(
        f"in acidosis below {fmt(s.uog_low_below)} means low ammonium, above "
        f"{fmt(s.uog_high_above)} adequate (diarrhea usually above 200)"
    )
    return finding((fid, name, unit, UOG_FORMULA, UOG_SOURCE), gap, j, reading)
