"""Finishes, thickness series, touch limits and fitting lengths (pipeins.catalog.*)."""

import numpy as np
import pint
import pytest
from hypothesis import given, settings, strategies as st

from pipeins.catalog.finishes import FAMILIES, SURFACE_KINDS, Finish, list_finishes, lookup_finish
from pipeins.catalog.fittings import equivalent_length_m, fitting_kinds
from pipeins.catalog.materials import list_materials
from pipeins.catalog.series import default_series, series_families, series_names, thickness_series_m
from pipeins.catalog.touch import (
    DEFAULT_CONTACT_TIME_S,
    DEFAULT_TOUCH_LIMIT_C,
    DEFAULT_TOUCH_LIMIT_SOURCE,
    touch_limit,
    touch_surface_kinds,
)
from pipeins.errors import InputError
from pipeins.tables import read_table

ureg = pint.UnitRegistry()

ALL_TABLES = ["pipes_steel", "pipes_copper", "pipes_metric", "wall_materials", "insulation_materials",
              "finishes", "thickness_series", "touch_limits", "fitting_lengths"]
TEXT_COLUMNS = {"nps", "nominal", "type", "schedule", "key", "name", "family", "series", "unit",
                "surface_kind", "fitting", "source", "condition", "aliases", "bare_finish", "absorptance_source"}


@pytest.mark.parametrize("table", ALL_TABLES)
def test_every_table_has_sources_and_numbers(table):
    rows = read_table(table)
    assert rows
    for row in rows:
        assert None not in row and all(v is not None for v in row.values()), row  # column count
        assert row["source"].strip(), row
        for column, value in row.items():
            if column not in TEXT_COLUMNS:
                assert np.isfinite(float(value)), (column, value)


# ---------------------------------------------------------------- finishes
def test_finish_table():
    for row in read_table("finishes"):
        low, used, high = (float(row[k]) for k in ("emittance_low", "emittance", "emittance_high"))
        assert 0.0 < low <= used <= high <= 1.0  # definition of emittance; the value used lies in its source's range
        assert row["surface_kind"] in SURFACE_KINDS
        assert row["family"] in FAMILIES
        assert row["condition"] in ("bright or new", "dull or aged", "weathered or oxidised", "any age")
        assert row["source"]
    assert set(SURFACE_KINDS) == set(touch_surface_kinds())
    assert {row["family"] for row in read_table("finishes")} == set(FAMILIES)


def test_finish_names_unique():
    # every key, name and alias names one finish only
    seen = {}
    for f in (lookup_finish(r["key"]) for r in read_table("finishes")):
        for text in (f.key, f.name, *f.aliases):
            norm = " ".join(text.lower().replace(",", " ").replace("_", " ").replace("-", " ").split())
            assert seen.setdefault(norm, f.key) == f.key, text


def test_finish_physics():
    # physical facts (heat-transfer texts' emittance tables): polished metals low, oxidised and
    # weathered metals higher, non-metallic surfaces and paints high
    e = {r["key"]: r["emittance"] for r in list_finishes()}
    for metal in ("aluminium", "stainless", "galvanised"):
        assert e[f"{metal}_bright" if metal != "galvanised" else "galvanised_new"] < e[f"{metal}_dull"] \
            < e[f"{metal}_weathered"]
    assert e["copper_bright"] < 0.1 < e["copper_oxidised"]
    assert e["steel_new"] < e["steel_oxidised"] and e["steel_oxidised"] > 0.7
    assert all(e[k] > 0.8 for k in ("pvc_jacket", "painted_steel", "paper_facing", "foam_unfaced", "plastic_pipe"))


def test_finish_lookup():
    f = lookup_finish("Aluminium, Dull or Aged")
    assert isinstance(f, Finish) and f.key == "aluminium_dull"
    assert lookup_finish("aluminium-dull-or-aged") == f
    assert lookup_finish("aluminium, bright").key == "aluminium_bright"
    with pytest.raises(InputError) as info:
        lookup_finish("aluminum old")
    assert info.value.name == "finish"
    assert info.value.message.startswith('unknown finish "aluminum old"; did you mean "aluminium ')
    with pytest.raises(InputError) as info:
        lookup_finish("pvc jackit")
    assert (info.value.name, info.value.message) == (
        "finish", 'unknown finish "pvc jackit"; did you mean "pvc jacket"?')
    assert len(list_finishes()) == len(read_table("finishes"))


@pytest.mark.parametrize("us, ours", [
    ("aluminum, bright", "aluminium_bright"),
    ("Aluminum, oxidized", "aluminium_weathered"),
    ("galvanized steel, new", "galvanised_new"),
    ("galvanized steel, weathered", "galvanised_weathered"),
    ("stainless steel, oxidized", "stainless_weathered"),
    ("painted steel, any color", "painted_steel"),
    ("carbon steel, bare, oxidized", "steel_oxidised"),
    ("copper, oxidized", "copper_oxidised"),
])
def test_finish_us_spellings(us, ours):
    assert lookup_finish(us).key == ours


# ---------------------------------------------------------------- thickness series
def test_series_shape():
    for name in series_names():
        values = thickness_series_m(name)
        assert values == tuple(sorted(set(values))) and values[0] > 0
        assert values[-1] <= 0.15  # common practice: no single layer thicker than 150 mm


def test_every_material_family_has_both_series():
    for family in {row["family"] for row in list_materials()} | {"generic"}:
        assert default_series(family, "si").startswith("mm_")
        assert default_series(family, "us").startswith("in_")
        assert default_series(family, "ip") == default_series(family, "us")
    assert "pipe_section" in series_families()


@pytest.mark.parametrize(
    "name, index, value",
    [
        pytest.param("in_pipe_section", 0, 0.5 * ureg.inch, id="pint: 1/2 in"),
        pytest.param("in_pipe_section", -1, 4 * ureg.inch, id="pint: 4 in"),
        pytest.param("in_elastomeric", 0, 0.375 * ureg.inch, id="pint: 3/8 in"),
        pytest.param("mm_pipe_section", -1, 120 * ureg.mm, id="pint: 120 mm"),
    ],
)
def test_series_units(name, index, value):
    assert thickness_series_m(name)[index] == pytest.approx(value.to("m").magnitude, rel=1e-12)


def test_series_errors():
    with pytest.raises(InputError) as info:
        thickness_series_m("mm_pipesection")
    assert (info.value.name, info.value.message) == (
        "series", 'unknown thickness series "mm_pipesection"; did you mean "mm_pipe_section"?')
    with pytest.raises(InputError) as info:
        default_series("brick")
    assert info.value.name == "series"
    assert info.value.message.startswith('no thickness series for material family "brick"; families: ')
    with pytest.raises(InputError) as info:
        default_series("block", "imperial")
    assert (info.value.name, info.value.message) == ("--units", 'unknown unit system "imperial"; use si or us')


# ---------------------------------------------------------------- touch limits
@pytest.mark.parametrize(
    "time_s, limit_c",
    [
        pytest.param(60, 51.0, id="ISO 13732-1:2006 Table 2, 1 min, all materials (from memory)"),
        pytest.param(600, 48.0, id="ISO 13732-1:2006 Table 2, 10 min, all materials (from memory)"),
        pytest.param(8 * 3600, 43.0, id="ISO 13732-1:2006 Table 2, 8 h, all materials (from memory)"),
    ],
)
@pytest.mark.parametrize("kind", ["bare_metal", "metal_jacket", "non_metallic"])
def test_touch_long_contact(kind, time_s, limit_c):
    limit, source = touch_limit(kind, time_s)
    assert limit == limit_c
    assert "ISO 13732-1" in source


def test_touch_short_contact_order():
    # ISO 13732-1: at short contact, metals burn at lower surface temperature than plastics
    for t in (1, 4, 10):
        assert touch_limit("bare_metal", t)[0] < touch_limit("non_metallic", t)[0]
    assert 65 <= touch_limit("bare_metal", 1)[0] <= 70  # ISO 13732-1 Figure 1, band 65-70 °C at 1 s (from memory)


@pytest.mark.parametrize("kind", ["bare_metal", "metal_jacket", "non_metallic"])
def test_touch_table_monotonic(kind):
    # physical fact: longer contact burns at a lower surface temperature
    rows = [r for r in read_table("touch_limits") if r["surface_kind"] == kind]
    limits = [float(r["limit_c"]) for r in sorted(rows, key=lambda r: float(r["contact_time_s"]))]
    assert all(b < a for a, b in zip(limits, limits[1:]))
    assert [float(r["contact_time_s"]) for r in rows] == [1, 4, 10, 60, 600, 28800]


def test_touch_interpolation_log_time():
    limit, source = touch_limit("bare_metal", 2.0)  # halfway between 1 s and 4 s in log time
    assert limit == pytest.approx((65 + 58) / 2)
    assert source.endswith("interpolated in log time")
    arr, _ = touch_limit("non_metallic", np.array([[1.0, 60.0], [600.0, 28800.0]]))
    assert arr.shape == (2, 2)
    assert arr.tolist() == [[85.0, 51.0], [48.0, 43.0]]


@settings(max_examples=50, deadline=None)
@given(t1=st.floats(1, 28800), t2=st.floats(1, 28800))
def test_touch_limit_decreases_with_time(t1, t2):
    lo, hi = sorted((t1, t2))
    assert touch_limit("bare_metal", hi)[0] <= touch_limit("bare_metal", lo)[0]


@pytest.mark.parametrize("time_s", [0.5, 30000, float("nan"), -1])
def test_touch_out_of_range(time_s):
    with pytest.raises(InputError) as info:
        touch_limit("bare_metal", time_s)
    assert (info.value.name, info.value.message) == (
        "contact_time_s", "contact time must be between 1 s and 28800 s (8 h)")


def test_touch_unknown_kind():
    with pytest.raises(InputError) as info:
        touch_limit("bare metal", 5)
    assert (info.value.name, info.value.message) == (
        "--surface", 'unknown surface kind "bare metal"; did you mean "bare_metal"?')


def test_default_touch_limit():
    assert DEFAULT_TOUCH_LIMIT_C == 60.0  # common practice, after ASTM C1055 (short contact with metal)
    assert DEFAULT_CONTACT_TIME_S == 5.0
    assert DEFAULT_TOUCH_LIMIT_SOURCE == "common practice, after ASTM C1055 guidance for short contact with metal"


# ---------------------------------------------------------------- fittings
def test_fitting_lengths():
    assert fitting_kinds() == ["valve", "flange", "strainer"]
    d = np.array([0.0213, 0.0603, 0.0889, 0.1683, 0.2191, 0.3239, 0.610, 0.914])
    for kind in fitting_kinds():
        lengths = equivalent_length_m(kind, d)
        assert lengths.shape == d.shape
        assert np.all(np.diff(lengths) >= 0)  # physical: a bigger fitting loses more heat
    # common practice: a valve body loses more than a flange pair of the same size
    assert np.all(equivalent_length_m("valve", d) > equivalent_length_m("flange", d))
    assert float(equivalent_length_m("strainer", 0.0603)) == 1.2  # band edge: NPS 2 is in the first band


def test_fitting_errors():
    with pytest.raises(InputError) as info:
        equivalent_length_m("valv", 0.1)
    assert (info.value.name, info.value.message) == ("--fitting", 'unknown fitting "valv"; did you mean "valve"?')
    for bad in (0.0, 1.0, [0.1, -0.1]):
        with pytest.raises(InputError) as info:
            equivalent_length_m("valve", bad)
        assert (info.value.name, info.value.message) == (
            "--outer-diameter", "outside diameter must be above 0 and at most 920 mm for fitting lengths")
