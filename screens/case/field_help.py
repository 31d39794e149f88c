"""The help line under the draw form: what the focused field reads, in which unit, and why a
value was refused. A pure function of the field and the core's reading; draw_pane.py shows it.
"""

from __future__ import annotations

from rich.text import Text

from screens.entry import FieldReading, ValueField, unit_choices

FORM_KEYS = "Tab/Enter: next field  Shift+Tab: back  Ctrl+N: new draw  F4: findings  F1: help"
"""The help line while no value field has the focus."""


def field_help(
    field: ValueField | None, reading: FieldReading, unit_note: str | None = None
) -> str | Text:
    """The help line for ``field`` (None: no value field focused) holding ``reading``.

    ``unit_note`` says where the row's unit came from; it is shown while the row is empty.
    """
    if field is None:
        return FORM_KEYS
    a = field.analyte
    choices = unit_choices(a)
    units = ", ".join(u or "no unit" for u in choices)
    out = Text()
    out.append(f"{a.name} ({field.panel.value.replace('_', ' ')})", style="bold")
    if len(choices) == 1:
        # One unit (or none, as for pH): nothing to choose, so it is said once.
        out.append(f" in {choices[0]}" if choices[0] else ", no unit")
    else:
        shown = field.unit if field.unit is not None else "no unit chosen"
        out.append(f" in {shown or 'no unit'}; units {units}")
    if len(unit_choices(a)) > 1 and not unit_note:
        out.append(" (Ctrl+T switches)")  # else said on the second line, keeping 80 columns
    if a.words:
        out.append("; grades: " + ", ".join(a.words))
    if reading.problem and field.unit is None and "ambiguous" in reading.problem:
        out.append(
            "\nx refused: no unit yet. Ctrl+T picks one, or set the case's unit system on F3.",
            style="bold",
        )
    elif reading.problem:
        out.append("\nx refused: " + reading.problem, style="bold")
    elif reading.caution:
        out.append("\n! " + reading.caution, style="bold")
    elif reading.measurement is not None:
        m = reading.measurement
        canon = f"{m.canonical:g} {a.canonical}".strip()
        out.append(f"\n+ read as {canon}")
    elif unit_note:
        out.append("\n" + unit_note)
    return out
