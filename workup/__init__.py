"""workup: the domain core of a terminal workup of metabolic acidosis (decision support only).

This package never imports Textual or ``screens``; the terminal app in ``screens/`` builds on it.
"""

from __future__ import annotations

__version__ = "0.1.0"
