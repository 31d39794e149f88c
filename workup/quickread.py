"""A strict, fast reader for the small, regular subset of YAML that case files are written in.

:func:`parse` returns exactly what ``yaml.load(text, Loader=yaml.CSafeLoader)`` returns (same
types, values and key order), or ``None`` meaning "not sure, use the real loader". It never
raises and never returns a different value: anything outside the subset it knows is declined.

The reference is PyYAML's behaviour over libyaml (the C loader), which follows the YAML 1.1
specification (Ben-Kiki, Evans, Ingerson, 2005): implicit typing of plain scalars is not
re-implemented here but asked of PyYAML's own resolver (``yaml.resolver.Resolver``) and built by
PyYAML's own ``SafeConstructor`` methods, memoised per scalar text because both are pure
functions of it. The differential tests in ``tests/workup/test_quickread.py`` are the
specification of the rest.

The subset: a top-level block mapping at column 0; nested block mappings by indentation; block
sequences (``- item``, ``- key: value`` with further keys lined up under the first); one-level flow
mappings ``{k: v}`` and flow sequences ``[a, b]`` as values, possibly continued on following
lines indented deeper than their key; full-line and trailing `` #`` comments; ``key:`` with
nothing after it; single-line plain, double-quoted and single-quoted scalars; literal block
scalars with clip or strip chomping (``key: |``, ``key: |-``; workup.quickread_literal). Keys are
plain scalars that resolve to ``str``. Declined (``None``): tags, anchors, aliases, folded blocks
and literal blocks with any other header,
document markers, directives, complex keys, tabs, CR or any non-printable character,
multi-line scalars, nested flow collections, comments or blank lines inside a flow collection,
trailing commas, duplicate keys at any level, non-string keys, and anything that fits no rule.

This module walks the block and flow structure and keeps the memos; the scalars themselves
(accepted characters, quoting and escapes, implicit typing) are read in workup.quickread_scalars.
"""

from __future__ import annotations

import re
from typing import Any

from workup.quickread_literal import _is_dash, _Literal, literals
from workup.quickread_scalars import (
    _BLOCK_PLAIN,
    _FLOW_PLAIN,
    _FLOW_PLAIN_RUN,
    _FLOW_UNSAFE,
    _MAX_KEY,
    _Decline,
    _plain_value,
    _quoted,
    _quoted_line,
    _tail,
    _unsupported,
    _ws,
)

# Re-exported (the ``x as x`` form says so): the tests check _unsupported against it here.
from workup.quickread_scalars import _UNSUPPORTED_CHAR as _UNSUPPORTED_CHAR

__all__ = ["parse"]

# The memos and their limit live here, beside every function that fills them.
_CACHE_LIMIT = 4096
"""Entries per memo before it is emptied: a library of 10,000 files holds mostly unique lines
(labels, times), and the memos must not grow with it; the values that repeat come back at once."""


# Memos: each maps a piece of text to what it reads as, or raises. All values are immutable.
_SCALARS: dict[str, Any] = {}
_LINES: dict[str, tuple[int, Any, Any]] = {}
_MAP_ITEMS: dict[str, tuple[str, Any]] = {}
_SEQ_ITEMS: dict[str, Any] = {}
_KEYS: dict[str, str] = {}

_SCALAR, _OPEN, _FLOW = 0, 1, 2


def parse(text: str) -> Any | None:
    """What ``yaml.load(text, Loader=CSafeLoader)`` returns, or None to say "use the loader"."""
    try:
        return _parse(text)
    except Exception:  # any surprise means "not sure"; never a wrong value
        return None


def _parse(text: str) -> Any | None:
    if _unsupported(text) or text.startswith(("---", "...", "%")):
        return None
    if "\n---" in text or "\n..." in text:
        return None
    lines = text.split("\n")
    ind: list[int] = []
    con: list[str | None] = []
    add_ind, add_con = ind.append, con.append
    for line in lines:
        s = line.lstrip(" ")
        if s and s[0] != "#":
            add_ind(len(line) - len(s))
            add_con(s.rstrip(" ") if s[-1] == " " else s)
        else:
            add_ind(0)
            add_con(None)
    if "|" in text:
        literals(lines, ind, con)
    n = len(con)
    i = 0
    while i < n and con[i] is None:
        i += 1
    if i == n or ind[i] != 0:
        return None  # empty (the loader says None too) or not a mapping at column 0
    out, i = _block_map(ind, con, i, n, 0)
    if i != n:
        return None
    return out


def _skip(con: list[str | None], i: int, n: int) -> int:
    while i < n and con[i] is None:
        i += 1
    return i


def _block_map(
    ind: list[int], con: list[str | None], i: int, n: int, indent: int
) -> tuple[dict[str, Any], int]:
    out: dict[str, Any] = {}
    lines_memo = _LINES
    while True:
        while i < n and con[i] is None:
            i += 1
        if i >= n or ind[i] < indent:
            return out, i
        if ind[i] > indent:
            raise _Decline  # a continuation line or a stray deeper block
        c = con[i]
        entry = lines_memo.get(c)  # type: ignore[arg-type]
        if entry is None:
            # A literal header is never in the memo: _map_line declines "k: |" and "k: |-".
            if type(c) is _Literal:
                entry = (_SCALAR, _key(c.partition(": ")[0]), c.value)
            else:
                entry = _map_line(c)  # type: ignore[arg-type]
        kind, key, payload = entry
        if key in out:
            raise _Decline
        i += 1
        if kind == _SCALAR:
            out[key] = payload
        elif kind == _FLOW:
            out[key], i = _flow(payload, ind, con, i, n, indent)
        else:
            j = _skip(con, i, n)
            if j < n and ind[j] > indent:
                if _is_dash(con[j]):  # type: ignore[arg-type]
                    out[key], i = _block_seq(ind, con, j, n, ind[j])
                else:
                    out[key], i = _block_map(ind, con, j, n, ind[j])
            elif j < n and ind[j] == indent and _is_dash(con[j]):  # type: ignore[arg-type]
                # A sequence may sit at its key's own indentation (as dump_case writes draws:).
                out[key], i = _block_seq(ind, con, j, n, indent)
            else:
                out[key] = None


def _block_seq(
    ind: list[int], con: list[str | None], i: int, n: int, indent: int
) -> tuple[list[Any], int]:
    out: list[Any] = []
    while True:
        while i < n and con[i] is None:
            i += 1
        if i >= n or ind[i] < indent:
            return out, i
        if ind[i] > indent:
            raise _Decline
        c: str = con[i]  # type: ignore[assignment]
        if not _is_dash(c):
            return out, i  # the enclosing block decides whether this line belongs to it
        if len(c) < 3:
            raise _Decline  # "-" alone: an item whose block starts on the next line
        s = c[2:].lstrip(" ")
        col = indent + len(c) - len(s)
        first = s[0]
        if first == "#" or _is_dash(s):
            raise _Decline
        if first == "{" or first == "[":
            value, i = _flow(s, ind, con, i + 1, n, indent)
        elif first == '"' or first == "'":
            value = _quoted_line(s)
            i += 1
        else:
            h = s.find(" #")
            t = s if h < 0 else s[:h].rstrip(" ")
            if ": " in t or t.endswith(":"):
                # "- key: value": the item is a mapping whose keys line up with this first one.
                ind[i] = col
                con[i] = c.rebase(s) if type(c) is _Literal else s
                value, i = _block_map(ind, con, i, n, col)
            else:
                value = _plain(t, _BLOCK_PLAIN)
                i += 1
        out.append(value)


def _map_line(c: str) -> tuple[int, Any, Any]:
    """Read one ``key: value`` line (indentation removed): what kind of value, the key, the rest."""
    k, sep, rest = c.partition(": ")
    if not sep:
        if not c.endswith(":"):
            raise _Decline
        k, rest = c[:-1], ""
    key = _key(k)
    rest = rest.lstrip(" ")
    if not rest or rest[0] == "#":
        entry: tuple[int, Any, Any] = (_OPEN, key, None)
    elif rest[0] == "{" or rest[0] == "[":
        return (_FLOW, key, rest)  # long and nearly always unique: not worth keeping
    elif rest[0] == '"' or rest[0] == "'":
        entry = (_SCALAR, key, _quoted_line(rest))
    else:
        h = rest.find(" #")
        entry = (_SCALAR, key, _plain(rest if h < 0 else rest[:h].rstrip(" "), _BLOCK_PLAIN))
    _remember(_LINES, c, entry)
    return entry


def _key(k: str) -> str:
    key = _KEYS.get(k)
    if key is not None:
        return key
    if not k or len(k) > _MAX_KEY or k[-1] in " :" or " #" in k or k.startswith("..."):
        raise _Decline
    key = _plain(k, _BLOCK_PLAIN)
    if type(key) is not str:
        raise _Decline  # yes:, null:, 1: and the like are not string keys
    _remember(_KEYS, k, key)
    return key


def _plain(t: str, shape: re.Pattern[str]) -> Any:
    """The value of a one-line plain scalar, as PyYAML's resolver and constructor make it."""
    if shape is _BLOCK_PLAIN and (": " in t or t.endswith(":") or " #" in t):
        raise _Decline
    if not shape.fullmatch(t):
        raise _Decline
    try:
        return _SCALARS[t]
    except KeyError:
        pass
    value = _plain_value(t)
    _remember(_SCALARS, t, value)
    return value


def _remember(memo: dict[str, Any], text: str, value: Any) -> None:
    if len(memo) >= _CACHE_LIMIT:
        memo.clear()
    memo[text] = value


def _flow(
    s: str, ind: list[int], con: list[str | None], i: int, n: int, indent: int
) -> tuple[Any, int]:
    """A flow collection starting at ``s`` (line i-1), continued on deeper lines; (value, next i)."""
    close = "}" if s[0] == "{" else "]"
    while close not in s:
        s, i = _next_flow_line(s, ind, con, i, n, indent)
    end = s.find(close)
    body = s[1:end]
    if _FLOW_UNSAFE.search(body) is None:
        _tail(s, end + 1)
        if close == "}":
            return _flow_map_simple(body), i
        return _flow_seq_simple(body), i
    while True:
        try:
            value, end = _flow_scan(s, close)
            break
        except IndexError:  # the text ran out before the collection closed (a quoted "}")
            s, i = _next_flow_line(s, ind, con, i, n, indent)
    _tail(s, end)
    return value, i


def _next_flow_line(
    s: str, ind: list[int], con: list[str | None], i: int, n: int, indent: int
) -> tuple[str, int]:
    if i >= n:
        raise _Decline
    c = con[i]
    if c is None or ind[i] <= indent or type(c) is _Literal:
        raise _Decline  # a blank or comment line inside, a line not indented deeper, a block
    return s + "\n" + c, i + 1


def _flow_map_simple(body: str) -> dict[str, Any]:
    items = body.split(",")
    if len(items) == 1 and not body.strip(" \n"):
        return {}
    out: dict[str, Any] = {}
    memo = _MAP_ITEMS
    for item in items:
        kv = memo.get(item)
        if kv is None:
            kv = _flow_map_item(item)
        out[kv[0]] = kv[1]
    if len(out) != len(items):
        raise _Decline  # a duplicate key
    return out


def _flow_map_item(item: str) -> tuple[str, Any]:
    k, sep, v = item.partition(": ")
    if not sep:
        raise _Decline  # "{a}", "{a:1}", "{a:\n1}", an empty item (trailing comma)
    kv = (_flow_key(k.lstrip(" \n")), _plain(v.strip(" \n"), _FLOW_PLAIN))
    _remember(_MAP_ITEMS, item, kv)
    return kv


def _flow_key(k: str) -> str:
    if not k or len(k) > _MAX_KEY or k[-1] == " ":
        raise _Decline
    key = _plain(k, _FLOW_PLAIN)
    if type(key) is not str:
        raise _Decline
    return key


def _flow_seq_simple(body: str) -> list[Any]:
    items = body.split(",")
    if len(items) == 1 and not body.strip(" \n"):
        return []
    out: list[Any] = []
    memo = _SEQ_ITEMS
    for item in items:
        try:
            out.append(memo[item])
        except KeyError:
            value = _plain(item.strip(" \n"), _FLOW_PLAIN)
            _remember(memo, item, value)
            out.append(value)
    return out


def _flow_scan(s: str, close: str) -> tuple[Any, int]:
    """A flow collection with quoted scalars, read token by token; (value, index after it)."""
    is_map = close == "}"
    out: Any = {} if is_map else []
    pos = _ws(s, 1)
    if s[pos] == close:
        return out, pos + 1
    while True:
        if is_map:
            m = _FLOW_PLAIN_RUN.match(s, pos)
            key = _flow_key(m.group())  # type: ignore[union-attr]
            pos = m.end()  # type: ignore[union-attr]
            if s[pos] != ":" or s[pos + 1] != " " or key in out:
                raise _Decline
            pos = _ws(s, pos + 2)
        if s[pos] == '"' or s[pos] == "'":
            value, pos = _quoted(s, pos)
        else:
            m = _FLOW_PLAIN_RUN.match(s, pos)
            value = _plain(m.group().rstrip(" "), _FLOW_PLAIN)  # type: ignore[union-attr]
            pos = m.end()  # type: ignore[union-attr]
        if is_map:
            out[key] = value
        else:
            out.append(value)
        pos = _ws(s, pos)
        if s[pos] == close:
            return out, pos + 1
        if s[pos] != ",":
            raise _Decline
        pos = _ws(s, pos + 1)
        if s[pos] == close:
            raise _Decline  # a trailing comma
