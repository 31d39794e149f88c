"""Sections of the short note only: which draw it reads (``draw``), and gas with gaps in one.

A short note leaves the entered values to the full note; it names the draw instead, so a reader
never takes a loading-test draw's "no disorder" for the patient's state (see
:mod:`workup.draw_focus`).
"""

from __future__ import annotations

from workup.draw_focus import focus_draw, grouped_roles
from workup.notes.sections.acid_base import acid_base_section
from workup.notes.sections.context import Context, Section
from workup.notes.sections.gaps import gaps_section
from workup.notes.values import gas_line, when


def draw_section(c: Context) -> Section:
    """The assessed draw, why it was chosen and the part each other draw plays (its values are
    in the full note; the gas opens :func:`gas_and_gap_section`)."""
    s = Section("draw", "Draw")
    draw = c.draw
    if draw is None:
        s.sentences.append("The case has no draws yet, so there is nothing to assess.")
        return s
    if len(c.case.draws) == 1:
        return s  # nothing to tell apart: the gas paragraph names the draw
    focus = focus_draw(c.case, c.a.draws)
    reason = focus.reason if focus.label == draw.label else "as chosen"
    text = f'"{draw.label}" ({when(draw)}), {reason}'
    others = [(lab, role) for lab, role in focus.others if lab != draw.label]
    if focus.label != draw.label and focus.label is not None:
        others = [(focus.label, f"shows {focus.reason}"), *others]
        others = [o for o in others if o[0] != draw.label]
    if others:
        text += "; " + grouped_roles(others, '"')
    s.sentences.append(text + ".")
    return s


def gas_and_gap_section(c: Context) -> Section:
    """The gas as entered, the acid-base reading and the gaps, as one paragraph of a short note."""
    s = Section("acid_base", "Acid-base")
    draw = c.draw
    gas = gas_line(draw) if draw is not None else None
    if draw is not None and len(c.case.draws) == 1:
        s.sentences.append(f'Draw "{draw.label}" ({when(draw)})' + (f": {gas}." if gas else "."))
    elif gas:
        s.sentences.append(gas[0].upper() + gas[1:] + ".")
    s.sentences += acid_base_section(c).sentences + gaps_section(c).sentences
    return s
