"""The case workspace: enter a draw in chart order, and read its findings, causes and diagram.

The screen keeps a working copy of the case. Every accepted change goes into that copy and the
assessment is recomputed from it at once (``workup.assess.assess`` is fast); a refused value is
kept as text beside the field, never in the case, and is reported before saving.

The case is open through a :class:`workup.session.CaseSession` (see screens/persistence.py): the
working copy is journaled to a draft every few seconds when it changed and on every draw change,
so a crash or a dropped line loses at most the last few seconds; a save that would overwrite a
file changed on disk shows the differences and asks first.
"""

from __future__ import annotations

from collections.abc import Callable
from datetime import datetime
from pathlib import Path
from typing import TYPE_CHECKING, Any

from pydantic import ValidationError
from rich.text import Text
from textual import on
from textual.app import ComposeResult
from textual.containers import Horizontal, VerticalScroll
from textual.screen import Screen
from textual.timer import Timer
from textual.widgets import (
    Footer,
    Input,
    Select,
    Static,
    TabbedContent,
    TabPane,
)

from screens import persistence
from screens.case import keys
from screens.case.keys import TABS
from screens.davenport import DavenportView
from screens.dialogs import AskScreen, ChoiceScreen, ConflictScreen
from screens.entry import (
    SECTIONS,
    EntryInput,
    EntrySelect,
    FieldReading,
    ValueField,
    default_unit,
    read_field,
    shown_text,
    unit_choices,
)
from screens.findings_view import CausesView, FindingsView
from screens.flags import FlagList
from workup.analytes import Panel, UnitSystem
from workup.assess import Assessment, assess
from workup.cautions import CAUTION_LINES, CAUTION_SHORT
from workup.model import Case, Draw, GasSample, LoadingTest, Patient, Sex
from workup.quantity import Measurement, convert

if TYPE_CHECKING:
    from workup import diagram

__all__ = ["JOURNAL_SECONDS", "NO_TEST", "TABS", "CaseScreen"]

NO_TEST = "none"

JOURNAL_SECONDS = 3.0
"""How often unsaved edits are written to the draft (only when something changed since)."""


def _same(a: Measurement | None, b: Measurement | None) -> bool:
    if a is None or b is None:
        return a is b
    return (a.value, a.unit, a.word) == (b.value, b.unit, b.word)


def _input(value: str, id_: str, max_length: int) -> Input:
    return EntryInput(value, id=id_, compact=True, max_length=max_length, validate_on=[])


def _select(options: list[tuple[str, Any]], value: Any, id_: str) -> Select:
    return EntrySelect(options, value=value, id=id_, allow_blank=False, compact=True)


def _meta(name: str, widget: Any, state_id: str) -> Horizontal:
    return Horizontal(
        Static(name, classes="field-name"),
        widget,
        Static("", id=state_id, classes="meta-state"),
        classes="field-row meta-row",
    )


class CaseScreen(Screen[None]):
    """One case: draws to enter, findings to read, notes to draft."""

    BINDINGS = keys.BINDINGS

    def __init__(
        self,
        case: Case,
        path: Path | None,
        cases_dir: Path,
        clock: Callable[[], datetime],
        overrides: dict[str, float] | None = None,
        dirty: bool = False,
        start_tab: str = "tab-draw",
        session: persistence.CaseSession | None = None,
    ) -> None:
        super().__init__()
        self.case = case
        self.path = path
        self.session = session
        """The open case file (lock, draft, conflict-checked save); None until a new case's
        first edit is journaled."""
        self.changed_since_journal = False
        """Edits made since the last journal write (the timer writes only when True)."""
        self.journal_problem: str | None = None
        self._left_cleanly = False
        self.journal_timer: Timer | None = None
        """Writes the draft every JOURNAL_SECONDS while something changed (None read-only)."""
        self.cases_dir = cases_dir
        self.clock = clock
        self.overrides = overrides or {}
        self.dirty = dirty
        self.start_tab = start_tab
        if not self.case.draws:
            self.case.draws.append(self._fresh_draw())
        self.index = len(case.draws) - 1
        self.assessment: Assessment | None = None
        self.error: str | None = None
        # Refused text by (draw index, panel, key): shown again, never saved silently.
        self.pending: dict[tuple[int, Panel, str], str] = {}
        self.readings: dict[tuple[Panel, str], FieldReading] = {}
        self.meta_problems: dict[str, str] = {}
        self._fields: dict[tuple[Panel, str], ValueField] = {}
        self._focused: ValueField | None = None

    # ----------------------------------------------------------------- layout

    # fmt: off
    def compose(self) -> ComposeResult:
        c, d = self.case, self.draw
        taken = d.taken.isoformat(timespec="minutes") if d.taken else ""
        tests = [("no loading test", NO_TEST)] + [
            (t.value.replace("_", " "), t.value) for t in LoadingTest
        ]
        yield Static("", id="titlebar")
        with TabbedContent(id="tabs", initial=self.start_tab):
            with TabPane("F2 Draw", id="tab-draw"):
                with VerticalScroll(id="entry"):
                    yield _meta("draw", _select(self._draw_options(), self.index, "draw-select"),
                                "draw-count")
                    yield _meta("draw label", _input(d.label, "meta-label", 80), "st-label")
                    yield _meta("taken (YYYY-MM-DDTHH:MM)", _input(taken, "meta-taken", 30),
                                "st-taken")
                    yield _meta("during loading test",
                                _select(tests, d.during.value if d.during else NO_TEST,
                                        "meta-during"), "st-during")
                    for title, fields in SECTIONS:
                        yield Static(title, classes="section")
                        if title == "Blood gas":
                            yield _meta("gas sample",
                                        _select([(s.value, s.value) for s in GasSample],
                                                d.blood_gas.sample.value, "meta-sample"),
                                        "st-sample")
                        for panel, key in fields:
                            field = ValueField(panel, key)
                            self._fields[(panel, key)] = field
                            yield field
                    yield Static("Draw notes", classes="section")
                    yield _meta("notes", _input(d.notes or "", "meta-notes", 500), "st-notes")
                yield Static("", id="field-help")
            with TabPane("F3 Case", id="tab-case"), VerticalScroll(id="case-form"):
                yield _meta("case label", _input(c.label, "case-label", 120), "st-clabel")
                units = [("not set: write units", "none"), ("conventional (mg/dL)", "conventional"),
                         ("SI (mmol/L)", "si")]
                yield _meta("unit system",
                            _select(units, c.units.value if c.units else "none", "case-units"),
                            "st-units")
                age = "" if c.patient.age is None else str(c.patient.age)
                yield _meta("age (years)", _input(age, "case-age", 3), "st-age")
                sexes = [("not given", "none"), ("female", "female"), ("male", "male")]
                yield _meta("sex",
                            _select(sexes, c.patient.sex.value if c.patient.sex else "none",
                                    "case-sex"), "st-sex")
                yield _meta("weight (70 kg, 154 lb)",
                            _input(c.patient.weight or "", "case-weight", 20), "st-weight")
                yield _meta("case notes", _input(c.notes or "", "case-notes", 2000), "st-cnotes")
                yield Static("Clinical context (Space or Enter toggles a flag)",
                             classes="section")
                yield FlagList(list(c.context), id="case-context", compact=True)
            with TabPane("F4 Findings", id="tab-findings"):
                yield FindingsView(id="findings")
            with TabPane("F5 Causes", id="tab-causes"):
                yield CausesView(id="causes")
            with TabPane("F6 Diagram", id="tab-diagram"):
                yield DavenportView(id="davenport")
        yield Static("", id="caution-line")
        yield Footer()
    # fmt: on

    def on_mount(self) -> None:
        # Long texts read from their start, not scrolled to the cursor at their end.
        for w in self.query(".meta-row Input").results(Input):
            w.cursor_position = 0
        self._load_draw()
        self._recompute()
        if self.read_only:
            # A read-only session does not journal, so nothing may be edited in it.
            for sel in ("#entry", "#case-form"):
                self.query_one(sel).disabled = True
            if self.start_tab in ("tab-draw", "tab-case"):
                self.start_tab = "tab-findings"
        else:
            self.journal_timer = self.set_interval(JOURNAL_SECONDS, self.journal_tick)
            if self.dirty and self.session is not None:
                self.journal_now()  # restored edits: make sure this session's draft holds them
        self.action_tab(self.start_tab)

    def on_unmount(self) -> None:
        # Leaving without the fellow choosing to save or discard (the app shut down around
        # unsaved edits) is not a clean close: the lock goes, the draft stays.
        self.end_session(clean=self._left_cleanly or not self.dirty)

    # ----------------------------------------------------------------- session

    @property
    def read_only(self) -> bool:
        """True when the case was opened while another session held it."""
        return self.session is not None and self.session.read_only

    def end_session(self, clean: bool) -> None:
        """Release the case's lock; a clean close also deletes the draft."""
        if self.session is not None:
            self.session.close(keep_draft=not clean)

    def journal_tick(self) -> None:
        """Timer: write the draft when something changed since the last write."""
        if self.changed_since_journal:
            self.journal_now()

    def journal_now(self) -> bool:
        """Write the working copy to the draft now (if it differs); True when written."""
        if self.read_only:
            return False
        self.changed_since_journal = False
        # The session keeps the version it was given, and the screen edits self.case in
        # place: hand it a copy, or later edits would look already journaled.
        snapshot = self.case.model_copy(deep=True)
        try:
            if self.session is None:
                if not self.dirty:
                    return False
                self.session = persistence.new_session(self.cases_dir, self.case.label, snapshot)
            written = self.session.journal(snapshot)
        except (OSError, persistence.CaseLockedError) as exc:
            if self.journal_problem is None:
                self.notify(
                    f"Unsaved edits could not be written to the draft: {exc}. Save soon.",
                    title="Draft not written",
                    severity="error",
                    timeout=15,
                )
            self.journal_problem = str(exc)
            self.changed_since_journal = True
            return False
        self.journal_problem = None
        return written

    # ----------------------------------------------------------------- state

    @property
    def draw(self) -> Draw:
        """The draw being entered."""
        return self.case.draws[self.index]

    def _draw_options(self) -> list[tuple[str, int]]:
        out = []
        for i, x in enumerate(self.case.draws):
            text = f"{i + 1}. {x.label}"
            if x.taken is not None:
                text += f", {x.taken:%d %b %H:%M}"
            if x.during is not None:
                text += ", loading"
            out.append((text, i))
        return out

    def _fresh_draw(self) -> Draw:
        labels = {d.label for d in self.case.draws}
        n = len(self.case.draws) + 1
        while f"draw {n}" in labels:
            n += 1
        taken = self.clock().replace(second=0, microsecond=0)
        return Draw(label=f"draw {n}", taken=taken)

    def _mark_dirty(self) -> None:
        self.dirty = True
        self.changed_since_journal = True
        self._update_title()

    def _update_title(self) -> None:
        where = self.path.name if self.path else "not saved yet"
        mark = "* UNSAVED" if self.dirty else "saved"
        if self.read_only:
            mark = "READ-ONLY (open elsewhere)"
        self.query_one("#titlebar", Static).update(
            f"{mark} | {self.case.label} | draw {self.index + 1}/{len(self.case.draws)}: "
            f"{self.draw.label} | {where}"
        )

    def _system(self) -> UnitSystem | None:
        return self.case.units

    def _quiet(self):
        # Values the screen sets itself must not come back as edits: a late Changed message
        # would otherwise be applied to whichever draw is showing when it arrives.
        return self.prevent(Input.Changed, Select.Changed, FlagList.Toggled)

    def _set_input(self, selector: str, text: str) -> None:
        w = self.query_one(selector, Input)
        if w.value != text:
            with self._quiet():
                w.value = text

    def _set_select(self, selector: str, value: str) -> None:
        w = self.query_one(selector, Select)
        if w.value != value:
            with self._quiet():
                w.value = value

    def _load_draw(self) -> None:
        """Fill the form from the current draw (and the refused text kept for it)."""
        d = self.draw
        select = self.query_one("#draw-select", Select)
        with self._quiet():
            select.set_options(self._draw_options())
            select.value = self.index
        self.query_one("#draw-count", Static).update(
            f"{self.index + 1} of {len(self.case.draws)}  (Ctrl+PgUp/PgDn)"
        )
        self.meta_problems.clear()
        self._set_input("#meta-label", d.label)
        self._set_input("#meta-taken", d.taken.isoformat(timespec="minutes") if d.taken else "")
        self._set_select("#meta-during", d.during.value if d.during else NO_TEST)
        self._set_select("#meta-sample", d.blood_gas.sample.value)
        self._set_input("#meta-notes", d.notes or "")
        for st in ("st-label", "st-taken"):
            self.query_one(f"#{st}", Static).update("")
        for (panel, key), field in self._fields.items():
            m = getattr(d.panel(panel), key)
            if m is not None:
                unit, text = m.unit, shown_text(m)
            else:
                unit = self._unit_for(field)
                text = self.pending.get((self.index, panel, key), "")
            field.show_unit(unit)
            if field.input.value != text:
                with self._quiet():
                    field.input.value = text
            reading = read_field(field.analyte, text, unit, self._system())
            self.readings[(panel, key)] = reading
            field.show_reading(reading)
        self._update_title()
        self._update_help()

    def _unit_for(self, field: ValueField) -> str | None:
        # Keep a unit the fellow chose for this analyte; otherwise the case default.
        if field.unit is not None and field.unit in unit_choices(field.analyte):
            return field.unit
        return default_unit(field.analyte, self._system())

    # ----------------------------------------------------------------- editing

    @on(Input.Changed, ".field-input")
    def _value_changed(self, event: Input.Changed) -> None:
        if event.value != event.input.value:
            return  # superseded by a later value of the same input
        field = next(a for a in event.input.ancestors if isinstance(a, ValueField))
        self._apply_field(field, event.value)

    def _apply_field(self, field: ValueField, text: str) -> None:
        reading = read_field(field.analyte, text, field.unit, self._system())
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
        if not _same(getattr(panel, field.key), m):
            setattr(panel, field.key, m)
            self._mark_dirty()
            self._recompute()
        if field is self._focused:
            self._update_help()

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
            self._mark_dirty()
            self._recompute()
        self._meta_state("st-label", problem)

    @on(Input.Changed, "#meta-taken")
    def _taken_changed(self, event: Input.Changed) -> None:
        text = event.value.strip()
        problem = None
        try:
            taken = datetime.fromisoformat(text) if text else None
        except ValueError:
            taken, problem = self.draw.taken, "x refused: write e.g. 2026-11-30T08:15"
        if problem is None and taken != self.draw.taken:
            self.draw.taken = taken
            self._refresh_draw_options()
            self._mark_dirty()
            self._recompute()
        self._meta_state("st-taken", problem)

    @on(Input.Changed, "#meta-notes")
    def _draw_notes_changed(self, event: Input.Changed) -> None:
        notes = event.value.strip() or None
        if notes != self.draw.notes:
            self.draw.notes = notes
            self._mark_dirty()

    @on(Select.Changed, "#meta-during")
    def _during_changed(self, event: Select.Changed) -> None:
        during = None if event.value in (NO_TEST, Select.NULL) else LoadingTest(event.value)
        if during != self.draw.during:
            self.draw.during = during
            self._refresh_draw_options()
            self._mark_dirty()
            self._recompute()

    @on(Select.Changed, "#meta-sample")
    def _sample_changed(self, event: Select.Changed) -> None:
        if event.value is Select.NULL:
            return
        sample = GasSample(event.value)
        if sample != self.draw.blood_gas.sample:
            self.draw.blood_gas.sample = sample
            self._mark_dirty()
            self._recompute()

    @on(Select.Changed, "#draw-select")
    def _draw_chosen(self, event: Select.Changed) -> None:
        if isinstance(event.value, int) and event.value != self.index:
            self.switch_draw(event.value)

    @on(Input.Changed, "#case-label")
    def _case_label_changed(self, event: Input.Changed) -> None:
        text = event.value.strip()
        if not text:
            self._meta_state("st-clabel", "x refused: a case needs a label")
            return
        self._meta_state("st-clabel", None)
        if text != self.case.label:
            self.case.label = text
            self._mark_dirty()
            self._recompute()

    @on(Input.Changed, "#case-notes")
    def _case_notes_changed(self, event: Input.Changed) -> None:
        notes = event.value.strip() or None
        if notes != self.case.notes:
            self.case.notes = notes
            self._mark_dirty()

    @on(Select.Changed, "#case-units")
    def _units_changed(self, event: Select.Changed) -> None:
        units = None if event.value in ("none", Select.NULL) else UnitSystem(event.value)
        if units == self.case.units:
            return
        self.case.units = units
        self._mark_dirty()
        for (panel, key), field in self._fields.items():
            if getattr(self.draw.panel(panel), key) is None and field.analyte.ambiguous:
                field.show_unit(default_unit(field.analyte, units))
                self._apply_field(field, field.input.value)
        self._recompute()

    def _patient_update(self, name: str, value: Any, state_id: str) -> None:
        data = self.case.patient.model_dump()
        data[name] = value
        try:
            patient = Patient.model_validate(data)
        except ValidationError as exc:
            self._meta_state(
                state_id, "x refused: " + exc.errors()[0]["msg"].removeprefix("Value error, ")
            )
            return
        self._meta_state(state_id, None)
        if patient != self.case.patient:
            self.case.patient = patient
            self._mark_dirty()
            self._recompute()

    @on(Input.Changed, "#case-age")
    def _age_changed(self, event: Input.Changed) -> None:
        text = event.value.strip()
        if text and not text.isdigit():
            self._meta_state("st-age", "x refused: whole years, e.g. 54")
            return
        self._patient_update("age", int(text) if text else None, "st-age")

    @on(Input.Changed, "#case-weight")
    def _weight_changed(self, event: Input.Changed) -> None:
        self._patient_update("weight", event.value.strip() or None, "st-weight")

    @on(Select.Changed, "#case-sex")
    def _sex_changed(self, event: Select.Changed) -> None:
        sex = None if event.value in ("none", Select.NULL) else Sex(event.value)
        self._patient_update("sex", sex, "st-sex")

    @on(FlagList.Toggled, "#case-context")
    def _context_changed(self, event: FlagList.Toggled) -> None:
        flags = event.flags
        if flags != list(self.case.context):
            self.case.context = flags
            self._mark_dirty()
            self._recompute()

    def _meta_state(self, state_id: str, problem: str | None) -> None:
        if problem:
            self.meta_problems[state_id] = problem
        else:
            self.meta_problems.pop(state_id, None)
        self.query_one(f"#{state_id}", Static).update(problem or "")

    def _refresh_draw_options(self) -> None:
        select = self.query_one("#draw-select", Select)
        with self._quiet():
            select.set_options(self._draw_options())
            select.value = self.index
        self._update_title()

    # ----------------------------------------------------------------- focus and help line

    def on_descendant_focus(self, event) -> None:
        widget = event.widget
        field = next((a for a in widget.ancestors if isinstance(a, ValueField)), None)
        self._focused = field
        self._update_help()

    def _update_help(self) -> None:
        help_line = self.query_one("#field-help", Static)
        field = self._focused
        if field is None:
            help_line.update(
                "Tab/Enter: next field  Shift+Tab: back  Ctrl+N: new draw  F4: findings  F1: help"
            )
            return
        reading = self.readings.get((field.panel, field.key), FieldReading(None))
        a = field.analyte
        units = ", ".join(u or "no unit" for u in unit_choices(a))
        out = Text()
        out.append(f"{a.name} ({field.panel.value.replace('_', ' ')})", style="bold")
        shown = field.unit if field.unit is not None else "no unit chosen"
        out.append(f" in {shown or 'no unit'}; units {units}")
        if len(unit_choices(a)) > 1:
            out.append(" (Ctrl+T switches)")
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
        help_line.update(out)

    # ----------------------------------------------------------------- assessment

    def _recompute(self) -> None:
        try:
            self.assessment = assess(self.case, self.draw.label, self.overrides)
            self.error = None
        except Exception as exc:  # a half-built core must not take the app down
            self.assessment = None
            self.error = f"The assessment could not be computed: {type(exc).__name__}: {exc}"
        a = self.assessment
        self.query_one(FindingsView).show(a, self.error)
        self.query_one(CausesView).show(a, self.error)
        self._update_diagram()
        self._update_cautions()
        self._update_title()

    def _point(self, d: Draw) -> tuple[diagram.Point | None, str]:
        from workup import diagram

        return diagram.point_for(
            d.blood_gas.canonical("ph"),
            d.blood_gas.canonical("bicarbonate"),
            d.serum.canonical("bicarbonate"),
            d.blood_gas.canonical("pco2"),
            d.label,
        )

    @on(TabbedContent.TabActivated)
    def _tab_shown(self, event: TabbedContent.TabActivated) -> None:
        if event.pane.id == "tab-diagram":
            self._update_diagram()

    def _update_diagram(self) -> None:
        # Drawn only while visible: the geometry needs numpy, which start-up should not wait for.
        if self.query_one(TabbedContent).active != "tab-diagram":
            return
        point, source = self._point(self.draw)
        others = tuple(
            p
            for i, d in enumerate(self.case.draws)
            if i != self.index and (p := self._point(d)[0]) is not None
        )
        check = self.assessment.indices.get("henderson_hasselbalch_ph") if self.assessment else None
        self.query_one(DavenportView).show(point, source, others, check)

    def specific_cautions(self) -> list[str]:
        """The cautions of this case and draw (without the standing ones)."""
        if self.assessment is None:
            return [self.error] if self.error else []
        return [c for c in self.assessment.cautions if c not in CAUTION_LINES]

    def _update_cautions(self) -> None:
        own = self.specific_cautions()
        line = self.query_one("#caution-line", Static)
        if own:
            line.update(f"! {len(own)} caution(s), F1 lists all: {own[0]}")
        else:
            line.update(f"! {CAUTION_SHORT} (F1)")

    # ----------------------------------------------------------------- actions

    def action_tab(self, tab_id: str) -> None:
        """Show one tab."""
        self.query_one(TabbedContent).active = tab_id
        if tab_id == "tab-findings":
            self.query_one("#indices").focus()
        elif tab_id == "tab-causes":
            self.query_one(CausesView).focus()
        elif tab_id == "tab-draw":
            (self._focused.input if self._focused else self.query_one("#in-serum-sodium")).focus()
        elif tab_id == "tab-case":
            self.query_one("#case-label").focus()
        else:
            self.query_one(TabbedContent).query_one("Tabs").focus()

    def action_next_unit(self) -> None:
        """Switch the focused field to its next unit, converting a value already read."""
        if self._refuse_if_read_only():
            return
        field = self._focused
        if field is None or field.analyte.words:
            self.notify("Move to a value field to switch its unit.", severity="warning")
            return
        choices = unit_choices(field.analyte)
        if len(choices) < 2:
            self.notify(f"{field.analyte.name} has one unit only.")
            return
        i = choices.index(field.unit) + 1 if field.unit in choices else 0
        new = choices[i % len(choices)]
        m = getattr(self.draw.panel(field.panel), field.key)
        field.show_unit(new)
        if m is not None:
            value = convert(field.analyte, m.canonical, new)
            # Four significant figures keep the quantity (to 0.05%) without false precision.
            text = f"{value:.0f}" if abs(value) >= 1000 else f"{value:.4g}"
            with self._quiet():
                field.input.value = text
            self._apply_field(field, text)
        else:
            self._apply_field(field, field.input.value)

    def switch_draw(self, index: int) -> None:
        """Show draw ``index`` in the form and the findings."""
        self.index = max(0, min(index, len(self.case.draws) - 1))
        self._load_draw()
        self._recompute()
        if self.changed_since_journal:
            self.journal_now()  # a draw added, copied, deleted or left: journal at once

    def action_previous_draw(self) -> None:
        """Show the draw before this one."""
        if self.index > 0:
            self.switch_draw(self.index - 1)

    def action_next_draw(self) -> None:
        """Show the draw after this one."""
        if self.index < len(self.case.draws) - 1:
            self.switch_draw(self.index + 1)

    def action_new_draw(self) -> None:
        """Add an empty draw, time-stamped now, and show it."""
        if self._refuse_if_read_only():
            return
        self.case.draws.append(self._fresh_draw())
        self._mark_dirty()
        self.switch_draw(len(self.case.draws) - 1)
        self.action_tab("tab-draw")
        self.query_one("#meta-label", Input).focus()

    def action_copy_draw(self) -> None:
        """Add a copy of this draw's values as a new draw."""
        if self._refuse_if_read_only():
            return
        new = self._fresh_draw()
        copy = self.draw.model_copy(deep=True)
        copy.label, copy.taken, copy.during = new.label, new.taken, None
        self.case.draws.append(copy)
        self._mark_dirty()
        self.switch_draw(len(self.case.draws) - 1)

    def action_delete_draw(self) -> None:
        """Remove this draw, after asking."""
        if self._refuse_if_read_only():
            return
        if len(self.case.draws) == 1:
            self.notify("A case keeps at least one draw.", severity="warning")
            return

        def done(answer: str | None) -> None:
            if answer != "delete":
                return
            gone = self.index
            del self.case.draws[gone]
            self.pending = {
                (i if i < gone else i - 1, p, k): t
                for (i, p, k), t in self.pending.items()
                if i != gone
            }
            self.switch_draw(min(gone, len(self.case.draws) - 1))
            self._mark_dirty()

        self.app.push_screen(
            ChoiceScreen(
                f"Delete the draw {self.draw.label!r} and its values?",
                [("cancel", "Keep it"), ("delete", "Delete")],
            ),
            done,
        )

    def refused_summary(self) -> list[str]:
        """Fields holding refused text, in words."""
        out = []
        for (i, panel, key), text in self.pending.items():
            field = self._fields[(panel, key)]
            out.append(f"{self.case.draws[i].label}: {field.analyte.name} {text!r}")
        return out

    def _refuse_if_read_only(self) -> bool:
        if self.read_only:
            who = self.session.holder.describe() if self.session and self.session.holder else ""
            self.notify(
                f"Read-only: this case is open in another session {who}. Close it there, "
                "then open it again here to edit.",
                severity="warning",
            )
        return self.read_only

    def save_now(
        self,
        path: Path | None = None,
        *,
        force: bool = False,
        then: Callable[[], None] | None = None,
    ) -> bool:
        """Write the case (refused values are not part of it); True when written now.

        ``path`` saves under another name (the fellow has agreed to replace a file there).
        When the file changed on disk since it was opened, nothing is written: the
        differences are shown and the fellow chooses to overwrite, save as a new file or
        cancel; ``then`` runs after a save that succeeds, now or after that choice.
        """
        if self._refuse_if_read_only():
            return False
        case = self.case.model_copy(deep=True)
        old = self.session
        session: persistence.CaseSession | None = None
        try:
            session = self._session_for(path, case)
            result = session.save(case, force=force)
        except (persistence.SaveConflict, persistence.CaseLockedError, persistence.CaseFileError,
                OSError, persistence.ReadOnlyError) as exc:  # fmt: skip
            if session is not None and session is not old:
                session.close(keep_draft=True)  # opened for this save only
            return self._not_saved(exc, path, then)
        if session is not old:
            self.session = session
            if old is not None:
                old.close()  # its draft held the edits just saved elsewhere
        self.path = session.path
        self.dirty = False
        self.changed_since_journal = False
        self._update_title()
        refused = self.refused_summary()
        extra = f" {len(refused)} refused value(s) were not saved." if refused else ""
        if result.backup is not None:
            extra += " The previous version is kept (Ctrl+R lists backups)."
        if result.note:
            extra += f" Comments could not be kept: {result.note}."
        self.notify(f"Saved to {session.path}.{extra}", title="Saved")
        if then is not None:
            then()
        return True

    def _not_saved(
        self, exc: Exception, path: Path | None, then: Callable[[], None] | None
    ) -> bool:
        if isinstance(exc, persistence.SaveConflict):
            self._show_conflict(exc, path, then)
        elif isinstance(exc, persistence.CaseLockedError):
            self.notify(f"Not saved: {exc}.", severity="error", timeout=10)
        elif isinstance(exc, persistence.CaseFileError):
            first = exc.problems[0].message if exc.problems else "unreadable"
            self.notify(
                f"Not saved: {path} is not a case file workup can read ({first}); "
                "choose another name.",
                severity="error",
                timeout=10,
            )
        else:
            target = path or (self.session.path if self.session else self.cases_dir)
            self.notify(f"Could not save to {target}: {exc}", severity="error", timeout=10)
        return False

    def _session_for(self, path: Path | None, case: Case) -> persistence.CaseSession:
        """The session a save goes through: this case's own, or one for the new file name."""
        s = self.session
        target = path if path is not None else self.path
        if target is None:
            # Never saved: the file is named after the label as it is now.
            return persistence.new_session(self.cases_dir, self.case.label, case, keep=s)
        target = Path(target)
        if s is not None and s.path == target.resolve():
            return s
        if target.exists():
            return persistence.open_session(target)
        return persistence.create_session(target, case)

    def _show_conflict(
        self,
        conflict: persistence.SaveConflict,
        path: Path | None,
        then: Callable[[], None] | None,
    ) -> None:
        gone = conflict.disk_text is None
        what = "was deleted" if gone else "was changed outside this session"
        message = (
            f"{conflict.path.name} {what} since you opened it. Nothing was written.\n"
            "Read the differences below, then choose."
        )

        def done(answer: str | None) -> None:
            if answer == "overwrite":
                self.save_now(path, force=True, then=then)
            elif answer == "save_as":
                target = conflict.path
                suggested = persistence.free_path(target.parent, target.stem, ".yaml").name
                self.action_save_as(suggested, then=then)

        self.app.push_screen(ConflictScreen(message, conflict.diff), done)

    def action_save(self) -> None:
        """Save the case (asking first when some values were refused)."""
        self._save_asking(None)

    def _save_asking(self, then: Callable[[], None] | None) -> None:
        refused = self.refused_summary()
        if not refused:
            self.save_now(then=then)
            return
        listing = "\n".join(f"  {r}" for r in refused[:6])

        def done(answer: str | None) -> None:
            if answer == "save":
                self.save_now(then=then)

        self.app.push_screen(
            ChoiceScreen(
                f"These values were refused and are not part of the case:\n{listing}\n"
                "Save the rest?",
                [("cancel", "Go back and fix"), ("save", "Save the rest")],
            ),
            done,
        )

    def action_save_as(
        self, suggested: str | None = None, then: Callable[[], None] | None = None
    ) -> None:
        """Save under a new file name (in the library folder unless a full path is given)."""
        if self._refuse_if_read_only():
            return
        if suggested is None:
            suggested = (
                self.path.name
                if self.path
                else persistence.new_case_path(self.cases_dir, self.case.label).name
            )

        def done(answer: str | None) -> None:
            if not answer:
                return
            target = Path(answer).expanduser()
            if not target.is_absolute():
                target = self.cases_dir / target
            if target.suffix not in (".yaml", ".yml"):
                target = target.with_name(target.name + ".yaml")
            if target.exists() and target != self.path:

                def confirm(answer: str | None) -> None:
                    if answer == "replace":
                        self.save_now(target, then=then)

                self.app.push_screen(
                    ChoiceScreen(
                        f"{target} exists. Replace it? (Its version is kept as a backup.)",
                        [("cancel", "Keep it"), ("replace", "Replace")],
                    ),
                    confirm,
                )
                return
            self.save_now(target, then=then)

        self.app.push_screen(AskScreen("Save the case as (file name):", suggested), done)

    def confirm_leave(self, then: Callable[[], None]) -> None:
        """Run ``then`` after saving or discarding unsaved changes, as the fellow chooses.

        Either way it is a clean close: the draft is deleted when the screen goes.
        """

        def leave() -> None:
            self._left_cleanly = True
            then()

        if not self.dirty or self.read_only:
            leave()
            return

        def done(answer: str | None) -> None:
            if answer == "save":
                self._save_asking(leave)
            elif answer == "discard":
                leave()

        refused = self.refused_summary()
        lost = (
            f"\n{len(refused)} refused value(s) are not part of the case and will be lost."
            if refused
            else ""
        )
        self.app.push_screen(
            ChoiceScreen(
                f"{self.case.label!r} has unsaved changes.{lost}",
                [("save", "Save"), ("discard", "Discard changes"), ("cancel", "Cancel")],
            ),
            done,
        )

    def action_close(self) -> None:
        """Close the case and return to the library (asking about unsaved changes)."""
        self.confirm_leave(self._leave)

    def _leave(self) -> None:
        self.end_session(clean=True)
        self.dismiss()
        self.app.call_later(self.app.show_library)  # type: ignore[attr-defined]

    def action_backups(self) -> None:
        """List the kept previous versions of this case's file and restore one (after asking)."""
        from screens.recovery import BackupsScreen

        if self.path is None:
            self.notify("This case has not been saved yet: it has no backups.")
            return
        backups = persistence.backups_of(self.path)
        if not backups:
            self.notify(
                f"No backups of {self.path.name} yet: one is kept each time a save replaces it."
            )
            return

        def chosen(backup: persistence.Backup | None) -> None:
            if backup is None:
                return
            if self._refuse_if_read_only():
                return
            lost = " Your unsaved changes here are discarded." if self.dirty else ""
            self.app.push_screen(
                ChoiceScreen(
                    f"Put back the version of {self.path.name} kept at "
                    f"{backup.taken:%Y-%m-%d %H:%M:%S} UTC? The file's current version is "
                    f"kept as a backup first.{lost}",
                    [("cancel", "Cancel"), ("restore", "Put it back")],
                ),
                lambda answer: self._put_back(backup) if answer == "restore" else None,
            )

        self.app.push_screen(BackupsScreen(self.path.name, backups), chosen)

    def _put_back(self, backup: persistence.Backup) -> None:
        path = self.path
        try:
            persistence.put_back(backup)
        except OSError as exc:
            self.notify(f"Could not put the backup back: {exc}", severity="error", timeout=10)
            return
        self.notify(f"{backup.original.name} is back to the version of {backup.taken:%H:%M:%S}.")
        self._left_cleanly = True
        self.end_session(clean=True)
        self.dismiss()
        self.app.call_later(self.app.open_case, path)  # type: ignore[attr-defined]

    def action_note(self) -> None:
        """Open the note screen on the current assessment."""
        if self.assessment is None:
            self.notify(self.error or "Nothing to draft yet.", severity="warning")
            return
        from screens.note_screen import NoteScreen

        self.app.push_screen(
            NoteScreen(
                self.assessment,
                self.case,
                lambda: persistence.note_path(self.path, self.cases_dir, self.case.label),
                persistence.write_note,
            )
        )

    def action_paste(self) -> None:
        """Read a pasted lab report into this draw (when the paste screen is available)."""
        if self._refuse_if_read_only():
            return
        try:
            from screens.paste import PasteScreen
            from workup.paste import apply_proposal
        except ImportError:
            self.notify("Pasting lab reports is not available yet.", severity="warning")
            return

        def done(proposal: Any) -> None:
            if proposal is None:
                return
            try:
                updated = apply_proposal(self.draw, proposal)
            except Exception as exc:
                self.notify(f"The pasted values could not be applied: {exc}", severity="error")
                return
            self.case.draws[self.index] = updated
            self._mark_dirty()
            self.switch_draw(self.index)

        self.app.push_screen(PasteScreen(self.case.units), done)

    def _open_optional(self, name: str) -> None:
        try:
            import screens.trends as trends
        except ImportError:
            self.notify("Trends are not available yet.", severity="warning")
            return
        self.app.push_screen(getattr(trends, name)(self.case))

    def action_trends(self) -> None:
        """Show each value over the case's draws."""
        self._open_optional("TrendsScreen")

    def action_compare(self) -> None:
        """Compare the case's draws side by side."""
        self._open_optional("CompareScreen")

    # ----------------------------------------------------------------- help and commands

    def help_context(self) -> tuple[str, list[tuple[str, str]], list[str], str]:
        """What the help screen shows for this screen."""
        return keys.help_context(self)

    def commands(self) -> list[tuple[str, str, Callable[[], Any]]]:
        """Palette entries for every action of this screen."""
        return keys.palette_commands(self)
