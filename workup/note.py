"""Drafting the assessment paragraphs of a nephrology consult note from an assessment.

``draft_note`` is what ``workup note`` prints and what the app's note screen shows. The draft is
meant to be read through and edited before it goes into a record: it restates the assessment
(every number is one the assessment reports or a value entered for the draw), states each index
with its validity, and always ends with the standing caution. It names the case by its label only.
"""

from __future__ import annotations

from workup.assess import Assessment
from workup.model import Case
from workup.notes.render import render_markdown, render_text
from workup.notes.sections import build

STYLES = ("brief", "full")
"""``brief`` fits a daily progress note; ``full`` an initial consult."""
FORMATS = ("text", "markdown")
"""``text`` wraps at 80 columns in plain ASCII punctuation; ``markdown`` keeps headings and a table."""


def draft_note(assessment: Assessment, case: Case, style: str = "full", fmt: str = "text") -> str:
    """The note for ``assessment`` of ``case`` in ``style`` (brief|full) and ``fmt`` (text|markdown).

    Raises ValueError for an unknown style or format, or when the assessment is not of ``case``.
    """
    if style not in STYLES:
        raise ValueError(f"unknown note style {style!r}; use one of {', '.join(STYLES)}")
    if fmt not in FORMATS:
        raise ValueError(f"unknown note format {fmt!r}; use one of {', '.join(FORMATS)}")
    if assessment.case_label != case.label:
        raise ValueError(
            f"the assessment is of {assessment.case_label!r}, not of the case {case.label!r}"
        )
    brief = style == "brief"
    sections = build(assessment, case, brief)
    if fmt == "text":
        return render_text(sections, case, brief)
    if brief:
        draws = [d for d in case.draws if d.label == assessment.draw_label]
    else:
        draws = list(case.draws)
    return render_markdown(sections, case, draws, brief)
