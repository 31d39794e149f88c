"""How many repetitions a benchmark run makes: the full plan of ``make bench`` and a quick one.

The runner hands a :class:`Plan` to every section (bench/sections/); nothing else reads it.
"""

from __future__ import annotations

from dataclasses import dataclass


@dataclass(frozen=True)
class Plan:
    """How many repetitions each section makes."""

    pairs: int
    """Alternating app/baseline pairs in the pty."""
    sweeps: int
    """Recompute sweeps over all demo cases."""
    library_reps: int
    """Repetitions of the library listing benchmark (a fresh process each)."""
    memory_reps: int
    """App starts on the 10,000-case library (the first one with a cold index)."""
    idle_window: float
    """Seconds of idle output measured per run."""
    startup_pairs: int
    """Pairs of each first screen against the minimal app (at least 5: a median of fewer is
    one lucky run)."""


FULL = Plan(pairs=8, sweeps=300, library_reps=3, memory_reps=3, idle_window=1.5, startup_pairs=8)
QUICK = Plan(pairs=3, sweeps=60, library_reps=1, memory_reps=2, idle_window=1.0, startup_pairs=5)
