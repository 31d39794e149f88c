"""The draft journal: unsaved edits of an open case, kept on disk so a crash loses nothing.

One draft file per case, in the private ``drafts`` folder of the platformdirs user state path
(``~/.local/state/workup/drafts``, honouring XDG_STATE_HOME). Each journal write replaces the
whole draft atomically (see workup.storage), so a draft is always one complete version. The draft
names the case file and the fingerprint of the file the edits started from, so a restore can tell
whether the file changed on disk meanwhile.
"""

from __future__ import annotations

import contextlib
import hashlib
import json
import os
import socket
from dataclasses import dataclass
from datetime import UTC, datetime
from pathlib import Path
from typing import Any

from workup.caseio import CaseFileError, case_from_bytes, case_from_data, case_to_data
from workup.equivalence import same_case
from workup.locking import current_holder, current_user
from workup.model import Case
from workup.storage import Fingerprint, atomic_write_text, make_private_dir, read_with_fingerprint

DRAFT_FORMAT = 1
"""Version of the draft file layout (independent of the case schema inside it)."""
DRAFT_SUFFIX = ".draft.json"


class DraftError(ValueError):
    """A draft file that cannot be read."""


def drafts_folder(create: bool = True) -> Path:
    """The private folder holding drafts (created 0700 when ``create``)."""
    from platformdirs import user_state_path

    folder = user_state_path("workup", appauthor=False) / "drafts"
    return make_private_dir(folder) if create else folder


def case_key(case_path: str | Path) -> Path:
    """The absolute, resolved path that identifies a case across sessions."""
    return Path(os.path.realpath(Path(case_path).expanduser()))


def draft_path(case_path: str | Path) -> Path:
    """Where the draft of ``case_path`` lives."""
    digest = hashlib.sha256(str(case_key(case_path)).encode("utf-8")).hexdigest()[:24]
    return drafts_folder() / f"{digest}{DRAFT_SUFFIX}"


def _checksum(case_data: Any) -> str:
    text = json.dumps(case_data, sort_keys=True, ensure_ascii=False, separators=(",", ":"))
    return hashlib.sha256(text.encode("utf-8")).hexdigest()


@dataclass(frozen=True, slots=True)
class Draft:
    """One draft found on disk."""

    path: Path
    """The draft file."""
    case_path: Path | None
    """The case file the edits belong to (None when the draft is unreadable)."""
    case: Case | None
    """The edited case, or None when the draft could not be read (see ``problem``)."""
    base: Fingerprint | None
    """The case file as it was when the edits began; None for a case not yet saved."""
    written: datetime | None
    """When the draft was last written (UTC)."""
    owner: str
    """``user@host (pid N)`` of the session that wrote it."""
    problem: str | None = None
    """Why the draft cannot be restored, when it cannot."""

    def disk_changed(self) -> bool:
        """Whether the case file differs now from the version the edits started from."""
        if self.case_path is None:
            return False
        now = read_with_fingerprint(self.case_path)
        now_sha = None if now is None else now[1].sha256
        base_sha = None if self.base is None else self.base.sha256
        return now_sha != base_sha

    def same_as_disk(self) -> bool:
        """Whether the draft holds exactly the case now on disk (nothing unsaved in it)."""
        if self.case is None or self.case_path is None:
            return False
        now = read_with_fingerprint(self.case_path)
        if now is None:
            return False
        try:
            return same_case(case_from_bytes(now[0], str(self.case_path)), self.case)
        except CaseFileError:
            return False

    def in_use(self) -> bool:
        """Whether a running session holds the case's lock (its draft is live, not left over)."""
        return self.case_path is not None and current_holder(self.case_path) is not None


def write_draft(case_path: str | Path, case: Case, base: Fingerprint | None) -> Path:
    """Replace the draft of ``case_path`` with ``case`` atomically; returns the draft file."""
    data = case_to_data(case)
    record = {
        "format": DRAFT_FORMAT,
        "case_path": str(case_key(case_path)),
        "base": None if base is None else base.to_json(),
        "written": datetime.now(UTC).isoformat(timespec="microseconds"),
        "owner": f"{current_user()}@{socket.gethostname()} (pid {os.getpid()})",
        "checksum": _checksum(data),
        "case": data,
    }
    path = draft_path(case_path)
    atomic_write_text(path, json.dumps(record, ensure_ascii=False, indent=1))
    return path


def read_draft(path: str | Path) -> Draft:
    """Read one draft file; never raises for a bad draft (``problem`` says what is wrong)."""
    path = Path(path)
    try:
        record = json.loads(path.read_text(encoding="utf-8"))
        if not isinstance(record, dict) or record.get("format") != DRAFT_FORMAT:
            raise DraftError("not a draft of this version of workup")
        case_path = Path(str(record["case_path"]))
        base = Fingerprint.from_json(record.get("base"))
        written = datetime.fromisoformat(str(record["written"]))
        owner = str(record.get("owner", "?"))
    except (OSError, ValueError, KeyError, TypeError, RecursionError) as exc:
        return Draft(path, None, None, None, None, "?", f"unreadable draft: {exc}")
    data = record.get("case")
    try:
        if _checksum(data) != record.get("checksum"):
            return Draft(
                path, case_path, None, base, written, owner, "the draft's checksum is wrong"
            )
        case = case_from_data(data, str(path))
    except (CaseFileError, ValueError, TypeError, RecursionError) as exc:
        return Draft(path, case_path, None, base, written, owner, f"the draft's case: {exc}")
    return Draft(path, case_path, case, base, written, owner)


def list_drafts() -> list[Draft]:
    """Every draft on disk, newest first (unreadable ones included, with their problem)."""
    folder = drafts_folder(create=False)
    if not folder.is_dir():
        return []
    drafts = [read_draft(p) for p in folder.glob(f"*{DRAFT_SUFFIX}") if p.is_file()]
    epoch = datetime.min.replace(tzinfo=UTC)
    drafts.sort(key=lambda d: d.written or epoch, reverse=True)
    return drafts


def pending_drafts() -> list[Draft]:
    """Drafts left by sessions that did not close: what to offer for restoring on start.

    Left out: drafts of cases a running session holds (they are live, not left over) and drafts
    that hold exactly what is on disk (a crash between the save and the draft's removal).
    Unreadable drafts are included so the user hears of them.
    """
    out = []
    for d in list_drafts():
        if d.in_use():
            continue
        if d.case is not None and d.same_as_disk():
            continue
        out.append(d)
    return out


def draft_for(case_path: str | Path) -> Draft | None:
    """The draft of ``case_path``, if one exists."""
    path = draft_path(case_path)
    return read_draft(path) if path.is_file() else None


def set_aside(draft: Draft) -> Draft:
    """Move a draft to a name of its own so a new session's journal cannot overwrite it."""
    stamp = datetime.now(UTC).strftime("%Y%m%dT%H%M%S%fZ")
    target = draft.path.with_name(draft.path.name.replace(DRAFT_SUFFIX, f".{stamp}{DRAFT_SUFFIX}"))
    os.replace(draft.path, target)
    return read_draft(target)


def discard_draft(draft: Draft | Path) -> None:
    """Delete a draft file (after the user chose not to restore it)."""
    path = draft.path if isinstance(draft, Draft) else Path(draft)
    with contextlib.suppress(FileNotFoundError):
        path.unlink()
