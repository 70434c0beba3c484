"""Vessel heads (pipeins.geometry.heads): areas, depths and volumes against fluids.geometry
(an independent reference library) and the published closed forms, the parallel-surface
areas against an explicit offset of the head's profile, and the head's conduction factor
against a numerical integration."""

import math

import numpy as np
import pytest

from pipeins.errors import InputError
from pipeins.geometry.heads import (DishedHead, head_area_m2, head_curvature, head_depth_m,
                                    head_layer_factors, head_volume_m3, normalise_head)
from pipeins.geometry.sphere import Sphere

fluids_geometry = pytest.importorskip("fluids.geometry")


@pytest.mark.parametrize("d", [0.8, 2.0, 3.6])
def test_two_to_one_head_area_depth_volume(d):
    # fluids.geometry.SA_ellipsoidal_head (exact oblate-spheroid area) and
    # V_vertical_ellipsoidal filled to the head's depth; 1.084·D² and π·D³/24 (from memory).
    assert head_area_m2("2:1", d) == pytest.approx(fluids_geometry.SA_ellipsoidal_head(d, d / 4), rel=1e-12)
    assert head_area_m2("2:1", d) == pytest.approx(1.084 * d**2, rel=1e-3)
    a, c = d / 2, d / 4
    e = math.sqrt(1 - c**2 / a**2)
    exact = math.pi * a**2 + math.pi * c**2 / (2 * e) * math.log((1 + e) / (1 - e))
    assert head_area_m2("2:1", d) == pytest.approx(exact, rel=1e-12)
    assert head_depth_m("2:1", d) == pytest.approx(d / 4)
    assert head_volume_m3("2:1", d) == pytest.approx(math.pi * d**3 / 24, rel=1e-12)
    assert head_volume_m3("2:1", d) == pytest.approx(fluids_geometry.V_vertical_ellipsoidal(d, d / 4, d / 4),
                                                     rel=1e-12)


@pytest.mark.parametrize("d", [1.0, 2.5])
def test_hemispherical_head(d):
    # 2πR² and 2/3·πR³ (any geometry handbook); fluids.geometry.SA_partial_sphere
    r = d / 2
    assert head_area_m2("hemispherical", d) == pytest.approx(2 * math.pi * r**2, rel=1e-14)
    assert head_area_m2("hemispherical", d) == pytest.approx(fluids_geometry.SA_partial_sphere(d, r), rel=1e-12)
    assert head_volume_m3("hemispherical", d) == pytest.approx(2 / 3 * math.pi * r**3, rel=1e-14)
    assert head_depth_m("hemispherical", d) == pytest.approx(r)


@pytest.mark.parametrize("d", [1.0, 3.0])
def test_torispherical_head_against_fluids(d):
    # fluids.geometry.SA_torispheroidal and V_vertical_torispherical (crown 1.0 D, knuckle 0.1 D)
    assert head_area_m2("torispherical", d) == pytest.approx(fluids_geometry.SA_torispheroidal(d, 1.0, 0.1),
                                                             rel=1e-12)
    h = float(head_depth_m("torispherical", d))
    assert head_volume_m3("torispherical", d) == pytest.approx(
        fluids_geometry.V_vertical_torispherical(d, 1.0, 0.1, h), rel=1e-12)
    assert h / d == pytest.approx(0.194, abs=1e-3)  # from memory: about 0.194 D


def test_flat_head():
    assert head_area_m2("flat", 2.0) == pytest.approx(math.pi)
    assert head_area_m2("flat", 2.0, 0.1) == pytest.approx(math.pi * 1.1**2)
    assert head_volume_m3("flat", 2.0) == 0.0 and head_depth_m("flat", 2.0) == 0.0


def _offset_area_of_ellipse_head(d, s):
    """The parallel surface of a 2:1 head built point by point: profile x = a sinθ,
    z = c cosθ, moved s along its unit normal; area of revolution 2π∫x|dp/dθ|dθ."""
    from scipy.integrate import quad

    a, c = d / 2, d / 4

    def point(th):
        x, z = a * math.sin(th), c * math.cos(th)
        nx, nz = x / a**2, z / c**2
        n = math.hypot(nx, nz)
        return x + s * nx / n, z + s * nz / n

    def integrand(th, h=1e-6):
        (x1, z1), (x2, z2) = point(th - h), point(th + h)
        x, _ = point(th)
        return 2 * math.pi * x * math.hypot(x2 - x1, z2 - z1) / (2 * h)

    return quad(integrand, 1e-7, math.pi / 2 - 1e-7, epsabs=1e-12, epsrel=1e-10)[0]


@pytest.mark.parametrize("s", [-0.012, 0.05, 0.2])
def test_parallel_surface_area_is_steiner(s):
    # A(s) = A0 + 2Ms + 2πs² against an explicit offset of the profile (independent construction)
    assert head_area_m2("2:1", 2.0, s) == pytest.approx(_offset_area_of_ellipse_head(2.0, s), rel=1e-6)


def test_dished_head_factor_is_the_integral_of_ds_over_area():
    from scipy.integrate import quad

    d, s1, s2 = 2.0, 0.0, 0.15
    expected = quad(lambda s: 1 / _offset_area_of_ellipse_head(d, s), s1, s2, epsrel=1e-8)[0]
    assert head_layer_factors("2:1", d, [s1, s2])[0] == pytest.approx(expected, rel=1e-5)
    # close to the geometric-mean-area rule t/√(A1·A2)
    gm = (s2 - s1) / math.sqrt(head_area_m2("2:1", d, s1) * head_area_m2("2:1", d, s2))
    assert head_layer_factors("2:1", d, [s1, s2])[0] == pytest.approx(gm, rel=1e-3)


def test_hemispherical_dished_head_is_half_a_sphere():
    # A hemisphere through the general head shape equals the sphere shape with weight 1/2
    c = {"od": np.array([2.0]), "wall": np.array([0.01]), "length": np.array([np.nan])}
    ts = [np.array([0.05]), np.array([0.04])]
    head = DishedHead("hemispherical", 2.0).network(c, ts)
    sphere = Sphere(2.0, 0.01).network(c, ts)
    assert head.outer_area[0] == pytest.approx(0.5 * sphere.outer_area[0], rel=1e-13)
    assert head.inner_film_factor[0] == pytest.approx(2 * sphere.inner_film_factor[0], rel=1e-13)
    assert head.wall_factor[0] == pytest.approx(2 * sphere.wall_factor[0], rel=1e-12)
    for a, b in zip(head.layer_factors, sphere.layer_factors):
        assert a[0] == pytest.approx(2 * b[0], rel=1e-12)


def test_curvature_of_the_hemisphere_and_torisphere_limits():
    assert head_curvature("hemispherical") == pytest.approx((math.pi / 2, math.pi))
    for kind in ("2:1", "torispherical"):
        # a convex head that is not a hemisphere: δ² = ρ² − A0/(2π) > 0 (Minkowski-type inequality)
        a0, m = head_curvature(kind)
        assert (m / (2 * math.pi)) ** 2 - a0 / (2 * math.pi) > 0


def test_unknown_head_shape_is_refused():
    assert normalise_head("hemi") == "hemispherical"
    with pytest.raises(InputError, match='--heads: unknown head shape "conical"; use flat, 2:1, '
                                         'hemispherical or torispherical'):
        normalise_head("conical")
    with pytest.raises(InputError, match="--heads"):
        DishedHead("flat", 2.0)
