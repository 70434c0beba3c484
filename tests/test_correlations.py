"""The correlation registry: every record through the lookup, each against an outside source.

Each outer correlation is looked up the way the outer film looks it up
(``lookup(geometry, orientation, kind, side)``), evaluated through its record, and compared
with its counterpart in the reference library ``ht`` called directly (not through ht's
dispatchers), within 0.5 %.  Where ht has no counterpart the comparison is with a hand
evaluation of the published equation, and the test says so.
"""

import math

import numpy as np
import pytest

from ht import conv_external, conv_free_immersed, conv_internal
from ht.conv_supercritical import Nu_Krasnoshchekov

from pipeins.errors import InputError
from pipeins.physics import correlations as registry
from pipeins.physics import outer
from pipeins.physics.correlations import CORRELATIONS, by_key, lookup
from pipeins.reports.notes import render_all

REL = 5e-3  # 0.5 %
PRANDTLS = (0.7, 0.71, 5.0)

# sample groups at which every record can be evaluated
SAMPLE = {"Ra": 1.0e6, "Pr": 0.71, "H": 2.0, "D": 0.1, "Re": 1.0e4, "NuF": 30.0, "NuN": 20.0}


def _slots(record):
    return [(record.geometry, o, record.kind, record.side) for o in record.orientations]


# --------------------------------------------------------------------------- the registry itself


@pytest.mark.parametrize("record", CORRELATIONS, ids=lambda r: r.key)
def test_every_record_runs_through_the_lookup(record):
    for slot in _slots(record):
        assert lookup(*slot) is record
    assert by_key(record.key) is record
    value = record.evaluate(SAMPLE)
    assert np.all(np.isfinite(value)) and np.all(value > 0)


@pytest.mark.parametrize("record", CORRELATIONS, ids=lambda r: r.key)
def test_every_record_is_complete(record):
    assert record.key.startswith(record.kind + "_")
    assert record.kind in ("natural", "forced", "mixing", "internal")
    assert set(record.orientations) <= {"horizontal", "vertical", "top", "bottom", "any"}
    assert record.side in ("hot", "cold", "any")
    assert record.source.authors and record.source.year > 1900 and record.source.equation
    assert record.ranges
    for group, (low, high) in record.ranges.items():
        assert group in registry.GROUP_LABELS
        assert low is not None or high is not None
        assert low is None or high is None or low < high
    if record.kind != "mixing":
        assert record.range_name.startswith("the ")
    if record.base is not None:
        assert by_key(record.base).kind == record.kind and record.regime is not None


def test_keys_are_unique():
    assert len({r.key for r in CORRELATIONS}) == len(CORRELATIONS)


def test_the_outer_film_offers_what_is_registered():
    assert outer.GEOMETRIES == registry.geometries("natural")
    for geometry, orientations in outer.GEOMETRIES.items():
        for orientation in orientations:
            for kind in ("forced", "mixing"):
                assert lookup(geometry, orientation, kind).kind == kind
            for side in ("hot", "cold"):
                assert lookup(geometry, orientation, "natural", side).kind == "natural"


def test_horizontal_faces_hot_and_cold_side():
    # a hot top and a cold bottom shed their buoyant flow (enhanced); the other two hold it (reduced)
    enhanced = {lookup("flat", "top", "natural", "hot"), lookup("flat", "bottom", "natural", "cold")}
    reduced = {lookup("flat", "top", "natural", "cold"), lookup("flat", "bottom", "natural", "hot")}
    assert {r.function for r in enhanced} == {registry.cv.nusselt_horizontal_plate_up_mcadams}
    assert {r.function for r in reduced} == {registry.cv.nusselt_horizontal_plate_down_mcadams}
    assert len(enhanced | reduced) == 4


def test_unknown_combination_and_key():
    with pytest.raises(InputError, match="no forced correlation registered for a top cone"):
        lookup("cone", "top", "forced")
    with pytest.raises(InputError, match='unknown correlation "natural_horizontal_cylindre"'):
        by_key("natural_horizontal_cylindre")


def test_warnings_are_made_from_the_records():
    # the bound and the wording of an outer-film warning come from the record's range
    record = lookup("cylinder", "horizontal", "natural")
    top = record.bound("Ra", 1)
    found = render_all(outer.outer_convection_warnings(60.0, 20.0, [1.0, 8.0]))
    assert found == [f"outer film: Rayleigh number above {registry.group_text(top)} in 1 of 2 cases; "
                     f"beyond {record.range_name}; extrapolated"]
    mask, what, consequence = record.excursions({"Ra": np.array([1e11, 2e12])})[0]
    assert mask.tolist() == [False, True] and what == "Rayleigh number above 1e12"


# --------------------------------------------------------------------------- natural, against ht


@pytest.mark.parametrize("prandtl", PRANDTLS)
def test_horizontal_cylinder_vs_ht(prandtl):
    rayleigh = np.logspace(-5, 12, 18)
    ours = lookup("cylinder", "horizontal", "natural").evaluate({"Ra": rayleigh, "Pr": prandtl})
    ref = [conv_free_immersed.Nu_horizontal_cylinder_Churchill_Chu(prandtl, ra / prandtl) for ra in rayleigh]
    assert ours == pytest.approx(ref, rel=REL)  # ht.conv_free_immersed.Nu_horizontal_cylinder_Churchill_Chu


@pytest.mark.parametrize("prandtl", PRANDTLS)
def test_vertical_plate_vs_ht(prandtl):
    rayleigh = np.logspace(-1, 12, 14)
    ours = lookup("flat", "vertical", "natural").evaluate({"Ra": rayleigh, "Pr": prandtl})
    ref = [conv_free_immersed.Nu_vertical_plate_Churchill(prandtl, ra / prandtl) for ra in rayleigh]
    assert ours == pytest.approx(ref, rel=REL)  # ht.conv_free_immersed.Nu_vertical_plate_Churchill


@pytest.mark.parametrize("height_over_diameter", [1.0, 10.0, 60.0])
def test_vertical_cylinder_vs_ht(height_over_diameter):
    # the record applies the curvature correction everywhere, as ht does (Ra >= 1e4: below it
    # the correction is held at its Ra = 1e4 value, see the function's docstring)
    rayleigh = np.logspace(4, 9, 11)
    groups = {"Ra": rayleigh, "Pr": 0.71, "H": 3.0, "D": 3.0 / height_over_diameter}
    ours = lookup("cylinder", "vertical", "natural").evaluate(groups)
    ref = [conv_free_immersed.Nu_vertical_cylinder_Popiel_Churchill(0.71, ra / 0.71, 3.0, groups["D"])
           for ra in rayleigh]
    assert ours == pytest.approx(ref, rel=REL)  # ht.conv_free_immersed.Nu_vertical_cylinder_Popiel_Churchill


@pytest.mark.parametrize("orientation, side, buoyancy, high", [
    ("top", "hot", True, 1e11), ("bottom", "cold", True, 1e11),  # enhanced: buoyancy-assisted in ht
    ("top", "cold", False, 1e10), ("bottom", "hot", False, 1e10),  # reduced, up to its Ra = 1e10 range end
])
def test_horizontal_faces_vs_ht(orientation, side, buoyancy, high):
    rayleigh = np.logspace(4, math.log10(high), 15)
    ours = lookup("flat", orientation, "natural", side).evaluate({"Ra": rayleigh, "Pr": 0.71})
    ref = [conv_free_immersed.Nu_horizontal_plate_McAdams(0.71, ra / 0.71, buoyancy=buoyancy) for ra in rayleigh]
    assert ours == pytest.approx(ref, rel=REL)  # ht.conv_free_immersed.Nu_horizontal_plate_McAdams(Pr, Gr, buoyancy)


# --------------------------------------------------------------------------- forced, against ht


@pytest.mark.parametrize("orientation", ["horizontal", "vertical"])
@pytest.mark.parametrize("prandtl", PRANDTLS)
def test_cylinder_cross_flow_vs_ht(orientation, prandtl):
    reynolds = np.logspace(0, 7, 15)
    ours = lookup("cylinder", orientation, "forced").evaluate({"Re": reynolds, "Pr": prandtl})
    ref = [conv_external.Nu_cylinder_Churchill_Bernstein(re, prandtl) for re in reynolds]
    assert ours == pytest.approx(ref, rel=REL)  # ht.conv_external.Nu_cylinder_Churchill_Bernstein


@pytest.mark.parametrize("orientation", ["vertical", "top", "bottom"])
@pytest.mark.parametrize("prandtl", PRANDTLS)
def test_flat_face_in_wind_laminar_vs_ht(orientation, prandtl):
    reynolds = np.logspace(2, math.log10(5e5), 12)
    ours = lookup("flat", orientation, "forced").evaluate({"Re": reynolds, "Pr": prandtl})
    ref = [conv_external.Nu_horizontal_plate_laminar_Baehr(re, prandtl) for re in reynolds]
    assert ours == pytest.approx(ref, rel=REL)  # ht.conv_external.Nu_horizontal_plate_laminar_Baehr


@pytest.mark.parametrize("prandtl", PRANDTLS)
def test_flat_face_in_wind_mixed_layer_by_hand(prandtl):
    # ht has no mixed laminar/turbulent plate (its turbulent forms are turbulent from the leading
    # edge): hand evaluation of Incropera et al., 6th ed., Eq. 7.38, Nu = (0.037 Re^4/5 - 871) Pr^1/3
    reynolds = np.logspace(math.log10(6e5), 8, 10)
    ours = lookup("flat", "top", "forced").evaluate({"Re": reynolds, "Pr": prandtl})
    ref = [(0.037 * re**0.8 - 871.0) * prandtl ** (1.0 / 3.0) for re in reynolds]
    assert ours == pytest.approx(ref, rel=REL)  # Incropera et al. 6th ed. Eq. 7.38, by hand


# --------------------------------------------------------------------------- the mixing rule and the pipe


@pytest.mark.parametrize("geometry, orientation", [("cylinder", "horizontal"), ("flat", "bottom")])
def test_mixing_rule_by_hand(geometry, orientation):
    # ht has no mixing rule: hand evaluation of Churchill (1977), Nu³ = Nu_F³ + Nu_N³
    # (Incropera et al. 6th ed. Eq. 9.64 with n = 3, assisting or transverse flow)
    rule = lookup(geometry, orientation, "mixing")
    for forced, natural in [(30.0, 20.0), (5.0, 50.0), (0.0, 7.0), (1e-12, 1e12)]:
        expected = (forced**3 + natural**3) ** (1.0 / 3.0)
        assert float(rule.evaluate({"NuF": forced, "NuN": natural})) == pytest.approx(expected, rel=1e-12)


def test_pipe_record_vs_ht():
    reynolds = np.logspace(4, math.log10(5e6), 10)
    ours = lookup("pipe", "any", "internal").evaluate({"Re": reynolds, "Pr": 7.0})
    friction = [8 * 1.07 * Nu_Krasnoshchekov(re, 1.0) / re for re in reynolds]  # Filonenko f inside ht
    ref = [conv_internal.turbulent_Gnielinski(re, 7.0, fd) for re, fd in zip(reynolds, friction)]
    assert ours == pytest.approx(ref, rel=REL)  # ht.conv_internal.turbulent_Gnielinski


# --------------------------------------------------------------------------- the sphere


@pytest.mark.parametrize("prandtl", PRANDTLS)
def test_sphere_natural_vs_ht(prandtl):
    rayleigh = np.logspace(-2, 13, 16)
    ours = lookup("sphere", "any", "natural").evaluate({"Ra": rayleigh, "Pr": prandtl})
    ref = [conv_free_immersed.Nu_sphere_Churchill(prandtl, ra / prandtl) for ra in rayleigh]
    assert ours == pytest.approx(ref, rel=REL)  # ht.conv_free_immersed.Nu_sphere_Churchill (Churchill 1983)


@pytest.mark.parametrize("prandtl", PRANDTLS)
def test_sphere_natural_laminar_form_by_hand(prandtl):
    # the laminar form, Incropera et al. 6th ed. Eq. 9.35 (Churchill 1983; Ra <= 1e11, Pr >= 0.7),
    # evaluated by hand; the registered full form equals it within 0.5 % up to Ra = 1e6 (2.5e6 in air) and
    # exceeds it beyond (its turbulent term), by more than 10 % at Ra = 1e8
    psi = 1.0 + (0.469 / prandtl) ** (9.0 / 16.0)
    rayleigh = np.logspace(0, 11, 12)
    laminar = [2.0 + 0.589 * ra**0.25 / psi ** (4.0 / 9.0) for ra in rayleigh]
    assert registry.cv.nusselt_sphere_churchill(rayleigh, prandtl, turbulent=False) == pytest.approx(laminar, rel=1e-12)
    record = lookup("sphere", "any", "natural")
    low = np.logspace(0, 6, 8)
    assert record.evaluate({"Ra": low, "Pr": prandtl}) == pytest.approx(
        [2.0 + 0.589 * ra**0.25 / psi ** (4.0 / 9.0) for ra in low], rel=REL)  # Incropera Eq. 9.35, by hand
    assert float(record.evaluate({"Ra": 1e8, "Pr": prandtl})) > 1.1 * (2.0 + 0.589 * 1e8**0.25 / psi ** (4.0 / 9.0))


@pytest.mark.parametrize("prandtl", (0.71, 7.0, 380.0))
def test_sphere_forced_by_hand_and_against_ht_cylinder_form(prandtl):
    # ht has no sphere form of Whitaker (1972): hand evaluation of Incropera et al. 6th ed. Eq. 7.56
    # with the viscosity ratio taken as 1, Nu = 2 + (0.4 Re^1/2 + 0.06 Re^2/3) Pr^0.4
    reynolds = np.logspace(math.log10(3.5), math.log10(7.6e4), 12)
    ours = lookup("sphere", "any", "forced").evaluate({"Re": reynolds, "Pr": prandtl})
    by_hand = [2.0 + (0.4 * re**0.5 + 0.06 * re ** (2.0 / 3.0)) * prandtl**0.4 for re in reynolds]
    assert ours == pytest.approx(by_hand, rel=REL)  # Whitaker (1972), Incropera Eq. 7.56, by hand
    # the same paper's cylinder form in ht shares the Reynolds function, with Pr^0.3 and no leading 2
    cylinder = [conv_external.Nu_cylinder_Whitaker(re, prandtl) for re in reynolds]
    assert ours - 2.0 == pytest.approx(np.array(cylinder) * prandtl**0.1, rel=REL)  # ht.conv_external.Nu_cylinder_Whitaker


def test_sphere_viscosity_ratio_by_hand():
    # Whitaker's (mu_inf/mu_s)^1/4, by hand; the outer film takes it as 1
    nu = registry.cv.nusselt_sphere_whitaker(1e3, 0.71, viscosity_ratio=2.0)
    assert float(nu) == pytest.approx(2.0 + (0.4 * 1e3**0.5 + 0.06 * 1e3 ** (2.0 / 3.0)) * 0.71**0.4 * 2.0**0.25)


def _air(surface_temp_c, air_temp_c, pressure_pa=101325.0):
    """Film properties from CoolProp (scalar calls), beta = 1/T_film, for the pipeline checks."""
    from CoolProp.CoolProp import PropsSI

    film_k = 0.5 * (surface_temp_c + air_temp_c) + 273.15
    rho, mu, k, cp = (PropsSI(key, "T", film_k, "P", pressure_pa, "Air") for key in ("D", "V", "L", "CPMASS"))
    return film_k, mu / rho, k, cp * mu / k


@pytest.mark.parametrize("surface_temp_c, air_temp_c, diameter_m, wind_m_s", [
    (60.0, 15.0, 2.5, 0.0), (150.0, 20.0, 0.3, 0.0), (5.0, 30.0, 4.0, 0.0),
    (60.0, 15.0, 0.5, 0.5), (200.0, -10.0, 3.0, 5.0),
])
def test_sphere_outer_film_vs_ht_and_coolprop(surface_temp_c, air_temp_c, diameter_m, wind_m_s):
    # the whole outer film on a sphere: ht's Nu_sphere_Churchill on CoolProp air at the film
    # temperature, Whitaker by hand with the same air, combined by Churchill's (1977) rule on D
    film_k, nu, k, pr = _air(surface_temp_c, air_temp_c)
    gr = 9.80665 * abs(surface_temp_c - air_temp_c) / film_k * diameter_m**3 / nu**2
    natural = conv_free_immersed.Nu_sphere_Churchill(pr, gr)
    if wind_m_s:
        re = wind_m_s * diameter_m / nu
        forced = 2.0 + (0.4 * re**0.5 + 0.06 * re ** (2.0 / 3.0)) * pr**0.4
        natural = (forced**3 + natural**3) ** (1.0 / 3.0)
    ours = outer.outer_convection_coefficient(surface_temp_c, air_temp_c, diameter_m, wind_m_s, "any", None,
                                              101325.0, "sphere")
    assert float(ours) == pytest.approx(natural * k / diameter_m, rel=REL)  # ht + CoolProp, 0.5 %


def test_sphere_at_equal_temperatures_conducts_to_still_air():
    # Nu -> 2 as Ra -> 0 (conduction from a sphere into an infinite still medium, h = 2k/D)
    from pipeins.props.air import air_properties

    h = float(outer.outer_convection_coefficient(20.0, 20.0, 1.0, orientation="any", geometry="sphere"))
    assert h == pytest.approx(2.0 * float(air_properties(20.0, 101325.0).conductivity_w_mk) / 1.0, rel=1e-12)


def test_sphere_warnings_from_its_records():
    natural, forced = lookup("sphere", "any", "natural"), lookup("sphere", "any", "forced")
    found = render_all(outer.outer_convection_warnings(60.0, 15.0, [0.001, 30.0], [1e-3, 0.0], "any", None,
                                                       101325.0, "sphere"))
    assert found == [
        f"outer film: Rayleigh number above {registry.group_text(natural.bound('Ra', 1))} on a sphere in 1 of 2 "
        "cases; beyond the Churchill (1983) sphere range; extrapolated",
        "outer film: Reynolds number below 3.5 over a sphere in 1 of 2 cases; below the Whitaker (1972) sphere "
        "range; extrapolated",
    ]
    windy = render_all(outer.outer_convection_warnings(60.0, 15.0, 2.5, 3.0, "any", None, 101325.0, "sphere"))
    assert windy[0] == (f"outer film: Reynolds number above {registry.group_text(forced.bound('Re', 1))} over a "
                        "sphere; beyond the Whitaker (1972) sphere range; extrapolated")
    assert registry.group_text(forced.bound("Re", 1)) == "7.6e4"
    assert outer.outer_convection_warnings(60.0, 15.0, 0.5, orientation="any", geometry="sphere") == []


def test_sphere_through_the_solver():
    # a sphere section with real films: the solver's convective coefficient is the outer film's
    # at the converged surface temperature, and the surface balance closes
    from pipeins.catalog.materials import lookup_material
    from pipeins.geometry.sphere import Sphere
    from pipeins.model import Fluid, Layer, Surface, Surroundings
    from pipeins.physics.radiation import radiative_flux_w_m2
    from pipeins.solve import solve

    class _Section:
        wall_m, wall_conductivity_w_mk = 0.012, 50.0

        def shape(self, surroundings):
            return Sphere(np.array([1.0, 2.5, 4.0]), 0.012)

    surroundings = Surroundings(15.0, wind_speed_m_s=np.array([0.0, 0.0, 4.0]))
    result = solve(_Section(), [Layer(lookup_material("mineral wool"), 0.05)], Fluid(180.0), surroundings,
                   Surface(0.9))
    ts = np.asarray(result.surface_temp_c)
    outer_d = np.array([1.0, 2.5, 4.0]) + 0.1
    h = outer.outer_convection_coefficient(ts, 15.0, outer_d, surroundings.wind_speed_m_s, "any", None,
                                           101325.0, "sphere")
    assert np.asarray(result.h_conv_w_m2k) == pytest.approx(h, rel=1e-9)
    flux = h * (ts - 15.0) + radiative_flux_w_m2(ts, 15.0, 0.9)
    assert np.asarray(result.outer_heat_flux_w_m2) == pytest.approx(flux, rel=1e-6)
    assert result.basis == "W"
