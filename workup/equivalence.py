"""When two versions of a case are the same case: equal as they would be written to a file.

pydantic's ``==`` on :class:`workup.model.Case` also compares how each value was typed (a bare
``15`` and ``15 mmol/L`` differ in ``Measurement.bare``), which a file cannot keep apart once
written. Saves, drafts and conflict checks compare what would be stored instead.
"""

from __future__ import annotations

from workup.caseio import case_to_data
from workup.model import Case


def same_case(a: Case | None, b: Case | None) -> bool:
    """Whether ``a`` and ``b`` would be written as the same case file content."""
    if a is None or b is None:
        return a is b
    return a is b or case_to_data(a) == case_to_data(b)
