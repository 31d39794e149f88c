"""What a note says, section by section, before any layout: the order a consult reads.

Each builder returns a :class:`Section` of plain sentences (and list items). Sentences restate the
assessment: numbers come from its findings (formatted by :mod:`workup.formatting`) or from the
values entered for the draw; evidence and reasons are quoted as the analysis wrote them.
"""

from __future__ import annotations

from dataclasses import dataclass, field

from workup.analytes import Panel
from workup.assess import Assessment
from workup.cautions import CAUTION_LINES, CAUTION_TEXT
from workup.findings import Disorder, Evidence, Finding, PatternCall, Status, Verdict
from workup.model import Case, Draw
from workup.notes import phrases as ph
from workup.notes.values import values_line, when, written_number
from workup.settings import DEFAULTS

METABOLIC_ACIDOSES = frozenset(
    {"normal_gap_metabolic_acidosis", "high_gap_metabolic_acidosis", "metabolic_acidosis"}
)
"""Disorder ids of a metabolic acidosis (docs: workup.findings.Disorder)."""


@dataclass
class Section:
    """One part of the note.

    In the ``values`` section the items are the values lines, one per draw, which a markdown note
    shows as a table instead.
    """

    key: str
    """Stable id: ``values``, ``acid_base``, ``gaps``, ``renal_acid``, ``potassium``, ``causes``,
    ``kidney``, ``next_tests``, ``caveats`` or ``caution``."""
    title: str
    """The heading (markdown) or lead-in (text)."""
    sentences: list[str] = field(default_factory=list)
    """Running prose."""
    items: list[str] = field(default_factory=list)
    """List items shown after the prose (one per line)."""


@dataclass
class Context:
    """What the builders share: the assessment, the case, the style and what was said already."""

    a: Assessment
    """The assessment the note restates."""
    case: Case
    """The case (for the entered values and draw times)."""
    brief: bool
    """True for the daily-progress style."""
    said: set[str] = field(default_factory=set)
    """Reasons already written, so the closing caveats do not repeat them."""
    leads: set[str] = field(default_factory=set)
    """Long evidence leads already written (see :func:`_evidence`)."""

    def finding(self, id: str) -> Finding | None:
        """The assessed draw's finding ``id``, or None when this version does not compute it."""
        return self.a.indices.get(id)

    def clause(
        self, id: str, label: str, with_reading: bool = True, words: str | None = None
    ) -> str | None:
        """The clause for finding ``id`` (None when absent), noting the reasons it wrote."""
        f = self.finding(id)
        if f is None:
            return None
        if self.brief:
            label = ph.BRIEF_LABEL.get(id, label)
        return ph.clause(f, label, self.brief, with_reading, self.said, words)

    @property
    def acidosis(self) -> bool:
        """True when the assessed draw has a metabolic acidosis of any kind."""
        return any(d.id in METABOLIC_ACIDOSES for d in self.a.disorders)

    @property
    def draw(self) -> Draw | None:
        """The assessed draw."""
        if self.a.draw_label is None:
            return None
        return next((d for d in self.case.draws if d.label == self.a.draw_label), None)


# ---------------------------------------------------------------------------------------------
# values


def values_section(c: Context) -> Section:
    """The entered values with units and draw times (every draw in a consult note)."""
    s = Section("values", "Values")
    draw = c.draw
    if draw is None:
        s.sentences.append("The case has no draws yet, so there is nothing to assess.")
        return s
    others = [d for d in c.case.draws if d.label != draw.label]
    if not others or c.brief:
        s.title = f'Values, "{draw.label}" draw ({when(draw)})'
        s.items.append(values_line(draw, c.brief) + ".")
    if not others:
        return s
    if c.brief:
        s.sentences.append(
            "Other draws, read for the causes: "
            + "; ".join(f'"{d.label}" ({when(d)})' for d in others)
            + "."
        )
        return s
    s.sentences.append(
        f'Indices are from the "{draw.label}" draw; the causes are judged on every draw.'
    )
    if draw.during is not None:
        # A loading draw answers the loading question; the steady-state readings live elsewhere.
        s.sentences.append(
            "That draw was taken during a loading test, so its urine acid and ammonium readings "
            "are not steady-state ones; those of the other draws appear under the causes."
        )
    for d in c.case.draws:
        s.items.append(f'"{d.label}" ({when(d)}): {values_line(d, False)}.')
    return s


# ---------------------------------------------------------------------------------------------
# acid-base


# The compensation index that belongs to each primary disorder (by detail where it matters).
COMPENSATION_INDEX: dict[str, dict[str | None, tuple[str, ...]]] = {
    "normal_gap_metabolic_acidosis": {None: ("expected_pco2",)},
    "high_gap_metabolic_acidosis": {None: ("expected_pco2",)},
    "metabolic_acidosis": {None: ("expected_pco2",)},
    "metabolic_alkalosis": {None: ("expected_pco2_metabolic_alkalosis",)},
    "respiratory_acidosis": {
        "acute": ("expected_bicarbonate_respiratory_acidosis_acute",),
        "chronic": ("expected_bicarbonate_respiratory_acidosis_chronic",),
        None: (
            "expected_bicarbonate_respiratory_acidosis_acute",
            "expected_bicarbonate_respiratory_acidosis_chronic",
        ),
    },
    "respiratory_alkalosis": {
        "acute": ("expected_bicarbonate_respiratory_alkalosis_acute",),
        "chronic": ("expected_bicarbonate_respiratory_alkalosis_chronic",),
        None: (
            "expected_bicarbonate_respiratory_alkalosis_acute",
            "expected_bicarbonate_respiratory_alkalosis_chronic",
        ),
    },
}

_EXPECTED_LABEL = {
    "expected_pco2": "the expected pCO2 (Winters' formula)",
    "expected_pco2_metabolic_alkalosis": "the expected pCO2 for a metabolic alkalosis",
    "expected_bicarbonate_respiratory_acidosis_acute": "the expected HCO3 if acute",
    "expected_bicarbonate_respiratory_acidosis_chronic": "the expected HCO3 if chronic",
    "expected_bicarbonate_respiratory_alkalosis_acute": "the expected HCO3 if acute",
    "expected_bicarbonate_respiratory_alkalosis_chronic": "the expected HCO3 if chronic",
}


def _expected_clause(c: Context, id: str) -> str | None:
    f = c.finding(id)
    if f is None:
        return None
    label = _EXPECTED_LABEL[id]
    if c.brief:
        label = label.removeprefix("the ").replace(" (Winters' formula)", "")
    band = ph.band_of(f)
    if ph.stated(f) and band is not None:
        # The expected range is the number that matters here; the midpoint adds nothing.
        return f"{label} {'' if c.brief else 'is '}{band}" + ph.caution_suffix(f, None, c.said)
    return c.clause(id, label, with_reading=False)


LONG_LEAD = 80
"""An evidence lead longer than this is written in full once and shortened after that."""


def _evidence(ev: tuple[Evidence, ...], c: Context, limit: int | None = None) -> str:
    """Evidence texts as the analysis wrote them, joined; a long lead already written is cut.

    The ranker writes one reading (say the ammonium verdict) as the lead of an item for each
    cause it bears on, "<reading>: <what it means for this cause>"; repeating the whole reading
    under every cause buries the point, so the second time only its first clause is kept.
    """
    picked = ev if limit is None else ev[:limit]
    out = []
    for e in picked:
        text = ph.tidy(e.text)
        if e.index == "henderson_hasselbalch_ph":
            # The failed gas check opens the section in full; its evidence is not quoted twice.
            for said in c.said:
                if said and len(said) > 40 and said in text:
                    text = text.replace(said, "as above")
        lead, sep, why = text.rpartition(": ")
        if sep and len(lead) > LONG_LEAD:
            if c.brief:
                text = f"{lead.split('; ')[0]}: {why}"  # a daily note keeps the gist
            elif lead in c.leads:
                text = f"{lead.split('; ')[0]}, as above: {why}"
            c.leads.add(lead)
        out.append(text)
    return "; ".join(out)


def _disorder_name(d: Disorder) -> str:
    return f"{d.name} ({d.detail})" if d.detail else d.name


def _gas_entered(c: Context) -> bool:
    draw = c.draw
    return draw is not None and {"ph", "pco2"} <= set(draw.blood_gas.measurements())


def acid_base_section(c: Context) -> Section:
    """Primary disorder, whether compensation is appropriate, and any added disorder."""
    s = Section("acid_base", "Acid-base")
    hh = c.finding("henderson_hasselbalch_ph")
    if hh is not None and hh.status is Status.not_valid:
        why = ph.caveat(hh)
        c.said.add(why or "")
        s.sentences.append(
            "The gas values do not agree with each other on the Henderson-Hasselbalch check"
            + (f" ({why})" if why else "")
            + ", so the reading below is provisional until the sample is checked."
        )
    elif hh is not None and hh.status is Status.caution:
        why = ph.caveat(hh)
        c.said.add(why or "")
        s.sentences.append(
            "The Henderson-Hasselbalch check shows a small mismatch"
            + (f" ({why})" if why else "")
            + "."
        )
    elif hh is not None and hh.status is Status.ok and not c.brief:
        s.sentences.append("The gas is internally consistent on the Henderson-Hasselbalch check.")
    if not c.a.disorders:
        if not _gas_entered(c):
            s.sentences.append(
                "No blood gas (pH and pCO2) was entered with this draw, so the primary disorder "
                "and its compensation are not judged; a gas drawn with the chemistry is suggested."
            )
        else:
            s.sentences.append("No acid-base disorder is identified from the values entered.")
        return s
    primary = [d for d in c.a.disorders if d.primary]
    added = [d for d in c.a.disorders if not d.primary]
    if c.brief:
        s.sentences.append(_acid_base_brief(c, primary, added))
        return s
    for d in primary:
        text = f"{_disorder_name(d)} is the primary disorder"
        if not c.brief and d.evidence:
            text += f" ({_evidence(d.evidence, c)})"
        s.sentences.append(ph.sentence(text))
        s.sentences.extend(_compensation(c, d))
    if added:
        names = [_article(_disorder_name(d)) for d in added]
        lead = "There is also " if primary else "Disorders found: "
        if c.brief:
            s.sentences.append(ph.sentence(lead + _and(names)))
        else:
            parts = [
                f"{n} ({_evidence(d.evidence, c)})" if d.evidence else n
                for n, d in zip(names, added, strict=True)
            ]
            s.sentences.append(ph.sentence(lead + _and(parts)))
    elif primary:
        s.sentences.append("No mixed disorder is identified.")
    return s


def _acid_base_brief(c: Context, primary: list[Disorder], added: list[Disorder]) -> str:
    """One sentence: the primary disorder, its compensation and band, and any added disorder."""
    parts = []
    for d in primary:
        text = _disorder_name(d)
        if not _gas_entered(c):
            parts.append(text + "; no gas entered, so compensation is not judged")
            continue
        ids = COMPENSATION_INDEX.get(d.id, {})
        bands = [
            x for x in (_expected_clause(c, i) for i in ids.get(d.detail, ids.get(None, ()))) if x
        ]
        if d.compensation:
            text += f", compensation {d.compensation}"
        if bands:
            text += f" ({'; '.join(bands)})"
        parts.append(text)
    if added:
        lead = "also " if primary else ""
        parts.append(lead + _and([_article(_disorder_name(d)) for d in added]))
    elif primary:
        parts.append("no mixed disorder")
    return ph.sentence("; ".join(parts))


def _compensation(c: Context, d: Disorder) -> list[str]:
    if not _gas_entered(c):
        return [
            "No blood gas was entered, so compensation is not judged; a gas drawn with the "
            "chemistry is suggested."
        ]
    ids = COMPENSATION_INDEX.get(d.id, {})
    chosen = ids.get(d.detail, ids.get(None, ()))
    clauses = [x for x in (_expected_clause(c, i) for i in chosen) if x]
    if d.compensation:
        text = f"Compensation is {d.compensation}"
        if clauses:
            text += f": {ph.join_clauses(clauses)}"
        return [ph.sentence(text)]
    if clauses:
        return [ph.sentence(ph.join_clauses(clauses))]
    return []


def _lower(text: str) -> str:
    """``text`` with a lower-case first letter unless it starts an abbreviation ("FEHCO3")."""
    if len(text) > 1 and not text[1].isupper():
        return text[0].lower() + text[1:]
    return text


def _article(name: str) -> str:
    """ "Metabolic alkalosis" -> "a metabolic alkalosis", for the middle of a sentence."""
    name = _lower(name)
    return ("an " if name[0] in "aeiou" else "a ") + name


def _and(items: list[str]) -> str:
    if len(items) <= 1:
        return "".join(items)
    return ", ".join(items[:-1]) + " and " + items[-1]


# ---------------------------------------------------------------------------------------------
# gaps


def gaps_section(c: Context) -> Section:
    """Anion gap, its albumin-corrected value, the delta ratio and (consult) the osmolal gap."""
    s = Section("gaps", "Gaps")
    parts = [c.clause("anion_gap", "the anion gap")]
    corrected = c.finding("anion_gap_albumin_corrected")
    if corrected is not None and (not c.brief or corrected.status is not Status.needs_input):
        parts.append(c.clause("anion_gap_albumin_corrected", "the albumin-corrected gap"))
    delta = c.finding("delta_ratio")
    # The delta ratio only means something alongside a metabolic acidosis.
    if delta is not None and c.acidosis and delta.status is not Status.needs_input:
        parts.append(c.clause("delta_ratio", "the delta ratio"))
    osm = c.finding("serum_osmolal_gap")
    if osm is not None and not c.brief and osm.status is not Status.needs_input:
        parts.append(c.clause("serum_osmolal_gap", "the serum osmolal gap"))
    parts = [p for p in parts if p]
    if parts:
        s.sentences.append(ph.sentence(ph.join_clauses(parts)))
    return s


# ---------------------------------------------------------------------------------------------
# renal acid excretion

_RENAL = (
    ("urine_ph", "the urine pH"),
    ("urine_anion_gap", "the urine anion gap"),
    ("urine_osmolal_gap", "the urine osmolal gap"),
    ("urine_ammonium_estimate", None),
    ("urine_ammonium_creatinine_ratio", "the urine ammonium/creatinine ratio"),
)


def _ammonium_label(f: Finding) -> str:
    if f.extra.get("measured"):
        return "the measured urine ammonium"
    return "the urine ammonium estimated from the osmolal gap"


def renal_acid_section(c: Context) -> Section:
    """Urine pH, the urine anion and osmolal gaps or measured ammonium, with their caveats."""
    s = Section("renal_acid", "Renal acid" if c.brief else "Renal acid excretion")
    draw = c.draw
    if draw is not None and not draw.urine.measurements() and c.brief:
        s.sentences.append("Not assessed: no urine with this draw; a spot urine is suggested.")
        return s
    if draw is not None and not draw.urine.measurements():
        s.sentences.append(
            "Not assessed: no urine studies were entered with this draw; a spot urine for "
            "sodium, potassium, chloride, pH, osmolality, urea, glucose and creatinine, taken "
            "with the blood, is suggested."
        )
        return s
    parts = []
    for id, label in _RENAL:
        f = c.finding(id)
        if f is None:
            continue
        if c.brief and f.status is Status.needs_input:
            continue
        if c.brief and id == "urine_ammonium_estimate" and not f.extra.get("measured"):
            continue  # the daily note keeps the osmolal gap it was estimated from
        if c.brief and id == "urine_ammonium_creatinine_ratio" and parts:
            continue  # one ammonium measure is enough for a daily note
        words = None
        if id == "urine_ph" and not c.brief and not c.acidosis:
            # "appropriately" and "despite the acidosis" only hold during an acidosis.
            words = {"acidified": "acidified", "not_acidified": "not acidified"}.get(
                f.interpretation or ""
            )
        parts.append(c.clause(id, label or _ammonium_label(f), words=words))
    parts = [p for p in parts if p]
    if parts:
        s.sentences.append(ph.sentence(ph.join_clauses(parts)))
    s.sentences.extend(_ammonium_summary(c))
    return s


def _ammonium_summary(c: Context) -> list[str]:
    directions: dict[str, str] = {}
    measured = False
    for id, table in ph.AMMONIUM_DIRECTION.items():
        f = c.finding(id)
        if f is None or not ph.stated(f) or f.interpretation not in table:
            continue
        directions[id] = table[f.interpretation]
        if id == "urine_ammonium_estimate" and f.extra.get("measured"):
            measured = True
    found = set(directions.values())
    if len(found) > 1:
        if measured:
            return [
                "These measures disagree about ammonium excretion; the measured urine ammonium "
                "is the direct one."
            ]
        return [
            "These measures disagree about ammonium excretion; a measured urine ammonium would "
            "settle it."
        ]
    if len(found) == 1 and len(directions) > 1 and not c.brief:
        return [f"Taken together, renal ammonium excretion appears {found.pop()}."]
    return []


# ---------------------------------------------------------------------------------------------
# potassium

_KALEMIA_WORD = {"hypo": "low", "normal": "normal", "hyper": "high"}

# How a TTKG or urine K/creatinine reading reads against the serum potassium state.
_K_READING = {
    ("hypo", "low"): "appropriately low for the hypokalemia: the kidney is conserving potassium",
    ("hypo", "high"): "inappropriately high for the hypokalemia: a renal potassium loss",
    ("hyper", "low"): "inappropriately low for the hyperkalemia: a reduced aldosterone effect, "
    "from deficiency or resistance",
    ("hyper", "high"): "appropriately high for the hyperkalemia",
}


_K_READING_BRIEF = {
    ("hypo", "low"): "appropriately low: renal conservation",
    ("hypo", "high"): "inappropriately high: renal K loss",
    ("hyper", "low"): "inappropriately low: reduced aldosterone effect",
    ("hyper", "high"): "appropriately high",
}


def _kalemia(c: Context) -> str | None:
    for id in ("ttkg", "urine_potassium_creatinine_ratio"):
        f = c.finding(id)
        if f is not None and f.extra.get("kalemia") in _KALEMIA_WORD:
            return str(f.extra["kalemia"])
    k = _serum_potassium(c)
    if k is None:
        return None
    settings = c.a.settings or DEFAULTS
    if k < settings.potassium_low:
        return "hypo"
    if k > settings.potassium_high:
        return "hyper"
    return "normal"


def _serum_potassium(c: Context) -> float | None:
    draw = c.draw
    return None if draw is None else draw.serum.canonical("potassium")


def _k_clause(c: Context, id: str, label: str, kalemia: str | None) -> str | None:
    f = c.finding(id)
    if f is None or (c.brief and f.status is Status.needs_input):
        return None
    if not ph.stated(f):
        return c.clause(id, label)
    table = _K_READING_BRIEF if c.brief else _K_READING
    words = table.get((kalemia or "", f.interpretation or ""))
    if words is None:
        return c.clause(id, label)
    if c.brief:
        label = ph.BRIEF_LABEL.get(id, label)
    return f"{label} is {ph.value_of(f)}" + ph.caution_suffix(f, words, c.said)


def potassium_section(c: Context) -> Section:
    """Serum potassium and the kidney's potassium handling (TTKG, urine K/creatinine)."""
    s = Section("potassium", "Potassium")
    draw = c.draw
    kalemia = _kalemia(c)
    m = None if draw is None else draw.serum.measurements().get("potassium")
    serum_k = None
    if m is None:
        s.sentences.append("Serum potassium is not available.")
    elif c.brief:
        # Joined to the kidney's handling below, one sentence in a daily note.
        serum_k = (
            f"serum K {written_number(Panel.serum, 'potassium', m)} {m.unit} "
            f"({_KALEMIA_WORD[kalemia or 'normal']})"
        )
    else:
        s.sentences.append(
            f"Serum potassium {written_number(Panel.serum, 'potassium', m)} {m.unit} is "
            f"{_KALEMIA_WORD[kalemia or 'normal']}."
        )
    if draw is not None and not draw.urine.measurements():
        if serum_k:
            s.sentences.append(ph.sentence(serum_k))
        return s  # the renal section already says no urine was entered
    ratio_id, ratio_label = "urine_potassium_creatinine_ratio", "the urine K/creatinine ratio"
    ratio_f = c.finding(ratio_id)
    if c.brief and ratio_f is not None and ph.stated(ratio_f):
        # One measure of potassium handling is enough for a daily note.
        parts = [_k_clause(c, ratio_id, ratio_label, kalemia)]
    else:
        # In reading order, so that a caveat shared by both is written in full first.
        ttkg = _k_clause(c, "ttkg", "the TTKG", kalemia)
        parts = [ttkg, _k_clause(c, ratio_id, ratio_label, kalemia)]
    parts = [p for p in [serum_k, *parts] if p]
    if parts:
        s.sentences.append(ph.sentence(ph.join_clauses(parts)))
    return s


# ---------------------------------------------------------------------------------------------
# kidney function and tubular studies

_KIDNEY = (
    ("egfr", "the eGFR"),
    ("fe_bicarbonate", "the fractional excretion of bicarbonate"),
    ("urine_blood_pco2", "the urine-minus-blood pCO2"),
    ("fe_phosphate", "the fractional excretion of phosphate"),
    ("tmp_gfr", "the TmP/GFR"),
    ("fe_urate", "the fractional excretion of urate"),
)

_KIDNEY_BRIEF = {"egfr": "the eGFR", "fe_bicarbonate": "the FEHCO3"}


def kidney_section(c: Context) -> Section:
    """eGFR and the tubular studies that were done (absent ones are not listed as gaps here:
    the causes and suggested tests say which would help)."""
    s = Section("kidney", "Kidney" if c.brief else "Kidney function and tubular studies")
    parts = []
    for id, label in _KIDNEY:
        f = c.finding(id)
        if f is None or f.status is Status.needs_input:
            continue
        if c.brief and id not in _KIDNEY_BRIEF:
            continue
        parts.append(c.clause(id, _KIDNEY_BRIEF.get(id, label) if c.brief else label))
    parts = [p for p in parts if p]
    if parts:
        s.sentences.append(ph.sentence(ph.join_clauses(parts)))
    return s


# ---------------------------------------------------------------------------------------------
# causes

_VERDICT_WORD = {
    Verdict.likely: "likely",
    Verdict.possible: "possible",
    Verdict.unlikely: "unlikely",
}


def causes_section(c: Context) -> Section:
    """The ranked causes of a normal-gap acidosis, with the evidence for and against."""
    s = Section("causes", "Causes")
    for note in c.a.ranking_notes:
        if c.brief and note.startswith("Ammonium:"):
            continue  # the daily note's renal line already says which ammonium reading counts
        s.sentences.append(ph.sentence(ph.tidy(note)))
        _head, sep, rest = ph.tidy(note).partition(": ")
        if sep:
            c.leads.add(rest)  # a reading the notes state in full is shortened under each cause
    calls = c.a.patterns
    if not calls:
        if not c.a.ranking_notes:
            s.sentences.append("No cause of a normal-gap acidosis was ranked.")
        return s
    if c.brief:
        s.sentences.extend(_causes_brief(c, calls))
    else:
        s.items.extend(_causes_full(c, calls))
    return s


def _causes_brief(c: Context, calls: list[PatternCall]) -> list[str]:
    out = []
    top = calls[0]
    if top.verdict is not Verdict.unlikely:
        text = f"{top.name} is {_VERDICT_WORD[top.verdict]}"
        if top.support:
            text += f" (for: {_evidence(top.support, c, 2)})"
        if top.against:
            text += f" (against: {_evidence(top.against, c, 1)})"
        out.append(ph.sentence(text))
        rest = calls[1:]
    else:
        rest = calls
    possible = [p.name for p in rest if p.verdict is not Verdict.unlikely]
    unlikely = [p.name for p in rest if p.verdict is Verdict.unlikely]
    if not possible and out == [] and c.a.ranking_notes:
        return out  # nothing ranked at all: the ranking's note says why, a list adds nothing
    if possible:
        out.append(ph.sentence("Also possible: " + ", ".join(possible)))
    if unlikely:
        out.append(ph.sentence("Unlikely: " + ", ".join(unlikely)))
    return out


def _causes_full(c: Context, calls: list[PatternCall]) -> list[str]:
    """One list item per cause still in play, best first, then one for those ruled unlikely."""
    out = []
    first = True
    for p in calls:
        if p.verdict is Verdict.unlikely:
            continue
        lead = "the leading consideration" if first else _VERDICT_WORD[p.verdict]
        text = f"{p.name} is {lead}" + (f" ({_VERDICT_WORD[p.verdict]})" if first else "")
        first = False
        parts = [ph.sentence(text)]
        if p.support:
            parts.append(ph.sentence("In favour: " + _evidence(p.support, c)))
        if p.against:
            parts.append(ph.sentence("Against: " + _evidence(p.against, c)))
        if p.missing:
            parts.append(ph.sentence("Not yet known: " + ", ".join(ph.tidy(m) for m in p.missing)))
        out.append(" ".join(parts))
    unlikely = [p for p in calls if p.verdict is Verdict.unlikely]
    shared = {p.against[0].text if p.against else "" for p in unlikely}
    if len(unlikely) > 1 and len(shared) == 1 and "" not in shared:
        # One reason rules them all out (no normal-gap acidosis at all): say it once.
        why = ph.tidy(shared.pop())
        out.append(
            ph.sentence(f"Considered unlikely ({why}): " + ", ".join(p.name for p in unlikely))
        )
    elif unlikely:
        parts = [
            f"{p.name} ({_evidence(p.against, c, 1)})" if p.against else p.name for p in unlikely
        ]
        out.append(ph.sentence("Considered unlikely: " + "; ".join(parts)))
    return out


# ---------------------------------------------------------------------------------------------
# next tests, caveats, caution


def next_tests_section(c: Context) -> Section:
    """The suggested tests, most useful first (the first three in a daily note)."""
    s = Section("next_tests", "Next" if c.brief else "Suggested next")
    tests = c.a.next_tests[:3] if c.brief else c.a.next_tests
    if c.brief:
        if tests:
            # One sentence per test: a test's own text may hold a semicolon, and some start
            # with a name (Fanconi, Anti-Ro) that must keep its capital.
            s.sentences.extend(ph.sentence(ph.tidy(t.text)) for t in tests)
        return s
    for t in tests:
        s.items.append(f"{ph.tidy(t.text)}: {ph.tidy(t.why)}." if t.why else ph.sentence(t.text))
    return s


def caveats_section(c: Context) -> Section:
    """Case-specific cautions (entered values, gas sample) not already stated above."""
    s = Section("caveats", "Caveats")
    standing = set(CAUTION_LINES)
    # The assessment also lists the first reason of every not-valid index; those that matter
    # were stated beside their index, and the rest (a compensation rule that does not apply to
    # this disorder) would only crowd the note.
    index_reasons = {
        ph.tidy(f.reasons[0])
        for f in c.a.indices.values()
        if f.status is Status.not_valid and f.reasons
    }
    for text in c.a.cautions:
        if text in standing or ph.tidy(text) in c.said or ph.tidy(text) in index_reasons:
            continue
        s.sentences.append(ph.sentence(ph.tidy(text)))
    return s


def caution_section(c: Context) -> Section:
    """The standing caution that closes every note."""
    return Section("caution", "Caution", [CAUTION_TEXT])


BUILDERS = (
    values_section,
    acid_base_section,
    gaps_section,
    renal_acid_section,
    potassium_section,
    kidney_section,
    causes_section,
    next_tests_section,
    caveats_section,
    caution_section,
)


def build(a: Assessment, case: Case, brief: bool) -> list[Section]:
    """Every non-empty section of the note, in reading order; the caution always last."""
    c = Context(a, case, brief)
    if a.draw_label is None:
        return [values_section(c), causes_section(c), caution_section(c)]
    sections = [b(c) for b in BUILDERS]
    return [x for x in sections if x.sentences or x.items]
