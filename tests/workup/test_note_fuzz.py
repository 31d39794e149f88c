"""Notes drafted from demo cases (invented scenarios) with values knocked out at random.

Whatever is missing, a note is drafted without error, ends with the caution, keeps text lines
within 80 columns in ASCII, and writes only numbers the assessment reports or values entered.
"""

from __future__ import annotations

import json
from pathlib import Path

import pytest
import yaml
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from workup.assess import assess
from workup.caseio import case_from_bytes
from workup.cautions import CAUTION_TEXT
from workup.note import draft_note
from workup.notes.render import ascii_text

ROOT = Path(__file__).resolve().parents[2]
CASES = sorted((ROOT / "cases").glob("*.yaml"))
PANELS = ("serum", "blood_gas", "urine")

# Reuse the number tracing of the numbers test so both tests apply one rule.
from tests.workup.test_note_numbers import DATE_TIME, json_numbers, numbers  # noqa: E402


def _knock_out(raw: dict, keep: list[bool]) -> dict:
    """``raw`` with the n-th entered value dropped wherever ``keep[n % len(keep)]`` is False."""
    n = 0
    for draw in raw.get("draws", []):
        for panel in PANELS:
            values = draw.get(panel) or {}
            for key in list(values):
                if key == "sample":
                    continue
                if not keep[n % len(keep)]:
                    del values[key]
                n += 1
    return raw


def _entered(raw: dict) -> set[float]:
    out: set[float] = set()
    for draw in raw.get("draws", []):
        for panel in PANELS:
            for v in (draw.get(panel) or {}).values():
                if isinstance(v, int | float) and not isinstance(v, bool):
                    out.add(float(v))
                elif isinstance(v, str):
                    out.update(float(x) for x in numbers(v))
    return out


@pytest.mark.parametrize("path", CASES, ids=lambda p: p.stem)
@settings(max_examples=12, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(keep=st.lists(st.booleans(), min_size=3, max_size=17))
def test_a_note_survives_missing_values(path: Path, keep: list[bool]) -> None:
    raw = _knock_out(yaml.safe_load(path.read_text(encoding="utf-8")), keep)
    case = case_from_bytes(yaml.safe_dump(raw, sort_keys=False).encode())
    a = assess(case)
    reported = json_numbers(json.loads(json.dumps(a.to_json())))
    entered = _entered(raw)
    for style in ("brief", "full"):
        for fmt in ("text", "markdown"):
            note = draft_note(a, case, style, fmt)
            assert " ".join(note.split()).endswith(CAUTION_TEXT)
            if fmt == "text":
                assert all(
                    len(x) <= 80 and x.isascii() and x == x.rstrip() for x in note.split("\n")
                )
            scrubbed = note
            for label in sorted(
                [case.label, *(d.label for d in case.draws)], key=len, reverse=True
            ):
                scrubbed = scrubbed.replace(label, " ").replace(ascii_text(label), " ")
            scrubbed = DATE_TIME.sub(" ", scrubbed)
            stray = [x for x in numbers(scrubbed) if x not in reported and float(x) not in entered]
            assert stray == [], (style, fmt, stray)
