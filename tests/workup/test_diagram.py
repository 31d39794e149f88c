"""The Davenport diagram's geometry: isobars obey Henderson–Hasselbalch, bands follow the rules."""

from __future__ import annotations

import numpy as np
import pytest

from workup import diagram as d
from workup.settings import Settings


@pytest.mark.parametrize("pco2", d.ISOBARS)
def test_isobar_points_satisfy_henderson_hasselbalch(pco2: float) -> None:
    # pH = 6.1 + log10(HCO3 / (0.03 × pCO2)): Silverthorn, Human Physiology, 8th ed.
    ph, hco3 = d.isobar(pco2)
    assert len(ph) > 10
    expected = 6.1 + np.log10(hco3 / (0.03 * pco2))
    np.testing.assert_allclose(ph, expected, atol=1e-12)
    assert (hco3 >= d.HCO3_RANGE[0]).all() and (hco3 <= d.HCO3_RANGE[1]).all()


def test_normal_point_lies_on_the_40_isobar() -> None:
    # Own arithmetic (not published): pH 7.40 with pCO2 40 gives HCO3 0.03 × 40 × 10^1.3 ≈ 23.9.
    assert float(d.hco3_on_isobar(7.40, 40.0)) == pytest.approx(23.94, abs=0.01)
    assert d.Point(7.40, 23.94).pco2 == pytest.approx(40.0, abs=0.05)


def _band(band_id: str, settings: Settings | None = None) -> d.Band:
    return next(b for b in d.bands(settings or Settings()) if b.id == band_id)


def _pco2(edge: np.ndarray) -> np.ndarray:
    return edge[:, 1] / (0.03 * 10.0 ** (edge[:, 0] - 6.1))


def test_metabolic_acidosis_edges_follow_winters() -> None:
    # Winters: pCO2 = 1.5 × HCO3 + 8 ± 2 (Albert, Dell & Winters, Ann Intern Med 1967; from memory).
    b = _band("metabolic_acidosis")
    h = b.edge_a[:, 1]
    np.testing.assert_allclose(_pco2(b.edge_a), 1.5 * h + 10, rtol=1e-9)
    np.testing.assert_allclose(_pco2(b.edge_b), 1.5 * h + 6, rtol=1e-9)


def test_metabolic_alkalosis_edges_follow_point_seven_rule() -> None:
    # ΔpCO2 = 0.7 × ΔHCO3 ± 2 (Berend, de Vries & Gans, NEJM 2014; read in a secondary summary).
    b = _band("metabolic_alkalosis")
    h = b.edge_a[:, 1]
    np.testing.assert_allclose(_pco2(b.edge_a), 40 + 0.7 * (h - 24) + 2, rtol=1e-9)
    np.testing.assert_allclose(_pco2(b.edge_b), 40 + 0.7 * (h - 24) - 2, rtol=1e-9)


@pytest.mark.parametrize(
    ("band_id", "low_coef", "high_coef"),
    [
        # Narins & Emmett, Medicine 1980 (as tabulated); ± 2 from Berend et al., NEJM 2014.
        ("respiratory_acidosis_acute", 0.1, 0.1),
        ("respiratory_acidosis_chronic", 0.35, 0.35),
        ("respiratory_alkalosis_acute", 0.2, 0.2),
        ("respiratory_alkalosis_chronic", 0.5, 0.4),
    ],
)
def test_respiratory_edges_follow_the_bicarbonate_rules(
    band_id: str, low_coef: float, high_coef: float
) -> None:
    b = _band(band_id)
    p = b.primary
    np.testing.assert_allclose(_pco2(b.edge_a), p, rtol=1e-9)
    np.testing.assert_allclose(_pco2(b.edge_b), p, rtol=1e-9)
    sign = 1.0 if "acidosis" in band_id else -1.0
    delta = np.abs(p - 40)
    np.testing.assert_allclose(b.edge_a[:, 1], 24 + sign * low_coef * delta - 2, atol=1e-9)
    np.testing.assert_allclose(b.edge_b[:, 1], 24 + sign * high_coef * delta + 2, atol=1e-9)


def test_brandis_example_falls_in_chronic_not_acute_band() -> None:
    # Brandis, Acid-Base Physiology: PaCO2 60, HCO3 31 — acute expects 26 (so not appropriate),
    # chronic expects 32 (appropriate).
    ph = float(d.ph_of(31.0, 60.0))
    inside = {b.id for b in d.bands_containing(d.Point(ph, 31.0))}
    assert "respiratory_acidosis_chronic" in inside
    assert "respiratory_acidosis_acute" not in inside


def test_winters_point_inside_and_outside_the_acidosis_band() -> None:
    # Own arithmetic on Winters' rule: HCO3 12 expects pCO2 26 (24–28).
    inside = d.Point(float(d.ph_of(12.0, 26.0)), 12.0)
    outside = d.Point(float(d.ph_of(12.0, 34.0)), 12.0)
    assert "metabolic_acidosis" in {b.id for b in d.bands_containing(inside)}
    assert "metabolic_acidosis" not in {b.id for b in d.bands_containing(outside)}


def test_bands_follow_the_normal_values_in_settings() -> None:
    b = _band("metabolic_alkalosis", Settings(bicarbonate_normal=26.0, pco2_normal=42.0))
    assert b.primary[0] == pytest.approx(26.0)
    assert _pco2(b.edge_a)[0] == pytest.approx(44.0)


@pytest.mark.parametrize(("cols", "rows"), [(1, 1), (40, 10), (76, 16), (116, 30)])
def test_raster_has_the_asked_size_and_marks_the_point(cols: int, rows: int) -> None:
    r = d.raster(cols, rows, d.Point(7.31, 15.0), (d.Point(7.40, 23.0),))
    lines = r.lines()
    assert len({len(line) for line in lines}) == 1
    assert len(lines) == max(rows, 6) and len(lines[0]) == max(cols, 13)
    text = "".join(lines)
    assert d.MARK in text
    if cols >= 40:
        assert all(b.digit in text for b in r.bands)
        assert any(0x2800 < ord(ch) <= 0x28FF for ch in text)
    assert len(r.styles) == len(r.chars)


def test_point_off_the_plane_is_not_drawn() -> None:
    r = d.raster(60, 16, d.Point(6.70, 3.0))
    assert d.MARK not in "".join(r.lines())
    assert not d.Point(6.70, 3.0).on_plane


def test_point_prefers_gas_bicarbonate_then_computed_then_serum() -> None:
    p, src = d.point_for(7.31, 14.0, 15.0, 30.0)
    assert p is not None and p.hco3 == 14.0 and src == "gas bicarbonate"
    p, src = d.point_for(7.40, None, 15.0, 40.0)
    assert p is not None and p.hco3 == pytest.approx(23.94, abs=0.01) and "pCO2" in src
    p, src = d.point_for(7.31, None, 15.0, None)
    assert p is not None and p.hco3 == 15.0 and src == "serum total CO2"
    p, src = d.point_for(None, 14.0, 15.0, 30.0)
    assert p is None and "pH" in src
