"""Differential tests of workup.quickread against PyYAML's C loader, which is the specification.

The reference is ``yaml.load(text, Loader=yaml.CSafeLoader)``: PyYAML 6 over libyaml 0.2, which
follows the YAML 1.1 specification (Ben-Kiki, Evans, Ingerson, 2005). For every input,
``parse(x)`` must be None or equal to what the loader returns, with the same types at every level
(True is not 1, 1 is not 1.0) and the same key order; where the loader raises, parse returns None.
Separate tests check that case files and well-formed case-like documents are not declined, so a
reader that always said "not sure" would fail. All documents here are invented.
"""

from __future__ import annotations

import math
import random
from datetime import date, datetime
from pathlib import Path
from typing import Any

import pytest
import yaml
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from bench.library_bench import _templates, case_text
from bench.varied_library import case_text as varied_case_text
from tests.workup.helpers.yaml_documents import ALPHABET, Drawn, Random, document
from workup import quickread
from workup.caseio import dump_case, load_case
from workup.quickread import parse

CASES = sorted((Path(__file__).resolve().parents[2] / "cases").glob("*.yaml"))
CASE_TEXTS = [p.read_text(encoding="utf-8") for p in CASES]
VARIED_TEXTS = [varied_case_text(i) for i in range(8)]
"""Case files shaped unlike the demo cases: comments, SI units, literal-block notes."""
FAST = settings(
    deadline=None, suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large]
)


def _load(text: str) -> tuple[bool, Any]:
    try:
        return True, yaml.load(text, Loader=yaml.CSafeLoader)
    except Exception:  # the loader refusing the text is an outcome, not a test error
        return False, None


def same(a: Any, b: Any) -> bool:
    """Equal values of identical types all the way down, dict keys in the same order."""
    if type(a) is not type(b):
        return False
    if isinstance(a, dict):
        return len(a) == len(b) and all(
            type(ka) is type(kb) and ka == kb and same(va, vb)
            for (ka, va), (kb, vb) in zip(a.items(), b.items(), strict=True)
        )
    if isinstance(a, list):
        return len(a) == len(b) and all(same(x, y) for x, y in zip(a, b, strict=True))
    if isinstance(a, float):
        if math.isnan(a) or math.isnan(b):
            return math.isnan(a) and math.isnan(b)
        return a == b and math.copysign(1.0, a) == math.copysign(1.0, b)
    if isinstance(a, datetime | date):
        # Aware datetimes at the same instant compare equal across offsets; the text does not.
        return a.isoformat() == b.isoformat()
    return a == b


def check(text: str) -> Any:
    """The contract for one input; returns what parse gave."""
    got = parse(text)
    ok, want = _load(text)
    if not ok:
        assert got is None, f"loader raises but parse gave {got!r} for {text!r}"
    elif got is not None:
        assert same(got, want), f"parse gave {got!r}, loader {want!r} for {text!r}"
    return got


def accepted(text: str) -> None:
    """The contract, and parse must not decline."""
    assert check(text) is not None, f"declined: {text!r}"


def test_same_tells_types_apart():
    assert not same({"a": True}, {"a": 1})
    assert not same([1], [1.0])
    assert not same(0.0, -0.0)
    assert same(float("nan"), float("nan"))
    assert not same({"a": 1, "b": 2}, {"b": 2, "a": 1})
    assert not same(
        datetime.fromisoformat("2026-11-20T09:10:00+01:00"),
        datetime.fromisoformat("2026-11-20T08:10:00+00:00"),
    )


# --- the case files the project writes ---------------------------------------------------------


@pytest.mark.parametrize("path", CASES, ids=[p.stem for p in CASES])
def test_demo_case_files(path):
    accepted(path.read_text(encoding="utf-8"))


@pytest.mark.parametrize("path", CASES, ids=[p.stem for p in CASES])
def test_dump_case_output(path):
    accepted(dump_case(load_case(path)))


def test_generated_library_texts():
    templates = _templates()
    rng = random.Random(20261202)
    for i in range(400):
        accepted(case_text(templates[i % len(templates)], i, rng))


@pytest.mark.parametrize("index", range(len(VARIED_TEXTS)))
def test_varied_library_texts(index):
    # The varied bench library writes notes as literal blocks; each file must be read, not declined.
    accepted(VARIED_TEXTS[index])


def test_results_are_fresh_objects():
    # Memoised pieces must never leak shared mutable containers between calls.
    text = CASE_TEXTS[0]
    first, second = parse(text), parse(text)
    assert first is not second and first["draws"] is not second["draws"]
    first["draws"][0]["serum"]["sodium"] = -1
    assert parse(text)["draws"][0]["serum"]["sodium"] == 140


def test_memo_is_bounded(monkeypatch):
    monkeypatch.setattr(quickread, "_CACHE_LIMIT", 8)
    for i in range(50):
        accepted(f"a{i}: {i}\nb: {{x: {i} mg/dL, y{i}: z}}\nc: [{i}, w{i}]\n")
    memos = (quickread._SCALARS, quickread._MAP_ITEMS, quickread._LINES, quickread._KEYS)
    assert max(len(m) for m in memos) <= 8


# --- named inputs ------------------------------------------------------------------------------

ACCEPTED = {
    "comments everywhere": "# top\na: 1  # trailing\n  # indented comment\nb: x # c: d\n",
    "key with nothing": "a:\nb: # only a comment\nc: 2\n",
    "nested block": "a:\n  b:\n     c: 1\n  d: [x, y]\ne: 2\n",
    "sequence at the key's indent": "a:\n- 1\n- x\nb: 2\n",
    "sequence indented": "a:\n    - 1\n    - {p: q}\n",
    "sequence of maps": "d:\n  - label: x\n    taken: 2026-11-20T09:10\n  -   k: 1\n      j: 2\n",
    "list in a list item's map": "x:\n- a:\n  - b\n",
    "wrapped flow map": "s: {a: 1, b: 2,\n       c: 3,\n    d: 4}  # end\n",
    "wrapped flow seq": "s: [a,\n  b]\n",
    "empty flows": "a: {}\nb: [ ]\nc: { }\n",
    "flow spacing": "a: { x: 1 , y: 2 }\nb: [ 1 ,2 ]\n",
    "quoted": "a: \"x: y #z\"\nb: 'it''s'\nc: \"\" # e\nd: ''\n",
    "quoted in flow": "a: {b: \"x, y\", c: 'p}q', d: 2}\nb: ['a]', \"b\"]\n",
    "escapes": 'a: "\\u00e9\\t\\x41\\\\\\"\\/\\U0001F600"\n',
    "typed values": "a: yes\nb: ~\nc: 0x1F\nd: 12:30\ne: 2026-11-20\nf: .nan\ng: -.Inf\nh: 3.\n",
    "timestamp with zone": "a: 2026-11-20 09:10:00+01:00\n",
    "brackets inside block plain": "a: x[1]{2}, y\nb[1]: c\n",
    "colon inside block plain": "a: http://x:80/y\nb:c: d\n",
    "non-ASCII": "é: ü ß\nb: {ç: 中文}\n",
    "no final newline": "a: 1",
    "extra spaces after colon": "a:    1\nb:   {c:   2}\n",
    "dash-led plain": "a: -5\nb: -x\n-c: 1\n",
    # Literal block scalars, YAML 1.1 §9.2-9.3: clip keeps one final break, strip none.
    "literal block": "a: |\n  x\n",
    "literal strip": "a: |-\n  x\n  y\nb: 1\n",
    "literal keeps deeper indentation": "a: |\n  x\n    y\n  z\n",
    "literal with empty lines": "a: |\n  x\n\n  y\n\n\nb: 2\n",
    "literal holds what would be syntax": "a: |\n  # not a comment\n  k: {v, [w\n  - 'q\n",
    "literal in a nested map": "a:\n  b: |\n     x\n  c: 1\n",
    "literal in a list item": "d:\n- notes: |\n    x\n  k: 2\n- notes: |-\n    y\n",
    "literal then a comment at the key's column": "a: |\n  x\n# c\nb: 1\n",
    "literal with trailing spaces on a line": "a: |\n  x  \n  y\n",
    "literal header with spaces after": "a:   |  \n  x\n",
}


@pytest.mark.parametrize("text", ACCEPTED.values(), ids=ACCEPTED.keys())
def test_accepted_inputs(text):
    accepted(text)


DECLINED = {
    # The constructs the subset leaves out, named as in the YAML 1.1 specification; whether
    # the loader accepts each one or not, this reader must say "not sure".
    "tag": "a: !!str 1\n",
    "local tag": "a: !x y\n",
    "anchor": "a: &x 1\nb: 2\n",
    "alias": "a: 1\nb: *x\n",
    "folded block": "a: >\n  x\n",
    "literal keep": "a: |+\n  x\n\n",
    "literal indentation indicator": "a: |2\n   x\n",
    "literal comment after header": "a: | # c\n  x\n",
    "literal leading empty line": "a: |\n\n  x\n",
    "literal line of spaces": "a: |\n  x\n   \n  y\n",
    "literal empty": "a: |\nb: 1\n",
    "literal not deeper": "a:\n  b: |\n  x\n",
    "literal at the end without a break": "a: |\n  x",
    "literal as a sequence item": "a:\n- |\n  x\n",
    "literal inside a flow": "a: [x,\n  b: |\n    y]\n",
    "literal less indented line": "a:\n    b: |\n        x\n      c: 1\n",
    "document start": "---\na: 1\n",
    "document end": "a: 1\n...\n",
    "document start later": "a: 1\n---\nb: 2\n",
    "directive": "%YAML 1.1\n---\na: 1\n",
    "complex key": "? a\n: 1\n",
    "tab indentation": "a:\n\tb: 1\n",  # tabs
    "tab in value": "a: x\ty\n",
    "carriage return": "a: 1\r\nb: 2\r\n",
    "NUL": "a: x\x00\n",
    "BOM inside": "a: \ufeffx\n",
    "line separator": "a: x\u2028y\n",
    "multi-line plain": "a: b\n  c\n",
    "multi-line plain in seq": "a:\n- b\n  c\n",
    "multi-line plain in flow": "a: {b: x\n  y}\n",
    "multi-line quoted": 'a: "x\n  y"\n',
    "multi-line single": "a: 'x\n  y'\n",
    "blank line in flow": "a: {b: 1,\n\n  c: 2}\n",
    "comment line in flow": "a: {b: 1,\n  # c\n  c: 2}\n",
    "trailing comment in flow": "a: {b: 1, # c\n  c: 2}\n",
    "continuation not deeper": "a: {b: 1,\nc: 2}\n",
    "nested flow": "a: {b: [1, 2]}\n",
    "nested flow in seq": "a: [1, {b: 2}]\n",
    "trailing comma": "a: {b: 1, }\n",
    "trailing comma seq": "a: [1, 2,]\n",
    "flow value on the next line": "s: {a:\n  1}\n",
    "flow key without value": "a: {b, c: 1}\n",
    "colon in flow plain": "a: {t: 12:30}\n",
    "question mark in flow plain": "a: [x?y]\n",
    "duplicate top key": "a: 1\na: 2\n",  # the project's loader rejects duplicates
    "duplicate nested key": "a:\n  b: 1\n  b: 2\n",
    "duplicate flow key": "a: {b: 1, b: 2}\n",
    "duplicate quoted flow key": "a: {b: 'x', b: 2}\n",
    "duplicate key in item": "d:\n- k: 1\n  k: 2\n",
    "int key": "1: x\n",  # keys PyYAML's resolver types as non-str
    "bool key": "yes: x\n",
    "null key": "null: x\n",
    "tilde key": "~: x\n",
    "date key": "2026-11-20: x\n",
    "float key in flow": "a: {1.5: x}\n",
    "merge key": "a: {b: 1}\n<<: {c: 2}\n",
    "value tag key": "=: 1\n",
    "quoted key": '"a": 1\n',
    "top-level sequence": "- a\n- b\n",
    "top-level scalar": "just text\n",
    "indented top level": "  a: 1\n",
    "value then deeper key": "a: 1\n  b: 2\n",
    "mapping value inside value": "a: b: c\n",
    "nested sequence item": "a:\n- - x\n",
    "dash alone": "a:\n-\n  b: 1\n",
    "dash as a value": "a: -\n",
    "surrogate escape": 'a: "\\ud83d\\ude00"\n',
    "unknown escape": 'a: "it\\\'s"\n',
    "short hex escape": 'a: "\\x4"\n',
    "junk after quote": 'a: "x" y\n',
    "comment glued to quote": 'a: "x"#c\n',
    "junk after flow": "a: {b: 1} x\n",
    "unclosed flow": "a: {b: 1\n",
    "invalid date": "a: 2026-13-45\n",
    "empty document": "# nothing\n",
}


@pytest.mark.parametrize("text", DECLINED.values(), ids=DECLINED.keys())
def test_declined_inputs(text):
    check(text)  # the contract holds whatever the loader does ...
    assert parse(text) is None  # ... and this reader says "not sure"


# Each escape libyaml accepts, and some it refuses, checked against the loader itself.
ESCAPES = [*'0abtnvfre N_LP/\\"', "x41", "xe9", "u00e9", "U0001F600", "u0000", "ufeff", "x9f"]


@pytest.mark.parametrize("code", ESCAPES)
def test_each_escape(code):
    accepted(f'a: "<\\{code}>"\n')


@pytest.mark.parametrize("code", ["'", "q", "x4", "xZZ", "ud800", "udfff", "U00110000", "u12"])
def test_refused_escapes(code):
    text = f'a: "<\\{code}>"\n'
    check(text)
    assert parse(text) is None


# --- generated case-like documents -------------------------------------------------------------

# The generator lives in tests/workup/helpers/yaml_documents.py.


@settings(FAST, max_examples=250)
@given(st.data())
def test_generated_documents_hold_the_contract(data):
    check(document(Drawn(data), wild=True))


@settings(FAST, max_examples=150)
@given(st.data())
def test_well_formed_documents_are_read(data):
    accepted(document(Drawn(data), wild=False))


def test_share_of_generated_documents_read():
    # Wild documents break a rule now and then; most still fit the subset and must be read.
    docs = [document(Random(seed), wild=True) for seed in range(300)]
    read = sum(check(d) is not None for d in docs)
    assert read >= 0.5 * len(docs), f"only {read} of {len(docs)} read"
    well = [document(Random(seed), wild=False) for seed in range(300)]
    assert all(check(d) is not None for d in well)


# --- mutations of valid files ------------------------------------------------------------------

MUTATION_POOL = [*":,{}[]#'\"- \n\t&*!|", "  ", "\n  ", "0", "x", "\\", "é"]
SOURCES = [
    *CASE_TEXTS,
    *VARIED_TEXTS[:3],
    dump_case(load_case(CASES[1])),
    case_text(_templates()[1], 7, random.Random(7)),
]


@settings(FAST, max_examples=800)
@given(st.data())
def test_mutated_case_files_hold_the_contract(data):
    text = data.draw(st.sampled_from(SOURCES))
    for _ in range(data.draw(st.integers(1, 3))):
        pos = data.draw(st.integers(0, len(text)))
        op = data.draw(st.sampled_from(["insert", "delete", "substitute"]))
        piece = data.draw(st.sampled_from(MUTATION_POOL))
        if op == "insert":
            text = text[:pos] + piece + text[pos:]
        elif op == "delete":
            text = text[:pos] + text[pos + 1 :]
        else:
            text = text[:pos] + piece + text[pos + 1 :]
    check(text)


@settings(FAST, max_examples=100)
@given(st.text(st.sampled_from(ALPHABET + "\n\r\x00\x85\u2028"), max_size=60))
def test_any_text_holds_the_contract(text):
    check(text)


@settings(max_examples=300, deadline=None)
@given(st.text(alphabet=st.characters(max_codepoint=0x7F), max_size=60))
def test_the_ascii_character_check_agrees_with_the_full_pattern(text: str) -> None:
    """The fast test for ASCII text refuses exactly what the full character class refuses."""
    assert quickread._unsupported(text) == bool(quickread._UNSUPPORTED_CHAR.search(text))
    assert quickread._unsupported(text + "é") == bool(quickread._UNSUPPORTED_CHAR.search(text))
