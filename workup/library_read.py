"""Reading one case file for the library by the cheapest reader that is provably equivalent.

The quick reader first, then one libyaml pass; every doubt or failure falls back to the checking
loader (:func:`workup.caseio.load_case`), so the verdict and its message are always the loader's.
Runs in pool workers; the readers are imported on first use.
"""

from __future__ import annotations

import functools
from pathlib import Path
from typing import Any


def _read_case(path: Path | str, size: int | None = None) -> Any:
    """Load the case at ``path`` by the cheapest reader that is provably equivalent.

    First :func:`workup.quickread.parse`, which reads the plain subset case files are written in
    (or declines), then one libyaml pass (compose, then construct from the same node tree). A
    file with ``&``, ``*`` or ``!`` anywhere could hold an anchor, alias or tag, which the
    checking loader must judge; so could anything unusual. Those, and every failure or doubt of
    the lean paths, go through :func:`workup.caseio.load_case`, which raises the canonical error.
    ``size`` is the size the folder scan saw, if known.
    """
    caseio, quickread = _readers()
    limit = caseio.MAX_FILE_BYTES
    raw = None
    if size is None or size <= limit:
        try:
            with open(path, "rb") as fh:
                raw = fh.read()  # sized from the open file; a file that grew is refused below
        except OSError:
            raw = None
    if raw is None or len(raw) > limit or any(c in raw for c in _SUSPECT):
        return caseio.load_case(Path(path))
    try:
        text = raw.decode("utf-8-sig")
    except UnicodeDecodeError:
        return caseio.load_case(Path(path))
    data = quickread.parse(text)
    if isinstance(data, dict):
        try:
            return caseio.case_from_data(data, str(path))
        except caseio.CaseFileError:
            # The message must carry line numbers, which only the checking loader's nodes know.
            return caseio.load_case(Path(path))
    try:
        loader = _lean_loader()(text)
        try:
            node = loader.get_single_node()
            data = _build(node, loader) if node is not None else None
        finally:
            loader.dispose()
    except Exception:  # _Slow, or anything odd: the checking loader decides and words the error
        return caseio.load_case(Path(path))
    if not isinstance(data, dict):
        return caseio.load_case(Path(path))
    return caseio.case_from_data(data, str(Path(path)), node)  # named as load_case names it


@functools.lru_cache(maxsize=1)
def _readers() -> tuple[Any, Any]:
    """The checking loader's module and the quick reader, imported on first use (an unchanged
    listing never needs them)."""
    from workup import caseio, quickread

    return caseio, quickread


_SUSPECT = (b"&", b"*", b"!", b"\x00")


class _Slow(Exception):
    """The lean reader met something only the checking loader may judge."""


@functools.lru_cache(maxsize=1)
def _lean_loader() -> Any:
    """CSafeLoader with a memo on tag resolution (a pure function of kind, text and style)."""
    import yaml

    base = getattr(yaml, "CSafeLoader", yaml.SafeLoader)
    memo: dict[tuple[Any, Any, Any], str] = {}

    class LeanLoader(base):  # type: ignore[misc, valid-type]
        def resolve(self, kind: Any, value: Any, implicit: Any) -> str:
            key = (kind, value, implicit)
            tag = memo.get(key)
            if tag is None:
                tag = super().resolve(kind, value, implicit)
                if len(memo) < 200_000:
                    memo[key] = tag
            return tag

    return LeanLoader


_T = "tag:yaml.org,2002:"
_STR, _INT, _FLOAT, _BOOL, _NULL, _TIME, _MAP, _SEQ = (
    _T + t for t in ("str", "int", "float", "bool", "null", "timestamp", "map", "seq")
)


def _build(node: Any, ctor: Any) -> Any:
    """Plain data from a node tree, as SafeConstructor builds it for the tags a case file uses.

    Raises _Slow for anything else (merge keys, sets, binary, non-string or repeated keys), so
    that the checking loader handles it.
    """
    kind = node.id
    tag = node.tag
    if kind == "scalar":
        if tag == _STR:
            return node.value
        if tag == _INT:
            return ctor.construct_yaml_int(node)
        if tag == _FLOAT:
            return ctor.construct_yaml_float(node)
        if tag == _NULL:
            return None
        if tag == _BOOL:
            return ctor.construct_yaml_bool(node)
        if tag == _TIME:
            return ctor.construct_yaml_timestamp(node)
        raise _Slow(tag)
    if kind == "mapping" and tag == _MAP:
        out: dict[str, Any] = {}
        for k, v in node.value:
            if k.id != "scalar" or k.tag != _STR or k.value in out:
                raise _Slow("key")
            out[k.value] = _build(v, ctor)
        return out
    if kind == "sequence" and tag == _SEQ:
        return [_build(v, ctor) for v in node.value]
    raise _Slow(tag)
