"""The F3 Case tab: the case's label, unit system, patient, notes and clinical context.

The pane edits the case it was handed in place and posts WorkingCopyEdited up, or
UnitSystemChanged so that the screen can show the new units in the draw form; a refused value
stays in its input with the reason beside it and never reaches the case.
"""

from __future__ import annotations

from typing import Any

from pydantic import ValidationError
from textual import on
from textual.app import ComposeResult
from textual.containers import VerticalScroll
from textual.widget import Widget
from textual.widgets import Input, Select, Static

from screens.case.messages import UnitSystemChanged, WorkingCopyEdited
from screens.case.pane_base import FormPane, entry_input, entry_select, meta_row
from screens.flags import FlagList
from workup.analytes import UnitSystem
from workup.model import Case, Patient, Sex


class CasePane(FormPane):
    """The form of everything about the case that is not one draw's."""

    FORM_ID = "case-form"

    def __init__(self, case: Case, *, late: bool = False) -> None:
        super().__init__("F3 Case", id="tab-case", late=late)
        self.case = case
        """The working copy the form edits (the screen's own object)."""

    # fmt: off
    def content(self) -> ComposeResult:
        """The case form, top to bottom in the order Tab moves through it."""
        c = self.case
        with VerticalScroll(id="case-form"):
            yield meta_row("case label", entry_input(c.label, "case-label", 120), "st-clabel")
            units = [("not set: write units", "none"), ("conventional (mg/dL)", "conventional"),
                     ("SI (mmol/L)", "si")]
            yield meta_row("unit system",
                           entry_select(units, c.units.value if c.units else "none",
                                        "case-units"),
                           "st-units")
            age = "" if c.patient.age is None else str(c.patient.age)
            yield meta_row("age (years)", entry_input(age, "case-age", 3), "st-age")
            sexes = [("not given", "none"), ("female", "female"), ("male", "male")]
            yield meta_row("sex",
                           entry_select(sexes, c.patient.sex.value if c.patient.sex else "none",
                                        "case-sex"), "st-sex")
            yield meta_row("weight (70 kg, 154 lb)",
                           entry_input(c.patient.weight or "", "case-weight", 20), "st-weight")
            height = "" if c.patient.height is None else f"{c.patient.height:g}"
            yield meta_row("height (cm; eGFR under 18)", entry_input(height, "case-height", 10),
                           "st-height")
            yield meta_row("case notes", entry_input(c.notes or "", "case-notes", 2000),
                           "st-cnotes")
            yield Static("Clinical context (Space or Enter toggles a flag)", classes="section")
            yield FlagList(list(c.context), id="case-context", compact=True)
    # fmt: on

    def focus_target(self) -> Widget | None:
        """The patient's age, the form's first value (the case label and units are above it)."""
        return self.query_one("#case-age")

    @on(Input.Changed, "#case-label")
    def _case_label_changed(self, event: Input.Changed) -> None:
        text = event.value.strip()
        if not text:
            self.show_problem("st-clabel", "x refused: a case needs a label")
            return
        self.show_problem("st-clabel", None)
        if text != self.case.label:
            self.case.label = text
            self.post_message(WorkingCopyEdited())

    @on(Input.Changed, "#case-notes")
    def _case_notes_changed(self, event: Input.Changed) -> None:
        notes = event.value.strip() or None
        if notes != self.case.notes:
            self.case.notes = notes
            self.post_message(WorkingCopyEdited(recompute=False))

    @on(Select.Changed, "#case-units")
    def _units_changed(self, event: Select.Changed) -> None:
        units = None if event.value in ("none", Select.NULL) else UnitSystem(event.value)
        if units != self.case.units:
            self.case.units = units
            self.post_message(UnitSystemChanged())

    def _patient_update(self, name: str, value: Any, state_id: str) -> None:
        data = self.case.patient.model_dump()
        data[name] = value
        try:
            patient = Patient.model_validate(data)
        except ValidationError as exc:
            self.show_problem(
                state_id, "x refused: " + exc.errors()[0]["msg"].removeprefix("Value error, ")
            )
            return
        self.show_problem(state_id, None)
        if patient != self.case.patient:
            self.case.patient = patient
            self.post_message(WorkingCopyEdited())

    @on(Input.Changed, "#case-age")
    def _age_changed(self, event: Input.Changed) -> None:
        text = event.value.strip()
        if text and not text.isdigit():
            self.show_problem("st-age", "x refused: whole years, e.g. 54")
            return
        self._patient_update("age", int(text) if text else None, "st-age")

    @on(Input.Changed, "#case-weight")
    def _weight_changed(self, event: Input.Changed) -> None:
        self._patient_update("weight", event.value.strip() or None, "st-weight")

    @on(Input.Changed, "#case-height")
    def _height_changed(self, event: Input.Changed) -> None:
        self._patient_update("height", event.value.strip() or None, "st-height")

    @on(Select.Changed, "#case-sex")
    def _sex_changed(self, event: Select.Changed) -> None:
        sex = None if event.value in ("none", Select.NULL) else Sex(event.value)
        self._patient_update("sex", sex, "st-sex")

    @on(FlagList.Toggled, "#case-context")
    def _context_changed(self, event: FlagList.Toggled) -> None:
        flags = event.flags
        if flags != list(self.case.context):
            self.case.context = flags
            self.post_message(WorkingCopyEdited())
