"""Fuzzing the case loader: any bytes or text either load as a case or raise CaseFileError.

Nothing else may escape (no TypeError, RecursionError, OverflowError, no hang): the app shows a
CaseFileError as a message and would crash on anything else. Inputs: raw bytes, raw text, YAML
built from hostile fragments (tags, anchors and alias bombs, deep nesting, huge and odd numbers,
NULs, non-mappings, duplicate keys) and mutated copies of the invented demo cases.

Set WORKUP_FUZZ_STATS=path to write how many examples each test ran (for docs/reliability.md)
and WORKUP_FUZZ_EXAMPLES=n for a longer run.
"""

from __future__ import annotations

import json
import os
from collections import Counter
from pathlib import Path

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from workup.caseio import CaseFileError, case_from_bytes, case_from_text
from workup.model import Case

CASES = sorted((Path(__file__).resolve().parents[2] / "cases").glob("*.yaml"))
DEMO_TEXTS = [p.read_text(encoding="utf-8") for p in CASES]
RUNS: Counter[str] = Counter()
FUZZ = settings(
    # WORKUP_FUZZ_EXAMPLES raises the count for a long one-off run; the suite stays fast.
    max_examples=int(os.environ.get("WORKUP_FUZZ_EXAMPLES", "300")),
    deadline=None,
    suppress_health_check=[HealthCheck.too_slow, HealthCheck.filter_too_much],
)


def _check(raw: bytes | str) -> None:
    loaders = (
        (case_from_bytes,)
        if isinstance(raw, bytes)
        else (case_from_text, lambda t: case_from_bytes(t.encode("utf-8", "replace")))
    )
    for load in loaders:
        try:
            got = load(raw)
        except CaseFileError as exc:
            assert str(exc)  # a message the user can read
            assert all(p.message for p in exc.problems)
        else:
            assert isinstance(got, Case)


SCALARS = st.sampled_from(
    [
        "1e999999",
        "-1e999999",
        "9" * 5000,
        "9" * 400,
        "0x" + "f" * 400,
        "0o777777777777777777777",
        ".inf",
        "-.inf",
        ".nan",
        "1_000_000",
        "0b1010",
        "190:20:30",
        "~",
        "null",
        "yes",
        "no",
        "2026-13-45",
        "2026-02-30T25:61",
        "'\\x00'",
        '"\\0"',
        '"\\uD800"',
        "!!binary aGVsbG8=",
        "!!python/object/apply:os.system ['true']",
        "!!python/name:os.system",
        "!custom 1",
        "!!set {a, b}",
        "!!omap [a: 1]",
        "!!timestamp 2026-01-01",
        "!!float nope",
        "&a 1",
        "*a",
        "[]",
        "{}",
        "-",
        "?",
        "|",
        ">-\n  folded",
        "'unterminated",
        '"unterminated',
        "\x00",
        "\ufeff",
        "\u2028",
        "12 mg/dL",
        "7.4",
        "-40",
        "1e308 mmol/L",
        "3+",
    ]
)
KEYS = st.sampled_from(
    [
        "schema",
        "label",
        "patient",
        "age",
        "sex",
        "weight",
        "units",
        "context",
        "notes",
        "settings",
        "draws",
        "serum",
        "blood_gas",
        "urine",
        "sodium",
        "ph",
        "taken",
        "during",
        "sample",
        "<<",
        "? complex",
        "1",
        "null",
        "''",
    ]
)


def _yaml_value(depth: int):
    if depth <= 0:
        return SCALARS
    inner = _yaml_value(depth - 1)
    return st.one_of(
        SCALARS,
        st.lists(inner, max_size=4).map(lambda xs: "[" + ", ".join(xs) + "]"),
        st.lists(st.tuples(KEYS, inner), max_size=4).map(
            lambda kv: "{" + ", ".join(f"{k}: {v}" for k, v in kv) + "}"
        ),
    )


DOCUMENTS = st.lists(st.tuples(KEYS, _yaml_value(3)), max_size=8).map(
    lambda kv: "\n".join(f"{k}: {v}" for k, v in kv)
)


def _alias_bomb(levels: int, width: int) -> str:
    lines = ["a0: &a0 [lol]"]
    for i in range(1, levels):
        refs = ", ".join([f"*a{i - 1}"] * width)
        lines.append(f"a{i}: &a{i} [{refs}]")
    return "label: bomb\n" + "\n".join(lines) + "\n"


@FUZZ
@given(st.binary(max_size=3000))
def test_any_bytes(raw):
    RUNS["bytes"] += 1
    _check(raw)


@FUZZ
@given(st.text(max_size=2000))
def test_any_text(text):
    RUNS["text"] += 1
    _check(text)


@FUZZ
@given(DOCUMENTS)
def test_hostile_yaml_documents(doc):
    RUNS["hostile_yaml"] += 1
    _check(doc)
    _check(doc.encode("utf-8", "replace"))


@FUZZ
@given(
    st.sampled_from(range(len(DEMO_TEXTS))),
    st.lists(
        st.tuples(st.integers(0, 3000), st.integers(0, 40), st.text(max_size=20) | SCALARS),
        min_size=1,
        max_size=6,
    ),
)
def test_mutated_demo_cases(which, edits):
    RUNS["mutated_demo"] += 1
    text = DEMO_TEXTS[which]
    for pos, cut, insert in edits:
        pos = pos % (len(text) + 1)
        text = text[:pos] + insert + text[pos + cut :]
    _check(text)


@FUZZ
@given(
    st.sampled_from(range(len(DEMO_TEXTS))),
    st.sampled_from(["serum", "urine", "blood_gas"]),
    KEYS,
    SCALARS,
)
def test_demo_cases_with_a_hostile_value(which, panel, key, value):
    RUNS["hostile_value"] += 1
    text = DEMO_TEXTS[which].replace(f"{panel}: {{", f"{panel}: {{{key}: {value}, ", 1)
    _check(text)


@pytest.mark.parametrize(
    "text",
    [
        "",
        " ",
        "\n\n",
        "\x00",
        "label: x\x00",
        "---\n...\n",
        "--- 1\n--- 2\n",
        "[1, 2]",
        "42",
        "just words",
        "label: a\nlabel: b\n",
        "? [a, b]\n: c\n",
        "label: x\n<<: {a: 1}\n",
        "[" * 5000 + "]" * 5000,
        "{a: " * 5000 + "1" + "}" * 5000,
        "".join("  " * i + "a:\n" for i in range(2000)),
        "label: " + "9" * 100_000,
        "label: x\ndraws: [" + ", ".join(["{label: d}"] * 2000) + "]\n",
        "x" * 1_000_001,
        _alias_bomb(9, 9),
        _alias_bomb(30, 2),
    ],
    ids=lambda t: repr(t[:24]),
)
def test_known_hostile_inputs(text):
    RUNS["named"] += 1
    _check(text)
    _check(text.encode("utf-8", "replace"))


def test_bytes_that_are_not_utf8_or_too_large():
    RUNS["named"] += 3
    for raw in (b"\xff\xfe\x00l\x00a", b"label: \xc3\x28", b"a" * 1_000_001):
        with pytest.raises(CaseFileError):
            case_from_bytes(raw)


HUGE = "label: x\ndraws: [{label: a, serum: {sodium: " + "9" * 400 + "}}]\n"


def test_huge_integer_value_is_a_case_file_error():
    # Found by this fuzzing: float() of a 400-digit integer overflowed out of the loader.
    with pytest.raises(CaseFileError, match="too large"):
        case_from_text(HUGE)


def teardown_module(module):
    out = os.environ.get("WORKUP_FUZZ_STATS")
    if out:
        Path(out).write_text(json.dumps(dict(RUNS), indent=1))
