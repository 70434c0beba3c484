"""The solver against published worked examples and physical invariants."""

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from pipeins.catalog.materials import lookup_material
from pipeins.model import Fluid, Layer, Pipe, Surface, Surroundings
from pipeins.physics.conduction import Conductivity
from pipeins.solve import solve

GLASS_WOOL_K005 = lookup_material("k=0.05")


def test_cengel_insulated_steam_pipe():
    # Çengel and Ghajar, Heat and Mass Transfer, ch. 3, insulated steam-pipe example (from memory):
    # cast-iron pipe D 5/5.5 cm, k 80; 3 cm glass wool k 0.05; steam 320 °C, h_i 60;
    # surroundings 5 °C, combined h_o 18 -> about 121 W/m and about 284 K across the insulation.
    pipe = Pipe(0.055, 0.0025, 80.0)
    r = solve(pipe, [Layer(GLASS_WOOL_K005, 0.03)], Fluid(320.0, 60.0), Surroundings(5.0),
              Surface(fixed_coefficient_w_m2k=18.0))
    assert float(r.heat_flow) == pytest.approx(121.0, rel=0.01)
    drop = float(r.interface_temps_c[1] - r.interface_temps_c[2])  # pipe outside -> surface
    assert drop == pytest.approx(284.0, rel=0.01)


def test_cengel_matches_hand_resistances():
    # The same case by the series-resistance sum R = 1/(h_i 2πr1) + ln(r2/r1)/(2πk_p)
    # + ln(r3/r2)/(2πk_i) + 1/(h_o 2πr3) (Çengel and Ghajar, ch. 3, Eq. for cylindrical layers).
    r1, r2, r3 = 0.025, 0.0275, 0.0575
    total = (1 / (60 * 2 * math.pi * r1) + math.log(r2 / r1) / (2 * math.pi * 80)
             + math.log(r3 / r2) / (2 * math.pi * 0.05) + 1 / (18 * 2 * math.pi * r3))
    r = solve(Pipe(0.055, 0.0025, 80.0), [Layer(GLASS_WOOL_K005, 0.03)], Fluid(320.0, 60.0),
              Surroundings(5.0), Surface(fixed_coefficient_w_m2k=18.0))
    assert float(r.heat_flow) == pytest.approx(315.0 / total, rel=1e-9)


def test_incropera_example_9_3_bare_steam_pipe():
    # Incropera, DeWitt, Bergman and Lavine, Fundamentals of Heat and Mass Transfer, 6th ed.,
    # Example 9.3 (from memory): horizontal pipe D = 0.1 m, surface 165 °C, air and surroundings
    # 23 °C, emissivity 0.85 -> q' ≈ 765 W/m total, ≈ 324 W/m convection and ≈ 441 W/m radiation.
    # The surface is held at 165 °C by a bare, very conductive wall with no inner film.
    r = solve(Pipe(0.1, 0.001, 1e6), [], Fluid(165.0), Surroundings(23.0), Surface(0.85))
    assert float(r.surface_temp_c) == pytest.approx(165.0, abs=1e-3)
    area = math.pi * 0.1
    conv = float(r.h_conv_w_m2k) * area * 142.0
    rad = float(r.h_rad_w_m2k) * area * 142.0
    assert float(r.heat_flow) == pytest.approx(765.0, rel=0.02)
    assert conv == pytest.approx(324.0, rel=0.02)
    assert rad == pytest.approx(441.0, rel=0.02)


def test_incropera_example_3_5_critical_radius():
    # Incropera et al., 6th ed., Example 3.5: thin-walled tube r_i = 5 mm, insulation k = 0.055,
    # h = 5 W/m²K: critical radius r_cr = k/h = 11 mm; heat flow rises with thickness below it
    # and falls above it.
    thickness = np.linspace(0.0005, 0.030, 300)
    r = solve(Pipe(0.010, 0.0002, 400.0), [Layer(lookup_material("k=0.055"), thickness)],
              Fluid(100.0), Surroundings(25.0), Surface(fixed_coefficient_w_m2k=5.0))
    q = r.heat_flow
    peak_radius = 0.005 + thickness[np.argmax(q)]
    assert peak_radius == pytest.approx(0.011, abs=1e-4)
    rising = 0.005 + thickness < 0.011
    assert np.all(np.diff(q[rising]) > 0)
    assert np.all(np.diff(q[~rising][1:]) < 0)


def test_kirchhoff_layer_matches_mean_conductivity_for_linear_k():
    # For k linear in T, the Kirchhoff integral equals k at the arithmetic mean temperature of the
    # layer times ΔT (exact for linear k; Incropera et al., 6th ed., section 3.2 on k(T) in a wall, from memory).
    mat = lookup_material("mineral wool")
    k = Conductivity.from_points([(0.0, 0.030), (100.0, 0.040)], -50.0, 400.0)
    t1, t2 = 250.0, 40.0
    assert float(k.potential(t1) - k.potential(t2)) == pytest.approx(float(k.conductivity(145.0)) * 210.0, rel=1e-12)
    assert mat.points  # the catalogue material has conductivity points to fit


def test_scalar_list_and_array_agree():
    mat = lookup_material("mineral wool")
    pipe = Pipe(0.0603, 0.0039)
    scalar = [float(solve(pipe, [Layer(mat, t)], Fluid(150.0), Surroundings(20.0)).heat_flow)
              for t in (0.025, 0.05, 0.1)]
    as_list = solve(pipe, [Layer(mat, [0.025, 0.05, 0.1])], Fluid(150.0), Surroundings(20.0))
    as_grid = solve(pipe, [Layer(mat, np.array([[0.025], [0.05], [0.1]]))], Fluid(np.array([150.0, 150.0])),
                    Surroundings(20.0))
    np.testing.assert_allclose(as_list.heat_flow, scalar, rtol=1e-9)
    np.testing.assert_allclose(as_grid.heat_flow[:, 0], scalar, rtol=1e-9)
    assert as_grid.shape == (3, 2)


def test_fixed_outer_coefficient_equal_to_solved_reproduces_heat_flow():
    # Invariant: with the surroundings at the air temperature, a fixed combined coefficient equal
    # to the solved h_conv + h_rad gives back the solved heat flow.
    mat = lookup_material("calcium silicate")
    pipe, layers = Pipe(0.1683, 0.0071), [Layer(mat, 0.075)]
    free = solve(pipe, layers, Fluid(350.0), Surroundings(15.0, wind_speed_m_s=2.0), Surface(0.3))
    h = free.h_conv_w_m2k + free.h_rad_w_m2k
    fixed = solve(pipe, layers, Fluid(350.0), Surroundings(15.0), Surface(fixed_coefficient_w_m2k=float(h)))
    assert float(fixed.heat_flow) == pytest.approx(float(free.heat_flow), rel=1e-8)


def test_equal_temperatures_give_zero_flow():
    r = solve(Pipe(0.0603, 0.0039), [Layer(GLASS_WOOL_K005, 0.03)], Fluid(20.0), Surroundings(20.0))
    assert float(r.heat_flow) == 0.0
    assert float(r.surface_temp_c) == 20.0


def test_converges_over_a_wide_grid_without_nan():
    mat = lookup_material("mineral wool")
    thickness = np.geomspace(0.001, 0.3, 40)[:, None, None]
    fluid = np.linspace(-40.0, 600.0, 25)[None, :, None]
    wind = np.array([0.0, 0.5, 10.0])[None, None, :]
    r = solve(Pipe(0.0213, 0.0028), [Layer(mat, thickness)], Fluid(fluid),
              Surroundings(20.0, wind_speed_m_s=wind), Surface(0.9))
    assert np.all(np.isfinite(r.heat_flow))
    assert r.iterations <= 60
    assert r.residual_w_per_m <= 1e-6 * np.max(np.abs(r.heat_flow))


def test_layer_beyond_service_limit_is_a_named_warning():
    r = solve(Pipe(0.1143, 0.006), [Layer(lookup_material("elastomeric foam"), 0.025)],
              Fluid(180.0), Surroundings(20.0))
    assert any(w.code == "layer.above_service_limit" and w.word("layer") == "1" for w in r.warnings)


# --- invariants (hypothesis) ---------------------------------------------------------------

materials = st.sampled_from(["mineral wool", "calcium silicate", "cellular glass", "k=0.035"])


@settings(max_examples=40, deadline=None)
@given(material=materials, t1=st.floats(0.005, 0.15), t2=st.floats(0.005, 0.15),
       fluid=st.floats(-30.0, 400.0), air=st.floats(-20.0, 40.0), wind=st.floats(0.0, 10.0),
       emittance=st.floats(0.05, 1.0))
def test_interfaces_monotone_and_energy_balance(material, t1, t2, fluid, air, wind, emittance):
    mat = lookup_material(material)
    inner = lookup_material("calcium silicate")
    r = solve(Pipe(0.0889, 0.0055), [Layer(inner, t1), Layer(mat, t2)], Fluid(fluid, 2000.0),
              Surroundings(air, wind_speed_m_s=wind), Surface(emittance))
    temps = r.interface_temps_c
    lo, hi = min(fluid, air), max(fluid, air)
    assert np.all(temps >= lo - 1e-9) and np.all(temps <= hi + 1e-9)
    steps = np.diff(temps) * np.sign(fluid - air)
    assert np.all(steps <= 1e-9)
    flows = r.layer_heat_flows_w_per_m()
    q = float(r.heat_flow)
    assert np.allclose(flows, q, rtol=1e-9, atol=1e-9)


@settings(max_examples=30, deadline=None)
@given(hot=st.floats(30.0, 300.0), cold=st.floats(-20.0, 25.0), k=st.floats(0.02, 0.2),
       h=st.floats(2.0, 50.0), t=st.floats(0.005, 0.2))
def test_swapping_hot_and_cold_flips_the_sign(hot, cold, k, h, t):
    # Exact antisymmetry with constant k and a fixed outer coefficient; with the correlations
    # the sign still flips.
    layers = [Layer(lookup_material(f"k={k}"), t)]
    pipe = Pipe(0.0603, 0.0039)
    a = solve(pipe, layers, Fluid(hot), Surroundings(cold), Surface(fixed_coefficient_w_m2k=h))
    b = solve(pipe, layers, Fluid(cold), Surroundings(hot), Surface(fixed_coefficient_w_m2k=h))
    assert float(a.heat_flow) == pytest.approx(-float(b.heat_flow), rel=1e-9)
    c = solve(pipe, layers, Fluid(cold), Surroundings(hot))
    assert float(c.heat_flow) < 0 < float(a.heat_flow)


@settings(max_examples=30, deadline=None)
@given(material=materials, od=st.sampled_from([0.0213, 0.0603, 0.1143, 0.2191]),
       fluid=st.floats(60.0, 400.0), wind=st.floats(0.0, 8.0))
def test_more_insulation_beyond_critical_radius_never_raises_loss(material, od, fluid, wind):
    mat = lookup_material(material)
    thickness = np.linspace(0.02, 0.2, 30)
    r = solve(Pipe(od, 0.0028), [Layer(mat, thickness)], Fluid(fluid), Surroundings(20.0, wind_speed_m_s=wind))
    # 20 mm of insulation puts every case here past its critical radius (k/h < 20 mm).
    assert np.all(np.diff(r.heat_flow) < 0)


def test_flat_face_matches_plane_wall_resistances():
    # Plane wall in series with films: q'' = ΔT / (1/h_i + L_w/k_w + L/k + 1/h_o)
    # (Incropera et al., 6th ed., Eq. 3.19, the composite plane wall).
    from pipeins.model import FlatWall

    wall = FlatWall(wall_m=0.001, wall_conductivity_w_mk=50.0, length_m=1.0)
    r = solve(wall, [Layer(lookup_material("k=0.04"), 0.05)], Fluid(60.0, 30.0), Surroundings(20.0),
              Surface(fixed_coefficient_w_m2k=8.0))
    expected = 40.0 / (1 / 30.0 + 0.001 / 50.0 + 0.05 / 0.04 + 1 / 8.0)
    assert float(r.heat_flow) == pytest.approx(expected, rel=1e-9)
    assert "heat_flow_w_per_m2" in r.to_dict()


def test_flat_faces_lose_more_facing_up_when_hot():
    # Physical fact: a hot face looking up sheds more heat by natural convection than one looking
    # down (Incropera et al., 6th ed., Eqs. 9.30-9.32).
    from pipeins.model import FlatWall

    flows = {face: float(solve(FlatWall(length_m=0.5, face=face), [Layer(lookup_material("k=0.04"), 0.03)],
                               Fluid(120.0), Surroundings(20.0)).heat_flow)
             for face in ("top", "vertical", "bottom")}
    assert flows["top"] > flows["bottom"]
    assert flows["top"] > 0 and flows["bottom"] > 0
