"""The draw entry form: one row per analyte in chart order, each with its unit and its check.

Reading and checking a value is the core's job (``workup.quantity``); this module only decides
which unit a field shows, hands the text and that unit to the core and shows the answer.
"""

from __future__ import annotations

import re
from dataclasses import dataclass

from textual import events
from textual.app import ComposeResult
from textual.containers import Horizontal
from textual.widgets import Input, Select, Static

from workup.analytes import Analyte, Panel, UnitSystem, analyte
from workup.quantity import Measurement, ValueProblem, read_value, unusual

# Chart order: how a fellow reads the results off the record, panel by panel, then the extras.
SECTIONS: tuple[tuple[str, tuple[tuple[Panel, str], ...]], ...] = (
    (
        "Serum",
        tuple(
            (Panel.serum, k)
            for k in (
                "sodium", "potassium", "chloride", "bicarbonate", "urea_nitrogen", "urea",
                "creatinine", "glucose", "albumin", "osmolality",
            )
        ),
    ),
    ("Blood gas", tuple((Panel.blood_gas, k) for k in ("ph", "pco2", "bicarbonate"))),
    (
        "Urine",
        tuple(
            (Panel.urine, k)
            for k in (
                "sodium", "potassium", "chloride", "ph", "osmolality", "urea_nitrogen", "urea",
                "glucose", "creatinine",
            )
        ),
    ),
    (
        "Extras: Fanconi markers",
        (
            (Panel.serum, "phosphate"), (Panel.urine, "phosphate"),
            (Panel.serum, "uric_acid"), (Panel.urine, "uric_acid"),
        ),
    ),
    ("Extras: measured urine ammonium", ((Panel.urine, "ammonium"),)),
    (
        "Extras: loading-test values",
        ((Panel.urine, "bicarbonate"), (Panel.urine, "pco2")),
    ),
    (
        "Extras: calcium, citrate, other anions",
        (
            (Panel.serum, "calcium"), (Panel.urine, "calcium"), (Panel.urine, "citrate"),
            (Panel.serum, "lactate"), (Panel.serum, "beta_hydroxybutyrate"),
            (Panel.serum, "ethanol"), (Panel.urine, "ketones"),
        ),
    ),
)  # fmt: skip

PANEL_WORD = {Panel.serum: "serum", Panel.blood_gas: "gas", Panel.urine: "urine"}

_BARE = re.compile(r"^\s*[-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?\s*$")


def field_id(panel: Panel, key: str) -> str:
    """The widget id of a field, e.g. ``serum-sodium``."""
    return f"{panel.value.replace('_', '-')}-{key.replace('_', '-')}"


def all_fields() -> list[tuple[Panel, str]]:
    """Every field of the form in entry order."""
    return [pk for _, fields in SECTIONS for pk in fields]


def default_unit(a: Analyte, system: UnitSystem | None) -> str | None:
    """The unit an empty field shows: the case's system for ambiguous analytes, else canonical.

    None means the field has no unit yet (an ambiguous analyte in a case without a unit system):
    a bare number is then refused by the core, never guessed.
    """
    if a.words:
        return a.canonical
    if not a.ambiguous:
        return a.canonical
    if system is None:
        return None
    u = a.unit_for(system)
    return u.symbol if u else None


def unit_choices(a: Analyte) -> list[str]:
    """The units a field can switch between, canonical first as the catalogue lists them."""
    return [u.symbol for u in a.units]


@dataclass(frozen=True)
class FieldReading:
    """What the core said about the text of one field."""

    measurement: Measurement | None
    """The value read, or None when empty or refused."""
    problem: str | None = None
    """Why the text was refused (the core's words)."""
    caution: str | None = None
    """The core's caution for an unusual value."""


def read_field(a: Analyte, text: str, unit: str | None, system: UnitSystem | None) -> FieldReading:
    """Read a field's text in the unit it shows; a unit typed in the text wins."""
    text = text.strip()
    if not text:
        return FieldReading(None)
    raw = text
    if _BARE.match(text) and unit and not a.words:
        raw = f"{text} {unit}"
    try:
        m = read_value(a, raw, system)
    except ValueProblem as exc:
        return FieldReading(None, problem=str(exc))
    return FieldReading(m, caution=unusual(a, m))


def shown_text(m: Measurement) -> str:
    """How a stored measurement is written back into its field."""
    if m.word is not None:
        return m.word
    v = m.value
    return str(int(v)) if float(v).is_integer() and abs(v) < 1e15 else f"{v:g}"


class FollowFocus:
    """Tab (and, where asked, Enter) move on at once, and typed-ahead keys follow the focus.

    Textual hands every key of a burst to the widget focused when the burst arrived, and moves
    the focus only after Enter or Tab has travelled up to the screen. Keys typed quickly, or
    bunched by a slow SSH link, would land in the field just left. Here the focus moves while
    the key itself is handled, and a key that reaches this widget after the focus has left is
    passed on to the widget that has it now.
    """

    ENTER_MOVES = True
    INLINE_BINDINGS = False

    async def _on_key(self, event: events.Key) -> None:
        screen = self.screen  # type: ignore[attr-defined]
        focused = screen.focused
        if focused is not None and focused is not self and self not in focused.ancestors:
            event.stop()
            event.prevent_default()
            focused._forward_event(events.Key(event.key, event.character))
            return
        if focused is not self:
            return
        moves = {"tab": screen.focus_next, "shift+tab": screen.focus_previous}
        if self.ENTER_MOVES:
            moves["enter"] = screen.focus_next
        move = moves.get(event.key)
        if move is not None:
            event.stop()
            event.prevent_default()
            move()
            return
        if self.INLINE_BINDINGS:
            # Editing keys (Backspace, Delete, arrows, Home, End) are bindings, which Textual
            # runs only after the key has bubbled up; in a burst the characters typed after
            # them would be inserted first ("141", Backspace ×3, "152" left "141"). Running
            # the field's own binding here keeps every key in the order it was typed.
            bindings = self._bindings.key_to_bindings.get(event.key)  # type: ignore[attr-defined]
            if bindings:
                event.stop()
                event.prevent_default()
                await self.run_action(bindings[0].action)  # type: ignore[attr-defined]


class EntryInput(FollowFocus, Input):
    """A form input: Enter and Tab go to the next field, even in a burst of keys."""

    INLINE_BINDINGS = True


class EntrySelect(FollowFocus, Select):
    """A form choice: Tab goes on even in a burst of keys; Enter still opens the list."""

    ENTER_MOVES = False


class ValueField(Horizontal):
    """One analyte: its name, an input, the unit it is read in and the core's verdict."""

    def __init__(self, panel: Panel, key: str) -> None:
        super().__init__(id=f"row-{field_id(panel, key)}", classes="field-row")
        self.panel = panel
        self.key = key
        self.analyte = analyte(panel, key)
        self.unit: str | None = None
        self._shown = ("", "")

    def compose(self) -> ComposeResult:
        name = f"{PANEL_WORD[self.panel]} {self.analyte.name}"
        yield Static(name, classes="field-name")
        yield EntryInput(
            id=f"in-{field_id(self.panel, self.key)}",
            classes="field-input",
            compact=True,
            max_length=40,
            select_on_focus=False,
            validate_on=[],  # the core validates; Input's own classes would only cost restyles
        )
        yield Static("", classes="field-unit")
        yield Static("", classes="field-state")

    @property
    def input(self) -> Input:
        """The text input of the field."""
        return self.query_one(Input)

    def show_unit(self, unit: str | None) -> None:
        """Display ``unit`` (None: no unit chosen yet)."""
        self.unit = unit
        text = "unit?" if unit is None else (unit or "no unit")
        self.query_one(".field-unit", Static).update(text)

    def show_reading(self, reading: FieldReading) -> None:
        """Show the verdict in words and marks, never in colour alone."""
        if reading.problem:
            word, cls = "x refused", "-refused"
        elif reading.caution:
            word, cls = "! unusual", "-unusual"
        elif reading.measurement is not None:
            word, cls = "+ read", "-ok"
        else:
            word, cls = "", ""
        if (word, cls) == self._shown:
            return
        self._shown = (word, cls)
        # Colour by content markup, not CSS classes: a class change restyles the widget, and
        # ~50 rows restyled on every draw switch was most of the time spent showing a draw.
        colour = {"-refused": "bold $error", "-unusual": "bold $warning"}.get(cls)
        text = f"[{colour}]{word}[/]" if colour else word
        self.query_one(".field-state", Static).update(text)

    @property
    def state_kind(self) -> str:
        """``-refused``, ``-unusual``, ``-ok`` or "" (empty field)."""
        return self._shown[1]
