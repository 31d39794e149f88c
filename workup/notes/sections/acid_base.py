"""The ``acid_base`` section: the gas check, the primary disorder, its compensation, any other.

The compensation clauses restate the expected-value indices (``COMPENSATION_INDEX`` says which
belongs to which disorder); :mod:`workup.notes.sections.evidence` quotes each disorder's evidence.
"""

from __future__ import annotations

from workup.findings import Disorder, Status
from workup.notes import phrases as ph
from workup.notes.sections.context import Context, Section
from workup.notes.sections.evidence import evidence_text

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
        return f"{label} {'' if c.brief else 'is '}{band}" + ph.caution_suffix(
            f, None, c.said, c.brief
        )
    return c.clause(id, label, with_reading=False)


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
            text += f" ({evidence_text(d.evidence, c)})"
        s.sentences.append(ph.sentence(text))
        s.sentences.extend(_compensation(c, d))
    if added:
        names = [_article(_disorder_name(d)) for d in added]
        lead = "There is also " if primary else "Disorders found: "
        if c.brief:
            s.sentences.append(ph.sentence(lead + _and(names)))
        else:
            parts = [
                f"{n} ({evidence_text(d.evidence, c)})" if d.evidence else n
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
