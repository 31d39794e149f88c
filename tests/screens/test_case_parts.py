"""The seams of the case screen's parts (screens/case/): the helpers each module holds and the
draw form's bookkeeping of refused text, checked without running the app."""

from __future__ import annotations

from datetime import datetime
from pathlib import Path

from screens.case.draw_pane import DrawPane, draw_options, same_measurement
from screens.case.draws import fresh_draw
from screens.case.field_help import FORM_KEYS, field_help
from screens.case.file_actions import save_as_target, saved_message
from screens.entry import FieldReading, ValueField, read_field
from workup.analytes import Panel
from workup.model import Case, Draw, LoadingTest
from workup.quantity import Measurement
from workup.session import SaveResult
from workup.storage import Backup


def test_a_fresh_draw_takes_the_next_free_label_and_the_minute() -> None:
    draws = [Draw(label="draw 1"), Draw(label="draw 3")]
    d = fresh_draw(draws, lambda: datetime(2026, 12, 1, 8, 5, 42, 7))
    assert d.label == "draw 4"  # "draw 3", the next by count, is taken
    assert d.taken == datetime(2026, 12, 1, 8, 5)
    assert fresh_draw([], lambda: datetime(2026, 12, 1)).label == "draw 1"


def test_the_draw_list_names_position_time_and_loading() -> None:
    draws = [
        Draw(label="admission", taken=datetime(2026, 11, 30, 8, 15)),
        Draw(label="2 h", during=LoadingTest.bicarbonate_loading),
    ]
    assert draw_options(draws) == [("1. admission, 30 Nov 08:15", 0), ("2. 2 h, loading", 1)]


def test_same_measurement_compares_value_unit_and_word() -> None:
    a = Measurement(value=1.8, unit="mg/dL", canonical=159.1)
    assert same_measurement(a, Measurement(value=1.8, unit="mg/dL", canonical=159.1, bare=True))
    assert not same_measurement(a, Measurement(value=159.1, unit="umol/L", canonical=159.1))
    assert same_measurement(None, None)
    assert not same_measurement(a, None)


def test_save_as_names_a_yaml_file_in_the_library_unless_a_path_is_given() -> None:
    cases = Path("/library")
    assert save_as_target("visit 2", cases) == Path("/library/visit 2.yaml")
    assert save_as_target("old.yml", cases) == Path("/library/old.yml")
    assert save_as_target("notes.txt", cases) == Path("/library/notes.txt.yaml")
    assert save_as_target("/elsewhere/b.yaml", cases) == Path("/elsewhere/b.yaml")
    assert save_as_target("~/b", cases) == Path.home() / "b.yaml"


def test_the_saved_message_says_what_the_save_did_not_keep() -> None:
    path = Path("/library/a.yaml")
    plain = SaveResult(path=path, backup=None, kept_comments=True)
    assert saved_message(path, 0, plain) == "Saved to /library/a.yaml."
    backup = Backup(path=Path("/b/a.yaml.1"), original=path, taken=datetime(2026, 12, 1), size=10)
    full = SaveResult(path=path, backup=backup, kept_comments=False, note="tabs in the file")
    text = saved_message(path, 2, full)
    assert text.startswith("Saved to /library/a.yaml. 2 refused value(s) were not saved.")
    assert "previous version is kept" in text
    assert text.endswith("Comments could not be kept: tabs in the file.")


def test_deleting_a_draw_drops_its_refused_text_and_moves_the_later_ones_up() -> None:
    case = Case(label="c", draws=[Draw(label="a"), Draw(label="b"), Draw(label="c")])
    pane = DrawPane(case, 0)
    pane.pending = {
        (0, Panel.serum, "sodium"): "1380",
        (1, Panel.serum, "potassium"): "x",
        (2, Panel.urine, "ph"): "19",
    }
    del case.draws[1]
    pane.forget_draw(1)
    assert pane.pending == {(0, Panel.serum, "sodium"): "1380", (1, Panel.urine, "ph"): "19"}
    assert pane.refused_summary() == ["a: sodium '1380'", "c: pH '19'"]


def test_the_help_line_explains_the_focused_field_or_lists_the_keys() -> None:
    assert field_help(None, FieldReading(None)) == FORM_KEYS
    field = ValueField(Panel.serum, "creatinine")  # ambiguous: no unit until one is chosen
    reading = read_field(field.analyte, "9", None, None)
    text = str(field_help(field, reading))
    assert text.startswith("creatinine (serum) in no unit chosen")
    assert "Ctrl+T picks one, or set the case's unit system on F3." in text
    field.unit = "mg/dL"
    text = str(field_help(field, read_field(field.analyte, "1.8", "mg/dL", None)))
    assert "(Ctrl+T switches)" in text
    assert "\n+ read as 159.1" in text  # 1.8 mg/dL x 88.4, in the canonical umol/L
    sodium = ValueField(Panel.serum, "sodium")
    sodium.unit = "mmol/L"
    text = str(field_help(sodium, read_field(sodium.analyte, "141", "mmol/L", None)))
    assert text == "sodium (serum) in mmol/L\n+ read as 141 mmol/L"  # one unit: said once
