"""File actions of the case: save, save as, a save that meets a file changed on disk, leaving
with unsaved changes, and putting a backup back (which reopens the case from it).

A mixin of CaseScreen: Ctrl+S, Ctrl+O and Ctrl+R are the screen's keys, and each action ends
in one of its dialogs (screens/dialogs.py). Sessions and files are screens/persistence.py.
"""

from __future__ import annotations

from collections.abc import Callable
from pathlib import Path
from typing import TYPE_CHECKING

from screens import persistence
from screens.case.drafts import DraftJournal
from screens.dialogs import AskScreen, ChoiceScreen, ConflictScreen
from workup.model import Case


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


class FileActions(DraftJournal):
    """Save and leave the case the way the fellow chooses; never overwrite a change unseen."""

    path: Path | None
    _left_cleanly: bool

    if TYPE_CHECKING:  # the screen's own, named here for the reader and the type checker

        def refused_summary(self) -> list[str]: ...
        def _update_title(self) -> None: ...

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
