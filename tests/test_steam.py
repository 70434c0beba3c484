"""Saturated steam (pipeins.props.steam) against IAPWS-IF97 (iapws) and live CoolProp."""

import numpy as np
import pytest

from pipeins.errors import InputError
from pipeins.props import steam

iapws = pytest.importorskip("iapws")

PRESSURES_BAR = [0.02, 0.5, 1.0, 3.0, 10.0, 20.0, 50.0, 100.0, 150.0, 190.0]


@pytest.mark.parametrize(
    "pressure_bar",
    [pytest.param(p, id=f"iapws.IAPWS97 {p:g} bar") for p in PRESSURES_BAR],
)
def test_saturation_temp_and_latent_heat_vs_iapws97(pressure_bar):
    liquid = iapws.IAPWS97(P=pressure_bar / 10.0, x=0.0)  # IAPWS-IF97, P in MPa
    vapour = iapws.IAPWS97(P=pressure_bar / 10.0, x=1.0)
    pressure_pa = pressure_bar * 1e5
    temp_c = float(steam.saturation_temp_c(pressure_pa))
    latent = float(steam.latent_heat_j_kg(pressure_pa))
    assert temp_c == pytest.approx(liquid.T - 273.15, abs=0.05)  # iapws IAPWS-IF97
    assert latent == pytest.approx((vapour.h - liquid.h) * 1e3, rel=1e-3)  # iapws IAPWS-IF97


@pytest.mark.parametrize(
    "temp_c", [pytest.param(t, id=f"iapws.IAPWS97 {t:g} C") for t in (20.0, 100.0, 180.0, 300.0)]
)
def test_saturation_pressure_vs_iapws97(temp_c):
    expected_pa = iapws.IAPWS97(T=temp_c + 273.15, x=0.0).P * 1e6
    assert float(steam.saturation_pressure_pa(temp_c)) == pytest.approx(expected_pa, rel=5e-4)


def test_interpolation_error_vs_live_coolprop():
    # CoolProp PropsSI Water (IAPWS-95), at points between the table's grid points:
    # the docstring promises < 0.001 K and < 0.02 % latent heat.
    from CoolProp.CoolProp import PropsSI

    pressure_pa = np.geomspace(1.013e3, 1.98e7, 157)
    temp_k = PropsSI("T", "P", pressure_pa, "Q", np.zeros_like(pressure_pa), "Water")
    latent = PropsSI("H", "P", pressure_pa, "Q", np.ones_like(pressure_pa), "Water") - PropsSI(
        "H", "P", pressure_pa, "Q", np.zeros_like(pressure_pa), "Water"
    )
    np.testing.assert_allclose(steam.saturation_temp_c(pressure_pa), temp_k - 273.15, atol=1e-3)
    np.testing.assert_allclose(steam.latent_heat_j_kg(pressure_pa), latent, rtol=2e-4)
    np.testing.assert_allclose(steam.saturation_pressure_pa(temp_k - 273.15), pressure_pa, rtol=1e-5)


def test_vectorised_shape_and_round_trip():
    pressure_pa = np.array([[2e4, 1e5], [1e6, 1.5e7]])
    temp_c = steam.saturation_temp_c(pressure_pa)
    assert temp_c.shape == (2, 2)
    np.testing.assert_allclose(steam.saturation_pressure_pa(temp_c), pressure_pa, rtol=1e-5)
    assert isinstance(steam.saturation_temp_c(1e5), np.ndarray)


@pytest.mark.parametrize(
    "call, message",
    [
        (lambda: steam.saturation_temp_c(500.0),
         "--steam-pressure: 500 Pa is outside 1000 Pa to 20 MPa absolute (0.01 to 200 bar absolute)"),
        (lambda: steam.latent_heat_j_kg([1e5, 3e7]),
         "--steam-pressure: 3e+07 Pa is outside 1000 Pa to 20 MPa absolute (0.01 to 200 bar absolute)"),
        (lambda: steam.saturation_pressure_pa(400.0),
         "--steam-temp: 400 °C is outside 6.97 to 365.75 °C (saturation at 0.01 to 200 bar absolute)"),
    ],
)
def test_out_of_range_messages(call, message):
    with pytest.raises(InputError) as info:
        call()
    assert str(info.value) == message
