"""What a note says, section by section, before any layout: the order a consult reads.

Each builder returns a :class:`Section` of plain sentences (and list items). Sentences restate the
assessment: numbers come from its findings (formatted by :mod:`workup.formatting`) or from the
values entered for the draw; evidence and reasons are quoted as the analysis wrote them.

One module per section group (``entered_values``, ``acid_base``, ``gaps``, ``renal_acid``,
``potassium``, ``kidney``, ``causes``, ``closing``); the shared context is in ``context`` and
evidence quoting in ``evidence``. The order the note reads in is :data:`BUILDERS`, here.
"""

from __future__ import annotations

from workup.assess import Assessment
from workup.model import Case
from workup.notes.sections.acid_base import COMPENSATION_INDEX, acid_base_section
from workup.notes.sections.causes import causes_section
from workup.notes.sections.closing import caution_section, caveats_section, next_tests_section
from workup.notes.sections.context import METABOLIC_ACIDOSES, Context, Section
from workup.notes.sections.draw import draw_section, gas_and_gap_section
from workup.notes.sections.entered_values import values_section
from workup.notes.sections.evidence import LONG_LEAD
from workup.notes.sections.gaps import gaps_section
from workup.notes.sections.kidney import kidney_section
from workup.notes.sections.potassium import potassium_section
from workup.notes.sections.renal_acid import renal_acid_section

# Both notes read the same from the renal acid section on; only their openings differ.
_FROM_RENAL_ACID = (
    renal_acid_section,
    potassium_section,
    kidney_section,
    causes_section,
    next_tests_section,
    caveats_section,
    caution_section,
)

BUILDERS = (values_section, acid_base_section, gaps_section, *_FROM_RENAL_ACID)
"""The section builders in the order the note reads them; each lives in the module of its name."""

BRIEF_BUILDERS = (draw_section, gas_and_gap_section, *_FROM_RENAL_ACID)
"""The short note's order: the draw instead of the entered values (those stay in the full note)."""


def build(a: Assessment, case: Case, brief: bool) -> list[Section]:
    """Every non-empty section of the note, in reading order; the caution always last."""
    c = Context(a, case, brief)
    if a.draw_label is None:
        return [values_section(c), causes_section(c), caution_section(c)]
    sections = [b(c) for b in (BRIEF_BUILDERS if brief else BUILDERS)]
    return [x for x in sections if x.sentences or x.items]


__all__ = [
    "BRIEF_BUILDERS",
    "BUILDERS",
    "COMPENSATION_INDEX",
    "LONG_LEAD",
    "METABOLIC_ACIDOSES",
    "Context",
    "Section",
    "acid_base_section",
    "build",
    "causes_section",
    "caution_section",
    "caveats_section",
    "draw_section",
    "gaps_section",
    "gas_and_gap_section",
    "kidney_section",
    "next_tests_section",
    "potassium_section",
    "renal_acid_section",
    "values_section",
]
