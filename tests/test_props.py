"""Air and pipe-fluid properties (pipeins.props.air, .liquids) and the shipped tables.

References: live CoolProp (the tables' own source), iapws (IAPWS-95 / IAPWS-06).
"""

import math
import subprocess
import sys

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from pipeins.errors import InputError
from pipeins.props import generate
from pipeins.props.air import air_properties
from pipeins.props.liquids import (
    LATENT_HEAT_FUSION_J_KG,
    check_fluid_temp,
    fluid_properties,
    fluid_temp_range_c,
    freezing_point_c,
    normalise_fluid,
)
from pipeins.tables import read_table

CP = pytest.importorskip("CoolProp.CoolProp")

FIELDS = {
    "density_kg_m3": "D",
    "viscosity_pa_s": "V",
    "conductivity_w_mk": "L",
    "heat_capacity_j_kgk": "CPMASS",
    "prandtl": "PRANDTL",
}


def _coolprop(fluid, temp_c, *state):
    temp_k = np.asarray(temp_c, float) + 273.15
    return {field: np.asarray(CP.PropsSI(key, "T", temp_k, *state, fluid)) for field, key in FIELDS.items()}


# ---------------------------------------------------------------- air
AIR_TEMPS_C = np.array([-73.3, -20.0, 0.7, 20.0, 51.1, 149.9, 401.3, 899.0])


def test_air_vs_coolprop_off_grid():
    ours = air_properties(AIR_TEMPS_C)
    live = _coolprop("Air", AIR_TEMPS_C, "P", np.full(AIR_TEMPS_C.shape, 101_325.0))
    for field, expected in live.items():
        np.testing.assert_allclose(getattr(ours, field), expected, rtol=1e-4, err_msg=field)  # CoolProp Air


def test_air_at_80_kpa_vs_coolprop():
    # ideal-gas density scaling, other properties pressure-independent: 0.5 % vs CoolProp Air at 80 kPa
    ours = air_properties(AIR_TEMPS_C, 80_000.0)
    live = _coolprop("Air", AIR_TEMPS_C, "P", np.full(AIR_TEMPS_C.shape, 80_000.0))
    for field, expected in live.items():
        np.testing.assert_allclose(getattr(ours, field), expected, rtol=5e-3, err_msg=field)  # CoolProp Air


def test_air_shapes_broadcast():
    props = air_properties([[20.0], [40.0]], [1e5, 9e4, 8e4])
    assert props.density_kg_m3.shape == (2, 3)
    assert isinstance(air_properties(20.0).prandtl, np.ndarray)


# ---------------------------------------------------------------- water
WATER_TEMPS_C = np.array([0.0, 0.25, 3.9, 23.3, 51.7, 87.7, 151.1, 199.8])


def test_water_vs_coolprop_saturated_liquid():
    ours = fluid_properties("water", WATER_TEMPS_C)
    live = _coolprop("Water", WATER_TEMPS_C, "Q", np.zeros(WATER_TEMPS_C.shape))
    for field, expected in live.items():
        np.testing.assert_allclose(getattr(ours, field), expected, rtol=1e-4, err_msg=field)  # CoolProp Water


@pytest.mark.parametrize(
    "temp_c", [pytest.param(t, id=f"iapws.IAPWS95 saturated liquid {t:g} C") for t in (20.0, 80.0)]
)
def test_water_density_and_heat_capacity_vs_iapws95(temp_c):
    from iapws import IAPWS95

    liquid = IAPWS95(T=temp_c + 273.15, x=0.0)
    props = fluid_properties("water", temp_c)
    assert float(props.density_kg_m3) == pytest.approx(liquid.rho, rel=2e-3)  # iapws IAPWS-95
    assert float(props.heat_capacity_j_kgk) == pytest.approx(liquid.cp * 1e3, rel=2e-3)  # iapws IAPWS-95


@pytest.mark.filterwarnings("ignore:Metastable ice")  # brentq may land a hair above the melting curve
def test_latent_heat_of_fusion_vs_iapws06():
    # IAPWS R10-06(2009) ice Ih (iapws._Ice) and IAPWS-95 liquid at the normal melting point,
    # where the melting curve (IAPWS 2011, iapws._Melting_Pressure) crosses 101 325 Pa.
    from iapws import IAPWS95
    from iapws._iapws import _Ice, _Melting_Pressure
    from scipy.optimize import brentq

    melt_k = brentq(lambda t: _Melting_Pressure(t) - 0.101325, 273.0, 273.16)
    fusion = (IAPWS95(T=melt_k, P=0.101325).h - _Ice(melt_k, 0.101325)["h"]) * 1e3
    assert melt_k == pytest.approx(273.1525, abs=1e-4)  # iapws IAPWS 2011 melting curve
    assert LATENT_HEAT_FUSION_J_KG == pytest.approx(fusion, rel=5e-4)  # iapws IAPWS-06 + IAPWS-95


def test_water_range_and_freezing_point():
    assert freezing_point_c("water") == 0.0  # definition of the Celsius scale (ice point), common practice
    assert fluid_temp_range_c("water") == (0.0, 200.0)


# ---------------------------------------------------------------- glycols and other CoolProp fluids
@pytest.mark.parametrize(
    "name, coolprop_name, temps_c",
    [
        pytest.param("30% ethylene glycol", "INCOMP::MEG[0.3]", [-14.3, -10.3, 20.2, 79.9],
                     id="CoolProp INCOMP::MEG[0.3]"),
        pytest.param("PG 40%", "INCOMP::MPG[0.4]", [-20.1, -5.1, 45.3, 99.9],
                     id="CoolProp INCOMP::MPG[0.4]"),
    ],
)
def test_glycol_vs_coolprop(name, coolprop_name, temps_c):
    ours = fluid_properties(name, temps_c)
    live = _coolprop(coolprop_name, temps_c, "P", np.full(len(temps_c), 101_325.0))
    for field, expected in live.items():
        np.testing.assert_allclose(getattr(ours, field), expected, rtol=1e-4, err_msg=field)  # CoolProp
    freeze_c = CP.PropsSI("T_freeze", coolprop_name) - 273.15
    # CoolProp T_freeze, to the 9 significant digits the shipped table prints
    assert freezing_point_c(name) == pytest.approx(freeze_c, abs=1e-6)


def test_pure_coolprop_fluid_as_compressed_liquid():
    temps_c = [-30.3, 0.7, 25.1]
    ours = fluid_properties("R134a", temps_c, 10e5)
    live = _coolprop("R134a", temps_c, "P", np.full(3, 10e5))
    for field, expected in live.items():
        np.testing.assert_allclose(getattr(ours, field), expected, rtol=1e-4, err_msg=field)  # CoolProp R134a
    top_c = CP.PropsSI("T", "P", 10e5, "Q", 0, "R134a") - 273.15 - 0.5
    assert fluid_temp_range_c("R134a", 10e5)[1] == pytest.approx(top_c)


def test_glycol_limit_matches_coolprop():
    # CoolProp's MEG/MPG fits accept 60 % by mass and refuse more (the 0-60 % limit in liquids.py)
    assert CP.PropsSI("D", "T", 300.0, "P", 1e5, "INCOMP::MEG[0.6]") > 1000.0
    with pytest.raises(ValueError):
        CP.PropsSI("D", "T", 300.0, "P", 1e5, "INCOMP::MEG[0.61]")


@pytest.mark.parametrize(
    "spelling, canonical",
    [
        ("water", "water"),
        ("H2O", "water"),
        ("30% ethylene glycol", "30% ethylene glycol"),
        ("ethylene glycol 30%", "30% ethylene glycol"),
        ("MEG30", "30% ethylene glycol"),
        ("EG 25 %", "25% ethylene glycol"),
        ("30% propylene glycol", "30% propylene glycol"),
        ("PG 40%", "40% propylene glycol"),
        ("INCOMP::MEG[0.3]", "30% ethylene glycol"),
        ("INCOMP::MPG-35%", "35% propylene glycol"),
        ("R134a", "R134a"),
        ("INCOMP::TVP1", "INCOMP::TVP1"),
        ("Air", "air"),
    ],
)
def test_normalise_fluid(spelling, canonical):
    assert normalise_fluid(spelling) == canonical


@pytest.mark.parametrize(
    "call, name, message",
    [
        (lambda: normalise_fluid("x"), "--fluid",
         'unknown fluid "x"; use water, N% ethylene or propylene glycol, N% calcium or sodium chloride, '
         "N% potassium formate or acetate, or a CoolProp fluid name"),
        (lambda: normalise_fluid("MEG70"), "--fluid",
         '"MEG70": glycol content 70 % is outside 0 to 60 % by mass'),
        (lambda: check_fluid_temp("MEG30", -20.0), "--fluid-temp",
         "-20 °C is below the freezing point of 30% ethylene glycol (-14.6 °C)"),
        (lambda: fluid_properties("water", [20.0, -2.0]), "--fluid-temp",
         "-2 °C is below the freezing point of water (0.0 °C)"),
        (lambda: fluid_properties("water", 250.0), "--fluid-temp",
         "250 °C is above the top of the property table for water (200.0 °C)"),
        (lambda: fluid_properties("water", float("nan")), "--fluid-temp",
         "must be a finite number of °C"),
    ],
)
def test_error_messages(call, name, message):
    with pytest.raises(InputError) as info:
        call()
    assert info.value.name == name
    assert info.value.message == message


@settings(max_examples=40, deadline=None)
@given(st.lists(st.floats(0.0, 200.0), min_size=1, max_size=6))
def test_water_vectorised_equals_scalar(temps_c):
    together = fluid_properties("water", temps_c).viscosity_pa_s
    one_by_one = [float(fluid_properties("water", t).viscosity_pa_s) for t in temps_c]
    np.testing.assert_allclose(together, one_by_one, rtol=1e-12)


# ---------------------------------------------------------------- shipped tables
# the glycol, brine and oil tables (fluid_*) are checked to the printed digits in test_props_fluids.py
@pytest.mark.parametrize("name", [name for name in generate.TABLE_BUILDERS if not name.startswith("fluid_")])
def test_shipped_table_regenerates_from_live_coolprop(name):
    builder, _comment = generate.TABLE_BUILDERS[name]
    fresh = builder()
    shipped = read_table(name)
    assert len(shipped) == len(fresh)
    assert list(shipped[0]) == list(fresh[0])
    for old, new in zip(shipped, fresh):
        assert old["source"] == new["source"]
        for column, value in new.items():
            if isinstance(value, str):
                assert old[column] == value
            else:
                assert math.isclose(float(old[column]), value, rel_tol=1e-6, abs_tol=1e-12), (name, column)


def test_common_fluids_need_no_coolprop_import():
    code = (
        "import sys\n"
        "from pipeins.props import air, humid, liquids, steam\n"
        "air.air_properties(20.0); liquids.fluid_properties('water', 60.0)\n"
        "steam.latent_heat_j_kg(5e5); humid.dew_point_c(20.0, 50.0)\n"
        "assert not [m for m in sys.modules if m.startswith('CoolProp')]\n"
    )
    subprocess.run([sys.executable, "-c", code], check=True)
