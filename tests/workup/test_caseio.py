"""Loading case files: every bad input gets a one-line error naming the field, never a traceback."""

from __future__ import annotations

import pytest

from workup.caseio import CaseFileError, case_from_bytes, case_from_text, dump_case, load_case

GOOD = """\
schema: 1
label: Test case
units: conventional
draws:
  - label: first
    taken: 2026-11-30T08:15
    serum: {sodium: 138, potassium: 3.1, chloride: 114, bicarbonate: 14,
            urea_nitrogen: 14 mg/dL, creatinine: 1.1 mg/dL}
    blood_gas: {ph: 7.28, pco2: 29 mmHg}
    urine: {sodium: 40, potassium: 30, chloride: 95}
"""


def _problems(text: str) -> list:
    with pytest.raises(CaseFileError) as info:
        case_from_text(text, "case.yaml")
    return info.value.problems


def test_good_file_reads_canonical_values() -> None:
    case = case_from_text(GOOD)
    d = case.draws[0]
    assert d.serum.sodium.canonical == 138
    # 1.1 mg/dL creatinine = 97.2 µmol/L (molar mass 113.12 g/mol; SI conversion 88.4).
    assert d.serum.creatinine.canonical == pytest.approx(97.24, abs=0.05)
    assert d.blood_gas.pco2.canonical == 29


@pytest.mark.parametrize(
    ("text", "field", "fragment", "line"),
    [
        # A typo must not silently drop a value: the nearest known key is suggested.
        (
            GOOD.replace("sodium: 138", "sodum: 138"),
            "draws[0].serum.sodum",
            "did you mean 'sodium'",
            7,
        ),
        (GOOD.replace("label: Test case", "lable: Test case"), "lable", "did you mean 'label'", 2),
        # Impossible values name the field.
        (
            GOOD.replace("sodium: 138", "sodium: 1380"),
            "draws[0].serum.sodium",
            "not a possible sodium",
            7,
        ),
        (GOOD.replace("ph: 7.28", "ph: 74"), "draws[0].blood_gas.ph", "not a possible pH", 9),
        (
            GOOD.replace("chloride: 114", "chloride: -5"),
            "draws[0].serum.chloride",
            "not a possible",
            7,
        ),
        # Ambiguous bare numbers without a unit system are refused, never guessed.
        (
            GOOD.replace("urea_nitrogen: 14 mg/dL", "urea_nitrogen: 14 mmol/L"),
            "draws[0].serum.urea_nitrogen",
            "unknown unit",
            8,
        ),
        (GOOD.replace("schema: 1", "schema: 7"), "schema", "newer than this version", 1),
        (
            GOOD.replace("during", "x").replace("    taken:", "    during: bicarb\n    taken:"),
            "draws[0].during",
            "not one of",
            6,
        ),
    ],
)
def test_bad_field_is_named(text: str, field: str, fragment: str, line: int | None) -> None:
    problems = _problems(text)
    hit = [p for p in problems if p.field == field]
    assert hit, [p.field for p in problems]
    assert fragment in hit[0].message
    if line is not None:
        assert hit[0].line == line


def test_bare_ambiguous_without_units_names_the_fix() -> None:
    problems = _problems(
        GOOD.replace("units: conventional\n", "").replace(" mg/dL", "").replace(" mmHg", "")
    )
    fields = {p.field for p in problems}
    assert {
        "draws[0].serum.urea_nitrogen",
        "draws[0].serum.creatinine",
        "draws[0].blood_gas.pco2",
    } <= fields
    msg = next(p.message for p in problems if p.field == "draws[0].serum.creatinine")
    assert "units: conventional" in msg and "mg/dL" in msg


def test_bun_and_urea_are_different_analytes() -> None:
    si = GOOD.replace("units: conventional", "units: si").replace(
        "urea_nitrogen: 14 mg/dL", "urea: 5.0"
    )
    case = case_from_text(si.replace("creatinine: 1.1 mg/dL", "creatinine: 97"))
    assert case.draws[0].serum.urea.canonical == 5.0
    assert case.draws[0].serum.urea_nitrogen is None
    # BUN has no SI unit: a bare BUN in an SI case is refused with a pointer to `urea:`.
    bad = si.replace("urea: 5.0", "urea_nitrogen: 14")
    msg = next(p.message for p in _problems(bad) if p.field == "draws[0].serum.urea_nitrogen")
    assert "urea:" in msg


@pytest.mark.parametrize(
    ("raw", "fragment"),
    [
        (b"", "empty"),
        (b"- a\n- b\n", "expected a mapping"),
        (b"just text", "expected a mapping"),
        (b"\xff\xfe\x00junk", "not UTF-8"),
        (b"label: x\x00", "NUL"),
        (b"label: !!python/object/apply:os.system ['echo hi']\n", "tags"),
        (b"a: &x [1]\nb: *x\n", "anchors and aliases"),
        (b"label: [unclosed\n", "not valid YAML"),
        (b"label: a\nlabel: b\n", "appears twice"),
        (b"x" * 1_000_001, "too large"),
    ],
)
def test_hostile_or_broken_files_get_one_line_errors(raw: bytes, fragment: str) -> None:
    with pytest.raises(CaseFileError) as info:
        case_from_bytes(raw, "bad.yaml")
    text = str(info.value)
    assert fragment in text
    assert "Traceback" not in text
    assert text.startswith("bad.yaml")


def test_alias_bomb_is_refused_quickly() -> None:
    bomb = "a: &a [x, x, x, x, x, x, x, x, x]\n" + "".join(
        f"{chr(98 + i)}: &{chr(98 + i)} [*{chr(97 + i)}, *{chr(97 + i)}, *{chr(97 + i)}]\n"
        for i in range(8)
    )
    with pytest.raises(CaseFileError, match="aliases"):
        case_from_text(bomb)


def test_unreadable_path(tmp_path) -> None:
    with pytest.raises(CaseFileError, match="cannot read"):
        load_case(tmp_path / "missing.yaml")


def test_dump_round_trips(cases_dir) -> None:
    for path in sorted(cases_dir.glob("*.yaml")):
        case = load_case(path)
        again = case_from_text(dump_case(case))
        assert again == case, path.name


MULTI_LINE_NOTES = [
    # (notes, the header the file should show); YAML 1.1 §9.3 chomping: "|" keeps one final
    # break, "|-" none, "|+" more than one. Text a block cannot hold exactly stays quoted.
    ("Seen on the ward.\nRepeat gas at 14:00: pending.\n", "notes: |\n"),
    ("first line\n  indented # not a comment", "notes: |-\n"),
    ("ends with two breaks\n\n", "notes: |+\n"),
    ("trailing space \nbefore a break", "notes: "),
]


@pytest.mark.parametrize(("notes", "header"), MULTI_LINE_NOTES)
def test_multi_line_notes_are_written_as_literal_blocks(cases_dir, notes, header) -> None:
    case = load_case(sorted(cases_dir.glob("*.yaml"))[0])
    draw = case.draws[0].model_copy(update={"notes": notes})
    case = case.model_copy(update={"notes": notes, "draws": [draw, *case.draws[1:]]})
    text = dump_case(case)
    assert text.count(header) == 2, text  # the case's and the draw's notes
    if header != "notes: ":
        assert notes.splitlines()[0] in text  # the first line as typed, not escaped
    assert case_from_text(text) == case


def test_duplicate_draw_labels_refused() -> None:
    text = GOOD + "  - label: first\n"
    assert any("labelled 'first'" in p.message for p in _problems(text))


def test_case_format_doc_lists_every_analyte_and_flag() -> None:
    from pathlib import Path

    from workup.analytes import all_analytes
    from workup.context import Flag

    doc = (Path(__file__).resolve().parents[2] / "docs" / "case-format.md").read_text()
    missing = [a.label for a in all_analytes() if f"| `{a.key}` |" not in doc]
    missing += [f.value for f in Flag if f"| `{f.value}` |" not in doc]
    assert missing == []


def test_latest_draw_with_and_without_utc_offsets() -> None:
    # One draw written with an offset, one without: comparing them must not raise.
    text = GOOD + "  - label: second\n    taken: 2026-12-01T08:15:00+00:00\n"
    case = case_from_text(text)
    assert case.latest_draw().label == "second"


def test_written_panels_wrap_at_commas_never_inside_a_value(cases_dir) -> None:
    import re

    for path in sorted(cases_dir.glob("*.yaml")):
        text = dump_case(load_case(path))
        assert max(len(line) for line in text.splitlines()) <= 100, path.name
        for line in text.splitlines():
            # A continuation line starts with a key, never with the unit of a split value.
            stripped = line.strip()
            if line.startswith("          ") and stripped:
                assert re.match(r"[a-z_]+: ", stripped), (path.name, line)
