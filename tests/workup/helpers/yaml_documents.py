"""Generated case-like YAML documents for the quickread differential tests.

``document(pick, wild)`` writes a block mapping in the shapes case files take (scalars, flows,
nested blocks, sequences, literal blocks); ``wild`` ones may break any rule of the subset. The
choices come from :class:`Random` (a seed) or :class:`Drawn` (hypothesis, so failures shrink).
All documents are invented.
"""

from __future__ import annotations

import random

from hypothesis import strategies as st

TRICKY = [
    *[
        "yes",
        "no",
        "on",
        "off",
        "y",
        "n",
        "~",
        "null",
        "Null",
        "NULL",
        "true",
        "True",
        "1e3",
        "1.0e+3",
        "0x1F",
        "0o17",
        "017",
        "1_000",
        "12:30",
        "1:20:30",
        "2026-11-20",
        "2026-11-20T09:10",
        ".5",
        "+.inf",
        "-.Inf",
        ".nan",
        "-0",
        "+12",
        "007",
        "3.",
    ],
    "2026-11-20 09:10:00+01:00",
    "a: b",
    "a #b",
    "it's",
    "tab\t",
    "é",
    "50 mg/dL",
    "-",
    "@x",
    "%x",
    "`x",
    "x[1]",
    "{a}",
    "a,b",
    "<<",
    "=",
    "",
    " pad ",
    'say "hi"',
    "back\\slash",
]
KEYS = [
    *[
        "schema",
        "label",
        "patient",
        "age",
        "sex",
        "units",
        "context",
        "notes",
        "draws",
        "taken",
        "during",
        "serum",
        "sodium",
        "potassium",
        "ph",
        "pco2",
        "blood_gas",
        "urea_nitrogen",
        "a",
        "b-c",
        "x.y",
        "k1",
        "é_key",
    ],
    "two words",
]
ALPHABET = "abcXYZ019 ._/+-:#,'\"[]{}!&*|>%@`\\é\t"


class Random:
    """Choices from a seeded random.Random, for deterministic share counts."""

    def __init__(self, seed: int):
        self.rng = random.Random(seed)

    def choice(self, seq):
        return self.rng.choice(seq)

    def chance(self, p: float) -> bool:
        return self.rng.random() < p

    def integer(self, lo: int, hi: int) -> int:
        return self.rng.randint(lo, hi)

    def text(self) -> str:
        return "".join(self.rng.choice(ALPHABET) for _ in range(self.rng.randint(0, 12)))


class Drawn(Random):
    """The same choices drawn by hypothesis, so failures shrink."""

    def __init__(self, data):
        self.data = data

    def choice(self, seq):
        return self.data.draw(st.sampled_from(seq))

    def chance(self, p: float) -> bool:
        return self.data.draw(st.integers(0, 99)) < 100 * p

    def integer(self, lo: int, hi: int) -> int:
        return self.data.draw(st.integers(lo, hi))

    def text(self) -> str:
        return self.data.draw(st.text(st.sampled_from(ALPHABET), max_size=12))


_SAFE_WORD = "abcXYZ019"


def _plain_safe(s: str, flow: bool) -> bool:
    """Conservative: texts any YAML reader takes as one plain scalar (typed values included)."""
    if s in TRICKY:
        return s not in (
            "a: b",
            "a #b",
            "tab\t",
            "-",
            "@x",
            "%x",
            "`x",
            "{a}",
            "<<",
            "=",
            "",
            " pad ",
        ) and (not flow or not any(c in s for c in ":?,[]{}#'\""))
    return (
        bool(s)
        and s[0] in _SAFE_WORD
        and s[-1] in _SAFE_WORD + "."
        and set(s) <= set(_SAFE_WORD + " ._/+-")
    )


def _double(s: str, pick: Random) -> str:
    out = []
    for c in s:
        if c in '"\\':
            out.append("\\" + c)
        elif c == "\t":
            out.append(pick.choice(["\\t", "\\x09", "\\u0009"]))
        elif ord(c) > 127 and pick.chance(0.5):
            out.append(f"\\u{ord(c):04x}")
        else:
            out.append(c)
    return '"' + "".join(out) + '"'


def rogue(pick: Random, wild: bool) -> bool:
    """In a wild document, whether this one choice may break the rules."""
    return wild and pick.chance(0.1)


def scalar(pick: Random, wild: bool, flow: bool) -> str:
    """One scalar written plain, double- or single-quoted."""
    wild = rogue(pick, wild)
    s = pick.choice(TRICKY) if pick.chance(0.6) else pick.text()
    style = pick.choice(["plain", "plain", "double", "single"])
    if not wild and style == "plain" and not _plain_safe(s, flow):
        style = "double"
    if not wild and style == "single" and "\t" in s:
        style = "double"
    if style == "plain":
        return s
    if style == "double":
        return _double(s, pick)
    return "'" + s.replace("'", "''") + "'"


def key(pick: Random, wild: bool, used: set[str]) -> str:
    """A mapping key: from KEYS, and in wild documents sometimes any scalar or a repeat."""
    if wild and pick.chance(0.03):  # quoted or typed keys are declined by design: keep rare
        return scalar(pick, True, flow=False)
    k = pick.choice(KEYS)
    while k in used and not rogue(pick, wild):
        k = k + pick.choice("xyz")
    used.add(k)
    return k


def flow(pick: Random, wild: bool, col: int) -> str:
    """A flow map or sequence, wrapped after commas onto lines deeper than ``col``."""
    is_map = pick.chance(0.65)
    used: set[str] = set()
    items = [
        (f"{key(pick, wild, used)}: " if is_map else "") + scalar(pick, wild, flow=True)
        for _ in range(pick.integer(0, 5))
    ]
    pad = " " if pick.chance(0.2) else ""
    out = "{" if is_map else "["
    for j, item in enumerate(items):
        if j:
            out += ","
            if pick.chance(0.3):
                far = pick.integer(0, col + 4) if rogue(pick, wild) else None
                deeper = pick.integer(col + 1, col + 12) if far is None else far
                out += "\n" + " " * deeper
            else:
                out += " "
        out += pad + item
    return out + pad + ("}" if is_map else "]")


def trailing(pick: Random, wild: bool) -> str:
    """Nothing, or a trailing comment."""
    if not pick.chance(0.2):
        return ""
    if rogue(pick, wild):
        return pick.choice(["#", " #", "  # "]) + "c"
    return pick.choice([" #", "  # x: y"]) + "c"


def block_map(pick: Random, wild: bool, col: int, depth: int) -> list[str]:
    """The lines of a block mapping whose keys sit at column ``col``."""
    lines: list[str] = []
    used: set[str] = set()
    for _ in range(pick.integer(1, 5)):
        if pick.chance(0.1):
            lines.append(" " * pick.integer(0, col + 4) + "# note" if pick.chance(0.6) else "")
        k = " " * col + key(pick, wild, used) + ":"
        kind = pick.choice(["scalar"] * 5 + ["flow"] * 2 + ["empty", "block", "seq", "literal"])
        if kind in ("block", "seq") and depth >= 2:
            kind = "scalar"
        sep = " " * pick.choice([1, 1, 1, 2])
        if kind == "scalar":
            lines.append(k + sep + scalar(pick, wild, flow=False) + trailing(pick, wild))
        elif kind == "flow":
            lines.append(k + sep + flow(pick, wild, col) + trailing(pick, wild))
        elif kind == "empty":
            lines.append(k + trailing(pick, wild))
        elif kind == "literal":
            lines += literal(pick, wild, k + sep, col)
        elif kind == "block":
            lines.append(k + trailing(pick, wild))
            lines += block_map(pick, wild, col + pick.choice([2, 3, 4]), depth + 1)
        else:
            lines.append(k)
            lines += block_seq(pick, wild, col + pick.choice([0, 2, 4]), depth + 1)
        if rogue(pick, wild) and pick.chance(0.3):
            lines.append(pick.choice(["---", "...", "  &a x", "- *a", "!t x: 1", "|", "? k"]))
    return lines


def literal(pick: Random, wild: bool, head: str, col: int) -> list[str]:
    """A literal block scalar under ``head`` (``key:`` plus spaces) whose key sits at ``col``."""
    odd = wild and pick.chance(0.2)
    lines = [head + pick.choice(["|+", "|2", "| #c", ">"] if odd else ["|", "|", "|-"])]
    depth = col + pick.choice([1, 2, 2, 4])
    for n in range(pick.integer(1, 4)):
        if n and pick.chance(0.2):
            lines.append("")
        extra = " " * pick.choice([0, 0, 0, 1, 3]) if n else ""  # the first line sets the depth
        plain = pick.choice(["free text: #1, {x}", "- y", "z"])
        text = pick.text() if wild and pick.chance(0.3) else plain
        lines.append(" " * depth + extra + (text or "t"))
    if wild and pick.chance(0.2):
        lines.append(" " * pick.integer(0, depth + 2))
    return lines


def block_seq(pick: Random, wild: bool, col: int, depth: int) -> list[str]:
    """The lines of a block sequence of scalars, flows and mappings at column ``col``."""
    lines: list[str] = []
    for _ in range(pick.integer(1, 3)):
        dash = " " * col + "-" + " " * pick.choice([1, 1, 3])
        kind = pick.choice(["scalar", "flow", "map", "map"])
        if kind == "scalar":
            lines.append(dash + scalar(pick, wild, flow=False) + trailing(pick, wild))
        elif kind == "flow":
            lines.append(dash + flow(pick, wild, col) + trailing(pick, wild))
        else:
            inner = block_map(pick, wild, len(dash), depth + 1)
            while not inner[0].strip(" ") or inner[0].lstrip(" ").startswith("#"):
                inner.pop(0)  # the item's first key goes on the dash line itself
            lines.append(dash + inner[0].lstrip(" "))
            lines += inner[1:]
    return lines


def document(pick: Random, wild: bool) -> str:
    """A case-like document; ``wild`` ones may break any rule, the others are well formed."""
    lines = ["# Invented case-like document for tests."] if pick.chance(0.5) else []
    lines += block_map(pick, wild, 0, 0)
    text = "\n".join(lines)
    # A literal block at the very end needs its final line break to be read (see DECLINED).
    return text + ("\n" if pick.chance(0.9) or (not wild and "|" in text) else "")
