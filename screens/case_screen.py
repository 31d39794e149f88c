"""The case workspace: enter a draw in chart order, and read its findings, causes and diagram.

The screen keeps a working copy of the case. Every accepted change goes into that copy and the
assessment is recomputed from it at once (``workup.assess.assess`` is fast); a refused value is
kept as text beside the field, never in the case, and is reported before saving.

The case is open through a :class:`workup.session.CaseSession` (see screens/persistence.py): the
working copy is journaled to a draft every few seconds when it changed and on every draw change,
so a crash or a dropped line loses at most the last few seconds; a save that would overwrite a
file changed on disk shows the differences and asks first.

This class is the coordinator: it holds the working copy and the session, composes one pane per
tab (screens/case/*_pane.py), hears their messages (screens/case/messages.py) and answers by
setting their attributes and calling their methods. Its keys are screens/case/keys.py; its
other jobs (drafts, saving, the draw list, the screens it opens) are still methods here.
"""

from __future__ import annotations

from collections.abc import Callable
from datetime import datetime
from pathlib import Path
from typing import Any

from textual import events, on
from textual.app import ComposeResult
from textual.screen import Screen
from textual.timer import Timer
from textual.widgets import Footer, Input, Static, TabbedContent

from screens import persistence
from screens.case import keys
from screens.case.case_pane import CasePane
from screens.case.causes_pane import CausesPane
from screens.case.diagram_pane import DiagramPane
from screens.case.draw_pane import NO_TEST, DrawPane
from screens.case.findings_pane import FindingsPane
from screens.case.keys import TABS
from screens.case.messages import DrawChosen, UnitSystemChanged, WorkingCopyEdited
from screens.case.pane_base import WorkspacePane
from screens.dialogs import AskScreen, ChoiceScreen, ConflictScreen
from workup.assess import Assessment, assess
from workup.cautions import CAUTION_LINES, CAUTION_SHORT
from workup.model import Case, Draw

__all__ = ["JOURNAL_SECONDS", "NO_TEST", "TABS", "CaseScreen"]

JOURNAL_SECONDS = 3.0
"""How often unsaved edits are written to the draft (only when something changed since)."""


def fresh_draw(draws: list[Draw], clock: Callable[[], datetime]) -> Draw:
    """An empty draw time-stamped now (to the minute), labelled apart from ``draws``."""
    labels = {d.label for d in draws}
    n = len(draws) + 1
    while f"draw {n}" in labels:
        n += 1
    taken = clock().replace(second=0, microsecond=0)
    return Draw(label=f"draw {n}", taken=taken)


def save_as_target(answer: str, cases_dir: Path) -> Path:
    """The file a "save as" answer names: in the library folder unless absolute, as YAML."""
    target = Path(answer).expanduser()
    if not target.is_absolute():
        target = cases_dir / target
    if target.suffix not in (".yaml", ".yml"):
        target = target.with_name(target.name + ".yaml")
    return target


def saved_message(path: Path, refused: int, result: persistence.SaveResult) -> str:
    """What the fellow is told after a save: where, and what it did not keep."""
    extra = f" {refused} refused value(s) were not saved." if refused else ""
    if result.backup is not None:
        extra += " The previous version is kept (Ctrl+R lists backups)."
    if result.note:
        extra += f" Comments could not be kept: {result.note}."
    return f"Saved to {path}.{extra}"


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
            self.case.draws.append(fresh_draw(self.case.draws, clock))
        self.index = len(case.draws) - 1
        self.assessment: Assessment | None = None
        self.error: str | None = None
        self.draw_pane = DrawPane(case, self.index)
        self.case_pane = CasePane(case)
        self.findings_pane = FindingsPane()
        self.causes_pane = CausesPane()
        self.diagram_pane = DiagramPane()
        self.panes: dict[str | None, WorkspacePane] = {
            p.id: p
            for p in (
                self.draw_pane,
                self.case_pane,
                self.findings_pane,
                self.causes_pane,
                self.diagram_pane,
            )
        }
        """The tabs in order, by pane id."""

    # ----------------------------------------------------------------- layout

    def compose(self) -> ComposeResult:
        yield Static("", id="titlebar")
        with TabbedContent(id="tabs", initial=self.start_tab):
            yield from self.panes.values()
        yield Static("", id="caution-line")
        yield Footer()

    def on_mount(self) -> None:
        # Long texts read from their start, not scrolled to the cursor at their end.
        for w in self.query(".meta-row Input").results(Input):
            w.cursor_position = 0
        self._show_draw()
        self._recompute()
        if self.read_only:
            # A read-only session does not journal, so nothing may be edited in it.
            self.draw_pane.make_read_only()
            self.case_pane.make_read_only()
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

    # ----------------------------------------------------------------- state

    @property
    def draw(self) -> Draw:
        """The draw being entered."""
        return self.case.draws[self.index]

    def refused_summary(self) -> list[str]:
        """Fields holding refused text, in words."""
        return self.draw_pane.refused_summary()

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

    def _show_draw(self) -> None:
        self.draw_pane.show_draw(self.index)
        self._update_title()

    # ----------------------------------------------------------------- from the panes

    @on(WorkingCopyEdited)
    def _working_copy_edited(self, event: WorkingCopyEdited) -> None:
        event.stop()
        self._mark_dirty()
        if event.recompute:
            self._recompute()

    @on(UnitSystemChanged)
    def _units_changed(self, event: UnitSystemChanged) -> None:
        event.stop()
        self._mark_dirty()
        self.draw_pane.follow_units()
        self._recompute()

    @on(DrawChosen)
    def _draw_chosen(self, event: DrawChosen) -> None:
        event.stop()
        if event.index != self.index:
            self.switch_draw(event.index)

    def on_descendant_focus(self, event: events.DescendantFocus) -> None:
        # Anywhere on the screen: focus outside the draw form means no value field is focused.
        self.draw_pane.follow_focus(event.widget)

    # ----------------------------------------------------------------- assessment

    def _recompute(self) -> None:
        try:
            self.assessment = assess(self.case, self.draw.label, self.overrides)
            self.error = None
        except Exception as exc:  # a half-built core must not take the app down
            self.assessment = None
            self.error = f"The assessment could not be computed: {type(exc).__name__}: {exc}"
        self.findings_pane.show(self.assessment, self.error)
        self.causes_pane.show(self.assessment, self.error)
        self._update_diagram()
        self._update_cautions()
        self._update_title()

    @on(TabbedContent.TabActivated)
    def _tab_shown(self, event: TabbedContent.TabActivated) -> None:
        if event.pane.id == "tab-diagram":
            self._update_diagram()

    def _update_diagram(self) -> None:
        # Drawn only while visible: the geometry needs numpy, which start-up should not wait for.
        if self.query_one(TabbedContent).active != "tab-diagram":
            return
        self.diagram_pane.plot(self.case, self.index, self.assessment)

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
        """Show one tab and focus its content (the tab bar when it has nothing to focus)."""
        tabs = self.query_one(TabbedContent)
        tabs.active = tab_id
        target = self.panes[tab_id].focus_target()
        (target if target is not None else tabs.query_one("Tabs")).focus()

    def action_next_unit(self) -> None:
        """Switch the focused field to its next unit, converting a value already read."""
        if self._refuse_if_read_only():
            return
        if self.draw_pane.next_unit():
            self._mark_dirty()
            self._recompute()

    # ----------------------------------------------------------------- session and drafts

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

    def _refuse_if_read_only(self) -> bool:
        if self.read_only:
            who = self.session.holder.describe() if self.session and self.session.holder else ""
            self.notify(
                f"Read-only: this case is open in another session {who}. Close it there, "
                "then open it again here to edit.",
                severity="warning",
            )
        return self.read_only

    # ----------------------------------------------------------------- draws

    def switch_draw(self, index: int) -> None:
        """Show draw ``index`` in the form and the findings."""
        self.index = max(0, min(index, len(self.case.draws) - 1))
        self._show_draw()
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
        self.case.draws.append(fresh_draw(self.case.draws, self.clock))
        self._mark_dirty()
        self.switch_draw(len(self.case.draws) - 1)
        self.action_tab("tab-draw")
        self.draw_pane.focus_label()

    def action_copy_draw(self) -> None:
        """Add a copy of this draw's values as a new draw."""
        if self._refuse_if_read_only():
            return
        new = fresh_draw(self.case.draws, self.clock)
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
            self.draw_pane.forget_draw(gone)
            self.switch_draw(min(gone, len(self.case.draws) - 1))
            self._mark_dirty()

        self.app.push_screen(
            ChoiceScreen(
                f"Delete the draw {self.draw.label!r} and its values?",
                [("cancel", "Keep it"), ("delete", "Delete")],
            ),
            done,
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

    # ----------------------------------------------------------------- files

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
        self.notify(saved_message(session.path, len(self.refused_summary()), result), title="Saved")
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
            target = save_as_target(answer, self.cases_dir)
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

    # ----------------------------------------------------------------- other screens

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
