"""A note never states a value its status forbids, always closes with the caution, and pastes.

Synthetic findings below are invented test values, not published examples; they stand in for
indices with a known status so that the wording around each status is checked directly.
"""

from __future__ import annotations

import dataclasses
from pathlib import Path

import pytest

from workup.assess import Assessment, assess
from workup.caseio import case_from_bytes, load_case
from workup.cautions import CAUTION_TEXT
from workup.cli import main
from workup.findings import Evidence, Finding, PatternCall, Status, Verdict
from workup.formatting import fmt_value
from workup.indices import REGISTRY
from workup.note import draft_note

ROOT = Path(__file__).resolve().parents[2]
CASES = sorted((ROOT / "cases").glob("*.yaml"))
STYLES = ("brief", "full")
FORMATS = ("text", "markdown")


def _with(a: Assessment, *findings: Finding) -> Assessment:
    """``a`` with ``findings`` put in (or replacing) its indices."""
    return dataclasses.replace(a, indices={**a.indices, **{f.id: f for f in findings}})


def _flat(note: str) -> str:
    return " ".join(note.replace("\\", "").split())


@pytest.fixture
def diarrhea():
    case = load_case(ROOT / "cases" / "gi-loss-diarrhea.yaml")
    return case, assess(case)


UAG_NOT_VALID = Finding(
    "urine_anion_gap", "Urine anion gap", 17.0, "mmol/L", Status.not_valid,
    ("urine sodium 8 is below 25: too little distal sodium delivery to read the gap",),
    interpretation="positive",
)  # fmt: skip


@pytest.mark.parametrize("style", STYLES)
@pytest.mark.parametrize("fmt", FORMATS)
def test_not_valid_index_is_not_stated_as_a_finding(diarrhea, style, fmt) -> None:
    case, a = diarrhea
    note = _flat(draft_note(_with(a, UAG_NOT_VALID), case, style, fmt))
    if style == "brief":
        # The short note keeps the caveat's first clause (the fact that makes it not valid).
        assert "UAG was not interpretable (urine sodium 8 is below 25)" in note
    else:
        assert (
            "the urine anion gap was not interpretable (urine sodium 8 is below 25: too little "
            "distal sodium delivery to read the gap)" in note
        )
    assert "17.0" not in note and "+17" not in note
    assert "positive, in keeping with low ammonium" not in note


def test_not_valid_urine_anion_gap_of_a_real_case_is_worded_as_not_interpretable() -> None:
    # Demo I (invented): urine sodium 8, so the urine anion gap must not be read.
    assert any(c.__name__ == "urine_anion_gap" for c in REGISTRY)
    case = load_case(ROOT / "cases" / "gi-loss-low-urine-sodium.yaml")
    a = assess(case)
    uag = a.indices["urine_anion_gap"]
    assert uag.status is Status.not_valid
    for style in STYLES:
        note = _flat(draft_note(a, case, style))
        name = "UAG" if style == "brief" else "urine anion gap"
        assert f"{name} was not interpretable" in note
        assert fmt_value(uag) not in note


@pytest.mark.parametrize("style", STYLES)
def test_caution_index_is_stated_with_its_caveat(diarrhea, style) -> None:
    case, a = diarrhea
    uog = Finding(
        "urine_osmolal_gap", "Urine osmolal gap", 212.0, "mOsm/kg", Status.caution,
        ("unmeasured urine osmoles (mannitol, contrast) may raise the gap",),
        interpretation="adequate",
    )  # fmt: skip
    note = _flat(draft_note(_with(a, uog), case, style))
    stated = (
        "UOG is 212 mOsm/kg (adequate NH4; "
        if style == "brief"
        else "the urine osmolal gap is 212 mOsm/kg (in keeping with adequate ammonium excretion; "
    )
    caveat = "read with caution: unmeasured urine osmoles (mannitol, contrast) may raise the gap)"
    assert stated + caveat in note


@pytest.mark.parametrize("style", STYLES)
@pytest.mark.parametrize("fmt", FORMATS)
def test_needs_input_values_never_appear_as_numbers(diarrhea, style, fmt) -> None:
    case, a = diarrhea
    # Contract breaches on purpose: a needs_input finding that still carries a number, and a
    # not_valid one; neither number may reach the note.
    ttkg = Finding(
        "ttkg", "TTKG", 123.45, "", Status.needs_input, ("enter urine.osmolality",),
        ("urine.osmolality",), interpretation="high",
    )  # fmt: skip
    fe = Finding("fe_bicarbonate", "FEHCO3", 67.89, "%", Status.not_valid, ("not loaded",))
    note = draft_note(_with(a, ttkg, fe), case, style, fmt)
    assert "123" not in note and "67.8" not in note and "67.9" not in note
    if style == "full":  # a daily note leaves out what could not be computed
        assert "TTKG is not available (needs urine osmolality)" in _flat(note)
        assert "fractional excretion of bicarbonate was not interpretable (not loaded)" in _flat(
            note
        )


def test_non_finite_value_is_not_written(diarrhea) -> None:
    case, a = diarrhea
    odd = dataclasses.replace(a.indices["anion_gap"], value=float("nan"))
    note = draft_note(_with(a, odd), case)
    assert "nan" not in note.lower()
    assert "anion gap is not available" in _flat(note)


def _all_notes():
    for path in CASES:
        case = load_case(path)
        a = assess(case)
        for style in STYLES:
            for fmt in FORMATS:
                yield path.stem, style, fmt, case, draft_note(a, case, style, fmt)


def test_every_note_ends_with_the_caution() -> None:
    for stem, style, fmt, _case, note in _all_notes():
        assert _flat(note).endswith(CAUTION_TEXT), (stem, style, fmt)


def test_every_note_says_how_validity_is_marked() -> None:
    # A value stated bare is a valid one (caution values carry their caveat, not-valid ones lose
    # their number); the note must say so, or a reader cannot tell a bare number's status.
    from workup.notes.sections.closing import VALIDITY_LEGEND

    for stem, style, fmt, _case, note in _all_notes():
        assert f"{VALIDITY_LEGEND} {CAUTION_TEXT}" in _flat(note), (stem, style, fmt)


def test_text_notes_are_80_columns_ascii_without_trailing_spaces() -> None:
    for stem, style, fmt, _case, note in _all_notes():
        if fmt != "text":
            continue
        for line in note.splitlines():
            assert len(line) <= 80, (stem, style, line)
            assert line == line.rstrip(), (stem, style, line)
            assert line.isascii(), (stem, style, line)
        assert note.endswith("\n") and not note.endswith("\n\n")


def test_notes_name_the_case_by_label_only() -> None:
    raw = (
        b"schema: 1\nlabel: Bed 4 - invented\nunits: conventional\n"
        b"patient: {age: 57, sex: female}\n"
        b"notes: Mrs Example Person, record 8812345, seen in clinic\n"
        b"draws:\n  - label: one\n    notes: drawn by Dr Somebody\n"
        b"    serum: {sodium: 138, potassium: 4.0, chloride: 110, bicarbonate: 18}\n"
    )
    case = case_from_bytes(raw)
    for style in STYLES:
        for fmt in FORMATS:
            note = draft_note(assess(case), case, style, fmt)
            assert "Bed 4 - invented" in note
            for word in ("Example", "8812345", "Somebody", "57", "female"):
                assert word not in note


def test_every_section_is_present_in_reading_order(diarrhea) -> None:
    case, a = diarrhea
    note = draft_note(a, case, "full")
    leads = ["Values", "Acid-base:", "Gaps:", "Potassium:", "Causes:", CAUTION_TEXT[:20]]
    at = [note.find(x) for x in leads]
    assert -1 not in at and at == sorted(at)


def test_a_case_without_a_gas_says_so_and_suggests_one() -> None:
    raw = (
        b"schema: 1\nlabel: Test - no gas\nunits: conventional\ndraws:\n  - label: one\n"
        b"    serum: {sodium: 138, potassium: 4.0, chloride: 104, bicarbonate: 25}\n"
    )
    case = case_from_bytes(raw)
    note = _flat(draft_note(assess(case), case, "full"))
    assert "No blood gas (pH and pCO2) was entered" in note
    assert "no urine studies were entered" in note


def test_a_case_without_draws_still_drafts_a_note() -> None:
    case = case_from_bytes(b"schema: 1\nlabel: Test - empty\n")
    note = draft_note(assess(case), case, "brief")
    assert "no draws yet" in note
    assert _flat(note).endswith(CAUTION_TEXT)


def test_unknown_style_format_or_case_is_refused(diarrhea) -> None:
    case, a = diarrhea
    with pytest.raises(ValueError, match="style"):
        draft_note(a, case, "long")
    with pytest.raises(ValueError, match="format"):
        draft_note(a, case, "full", "html")
    other = load_case(ROOT / "cases" / "ckd-acidosis.yaml")
    with pytest.raises(ValueError, match="not of the case"):
        draft_note(a, other)


# --- the command line ---------------------------------------------------------------------------


def test_cli_prints_the_note(capsys) -> None:
    path = ROOT / "cases" / "distal-rta-classic.yaml"
    assert main(["note", str(path), "--draw", "baseline", "--style", "brief"]) == 0
    out = capsys.readouterr().out
    case = load_case(path)
    assert out == draft_note(assess(case, "baseline"), case, "brief", "text")
    assert 'Draw: "baseline" (2026-11-20 09:10), the acidosis; "bicarbonate 3 h" is a' in out


def test_cli_markdown(capsys) -> None:
    path = ROOT / "cases" / "gi-loss-diarrhea.yaml"
    assert main(["note", str(path), "--format", "markdown", "--style", "full"]) == 0
    out = capsys.readouterr().out
    assert out.startswith("## Acid-base assessment: Demo A")
    assert "| Value |" in out


def test_cli_bad_draw_exits_2_with_a_message(capsys) -> None:
    path = ROOT / "cases" / "gi-loss-diarrhea.yaml"
    assert main(["note", str(path), "--draw", "day 9"]) == 2
    captured = capsys.readouterr()
    assert captured.out == ""
    assert "no draw labelled 'day 9'" in captured.err


def test_cli_bad_file_exits_2_with_a_message(tmp_path, capsys) -> None:
    bad = tmp_path / "bad.yaml"
    bad.write_text("schema: 1\nlabel: x\ndraws:\n  - label: a\n    serum: {sodium: 1380}\n")
    assert main(["note", str(bad)]) == 2
    captured = capsys.readouterr()
    assert captured.out == "" and "sodium" in captured.err
    assert main(["note", str(tmp_path / "missing.yaml")]) == 2
    assert "cannot read" in capsys.readouterr().err


def test_cli_rejects_an_unknown_style(capsys) -> None:
    with pytest.raises(SystemExit) as exc:
        main(["note", str(ROOT / "cases" / "gi-loss-diarrhea.yaml"), "--style", "long"])
    assert exc.value.code == 2


# --- wording that keeps the note readable without losing a caveat ------------------------------


def test_ascii_text_makes_typographic_punctuation_plain() -> None:
    from workup.notes.render import ascii_text

    assert ascii_text("pH \u2265 7.6 \u2013 \u03b22 \u00d7 2, \u22125, Sj\u00f6gren") == (
        "pH >= 7.6 - beta2 x 2, -5, Sjogren"
    )


def test_a_shared_caveat_is_written_in_full_before_any_as_above(diarrhea) -> None:
    case, a = diarrhea
    why = "an invented caveat shared by two indices"
    ttkg = Finding("ttkg", "TTKG", 2.0, "", Status.caution, (why,), interpretation="low",
                   extra={"kalemia": "hypo"})  # fmt: skip
    ratio = Finding("urine_potassium_creatinine_ratio", "UK/UCr", 1.2, "mmol/mmol",
                    Status.caution, (why,), interpretation="low",
                    extra={"kalemia": "hypo"})  # fmt: skip
    note = _flat(draft_note(_with(a, ttkg, ratio), case, "full"))
    assert note.count(why) == 1
    later = (
        "the urine K/creatinine ratio is 1.2 mmol/mmol (appropriately low for the hypokalemia: "
        "the kidney is conserving potassium; read with caution: as above)"
    )
    assert note.index("TTKG is 2.00") < note.index(why) < note.index(later)


def test_delta_ratio_is_written_only_beside_a_metabolic_acidosis() -> None:
    # Demo G (invented): the low bicarbonate is compensation, so a delta ratio means nothing.
    alk = load_case(ROOT / "cases" / "respiratory-alkalosis-chronic.yaml")
    a = assess(alk)
    assert "delta_ratio" in a.indices
    assert "delta ratio" not in draft_note(a, alk, "full")
    # Demo H (invented): a high-gap acidosis, where the delta ratio is the point.
    mixed = load_case(ROOT / "cases" / "mixed-ketoacidosis-saline.yaml")
    assert "delta ratio is" in _flat(draft_note(assess(mixed), mixed, "brief"))


def test_a_venous_gas_is_named_and_its_caution_kept() -> None:
    raw = (
        b"schema: 1\nlabel: Test - venous gas\nunits: conventional\ndraws:\n  - label: one\n"
        b"    serum: {sodium: 138, potassium: 4.0, chloride: 112, bicarbonate: 16}\n"
        b"    blood_gas: {ph: 7.31, pco2: 34 mmHg, sample: venous}\n"
    )
    case = case_from_bytes(raw)
    for style in STYLES:
        note = _flat(draft_note(assess(case), case, style))
        assert "venous gas pH 7.31" in note
        assert "the gas is venous; the compensation rules were derived on arterial blood" in note


def test_long_evidence_is_shortened_only_after_it_was_written_in_full(diarrhea) -> None:
    case, a = diarrhea
    # Invented evidence: one long reading shared by two causes, as the ranker writes it.
    lead = (
        "urine osmolal gap 250 mOsm/kg (admission) reads ammonium excretion as adequate; "
        "agreeing: urine anion gap -38 mmol/L (admission)"
    )
    calls = [
        PatternCall("gi_bicarbonate_loss", "Gut loss", Verdict.likely, 5.0,
                    (Evidence(f"{lead}: the kidney responds"),)),
        PatternCall("distal_rta", "Distal RTA", Verdict.possible, 1.0,
                    (Evidence("context: none"),), (Evidence(f"{lead}: low ammonium is the defect"),)),
    ]  # fmt: skip
    note = _flat(draft_note(dataclasses.replace(a, patterns=calls, ranking_notes=[]), case))
    assert note.count(lead) == 1
    short = (
        "urine osmolal gap 250 mOsm/kg (admission) reads ammonium excretion as adequate, as "
        "above: low ammonium is the defect"
    )
    assert note.index(lead) < note.index(short)
    brief = _flat(
        draft_note(dataclasses.replace(a, patterns=calls, ranking_notes=[]), case, "brief")
    )
    assert lead not in brief  # the short note keeps only the deciding finding
    assert "reads ammonium excretion as adequate" in brief
    assert "the kidney responds" not in brief


def test_without_a_gas_compensation_is_not_judged_and_no_band_is_given() -> None:
    # Invented values: a low bicarbonate with no gas, so any acidosis is presumed.
    raw = (
        b"schema: 1\nlabel: Test - no gas, low HCO3\nunits: conventional\ndraws:\n"
        b"  - label: one\n"
        b"    serum: {sodium: 138, potassium: 3.0, chloride: 114, bicarbonate: 15,"
        b" albumin: 4.0 g/dL}\n"
    )
    case = case_from_bytes(raw)
    a = assess(case)
    for style in STYLES:
        note = _flat(draft_note(a, case, style))
        assert "compensation is not judged" in note
        assert "expected pCO2" not in note


def test_a_failed_gas_check_is_explained_once() -> None:
    # Invented values that fail Henderson–Hasselbalch (pH 7.29, HCO3 15, pCO2 3.6 kPa).
    from workup.assess import assess
    from workup.caseio import case_from_data
    from workup.note import draft_note

    case = case_from_data(
        {
            "label": "invented",
            "draws": [
                {
                    "label": "a",
                    "serum": {"sodium": 139, "chloride": 117, "bicarbonate": 15},
                    "blood_gas": {"ph": 7.29, "pco2": "3.6 kPa"},
                }
            ],
        }
    )
    note = draft_note(assess(case), case, style="full")
    flat = " ".join(note.split())
    assert flat.count("the gas values do not fit together") == 1
