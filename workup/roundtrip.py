"""Saving into a hand-edited case file without losing its comments, key order or number style.

The file on disk is loaded with ruamel.yaml's round-trip loader into a CommentedMap, the new case
data (:func:`workup.caseio.case_to_data`) is merged into it — values changed, keys added and
removed, draws matched by label — and the map is written back. ruamel is told to write YAML 1.1
(``version = (1, 1)``) so that PyYAML, which reads every case, reads the words ``no``/``on`` and
numbers like ``012`` the way ruamel meant them. A value that means the same as before (``7.40`` vs
``7.4``, ``15 mmol/L`` vs a bare ``15`` of the same unit) is left as the user wrote it.

The result is accepted only if :func:`workup.caseio.case_from_text` reads it back to the very same
case; otherwise :class:`RoundTripError` is raised and the caller writes a fresh file instead.
"""

from __future__ import annotations

import io
import re
from datetime import datetime
from typing import Any

from ruamel.yaml import YAML
from ruamel.yaml.comments import CommentedMap, CommentedSeq
from ruamel.yaml.error import YAMLError
from ruamel.yaml.scalarstring import LiteralScalarString

from workup.analytes import CATALOGUE, Panel, UnitSystem, analyte
from workup.caseio import CaseFileError, case_from_text, case_to_data
from workup.equivalence import same_case
from workup.model import Case
from workup.quantity import ValueProblem, read_value

_DIRECTIVE = re.compile(r"\A%YAML 1\.1\n---\n")


class RoundTripError(ValueError):
    """The existing file could not be updated in place; write a fresh one instead."""


def _yaml() -> YAML:
    y = YAML(typ="rt")
    y.version = (1, 1)
    y.preserve_quotes = True
    y.indent(mapping=2, sequence=4, offset=2)
    y.width = 100
    return y


def load_commented(text: str) -> CommentedMap:
    """The round-trip tree of a case file's text; raises RoundTripError if it is not a mapping."""
    try:
        data = _yaml().load(text)
    except (YAMLError, ValueError, TypeError, RecursionError, OverflowError) as exc:
        raise RoundTripError(f"cannot read the file for a comment-keeping save: {exc}") from None
    if not isinstance(data, CommentedMap):
        raise RoundTripError("the file is not a mapping")
    return data


def roundtrip_text(old_text: str, case: Case) -> str:
    """The text of ``old_text`` updated to hold ``case``, keeping comments and order.

    Raises RoundTripError when that is not possible or the result would not read back to
    ``case``.
    """
    tree = load_commented(old_text)
    new = case_to_data(case)
    units = new.get("units")
    system = (
        UnitSystem(units) if isinstance(units, str) and units in UnitSystem.__members__ else None
    )
    try:
        _merge_map(tree, new, (), system)
        out = io.StringIO()
        _yaml().dump(tree, out)
    except (YAMLError, ValueError, TypeError, RecursionError, OverflowError) as exc:
        raise RoundTripError(f"cannot write the merged file: {exc}") from None
    text = out.getvalue()
    if not old_text.lstrip().startswith("%YAML"):
        text = _DIRECTIVE.sub("", text)
    tidy = "\n".join(line.rstrip() for line in text.split("\n"))
    for candidate in (_rewrap_flow(tidy), tidy, text):
        try:
            if same_case(case_from_text(candidate), case):
                return candidate
        except (CaseFileError, OverflowError):
            continue
    raise RoundTripError("the merged file would not read back to the same case")


_FLOW_START = re.compile(r"^(\s*(?:- )?[A-Za-z_][\w]*: )\{(.*)$")
WIDTH = 100
_UNSAFE = set("'\"{}[]#&*!|>%@`")


def _rewrap_flow(text: str) -> str:
    """Re-break one-line panels at commas, continuation aligned after the brace.

    ruamel breaks long flow mappings anywhere, even inside ``420 mg/dL``; this restores the
    layout a person (and caseio's writer) uses. Panels holding quotes are left as they are.
    """
    lines = text.split("\n")
    out: list[str] = []
    i = 0
    while i < len(lines):
        m = _FLOW_START.match(lines[i])
        if not m:
            out.append(lines[i])
            i += 1
            continue
        prefix, body = m.group(1), m.group(2)
        j = i
        while not body.rstrip().endswith("}") and j + 1 < len(lines):
            j += 1
            body += " " + lines[j].strip()
        body = body.rstrip()
        if not body.endswith("}") or any(c in _UNSAFE for c in body[:-1]):
            out.extend(lines[i : j + 1])
            i = j + 1
            continue
        items = [x.strip() for x in body[:-1].split(",")]
        out.extend(_wrap_items(prefix, items))
        i = j + 1
    return "\n".join(out)


def _wrap_items(prefix: str, items: list[str]) -> list[str]:
    indent = " " * (len(prefix) + 1)
    lines: list[str] = []
    current = prefix + "{"
    for n, item in enumerate(items):
        piece = item + ("}" if n == len(items) - 1 else ",")
        fresh = current in (prefix + "{", indent)
        if not fresh and len(current) + 1 + len(piece) > WIDTH:
            lines.append(current)
            current = indent + piece
        else:
            current = current + ("" if fresh else " ") + piece
    lines.append(current)
    return lines


def _flat(data: dict[str, Any]) -> bool:
    # The same rule as caseio's writer: panels and patient on one line, draws in blocks.
    return all(not isinstance(v, dict | list) for v in data.values()) and "label" not in data


def _fresh(value: Any) -> Any:
    """Plain data as ruamel nodes, styled like a freshly written case file."""
    if isinstance(value, dict):
        m = CommentedMap((k, _fresh(v)) for k, v in value.items())
        if _flat(value):
            m.fa.set_flow_style()
        return m
    if isinstance(value, list):
        s = CommentedSeq(_fresh(v) for v in value)
        if all(not isinstance(v, dict | list) for v in value):
            s.fa.set_flow_style()
        return s
    if isinstance(value, str) and "\n" in value:
        return LiteralScalarString(value)
    return value


def _same_scalar(old: Any, new: Any, path: tuple[Any, ...], system: UnitSystem | None) -> bool:
    if isinstance(old, dict | list) or isinstance(new, dict | list):
        return False
    if isinstance(old, bool) or isinstance(new, bool) or old is None or new is None:
        return type(old) is type(new) and old == new
    both_text = isinstance(old, str) and isinstance(new, str)
    both_numbers = isinstance(old, int | float) and isinstance(new, int | float)
    if (both_text or both_numbers) and old == new:
        return True
    if len(path) == 3 and path[0] == "draws" and path[2] == "taken":
        return _same_time(old, new)
    measured = _measured(path)
    return measured is not None and _same_measurement(measured, old, new, system)


def _same_time(old: Any, new: Any) -> bool:
    # "2026-11-20 09:10" and "2026-11-20T09:10" are the same moment; keep how it was written.
    try:
        a = old if isinstance(old, datetime) else datetime.fromisoformat(str(old))
        b = new if isinstance(new, datetime) else datetime.fromisoformat(str(new))
    except ValueError:
        return False
    return (a.tzinfo is None) == (b.tzinfo is None) and a == b


def _measured(path: tuple[Any, ...]) -> tuple[Panel, str] | None:
    # draws[i].<panel>.<analyte>
    if len(path) == 4 and path[0] == "draws" and path[2] in Panel.__members__:
        panel = Panel(path[2])
        if path[3] in CATALOGUE[panel]:
            return panel, path[3]
    return None


def _same_measurement(
    where: tuple[Panel, str], old: Any, new: Any, system: UnitSystem | None
) -> bool:
    a = analyte(*where)
    try:
        m_old = read_value(a, old, system)
        m_new = read_value(a, new, system)
    except (ValueProblem, ValueError, TypeError, OverflowError):
        return False
    return (m_old.value, m_old.unit, m_old.word) == (m_new.value, m_new.unit, m_new.word)


def _merge_value(old: Any, new: Any, path: tuple[Any, ...], system: UnitSystem | None) -> Any:
    """The value to store: ``old`` updated in place where possible, else a fresh node."""
    if isinstance(old, CommentedMap) and isinstance(new, dict):
        _merge_map(old, new, path, system)
        return old
    if isinstance(old, CommentedSeq) and isinstance(new, list):
        return _merge_seq(old, new, path, system)
    if _same_scalar(old, new, path, system):
        return old
    return _fresh(new)


def _merge_map(
    old: CommentedMap, new: dict[str, Any], path: tuple[Any, ...], system: UnitSystem | None
) -> None:
    for key in [k for k in old if k not in new]:
        del old[key]
    previous: str | None = None
    for key, value in new.items():
        if key in old:
            merged = _merge_value(old[key], value, (*path, key), system)
            if merged is not old[key]:
                old[key] = merged
        else:
            keys = list(old)
            pos = keys.index(previous) + 1 if previous in old else 0
            old.insert(pos, key, _fresh(value))
        previous = key


def _label(item: Any) -> Any:
    return item.get("label") if isinstance(item, dict) else None


def _merge_seq(
    old: CommentedSeq, new: list[Any], path: tuple[Any, ...], system: UnitSystem | None
) -> CommentedSeq:
    old_labels = [_label(x) for x in old]
    new_labels = [_label(x) for x in new]
    labelled = all(lb is not None for lb in old_labels + new_labels)
    if labelled:
        kept = [lb for lb in old_labels if lb in new_labels]
        if kept != [lb for lb in new_labels if lb in old_labels]:
            return _fresh_like(old, new)  # draws were reordered: comments cannot follow them
        for i in reversed(range(len(old))):
            if old_labels[i] not in new_labels:
                del old[i]
        for i, item in enumerate(new):
            if i < len(old) and _label(old[i]) == _label(item):
                merged = _merge_value(old[i], item, (*path, i), system)
                if merged is not old[i]:
                    old[i] = merged
            else:
                old.insert(i, _fresh(item))
        return old
    if len(old) != len(new):
        return _fresh_like(old, new)
    for i, item in enumerate(new):
        merged = _merge_value(old[i], item, (*path, i), system)
        if merged is not old[i]:
            old[i] = merged
    return old


def _fresh_like(old: CommentedSeq, new: list[Any]) -> CommentedSeq:
    seq = _fresh(new)
    if old.fa.flow_style():
        seq.fa.set_flow_style()
    elif all(not isinstance(v, dict | list) for v in new):
        seq.fa.set_block_style()
    return seq
