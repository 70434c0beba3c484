"""Dew point and relative humidity (pipeins.props.humid) against psychrolib, CoolProp, iapws."""

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from pipeins.errors import InputError
from pipeins.props.humid import dew_point_c, relative_humidity_percent, saturation_vapour_pressure_pa

AIR_TEMPS_C = np.arange(0.0, 40.1, 5.0)
RH_PERCENT = np.arange(20.0, 100.1, 10.0)
GRID_T, GRID_RH = (a.ravel() for a in np.meshgrid(AIR_TEMPS_C, RH_PERCENT))


@pytest.fixture(scope="module")
def psychrolib_si():
    psychrolib = pytest.importorskip("psychrolib")
    psychrolib.SetUnitSystem(psychrolib.SI)
    # SetUnitSystem sets the Newton solver's stopping step to 0.001 K; tighten it so the
    # comparison measures the saturation-pressure equations, not the solver.
    psychrolib.PSYCHROLIB_TOLERANCE = 1e-7
    return psychrolib


def test_dew_point_vs_psychrolib(psychrolib_si):
    # psychrolib GetTDewPointFromRelHum = ASHRAE Handbook - Fundamentals (2017) ch. 1 eq. 5, 6
    expected = [psychrolib_si.GetTDewPointFromRelHum(t, rh / 100.0) for t, rh in zip(GRID_T, GRID_RH)]
    np.testing.assert_allclose(dew_point_c(GRID_T, GRID_RH), expected, atol=0.05)  # psychrolib


@pytest.mark.parametrize(
    "pressure_pa",
    [pytest.param(101_325.0, id="CoolProp HAPropsSI 101325 Pa"),
     pytest.param(80_000.0, id="CoolProp HAPropsSI 80 kPa")],
)
def test_dew_point_vs_coolprop_haprops(pressure_pa):
    from CoolProp.CoolProp import HAPropsSI

    expected_k = HAPropsSI("D", "T", GRID_T + 273.15, "P", pressure_pa, "R", GRID_RH / 100.0)
    np.testing.assert_allclose(
        dew_point_c(GRID_T, GRID_RH, pressure_pa), np.asarray(expected_k) - 273.15, atol=0.05
    )  # CoolProp HAPropsSI (with enhancement factor)


@pytest.mark.parametrize("air_temp_c", [-30.0, -0.5, 0.0, 0.01, 12.3, 40.0, 90.0])
def test_saturated_air_dew_point_is_air_temperature(air_temp_c):
    # physical fact: at 100 % RH the air is saturated, so it is at its own dew point
    assert float(dew_point_c(air_temp_c, 100.0)) == air_temp_c


@pytest.mark.parametrize(
    "temp_c",
    [pytest.param(t, id=f"iapws _Sublimation_Pressure (IAPWS 2011) {t:g} C")
     for t in (-80.0, -40.0, -10.5, -0.2)],
)
def test_vapour_pressure_over_ice_vs_iapws(temp_c):
    from iapws._iapws import _Sublimation_Pressure

    expected_pa = _Sublimation_Pressure(temp_c + 273.15) * 1e6
    assert float(saturation_vapour_pressure_pa(temp_c)) == pytest.approx(expected_pa, rel=1e-4)


@pytest.mark.parametrize(
    "temp_c", [pytest.param(t, id=f"iapws IAPWS95 saturation {t:g} C") for t in (5.3, 20.0, 37.7, 95.5)]
)
def test_vapour_pressure_over_water_vs_iapws95(temp_c):
    from iapws import IAPWS95

    expected_pa = IAPWS95(T=temp_c + 273.15, x=0.0).P * 1e6
    assert float(saturation_vapour_pressure_pa(temp_c)) == pytest.approx(expected_pa, rel=1e-4)


def test_triple_point_pressure():
    # IAPWS-95 triple point pressure 611.655 Pa (Wagner & Pruss 2002, from memory);
    # the ice and liquid branches meet there.
    assert float(saturation_vapour_pressure_pa(0.01)) == pytest.approx(611.655, abs=0.002)
    below, above = saturation_vapour_pressure_pa([0.01 - 1e-6, 0.01 + 1e-6])
    assert below == pytest.approx(above, rel=1e-5)


def test_relative_humidity_inverse_and_shape():
    rh = relative_humidity_percent(GRID_T, dew_point_c(GRID_T, GRID_RH))
    np.testing.assert_allclose(rh, GRID_RH, rtol=1e-9)
    assert dew_point_c([[20.0], [30.0]], [50.0, 60.0, 70.0]).shape == (2, 3)
    assert isinstance(dew_point_c(20.0, 50.0), np.ndarray)


@settings(max_examples=60, deadline=None)
@given(
    air_temp_c=st.floats(-60.0, 90.0),
    rh_percent=st.floats(0.5, 100.0),
)
def test_round_trip_and_ordering(air_temp_c, rh_percent):
    dew = float(dew_point_c(air_temp_c, rh_percent))
    assert dew <= air_temp_c
    assert float(relative_humidity_percent(air_temp_c, dew)) == pytest.approx(rh_percent, rel=1e-9)


@pytest.mark.parametrize(
    "call, message",
    [
        (lambda: dew_point_c(20.0, 0.0),
         "rh_percent: 0 is outside 0 to 100 %: perfectly dry air (RH 0) has no dew point"),
        (lambda: dew_point_c(20.0, 120.0), "rh_percent: 120 is outside 0 to 100 %"),
        (lambda: dew_point_c(20.0, [50.0, -5.0]), "rh_percent: -5 is outside 0 to 100 %"),
        (lambda: dew_point_c(250.0, 50.0), "air_temp_c: 250 °C is outside -100 to 200 °C"),
        (lambda: dew_point_c(150.0, 90.0),
         "rh_percent: 90 % at 150 °C means a vapour pressure above the total pressure 101325 Pa"),
        (lambda: dew_point_c(20.0, 50.0, 0.0), "pressure_pa: 0 Pa is not a positive absolute pressure"),
        (lambda: relative_humidity_percent(10.0, 12.0),
         "dew_point_c: 12 °C is above the air temperature 10 °C"),
    ],
)
def test_error_messages(call, message):
    with pytest.raises(InputError) as info:
        call()
    assert str(info.value) == message
