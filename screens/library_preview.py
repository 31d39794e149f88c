"""The library's preview pane text: the highlighted case's findings, and what a search matched.

Pure functions to rich Text; LibraryScreen (screens/library.py) shows them under the table. The
core is imported on the first preview, not when the library comes up.
"""

from __future__ import annotations

from pathlib import Path
from typing import TYPE_CHECKING

from rich.text import Text

if TYPE_CHECKING:
    from workup.search import Match


def preview_text(path: Path, overrides: dict[str, float]) -> Text:
    """The findings of the case at ``path`` as text: the latest draw's indices with status."""
    from workup.assess import assess
    from workup.caseio import CaseFileError, load_case
    from workup.findings import STATUS_MARK, STATUS_WORD
    from workup.formatting import fmt_value

    out = Text()
    try:
        case = load_case(path)
    except CaseFileError as exc:
        out.append(f"{path.name} did not load\n", style="bold")
        for p in exc.problems[:6]:
            out.append(p.format(path.name) + "\n")
        return out
    a = assess(case, None, overrides)
    out.append(case.label + "\n", style="bold")
    latest = case.latest_draw() if case.draws else None
    when = latest.taken.isoformat(sep=" ", timespec="minutes") if latest and latest.taken else ""
    out.append(f"{len(case.draws)} draw(s); latest: {a.draw_label or 'none'} {when}\n")
    lead = a.leading
    if lead is not None and lead.verdict.value != "unlikely":
        out.append(f"Leading cause: {lead.name} ({lead.verdict.value})\n")
    elif lead is not None:
        out.append(f"No cause is likely or possible; best ranked: {lead.name} (unlikely)\n")
    for note in a.ranking_notes[:1]:
        out.append(note + "\n", style="italic")
    if a.next_tests:
        out.append(f"Next: {a.next_tests[0].text}\n")
    for d in a.disorders[:3]:
        role = "primary" if d.primary else "added"
        out.append(f"{d.name} ({role})\n")
    out.append("Indices of the latest draw   (+ valid, ! caution, x NOT VALID)\n", style="bold")
    for f in a.indices.values():
        if f.value is None:
            continue
        reading = f"  {f.interpretation}" if f.interpretation else ""
        out.append(f" {STATUS_MARK[f.status]} {f.name}: {fmt_value(f)} [{STATUS_WORD[f.status]}]")
        out.append(reading + "\n")
    missing = [f.name for f in a.indices.values() if f.value is None]
    if missing:
        out.append(f" ? needs input: {', '.join(missing)}\n", style="dim")
    return out


def match_header(m: Match) -> Text:
    """The line over the preview naming the draw a value search matched, with its values."""
    from workup.formatting import fmt_number
    from workup.library import status_word

    values = ", ".join(
        f"{f} {fmt_number(v, decimals=2 if abs(v or 0) < 10 else 1)} [{status_word(st)}]"
        for f, v, st in m.values
    )
    return Text(f"Search matched draw {m.draw!r}: {values}\n", style="bold")
