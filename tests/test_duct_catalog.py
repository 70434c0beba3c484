"""Duct sizes, sheet materials and gauges (pipeins.catalog.ducts)."""

import math

import pytest
from hypothesis import given, strategies as st

from pipeins.catalog import ducts
from pipeins.errors import InputError
from pipeins.tables import read_table

INCH = 0.0254


@pytest.mark.parametrize("text, kind, width_m, height_m", [
    ("600x400mm", "rectangular", 0.6, 0.4),
    ("600 x 400 mm", "rectangular", 0.6, 0.4),
    ("600mm x 400mm", "rectangular", 0.6, 0.4),
    ("600×400 mm", "rectangular", 0.6, 0.4),
    ("0.6X0.4m", "rectangular", 0.6, 0.4),
    ("60x40cm", "rectangular", 0.6, 0.4),
    ("24x16in", "rectangular", 24 * INCH, 16 * INCH),
    ("24 x 16 in", "rectangular", 24 * INCH, 16 * INCH),
    ("450mm", "round", 0.45, 0.45),
    ("18in", "round", 18 * INCH, 18 * INCH),
    ("18 in", "round", 18 * INCH, 18 * INCH),
])
def test_parse_duct_size(text, kind, width_m, height_m):
    size = ducts.parse_duct_size(text)
    assert size.kind == kind
    assert size.width_m == pytest.approx(width_m, rel=1e-12)
    assert size.height_m == pytest.approx(height_m, rel=1e-12)


def test_bare_numbers_follow_the_unit_system():
    assert ducts.parse_duct_size("600x400").width_m == pytest.approx(0.6)
    assert ducts.parse_duct_size("24x16", units="us").height_m == pytest.approx(16 * INCH)


def test_hydraulic_diameter_is_4a_over_p():
    # D_h = 4A/P = 2ab/(a+b) for a rectangle (any heat-transfer text, e.g. Incropera et al., Eq. 8.66)
    size = ducts.parse_duct_size("600x400mm")
    assert size.hydraulic_diameter_m == pytest.approx(2 * 0.6 * 0.4 / 1.0)
    assert ducts.parse_duct_size("450mm").hydraulic_diameter_m == pytest.approx(0.45)
    assert ducts.parse_duct_size("450mm").aspect_ratio == 1.0


@pytest.mark.parametrize("text, message", [
    ("0x400mm", '--duct: "0x400mm": every duct side must be greater than zero; use e.g. 600x400mm, 24x16in, 450mm or 18in'),
    ("-450mm", '--duct: "-450mm": every duct side must be greater than zero; use e.g. 600x400mm, 24x16in, 450mm or 18in'),
    ("600x400parsecs", '--duct: "600x400parsecs": unknown length unit "parsecs"; write the sides in mm, cm, m, in or ft, '
                       'e.g. 600x400mm, 24x16in, 450mm or 18in'),
    ("600x400x300mm", '--duct: "600x400x300mm" has more than two sides; use e.g. 600x400mm, 24x16in, 450mm or 18in'),
    ("1e400x1mm", '--duct: "1e400x1mm": every duct side must be a finite number; use e.g. 600x400mm, 24x16in, 450mm or 18in'),
    ("wide", '--duct: cannot read "wide" as a duct size; use e.g. 600x400mm, 24x16in, 450mm or 18in'),
    ("", "--duct: the duct size is missing; use e.g. 600x400mm, 24x16in, 450mm or 18in"),
    ("900x100mm", '--duct: "900x100mm" has sides 9:1; the per-face duct model takes at most 1:8 (its laminar inner-film '
                  "values are tabulated to 1:8; ducts are rarely made flatter than 1:4); model it as flat faces"),
])
def test_bad_duct_sizes_are_one_line_errors(text, message):
    with pytest.raises(InputError) as exc:
        ducts.parse_duct_size(text)
    assert str(exc.value) == message
    assert "\n" not in str(exc.value)


def test_aspect_ratio_limit_is_inclusive():
    assert ducts.parse_duct_size("800x100mm").aspect_ratio == pytest.approx(8.0)
    assert ducts.parse_duct_size("100x800mm").aspect_ratio == pytest.approx(8.0)
    with pytest.raises(InputError):
        ducts.parse_duct_size("801x100mm")


@given(st.integers(10, 3000), st.integers(10, 3000))
def test_any_ratio_within_the_limit_reads_back(width_mm, height_mm):
    text = f"{width_mm}x{height_mm}mm"
    if max(width_mm, height_mm) > 8 * min(width_mm, height_mm):
        with pytest.raises(InputError):
            ducts.parse_duct_size(text)
    else:
        size = ducts.parse_duct_size(text)
        assert (size.width_m, size.height_m) == pytest.approx((width_mm / 1000, height_mm / 1000))
        assert size.hydraulic_diameter_m <= min(size.width_m, size.height_m) * 2 + 1e-12


def test_round_sizes_are_sorted_positive_and_sourced():
    for system in ("mm", "in"):
        sizes = ducts.round_duct_sizes(system)
        assert len(sizes) >= 15 and list(sizes) == sorted(sizes) and sizes[0] > 0
    assert ducts.round_duct_sizes("si") == ducts.round_duct_sizes("mm")
    assert all("common practice" in row["source"] for row in read_table("duct_round_sizes"))
    with pytest.raises(InputError):
        ducts.round_duct_sizes("cubits")


# US Standard Gauge for sheet iron and steel (Act of Congress, 1893), weight in oz/ft² by gauge
# number, from memory; the galvanised sheet gauge adds 2.5 oz/ft² of zinc, and steel sheet weighs
# 41.82 lb/ft² per inch of thickness (density 501.8 lb/ft³ / 12), from memory.
US_STANDARD_GAUGE_OZ_FT2 = {30: 8, 28: 10, 26: 12, 24: 16, 22: 20, 20: 24, 18: 32, 16: 40, 14: 50, 12: 70, 10: 90}


@pytest.mark.parametrize("gauge, ounces", sorted(US_STANDARD_GAUGE_OZ_FT2.items()))
def test_galvanised_gauge_thickness_from_the_gauge_weight(gauge, ounces):
    expected_in = (ounces + 2.5) / 16.0 / 41.82
    assert ducts.gauge_thickness_m(gauge) / INCH == pytest.approx(expected_in, rel=5e-3)


def test_gauge_errors():
    assert ducts.gauge_thickness_m("24 ga") == ducts.gauge_thickness_m(24)
    with pytest.raises(InputError, match="gauge numbers are listed for galvanised steel only"):
        ducts.gauge_thickness_m(24, "aluminium")
    with pytest.raises(InputError, match='gauge "23" is not listed; listed: 10, 12'):
        ducts.gauge_thickness_m(23)
    with pytest.raises(InputError, match="cannot read"):
        ducts.gauge_thickness_m("thin")
    thicknesses = [t for _, t in ducts.list_gauges()]
    assert thicknesses == sorted(thicknesses)


def test_sheet_materials():
    from pipeins.catalog.finishes import lookup_finish

    for name in ("galvanized steel", "aluminum", "stainless steel"):
        sheet = ducts.lookup_sheet(name)
        assert sheet.conductivity_w_mk > 10 and sheet.source
        assert lookup_finish(sheet.bare_finish)  # the bare finish is a finish the catalogue knows
    # AISI 304 at 300 K: 14.9 W/(m·K) (Incropera & DeWitt, Table A.1, from memory)
    assert ducts.lookup_sheet("stainless_steel").conductivity_w_mk == 14.9
    with pytest.raises(InputError, match='unknown duct sheet material "brass"'):
        ducts.lookup_sheet("brass")
    assert math.isnan(ducts.parse_duct_size("600x400mm").diameter_m)


def test_wrap_compression_default_is_25_percent_common_practice():
    # common practice: duct wrap is rated at 25 % compression (2 in nominal -> 1.5 in installed)
    wrap = ducts.installed_wrap(2 * INCH, 0.040)
    assert ducts.WRAP_COMPRESSION_PERCENT == 25.0
    assert float(wrap.installed_thickness_m) == pytest.approx(1.5 * INCH)
    # R = t/k of a flat layer (ASTM C680 / any heat-transfer text), nominal beside installed
    assert float(wrap.nominal_r_m2k_w) == pytest.approx(2 * INCH / 0.040)
    assert float(wrap.installed_r_m2k_w) == pytest.approx(1.5 * INCH / 0.040)


def test_wrap_compression_override_and_inverse():
    import numpy as np

    wrap = ducts.installed_wrap(np.array([0.025, 0.05]), compression_percent=0)
    assert np.array_equal(wrap.installed_thickness_m, wrap.nominal_thickness_m) and wrap.installed_r_m2k_w is None
    installed = ducts.installed_wrap(0.05, compression_percent=15).installed_thickness_m
    assert float(installed) == pytest.approx(0.0425)
    assert float(ducts.nominal_wrap_thickness_m(installed, 15)) == pytest.approx(0.05)


@pytest.mark.parametrize("percent", [-1, 100, 150, float("nan")])
def test_wrap_compression_out_of_range(percent):
    with pytest.raises(InputError) as exc:
        ducts.installed_wrap(0.05, compression_percent=percent)
    assert exc.value.name == "wrap_compression_percent"
    assert "outside 0 to below 100 %" in exc.value.message


def test_wrap_bad_thickness_or_conductivity():
    with pytest.raises(InputError, match="thickness"):
        ducts.installed_wrap(0.0)
    with pytest.raises(InputError, match="conductivity"):
        ducts.installed_wrap(0.05, -0.04)
