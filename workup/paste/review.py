"""After the review: answering every "which sample?" question at once, and applying a proposal.

:func:`apply_proposal` resolves the user's answers (:meth:`~workup.paste.model.Proposal.resolve`)
and merges the values into a new :class:`~workup.model.Draw`; the draw given is never changed.
"""

from __future__ import annotations

from collections.abc import Mapping

from workup.analytes import Panel
from workup.model import PANEL_MODELS, Draw, GasSample
from workup.paste.model import Proposal, Question


def answers_for_panel(proposal: Proposal, panel: str) -> dict[str, int]:
    """Choices answering every "which sample?" question with ``panel`` where it is an option.

    For a block of unlabelled lines the user knows to be, say, all serum. Questions whose
    options hold ``panel`` more than once (a unit is also asked) are left for one-by-one answers.
    """
    out = {}
    for q in proposal.questions:
        if q.kind != "panel":
            continue
        hits = [i for i, o in enumerate(q.options) if o.entry and o.entry.panel == panel]
        if len(hits) == 1:
            out[q.id] = hits[0]
    return out


class UnansweredQuestions(ValueError):
    """Raised by :func:`apply_proposal` when a question has neither an answer nor a leave-out."""

    def __init__(self, questions: tuple[Question, ...]):
        self.questions = questions
        ids = ", ".join(q.id for q in questions)
        super().__init__(f"{len(questions)} question(s) unanswered ({ids}); choose or leave out")


def apply_proposal(
    draw: Draw, proposal: Proposal, choices: Mapping[str, int | None] | None = None
) -> Draw:
    """A new draw: ``draw`` with the proposal's values merged in (``draw`` is not changed).

    ``choices`` answers the open questions as in :meth:`Proposal.resolve`; every question must be
    answered or left out, else :class:`UnansweredQuestions` is raised. A proposed value replaces
    the draw's value of the same field; the proposal's collection time and gas sample are used
    only where the draw has none (a new draw) or where they are given, respectively.
    """
    p = proposal.resolve(choices or {})
    if p.questions:
        raise UnansweredQuestions(p.questions)
    panels = {}
    for panel in Panel:
        current = dict(draw.panel(panel).measurements())
        current.update(p.values.get(panel.value, {}))
        extra = {}
        if panel is Panel.blood_gas:
            extra["sample"] = GasSample(p.gas_sample) if p.gas_sample else draw.blood_gas.sample
        panels[panel.value] = PANEL_MODELS[panel](**current, **extra)
    return Draw(
        label=draw.label,
        taken=draw.taken if draw.taken is not None else p.taken,
        during=draw.during,
        notes=draw.notes,
        **panels,
    )
