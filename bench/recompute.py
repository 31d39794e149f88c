"""One full recompute after an edit, in process: what the fellow waits for after typing a value.

For each demo case, one value of the latest draw is rewritten (alternately nudged up and back, so
every recompute sees a changed value) and the whole case is assessed again with
:func:`workup.assess.assess`. The edit (reading the written value into a measurement) is part of
the timed step, as it is in the app.
"""

from __future__ import annotations

import gc
import time
from dataclasses import dataclass
from pathlib import Path

from workup.analytes import Panel, analyte
from workup.assess import assess
from workup.caseio import load_case
from workup.model import Case, Draw
from workup.quantity import Measurement, read_value

PREFERRED = ("bicarbonate", "chloride", "sodium")
"""Serum values edited first when present: every index of a low-bicarbonate workup reads them."""


@dataclass
class Edit:
    """The one value that is edited in a case: where it lives and its two written forms."""

    draw: Draw
    """The draw holding the value (the latest)."""
    panel: Panel
    """Its panel."""
    key: str
    """Its analyte key."""
    written: tuple[str, str]
    """The original value and a nudged one, as a fellow would type them."""


def pick_edit(case: Case) -> Edit | None:
    """The value to edit in ``case``: a preferred serum value of the latest draw, else any value."""
    if not case.draws:
        return None
    draw = case.draws[-1]
    present: list[tuple[Panel, str, Measurement]] = [
        (panel, key, m) for panel in Panel for key, m in draw.panel(panel).measurements().items()
    ]
    present = [p for p in present if p[2].word is None]  # dipstick grades have no "nudge"
    if not present:
        return None
    by_key = {(p, k): m for p, k, m in present}
    chosen = next(
        ((Panel.serum, k) for k in PREFERRED if (Panel.serum, k) in by_key),
        (present[0][0], present[0][1]),
    )
    m = by_key[chosen]
    nudged = m.value * 1.02 if m.value else 0.1
    return Edit(draw, chosen[0], chosen[1], (_write(m.value, m.unit), _write(nudged, m.unit)))


def _write(value: float, unit: str) -> str:
    return f"{value:.4g} {unit}".strip()


def apply_edit(case: Case, edit: Edit, which: int) -> None:
    """Write form ``which`` (0 or 1) of the edited value into the case, as the app would."""
    a = analyte(edit.panel, edit.key)
    m = read_value(a, edit.written[which], case.units)
    setattr(edit.draw.panel(edit.panel), edit.key, m)


@dataclass
class RecomputeResult:
    """Timings in milliseconds."""

    per_case_ms: list[float]
    """Every single edit + assess, all cases pooled."""
    sweep_ms: list[float]
    """Every sweep through all the cases (one edit + assess each)."""
    cases: int
    """Cases included."""
    skipped: list[str]
    """Cases that could not be edited or assessed, with the reason."""


def run(cases_dir: Path, sweeps: int = 300, warmup: int = 20) -> RecomputeResult:
    """Time ``sweeps`` sweeps over the demo cases in ``cases_dir`` after ``warmup`` untimed ones."""
    work: list[tuple[Case, Edit]] = []
    skipped: list[str] = []
    for path in sorted(cases_dir.glob("*.yaml")):
        try:
            case = load_case(path)
            edit = pick_edit(case)
            if edit is None:
                skipped.append(f"{path.name}: no value to edit")
                continue
            assess(case)
        except Exception as exc:  # a half-built core must not stop the other benchmarks
            skipped.append(f"{path.name}: {type(exc).__name__}: {exc}")
            continue
        work.append((case, edit))
    per_case: list[float] = []
    sweep: list[float] = []
    clock = time.perf_counter_ns
    for i in range(warmup + sweeps):
        total = 0
        for case, edit in work:
            t0 = clock()
            apply_edit(case, edit, (i + 1) % 2)
            assess(case)
            dt = clock() - t0
            total += dt
            if i >= warmup:
                per_case.append(dt / 1e6)
        if i >= warmup:
            sweep.append(total / 1e6)
        if i == warmup - 1:
            gc.collect()  # start the timed part from a clean heap; later collections count
    return RecomputeResult(per_case, sweep, len(work), skipped)
