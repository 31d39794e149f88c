"""Drafting the consult-note assessment: content (``sections``), wording (``phrases``), values
(``values``) and layout (``render``). The public entry point is :func:`workup.note.draft_note`.

A note restates the assessment; it adds no clinical judgement of its own beyond choosing words for
the index readings the assessment already made, so every number in it is a number the assessment
reports or a value entered for the draw.
"""
