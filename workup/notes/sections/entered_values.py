"""The ``values`` section: the values entered for the draws, with units and draw times.

The values lines themselves are written by :mod:`workup.notes.values`; a markdown note shows
this section as a table instead (:mod:`workup.notes.render`).
"""

from __future__ import annotations

from workup.notes.sections.context import Context, Section
from workup.notes.values import values_line, when


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
