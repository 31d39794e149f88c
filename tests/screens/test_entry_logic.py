"""The entry form's plumbing: chart order covers the catalogue; text goes to the core unchanged."""

from __future__ import annotations

import pytest

from screens.entry import SECTIONS, all_fields, default_unit, read_field, unit_choices
from workup.analytes import CATALOGUE, Panel, UnitSystem, analyte


def test_every_analyte_has_exactly_one_field() -> None:
    fields = all_fields()
    assert len(fields) == len(set(fields))
    expected = {(p, k) for p, keys in CATALOGUE.items() for k in keys}
    assert set(fields) == expected


def test_chart_order_starts_with_serum_then_gas_then_urine() -> None:
    titles = [t for t, _ in SECTIONS]
    assert titles[:3] == ["Serum", "Blood gas", "Urine"]
    assert all(t.startswith("Extras") for t in titles[3:])
    assert SECTIONS[0][1][0] == (Panel.serum, "sodium")


def test_bare_number_is_read_in_the_unit_the_field_shows() -> None:
    creat = analyte(Panel.serum, "creatinine")
    r = read_field(creat, "0.8", "mg/dL", None)
    assert r.problem is None and r.measurement is not None
    assert r.measurement.unit == "mg/dL"
    # 0.8 mg/dL x 88.4 = 70.7 umol/L: creatinine 113.12 g/mol (IUPAC standard atomic weights);
    # the same factor appears in SI unit conversion tables.
    assert r.measurement.canonical == pytest.approx(70.7, abs=0.1)


def test_typed_unit_wins_over_the_field_unit() -> None:
    creat = analyte(Panel.serum, "creatinine")
    r = read_field(creat, "71 umol/L", "mg/dL", None)
    assert r.measurement is not None and r.measurement.unit == "umol/L"


def test_ambiguous_field_without_unit_is_refused_not_guessed() -> None:
    creat = analyte(Panel.serum, "creatinine")
    assert default_unit(creat, None) is None
    r = read_field(creat, "0.8", None, None)
    assert r.measurement is None and "ambiguous" in (r.problem or "")
    assert default_unit(creat, UnitSystem.si) == "umol/L"


def test_impossible_and_unusual_values() -> None:
    # Limits of workup/analytes.py: sodium possible 80–200, usual 120–160 mmol/L (common
    # practice, chosen from memory to be generous).
    na = analyte(Panel.serum, "sodium")
    bad = read_field(na, "1380", "mmol/L", None)
    assert bad.measurement is None and "not a possible" in (bad.problem or "")
    odd = read_field(na, "118", "mmol/L", None)
    assert odd.measurement is not None and "unusually low" in (odd.caution or "")
    assert read_field(na, "", "mmol/L", None).measurement is None
    assert read_field(na, "1,5", "mmol/L", None).problem


def test_dipstick_words_and_units_listed() -> None:
    ketones = analyte(Panel.urine, "ketones")
    r = read_field(ketones, "2+", "grade", None)
    assert r.measurement is not None and r.measurement.word == "2+"
    assert unit_choices(analyte(Panel.blood_gas, "pco2")) == ["mmHg", "kPa"]
