"""Every key of the case screen, its line on the help screen (F1) and its palette command.

CaseScreen takes BINDINGS from here and answers the app's ``help_context`` and ``commands``
with the two functions below; the actions themselves are the screen's (and its mixins').
"""

from __future__ import annotations

from collections.abc import Callable
from typing import TYPE_CHECKING, Any

from textual.binding import Binding

from screens.davenport import band_rules_text

if TYPE_CHECKING:
    from screens.case_screen import CaseScreen

TABS = (
    ("f2", "tab-draw", "Draw"),
    ("f3", "tab-case", "Case"),
    ("f4", "tab-findings", "Findings"),
    ("f5", "tab-causes", "Causes"),
    ("f6", "tab-diagram", "Diagram"),
)
"""The tabs of the case: (key, pane id, name)."""

BINDINGS = [
    Binding("ctrl+s", "save", "Save", id="save"),
    Binding("ctrl+n", "new_draw", "New draw", id="new_draw"),
    Binding("ctrl+t", "next_unit", "Unit", id="next_unit", show=False),
    Binding("f7", "note", "Note", id="note"),
    Binding("f8", "paste", "Paste labs", id="paste", show=False),
    Binding("f9", "trends", "Trends", id="trends", show=False),
    Binding("shift+f9", "compare", "Compare draws", id="compare", show=False),
    Binding("ctrl+o", "close", "Library", id="close"),
    Binding("ctrl+r", "backups", "Backups", id="backups", show=False),
    # Priority: scrolling containers would otherwise take these as "page left/right".
    Binding("ctrl+pageup", "previous_draw", "Previous draw", show=False, priority=True),
    Binding("ctrl+pagedown", "next_draw", "Next draw", show=False, priority=True),
    *(Binding(k, f"tab('{tid}')", name, show=False) for k, tid, name in TABS),
]
"""The case screen's keys (the Footer shows those with ``show`` left on)."""

HELP_KEYS = [
    ("F2 .. F6", "tabs: draw, case, findings, causes, diagram"),
    ("Tab / Enter", "next field;  Shift+Tab: previous field"),
    ("Ctrl+T", "switch the unit of the field (a value already read is converted)"),
    ("Ctrl+N", "new draw, time-stamped now"),
    ("Ctrl+PgUp/PgDn", "previous / next draw"),
    ("s", "(findings) show the formula and source of the selected index"),
    ("c", "(findings) list the compensation rules that do not apply, or fold them"),
    ("Enter", "(findings) the selected index's reasons in full, or its one line"),
    ("e", "(findings) show or hide the evidence under each acid-base disorder"),
    ("Ctrl+S", "save;  Save as, duplicate, delete draw: Ctrl+P"),
    ("F7", "draft the note (copy or write to a file)"),
    ("F8 / F9", "paste a lab report / trends over the draws"),
    ("Shift+F9", "compare the draws side by side"),
    ("Ctrl+R", "backups: earlier versions of this file, to put one back"),
    ("Ctrl+O", "close the case and go to the library"),
    ("Ctrl+Q", "quit (asks when changes are unsaved)"),
]
"""The keys as the help screen lists them, in words."""


def help_context(screen: CaseScreen) -> tuple[str, list[tuple[str, str]], list[str], str]:
    """What the help screen shows for ``screen``: title, keys, its cautions, extra text."""
    extra = "Davenport bands (F6):\n" + band_rules_text()
    refused = screen.draw_pane.refused_reasons()
    if refused:
        # Listed first: a refused value is what the fellow most needs explained right now.
        lines = "\n".join(f"  x {r}" for r in refused)
        extra = f"Refused on draw {screen.draw.label!r} (not part of the case):\n{lines}\n\n{extra}"
    lock = screen.session.lock if screen.session is not None else None
    if lock is not None and lock.note:
        extra += f"\n\nStale lock taken over: {lock.note}"
    privacy = screen.session.privacy if screen.session is not None else []
    if privacy:
        extra += "\n\nPrivacy: other users of this machine can reach this case\n"
        extra += "\n".join(f"  {w.format()}" for w in privacy)
    return f"case {screen.case.label}", list(HELP_KEYS), screen.specific_cautions(), extra


def palette_commands(screen: CaseScreen) -> list[tuple[str, str, Callable[[], Any]]]:
    """Palette entries for every action of ``screen``."""
    cmds: list[tuple[str, str, Callable[[], Any]]] = [
        ("Save", "Save the case to its file", screen.action_save),
        ("Save as…", "Save the case under a new file name", screen.action_save_as),
        ("Duplicate case", "Open a copy of this case as a new, unsaved case",
         lambda: screen.app.duplicate_case(screen)),  # type: ignore[attr-defined]
        ("New case", "Start a new, empty case", lambda: screen.app.new_case()),  # type: ignore[attr-defined]
        ("Close case", "Return to the library", screen.action_close),
        ("Backups…", "Earlier versions of this case's file; put one back (Ctrl+R)",
         screen.action_backups),
        ("New draw", "Add an empty draw, time-stamped now", screen.action_new_draw),
        ("Copy draw", "Add a new draw holding this draw's values", screen.action_copy_draw),
        ("Delete draw", "Remove the current draw", screen.action_delete_draw),
        ("Previous draw", "Show the draw before this one", screen.action_previous_draw),
        ("Next draw", "Show the draw after this one", screen.action_next_draw),
        ("Switch unit", "Next unit for the focused value field", screen.action_next_unit),
        ("Draft note", "Draft, edit, copy or write the note", screen.action_note),
        ("Paste lab report", "Read pasted lab text into this draw", screen.action_paste),
        ("Trends", "Values over the case's draws", screen.action_trends),
        ("Compare draws", "The draws side by side", screen.action_compare),
    ]  # fmt: skip
    for key, tid, name in TABS:
        cmds.append((f"Show {name.lower()}", f"The {name} tab ({key.upper()})",
                     lambda tid=tid: screen.action_tab(tid)))  # fmt: skip
    return cmds
