"""The closing sections: ``next_tests`` (tests to suggest), ``caveats`` and ``caution``.

They end the note in this order; only the standing caution is written in every note.
"""

from __future__ import annotations

from workup.cautions import CAUTION_LINES, CAUTION_TEXT
from workup.findings import Status
from workup.notes import phrases as ph
from workup.notes.sections.context import Context, Section


def next_tests_section(c: Context) -> Section:
    """The suggested tests, most useful first (only the first in a short note)."""
    s = Section("next_tests", "Next" if c.brief else "Suggested next")
    tests = c.a.next_tests[:1] if c.brief else c.a.next_tests
    if c.brief:
        if tests:
            # One sentence per test: a test's own text may hold a semicolon, and some start
            # with a name (Fanconi, Anti-Ro) that must keep its capital.
            s.sentences.extend(ph.sentence(ph.tidy(t.text)) for t in tests)
        return s
    for t in tests:
        s.items.append(f"{ph.tidy(t.text)}: {ph.tidy(t.why)}." if t.why else ph.sentence(t.text))
    return s


def caveats_section(c: Context) -> Section:
    """Case-specific cautions (entered values, gas sample) not already stated above."""
    s = Section("caveats", "Caveats")
    standing = set(CAUTION_LINES)
    # The assessment also lists the first reason of every not-valid index; those that matter
    # were stated beside their index, and the rest (a compensation rule that does not apply to
    # this disorder) would only crowd the note.
    index_reasons = {
        ph.tidy(f.reasons[0])
        for f in c.a.indices.values()
        if f.status is Status.not_valid and f.reasons
    }
    for text in c.a.cautions:
        if text in standing or ph.tidy(text) in c.said or ph.tidy(text) in index_reasons:
            continue
        s.sentences.append(ph.sentence(ph.tidy(text)))
    return s


VALIDITY_LEGEND = "Values without a caveat met their validity conditions."
"""How the note marks validity, so that no number reads without its status."""


def caution_section(c: Context) -> Section:
    """The standing caution that closes every note, with how validity is marked."""
    return Section("caution", "Caution", [f"{VALIDITY_LEGEND} {CAUTION_TEXT}"])
