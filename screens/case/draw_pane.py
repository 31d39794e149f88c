"""The F2 Draw tab: the entry form of the shown draw in chart order, with its help line.

The screen hands the pane the case and says which draw to show (``show_draw``); the pane writes
accepted values into that draw in place, keeps refused text beside it (never in the case) and
posts WorkingCopyEdited or DrawChosen up. Reading a value is the core's job (screens/entry.py).
"""

from __future__ import annotations

from datetime import datetime

from textual import on
from textual.app import ComposeResult
from textual.containers import VerticalScroll
from textual.widget import Widget
from textual.widgets import Input, Select, Static

from screens.case.field_help import field_help
from screens.case.messages import DrawChosen, WorkingCopyEdited
from screens.case.pane_base import FormPane, entry_input, entry_select, meta_row
from screens.entry import (
    SECTIONS,
    FieldReading,
    ValueField,
    default_unit,
    read_field,
    shown_text,
    unit_choices,
)
from workup.analytes import Panel, analyte
from workup.model import Case, Draw, GasSample, LoadingTest
from workup.quantity import Measurement, convert

NO_TEST = "none"
"""The loading-test choice meaning the draw was not taken during a test."""


def same_measurement(a: Measurement | None, b: Measurement | None) -> bool:
    """True when ``a`` and ``b`` hold the same value, unit and word (or are both empty)."""
    if a is None or b is None:
        return a is b
    return (a.value, a.unit, a.word) == (b.value, b.unit, b.word)


def draw_options(draws: list[Draw]) -> list[tuple[str, int]]:
    """The draw list's entries: position, label, time taken and a loading-test mark."""
    out = []
    for i, x in enumerate(draws):
        text = f"{i + 1}. {x.label}"
        if x.taken is not None:
            text += f", {x.taken:%d %b %H:%M}"
        if x.during is not None:
            text += ", loading"
        out.append((text, i))
    return out


TAKEN_REFUSED = "x refused: not a date and time; write e.g. 2026-11-30T08:15"
TAKEN_MARK = "x refused: not a date/time"
"""The mark beside the field: short enough to show whole at 80 columns (F1 adds the example)."""
"""The state line of a draw time that does not read as an ISO date and time."""


class DrawPane(FormPane):
    """The draw's label, time, loading test and gas sample, then one row per analyte."""

    FORM_ID = "entry"

    def __init__(self, case: Case, index: int, *, late: bool = False) -> None:
        super().__init__("F2 Draw", id="tab-draw", late=late)
        self.case = case
        """The working copy whose draws the form edits (the screen's own object)."""
        self.index = index
        """The position of the draw shown (set by ``show_draw``)."""
        self.pending: dict[tuple[int, Panel, str], str] = {}
        """Refused text by (draw index, panel, key): shown again, never saved silently."""
        self.pending_taken: dict[int, str] = {}
        """Refused text of each draw's time, by draw index: listed at save like the values."""
        self.readings: dict[tuple[Panel, str], FieldReading] = {}
        """The core's reading of each field of the shown draw."""
        self.fields: dict[tuple[Panel, str], ValueField] = {}
        """The value rows by (panel, key)."""
        self.units_origin = "the case's unit system, F3"
        """Where the case's unit system came from, said on the help line of an empty row."""
        self.focused_field: ValueField | None = None
        """The value row holding the focus (None: the focus is elsewhere on the screen)."""

    @property
    def draw(self) -> Draw:
        """The draw shown."""
        return self.case.draws[self.index]

    # fmt: off
    def content(self) -> ComposeResult:
        """The draw form, top to bottom in the order Tab moves through it, then the help line."""
        d = self.draw
        taken = d.taken.isoformat(timespec="minutes") if d.taken else ""
        tests = [("no loading test", NO_TEST)] + [
            (t.value.replace("_", " "), t.value) for t in LoadingTest
        ]
        with VerticalScroll(id="entry"):
            yield meta_row("draw",
                           entry_select(draw_options(self.case.draws), self.index, "draw-select"),
                           "draw-count")
            yield meta_row("draw label", entry_input(d.label, "meta-label", 80), "st-label")
            yield meta_row("taken (YYYY-MM-DDTHH:MM)", entry_input(taken, "meta-taken", 30),
                           "st-taken")
            yield meta_row("during loading test",
                           entry_select(tests, d.during.value if d.during else NO_TEST,
                                        "meta-during"), "st-during")
            for title, fields in SECTIONS:
                yield Static(title, classes="section")
                for panel, key in fields:
                    field = ValueField(panel, key)
                    self.fields[(panel, key)] = field
                    yield field
                if title == "Blood gas":
                    # After the gas values, so typing value after value never lands in it.
                    yield meta_row("gas sample",
                                   entry_select([(s.value, s.value) for s in GasSample],
                                                d.blood_gas.sample.value, "meta-sample"),
                                   "st-sample")
            yield Static("Draw notes", classes="section")
            yield meta_row("notes", entry_input(d.notes or "", "meta-notes", 500), "st-notes")
        yield Static("", id="field-help")
    # fmt: on

    # ----------------------------------------------------------------- shown by the screen

    def after_build(self) -> None:
        """Fill the form, built late, with the draw shown."""
        super().after_build()
        self.show_draw(self.index)

    def show_draw(self, index: int) -> None:
        """Fill the form from draw ``index`` (and the refused text kept for it)."""
        self.index = index
        if not self.built:
            return  # filled when built
        d = self.draw
        self._refresh_draw_options()
        self.query_one("#draw-count", Static).update(
            f"{self.index + 1} of {len(self.case.draws)}  (Ctrl+PgUp/PgDn)"
        )
        self.problems.clear()
        self.set_input("#meta-label", d.label)
        taken = self.pending_taken.get(self.index)
        shown_taken = d.taken.isoformat(timespec="minutes") if d.taken else ""
        self.set_input("#meta-taken", shown_taken if taken is None else taken)
        self.set_select("#meta-during", d.during.value if d.during else NO_TEST)
        self.set_select("#meta-sample", d.blood_gas.sample.value)
        self.set_input("#meta-notes", d.notes or "")
        self.show_problem("st-label", None)
        self.show_problem("st-taken", None if taken is None else TAKEN_MARK)
        for (panel, key), field in self.fields.items():
            m = getattr(d.panel(panel), key)
            if m is not None:
                unit, text = m.unit, shown_text(m)
            else:
                unit = self._unit_for(field)
                text = self.pending.get((self.index, panel, key), "")
            field.show_unit(unit)
            if field.input.value != text:
                with self.quiet():
                    field.input.value = text
            reading = read_field(field.analyte, text, unit, self.case.units)
            self.readings[(panel, key)] = reading
            field.show_reading(reading)
        self.update_help()

    def focus_target(self) -> Widget | None:
        """The value row last focused, else the first one."""
        return (
            self.focused_field.input if self.focused_field else self.query_one("#in-serum-sodium")
        )

    def follow_focus(self, widget: Widget) -> None:
        """Note which value row (if any) holds ``widget``, just focused, and explain it."""
        self.focused_field = next((a for a in widget.ancestors if isinstance(a, ValueField)), None)
        self.update_help()

    def follow_units(self) -> bool:
        """Show the case's new unit system in the empty ambiguous rows; True if a value changed."""
        changed = False
        for (panel, key), field in self.fields.items():
            if getattr(self.draw.panel(panel), key) is None and field.analyte.ambiguous:
                field.show_unit(default_unit(field.analyte, self.case.units))
                changed = self.apply_field(field, field.input.value) or changed
        return changed

    def next_unit(self) -> bool:
        """Switch the focused row to its next unit, converting a value already read.

        True when the draw changed; a row that has one unit (or none focused) is explained.
        """
        field = self.focused_field
        if field is None or field.analyte.words:
            self.notify("Move to a value field to switch its unit.", severity="warning")
            return False
        choices = unit_choices(field.analyte)
        if len(choices) < 2:
            self.notify(f"{field.analyte.name} has one unit only.")
            return False
        i = choices.index(field.unit) + 1 if field.unit in choices else 0
        new = choices[i % len(choices)]
        m = getattr(self.draw.panel(field.panel), field.key)
        field.show_unit(new)
        if m is None:
            return self.apply_field(field, field.input.value)
        value = convert(field.analyte, m.canonical, new)
        # Four significant figures keep the quantity (to 0.05%) without false precision.
        text = f"{value:.0f}" if abs(value) >= 1000 else f"{value:.4g}"
        with self.quiet():
            field.input.value = text
        return self.apply_field(field, text)

    # ----------------------------------------------------------------- refused text

    def refused_summary(self) -> list[str]:
        """Rows holding refused text, in words, over every draw."""
        values = [
            f"{self.case.draws[i].label}: {analyte(panel, key).name} {text!r}"
            for (i, panel, key), text in self.pending.items()
        ]
        times = [
            f"{self.case.draws[i].label}: taken {text!r} (not a date and time)"
            for i, text in sorted(self.pending_taken.items())
        ]
        return values + times

    def refused_reasons(self) -> list[str]:
        """The refused rows of the shown draw, each with the core's reason (for F1 help)."""
        out = [
            f"{analyte(panel, key).name}: {reading.problem}"
            for (panel, key), reading in self.readings.items()
            if reading.problem
        ]
        if self.index in self.pending_taken:
            out.append(
                f"taken {self.pending_taken[self.index]!r}: {TAKEN_REFUSED.removeprefix('x refused: ')}"
            )
        return out

    def forget_draw(self, gone: int) -> None:
        """Drop the refused text of draw ``gone``, just deleted; later draws move up one."""
        self.pending = {
            (i if i < gone else i - 1, p, k): t
            for (i, p, k), t in self.pending.items()
            if i != gone
        }
        self.pending_taken = {
            i if i < gone else i - 1: t for i, t in self.pending_taken.items() if i != gone
        }

    # ----------------------------------------------------------------- editing

    def apply_field(self, field: ValueField, text: str) -> bool:
        """Read ``text`` into ``field``'s value of the shown draw; True when the draw changed."""
        reading = read_field(field.analyte, text, field.unit, self.case.units)
        key = (self.index, field.panel, field.key)
        if reading.problem:
            self.pending[key] = text
        else:
            self.pending.pop(key, None)
        m = reading.measurement
        if m is not None and m.unit != field.unit and not m.word:
            field.show_unit(m.unit)
        self.readings[(field.panel, field.key)] = reading
        field.show_reading(reading)
        panel = self.draw.panel(field.panel)
        changed = not same_measurement(getattr(panel, field.key), m)
        if changed:
            setattr(panel, field.key, m)
        if field is self.focused_field:
            self.update_help()
        return changed

    @on(Input.Changed, ".field-input")
    def _value_changed(self, event: Input.Changed) -> None:
        if event.value != event.input.value:
            return  # superseded by a later value of the same input
        field = next(a for a in event.input.ancestors if isinstance(a, ValueField))
        if self.apply_field(field, event.value):
            self.post_message(WorkingCopyEdited())

    @on(Input.Changed, "#meta-label")
    def _label_changed(self, event: Input.Changed) -> None:
        text = event.value.strip()
        others = {d.label for i, d in enumerate(self.case.draws) if i != self.index}
        problem = None
        if not text:
            problem = "x refused: a draw needs a label"
        elif text in others:
            problem = "x refused: another draw has this label"
        elif text != self.draw.label:
            self.draw.label = text
            self._refresh_draw_options()
            self.post_message(WorkingCopyEdited())
        self.show_problem("st-label", problem)

    @on(Input.Changed, "#meta-taken")
    def _taken_changed(self, event: Input.Changed) -> None:
        text = event.value.strip()
        problem = None
        try:
            taken = datetime.fromisoformat(text) if text else None
        except ValueError:
            taken, problem = self.draw.taken, TAKEN_MARK
        # The refused text is kept so that saving lists it instead of dropping it unseen.
        if problem is None:
            self.pending_taken.pop(self.index, None)
        else:
            self.pending_taken[self.index] = text
        if problem is None and taken != self.draw.taken:
            self.draw.taken = taken
            self._refresh_draw_options()
            self.post_message(WorkingCopyEdited())
        self.show_problem("st-taken", problem)

    @on(Input.Changed, "#meta-notes")
    def _draw_notes_changed(self, event: Input.Changed) -> None:
        notes = event.value.strip() or None
        if notes != self.draw.notes:
            self.draw.notes = notes
            self.post_message(WorkingCopyEdited(recompute=False))

    @on(Select.Changed, "#meta-during")
    def _during_changed(self, event: Select.Changed) -> None:
        during = None if event.value in (NO_TEST, Select.NULL) else LoadingTest(event.value)
        if during != self.draw.during:
            self.draw.during = during
            self._refresh_draw_options()
            self.post_message(WorkingCopyEdited())

    @on(Select.Changed, "#meta-sample")
    def _sample_changed(self, event: Select.Changed) -> None:
        if event.value is Select.NULL:
            return
        sample = GasSample(event.value)
        if sample != self.draw.blood_gas.sample:
            self.draw.blood_gas.sample = sample
            self.post_message(WorkingCopyEdited())

    @on(Select.Changed, "#draw-select")
    def _draw_chosen(self, event: Select.Changed) -> None:
        if isinstance(event.value, int) and event.value != self.index:
            self.post_message(DrawChosen(event.value))

    # ----------------------------------------------------------------- helpers

    def _unit_for(self, field: ValueField) -> str | None:
        # Keep a unit the fellow chose for this analyte; otherwise the case default.
        if field.unit is not None and field.unit in unit_choices(field.analyte):
            return field.unit
        return default_unit(field.analyte, self.case.units)

    def _refresh_draw_options(self) -> None:
        if not self.built:
            return
        select = self.query_one("#draw-select", Select)
        with self.quiet():
            select.set_options(draw_options(self.case.draws))
            select.value = self.index

    def update_help(self) -> None:
        """Explain the focused value row (or the form's keys) on the help line."""
        if not self.built:
            return
        field = self.focused_field
        reading = (
            self.readings.get((field.panel, field.key), FieldReading(None))
            if field is not None
            else FieldReading(None)
        )
        units = None
        if field is not None and field.analyte.ambiguous and self.case.units is not None:
            units = f"units: {self.case.units.value} ({self.units_origin}; Ctrl+T switches)"
        self.query_one("#field-help", Static).update(field_help(field, reading, units))
