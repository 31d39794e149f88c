"""Scalars for workup.quickread: the characters it accepts, the shapes of plain scalars, quoted
scalars and their escapes, and PyYAML's own resolver and constructor that type plain ones.

Pure functions of the text, raising :class:`_Decline` outside the subset; workup.quickread walks
the block and flow structure around them and keeps the memos of their answers.
"""

from __future__ import annotations

import re
from typing import Any

import yaml
from yaml.constructor import SafeConstructor
from yaml.resolver import Resolver


class _Decline(Exception):
    """Internal: the text is outside the subset (or invalid); the caller uses the real loader."""


# Characters YAML 1.1 treats as printable, minus the ones this reader never accepts: tab, CR,
# the extra line breaks NEL (U+0085), LS (U+2028) and PS (U+2029), and a BOM inside the text.
_UNSUPPORTED_CHAR = re.compile(
    "[^\n\x20-\x7e\xa0-\u2027\u202a-\ud7ff\ue000-\ufefe\uff00-\ufffd\U00010000-\U0010ffff]"
)

# A plain scalar may not start with an indicator character (YAML 1.1); "-" followed by a
# letter, digit or dot is the one such start accepted here (negative numbers, "-x").
_START = "(?:[^-?:,\\[\\]{}#&*!|>'\"%@` ]|-[0-9A-Za-z.])"
_BLOCK_PLAIN = re.compile(_START + ".*")
# In a flow collection: no flow indicators, no colon, no "?" (older libyaml ended a plain scalar
# there, from memory), no quotes and no line break inside the scalar.
_FLOW_PLAIN = re.compile(_START + "[^,\\[\\]{}#:?'\"\n]*")
_FLOW_UNSAFE = re.compile("[\\[\\]{}#\"'?]")
_FLOW_PLAIN_RUN = re.compile("[^,\\[\\]{}#:\n]*")
_DOUBLE = re.compile(r'"((?:[^"\\]|\\.)*)"')
_SINGLE = re.compile(r"'((?:[^']|'')*)'")
_ESCAPE = re.compile(r"\\(x[0-9A-Fa-f]{2}|u[0-9A-Fa-f]{4}|U[0-9A-Fa-f]{8}|.)")
# The escapes libyaml 0.2 accepts in a double-quoted scalar: YAML 1.1's and "\/" (from YAML 1.2,
# from memory), each checked against the C loader in the tests.
_ESCAPES = {
    "0": "\x00",
    "a": "\x07",
    "b": "\x08",
    "t": "\t",
    "n": "\n",
    "v": "\x0b",
    "f": "\x0c",
    "r": "\r",
    "e": "\x1b",
    " ": " ",
    '"': '"',
    "/": "/",
    "\\": "\\",
    "N": "\x85",
    "_": "\xa0",
    "L": "\u2028",
    "P": "\u2029",
}
_MAX_KEY = 500
"""libyaml rejects a simple key longer than 1024 characters; keys this long are declined well
before that."""

_RESOLVER = Resolver()
_CONSTRUCTOR = SafeConstructor()
_BUILD = {
    "tag:yaml.org,2002:str": None,
    "tag:yaml.org,2002:null": None,
    "tag:yaml.org,2002:int": _CONSTRUCTOR.construct_yaml_int,
    "tag:yaml.org,2002:float": _CONSTRUCTOR.construct_yaml_float,
    "tag:yaml.org,2002:bool": _CONSTRUCTOR.construct_yaml_bool,
    "tag:yaml.org,2002:timestamp": _CONSTRUCTOR.construct_yaml_timestamp,
}


def _unsupported(text: str) -> bool:
    """True when ``text`` holds a character this reader never accepts (``_UNSUPPORTED_CHAR``).

    Case files are nearly always ASCII, where that means a control character other than the line
    break; str methods tell that without a regular expression visiting every character.
    """
    if text.isascii():
        return not text.replace("\n", "").isprintable()
    return _UNSUPPORTED_CHAR.search(text) is not None


def _plain_value(t: str) -> Any:
    """The value PyYAML's resolver and constructor make of the one-line plain scalar ``t``, whose
    shape the caller has checked (workup.quickread keeps the answer)."""
    tag = _RESOLVER.resolve(yaml.ScalarNode, t, (True, False))
    if tag not in _BUILD:
        raise _Decline  # "<<" (merge), "=" (value) and anything else unusual
    build = _BUILD[tag]
    if build is not None:
        return build(yaml.ScalarNode(tag, t))
    if tag == "tag:yaml.org,2002:null":
        return None
    return t


def _quoted_line(s: str) -> str:
    """A quoted scalar that is the whole rest of the line, but for a trailing comment."""
    value, end = _quoted(s, 0)
    _tail(s, end)
    return value


def _quoted(s: str, pos: int) -> tuple[str, int]:
    """The quoted scalar starting at ``s[pos]`` on one line, and the index after it."""
    if s[pos] == '"':
        m = _DOUBLE.match(s, pos)
        if m is None:
            raise _Decline
        body = m.group(1)
        if "\n" in body:
            raise _Decline
        return (_unescape(body) if "\\" in body else body), m.end()
    m = _SINGLE.match(s, pos)
    if m is None or "\n" in m.group(1):
        raise _Decline
    return m.group(1).replace("''", "'"), m.end()


def _unescape(body: str) -> str:
    parts = _ESCAPE.split(body)
    out = [parts[0]]
    for j in range(1, len(parts), 2):
        code = parts[j]
        if len(code) > 1:
            point = int(code[1:], 16)
            if 0xD800 <= point <= 0xDFFF or point > 0x10FFFF:
                raise _Decline  # libyaml: "found invalid Unicode character escape code"
            out.append(chr(point))
        else:
            char = _ESCAPES.get(code)
            if char is None:
                raise _Decline  # unknown escape (libyaml raises)
            out.append(char)
        out.append(parts[j + 1])
    return "".join(out)


def _tail(s: str, end: int) -> None:
    """After a complete value only spaces, or spaces and a comment, may follow on the line."""
    if end == len(s):
        return
    rest = s[end:]
    if rest[0] != " " or rest.lstrip(" ")[:1] not in ("", "#"):
        raise _Decline


def _ws(s: str, pos: int) -> int:
    while s[pos] == " " or s[pos] == "\n":
        pos += 1
    return pos
