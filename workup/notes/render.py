"""Laying out a note's sections as plain text (80 columns, ASCII punctuation) or markdown."""

from __future__ import annotations

import re
import textwrap
import unicodedata

from workup.model import Case, Draw
from workup.notes.sections import Section
from workup.notes.values import table_rows, when

WIDTH = 80
"""Text notes wrap here so they paste into any record system unchanged."""

# Typographic characters that some record systems mangle on paste, with plain equivalents.
_ASCII = {
    "\u2013": "-",  # en dash
    "\u2014": "-",  # em dash
    "\u2212": "-",  # minus sign
    "\u00d7": "x",
    "\u2265": ">=",
    "\u2264": "<=",
    "\u00b1": "+/-",
    "\u2248": "~",
    "\u2192": "->",
    "\u2190": "<-",
    "\u2018": "'",
    "\u2019": "'",
    "\u201c": '"',
    "\u201d": '"',
    "\u2026": "...",
    "\u00b5": "u",
    "\u03bc": "u",
    "\u00a0": " ",
    "\u00b7": ".",
    "\u2022": "-",
    "\u0394": "delta ",
    "\u03b1": "alpha",
    "\u03b2": "beta",
    "\u03b3": "gamma",
}


def ascii_text(text: str) -> str:
    """``text`` with typographic punctuation made plain and accents dropped from letters."""
    out = []
    for ch in text:
        if ch in _ASCII:
            out.append(_ASCII[ch])
        elif ord(ch) < 128:
            out.append(ch)
        else:
            base = "".join(c for c in unicodedata.normalize("NFKD", ch) if ord(c) < 128)
            out.append(base or ch)
    return "".join(out)


_DATE_TIME = re.compile(r"(\d{4}-\d{2}-\d{2}) (\d{2}:\d{2})")
_KEEP = "\x00"  # stands in for a space that must not become a line break


def _fill(text: str, indent: str = "", hang: str = "") -> list[str]:
    # Never split a signed number or a hyphenated term across lines (it would read as two
    # values), nor a draw's date from its time.
    text = _DATE_TIME.sub(rf"\1{_KEEP}\2", text)
    lines = textwrap.wrap(
        text,
        WIDTH,
        initial_indent=indent,
        subsequent_indent=hang,
        break_on_hyphens=False,
        break_long_words=False,
    )
    return [line.replace(_KEEP, " ") for line in lines]


def render_text(sections: list[Section], case: Case, brief: bool) -> str:
    """The note as plain text: a lead-in per section, blank lines between sections in a consult."""
    lines = _fill(ascii_text(f"Acid-base assessment: {case.label}"))
    if not brief:
        lines.append("")
    for s in sections:
        body = " ".join(s.sentences)
        if s.key == "values" and len(s.items) == 1:
            lines += _fill(ascii_text(f"{s.title}: {' '.join([*s.items, *s.sentences])}"))
            if not brief:
                lines.append("")
            continue
        if s.key == "caution":
            lines += _fill(ascii_text(body))
        elif body:
            lines += _fill(ascii_text(f"{s.title}: {body}"))
        elif s.items:
            lines.append(ascii_text(f"{s.title}:"))
        for item in s.items:
            lines += _fill(ascii_text(item), "- ", "  ")
        if not brief:
            lines.append("")
    while lines and not lines[-1]:
        lines.pop()
    return "\n".join(line.rstrip() for line in lines) + "\n"


def _md_escape(text: str) -> str:
    for ch in ("\\", "*", "_", "`"):
        text = text.replace(ch, "\\" + ch)
    return text


def _cell(text: str) -> str:
    return _md_escape(text).replace("|", "\\|")


def _table(draws: list[Draw], brief: bool) -> list[str]:
    rows = table_rows(draws, brief)
    if not rows:
        return []
    head = ["Value", *(f"{d.label} ({when(d)})" for d in draws)]
    out = [
        "| " + " | ".join(_cell(h) for h in head) + " |",
        "|" + "|".join("---" for _ in head) + "|",
    ]
    for label, cells in rows:
        out.append("| " + " | ".join(_cell(x) for x in (label, *cells)) + " |")
    return out


def render_markdown(sections: list[Section], case: Case, draws: list[Draw], brief: bool) -> str:
    """The note as markdown: a heading, a small table of values, then one heading per section.

    The daily style keeps the table and writes each section as one bold-led paragraph.
    """
    lines = [f"## Acid-base assessment: {_md_escape(case.label)}", ""]
    for s in sections:
        if s.key == "values":
            table = _table(draws, brief)
            lines += [*table, ""] if table else []
            if s.sentences:
                lines += [_md_escape(" ".join(s.sentences)), ""]
            continue
        body = _md_escape(" ".join(s.sentences))
        if s.key == "caution":
            lines += [body, ""]
            continue
        if brief:
            if body:
                lines += [f"**{_md_escape(s.title)}:** {body}", ""]
            for item in s.items:
                lines.append(f"- {_md_escape(item)}")
            if s.items:
                lines.append("")
            continue
        lines += [f"### {_md_escape(s.title)}", ""]
        if body:
            lines += [body, ""]
        for item in s.items:
            lines.append(f"- {_md_escape(item)}")
        if s.items:
            lines.append("")
    while lines and not lines[-1]:
        lines.pop()
    return "\n".join(line.rstrip() for line in lines) + "\n"
