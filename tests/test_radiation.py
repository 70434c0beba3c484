"""Surface radiation checked against ht.radiation and scipy.constants."""

import numpy as np
import pytest
import scipy.constants
from hypothesis import given, settings
from hypothesis import strategies as st
from ht.radiation import q_rad

from pipeins.errors import InputError
from pipeins.physics.outer import outer_convection_coefficient
from pipeins.physics.radiation import STEFAN_BOLTZMANN, radiation_coefficient_w_m2k, radiative_flux_w_m2


def test_stefan_boltzmann_codata():
    assert STEFAN_BOLTZMANN == pytest.approx(scipy.constants.Stefan_Boltzmann, rel=1e-12)  # scipy.constants, CODATA 2018


@pytest.mark.parametrize("emittance", [0.05, 0.3, 0.85, 1.0])
@pytest.mark.parametrize("surroundings_c", [-20.0, 23.0, 45.0])
def test_flux_matches_ht(emittance, surroundings_c):
    surface_c = np.linspace(-50.0, 600.0, 27)
    ours = radiative_flux_w_m2(surface_c, surroundings_c, emittance)
    ref = [q_rad(emittance, t + 273.15, surroundings_c + 273.15) for t in surface_c]
    assert ours == pytest.approx(ref, rel=5e-3, abs=1e-9)  # ht.radiation.q_rad


def test_ht_docstring_value():
    # ht.radiation.q_rad docstring: eps 0.85, T 400 K, T2 305 K -> 816.78 W/m2
    assert float(radiative_flux_w_m2(400.0 - 273.15, 305.0 - 273.15, 0.85)) == pytest.approx(816.78, rel=1e-5)


@settings(max_examples=60, deadline=None)
@given(st.floats(-80.0, 800.0), st.floats(-40.0, 60.0), st.floats(0.01, 1.0))
def test_coefficient_times_difference_is_flux(surface_c, surroundings_c, emittance):
    h = radiation_coefficient_w_m2k(surface_c, surroundings_c, emittance)
    q = radiative_flux_w_m2(surface_c, surroundings_c, emittance)
    assert float(h * (surface_c - surroundings_c)) == pytest.approx(float(q), rel=1e-9, abs=1e-9)  # Incropera 6th ed. Eq. 1.9


@pytest.mark.parametrize("temp_c", [-20.0, 20.0, 150.0])
def test_small_difference_limit(temp_c):
    # h_r -> 4 eps sigma T^3 as Ts -> Tsur (Incropera 6th ed. Eq. 1.9 linearised)
    t_k = temp_c + 273.15
    h = radiation_coefficient_w_m2k(temp_c + 0.01, temp_c, 0.9)
    assert float(h) == pytest.approx(4 * 0.9 * STEFAN_BOLTZMANN * t_k**3, rel=1e-4)


def test_high_emittance_comparable_to_still_air_convection():
    # common practice (no source): a high-emittance surface some 10 K above still room air
    # loses heat by radiation and natural convection in similar amounts (within a factor 2)
    surface_c, air_c = 33.0, 23.0
    h_rad = float(radiation_coefficient_w_m2k(surface_c, air_c, 0.9))
    for diameter_m in (0.025, 0.1, 0.3, 1.0):
        h_conv = float(outer_convection_coefficient(surface_c, air_c, diameter_m))
        assert 0.5 < h_rad / h_conv < 2.0


def test_broadcast():
    h = radiation_coefficient_w_m2k(np.linspace(0, 100, 5).reshape(5, 1), 20.0, np.array([0.1, 0.5, 0.9]))
    assert h.shape == (5, 3)
    assert np.all(np.diff(h, axis=1) > 0)


@pytest.mark.parametrize("emittance", [0.0, -0.1, 1.01, [0.5, 1.2], float("nan")])
def test_emittance_outside_range(emittance):
    for func in (radiation_coefficient_w_m2k, radiative_flux_w_m2):
        with pytest.raises(InputError) as info:
            func(100.0, 20.0, emittance)
        assert str(info.value) == "--emittance: must be greater than 0 and at most 1"


def test_below_absolute_zero():
    with pytest.raises(InputError):
        radiative_flux_w_m2(-300.0, 20.0, 0.9)
