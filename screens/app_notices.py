"""What the app says when it opens a case: the wording of its messages and questions.

Pure functions from a session, an error or a draft to text, so the flow in screens/app_cases.py
reads as steps and each wording can be checked without a running app.
"""

from __future__ import annotations

from collections.abc import Sequence
from typing import TYPE_CHECKING, NamedTuple

from textual.notifications import SeverityLevel

if TYPE_CHECKING:
    from screens.persistence import CaseSession, Draft
    from workup.caseio import Problem

MAX_PROBLEMS_SHOWN = 5
"""A broken file can have dozens of problems; a message box shows the first few and a count."""


class Notice(NamedTuple):
    """One message box: the arguments of ``App.notify``."""

    message: str
    """The text of the box."""
    title: str
    """Its title line."""
    severity: SeverityLevel
    """information, warning or error (sets its colour)."""
    timeout: float
    """Seconds before it closes by itself."""


def case_file_problems(problems: Sequence[Problem], name: str) -> str:
    """The first problems of the case file ``name``, one a line, and how many more there are."""
    shown = "\n".join(p.format(name) for p in problems[:MAX_PROBLEMS_SHOWN])
    extra = len(problems) - MAX_PROBLEMS_SHOWN
    more = f"\n(+{extra} more)" if extra > 0 else ""
    return f"{shown}{more}"


def session_notices(session: CaseSession) -> list[Notice]:
    """The warnings due when ``session`` has been opened: a stale lock taken over, open folders."""
    notices = []
    if session.lock is not None and session.lock.note:
        notices.append(Notice(session.lock.note, "Stale lock taken over", "warning", 20))
    if session.privacy:
        # One toast, not one per warning: the folder's chmod alone already shuts others
        # out; every warning with its command is on the case's help screen (F1).
        first = session.privacy[0]
        more = len(session.privacy) - 1
        tail = f"\n(+{more} more warning{'s' if more != 1 else ''}: F1)" if more else ""
        tail += "\nctrl+d closes this message"
        notices.append(Notice(first.format() + tail, "Case folder not private", "warning", 30))
    return notices


def banner_text(session: CaseSession) -> str:
    """One line for the case screen's banner: each warning in a few words with its fix, F1 for
    the full text ("" when there is nothing to say). A banner, not a toast: nothing may cover the
    findings while the fellow reads them."""
    parts = []
    if session.lock is not None and session.lock.note:
        parts.append("stale lock taken over (a session ended without closing)")
    if session.privacy:
        more = len(session.privacy) - 1
        extra = f" (+{more} more)" if more else ""
        parts.append(f"others can read this case: {session.privacy[0].command}{extra}")
    return ("! " + "; ".join(parts) + "  F1: details") if parts else ""


def read_only_question(name: str, exc: Exception) -> str:
    """The question asked when the case file ``name`` is held by another session (``exc``)."""
    holder = getattr(exc, "holder", None)
    who = holder.describe() if holder else "another session (its details are unreadable)"
    return f"{name} is open in {who}.\nOpen it read-only here (no edits, no saving), or cancel?"


def pending_edits_question(name: str, draft: Draft) -> str:
    """The question asked when the case file ``name`` has left-over edits (``draft``)."""
    from screens.recovery import draft_line

    return (
        f"Unsaved edits of {name} were left by a session that did not close:\n"
        + draft_line(draft).plain
        + "\nRestore them (still unsaved until you save), discard them, or decide later?"
    )
