"""Literal block scalars (``key: |`` and ``key: |-``) for workup.quickread.

Case files keep multi-line notes as literal blocks, the one block scalar style the subset reads.
The rules followed (YAML 1.1 specification, Ben-Kiki, Evans, Ingerson 2005, §9.2 and §9.3, as
PyYAML's scanner applies them): the content's indentation is that of its first line, which must
be deeper than the key's; each content line loses exactly that indentation and keeps any more;
an empty line inside is a line break; the block ends at the first non-empty line indented less.
"Clip" (``|``) keeps one final line break and drops trailing empty lines; "strip" (``|-``) drops
them all. Anything else is declined, conservatively: an indentation or keep indicator, a comment
after the indicator, empty or space-only leading lines, lines holding only spaces, an empty
block, and a block that reaches the end of a text without a final line break.

The pre-pass runs before the block walk: it replaces each header line by a :class:`_Literal`
(the same text, carrying the value) and blanks the content lines, so the walk sees one
``key: value`` line where the file has several.
"""

from __future__ import annotations

from workup.quickread_scalars import _Decline


class _Literal(str):
    """A ``key: |`` header line that carries the value of its block."""

    value: str
    """The block's text, chomped."""

    def rebase(self, text: str) -> _Literal:
        """The same header read from a later column (after a ``- `` item dash)."""
        out = _Literal(text)
        out.value = self.value
        return out


def _is_dash(c: str) -> bool:
    return c[0] == "-" and (len(c) == 1 or c[1] == " ")


def _header(c: str, col: int) -> tuple[int, bool] | None:
    """(key column, strip?) when ``c`` (at ``col``) opens a literal block, else None."""
    if c[-1] != "|" and not c.endswith("|-"):
        return None
    while _is_dash(c):
        if len(c) < 3:
            return None
        rest = c[2:].lstrip(" ")
        col += len(c) - len(rest)
        c = rest
    key, sep, rest = c.partition(": ")
    if not sep or not key:
        return None
    rest = rest.lstrip(" ")
    if rest == "|":
        return col, False
    if rest == "|-":
        return col, True
    return None  # "x: a|", "x: [|]", ... are not headers: the walk reads or declines them


def literals(lines: list[str], ind: list[int], con: list[str | None]) -> None:
    """Fold each literal block into its header line, in place (see the module docstring)."""
    n = len(con)
    i = 0
    while i < n:
        c = con[i]
        if c is None:
            i += 1
            continue
        head = _header(c, ind[i])
        if head is None:
            i += 1
            continue
        key_col, strip = head
        j = i + 1
        if j >= n or not lines[j]:
            raise _Decline  # a leading empty line, or nothing after the header
        first = lines[j]
        depth = len(first) - len(first.lstrip(" "))
        if depth <= key_col or depth == len(first):
            raise _Decline  # an empty block, or a line of spaces only
        body: list[str] = []
        breaks = 0  # empty lines waiting to see whether content follows
        while j < n:
            raw = lines[j]
            if not raw:
                breaks += 1
                j += 1
                continue
            lead = len(raw) - len(raw.lstrip(" "))
            if lead == len(raw):
                raise _Decline  # spaces only: their meaning depends on the indentation
            if lead < depth:
                break
            body.extend([""] * breaks)
            breaks = 0
            body.append(raw[depth:])
            j += 1
        if j == n and breaks == 0:
            raise _Decline  # the text ends inside the block without a final line break
        text = "\n".join(body)
        header = _Literal(c)
        header.value = text if strip else text + "\n"
        con[i] = header
        for k in range(i + 1, j):
            con[k] = None
        i = j
