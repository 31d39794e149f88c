"""What every section builder takes and returns: the shared :class:`Context` and a :class:`Section`.

The builders (one module per section group in this package) read the assessment through the
context and record in it what they have said, so later sections do not repeat it.
"""

from __future__ import annotations

from dataclasses import dataclass, field

from workup.assess import Assessment
from workup.findings import Finding
from workup.model import Case, Draw
from workup.notes import phrases as ph

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
    """Long evidence leads already written (see :mod:`workup.notes.sections.evidence`)."""

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
