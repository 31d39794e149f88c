"""A second generated library, shaped unlike the demo-derived one: how a fellow's folder grows.

Each invented case has 1–6 draws, notes of a few lines (a literal block), YAML comments, about a
third of the files in SI units, panels written as flow or block mappings and a few long notes,
so file sizes range from a few hundred bytes to several kilobytes. Values start from the demo
cases' draws (canonical units, read by workup.caseio) and are moved by a few percent. A case is
a pure function of its index and the seed, so any library size gives the same first files.
"""

from __future__ import annotations

import json
import math
import random
from dataclasses import dataclass
from datetime import datetime, timedelta
from functools import cache
from pathlib import Path

from workup.analytes import MOLAR_MASS, UnitSystem, analyte
from workup.caseio import load_case

DEMO_CASES = Path(__file__).resolve().parent.parent / "cases"
SEED = 20261203
"""The default seed: the library is the same on every machine and every run."""
DRAW_WEIGHTS = (30, 24, 18, 12, 9, 7)
"""Relative frequency of 1, 2, ... 6 draws per case: most cases are short, some are long."""
SI_SHARE = 0.3
"""Share of files written with ``units: si``."""
BLOCK_SHARE = 0.4
"""Share of files whose panels are block mappings (one value per line) rather than flow."""
LONG_NOTE_SHARE = 0.03
"""Share of files with a long pasted history (30–60 lines): the large tail of file sizes."""
PANELS = ("serum", "blood_gas", "urine")
_TIGHT = {"ph": 0.03, "sodium": 0.03, "chloride": 0.04, "osmolality": 0.03}
_DRAW_LABELS = ("admission", "4 h", "day 2", "day 3", "clinic", "follow-up", "repeat",
                "after fluids", "ward round", "week 2")  # fmt: skip
_NOTE_LINES = (
    "Referred by the ward team for a low bicarbonate on routine bloods.",
    "Repeat gas requested once the fluids have run in.",
    "Urine sent fresh and capped; pH read on the meter, not the dipstick.",
    "Home medicines reviewed with the pharmacist.",
    "Weight taken from the admission record.",
    "Discussed with the primary team; they will chase the outstanding tests.",
    "Follow-up in clinic in two weeks with repeat chemistry.",
    "Sample slightly haemolysed; potassium to be repeated.",
    "Oral intake poor for three days before admission.",
    "No recent travel; no new medicines in the last month.",
)
_COMMENTS = ("# lab slip transcribed by hand", "# point-of-care analyser", "# fresh sample",
             "# repeat after the infusion", "# values checked twice")  # fmt: skip


@dataclass(frozen=True)
class GenDraw:
    """One generated draw: canonical values by panel (dipstick grades as words)."""

    label: str
    """Unique within its case."""
    taken: datetime
    """When the samples were taken."""
    during: str | None
    """The loading test under way, if any (kept from the template draw)."""
    values: dict[str, dict[str, float | str]]
    """Panel name -> analyte key -> canonical value, or the grade word of a dipstick."""
    sample: str | None
    """The blood gas sample kind when not arterial."""
    note: str | None
    """A one-line draw note, or None."""
    comment: str | None
    """A comment line written above the draw, or None."""


@dataclass(frozen=True)
class GenCase:
    """One generated case, before it is written in a unit system and a mapping style."""

    index: int
    """Position in the library (the file is ``ward-INDEX.yaml``)."""
    label: str
    """Ends in ``#INDEX`` (five digits), as the benchmark's readiness check looks for."""
    patient: dict[str, object]
    """Age, sex and weight as written."""
    context: list[str]
    """Clinical-context flags (the template's)."""
    notes: list[str]
    """The lines of the case notes."""
    draws: list[GenDraw]
    """Oldest first, 1 to 6 of them."""
    system: UnitSystem
    """Conventional or SI: what a bare number means for an ambiguous analyte."""
    block: bool
    """Panels as block mappings (one value per line) rather than flow mappings."""


@cache
def _templates() -> tuple[tuple[object, list[tuple]], ...]:
    """Each demo case with its draws as (during, sample, canonical values) tuples."""
    out = []
    for path in sorted(DEMO_CASES.glob("*.yaml")):
        case = load_case(path)
        draws = []
        for d in case.draws:
            values = {
                p: {k: (m.word if m.word is not None else m.canonical)
                    for k, m in d.panel(p).measurements().items()}
                for p in PANELS
            }  # fmt: skip
            sample = d.blood_gas.sample.value if d.blood_gas.sample else None
            draws.append((d.during.value if d.during else None, sample, values))
        out.append((case, draws))
    return tuple(out)


def _vary(panel: str, key: str, x: float | str, rng: random.Random) -> float | str:
    """``x`` moved by a few percent, kept inside the analyte's hard limits."""
    if isinstance(x, str):
        return x
    spread = _TIGHT.get(key, 0.10)
    moved = (
        x + rng.uniform(-spread, spread) if key == "ph" else x * (1 + rng.uniform(-spread, spread))
    )
    lo, hi = analyte(panel, key).hard
    margin = (hi - lo) * 0.005
    return min(max(moved, lo + margin if x > lo else lo), hi - margin)


def plan_case(index: int, seed: int = SEED) -> GenCase:
    """The case at ``index`` of the library made with ``seed`` (the same on every call)."""
    rng = random.Random(f"{seed}-{index}")
    case, tdraws = _templates()[index % len(_templates())]
    n_draws = rng.choices(range(1, 7), weights=DRAW_WEIGHTS)[0]
    labels = rng.sample(_DRAW_LABELS, n_draws)
    when = datetime(2024, 1, 1) + timedelta(minutes=rng.randrange(0, 900 * 24 * 60))
    draws = []
    for j in range(n_draws):
        during, sample, values = tdraws[j % len(tdraws)]
        kept = {}
        for p in PANELS:
            # Later draws often repeat only the blood work; some values are not sent every time.
            if not values[p] or (j and p == "urine" and rng.random() < 0.4):
                continue
            kept[p] = {k: _vary(p, k, v, rng) for k, v in values[p].items()
                       if j == 0 or rng.random() < 0.85}  # fmt: skip
        loading = during if j < len(tdraws) else None
        label = labels[j]
        if loading:
            # A loading-test draw is named for its test, so it never reads as "admission"; a
            # template with several samples of one test must not repeat an hour (labels differ).
            hour = rng.randint(1, 6)
            while f"{loading.split('_')[0]} {hour} h" in {d.label for d in draws}:
                hour += 1
            label = f"{loading.split('_')[0]} {hour} h"
        draws.append(
            GenDraw(
                label=label,
                taken=when,
                during=loading,
                values={p: v for p, v in kept.items() if v},
                sample=sample if sample != "arterial" else None,
                note=rng.choice(_NOTE_LINES) if rng.random() < 0.2 else None,
                comment=rng.choice(_COMMENTS) if rng.random() < 0.5 else None,
            )
        )
        when += timedelta(hours=rng.randint(2, 72))
    long = rng.random() < LONG_NOTE_SHARE
    notes = ["Invented case generated for benchmarks (not a real patient)."]
    notes += [
        rng.choice(_NOTE_LINES) for _ in range(rng.randint(30, 60) if long else rng.randint(1, 5))
    ]
    patient: dict[str, object] = {
        "age": max(18, min(95, (case.patient.age or 50) + rng.randint(-12, 12)))
    }
    if case.patient.sex:
        patient["sex"] = case.patient.sex.value
    if rng.random() < 0.5:
        patient["weight"] = f"{rng.randint(45, 110)} kg"
    return GenCase(
        index=index,
        label=f"{case.label} #{index:05d}",
        patient=patient,
        context=[f.value for f in case.context],
        notes=notes,
        draws=draws,
        system=UnitSystem.si if rng.random() < SI_SHARE else UnitSystem.conventional,
        block=rng.random() < BLOCK_SHARE,
    )


def number_text(x: float) -> str:
    """``x`` with three significant figures (at most three decimals), as a laboratory prints."""
    if x == 0:
        return "0"
    decimals = min(3, max(0, 2 - math.floor(math.log10(abs(x)))))
    return f"{x:.{decimals}f}"


def written(
    panel: str, key: str, x: float | str, system: UnitSystem, explicit: bool
) -> tuple[str, str]:
    """The key and value text for canonical ``x`` in a file of ``system``.

    A bare number means the system's unit; ``explicit`` writes the unit after it. Urea nitrogen
    has no SI unit, so an SI file gives urea instead, as a laboratory reporting mmol/L does.
    """
    if isinstance(x, str):
        return key, x
    a = analyte(panel, key)
    if not a.ambiguous:
        return key, number_text(x)
    unit = a.unit_for(system)
    if unit is None:  # BUN in an SI file: mg/dL of urea nitrogen -> mmol/L of urea
        key, x = "urea", x * 10 / MOLAR_MASS["urea_nitrogen"]
        unit = analyte(panel, key).unit_for(system)
        assert unit is not None
    text = number_text(x / unit.factor)
    return key, f"{text} {unit.symbol}" if explicit else text


def render_case(case: GenCase, system: UnitSystem | None = None, block: bool | None = None) -> str:
    """The case file text, in the case's unit system and mapping style unless told otherwise."""
    system = case.system if system is None else system
    block = case.block if block is None else block
    rng = random.Random(f"render-{case.index}")  # which values carry their unit, which a comment
    flow = lambda m: "{" + ", ".join(f"{k}: {v}" for k, v in m.items()) + "}"  # noqa: E731
    lines = ["# Invented case generated for benchmarks (not a real patient).", "schema: 1",
             f"label: {json.dumps(case.label)}", f"patient: {flow(case.patient)}",
             f"units: {system.value}"]  # fmt: skip
    if case.context:
        lines.append("context: [" + ", ".join(case.context) + "]")
    lines += ["notes: |", *(f"  {line}" for line in case.notes), "draws:"]
    for d in case.draws:
        if d.comment:
            lines.append(f"  {d.comment}")
        lines.append(f"  - label: {json.dumps(d.label)}")
        lines.append(f"    taken: {d.taken.isoformat(timespec='minutes')}"
                     + ("  # time from the request form" if rng.random() < 0.3 else ""))  # fmt: skip
        if d.during:
            lines.append(f"    during: {d.during}")
        for p, values in d.values.items():
            pairs = dict(written(p, k, v, system, rng.random() < 0.5) for k, v in values.items())
            if p == "blood_gas" and d.sample:
                pairs = {"sample": d.sample, **pairs}
            if block:
                lines.append(f"    {p}:")
                lines += [f"      {k}: {v}" for k, v in pairs.items()]
            else:
                lines.append(f"    {p}: {flow(pairs)}")
        if d.note:
            lines.append(f"    notes: {json.dumps(d.note)}")
    return "\n".join(lines) + "\n"


def case_text(index: int, seed: int = SEED) -> str:
    """The text of file ``index`` of the library made with ``seed``."""
    return render_case(plan_case(index, seed))


def generate_varied_library(folder: Path, n: int, seed: int = SEED) -> list[Path]:
    """Write ``n`` invented case files into ``folder``; returns their paths in name order."""
    folder.mkdir(parents=True, exist_ok=True)
    paths = []
    for i in range(n):
        path = folder / f"ward-{i:05d}.yaml"
        path.write_text(case_text(i, seed), encoding="utf-8")
        paths.append(path)
    return paths
