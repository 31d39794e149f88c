"""Where the benchmarks find the repository and its demo cases, and where results are written."""

from __future__ import annotations

from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
"""The repository (the benchmarks run the tree they sit in)."""
RESULTS = ROOT / "bench" / "results" / "latest.json"
"""Every sample of the last full run, as JSON."""
DEMO_CASES = ROOT / "cases"
"""The invented demo cases the terminal and recompute figures open."""
