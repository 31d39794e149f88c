"""Ranking the causes of a normal-gap metabolic acidosis from every draw of a case."""

from __future__ import annotations

from typing import Any

from workup.findings import DrawResult, Ranking
from workup.settings import Settings


def rank(draws: list[DrawResult], case: Any, settings: Settings) -> Ranking:
    """Judge each candidate cause on the whole case; best first."""
    return Ranking([], [], ["pattern ranking not yet available"])
