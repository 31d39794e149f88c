"""The blood gas: the Henderson–Hasselbalch consistency check and the expected-compensation rules.

Each compensation rule is only meaningful in its own primary state (Winters' formula in a
metabolic acidosis, the 0.1 rule in an acute respiratory acidosis...). Outside that state the
rule's number is still computed, for the reader's orientation, but marked not valid with the reason.
"""

from __future__ import annotations

import math

from workup.findings import Finding, missing
from workup.indices._common import Judge, bicarbonate, finding, fmt
from workup.inputs import DrawInputs
from workup.model import LoadingTest

HH_FORMULA = "pH = 6.1 + log10(HCO3 / (0.03 × pCO2)); [H+] nmol/L = 24 × pCO2 / HCO3"
HH_SOURCE = (
    "Henderson–Hasselbalch with CO2 solubility 0.03 mmol/L/mmHg (Silverthorn, Human Physiology); "
    "[H+] form from Kassirer & Bleich, NEJM 1965 (from memory); tolerance common practice"
)
COMP_SOURCE = (
    "Narins & Emmett, Medicine 1980; Berend, de Vries & Gans, NEJM 2014;371:1434; limits common "
    "practice"
)
WINTERS_SOURCE = (
    "Winters' formula: Albert, Dell & Winters, Ann Intern Med 1967;66:312 (from memory)"
)

VENOUS_NOTE = (
    "the gas is {sample}: venous pCO2 runs about 4–6 mmHg higher and pH about 0.03 lower than "
    "arterial, and the rules were derived on arterial blood"
)


def henderson_hasselbalch_ph(x: DrawInputs) -> Finding:
    """pH computed from bicarbonate and pCO2, checked against the measured pH."""
    fid, name = "henderson_hasselbalch_ph", "Henderson–Hasselbalch check"
    s = x.settings
    # The gas bicarbonate comes from the same syringe; serum total CO2 is the fallback.
    if "bicarbonate" in x.gas:
        hco3, where = x.gas["bicarbonate"], "blood_gas"
    else:
        hco3, where = x.serum.get("bicarbonate"), "serum"
    need = [] if hco3 is not None else ["serum.bicarbonate"]
    need += [f"blood_gas.{k}" for k in ("ph", "pco2") if k not in x.gas]
    if need:
        return missing(fid, name, "", need, HH_FORMULA, HH_SOURCE)
    assert hco3 is not None
    ph, pco2 = x.gas["ph"], x.gas["pco2"]
    j = Judge()
    if hco3 <= 0 or pco2 <= 0:
        j.not_valid("bicarbonate and pCO2 must both be above zero for the equation")
        return finding((fid, name, "", HH_FORMULA, HH_SOURCE), ph, j, "inconsistent")
    computed = 6.1 + math.log10(hco3 / (0.03 * pco2))
    h_computed = 24.0 * pco2 / hco3
    h_measured = 10 ** (9 - ph)
    d_ph = computed - ph
    d_h = abs(h_computed - h_measured) / h_measured
    extra: dict[str, float | str] = {
        "measured_ph": ph,
        "h_computed": h_computed,
        "h_measured": h_measured,
        "bicarbonate_used": hco3,
        "bicarbonate_from": where,
    }
    if where == "blood_gas":
        j.note(
            "uses the gas analyzer's bicarbonate, itself calculated from pH and pCO2: the check "
            "mostly catches transcription errors"
        )
    else:
        j.note(
            "uses serum total CO2, which runs 1–2 mmol/L above the gas bicarbonate (total CO2 ≈ "
            "HCO3 + 0.03 × pCO2); a mismatch also flags samples not drawn together"
        )
    if "bicarbonate" in x.serum and "bicarbonate" in x.gas:
        diff = x.gas["bicarbonate"] - x.serum["bicarbonate"]
        extra["serum_gas_bicarbonate_difference"] = diff
        if abs(diff) > s.gas_serum_bicarbonate_tolerance:
            j.caution(
                f"gas bicarbonate {fmt(x.gas['bicarbonate'])} and serum total CO2 "
                f"{fmt(x.serum['bicarbonate'])} differ by {fmt(abs(diff))} (more than "
                f"{fmt(s.gas_serum_bicarbonate_tolerance)}): a laboratory error or samples not "
                "drawn at the same time"
            )
    bad = abs(d_ph) > s.hh_ph_tolerance or d_h > s.hh_h_tolerance_fraction
    words = (
        f"computed pH {fmt(computed, 2)} vs measured {fmt(ph, 2)} (difference {fmt(d_ph, 3)}); "
        f"[H+] {fmt(h_computed)} vs {fmt(h_measured)} nmol/L ({fmt(100 * d_h)}% apart)"
    )
    if bad and abs(d_ph) > 2 * s.hh_ph_tolerance:
        j.not_valid(
            f"{words}: the gas values do not fit together; check for a transcription error or "
            "mismatched samples before reading any acid-base index"
        )
    elif bad:
        j.caution(f"{words}: just outside the tolerance of {fmt(s.hh_ph_tolerance, 2)}")
    else:
        j.note(f"{words}: within the tolerance of {fmt(s.hh_ph_tolerance, 2)}")
    if x.venous:
        j.note(
            f"the gas is {x.sample.value}: the check holds for any sample, but venous values do "
            "not stand in for arterial ones in the compensation rules"
        )
    return finding(
        (fid, name, "", HH_FORMULA, HH_SOURCE),
        computed,
        j,
        "inconsistent" if bad else "consistent",
        extra=extra,
    )


def _reading(measured: float, low: float, high: float, above: str, below: str) -> str:
    if measured > high:
        return above
    if measured < low:
        return below
    return "appropriate"


def _gas_common(x: DrawInputs, j: Judge) -> None:
    if x.venous:
        j.caution(VENOUS_NOTE.format(sample=x.sample.value))
    if x.during in (LoadingTest.bicarbonate_loading, LoadingTest.ammonium_chloride):
        j.caution(
            f"taken during {x.during.value.replace('_', ' ')}: the rules assume a steady state "
            "that an acute load has not yet reached"
        )


def expected_pco2(x: DrawInputs) -> Finding:
    """Winters' formula: the pCO2 expected from respiratory compensation of a metabolic acidosis."""
    fid, name, unit = "expected_pco2", "Expected pCO2 (Winters)", "mmHg"
    formula = "expected pCO2 = 1.5 × HCO3 + 8 ± band"
    s = x.settings
    hco3, _, note = bicarbonate(x)
    need = [] if hco3 is not None else ["serum.bicarbonate"]
    if "pco2" not in x.gas:
        need.append("blood_gas.pco2")
    if need:
        return missing(fid, name, unit, need, formula, WINTERS_SOURCE)
    pco2 = x.gas["pco2"]
    expected = 1.5 * hco3 + 8  # type: ignore[operator]
    low, high = expected - s.winters_band, expected + s.winters_band
    j = Judge()
    if note:
        j.note(note)
    if hco3 >= s.bicarbonate_low:  # type: ignore[operator]
        j.not_valid(
            f"bicarbonate {fmt(hco3)} is not low: Winters' formula applies only to a metabolic "  # type: ignore[arg-type]
            "acidosis"
        )
    ph = x.gas.get("ph")
    if ph is None:
        j.caution("pH not given: cannot confirm that a metabolic acidosis is the primary disorder")
    elif ph > s.ph_high:
        j.not_valid(
            f"pH {fmt(ph, 2)} is alkalemic: a low bicarbonate here is more likely compensation of "
            "a respiratory alkalosis than a primary metabolic acidosis"
        )
    if low < s.compensation_pco2_floor:
        j.caution(
            f"the formula predicts {fmt(expected)} mmHg, below the usual floor of about "
            f"{fmt(s.compensation_pco2_floor)}: ventilation rarely lowers pCO2 further"
        )
    _gas_common(x, j)
    reading = _reading(pco2, low, high, "respiratory_acidosis_added", "respiratory_alkalosis_added")
    j.note(
        f"measured pCO2 {fmt(pco2)} against the expected {fmt(low)}–{fmt(high)} mmHg: "
        + {
            "appropriate": "appropriate respiratory compensation",
            "respiratory_acidosis_added": "higher than expected, an added respiratory acidosis",
            "respiratory_alkalosis_added": "lower than expected, an added respiratory alkalosis",
        }[reading]
    )
    return finding(
        (fid, name, unit, formula, WINTERS_SOURCE), expected, j, reading, low=low, high=high,
        extra={"measured_pco2": pco2, "bicarbonate_used": hco3},
    )  # fmt: skip


def expected_pco2_metabolic_alkalosis(x: DrawInputs) -> Finding:
    """The pCO2 expected from respiratory compensation of a metabolic alkalosis."""
    fid, name, unit = (
        "expected_pco2_metabolic_alkalosis",
        "Expected pCO2 (metab. alkalosis)",
        "mmHg",
    )
    formula = "expected pCO2 = normal pCO2 + 0.7 × (HCO3 − normal HCO3) ± band"
    s = x.settings
    hco3, _, note = bicarbonate(x)
    need = [] if hco3 is not None else ["serum.bicarbonate"]
    if "pco2" not in x.gas:
        need.append("blood_gas.pco2")
    if need:
        return missing(fid, name, unit, need, formula, COMP_SOURCE)
    pco2 = x.gas["pco2"]
    expected = s.pco2_normal + 0.7 * (hco3 - s.bicarbonate_normal)  # type: ignore[operator]
    band = s.metabolic_alkalosis_pco2_band
    low, high = expected - band, expected + band
    j = Judge()
    if note:
        j.note(note)
    if hco3 <= s.bicarbonate_high:  # type: ignore[operator]
        j.not_valid(
            f"bicarbonate {fmt(hco3)} is not high: this rule applies only to a metabolic "  # type: ignore[arg-type]
            "alkalosis"
        )
    ph = x.gas.get("ph")
    if ph is None:
        j.caution("pH not given: cannot confirm that a metabolic alkalosis is the primary disorder")
    elif ph < s.ph_low:
        j.not_valid(
            f"pH {fmt(ph, 2)} is acidemic: a high bicarbonate here is more likely compensation of "
            "a respiratory acidosis than a primary metabolic alkalosis"
        )
    if expected > s.metabolic_alkalosis_pco2_ceiling:
        j.caution(
            f"the rule predicts {fmt(expected)} mmHg, above the usual ceiling of about "
            f"{fmt(s.metabolic_alkalosis_pco2_ceiling)}: hypoventilation rarely goes further"
        )
    _gas_common(x, j)
    reading = _reading(pco2, low, high, "respiratory_acidosis_added", "respiratory_alkalosis_added")
    j.note(f"measured pCO2 {fmt(pco2)} against the expected {fmt(low)}–{fmt(high)} mmHg")
    return finding(
        (fid, name, unit, formula, COMP_SOURCE), expected, j, reading, low=low, high=high,
        extra={"measured_pco2": pco2, "bicarbonate_used": hco3},
    )  # fmt: skip


_RESPIRATORY_FORMULA: dict[tuple[float, float], str] = {}
"""Formula text by coefficients (four fixed pairs)."""


def _respiratory(
    x: DrawInputs,
    fid: str,
    name: str,
    coeffs: tuple[float, float],
    acidosis: bool,
    chronic: bool,
) -> Finding:
    """Expected bicarbonate for a primary respiratory disorder: normal HCO3 + k × ΔpCO2."""
    unit = "mmol/L"
    s = x.settings
    k_lo, k_hi = coeffs
    formula = _RESPIRATORY_FORMULA.get(coeffs)
    if formula is None:
        k_text = fmt(k_lo, 2) if k_lo == k_hi else f"{fmt(k_lo, 2)}–{fmt(k_hi, 2)}"
        formula = f"expected HCO3 = normal HCO3 + {k_text} × (pCO2 − normal pCO2) ± band"
        _RESPIRATORY_FORMULA[coeffs] = formula
    hco3, _, note = bicarbonate(x)
    need = [] if hco3 is not None else ["serum.bicarbonate"]
    if "pco2" not in x.gas:
        need.append("blood_gas.pco2")
    if need:
        return missing(fid, name, unit, need, formula, COMP_SOURCE)
    pco2 = x.gas["pco2"]
    dp = pco2 - s.pco2_normal
    k_mid = (k_lo + k_hi) / 2
    expected = s.bicarbonate_normal + k_mid * dp
    ends = sorted((s.bicarbonate_normal + k_lo * dp, s.bicarbonate_normal + k_hi * dp))
    low = ends[0] - s.respiratory_bicarbonate_band
    high = ends[1] + s.respiratory_bicarbonate_band
    j = Judge()
    if note:
        j.note(note)
    ph = x.gas.get("ph")
    kind = "acidosis" if acidosis else "alkalosis"
    if acidosis and pco2 <= s.pco2_high:
        j.not_valid(
            f"pCO2 {fmt(pco2)} is not high: this rule applies only to a respiratory acidosis"
        )
    if not acidosis and pco2 >= s.pco2_low:
        j.not_valid(
            f"pCO2 {fmt(pco2)} is not low: this rule applies only to a respiratory alkalosis"
        )
    if ph is None:
        j.caution(f"pH not given: cannot confirm that a respiratory {kind} is the primary disorder")
    elif acidosis and ph > s.ph_high:
        j.not_valid(
            f"pH {fmt(ph, 2)} is alkalemic: a high pCO2 here is more likely compensation of a "
            "metabolic alkalosis"
        )
    elif not acidosis and ph < s.ph_low:
        j.not_valid(
            f"pH {fmt(ph, 2)} is acidemic: a low pCO2 here is more likely compensation of a "
            "metabolic acidosis"
        )
    if acidosis:
        limit = (
            s.chronic_respiratory_acidosis_bicarbonate_max
            if chronic
            else s.acute_respiratory_acidosis_bicarbonate_max
        )
        if expected > limit:
            j.caution(
                f"the rule predicts {fmt(expected)}, above the usual limit of about {fmt(limit)} "
                "mmol/L for this compensation"
            )
    else:
        limit = (
            s.chronic_respiratory_alkalosis_bicarbonate_min
            if chronic
            else s.acute_respiratory_alkalosis_bicarbonate_min
        )
        if expected < limit:
            j.caution(
                f"the rule predicts {fmt(expected)}, below the usual limit of about {fmt(limit)} "
                "mmol/L for this compensation"
            )
    j.note(
        "chronic means renal adaptation has had about 3–5 days (common practice)"
        if chronic
        else "acute means minutes to hours, before renal adaptation (common practice)"
    )
    _gas_common(x, j)
    reading = _reading(hco3, low, high, "metabolic_alkalosis_added", "metabolic_acidosis_added")  # type: ignore[arg-type]
    j.note(f"measured bicarbonate {fmt(hco3)} against the expected {fmt(low)}–{fmt(high)} mmol/L")  # type: ignore[arg-type]
    return finding(
        (fid, name, unit, formula, COMP_SOURCE), expected, j, reading, low=low, high=high,
        extra={"measured_bicarbonate": hco3, "measured_pco2": pco2},
    )  # fmt: skip


def expected_bicarbonate_respiratory_acidosis_acute(x: DrawInputs) -> Finding:
    """Bicarbonate expected in an acute respiratory acidosis: 0.1 per mmHg of pCO2."""
    return _respiratory(
        x, "expected_bicarbonate_respiratory_acidosis_acute",
        "Exp. HCO3, acute resp. acidosis", (0.1, 0.1), True, False,
    )  # fmt: skip


def expected_bicarbonate_respiratory_acidosis_chronic(x: DrawInputs) -> Finding:
    """Bicarbonate expected in a chronic respiratory acidosis: 0.35 per mmHg of pCO2."""
    return _respiratory(
        x, "expected_bicarbonate_respiratory_acidosis_chronic",
        "Exp. HCO3, chronic resp. acidosis", (0.35, 0.35), True, True,
    )  # fmt: skip


def expected_bicarbonate_respiratory_alkalosis_acute(x: DrawInputs) -> Finding:
    """Bicarbonate expected in an acute respiratory alkalosis: 0.2 per mmHg of pCO2."""
    return _respiratory(
        x, "expected_bicarbonate_respiratory_alkalosis_acute",
        "Exp. HCO3, acute resp. alkalosis", (0.2, 0.2), False, False,
    )  # fmt: skip


def expected_bicarbonate_respiratory_alkalosis_chronic(x: DrawInputs) -> Finding:
    """Bicarbonate expected in a chronic respiratory alkalosis: 0.4–0.5 per mmHg of pCO2."""
    return _respiratory(
        x, "expected_bicarbonate_respiratory_alkalosis_chronic",
        "Exp. HCO3, chronic resp. alkalosis", (0.4, 0.5), False, True,
    )  # fmt: skip
