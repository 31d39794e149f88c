"""Applying every cause's table to a case: history first, then each answer in turn.

The tables of :mod:`workup.rules.causes` are turned once, at import, into one rule list per
context flag and per (question, answer); :func:`judge` walks the case's answers from
:mod:`.questions` and adds each matching rule to a :class:`~workup.rules.tally.Tally`.
"""

from __future__ import annotations

from workup.acidbase.wording import fmt
from workup.context import MEANING, SAME_AS, Flag
from workup.rules.ammonium import AmmoniumCall, ammonium
from workup.rules.cause import NoHistory
from workup.rules.causes import CAUSES
from workup.rules.questions import answers
from workup.rules.readings import Readings
from workup.rules.tally import Rule, Tally
from workup.settings import Settings


def _by_flag() -> dict[Flag, list[Rule]]:
    out: dict[Flag, list[Rule]] = {}
    for c in CAUSES:
        for flag, (w, why) in c.history.items():
            out.setdefault(flag, []).append((c.id, w, why))
    return out


def _by_answer() -> dict[tuple[str, str], list[Rule]]:
    out: dict[tuple[str, str], list[Rule]] = {}
    for c in CAUSES:
        for key, (w, why) in c.answers.items():
            out.setdefault(key, []).append((c.id, w, why))
    return out


FLAG_RULES: dict[Flag, list[Rule]] = _by_flag()
"""Context flag → the rule of each cause it bears on; built once, not per case."""
ANSWER_RULES: dict[tuple[str, str], list[Rule]] = _by_answer()
"""(question, answer) → the rule of each cause it bears on; built once, not per case."""
QUOTING: frozenset[tuple[str, str]] = frozenset(
    key for key, rules in ANSWER_RULES.items() if any("{" in why for _, _, why in rules)
)
"""The answers with a rule whose reason quotes a setting (see :func:`quote_settings`)."""
NO_HISTORY: tuple[tuple[str, NoHistory], ...] = tuple(
    (c.id, c.no_history) for c in CAUSES if c.no_history is not None
)
"""(cause id, its rule for a history that records none of its usual settings)."""


class _SettingsWords(dict[str, str]):
    """A setting's value by name, as an evidence sentence writes it."""

    def __init__(self, s: Settings):
        super().__init__()
        self.s = s

    def __missing__(self, name: str) -> str:
        return fmt(getattr(self.s, name))


def quote_settings(why: str, s: Settings) -> str:
    """A rule's reason with each ``{setting}`` replaced by that setting's value, so a reason can
    name a cut-off the user may change (e.g. ``"below {egfr_ckd_below}"``)."""
    return why.format_map(_SettingsWords(s))


def _history(t: Tally, flags: frozenset[Flag]) -> None:
    """Context flags: the history a fellow entered (weights in docs/ranking.md)."""
    for flag in sorted(flags, key=str):
        if SAME_AS.get(flag) in flags:
            continue  # an older flag set with the one it is read as counts once
        for rule in FLAG_RULES.get(flag, []):
            t.apply(f"history: {MEANING[flag]}", [rule])
    for pid, rule in NO_HISTORY:
        if not flags & rule.flags:
            t.apply(rule.text, [(pid, rule.weight, rule.why)])


def judge(
    rd: Readings, s: Settings, weights_only: bool = False
) -> tuple[Tally, AmmoniumCall | None]:
    """Apply every rule to the readings; returns the tally and the ammonium call."""
    t = Tally(weights_only=weights_only)
    _history(t, rd.context)
    nh4 = ammonium(rd, s)
    for key, r in answers(rd, nh4, s):
        rules = ANSWER_RULES.get(key)
        if not rules:
            continue
        if key in QUOTING and not weights_only:
            rules = [(pid, w, quote_settings(why, s)) for pid, w, why in rules]
        t.apply(r.text, rules, r.factor, r.index, r.draw)
    return t, nh4
