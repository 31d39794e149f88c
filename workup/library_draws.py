"""Draw values as the library index stores them: the ``draws`` and ``numbers`` columns of a row.

The scan packs each draw's values (workup.library_summary); the index decodes them into
:class:`DrawValues` for search conditions (workup.library_index, workup.search).
"""

from __future__ import annotations

import functools
import json
import math
from array import array
from dataclasses import dataclass, field
from typing import Any

ANALYTE_STATUS_MEASURED = "measured"
"""Status of a measured value inside the usual clinical range."""
ANALYTE_STATUS_UNUSUAL = "unusual"
"""Status of a measured value outside the usual clinical range (accepted, with a caution)."""


@dataclass(frozen=True, slots=True)
class DrawValues:
    """The numbers of one draw as the index stores them, for search conditions."""

    label: str
    """The draw's label."""
    taken: str | None
    """ISO time the draw was taken, if known."""
    during: str | None
    """The loading test under way, if any."""
    values: dict[str, tuple[float | None, str]] = field(default_factory=dict)
    """``panel.analyte`` and index id → (value, status). Analytes: measured/unusual; indices:
    the Finding's status (ok, caution, not_valid, needs_input)."""


# The ``draws`` column holds each draw's label, time, loading test and one status letter per
# stored value (JSON); the ``numbers`` column holds the values themselves as machine doubles,
# after the numbers of their names (see _value_names): writing a float as text costs more than
# the rest of a row, and a cold build writes tens of thousands.
STATUS_CODE = {
    ANALYTE_STATUS_MEASURED: "m",
    ANALYTE_STATUS_UNUSUAL: "u",
    "ok": "o",
    "caution": "c",
    "not_valid": "x",
    "needs_input": "n",
}
"""Stored status → its one-letter code in the index (every Finding status has one)."""
_STATUS_OF_CODE = {c: s for s, c in STATUS_CODE.items()}


@functools.lru_cache(maxsize=1)
def _value_names() -> tuple[tuple[str, ...], dict[str, int]]:
    """Every name a stored value can have (``panel.analyte``, then each index id) and its number.

    Fixed by the code (the catalogue and the calculators), which the index's engine stamp
    covers, so every process of a build numbers them alike.
    """
    from workup.indices import compute_all
    from workup.inputs import DrawInputs

    names = [name for _, analytes in _stored_analytes() for _, name, _, _ in analytes]
    names += [fid for fid in compute_all(DrawInputs()) if fid not in names]
    return tuple(names), {n: i for i, n in enumerate(names)}


@functools.lru_cache(maxsize=1)
def _stored_analytes() -> tuple[tuple[str, tuple[tuple[str, str, float, float], ...]], ...]:
    """For each panel attribute of a draw: (analyte key, stored name, usual low, usual high), in
    catalogue order (the order the index stores values in)."""
    from workup.analytes import CATALOGUE, Panel

    attr = {Panel.serum: "serum", Panel.blood_gas: "blood_gas", Panel.urine: "urine"}
    return tuple(
        (attr[p], tuple((k, f"{p.value}.{k}", *a.usual) for k, a in keys.items()))
        for p, keys in CATALOGUE.items()
    )


class _Draw:
    """One draw's stored values while a row is built: numbers of names, values, status letters."""

    __slots__ = ("codes", "head", "keys", "nums", "other")

    def __init__(self, label: str, taken: str | None, during: str | None) -> None:
        self.head: dict[str, Any] = {"label": label, "taken": taken, "during": during}
        self.keys: list[int] = []
        self.nums: list[float] = []
        self.codes: list[str] = []
        self.other: dict[str, list[Any]] = {}

    def add(self, name: str, value: float | None, status: str) -> None:
        i = _value_names()[1].get(name)
        if i is None:  # not a name the code knows (cannot happen today): keep it as JSON
            self.other[name] = [value, status]
            return
        self.keys.append(i)
        self.nums.append(math.nan if value is None else value)
        self.codes.append(STATUS_CODE[status])


def _pack(draws: list[_Draw]) -> tuple[str, bytes]:
    """The ``draws`` and ``numbers`` columns (the one place that lays them out)."""
    heads = []
    keys, nums = array("H"), array("d")
    for d in draws:
        head = {**d.head, "s": "".join(d.codes)}
        if d.other:
            head["x"] = d.other
        heads.append(head)
        keys.fromlist(d.keys)
        nums.fromlist(d.nums)
    return _COMPACT_JSON.encode(heads), keys.tobytes() + nums.tobytes()


_COMPACT_JSON = json.JSONEncoder(separators=(",", ":"))


def encode_draws(draws: list[dict[str, Any]]) -> tuple[str, bytes]:
    """The ``draws`` and ``numbers`` columns for draws given as dicts with ``label``, ``taken``,
    ``during`` and ``v`` (name → (value, status)), in order."""
    packed = []
    for d in draws:
        pd = _Draw(d["label"], d["taken"], d["during"])
        for name, (value, status) in d["v"].items():
            pd.add(name, value, status)
        packed.append(pd)
    return _pack(packed)


def draws_from_json(text: str | None, numbers: bytes | None = None) -> list[DrawValues]:
    """Decode the ``draws`` and ``numbers`` columns of the index."""
    if not text:
        return []
    heads = json.loads(text)
    total = sum(len(h["s"]) for h in heads)
    keys, nums = array("H"), array("d")
    raw = numbers or b""
    keys.frombytes(raw[: 2 * total])
    nums.frombytes(raw[2 * total :])
    if len(keys) != total or len(nums) != total:
        raise ValueError("the stored numbers do not match the stored draws")
    names, _ = _value_names()
    out, at = [], 0
    for h in heads:
        values: dict[str, tuple[float | None, str]] = {}
        for code in h["s"]:
            v = nums[at]
            values[names[keys[at]]] = (None if math.isnan(v) else v, _STATUS_OF_CODE[code])
            at += 1
        for name, (v, status) in h.get("x", {}).items():
            values[name] = (v, status)
        out.append(DrawValues(h["label"], h.get("taken"), h.get("during"), values))
    return out
