"""Outer and inner film coefficients: worked example, cross-checks with ht + CoolProp, physics."""

import math
import time

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import fluids.core
from CoolProp.CoolProp import PropsSI
from ht import conv_external, conv_free_immersed, conv_internal
from ht.conv_supercritical import Nu_Krasnoshchekov

from pipeins.errors import InputError
from pipeins.physics.inner import inner_film_coefficient, inner_film_warnings, reynolds_number
from pipeins.physics.outer import outer_convection_coefficient, outer_convection_warnings
from pipeins.physics.radiation import radiative_flux_w_m2
from pipeins.reports.notes import render_all

G = 9.80665


def reference_air(surface_temp_c, air_temp_c, pressure_pa=101325.0):
    """Film properties straight from CoolProp (scalar calls) for the ht cross-checks."""
    film_k = 0.5 * (surface_temp_c + air_temp_c) + 273.15
    rho, mu, k, cp = (PropsSI(key, "T", film_k, "P", pressure_pa, "Air") for key in ("D", "V", "L", "CPMASS"))
    return film_k, rho, mu, k, fluids.core.Prandtl(Cp=cp, k=k, mu=mu)


def reference_natural(surface_temp_c, air_temp_c, length_m):
    """(Gr, Pr, k) on *length_m* via fluids.core.Grashof with beta = 1/T_film."""
    film_k, rho, mu, k, pr = reference_air(surface_temp_c, air_temp_c)
    gr = fluids.core.Grashof(length_m, 1.0 / film_k, surface_temp_c, air_temp_c, rho=rho, mu=mu)
    return gr, pr, k


# --------------------------------------------------------------------------- worked example


def test_incropera_example_9_3_horizontal_steam_pipe():
    # Incropera 6th ed. Example 9.3: D = 0.1 m, Ts = 165 °C, air and walls 23 °C, eps = 0.85.
    # Book values from memory: h = 7.29 W/m2K, q'conv = 325 W/m, q'rad = 441 W/m (2 % tolerance).
    diameter_m = 0.1
    h = float(outer_convection_coefficient(165.0, 23.0, diameter_m))
    assert h == pytest.approx(7.29, rel=0.02)  # Incropera 6th ed. Ex. 9.3, from memory
    q_conv = h * math.pi * diameter_m * (165.0 - 23.0)
    assert q_conv == pytest.approx(325.0, rel=0.02)  # Incropera 6th ed. Ex. 9.3, from memory
    q_rad = float(radiative_flux_w_m2(165.0, 23.0, 0.85)) * math.pi * diameter_m
    assert q_rad == pytest.approx(441.0, rel=0.02)  # Incropera 6th ed. Ex. 9.3, from memory


# --------------------------------------------------------------------------- pipeline vs ht + CoolProp


@pytest.mark.parametrize("surface_temp_c, air_temp_c, diameter_m", [(165.0, 23.0, 0.1), (60.0, 20.0, 0.3), (5.0, 30.0, 0.05), (400.0, -10.0, 0.6)])
def test_horizontal_cylinder_vs_ht(surface_temp_c, air_temp_c, diameter_m):
    gr, pr, k = reference_natural(surface_temp_c, air_temp_c, diameter_m)
    ref = conv_free_immersed.Nu_horizontal_cylinder_Churchill_Chu(pr, gr) * k / diameter_m
    ours = outer_convection_coefficient(surface_temp_c, air_temp_c, diameter_m)
    assert float(ours) == pytest.approx(ref, rel=5e-3)  # ht Nu_horizontal_cylinder_Churchill_Chu + CoolProp Air


@pytest.mark.parametrize("diameter_m", [0.03, 0.1, 1.2])
def test_vertical_cylinder_vs_ht(diameter_m):
    height_m, ts, ta = 2.5, 80.0, 20.0
    gr, pr, k = reference_natural(ts, ta, height_m)
    # The outer film applies Popiel's curvature correction on both sides of the thin-cylinder
    # criterion (it tends to 1 for thick cylinders) so that h is continuous for the solver.
    nu = conv_free_immersed.Nu_vertical_cylinder_Popiel_Churchill(pr, gr, height_m, diameter_m)
    ours = outer_convection_coefficient(ts, ta, diameter_m, orientation="vertical", height_m=height_m)
    assert float(ours) == pytest.approx(nu * k / height_m, rel=5e-3)  # ht Nu_vertical_cylinder_Popiel_Churchill
    if diameter_m / height_m >= 35.0 / gr**0.25:  # thick: within 1.5 % of the plate (Incropera 6th ed. Eq. 9.33)
        plate = conv_free_immersed.Nu_vertical_plate_Churchill(pr, gr)
        assert float(ours) == pytest.approx(plate * k / height_m, rel=0.015)


def test_flat_faces_vs_ht():
    ts, ta, length_m, height_m = 70.0, 15.0, 0.4, 1.5
    gr, pr, k = reference_natural(ts, ta, height_m)
    side = outer_convection_coefficient(ts, ta, length_m, orientation="vertical", height_m=height_m, geometry="flat")
    assert float(side) == pytest.approx(
        conv_free_immersed.Nu_vertical_plate_Churchill(pr, gr) * k / height_m, rel=5e-3
    )  # ht Nu_vertical_plate_Churchill
    gr, pr, k = reference_natural(ts, ta, length_m)
    top = outer_convection_coefficient(ts, ta, length_m, orientation="top", geometry="flat")
    bottom = outer_convection_coefficient(ts, ta, length_m, orientation="bottom", geometry="flat")
    assert float(top) == pytest.approx(
        conv_free_immersed.Nu_horizontal_plate_McAdams(pr, gr, buoyancy=True) * k / length_m, rel=5e-3
    )  # ht Nu_horizontal_plate_McAdams, hot face up = enhanced
    assert float(bottom) == pytest.approx(
        conv_free_immersed.Nu_horizontal_plate_McAdams(pr, gr, buoyancy=False) * k / length_m, rel=5e-3
    )  # ht Nu_horizontal_plate_McAdams, hot face down = reduced


def test_cold_faces_swap_enhanced_and_reduced():
    # cold top face = reduced, cold bottom face = enhanced (Incropera 6th ed. Fig. 9.6, from memory)
    ts, ta, length_m = 5.0, 30.0, 0.4
    gr, pr, k = reference_natural(ts, ta, length_m)
    gr = abs(gr)
    top = outer_convection_coefficient(ts, ta, length_m, orientation="top", geometry="flat")
    bottom = outer_convection_coefficient(ts, ta, length_m, orientation="bottom", geometry="flat")
    assert float(top) == pytest.approx(
        conv_free_immersed.Nu_horizontal_plate_McAdams(pr, gr, buoyancy=False) * k / length_m, rel=5e-3
    )  # ht Nu_horizontal_plate_McAdams
    assert float(bottom) == pytest.approx(
        conv_free_immersed.Nu_horizontal_plate_McAdams(pr, gr, buoyancy=True) * k / length_m, rel=5e-3
    )  # ht Nu_horizontal_plate_McAdams


@pytest.mark.parametrize("wind_m_s", [0.5, 3.0, 12.0])
def test_cylinder_in_wind_vs_ht(wind_m_s):
    ts, ta, diameter_m = 90.0, 10.0, 0.25
    film_k, rho, mu, k, pr = reference_air(ts, ta)
    re = fluids.core.Reynolds(V=wind_m_s, D=diameter_m, rho=rho, mu=mu)
    nu_forced = conv_external.Nu_cylinder_Churchill_Bernstein(re, pr)
    gr, pr, k = reference_natural(ts, ta, diameter_m)
    nu_natural = conv_free_immersed.Nu_horizontal_cylinder_Churchill_Chu(pr, gr)
    ref = (nu_forced**3 + nu_natural**3) ** (1 / 3) * k / diameter_m  # Churchill 1977 rule, n = 3
    ours = outer_convection_coefficient(ts, ta, diameter_m, wind_speed_m_s=wind_m_s)
    assert float(ours) == pytest.approx(ref, rel=5e-3)  # ht Nu_cylinder_Churchill_Bernstein + Churchill_Chu


def test_flat_face_in_wind_vs_ht_laminar():
    ts, ta, length_m, wind_m_s = 50.0, 20.0, 1.0, 2.0
    film_k, rho, mu, k, pr = reference_air(ts, ta)
    re = fluids.core.Reynolds(V=wind_m_s, D=length_m, rho=rho, mu=mu)
    assert re < 5e5
    nu_forced = conv_external.Nu_horizontal_plate_laminar_Baehr(re, pr)
    gr, pr, k = reference_natural(ts, ta, length_m)
    nu_natural = conv_free_immersed.Nu_horizontal_plate_McAdams(pr, gr, buoyancy=True)
    ref = (nu_forced**3 + nu_natural**3) ** (1 / 3) * k / length_m
    ours = outer_convection_coefficient(ts, ta, length_m, wind_speed_m_s=wind_m_s, orientation="top", geometry="flat")
    assert float(ours) == pytest.approx(ref, rel=5e-3)  # ht Nu_horizontal_plate_laminar_Baehr + McAdams


# --------------------------------------------------------------------------- physical facts

CONFIGS = [
    dict(),
    dict(orientation="vertical", height_m=3.0),
    dict(orientation="vertical", height_m=3.0, geometry="flat"),
    dict(orientation="top", geometry="flat"),
    dict(orientation="bottom", geometry="flat"),
]


@pytest.mark.parametrize("config", CONFIGS)
def test_equal_temperatures_give_finite_limit(config):
    h = outer_convection_coefficient([20.0, 20.0], 20.0, 0.2, **config)  # RuntimeWarning is an error here
    assert np.all(np.isfinite(h)) and np.all(h >= 0)


def test_equal_temperatures_limits():
    from pipeins.props.air import air_properties

    k = float(air_properties(20.0).conductivity_w_mk)
    # Ra -> 0: Churchill & Chu horizontal cylinder -> 0.6^2, vertical plate -> 0.825^2
    assert float(outer_convection_coefficient(20.0, 20.0, 0.2)) == pytest.approx(0.36 * k / 0.2, rel=1e-9)
    flat_side = outer_convection_coefficient(20.0, 20.0, 0.2, orientation="vertical", height_m=2.0, geometry="flat")
    assert float(flat_side) == pytest.approx(0.825**2 * k / 2.0, rel=1e-9)
    assert float(outer_convection_coefficient(20.0, 20.0, 0.2, orientation="top", geometry="flat")) == 0.0


@pytest.mark.parametrize("config", CONFIGS)
def test_natural_h_grows_with_temperature_difference(config):
    # physical fact: buoyancy grows with |Ts - Ta|
    # (a 50 mm x 3 m vertical pipe stays on the slender side of the thin-cylinder criterion)
    delta = np.linspace(0.5, 200.0, 200)
    hot = outer_convection_coefficient(20.0 + delta, 20.0, 0.05, **config)
    assert np.all(np.diff(hot) > 0)
    cold = outer_convection_coefficient(20.0 - delta / 2, 20.0, 0.05, **config)
    assert np.all(np.diff(cold) > 0)


def test_vertical_cylinder_continuous_across_thin_to_thick():
    # The outer film keeps the curvature correction on both sides of D/L = 35/Gr^(1/4)
    # (Incropera 6th ed. Eq. 9.33), so h rises smoothly with ΔT; the plain switch would step
    # down by about 6 % at the boundary, which the solver's bracket cannot close over.
    delta = np.linspace(0.5, 200.0, 400)
    h = outer_convection_coefficient(20.0 + delta, 20.0, 0.2, orientation="vertical", height_m=3.0)
    step = np.diff(h) / h[:-1]
    assert np.all(step > 0)


@settings(max_examples=40, deadline=None)
@given(
    surface=st.floats(-40.0, 400.0),
    wind=st.floats(0.01, 20.0),
    diameter=st.floats(0.02, 1.5),
)
def test_wind_never_lowers_h(surface, wind, diameter):
    # physical fact: mixed >= max(forced, natural)
    still = outer_convection_coefficient(surface, 20.0, diameter)
    windy = outer_convection_coefficient(surface, 20.0, diameter, wind_speed_m_s=wind)
    assert float(windy) >= float(still) * (1 - 1e-12)


def test_h_grows_with_wind():
    wind = np.linspace(0.0, 15.0, 60)
    h = outer_convection_coefficient(60.0, 20.0, 0.15, wind_speed_m_s=wind)
    assert np.all(np.diff(h) > 0)


def test_thin_air_lowers_natural_h():
    # physical fact: Ra ~ rho^2, so a site at altitude (lower pressure) convects less
    sea, high = outer_convection_coefficient(80.0, 20.0, 0.2, pressure_pa=[101325.0, 70000.0])
    assert high < sea


def test_broadcast_and_speed():
    ts = np.linspace(-30.0, 300.0, 10_000).reshape(100, 100)
    wind = np.linspace(0.0, 10.0, 100)
    t0 = time.perf_counter()
    h = outer_convection_coefficient(ts, 20.0, 0.3, wind_speed_m_s=wind)
    elapsed = time.perf_counter() - t0
    assert h.shape == (100, 100) and np.all(np.isfinite(h))
    assert elapsed < 0.2


# --------------------------------------------------------------------------- input errors and warnings


def test_vertical_needs_height():
    with pytest.raises(InputError) as info:
        outer_convection_coefficient(60.0, 20.0, 0.1, orientation="vertical")
    assert info.value.name == "--height"
    with pytest.raises(InputError, match="--height: must be greater than 0 m"):
        outer_convection_coefficient(60.0, 20.0, 0.1, orientation="vertical", height_m=[2.0, 0.0])


def test_bad_orientation_and_geometry():
    with pytest.raises(InputError) as info:
        outer_convection_coefficient(60.0, 20.0, 0.1, orientation="horizontal", geometry="flat")
    assert str(info.value) == '--orientation: "horizontal" is not an orientation of a flat; use "vertical", "top", "bottom"'
    with pytest.raises(InputError) as info:
        outer_convection_coefficient(60.0, 20.0, 0.1, geometry="cone")
    assert str(info.value) == '--geometry: unknown geometry "cone"; use "cylinder", "flat" or "sphere"'
    with pytest.raises(InputError) as info:
        outer_convection_coefficient(60.0, 20.0, 0.1, geometry="sphere")  # the default orientation is a cylinder's
    assert str(info.value) == '--orientation: "horizontal" is not an orientation of a sphere; use "any"'


@pytest.mark.parametrize(
    "kwargs, name",
    [
        (dict(wind_speed_m_s=-1.0), "wind_m_s"),
        (dict(characteristic_length_m=0.0), "characteristic_length_m"),
        (dict(pressure_pa=0.0), "pressure_pa"),
        (dict(air_temp_c=-300.0), "air_temp_c"),
    ],
)
def test_impossible_outer_inputs(kwargs, name):
    args = dict(surface_temp_c=60.0, air_temp_c=20.0, characteristic_length_m=0.1) | kwargs
    with pytest.raises(InputError) as info:
        outer_convection_coefficient(**args)
    assert info.value.name == name


def test_outer_warnings():
    assert outer_convection_warnings([60.0, 120.0], 20.0, 0.2) == []
    found = render_all(outer_convection_warnings(60.0, 20.0, [1.0, 8.0]))  # Ra_D beyond 1e12 for the 8 m cylinder
    assert found == [
        "outer film: Rayleigh number above 1e12 in 1 of 2 cases; "
        "beyond the Churchill & Chu (1975) horizontal-cylinder range; extrapolated"
    ]
    slender = outer_convection_warnings(60.0, 20.0, 0.02, orientation="vertical", height_m=6.0)
    assert any("taller than 60 diameters" in w for w in render_all(slender))
    assert all(w.code == "film.outer.range" for w in slender)


# --------------------------------------------------------------------------- inner film


def water(temp_c):
    t_k = temp_c + 273.15
    return tuple(PropsSI(key, "T", t_k, "P", 5e5, "Water") for key in ("D", "V", "L", "CPMASS"))


@pytest.mark.parametrize("velocity_m_s", [0.3, 1.0, 3.0])
def test_inner_turbulent_water_vs_ht(velocity_m_s):
    rho, mu, k, cp = water(60.0)
    diameter_m = 0.0525
    re = fluids.core.Reynolds(V=velocity_m_s, D=diameter_m, rho=rho, mu=mu)
    pr = fluids.core.Prandtl(Cp=cp, k=k, mu=mu)
    assert re > 1e4
    fd = 8 * 1.07 * Nu_Krasnoshchekov(re, 1.0) / re  # Filonenko friction factor as used inside ht
    ref = conv_internal.turbulent_Gnielinski(re, pr, fd) * k / diameter_m
    ours = inner_film_coefficient(velocity_m_s, diameter_m, rho, mu, k, cp)
    assert float(ours) == pytest.approx(ref, rel=5e-3)  # ht.conv_internal.turbulent_Gnielinski + CoolProp water


def test_inner_laminar_oil_vs_ht():
    # a viscous heat-transfer oil (invented property values), creeping flow
    rho, mu, k, cp = 850.0, 0.05, 0.13, 2100.0
    ours = inner_film_coefficient(0.5, 0.1, rho, mu, k, cp)
    assert float(reynolds_number(0.5, 0.1, rho, mu)) < 2300
    assert float(ours) == pytest.approx(conv_internal.laminar_Q_const() * k / 0.1, rel=1e-9)  # ht laminar_Q_const


def test_reynolds_vs_fluids():
    assert float(reynolds_number(2.0, 0.08, 990.0, 5.5e-4)) == pytest.approx(
        fluids.core.Reynolds(V=2.0, D=0.08, rho=990.0, mu=5.5e-4), rel=1e-12
    )  # fluids.core.Reynolds


@pytest.mark.parametrize("velocity", [0.0, -1.0, [1.0, 0.0]])
def test_inner_velocity_must_be_positive(velocity):
    with pytest.raises(InputError) as info:
        inner_film_coefficient(velocity, 0.05, 998.0, 1e-3, 0.6, 4182.0)
    assert info.value.name == "--velocity"


def test_inner_broadcast_and_warnings():
    h = inner_film_coefficient(np.array([0.01, 0.1, 1.0, 3.0]), 0.05, 998.0, 1e-3, 0.6, 4182.0)
    assert h.shape == (4,) and np.all(np.diff(h) > 0)
    found = render_all(inner_film_warnings(np.array([0.01, 0.1, 1.0, 3.0]), 0.05, 998.0, 1e-3, 0.6, 4182.0))
    assert found[0].startswith("inner film: laminar flow (Re below 2300) in 1 of 4 cases")
    assert found[1].startswith("inner film: transitional flow (Re 2300 to 10000) in 1 of 4 cases")
