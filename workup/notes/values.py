"""The entered values of a draw as a note shows them: as written, with their units and times."""

from __future__ import annotations

from dataclasses import dataclass

from workup.analytes import CATALOGUE, Panel
from workup.model import Draw, GasSample, LoadingTest
from workup.quantity import Measurement

# Short names a consult note uses; trade abbreviations keep their usual spelling.
SHORT: dict[Panel, dict[str, str]] = {
    Panel.serum: {
        "sodium": "Na",
        "potassium": "K",
        "chloride": "Cl",
        "bicarbonate": "HCO3",
        "urea_nitrogen": "BUN",
        "urea": "urea",
        "creatinine": "creatinine",
        "glucose": "glucose",
        "albumin": "albumin",
        "osmolality": "osmolality",
        "phosphate": "phosphate",
        "uric_acid": "urate",
        "calcium": "calcium",
        "lactate": "lactate",
        "beta_hydroxybutyrate": "beta-hydroxybutyrate",
        "ethanol": "ethanol",
    },
    Panel.blood_gas: {"ph": "pH", "pco2": "pCO2", "bicarbonate": "HCO3"},
    Panel.urine: {
        "sodium": "Na",
        "potassium": "K",
        "chloride": "Cl",
        "ph": "pH",
        "osmolality": "osmolality",
        "urea_nitrogen": "urea nitrogen",
        "urea": "urea",
        "glucose": "glucose",
        "creatinine": "creatinine",
        "bicarbonate": "HCO3",
        "pco2": "pCO2",
        "ammonium": "NH4",
        "phosphate": "phosphate",
        "uric_acid": "urate",
        "calcium": "calcium",
        "citrate": "citrate",
        "ketones": "ketones",
    },
}

# The values a daily note carries; a consult note carries every value entered.
BRIEF_KEYS: dict[Panel, tuple[str, ...]] = {
    Panel.serum: ("sodium", "potassium", "chloride", "bicarbonate", "albumin", "creatinine"),
    Panel.blood_gas: ("ph", "pco2"),
    Panel.urine: ("sodium", "potassium", "chloride", "ph", "osmolality", "ammonium"),
}

PANEL_WORD = {Panel.serum: "serum", Panel.blood_gas: "gas", Panel.urine: "urine"}

DURING_WORDS = {
    LoadingTest.bicarbonate_loading: "during bicarbonate loading",
    LoadingTest.furosemide_fludrocortisone: "during a furosemide-fludrocortisone test",
    LoadingTest.ammonium_chloride: "during an ammonium chloride load",
}


@dataclass(frozen=True, slots=True)
class Entry:
    """One entered value as the note writes it."""

    panel: Panel
    """The panel it belongs to."""
    key: str
    """The analyte key."""
    name: str
    """Its short name, e.g. "Na"."""
    number: str
    """The value as written (or the dipstick word)."""
    unit: str
    """The unit it was written in ("" for pH and dipstick grades)."""


# Decimals a value is always written with, where a bare "7.4" or "3" would read oddly: the gas pH
# to 2, urine pH to 1, and serum values customarily reported to one decimal.
_MIN_DECIMALS = {
    (Panel.blood_gas, "ph", ""): 2,
    (Panel.urine, "ph", ""): 1,
    (Panel.serum, "potassium", "mmol/L"): 1,
    (Panel.serum, "creatinine", "mg/dL"): 1,
    (Panel.serum, "albumin", "g/dL"): 1,
    (Panel.serum, "phosphate", "mg/dL"): 1,
    (Panel.serum, "calcium", "mg/dL"): 1,
    (Panel.serum, "uric_acid", "mg/dL"): 1,
}


def written_number(panel: Panel, key: str, m: Measurement) -> str:
    """The value as the file wrote it: never rounded, so the note repeats the laboratory's number.

    Only trailing zeros a reader expects are added back ("7.40", "3.0").
    """
    if m.word is not None:
        return m.word
    # The shortest text that reads back as the same float: never rounds what was entered.
    text = str(int(m.value)) if float(m.value).is_integer() else repr(float(m.value))
    want = _MIN_DECIMALS.get((panel, key, m.unit), 0)
    have = len(text.partition(".")[2]) if "e" not in text else want
    if have < want:
        text = f"{m.value:.{want}f}"
    return text


def entries(draw: Draw, brief: bool) -> list[Entry]:
    """The draw's values in catalogue order (only the key ones when ``brief``)."""
    out = []
    for panel in (Panel.serum, Panel.blood_gas, Panel.urine):
        for key, m in draw.panel(panel).measurements().items():
            if brief and key not in BRIEF_KEYS[panel]:
                continue
            unit = "" if m.word is not None or m.unit == "grade" else m.unit
            out.append(
                Entry(panel, key, SHORT[panel].get(key, key), written_number(panel, key, m), unit)
            )
    return out


def when(draw: Draw) -> str:
    """The draw's time and any loading test, e.g. "2026-11-22 13:30, during bicarbonate loading"."""
    parts = []
    if draw.taken is not None:
        parts.append(draw.taken.strftime("%Y-%m-%d %H:%M"))
    if draw.during is not None:
        parts.append(DURING_WORDS[draw.during])
    return ", ".join(parts) if parts else "time not recorded"


def gas_word(draw: Draw) -> str:
    """ "gas" with its sample type when the gas is not arterial."""
    sample = draw.blood_gas.sample
    return "gas" if sample is GasSample.arterial else f"{sample.value} gas"


def values_line(draw: Draw, brief: bool) -> str:
    """The draw's values on one (wrappable) line, a unit written once after a run that shares it.

    For example "serum Na 139, K 2.9, Cl 116, HCO3 15 mmol/L, albumin 4.1 g/dL; gas pH 7.31,
    pCO2 30 mmHg; urine Na 60 mmol/L".
    """
    groups = []
    for panel in (Panel.serum, Panel.blood_gas, Panel.urine):
        items = [e for e in entries(draw, brief) if e.panel is panel]
        if not items:
            continue
        words = []
        for i, e in enumerate(items):
            text = f"{e.name} {e.number}"
            last_of_run = i + 1 == len(items) or items[i + 1].unit != e.unit
            if e.unit and last_of_run:
                text += f" {e.unit}"
            words.append(text)
        lead = gas_word(draw) if panel is Panel.blood_gas else PANEL_WORD[panel]
        groups.append(f"{lead} " + ", ".join(words))
    return "; ".join(groups) if groups else "no values entered"


def table_rows(draws: list[Draw], brief: bool) -> list[tuple[str, list[str]]]:
    """Rows of (analyte label, one cell per draw) for a values table; "" where not entered."""
    order: list[tuple[Panel, str, str]] = []
    cells: dict[tuple[Panel, str], list[str]] = {}
    for col, draw in enumerate(draws):
        for e in entries(draw, brief):
            k = (e.panel, e.key)
            if k not in cells:
                cells[k] = [""] * len(draws)
                order.append((e.panel, e.key, e.name))
            cells[k][col] = f"{e.number} {e.unit}".strip()
    panel_rank = {Panel.serum: 0, Panel.blood_gas: 1, Panel.urine: 2}
    order.sort(key=lambda t: (panel_rank[t[0]], list(CATALOGUE[t[0]]).index(t[1])))
    return [(f"{PANEL_WORD[p]} {name}", cells[(p, key)]) for p, key, name in order]


def gas_line(draw: Draw) -> str | None:
    """The gas and the serum bicarbonate as entered, e.g. "venous gas pH 7.31, pCO2 34 mmHg;
    serum HCO3 16 mmol/L" (None when neither was entered)."""
    groups = []
    for panel, keys in ((Panel.blood_gas, ("ph", "pco2")), (Panel.serum, ("bicarbonate",))):
        items = [e for e in entries(draw, False) if e.panel is panel and e.key in keys]
        if items:
            lead = gas_word(draw) if panel is Panel.blood_gas else PANEL_WORD[panel]
            words = ", ".join(
                f"{e.name} {e.number}" + (f" {e.unit}" if e.unit else "") for e in items
            )
            groups.append(f"{lead} {words}")
    return "; ".join(groups) or None
