"""Which draw of a case to show first: the one that best shows the metabolic acidosis.

A case often holds a baseline draw and a later loading-test draw (bicarbonate, furosemide with
fludrocortisone, ammonium chloride). The loading draw is meant to correct or provoke the acid-base
state, so reading it alone says "no disorder" while the causes, read from every draw, point at an
RTA. Screens and notes that show one draw therefore open on the most recent draw whose own
disorders include a metabolic acidosis and that was not taken during a loading test; without one,
the latest draw. :class:`DrawFocus` also says, in words, why the other draws still matter.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import TYPE_CHECKING

from workup.findings import DrawResult
from workup.model import Case

if TYPE_CHECKING:
    from workup.assess import Assessment

METABOLIC_ACIDOSIS_IDS = frozenset(
    {"normal_gap_metabolic_acidosis", "high_gap_metabolic_acidosis", "metabolic_acidosis"}
)
"""Disorder ids that count as a metabolic acidosis (docs: workup.findings.Disorder)."""

ACIDOSIS = "the acidosis"
"""Reason given when the chosen draw shows a metabolic acidosis."""
LATEST = "the latest draw"
"""Reason given when no untested draw shows one and the latest draw is shown."""


@dataclass(frozen=True, slots=True)
class DrawFocus:
    """The draw chosen for a one-draw view, why, and what the other draws are for."""

    index: int | None
    """Position of the chosen draw in ``case.draws`` (None for a case without draws)."""
    label: str | None
    """Label of the chosen draw (None for a case without draws)."""
    reason: str
    """Why this draw: :data:`ACIDOSIS` or :data:`LATEST`."""
    others: list[tuple[str, str]] = field(default_factory=list)
    """Every other draw as (label, what it is read for), in case order."""

    def sentence(self) -> str:
        """One line naming the shown draw and the part the others play, e.g. for a header."""
        if self.label is None:
            return "no draws yet"
        text = f"findings of draw '{self.label}' ({self.reason})"
        if self.others:
            text += "; " + grouped_roles(self.others, "'")
        return text


# A role said of several draws at once, so three loading samples take one clause, not three.
_PLURAL = {
    "is a loading test, read by the causes": "are loading tests, read by the causes",
    "also shows an acidosis and is read by the causes": (
        "also show an acidosis and are read by the causes"
    ),
    "is read by the causes": "are read by the causes",
}


def grouped_roles(others: list[tuple[str, str]], quote: str) -> str:
    """The other draws' roles in one clause per role, e.g. "'a' and 'b' are loading tests, …"."""
    by_role: dict[str, list[str]] = {}
    for label, role in others:
        by_role.setdefault(role, []).append(f"{quote}{label}{quote}")
    clauses = []
    for role, labels in by_role.items():
        if len(labels) == 1:
            clauses.append(f"{labels[0]} {role}")
        else:
            names = ", ".join(labels[:-1]) + " and " + labels[-1]
            clauses.append(f"{names} {_PLURAL.get(role, role)}")
    return "; ".join(clauses)


def shows_acidosis(result: DrawResult) -> bool:
    """True when the draw's own disorders include a metabolic acidosis."""
    return any(d.id in METABOLIC_ACIDOSIS_IDS for d in result.disorders)


def focus_draw(case: Case, results: list[DrawResult]) -> DrawFocus:
    """The draw of ``case`` that best shows its metabolic acidosis, given every draw's results.

    ``results`` are the per-draw results of :func:`workup.assess.assess` (``Assessment.draws``),
    matched to the draws by label. The most recent draw (in case order) that shows a metabolic
    acidosis and was not taken during a loading test wins; otherwise the latest draw.
    """
    if not case.draws:
        return DrawFocus(None, None, LATEST)
    by_label = {r.label: r for r in results}
    chosen, reason = len(case.draws) - 1, LATEST
    for i in range(len(case.draws) - 1, -1, -1):
        draw = case.draws[i]
        got = by_label.get(draw.label)
        if draw.during is None and got is not None and shows_acidosis(got):
            chosen, reason = i, ACIDOSIS
            break
    others = [
        (
            d.label,
            _role(
                d.during is not None,
                shows_acidosis(by_label[d.label]) if d.label in by_label else False,
            ),
        )
        for j, d in enumerate(case.draws)
        if j != chosen
    ]
    return DrawFocus(chosen, case.draws[chosen].label, reason, others)


def _role(loading: bool, acidosis: bool) -> str:
    # Loading draws answer the test's question; other draws still feed the ranking of causes.
    if loading:
        return "is a loading test, read by the causes"
    if acidosis:
        return "also shows an acidosis and is read by the causes"
    return "is read by the causes"


def focused_assessment(
    case: Case, draw_label: str | None = None, user_overrides: dict[str, float] | None = None
) -> tuple[Assessment, DrawFocus]:
    """The assessment of ``draw_label``, or of the focus draw when none is asked for, with the
    focus (whose sentence a one-draw view shows). Raises KeyError for an unknown draw label."""
    from workup.assess import assess, recentred  # here, so the choice itself needs only results

    a = assess(case, draw_label, user_overrides)
    focus = focus_draw(case, a.draws)
    if draw_label is None and focus.label is not None and focus.label != a.draw_label:
        a = recentred(a, case, focus.label)  # the same numbers, without assessing twice
    return a, focus


def header(a: Assessment, focus: DrawFocus) -> str:
    """The line naming the shown draw of ``a``: the focus sentence, or, for a draw asked for by
    label, that draw and what the focus draw is."""
    if a.draw_label is None or a.draw_label == focus.label:
        return focus.sentence()
    text = f"findings of draw '{a.draw_label}' (as chosen)"
    if focus.label is not None:
        text += f"; '{focus.label}' shows {focus.reason}"
    return text


# The roles in few words, for a header that must keep to one line of a narrow terminal.
_SHORT_ROLE = {
    "is a loading test, read by the causes": ("loading test", "loading tests"),
    "also shows an acidosis and is read by the causes": ("also acidotic", "also acidotic"),
    "is read by the causes": ("other draw", "other draws"),
}


def _short_headers(a: Assessment, focus: DrawFocus) -> list[str]:
    # Each shorter than the one before, all saying the same: which draw is shown and why,
    # and what every other draw is for (by name, then by count). The causes read every draw.
    if a.draw_label is not None and a.draw_label != focus.label:
        shown = f"draw '{a.draw_label}' (as chosen)"
        if focus.label is None:
            return [shown]
        return [f"{shown}; '{focus.label}' shows {focus.reason}"]
    shown = f"draw '{focus.label}' ({focus.reason})"
    by_role: dict[str, list[str]] = {}
    for label, role in focus.others:
        by_role.setdefault(role, []).append(f"'{label}'")
    named, counted = [], []
    for role, labels in by_role.items():
        one, many = _SHORT_ROLE.get(role, (role, role))
        named.append(f"{', '.join(labels)}: {one if len(labels) == 1 else many}")
        counted.append(f"{len(labels)} {many}" if len(labels) > 1 else f"{labels[0]}: {one}")
    if not focus.others:
        return [shown]
    return [
        f"{shown}; {'; '.join(named)}; all read by the causes",
        f"{shown}; {'; '.join(named)}; causes read all",
        f"{shown}; {'; '.join(counted)}; causes read all",
    ]


def fit_words(text: str, width: int) -> str:
    """``text`` cut at a word boundary to ``width`` columns, marked "…" where cut."""
    if len(text) <= width:
        return text
    cut = text[: width - 1].rsplit(" ", 1)[0].rstrip(";,:")
    return cut + "…"


def draw_header(case: Case, a: Assessment, width: int | None = None) -> str | None:
    """The header line of a one-draw view of ``a`` (None when the case has one draw or none,
    where there is nothing to tell apart).

    With ``width``, the line keeps to that many columns: the first of the full wording and two
    shorter ones that fits, else the shortest cut at a word boundary."""
    if len(case.draws) < 2 or a.draw_label is None:
        return None
    focus = focus_draw(case, a.draws)
    text = header(a, focus)
    if width is None or len(text) <= width:
        return text
    shorter = _short_headers(a, focus)
    return next((t for t in shorter if len(t) <= width), fit_words(shorter[-1], width))


def opening_index(case: Case, user_overrides: dict[str, float] | None = None) -> int:
    """Position in ``case.draws`` of the draw a case view opens on (0 for a case without draws)."""
    return opening(case, user_overrides)[0]


def opening(case: Case, user_overrides: dict[str, float] | None = None) -> tuple[int, Assessment]:
    """The draw a case view opens on (as :func:`opening_index`) and the assessment centred on
    it, the case assessed once: a view opening a case needs both."""
    from workup.assess import assess, recentred

    a = assess(case, None, user_overrides)
    if len(case.draws) < 2:
        return max(len(case.draws) - 1, 0), a
    index = focus_draw(case, a.draws).index
    index = len(case.draws) - 1 if index is None else index
    if case.draws[index].label != a.draw_label:
        a = recentred(a, case, case.draws[index].label)
    return index, a
