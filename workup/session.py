"""One open case, for the app: lock, draft journal, conflict-checked save with backup, clean close.

How the app uses it::

    for draft in pending_drafts():          # on start: sessions that did not close
        ...offer CaseSession.restore(draft) or discard_draft(draft)
    s = CaseSession.open(path)               # CaseLockedError if another session has it
    s.journal(case)                          # every few seconds and on every draw change
    s.save(case)                             # SaveConflict if the file changed on disk
    s.save(case, force=True)                 # after the user has read the conflict's diff
    s.close()                                # clean close: draft removed, lock released

A dropped SSH line (SIGHUP) or a kill is not a clean close: the draft stays for the next start.
"""

from __future__ import annotations

import difflib
from dataclasses import dataclass
from pathlib import Path

from workup.caseio import CaseFileError, Problem, case_from_bytes, dump_case
from workup.equivalence import same_case
from workup.journal import (
    Draft,
    case_key,
    discard_draft,
    draft_for,
    draft_path,
    pending_drafts,
    set_aside,
    write_draft,
)
from workup.locking import CaseLock, CaseLockedError, LockInfo, current_holder
from workup.model import Case
from workup.privacy import PrivacyWarning, check_folder
from workup.roundtrip import RoundTripError, roundtrip_text
from workup.storage import (
    Backup,
    Fingerprint,
    atomic_write_text,
    backup_current,
    read_with_fingerprint,
    remove_stale_temp_files,
)

__all__ = [
    "CaseLockedError",
    "CaseSession",
    "ReadOnlyError",
    "SaveConflict",
    "SaveResult",
    "pending_drafts",
]


class SaveConflict(RuntimeError):
    """The file changed on disk since it was opened; nothing was written."""

    def __init__(self, path: Path, disk_text: str | None, new_text: str):
        self.path = path
        """The case file."""
        self.disk_text = disk_text
        """What the file holds now (None when it was deleted)."""
        self.new_text = new_text
        """What the save would have written."""
        self.diff = "".join(
            difflib.unified_diff(
                (disk_text or "").splitlines(keepends=True),
                new_text.splitlines(keepends=True),
                fromfile=f"{path} (on disk now)",
                tofile=f"{path} (your version)",
            )
        )
        """Unified diff from the file on disk to the version that would be written."""
        what = "was deleted" if disk_text is None else "was changed by someone else"
        super().__init__(
            f"{path} {what} since you opened it; read the differences, then save with "
            "force=True to overwrite (the version on disk is kept as a backup)"
        )


class ReadOnlyError(RuntimeError):
    """A read-only session (opened while another session held the case) cannot save."""


@dataclass(frozen=True, slots=True)
class SaveResult:
    """What a save did."""

    path: Path
    """The case file written."""
    backup: Backup | None
    """The previous version kept, or None when the file was new."""
    kept_comments: bool
    """True when the file's own comments and layout were kept (round-trip save)."""
    note: str | None = None
    """Why comments could not be kept, when they could not."""


class CaseSession:
    """An open case file: see the module docstring for the protocol."""

    def __init__(
        self,
        path: Path,
        case: Case,
        base: Fingerprint | None,
        lock: CaseLock | None,
        holder: LockInfo | None = None,
    ):
        self.path = path
        """The case file (absolute, symlinks resolved)."""
        self.case = case
        """The newest version the app gave us (or the one loaded)."""
        self.base = base
        """Fingerprint of the file as last read or written; None for a file not yet on disk."""
        self._saved = case
        self._journaled: Case | None = None
        self.lock = lock
        """The held lock, or None for a read-only session."""
        self.holder = holder
        """Who held the case when this session was opened read-only."""
        self.notes: list[str] = []
        """Things the user should hear about (a stale lock taken over, a draft found)."""
        if lock is not None and lock.note:
            self.notes.append(lock.note)
        self.pending_draft: Draft | None = None
        """A draft left by an earlier session of this case, if any (offer to restore it)."""
        self.privacy: list[PrivacyWarning] = []
        """Other users can reach the case's folder or files: each warning carries its fix."""

    # -- opening -------------------------------------------------------------------------

    @classmethod
    def open(cls, path: str | Path, *, read_only: bool = False) -> CaseSession:
        """Open an existing case file.

        Raises CaseFileError when it cannot be read and CaseLockedError when another running
        session holds it (unless ``read_only``, which opens it without the lock).
        """
        path = case_key(path)
        lock, holder = cls._lock(path, read_only)
        try:
            got = read_with_fingerprint(path)
            if got is None:
                raise CaseFileError(str(path), [Problem("", "no such file")])
            raw, base = got
            case = case_from_bytes(raw, str(path))
        except BaseException:
            if lock is not None:
                lock.release()
            raise
        s = cls(path, case, base, lock, holder)
        if lock is not None:
            s._find_draft()
            remove_stale_temp_files(path.parent, path.name)
        s._check_privacy()
        return s

    @classmethod
    def create(cls, path: str | Path, case: Case) -> CaseSession:
        """Start a session for a new case not yet saved at ``path`` (FileExistsError if it is)."""
        path = case_key(path)
        if path.exists():
            raise FileExistsError(f"{path} already exists; open it instead")
        lock, _ = cls._lock(path, read_only=False)
        s = cls(path, case, None, lock)
        s._saved = None  # type: ignore[assignment]  # nothing on disk yet: always unsaved
        s._find_draft()
        return s

    @classmethod
    def restore(cls, draft: Draft) -> CaseSession:
        """Reopen the case of a left-over draft with its edits as the current, unsaved version.

        The session's base is the file the edits started from, so if the file changed since, the
        first save raises SaveConflict instead of overwriting it.
        """
        if draft.case is None or draft.case_path is None:
            raise ValueError(f"the draft {draft.path} cannot be restored: {draft.problem}")
        path = draft.case_path
        lock, _ = cls._lock(path, read_only=False)
        try:
            got = read_with_fingerprint(path)
            disk_case: Case | None = None
            if got is not None:
                try:
                    disk_case = case_from_bytes(got[0], str(path))
                except CaseFileError:
                    disk_case = None
        except BaseException:
            lock.release()
            raise
        # The base is what the edits started from, not what is on disk now.
        same = got is not None and draft.base is not None and got[1].sha256 == draft.base.sha256
        s = cls(path, draft.case, draft.base, lock)
        s._saved = disk_case if same else None  # type: ignore[assignment]
        s._journaled = None
        try:
            if draft.path != draft_path(path):
                s._find_draft()  # other left-over edits of this case: keep them out of the way
            s.journal(draft.case)
            if draft.path != draft_path(path):
                discard_draft(draft)  # its edits now live in this session's own draft
        except BaseException:
            lock.release()
            raise
        return s

    @staticmethod
    def _lock(path: Path, read_only: bool) -> tuple[CaseLock | None, LockInfo | None]:
        if read_only:
            return None, current_holder(path)
        return CaseLock.acquire(path), None

    def _check_privacy(self) -> None:
        self.privacy = check_folder(self.path.parent)
        self.notes.extend(w.format() for w in self.privacy)

    def _find_draft(self) -> None:
        d = draft_for(self.path)
        if d is None:
            return
        if d.case is not None and same_case(d.case, self.case):
            discard_draft(d)  # it holds nothing that is not on disk
            return
        # Our own journal writes to the same draft file: move the left-over edits out of its way.
        d = set_aside(d)
        self.pending_draft = d
        self.notes.append(
            f"unsaved edits from {d.owner} at {_when(d)} were found; restore or discard them"
        )

    # -- state ---------------------------------------------------------------------------

    @property
    def read_only(self) -> bool:
        """True when opened without the lock."""
        return self.lock is None

    @property
    def dirty(self) -> bool:
        """Whether the current case differs from the version on disk."""
        return not same_case(self.case, self._saved)

    def disk_changed(self) -> bool:
        """Whether the file on disk differs from the version this session read or wrote."""
        got = read_with_fingerprint(self.path)
        now = None if got is None else got[1].sha256
        return now != (None if self.base is None else self.base.sha256)

    # -- journal -------------------------------------------------------------------------

    def journal(self, case: Case) -> bool:
        """Record ``case`` as the current, unsaved version in the draft file.

        Cheap to call often: nothing is written when it equals the last journaled version, and
        the draft is removed when it equals the saved one. Returns True when a draft was written.
        """
        self.case = case
        if self.read_only:
            return False
        if self._journaled is not None and same_case(case, self._journaled):
            return False
        if same_case(case, self._saved):
            if self._journaled is not None:
                discard_draft(draft_path(self.path))
            self._journaled = case
            return False
        write_draft(self.path, case, self.base)
        self._journaled = case
        return True

    def restore_pending(self) -> Case:
        """Take the pending draft's case as the current version (the base stays the file's)."""
        d = self.pending_draft
        if d is None or d.case is None:
            raise ValueError("there is no restorable draft for this case")
        self.pending_draft = None
        self._journaled = None
        self.journal(d.case)
        discard_draft(d)  # its edits now live in this session's own draft
        return d.case

    def discard_pending(self) -> None:
        """Delete the pending draft without using it."""
        if self.pending_draft is not None:
            discard_draft(self.pending_draft)
            self.pending_draft = None

    # -- save ----------------------------------------------------------------------------

    def render(self, case: Case) -> tuple[str, bool, str | None]:
        """The text a save of ``case`` writes: (text, comments kept, note)."""
        got = read_with_fingerprint(self.path)
        if got is not None:
            try:
                old = got[0].decode("utf-8-sig")
                return roundtrip_text(old, case), True, None
            except (RoundTripError, UnicodeDecodeError) as exc:
                return dump_case(case), False, f"the file was rewritten in full ({exc})"
        return dump_case(case), False, None

    def save(self, case: Case | None = None, *, force: bool = False) -> SaveResult:
        """Write ``case`` (default: the current one) to the case file.

        Raises SaveConflict, writing nothing, when the file changed on disk since it was read
        or last written, unless ``force``. The replaced version is kept as a backup.
        """
        if self.read_only:
            who = self.holder.describe() if self.holder else "another session"
            raise ReadOnlyError(f"{self.path} is open read-only (held by {who})")
        case = self.case if case is None else case
        self.case = case
        text, kept, note = self.render(case)
        got = read_with_fingerprint(self.path)
        now = None if got is None else got[1]
        base_sha = None if self.base is None else self.base.sha256
        now_sha = None if now is None else now.sha256
        if now_sha != base_sha and not force:
            disk = None if got is None else got[0].decode("utf-8", errors="replace")
            raise SaveConflict(self.path, disk, text)
        backup = backup_current(self.path)
        # Look once more just before replacing: an editor may have written meanwhile.
        again = read_with_fingerprint(self.path)
        if (None if again is None else again[1].sha256) != now_sha and not force:
            disk = None if again is None else again[0].decode("utf-8", errors="replace")
            raise SaveConflict(self.path, disk, text)
        atomic_write_text(self.path, text)
        written = read_with_fingerprint(self.path)
        self.base = None if written is None else written[1]
        self._saved = case
        discard_draft(draft_path(self.path))
        self._journaled = case
        return SaveResult(self.path, backup, kept, note)

    # -- closing -------------------------------------------------------------------------

    def close(self, *, keep_draft: bool = False) -> None:
        """End the session: the draft is deleted (unless ``keep_draft``) and the lock released.

        The app asks the user to save or discard unsaved edits before a clean close.
        """
        if not keep_draft and not self.read_only:
            discard_draft(draft_path(self.path))
        if self.lock is not None:
            self.lock.release()

    def __enter__(self) -> CaseSession:
        return self

    def __exit__(self, exc_type: object, *rest: object) -> None:
        # Leaving on an exception is not a clean close: keep the edits for the next start.
        self.close(keep_draft=exc_type is not None)


def _when(d: Draft) -> str:
    return d.written.strftime("%Y-%m-%d %H:%M UTC") if d.written else "an unknown time"
