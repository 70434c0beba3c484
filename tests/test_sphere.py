"""The sphere shape (pipeins.geometry.sphere): spherical-shell conduction against its
closed form, k(T) through the Kirchhoff integral against a numerical integration of the
radial heat equation, and the shape inside the solver with a fixed outer film."""

import math
from dataclasses import dataclass

import numpy as np
import pytest

from pipeins.catalog.materials import lookup_material
from pipeins.geometry.sphere import Sphere, sphere_layer_factors
from pipeins.model import Fluid, Layer, Surface, Surroundings
from pipeins.physics import conduction
from pipeins.solve import solve


@dataclass(frozen=True)
class _SphereSection:
    """The least a section needs to reach the solver: a wall and a shape."""

    outer_diameter_m: float
    wall_m: float
    wall_conductivity_w_mk: float = 50.0

    def shape(self, surroundings):
        return Sphere(self.outer_diameter_m, self.wall_m)


@pytest.mark.parametrize("r1, r2, k", [
    pytest.param(0.5, 0.6, 0.04, id="Incropera-6ed-Eq3.36-thin"),
    pytest.param(1.25, 1.40, 0.035, id="Incropera-6ed-Eq3.36-vessel"),
    pytest.param(0.01, 1.0, 1.0, id="Incropera-6ed-Eq3.36-thick"),
])
def test_shell_resistance_is_the_closed_form(r1, r2, k):
    # Spherical shell R = (1/r1 − 1/r2)/(4πk) (Incropera, DeWitt et al., Fundamentals of
    # Heat and Mass Transfer, 6th ed., Eq. 3.36, from memory).
    factor = sphere_layer_factors([r1, r2])[0]
    assert factor / k == pytest.approx((1 / r1 - 1 / r2) / (4 * math.pi * k), rel=1e-14)
    # and the shell equals a plane of the same thickness over the geometric-mean area
    assert factor == pytest.approx((r2 - r1) / (4 * math.pi * r1 * r2), rel=1e-14)


def test_network_of_a_whole_sphere():
    shape = Sphere(2.5, 0.012)
    c = {"od": np.array([2.5]), "wall": np.array([0.012]), "length": np.array([np.nan])}
    net = shape.network(c, [np.array([0.05]), np.array([0.03])])
    r0, r1, r2, r3 = 1.25 - 0.012, 1.25, 1.30, 1.33
    assert net.inner_film_factor[0] == pytest.approx(1 / (4 * math.pi * r0**2), rel=1e-14)
    assert net.wall_factor[0] == pytest.approx((1 / r0 - 1 / r1) / (4 * math.pi), rel=1e-14)
    assert net.layer_factors[0][0] == pytest.approx((1 / r1 - 1 / r2) / (4 * math.pi), rel=1e-14)
    assert net.layer_factors[1][0] == pytest.approx((1 / r2 - 1 / r3) / (4 * math.pi), rel=1e-14)
    assert net.outer_area[0] == pytest.approx(4 * math.pi * r3**2, rel=1e-14)
    assert net.film_length_m[0] == pytest.approx(2 * r3, rel=1e-14)
    assert net.film_height_m is None and net.outer_radius_m[0] == pytest.approx(r3)
    assert (shape.kind, shape.basis, shape.correlation_key) == ("sphere", "W", ("sphere", "any"))


def test_critical_radius_is_2k_over_h():
    # r_c = 2k/h for a sphere (Incropera et al., 6th ed., §3.4.2, from memory)
    assert Sphere(0.1, 0.002).critical_radius_m(0.04, 8.0) == pytest.approx(0.01)


def test_kirchhoff_layer_with_k_of_t_matches_the_radial_heat_equation():
    # k(T) of a shipped material through the Kirchhoff potential: q = ΔΘ / factor.
    # Independent check: integrate dT/dr = −q / (4π r² k(T)) from r1 (at T1) to r2 with
    # scipy's solve_ivp and land on T2.
    from scipy.integrate import solve_ivp

    fit = conduction.conductivity_of(lookup_material("mineral wool"))
    r1, r2, t1, t2 = 0.75, 0.90, 350.0, 40.0
    factor = sphere_layer_factors([r1, r2])[0]
    q = (fit.potential(t1) - fit.potential(t2)) / factor
    sol = solve_ivp(lambda r, t: -q / (4 * math.pi * r**2 * fit.conductivity(t)), (r1, r2), [t1],
                    rtol=1e-11, atol=1e-11)
    assert sol.y[0, -1] == pytest.approx(t2, abs=1e-6)
    # k(T) matters here: a constant k at the mean temperature is off by more than 1 %
    q_mean_k = (t1 - t2) * fit.conductivity(0.5 * (t1 + t2)) / factor
    assert abs(q_mean_k / q - 1) > 0.01


def test_solver_on_a_sphere_equals_the_series_resistances():
    # Constant k and a fixed outer coefficient: the solver's heat flow is ΔT over the sum
    # of inner film, wall, layer and outer resistances (closed forms, Incropera Eq. 3.36).
    d, wall, t, k, h_i, h_o = 2.5, 0.012, 0.08, 0.04, 500.0, 10.0
    r = solve(_SphereSection(d, wall), [Layer(lookup_material(f"k={k}"), t)],
              Fluid(150.0, film_coefficient_w_m2k=h_i), Surroundings(10.0),
              Surface(fixed_coefficient_w_m2k=h_o))
    r0, r1, r2 = d / 2 - wall, d / 2, d / 2 + t
    total = (1 / (h_i * 4 * math.pi * r0**2) + (1 / r0 - 1 / r1) / (4 * math.pi * 50.0)
             + (1 / r1 - 1 / r2) / (4 * math.pi * k) + 1 / (h_o * 4 * math.pi * r2**2))
    assert float(r.heat_flow) == pytest.approx(140.0 / total, rel=1e-9)
    assert r.basis == "W"
    assert float(r.outer_heat_flux_w_m2) == pytest.approx(140.0 / total / (4 * math.pi * r2**2), rel=1e-9)


def test_solver_on_a_sphere_with_k_of_t_matches_the_radial_heat_equation():
    from scipy.integrate import solve_ivp

    material = lookup_material("mineral wool")
    fit = conduction.conductivity_of(material)
    d, t, h_o = 1.6, 0.1, 12.0
    r = solve(_SphereSection(d, 0.01, 1e6), [Layer(material, t)], Fluid(300.0), Surroundings(20.0),
              Surface(fixed_coefficient_w_m2k=h_o))
    q, ts = float(r.heat_flow), float(r.surface_temp_c)
    r1, r2 = d / 2, d / 2 + t
    assert q == pytest.approx(h_o * 4 * math.pi * r2**2 * (ts - 20.0), rel=1e-9)
    t_bore = float(r.interface_temps_c[1])
    sol = solve_ivp(lambda rr, tt: -q / (4 * math.pi * rr**2 * fit.conductivity(tt)), (r1, r2), [t_bore],
                    rtol=1e-11, atol=1e-11)
    assert sol.y[0, -1] == pytest.approx(ts, abs=1e-5)


def test_worked_example_liquid_nitrogen_sphere():
    # Incropera, DeWitt et al., Fundamentals of Heat and Mass Transfer, 6th ed., Ch. 3: a thin
    # metal sphere of 0.5 m holding liquid nitrogen at 77 K, 25 mm of evacuated reflective
    # insulation (k = 0.0017 W/(m·K)), air at 300 K with h = 20 W/(m²·K): heat gain 13.06 W and
    # a boil-off of about 5.6 kg/day at h_fg = 2e5 J/kg (values from memory).
    r = solve(_SphereSection(0.5, 1e-4, 1e6), [Layer(lookup_material("k=0.0017"), 0.025)],
              Fluid(77.0 - 273.15), Surroundings(300.0 - 273.15), Surface(fixed_coefficient_w_m2k=20.0))
    q = float(r.heat_flow)
    assert q == pytest.approx(-13.06, abs=0.005)  # negative: a heat gain
    assert -q / 2e5 * 86400 == pytest.approx(5.64, abs=0.01)
