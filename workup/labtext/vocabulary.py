"""The words of a lab report: analyte names and abbreviations, sample markers, section headings.

A name maps to one *identity* (what was measured) and the panels it may belong to. Which panel a
line belongs to is decided later, from a marker in the name ("Urine Na", "Na, urine"), from the
section heading above it, or by asking; never from the size of the number.
"""

from __future__ import annotations

import re
from dataclasses import dataclass

from workup.analytes import Panel

S, G, U = Panel.serum, Panel.blood_gas, Panel.urine


@dataclass(frozen=True, slots=True)
class Identity:
    """What a report name measures, and where workup can record it."""

    key: str
    """The analyte key in the catalogue ("" for names workup knows but does not use)."""
    panels: tuple[Panel, ...]
    """Panels holding this analyte, most usual first; empty for unused names."""
    unused: str = ""
    """For a known but unused name: why it is not taken."""
    co2: bool = False
    """True for a bare "CO2", which on a gas report may be pCO2 or total CO2."""


def _id(key: str, *panels: Panel) -> Identity:
    return Identity(key, panels)


def _unused(reason: str) -> Identity:
    return Identity("", (), unused=reason)


_COMPUTED = "workup computes this from the measured values itself"
_NOT_USED = "workup does not use this result"

# Spellings are matched case-insensitively at the start of a line, longest first, and must end at
# a word boundary so that "K" does not swallow "Ketones" or "Cr" swallow "CRP".
NAMES: dict[str, Identity] = {}


def _add(identity: Identity, *spellings: str) -> None:
    for s in spellings:
        NAMES[s] = identity


_add(_id("sodium", S, U), "sodium", "na", "na+")
_add(_id("potassium", S, U), "potassium", "k", "k+")
_add(_id("chloride", S, U), "chloride", "cl", "cl-")
_add(
    _id("bicarbonate", S, G, U),
    "bicarbonate",
    "bicarb",
    "hco3",
    "hco3-",
    "actual bicarbonate",
    "bicarbonate, actual",
    "hco3 act",
    "hco3(act)",
    "hco3 actual",
    "chco3",
    "hco3(p)",
    "hco3 (calc)",
    "hco3 calc",
    "hco3 calculated",
    "bicarbonate (calculated)",
    "calculated bicarbonate",
)
# Total CO2 is what the chemistry analyser reports as "bicarbonate"; on a gas report it is the
# analyser's derived total CO2, so it is offered as serum bicarbonate only after asking.
_add(
    _id("bicarbonate", S),
    "total co2",
    "co2 total",
    "co2, total",
    "tco2",
    "ctco2",
    "co2 content",
    "carbon dioxide",
    "carbon dioxide, total",
    "total carbon dioxide",
)
_add(Identity("co2", (S, G), co2=True), "co2")
_add(
    _id("urea_nitrogen", S, U),
    "bun",
    "urea nitrogen",
    "blood urea nitrogen",
    "urea n",
    "urea nitrogen, urine",
    "uun",
)
_add(_id("urea", S, U), "urea")
_add(_id("creatinine", S, U), "creatinine", "creat", "crea", "cr", "creat.")
_add(_id("glucose", S, U), "glucose", "glu", "gluc", "glucose, random", "glucose random")
_add(_id("albumin", S), "albumin", "alb")
_add(
    _id("osmolality", S, U),
    "osmolality",
    "osmolality, measured",
    "measured osmolality",
    "osmo",
    "osm",
    "osmol",
)
_add(
    _id("phosphate", S, U),
    "phosphate",
    "phosphorus",
    "phos",
    "po4",
    "inorganic phosphate",
    "phosphorus, inorganic",
    "inorganic phosphorus",
)
_add(_id("uric_acid", S, U), "uric acid", "urate")
_add(_id("calcium", S, U), "calcium", "ca", "total calcium", "calcium, total", "calcium total")
_add(_id("lactate", S), "lactate", "lactic acid", "lac", "lactate, plasma")
_add(
    _id("beta_hydroxybutyrate", S),
    "beta-hydroxybutyrate",
    "beta hydroxybutyrate",
    "β-hydroxybutyrate",
    "3-hydroxybutyrate",
    "b-hydroxybutyrate",
    "beta-ohb",
    "b-ohb",
    "β-ohb",
    "bhb",
)
_add(_id("ethanol", S), "ethanol", "etoh", "ethyl alcohol", "alcohol", "alcohol, ethyl")
_add(_id("ph", G, U), "ph")
_add(_id("pco2", G, U), "pco2", "p co2", "pco2 (t)", "pco2(t)")
_add(_id("pco2", G), "paco2", "pvco2", "pcco2")
_add(_id("ammonium", U), "ammonium", "nh4", "nh4+")
_add(_id("citrate", U), "citrate")
_add(_id("ketones", U), "ketones", "ketone", "ket", "ketone bodies")

_add(
    _unused(_COMPUTED),
    "anion gap",
    "ag",
    "egfr",
    "gfr",
    "gfr, estimated",
    "estimated gfr",
    "bun/creatinine ratio",
    "bun/creat ratio",
    "urea/creatinine ratio",
    "osmolality, calculated",
    "calculated osmolality",
    "osmolarity, calculated",
    "calculated osmolarity",
    "osm calc",
    "osmolal gap",
    "osmolar gap",
    "urine anion gap",
    "ttkg",
)
_add(
    _unused("standard bicarbonate is corrected to a pCO2 of 40, not the actual bicarbonate"),
    "standard bicarbonate",
    "std hco3",
    "hco3 std",
    "hco3(std)",
    "sbc",
    "sbce",
)
_add(
    _unused("ionized calcium is not the total calcium workup uses"),
    "ionized calcium",
    "ionised calcium",
    "calcium, ionized",
    "calcium, ionised",
    "ica",
    "ca++",
    "ca2+",
    "ca ionized",
    "ca ionised",
)
_add(
    _unused("plasma ammonia is not urine ammonium"),
    "ammonia",
    "nh3",
)
_add(
    _unused(_NOT_USED),
    "base excess",
    "base deficit",
    "be",
    "be(b)",
    "be(ecf)",
    "beecf",
    "abe",
    "sbe",
    "po2",
    "pao2",
    "pvo2",
    "so2",
    "sao2",
    "o2 sat",
    "o2 saturation",
    "fio2",
    "hemoglobin",
    "haemoglobin",
    "hgb",
    "hb",
    "thb",
    "hematocrit",
    "hct",
    "magnesium",
    "mg",
    "cohb",
    "carboxyhemoglobin",
    "methb",
    "methemoglobin",
    "specific gravity",
    "sg",
    "protein",
    "total protein",
    "bilirubin",
    "total bilirubin",
    "alt",
    "ast",
    "alk phos",
    "alkaline phosphatase",
    "wbc",
    "rbc",
    "platelets",
    "leukocytes",
    "leukocyte esterase",
    "nitrite",
    "crp",
    "temperature",
    "temp",
)

# Sample markers written before or after a name. Gas markers put a value on the gas panel;
# "whole blood" is how gas analysers label their electrolytes.
URINE_WORDS = ("urine", "urinary", "random urine", "spot urine", "ur", "u")
SERUM_WORDS = ("serum", "plasma", "s", "p", "ser", "pl")
GAS_WORDS = ("arterial", "venous", "capillary", "blood gas", "art", "ven", "a", "v")
WHOLE_BLOOD_WORDS = ("whole blood", "wb")

_MARKERS: list[tuple[str, str]] = sorted(
    [(w, "urine") for w in URINE_WORDS]
    + [(w, "serum") for w in SERUM_WORDS]
    + [(w, "gas") for w in GAS_WORDS]
    + [(w, "whole_blood") for w in WHOLE_BLOOD_WORDS],
    key=lambda x: -len(x[0]),
)
_SPELLINGS = sorted(NAMES, key=len, reverse=True)
_END = r"(?![a-z0-9+])"


@dataclass(frozen=True, slots=True)
class NameMatch:
    """A recognised name at the start of a line."""

    identity: Identity
    """What the name measures."""
    spelling: str
    """The spelling matched, lower case ("una" is not one: "na" with a "u" marker)."""
    marker: str | None
    """"urine", "serum", "gas" or "whole_blood" when the name itself says the sample."""
    gas_sample: str | None
    """"arterial", "venous" or "capillary" when the name says so (PaCO2, "pH venous")."""
    end: int
    """Offset in the original text just after the name (and any marker)."""


def _fold(text: str) -> str:
    return text.lower().replace("µ", "u").replace("μ", "u")


def _match_spelling(low: str, pos: int) -> str | None:
    for s in _SPELLINGS:
        if low.startswith(s, pos) and re.match(_END, low[pos + len(s) :]):
            return s
    return None


def _gas_sample(word: str | None) -> str | None:
    if word is None:
        return None
    for full in ("arterial", "venous", "capillary"):
        if full.startswith(word.rstrip(".")) and word[:1] in "avc":
            return full
    return None


_SEP = re.compile(r"[\s.,:;_\-/]*")
_SUFFIXES = [
    (re.compile(r"\s*[,(\[\-/]?\s*" + re.escape(w) + r"\s*[)\]]?" + _END), w)
    for w, _k in _MARKERS
    if len(w) > 2
]


def match_name(text: str) -> NameMatch | None:
    """The analyte name at the start of ``text`` (with a sample marker before or after it)."""
    low = _fold(text)
    start = len(low) - len(low.lstrip())
    marker_word: str | None = None
    pos = start
    spelling = _match_spelling(low, pos)
    if spelling is None:
        for word, _kind in _MARKERS:
            if low.startswith(word, pos):
                after = pos + len(word)
                sep = _SEP.match(low, after)
                nxt = sep.end() if sep else after
                # "UNa", "UK", "UCr": a one-letter marker glued to a short abbreviation.
                if nxt == after and len(word) > 1:
                    continue
                found = _match_spelling(low, nxt)
                if found is not None:
                    marker_word, pos, spelling = word, nxt, found
                    break
    if spelling is None:
        return None
    end = pos + len(spelling)
    if marker_word is None:
        for pattern, word in _SUFFIXES:
            m = pattern.match(low, end)
            if m:
                marker_word, end = word, m.end()
                break
    identity = NAMES[spelling]
    kind = next((k for w, k in _MARKERS if w == marker_word), None) if marker_word else None
    sample = _gas_sample(marker_word) if kind == "gas" else None
    if spelling in ("paco2", "pvco2", "pcco2"):
        kind = "gas"
        sample = {"a": "arterial", "v": "venous", "c": "capillary"}[spelling[1]]
    return NameMatch(identity, spelling, kind, sample, end)


@dataclass(frozen=True, slots=True)
class Heading:
    """A section heading: the sample type of the lines below it."""

    panel: str
    """"serum", "blood_gas", "urine", or "urine_timed" (a timed collection, not a spot urine)."""
    gas_sample: str | None = None
    """For a gas heading that names the sample."""


_HEADINGS: list[tuple[re.Pattern[str], Heading]] = [
    (
        re.compile(r"\b(24[- ]?h(ou)?r?|timed|24 hour)\b.*\burine\b|\burine\b.*\b24[- ]?h"),
        Heading("urine_timed"),
    ),
    (re.compile(r"\burin(e|ary|alysis)\b|\bua\b|\bspot urine\b"), Heading("urine")),
    (
        re.compile(r"\bvbg\b|\bvenous\b.*\bgas\b|\bgas\b.*\bvenous\b"),
        Heading("blood_gas", "venous"),
    ),
    (re.compile(r"\bcbg\b|\bcapillary\b.*\bgas\b"), Heading("blood_gas", "capillary")),
    (re.compile(r"\babg\b|\barterial\b"), Heading("blood_gas", "arterial")),
    (re.compile(r"\bblood gas\b|\bgases\b|\bgas\b|\bco-?oximetry\b"), Heading("blood_gas")),
    (
        re.compile(
            r"\bserum\b|\bplasma\b|\bchem(istry|istries)?\b|\bbiochem(istry)?\b|\bmetabolic panel\b"
            r"|\bbmp\b|\bcmp\b|\belectrolytes?\b|\brenal (profile|panel|function)\b|\bu ?& ?e\b"
            r"|\blytes\b"
        ),
        Heading("serum"),
    ),
]


def match_heading(text: str) -> Heading | None:
    """The heading a line without a value announces, or None."""
    low = _fold(text).strip().strip(":-=*#[]() ")
    if not low or len(low) > 70:
        return None
    for pattern, heading in _HEADINGS:
        if pattern.search(low):
            return heading
    return None
