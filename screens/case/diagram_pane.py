"""The F6 Diagram tab: the shown draw (and the others) on the Davenport diagram.

The screen calls ``plot`` while the tab is visible (the geometry needs numpy, which start-up
should not wait for); the pane places each draw and hands the points to screens/davenport.py.
"""

from __future__ import annotations

from typing import TYPE_CHECKING

from textual.app import ComposeResult

from screens.case.pane_base import WorkspacePane
from screens.davenport import DavenportView
from workup.assess import Assessment
from workup.model import Case, Draw

if TYPE_CHECKING:
    from workup import diagram


def draw_point(d: Draw) -> tuple[diagram.Point | None, str]:
    """Where draw ``d`` sits on the diagram (None: not placed) and which bicarbonate it used."""
    from workup import diagram

    return diagram.point_for(
        d.blood_gas.canonical("ph"),
        d.blood_gas.canonical("bicarbonate"),
        d.serum.canonical("bicarbonate"),
        d.blood_gas.canonical("pco2"),
        d.label,
    )


class DiagramPane(WorkspacePane):
    """The diagram with its legend; nothing in it takes the focus."""

    def __init__(self) -> None:
        super().__init__("F6 Diagram", id="tab-diagram")

    def compose(self) -> ComposeResult:
        """The diagram view (filled by ``plot``)."""
        yield DavenportView(id="davenport")

    def plot(self, case: Case, index: int, assessment: Assessment | None) -> None:
        """Place draw ``index`` of ``case``, the other draws as well, and its gas check."""
        point, source = draw_point(case.draws[index])
        others = tuple(
            p
            for i, d in enumerate(case.draws)
            if i != index and (p := draw_point(d)[0]) is not None
        )
        check = assessment.indices.get("henderson_hasselbalch_ph") if assessment else None
        self.query_one(DavenportView).show(point, source, others, check)
