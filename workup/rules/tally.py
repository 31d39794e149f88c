"""The evidence for and against each cause, as the judge collects it.

:mod:`.judge` adds weighted rules to a :class:`Tally`; :mod:`workup.patterns` sums its weights
into scores and verdicts and sorts its evidence for display.
"""

from __future__ import annotations

from collections.abc import Iterable
from dataclasses import dataclass, field

from workup.findings import Evidence, new_evidence
from workup.rules.causes import PATTERNS
from workup.rules.readings import Reading

Rule = tuple[str, float, str]
"""(pattern id, signed base weight: > 0 for, < 0 against, why in words)."""


@dataclass
class Tally:
    """Evidence collected for and against each pattern."""

    support: dict[str, list[Evidence]] = field(default_factory=lambda: {p: [] for p in PATTERNS})
    """Pattern id → evidence for."""
    against: dict[str, list[Evidence]] = field(default_factory=lambda: {p: [] for p in PATTERNS})
    """Pattern id → evidence against."""
    weights_only: bool = False
    """Keep only the weights (in ``support_w``/``against_w``), not the evidence in words: all a
    caller needs that keeps just the order and the verdicts (the library index)."""
    support_w: dict[str, list[float]] = field(default_factory=lambda: {p: [] for p in PATTERNS})
    """Pattern id → weights for (``weights_only``)."""
    against_w: dict[str, list[float]] = field(default_factory=lambda: {p: [] for p in PATTERNS})
    """Pattern id → weights against (``weights_only``)."""

    def apply(
        self, text: str, rules: Iterable[Rule], factor: float = 1.0,
        index: str | None = None, draw: str | None = None,
    ) -> None:  # fmt: skip
        """Add ``text`` + each rule's reason to its pattern with weight × ``factor``."""
        if self.weights_only:
            for pid, w, _why in rules:
                (self.support_w if w > 0 else self.against_w)[pid].append(abs(w) * factor)
            return
        for pid, w, why in rules:
            ev = new_evidence(f"{text}: {why}" if why else text, index, draw, abs(w) * factor)
            (self.support if w > 0 else self.against)[pid].append(ev)

    def weights(self, pid: str) -> tuple[list[float], list[float]]:
        """The weights for and against ``pid``, heaviest first (the order they are summed in)."""
        if self.weights_only:
            sup, ag = self.support_w[pid], self.against_w[pid]
        else:
            sup = [e.weight for e in self.support[pid]]
            ag = [e.weight for e in self.against[pid]]
        return sorted(sup, reverse=True), sorted(ag, reverse=True)

    def reading(self, r: Reading, rules: Iterable[Rule]) -> None:
        """Apply rules to a reading, with its reliability, index and draw."""
        self.apply(r.text, rules, r.factor, r.index, r.draw)
