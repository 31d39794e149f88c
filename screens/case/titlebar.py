"""One-line title bars that fit their width: fields are dropped or shortened whole, never cut.

A title is a list of fields in display order, each with a priority and one or more wordings
(longest first). :func:`fit_fields` keeps what fits the line, giving up the lowest-priority
field first; :class:`FittedLine` does that at render time, so the line is right at any width.
"""

from __future__ import annotations

from dataclasses import dataclass
from pathlib import Path

from textual.content import Content
from textual.css.styles import RulesMap
from textual.strip import Strip
from textual.style import Style
from textual.visual import RenderOptions, Visual

SEPARATOR = " | "
"""Between two fields of a title line."""


@dataclass(frozen=True, slots=True)
class Field:
    """One part of a title line."""

    wordings: tuple[str, ...]
    """The field's text, longest first; a shorter wording stands in when the longer won't fit."""
    priority: int
    """Higher stays longer: when the line is too narrow, the lowest priority goes first."""


def word_prefixes(text: str) -> tuple[str, ...]:
    """``text``, then ever shorter runs of its leading whole words ending in "…" (longest
    first), so a long label can shrink without a word being cut."""
    words = text.split()
    return (text, *(" ".join(words[:n]) + "…" for n in range(len(words) - 1, 0, -1)))


def fit_fields(fields: list[Field], width: int, sep: str = SEPARATOR) -> str:
    """The fields joined by ``sep`` in order, as many and as long as fit ``width`` cells.

    The lowest-priority field first takes its shorter wordings, then goes; the highest-priority
    field always stays (in its shortest wording when even that is too wide, cut by the widget).
    """
    choice = {i: 0 for i in range(len(fields))}  # field index -> wording index shown

    def text() -> str:
        return sep.join(fields[i].wordings[w] for i, w in sorted(choice.items()))

    by_priority = sorted(choice, key=lambda i: fields[i].priority)
    for i in by_priority[:-1]:
        while len(text()) > width and choice[i] < len(fields[i].wordings) - 1:
            choice[i] += 1
        if len(text()) > width:
            del choice[i]
    last = by_priority[-1] if by_priority else None
    while (
        last is not None and len(text()) > width and choice[last] < len(fields[last].wordings) - 1
    ):
        choice[last] += 1
    return text()


class FittedLine(Visual):
    """A one-line visual that fits its fields to the width it is drawn at.

    ``str()`` gives the whole line (every field, longest wording), so tests and logs read it all.
    """

    def __init__(self, fields: list[Field], sep: str = SEPARATOR) -> None:
        self.fields = fields
        self.sep = sep

    def __str__(self) -> str:
        return self.sep.join(f.wordings[0] for f in self.fields)

    def render_strips(
        self, width: int, height: int | None, style: Style, options: RenderOptions
    ) -> list[Strip]:
        """The fitted text, drawn like plain content of the widget."""
        line = Content(fit_fields(self.fields, width, self.sep))
        return line.render_strips(width, height, style, options)

    def get_optimal_width(self, rules: RulesMap, container_width: int) -> int:
        """The whole line's width."""
        return len(str(self))

    def get_height(self, rules: RulesMap, width: int) -> int:
        """Always one line."""
        return 1


def title_text(
    *,
    dirty: bool,
    read_only: bool,
    label: str,
    draw_number: int,
    draw_count: int,
    draw_label: str,
    path: Path | None,
) -> FittedLine:
    """The title line of the case screen: save state, case label, draw, file.

    When narrow, the file name goes first, then the label shrinks to its leading words, then
    the draw label; the save state always stays.
    """
    where = path.name if path else "not saved yet"
    mark: tuple[str, ...] = ("* UNSAVED",) if dirty else ("saved",)
    if read_only:
        mark = ("READ-ONLY (open elsewhere)", "READ-ONLY")
    draw = f"draw {draw_number}/{draw_count}"
    return FittedLine(
        [
            Field(mark, 4),
            Field(word_prefixes(label), 2),
            Field((f"{draw}: {draw_label}", draw), 3),
            Field((where,), 1),
        ]
    )
