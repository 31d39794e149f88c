"""Where a named value may go, and what to ask when the text does not settle it.

:func:`value_targets` turns a name, its marker ("urine sodium") and the section heading into the
fields the value may fill; :func:`question_kind` and :func:`question_text` word the question the
reading pass (:mod:`workup.paste.reading`) raises when more than one field, unit or doubt remains.
"""

from __future__ import annotations

from workup.analytes import Panel
from workup.labtext.vocabulary import Heading, Identity, NameMatch
from workup.paste.model import PANEL_WORD, SourceLine

Targets = list[tuple[Panel, str]]
"""The (panel, analyte key) fields a value may go to, in the order they are offered."""


def value_targets(
    ident: Identity, name: NameMatch, heading: Heading | None
) -> tuple[Targets, str, str]:
    """(fields the value may go to, a confirmation to ask, or a refusal)."""
    panels = ident.panels
    what = name.spelling

    def key_for(panel: Panel) -> str:
        if ident.co2:
            return "pco2" if panel is Panel.blood_gas else "bicarbonate"
        return ident.key

    def only(panel: Panel, confirm: str = "") -> tuple[list[tuple[Panel, str]], str, str]:
        if panel not in panels:
            return [], "", f"{what!r}: workup records no {PANEL_WORD[panel.value]} value of this"
        return [(panel, key_for(panel))], confirm, ""

    marker = name.marker
    if marker == "urine":
        return only(Panel.urine)
    if marker == "serum":
        return only(Panel.serum)
    if marker in ("gas", "whole_blood"):
        if Panel.blood_gas in panels and not ident.co2:
            return only(Panel.blood_gas)
        if ident.co2:
            return [(Panel.blood_gas, "pco2"), (Panel.serum, "bicarbonate")], "", ""
        return only(Panel.serum, "gas")
    section = heading.panel if heading else None
    if section == "urine_timed":
        return (
            [],
            "",
            "from a timed (24-hour) urine collection: workup takes spot-urine concentrations",
        )
    if section == "urine":
        return only(Panel.urine)
    if section == "serum":
        return only(Panel.serum)
    if section == "blood_gas":
        if ident.co2:
            return [(Panel.blood_gas, "pco2"), (Panel.serum, "bicarbonate")], "", ""
        if Panel.blood_gas in panels:
            return only(Panel.blood_gas)
        return only(Panel.serum, "gas")
    if ident.co2:
        return [(Panel.serum, "bicarbonate"), (Panel.blood_gas, "pco2")], "", ""
    if panels == (Panel.serum,):
        return only(Panel.serum)
    if panels == (Panel.urine,):
        return only(Panel.urine, "urine")
    return [(p, key_for(p)) for p in panels], "", ""


def question_kind(
    ident: Identity, targets: Targets, units_asked: bool, confirm: str, several: bool
) -> str:
    """The :attr:`~workup.paste.model.Question.kind` of the question about one line."""
    if several:
        return "conflict"
    if ident.co2:
        return "co2"
    if len({p for p, _ in targets}) > 1:
        return "panel"
    if confirm:
        return "confirm"
    return "unit" if units_asked else "conflict"


def question_text(
    line: str,
    ident: Identity,
    targets: Targets,
    units_asked: bool,
    confirm: str,
    several: bool,
    src: SourceLine,
) -> str:
    """The question about one line, in words: the line quoted, then each thing to settle."""
    shown = " ".join(line.split())
    if len(shown) > 48:
        shown = shown[:47] + "…"
    head = f"line {src.number} “{shown}”"
    if several:
        return f"{head} holds more than one value: which one belongs to this draw?"
    asks = []
    if ident.co2:
        asks.append(
            "“CO2” may be the total CO2 (serum bicarbonate) or the pCO2 of a blood gas: which is it?"
        )
    if len({p for p, _ in targets}) > 1 and not ident.co2:
        words = " or ".join(PANEL_WORD[p.value] for p, _ in targets)
        asks.append(f"no sample type is given: {words}?")
    if confirm == "gas":
        asks.append("this is from a blood gas report (whole blood): enter it as the serum value?")
    if confirm.startswith("quality:"):
        asks.append(f"the line says “{confirm.split(':', 1)[1]}”: use the value?")
    if confirm == "urine":
        asks.append("workup knows this only in urine, but the line does not say urine: is it?")
    if units_asked:
        asks.append("the number has no unit and no unit system was chosen: which unit?")
    return f"{head}: " + "; ".join(asks)
