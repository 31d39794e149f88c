"""Propose a draw from lab-report text copied out of the record, for review before it is applied.

:func:`propose` reads pasted text line by line. Each value it recognises lands in one panel field
with its source line; anything it cannot place without guessing becomes a :class:`Question`
(serum or urine? which unit? two values for one analyte? "CO2" on a gas report?), and anything it
cannot read is listed as :class:`Unrecognised` with the reason. Nothing is applied until the user
has reviewed the proposal: :meth:`Proposal.resolve` takes the answers and :func:`apply_proposal`
merges the values into a new :class:`~workup.model.Draw`.

Units follow the case-file rules (:func:`workup.quantity.read_value`): a unit written in the text
wins; otherwise the explicit ``units`` default; a bare number of an analyte whose unit differs
between countries, with no default, is a question with the possible units as options.

The package, in the order the text goes through it: :mod:`~workup.paste.reading` (the reading
pass), :mod:`~workup.paste.context_lines` (headings and times), :mod:`~workup.paste.targets`
(where a value may go, what to ask), :mod:`~workup.paste.pending` (settling the pass into a
proposal), :mod:`~workup.paste.model` (the records) and :mod:`~workup.paste.review` (applying).
"""

from __future__ import annotations

# PANEL_WORD and the line limits are importable here as before, but not part of ``*``.
from workup.paste.model import PANEL_WORD as PANEL_WORD
from workup.paste.model import (
    Entry,
    Option,
    Proposal,
    Question,
    SourceLine,
    Unrecognised,
)
from workup.paste.reading import MAX_LINE_CHARS as MAX_LINE_CHARS
from workup.paste.reading import MAX_LINES as MAX_LINES
from workup.paste.reading import propose
from workup.paste.review import UnansweredQuestions, answers_for_panel, apply_proposal

__all__ = [
    "Entry",
    "Option",
    "Proposal",
    "Question",
    "SourceLine",
    "UnansweredQuestions",
    "Unrecognised",
    "answers_for_panel",
    "apply_proposal",
    "propose",
]
