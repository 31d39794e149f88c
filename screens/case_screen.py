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
setting their attributes and calling their methods. Its other jobs are mixins of one module
each in screens/case/: drafts, file actions, the draw list, the screens it opens, its keys.
"""

from __future__ import annotations

from collections.abc import Callable
from datetime import datetime
from pathlib import Path
from typing import Any

from textual import events, on
from textual.app import ComposeResult
from textual.css.query import QueryType
from textual.reactive import Reactive
from textual.screen import Screen
from textual.timer import Timer
from textual.widget import Widget
from textual.widgets import Static, TabbedContent, Tabs

from screens import persistence
from screens.app_actions import SteadyFooter
from screens.case import keys
from screens.case.case_pane import CasePane
from screens.case.causes_pane import CausesPane
from screens.case.diagram_pane import DiagramPane
from screens.case.drafts import JOURNAL_SECONDS
from screens.case.draw_pane import NO_TEST, DrawPane
from screens.case.draws import DrawActions, fresh_draw
from screens.case.file_actions import FileActions
from screens.case.findings_pane import FindingsPane
from screens.case.keys import TABS
from screens.case.messages import DrawChosen, UnitSystemChanged, WorkingCopyEdited
from screens.case.pane_base import FormPane, WorkspacePane
from screens.case.side_screens import SideScreens
from screens.case.titlebar import title_text
from workup.assess import Assessment, assess
from workup.cautions import CAUTION_LINES, CAUTION_SHORT
from workup.draw_focus import draw_header, opening
from workup.model import Case, Draw

__all__ = ["JOURNAL_SECONDS", "NO_TEST", "TABS", "CaseScreen"]


class CaseScreen(FileActions, DrawActions, SideScreens, Screen[None]):
    """One case: draws to enter, findings to read, notes to draft."""

    BINDINGS = keys.BINDINGS
    # Textual repaints the whole screen when the focus moves (over 4 KB on the line for each
    # Tab, and twice while the screen first settles); the widgets whose look depends on the
    # focus are restyled and repainted by Textual anyway.
    focused: Reactive[Widget | None] = Reactive(None, repaint=False)

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
        if self.read_only and start_tab in ("tab-draw", "tab-case"):
            start_tab = "tab-findings"  # a read-only session opens where nothing is edited
        self.start_tab = start_tab
        if not self.case.draws:
            self.case.draws.append(fresh_draw(self.case.draws, clock))
        # Open on the draw that shows the acidosis, not a loading draw taken after it.
        # The assessment made to choose that draw is the one first shown: not made twice.
        self._opened: Assessment | None
        self.index, self._opened = opening(case, self.overrides)
        self.assessment: Assessment | None = None
        self.error: str | None = None
        # The two forms hold most of the screen's widgets: one not shown first is built on its
        # first visit (its tab, or a key that needs it), so the first screen comes up sooner.
        self.draw_pane = DrawPane(case, self.index, late=start_tab != "tab-draw")
        self.case_pane = CasePane(case, late=start_tab != "tab-case")
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
        yield Static("", id="notice-line")
        with TabbedContent(id="tabs", initial=self.start_tab):
            yield from self.panes.values()
        yield Static("", id="caution-line")
        yield SteadyFooter()

    def on_mount(self) -> None:
        self._show_draw()
        opened, self._opened = self._opened, None
        self._recompute(opened)
        self._show_notices()
        if self.read_only:
            # A read-only session does not journal, so nothing may be edited in it.
            self.draw_pane.make_read_only()
            self.case_pane.make_read_only()
        else:
            self.journal_timer = self.set_interval(JOURNAL_SECONDS, self.journal_tick)
            if self.dirty and self.session is not None:
                self.journal_now()  # restored edits: make sure this session's draft holds them
        self._show_tab(self.start_tab)  # built at compose: no wait

    async def build_all(self) -> None:
        """Build every pane not built yet (each once), e.g. for a test that reads every form."""
        for pane in self.panes.values():
            await pane.build()

    async def settle_builds(self) -> None:
        """Wait for any pane build under way (none is started), e.g. before the app shuts down."""
        for pane in self.panes.values():
            await pane.settle()

    def _show_notices(self) -> None:
        from screens.app_notices import banner_text

        text = banner_text(self.session) if self.session is not None else ""
        line = self.query_one("#notice-line", Static)
        line.update(text)
        line.display = bool(text)

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
        self.query_one("#titlebar", Static).update(
            title_text(
                dirty=self.dirty,
                read_only=self.read_only,
                label=self.case.label,
                draw_number=self.index + 1,
                draw_count=len(self.case.draws),
                draw_label=self.draw.label,
                path=self.path,
            )
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

    def _recompute(self, ready: Assessment | None = None) -> None:
        try:
            # ``ready``: the assessment of the case as it stands, centred on the shown draw.
            self.assessment = ready or assess(self.case, self.draw.label, self.overrides)
            self.error = None
        except Exception as exc:  # a half-built core must not take the app down
            self.assessment = None
            self.error = f"The assessment could not be computed: {type(exc).__name__}: {exc}"
        self.findings_pane.show(self.assessment, self.error, self._draw_header())
        self.causes_pane.show(self.assessment, self.error)
        self._update_diagram()
        self._update_cautions()
        self._update_title()

    def _draw_header(self) -> str | None:
        if self.assessment is None:
            return None
        # Fitted to the terminal's width (the pane has no margin): one line at 80 columns.
        return draw_header(self.case, self.assessment, self.app.size.width or None)

    @on(TabbedContent.TabActivated)
    async def _tab_shown(self, event: TabbedContent.TabActivated) -> None:
        # A tab chosen on the tab bar (arrows, mouse) is a first visit too: its form is built.
        pane = self.panes.get(event.pane.id)
        if pane is not None:
            await pane.build()
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

    async def action_tab(self, tab_id: str) -> None:
        """Show one tab and focus its content (the tab bar when it has nothing to focus).

        A pane not built yet is built first, so the key that asked for it lands in it."""
        await self.panes[tab_id].build()
        self._show_tab(tab_id)

    def _show_tab(self, tab_id: str) -> None:
        tabs = self.query_one(TabbedContent)
        tabs.active = tab_id
        target = self.panes[tab_id].focus_target()
        # Focused at once, not after the next message: at start-up Textual would otherwise
        # focus the tab bar first, one more full repaint and footer before the first screen.
        self.set_focus(target if target is not None else tabs.query_one("Tabs"))

    def focus_next(self, selector: str | type[QueryType] = "*") -> Widget | None:
        """Tab: as Textual does, except into and round a form (the rows' order stays as shown).

        Entering a form from the tab bar lands on its first value (the draw's serum sodium, the
        patient's age), not on the draw list, label and time above the values; Tab after the
        form's last field goes round to its top, so those rows come after the values and stay
        reachable (and by Shift+Tab from the first value)."""
        pane = self.panes.get(self.query_one(TabbedContent).active)
        if isinstance(pane, FormPane) and not pane.built:
            # Tab on the bar of a form still being built: enter it once its rows are there.
            self.call_next(self._enter_when_built, pane)
            return None
        jump = self._form_jump()
        if jump is None:
            return super().focus_next(selector)
        self.set_focus(jump)
        return jump

    async def _enter_when_built(self, pane: FormPane) -> None:
        await pane.build()
        if not pane.read_only and self.query_one(TabbedContent).active == pane.id:
            self.set_focus(pane.focus_target())

    def _form_jump(self) -> Widget | None:
        pane = self.panes.get(self.query_one(TabbedContent).active)
        if not isinstance(pane, FormPane) or not pane.built or pane.read_only:
            return None
        focused = self.focused
        if focused is None or isinstance(focused, Tabs):
            return pane.focus_target()
        fields = [w for w in self.focus_chain if pane in w.ancestors and w.id != pane.FORM_ID]
        if fields and focused is fields[-1]:
            return fields[0]
        return None

    def action_next_unit(self) -> None:
        """Switch the focused field to its next unit, converting a value already read."""
        if self._refuse_if_read_only():
            return
        if self.draw_pane.next_unit():
            self._mark_dirty()
            self._recompute()

    # ----------------------------------------------------------------- help and commands

    def help_context(self) -> tuple[str, list[tuple[str, str]], list[str], str]:
        """What the help screen shows for this screen."""
        return keys.help_context(self)

    def commands(self) -> list[tuple[str, str, Callable[[], Any]]]:
        """Palette entries for every action of this screen."""
        return keys.palette_commands(self)
