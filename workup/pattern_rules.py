"""The readings the pattern ranker uses, and the weighted rules that turn them into evidence.

Two steps, kept apart so each can be read and tested alone:

1. :func:`gather` picks, for each question (urine pH in acidosis, ammonium, potassium, FEHCO3 on
   loading, ...), one reading from the draw that can answer it: steady-state questions from draws
   taken during the normal-gap acidosis without a loading test, loading questions from
   bicarbonate-loading draws, acidification from furosemide–fludrocortisone or ammonium-chloride
   draws. Only findings with status ok or caution become readings; a not-valid one is kept as
   "set aside" with its reason, so it can never drive a verdict.
2. :func:`judge` applies the rule table of docs/ranking.md: each rule gives a pattern evidence for
   or against with a base weight (1 supportive, 2 strong, 3 decisive) multiplied by the reading's
   reliability (ok 1.0, caution 0.5).
"""

from __future__ import annotations

from collections.abc import Iterable
from dataclasses import dataclass, field

from workup.context import MEANING, Flag
from workup.disorders import fmt
from workup.findings import DrawResult, Evidence, Finding, Status, new_evidence
from workup.formatting import fmt_number
from workup.frozen import builder
from workup.model import LoadingTest
from workup.settings import Settings

PATTERNS: dict[str, str] = {
    "gi_bicarbonate_loss": "Bicarbonate loss from the gut",
    "proximal_rta": "Proximal RTA (type 2)",
    "distal_rta": "Classic distal RTA (type 1)",
    "hyperkalemic_distal_rta": "Hyperkalemic (voltage) distal RTA",
    "hypoaldosteronism": "Hypoaldosteronism (type 4 RTA)",
    "ckd_acidosis": "Acidosis of chronic kidney disease",
    "chloride_load": "Chloride load (saline)",
}
"""Candidate causes of a normal-gap acidosis, in the order used to break ties."""

STATUS_FACTOR = {Status.ok: 1.0, Status.caution: 0.5}
"""Reliability multiplier of a reading: a caution-status finding weighs half an ok one."""

AMMONIUM_SOURCES: tuple[tuple[str, float], ...] = (
    ("measured_ammonium", 3.0),
    ("urine_osmolal_gap", 2.0),
    ("urine_anion_gap", 1.5),
)
"""Base weight of each ammonium reading. A measured ammonium is the reference; the osmolal gap
tracks it better than the anion gap (Kamel et al., AJKD 1997; Kim et al., AJKD 1996), and the
anion gap correlates poorly in some settings (Raphael et al., CJASN 2018; Uribarri & Oh, JASN
2021)."""
CORROBORATION = 0.5
"""Extra weight for each weaker ammonium reading that agrees with the leading one (× its
reliability)."""

FURO_ACIDIFIED_BELOW = 5.3
"""Urine pH below this in any sample of a furosemide–fludrocortisone or short ammonium-chloride
test means normal distal acidification (Walsh et al., Kidney Int 2007; Wrong & Davies, QJM 1959;
both from memory)."""
GLUCOSURIA_ABOVE = 1.0
"""Urine glucose above this (mmol/L) is glucosuria (common practice)."""
RENAL_GLUCOSE_THRESHOLD = 10.0
"""Plasma glucose (mmol/L, 180 mg/dL) above which glucosuria is expected from filtered load alone
(common practice)."""
TYPE4_USUAL_HCO3_MIN = 16.0
"""Type 4 RTA runs a mild acidosis, serum HCO3 about 16–22 (Berend et al., Kidney Dis 2017,
Table 1)."""
MILD_ACIDOSIS_HCO3_MIN = 12.0
"""Proximal RTA and CKD acidosis seldom take serum HCO3 below about 12 (Berend 2017 Table 1:
proximal 12–20; common practice for CKD)."""


@dataclass(frozen=True, slots=True)
class Reading:
    """One answer to one question, from one draw."""

    key: str
    """The question: ``urine_ph``, ``urine_osmolal_gap``, ``potassium``, ``fe_bicarbonate``..."""
    word: str
    """The reading in words: an index interpretation, or ``hypo``/``normal``/``hyper``..."""
    value: float | None
    """The number it rests on."""
    draw: str
    """The draw's label."""
    index: str | None
    """The finding id, or None for a raw value."""
    factor: float
    """Reliability multiplier (see STATUS_FACTOR)."""
    text: str
    """The number in words, e.g. "urine pH 6.8 (baseline)"."""


@dataclass
class Readings:
    """Every reading chosen for the case, and the findings set aside as not valid."""

    by_key: dict[str, Reading] = field(default_factory=dict)
    """The chosen reading of each question."""
    set_aside: dict[str, str] = field(default_factory=dict)
    """Question key → why its finding could not be used (not valid), in words."""
    acidosis_draws: list[str] = field(default_factory=list)
    """Labels of the draws with a normal-gap acidosis and no loading test."""
    context: frozenset[Flag] = frozenset()
    """The case's context flags."""

    def get(self, key: str) -> Reading | None:
        """The reading of ``key``, if any."""
        return self.by_key.get(key)


# Which finding answers which question, and in what kind of draw.
STEADY_INDICES = {
    "urine_ph": "urine_ph",
    "urine_osmolal_gap": "urine_osmolal_gap",
    "urine_anion_gap": "urine_anion_gap",
    "ttkg": "ttkg",
    "urine_potassium_creatinine_ratio": "urine_potassium_creatinine_ratio",
    "fe_phosphate": "fe_phosphate",
    "tmp_gfr": "tmp_gfr",
    "fe_urate": "fe_urate",
}
LOADING_INDICES = {"fe_bicarbonate": "fe_bicarbonate", "urine_blood_pco2": "urine_blood_pco2"}
NAME = {
    "urine_ph": "urine pH",
    "urine_osmolal_gap": "urine osmolal gap",
    "urine_anion_gap": "urine anion gap",
    "measured_ammonium": "measured urine ammonium",
    "ttkg": "TTKG",
    "urine_potassium_creatinine_ratio": "urine K/creatinine",
    "fe_phosphate": "FEPO4",
    "tmp_gfr": "TmP/GFR",
    "fe_urate": "FE urate",
    "fe_bicarbonate": "FEHCO3 on bicarbonate loading",
    "urine_blood_pco2": "urine-minus-blood pCO2",
    "egfr": "eGFR",
}


def _has_normal_gap_acidosis(r: DrawResult) -> bool:
    return any(d.id == "normal_gap_metabolic_acidosis" for d in r.disorders)


def _unit(f: Finding) -> str:
    return f" {f.unit}" if f.unit else ""


def _num(f: Finding) -> str:
    """A reading's number rounded as everywhere else (app, CLI, note): workup.formatting."""
    return fmt_number(f.value, f.unit)


def _better(new: Reading, old: Reading | None) -> bool:
    """An ok reading beats a caution one; among equals the later draw wins."""
    return old is None or new.factor >= old.factor


def _offer(out: Readings, key: str, f: Finding | None, draw: str) -> None:
    """Take finding ``f`` as the reading of ``key`` if usable and better than what is there."""
    if f is None or f.value is None:
        return
    if not f.usable or f.interpretation is None:
        if f.status is Status.not_valid and key not in out.by_key:
            why = f.reasons[0] if f.reasons else "a validity condition fails"
            out.set_aside[key] = f"{NAME.get(key, f.name)} ({draw}) not valid: {why}"
        return
    r = _new_reading(
        key, f.interpretation, f.value, draw, f.id, STATUS_FACTOR[f.status],
        f"{NAME.get(key, f.name)} {_num(f)}{_unit(f)} "
        f"({draw}{', caution' if f.status is Status.caution else ''})",
    )  # fmt: skip
    if _better(r, out.by_key.get(key)):
        out.by_key[key] = r
        out.set_aside.pop(key, None)


def gather(draws: Iterable[DrawResult], context: Iterable[Flag], s: Settings) -> Readings:
    """Choose one reading per question from the draws that can answer it (see module doc)."""
    out = Readings(context=frozenset(context))
    acid_test_ph: list[tuple[float, str]] = []
    for r in draws:
        x, found = r.inputs, r.findings
        during = x.during
        if during is LoadingTest.bicarbonate_loading:
            for key, fid in LOADING_INDICES.items():
                _offer(out, key, found.get(fid), r.label)
            continue
        if during is not None:
            if "ph" in x.urine:
                acid_test_ph.append((x.urine["ph"], r.label))
            continue
        _offer(out, "egfr", found.get("egfr"), r.label)
        if not _has_normal_gap_acidosis(r):
            continue
        out.acidosis_draws.append(r.label)
        for key, fid in STEADY_INDICES.items():
            _offer(out, key, found.get(fid), r.label)
        if "ammonium" in x.urine:
            # A measured ammonium is the reference; the ratio to creatinine is preferred because
            # it does not depend on how concentrated the urine is.
            for fid in ("urine_ammonium_creatinine_ratio", "urine_ammonium_estimate"):
                f = found.get(fid)
                if f is not None and f.usable:
                    _offer(out, "measured_ammonium", f, r.label)
                    break
        k = x.serum.get("potassium")
        if k is not None:
            word = "hypo" if k < s.potassium_low else "hyper" if k > s.potassium_high else "normal"
            out.by_key["potassium"] = _new_reading(
                "potassium",
                word,
                k,
                r.label,
                None,
                1.0,
                f"serum potassium {fmt_number(k, 'mmol/L')} ({r.label})",
            )
        hco3 = x.serum.get("bicarbonate", x.gas.get("bicarbonate"))
        if hco3 is not None and (
            "bicarbonate" not in out.by_key or hco3 < (out.by_key["bicarbonate"].value or 0)
        ):
            out.by_key["bicarbonate"] = _new_reading(
                "bicarbonate", "low", hco3, r.label, None, 1.0,
                f"plasma bicarbonate {fmt_number(hco3, 'mmol/L')} ({r.label})",
            )  # fmt: skip
        ug, sg = x.urine.get("glucose"), x.serum.get("glucose")
        if ug is not None and sg is not None and sg <= RENAL_GLUCOSE_THRESHOLD:
            word = "present" if ug > GLUCOSURIA_ABOVE else "absent"
            out.by_key["glucosuria"] = _new_reading(
                "glucosuria", word, ug, r.label, None, 1.0,
                f"urine glucose {fmt_number(ug, 'mmol/L')} mmol/L with plasma glucose "
                f"{fmt_number(sg, 'mmol/L')} "
                f"({r.label})",
            )  # fmt: skip
    if acid_test_ph:
        low, label = min(acid_test_ph)
        word = "acidified" if low < FURO_ACIDIFIED_BELOW else "not_acidified"
        out.by_key["acidification_test"] = _new_reading(
            "acidification_test", word, low, label, None, 1.0,
            f"lowest urine pH {low:.2f} during an acidification test ({label})",
        )  # fmt: skip
    return out


@dataclass(frozen=True, slots=True)
class AmmoniumCall:
    """The case's answer on renal ammonium excretion, from the most reliable reading."""

    word: str
    """``high`` (adequate response) or ``low``."""
    weight: float
    """Effective weight of the leading reading plus corroboration."""
    lead: Reading
    """The reading that drives the call."""
    text: str
    """The call in words, naming readings that agree or were outweighed."""


_AMMONIUM_WORD = {
    "adequate": "high",
    "negative": "high",
    "low": "low",
    "positive": "low",
}


_new_reading = builder(Reading)
_new_ammonium_call = builder(AmmoniumCall)


def ammonium(rd: Readings) -> AmmoniumCall | None:
    """Combine measured NH4, the urine osmolal gap and the urine anion gap into one call.

    The reading with the highest effective weight (base × reliability) leads; agreeing weaker
    readings add :data:`CORROBORATION` × their reliability each; disagreeing ones are named as outweighed and add
    nothing. A not-valid reading never appears here (it was set aside in :func:`gather`).
    """
    cands = []
    for key, base in AMMONIUM_SOURCES:
        r = rd.get(key)
        if r is not None and r.word in _AMMONIUM_WORD:
            cands.append((base * r.factor, base, r))
    if not cands:
        return None
    cands.sort(key=lambda c: -c[0])
    w, _, lead = cands[0]
    word = _AMMONIUM_WORD[lead.word]
    agree = [c for c in cands[1:] if _AMMONIUM_WORD[c[2].word] == word]
    differ = [c for c in cands[1:] if _AMMONIUM_WORD[c[2].word] != word]
    level = "adequate (high)" if word == "high" else "low"
    text = f"{lead.text} reads ammonium excretion as {level}"
    if agree:
        text += "; agreeing: " + ", ".join(c[2].text for c in agree)
    if differ:
        text += "; outweighed: " + ", ".join(f"{c[2].text} reading {c[2].word}" for c in differ)
    aside = [v for k, v in rd.set_aside.items() if k in dict(AMMONIUM_SOURCES)]
    if aside:
        text += "; set aside: " + "; ".join(aside)
    return _new_ammonium_call(word, w + sum(CORROBORATION * c[2].factor for c in agree), lead, text)


Rule = tuple[str, float, str]
"""(pattern id, signed base weight: > 0 for, < 0 against, why in words)."""


@dataclass
class Tally:
    """Evidence collected for and against each pattern."""

    support: dict[str, list[Evidence]] = field(default_factory=lambda: {p: [] for p in PATTERNS})
    """Pattern id → evidence for."""
    against: dict[str, list[Evidence]] = field(default_factory=lambda: {p: [] for p in PATTERNS})
    """Pattern id → evidence against."""
    weights_only: bool = False
    """Keep only the weights (in ``support_w``/``against_w``), not the evidence in words: all a
    caller needs that keeps just the order and the verdicts (the library index)."""
    support_w: dict[str, list[float]] = field(default_factory=lambda: {p: [] for p in PATTERNS})
    """Pattern id → weights for (``weights_only``)."""
    against_w: dict[str, list[float]] = field(default_factory=lambda: {p: [] for p in PATTERNS})
    """Pattern id → weights against (``weights_only``)."""

    def apply(
        self, text: str, rules: Iterable[Rule], factor: float = 1.0,
        index: str | None = None, draw: str | None = None,
    ) -> None:  # fmt: skip
        """Add ``text`` + each rule's reason to its pattern with weight × ``factor``."""
        if self.weights_only:
            for pid, w, _why in rules:
                (self.support_w if w > 0 else self.against_w)[pid].append(abs(w) * factor)
            return
        for pid, w, why in rules:
            ev = new_evidence(f"{text}: {why}" if why else text, index, draw, abs(w) * factor)
            (self.support if w > 0 else self.against)[pid].append(ev)

    def weights(self, pid: str) -> tuple[list[float], list[float]]:
        """The weights for and against ``pid``, heaviest first (the order they are summed in)."""
        if self.weights_only:
            sup, ag = self.support_w[pid], self.against_w[pid]
        else:
            sup = [e.weight for e in self.support[pid]]
            ag = [e.weight for e in self.against[pid]]
        return sorted(sup, reverse=True), sorted(ag, reverse=True)

    def reading(self, r: Reading, rules: Iterable[Rule]) -> None:
        """Apply rules to a reading, with its reliability, index and draw."""
        self.apply(r.text, rules, r.factor, r.index, r.draw)


_FLAG_RULES: dict[Flag, list[Rule]] = {
    Flag.diarrhea: [("gi_bicarbonate_loss", 2.5, "stool bicarbonate loss")],
    Flag.laxatives: [("gi_bicarbonate_loss", 2.0, "stool bicarbonate loss")],
    Flag.bowel_fistula_or_ostomy: [("gi_bicarbonate_loss", 2.5, "intestinal fluid loss")],
    Flag.urinary_diversion: [("gi_bicarbonate_loss", 2.5, "bowel exchanges urine chloride for bicarbonate")],
    Flag.proximal_tubule_toxin: [("proximal_rta", 2.0, "a known cause of proximal tubular injury")],
    Flag.carbonic_anhydrase_inhibitor: [("proximal_rta", 2.0, "blocks proximal bicarbonate reabsorption")],
    Flag.paraprotein: [("proximal_rta", 1.5, "light chains injure the proximal tubule")],
    Flag.autoimmune_disease: [("distal_rta", 1.5, "Sjögren's and lupus cause classic distal RTA")],
    Flag.lithium: [("distal_rta", 1.0, "lithium impairs distal acidification")],
    Flag.toluene: [("distal_rta", 1.0, "toluene gives a distal-RTA-like picture")],
    Flag.urinary_obstruction: [("hyperkalemic_distal_rta", 2.0, "obstruction causes a voltage defect")],
    Flag.sickle_cell: [("hyperkalemic_distal_rta", 1.5, "medullary injury causes a voltage defect")],
    Flag.potassium_sparing_diuretic: [
        ("hyperkalemic_distal_rta", 1.0, "amiloride and triamterene block distal sodium channels"),
        ("hypoaldosteronism", 1.5, "mineralocorticoid antagonism"),
    ],
    Flag.trimethoprim: [
        ("hyperkalemic_distal_rta", 1.0, "blocks distal sodium channels"),
        ("hypoaldosteronism", 1.0, "aldosterone-resistance picture"),
    ],
    Flag.raas_blocker: [("hypoaldosteronism", 1.5, "lowers aldosterone")],
    Flag.diabetes: [("hypoaldosteronism", 1.5, "hyporeninemic hypoaldosteronism is common in diabetes")],
    Flag.calcineurin_inhibitor: [("hypoaldosteronism", 1.5, "causes a type 4 picture")],
    Flag.heparin: [("hypoaldosteronism", 1.0, "suppresses aldosterone synthesis")],
    Flag.nsaid: [("hypoaldosteronism", 1.0, "lowers renin")],
    Flag.known_ckd: [
        ("ckd_acidosis", 1.5, "reduced nephron mass limits ammonium excretion"),
        ("hypoaldosteronism", 0.5, "type 4 often comes with reduced kidney function"),
    ],
    Flag.saline_load: [("chloride_load", 3.0, "chloride-rich fluid dilutes bicarbonate")],
    Flag.ketoacidosis: [
        ("chloride_load", 1.0, "ketoanions lost in urine during recovery leave a normal-gap "
         "component (from memory)"),
    ],
}  # fmt: skip
"""Rules for each context flag (weights in docs/ranking.md); built once, not per case."""
_GI_FLAGS = frozenset(
    {Flag.diarrhea, Flag.laxatives, Flag.bowel_fistula_or_ostomy, Flag.urinary_diversion}
)
_T4_CAUSES = frozenset({
    Flag.raas_blocker, Flag.diabetes, Flag.potassium_sparing_diuretic, Flag.trimethoprim,
    Flag.calcineurin_inhibitor, Flag.heparin, Flag.nsaid, Flag.known_ckd,
})  # fmt: skip


def _flag_rules(t: Tally, flags: frozenset[Flag]) -> None:
    """Context flags: the history a fellow entered (weights in docs/ranking.md)."""
    for flag in sorted(flags, key=str):
        for rule in _FLAG_RULES.get(flag, []):
            t.apply(f"history: {MEANING[flag]}", [rule])
    if not flags & _GI_FLAGS:
        t.apply(
            "history: no diarrhea, laxatives, fistula or urinary diversion recorded",
            [("gi_bicarbonate_loss", -1.0, "hidden laxative use is still possible")],
        )
    if Flag.saline_load not in flags:
        # A dilutional (saline) acidosis is recognised from the fluid chart alone: without a
        # recorded chloride load the laboratory pattern cannot make it more than unlikely.
        t.apply(
            "history: no chloride-rich fluid recorded",
            [("chloride_load", -4.0, "the acidosis cannot be dilutional without a chloride load")],
        )
    if not flags & _T4_CAUSES:
        t.apply(
            "history: no diabetes, kidney disease or aldosterone-lowering drug recorded",
            [("hypoaldosteronism", -1.0, "most type 4 has one of these")],
        )


def judge(
    rd: Readings, s: Settings, weights_only: bool = False
) -> tuple[Tally, AmmoniumCall | None]:
    """Apply every rule to the readings; returns the tally and the ammonium call."""
    t = Tally(weights_only=weights_only)
    _flag_rules(t, rd.context)
    nh4 = ammonium(rd)
    if nh4 is not None:
        w = nh4.weight
        lead = nh4.lead
        if nh4.word == "high":
            rules: list[Rule] = [
                ("gi_bicarbonate_loss", w, "the kidney responds to the acidosis, as in gut loss"),
                ("chloride_load", w / 2, "a normal renal response"),
                ("proximal_rta", w / 2, "distal acidification is intact in proximal RTA"),
                ("distal_rta", -w, "low ammonium is the defect of distal RTA"),
                ("hyperkalemic_distal_rta", -w, "ammonium is low in a voltage defect"),
                ("hypoaldosteronism", -w, "ammonium is low in type 4"),
                ("ckd_acidosis", -w, "CKD acidosis is a failure of ammonium excretion"),
            ]
        else:
            rules = [
                ("gi_bicarbonate_loss", -w, "gut loss drives ammonium excretion up"),
                ("chloride_load", -w / 2, "a chloride load alone leaves ammonium excretion intact"),
                ("proximal_rta", -w / 2, "ammonium is normal in proximal RTA"),
                ("distal_rta", w, "the renal defect lowers ammonium"),
                ("hyperkalemic_distal_rta", w, "the renal defect lowers ammonium"),
                ("hypoaldosteronism", w, "hyperkalemia and low aldosterone lower ammoniagenesis"),
                ("ckd_acidosis", w, "reduced nephron mass lowers ammonium"),
            ]
        t.apply(nh4.text, rules, 1.0, lead.index, lead.draw)

    r = rd.get("urine_ph")
    if r is not None:
        if r.word == "not_acidified":
            distal_w = 2.0
            why = "distal H+ secretion fails"
            if nh4 is not None and nh4.word == "high":
                # High ammonium buffers urine and raises its pH (Batlle et al., NEJM 1988).
                distal_w, why = 0.5, "but with high ammonium a urine pH above 5.5 is expected"
            t.reading(r, [
                ("distal_rta", distal_w, why),
                ("hyperkalemic_distal_rta", distal_w, why),
                ("hypoaldosteronism", -2.5, "type 4 acidifies the urine below 5.5"),
                ("proximal_rta", -1.0, "in the steady state proximal RTA acidifies the urine"),
                ("ckd_acidosis", -0.5, "CKD usually acidifies the urine"),
            ])  # fmt: skip
        else:
            t.reading(r, [
                ("distal_rta", -3.0, "distal H+ secretion works"),
                ("hyperkalemic_distal_rta", -2.0, "distal H+ secretion works"),
                ("hypoaldosteronism", 1.5, "type 4 acidifies the urine"),
                ("proximal_rta", 1.0, "proximal RTA acidifies the urine in the steady state"),
                ("ckd_acidosis", 0.5, "CKD usually acidifies the urine"),
                ("gi_bicarbonate_loss", 0.5, "fits gut loss"),
                ("chloride_load", 0.5, "a normal renal response"),
            ])  # fmt: skip

    r = rd.get("acidification_test")
    if r is not None:
        if r.word == "acidified":
            t.reading(r, [("distal_rta", -3.0, "distal acidification is intact"),
                          ("hyperkalemic_distal_rta", -2.0, "distal acidification is intact")])  # fmt: skip
        else:
            t.reading(r, [("distal_rta", 2.0, f"never below {FURO_ACIDIFIED_BELOW}"),
                          ("hyperkalemic_distal_rta", 1.0, f"never below {FURO_ACIDIFIED_BELOW}")])  # fmt: skip

    r = rd.get("potassium")
    if r is not None:
        table: dict[str, list[Rule]] = {
            "hypo": [
                ("gi_bicarbonate_loss", 1.0, "stool potassium loss"),
                ("proximal_rta", 1.0, "renal potassium loss"),
                ("distal_rta", 1.5, "typical of classic distal RTA"),
                ("hyperkalemic_distal_rta", -2.5, "it is defined by hyperkalemia"),
                ("hypoaldosteronism", -3.0, "type 4 is defined by hyperkalemia"),
                ("ckd_acidosis", -0.5, "CKD seldom lowers potassium"),
            ],
            "hyper": [
                ("hyperkalemic_distal_rta", 2.0, "fits a voltage defect"),
                ("hypoaldosteronism", 2.0, "fits low aldosterone"),
                ("ckd_acidosis", 0.5, "reduced kidney function raises potassium"),
                ("distal_rta", -2.0, "classic distal RTA has a low or normal potassium"),
                ("gi_bicarbonate_loss", -1.0, "gut loss lowers potassium"),
                ("proximal_rta", -1.0, "proximal RTA wastes potassium"),
            ],
            "normal": [
                ("hyperkalemic_distal_rta", -2.5, "it is defined by hyperkalemia"),
                ("hypoaldosteronism", -2.5, "type 4 is defined by hyperkalemia"),
            ],
        }
        t.reading(r, table[r.word])

    r = _k_response(rd)
    kal = rd.get("potassium")
    if r is not None and kal is not None and kal.word != "normal":
        if kal.word == "hyper" and r.word == "low":
            rules = [("hypoaldosteronism", 2.0, "too little potassium secretion for the hyperkalemia"),
                     ("hyperkalemic_distal_rta", 1.5, "too little potassium secretion")]  # fmt: skip
        elif kal.word == "hyper":
            rules = [("hypoaldosteronism", -2.0, "potassium secretion responds to hyperkalemia"),
                     ("hyperkalemic_distal_rta", -1.5, "potassium secretion responds")]  # fmt: skip
        elif r.word == "high":
            rules = [("distal_rta", 1.0, "renal potassium wasting"),
                     ("proximal_rta", 1.0, "renal potassium wasting"),
                     ("gi_bicarbonate_loss", -1.5, "gut loss leaves the kidney conserving potassium")]  # fmt: skip
        else:
            rules = [("gi_bicarbonate_loss", 1.5, "the kidney conserves potassium: the loss is elsewhere"),
                     ("distal_rta", -1.0, "distal RTA usually wastes potassium"),
                     ("proximal_rta", -0.5, "proximal RTA usually wastes potassium")]  # fmt: skip
        t.reading(r, rules)

    r = rd.get("fe_bicarbonate")
    if r is not None:
        table = {
            "high": [
                ("proximal_rta", 3.0, "proximal bicarbonate wasting"),
                ("distal_rta", -2.0, "classic distal RTA wastes little bicarbonate"),
                ("hyperkalemic_distal_rta", -2.0, "a voltage defect wastes little bicarbonate"),
                ("gi_bicarbonate_loss", -2.0, "the kidney should reclaim bicarbonate"),
                ("hypoaldosteronism", -1.0, "type 4 runs 5–10%"),
            ],
            "intermediate": [
                ("hypoaldosteronism", 1.0, "type 4 runs 5–10%"),
                ("proximal_rta", 0.5, "partial wasting"),
                ("distal_rta", 0.5, "distal RTA with bicarbonate wasting (type 3) runs 5–15%"),
            ],
            "low": [
                ("proximal_rta", -3.0, "no proximal bicarbonate wasting"),
                ("distal_rta", 1.0, "fits classic distal RTA"),
                ("hyperkalemic_distal_rta", 1.0, "fits a voltage defect"),
            ],
        }
        t.reading(r, table.get(r.word, []))

    r = rd.get("urine_blood_pco2")
    if r is not None:
        if r.word == "low":
            t.reading(r, [
                ("distal_rta", 3.0, "the collecting duct fails to secrete H+ into alkaline urine"),
                ("hyperkalemic_distal_rta", -2.0, "a voltage defect keeps a normal U–B pCO2"),
                ("hypoaldosteronism", -2.0, "type 4 keeps a normal U–B pCO2"),
                ("proximal_rta", -1.0, "proximal RTA keeps a normal U–B pCO2"),
            ])  # fmt: skip
        else:
            t.reading(r, [
                ("distal_rta", -3.0, "distal H+ secretion into alkaline urine is intact"),
                ("hyperkalemic_distal_rta", 1.0, "fits a voltage defect"),
                ("hypoaldosteronism", 1.0, "fits type 4"),
                ("proximal_rta", 1.0, "fits proximal RTA"),
            ])  # fmt: skip

    _fanconi(t, rd)
    _kidney(t, rd, s)
    return t, nh4


def _k_response(rd: Readings) -> Reading | None:
    """TTKG or urine K/creatinine, whichever is more reliable; K/creatinine on a tie, because
    urea recycling undermines the TTKG (Kamel & Halperin 2011, from memory; Halperin 2017)."""
    a, b = rd.get("urine_potassium_creatinine_ratio"), rd.get("ttkg")
    if a is None or (b is not None and b.factor > a.factor):
        return b
    return a


def _fanconi(t: Tally, rd: Readings) -> None:
    """Proximal tubular features beyond bicarbonate (Berend et al. 2017; sheet §8)."""
    phos = rd.get("fe_phosphate")
    tmp = rd.get("tmp_gfr")
    if tmp is not None and (phos is None or tmp.factor > phos.factor):
        phos = tmp
    if phos is not None:
        wasting = phos.word in ("wasting", "low")
        t.reading(phos, [("proximal_rta", 1.5, "renal phosphate wasting (Fanconi)")] if wasting
                  else [("proximal_rta", -0.5, "phosphate handling is normal")])  # fmt: skip
    r = rd.get("fe_urate")
    if r is not None:
        t.reading(r, [("proximal_rta", 1.0, "urate wasting (Fanconi)")] if r.word == "high"
                  else [("proximal_rta", -0.5, "urate handling is normal")])  # fmt: skip
    r = rd.get("glucosuria")
    if r is not None:
        t.reading(r, [("proximal_rta", 1.5, "glucosuria with a normal plasma glucose (Fanconi)")]
                  if r.word == "present"
                  else [("proximal_rta", -0.5, "no glucosuria")])  # fmt: skip


def _kidney(t: Tally, rd: Readings, s: Settings) -> None:
    """Kidney function and the depth of the acidosis."""
    r = rd.get("egfr")
    if r is not None and r.value is not None:
        g = r.value
        if g < s.egfr_ckd_below:
            rules: list[Rule] = [
                ("ckd_acidosis", 3.0, f"below {fmt(s.egfr_ckd_below)}: enough to cause acidosis"),
                ("hypoaldosteronism", 0.5, "type 4 often comes with reduced kidney function"),
            ]
        elif g < 45:
            rules = [
                ("ckd_acidosis", -1.5, "seldom enough alone to cause acidosis"),
                ("hypoaldosteronism", 0.5, "type 4 often comes with reduced kidney function"),
            ]
        elif g < 60:
            rules = [("ckd_acidosis", -2.0, "too high for CKD to explain the acidosis")]
        else:
            rules = [("ckd_acidosis", -3.0, "kidney function is preserved")]
        t.reading(r, rules)
    r = rd.get("bicarbonate")
    if r is not None and r.value is not None:
        h = r.value
        if h < MILD_ACIDOSIS_HCO3_MIN:
            t.reading(r, [
                ("proximal_rta", -1.0, "proximal RTA seldom goes below 12"),
                ("ckd_acidosis", -1.0, "CKD acidosis is usually milder"),
                ("hypoaldosteronism", -1.5, "type 4 runs 16–22"),
            ])  # fmt: skip
        elif h < TYPE4_USUAL_HCO3_MIN:
            t.reading(r, [("hypoaldosteronism", -1.0, "type 4 usually runs 16–22")])
        else:
            t.reading(r, [("hypoaldosteronism", 0.5, "a mild acidosis, as in type 4")])


MISSING: dict[str, tuple[str, ...]] = {
    "gi_bicarbonate_loss": ("ammonium", "potassium", "k_response"),
    "proximal_rta": ("fe_bicarbonate", "phosphate", "glucosuria", "fe_urate", "urine_ph"),
    "distal_rta": ("urine_ph", "ammonium", "potassium", "urine_blood_pco2", "fe_bicarbonate"),
    "hyperkalemic_distal_rta": ("urine_ph", "ammonium", "potassium", "urine_blood_pco2"),
    "hypoaldosteronism": ("potassium", "k_response", "urine_ph", "ammonium", "egfr"),
    "ckd_acidosis": ("egfr", "ammonium"),
    "chloride_load": ("ammonium", "urine_ph"),
}
"""The questions that bear on each pattern; an unanswered one is listed as missing."""

QUESTION: dict[str, tuple[tuple[str, ...], str]] = {
    "ammonium": (
        ("measured_ammonium", "urine_osmolal_gap", "urine_anion_gap"),
        "urine ammonium during the acidosis (measured NH4, or urine Na, K, Cl, osmolality, "
        "urea and glucose for the urine gaps)",
    ),
    "potassium": (("potassium",), "serum potassium during the acidosis"),
    "k_response": (
        ("ttkg", "urine_potassium_creatinine_ratio"),
        "renal potassium response (urine K with osmolality or creatinine)",
    ),
    "urine_ph": (("urine_ph",), "urine pH during the acidosis (fresh sample, pH meter)"),
    "fe_bicarbonate": (("fe_bicarbonate",), "FEHCO3 during bicarbonate loading"),
    "urine_blood_pco2": (
        ("urine_blood_pco2",),
        "urine-minus-blood pCO2 during bicarbonate loading (urine pH ≥ 7.6)",
    ),
    "phosphate": (("fe_phosphate", "tmp_gfr"), "phosphate handling (FEPO4 or TmP/GFR)"),
    "glucosuria": (("glucosuria",), "urine glucose with plasma glucose"),
    "fe_urate": (("fe_urate",), "FE urate"),
    "egfr": (("egfr",), "eGFR (serum creatinine, age and sex)"),
}
"""Question → (reading keys that answer it, what to enter in words)."""


def missing_for(pid: str, rd: Readings) -> tuple[str, ...]:
    """What would bear on pattern ``pid`` but is absent or not valid, in words."""
    out: list[str] = []
    have = rd.by_key
    for q in MISSING[pid]:
        keys, words = QUESTION[q]
        if not have.keys().isdisjoint(keys):  # some reading answers it
            continue
        aside = [rd.set_aside[k] for k in keys if k in rd.set_aside]
        out.append(words + (" — " + "; ".join(aside) if aside else ""))
    return tuple(out)
