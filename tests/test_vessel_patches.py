"""Vessel and sphere patches (pipeins.geometry.vessel): what each patch is, that its weight
and outer area agree with its shape, the tank floor boundary, the contents volume against
fluids.geometry.TANK, and a whole vessel through the solver against the closed-form
resistances of a cylinder (ln r2/r1 / 2πkL), plane (t/kA) and sphere ((1/r1 − 1/r2)/4πk)."""

import math
from dataclasses import dataclass

import numpy as np
import pytest

from pipeins.catalog.materials import lookup_material
from pipeins.errors import InputError
from pipeins.geometry.heads import DishedHead
from pipeins.geometry.plane import Plane
from pipeins.geometry.sphere import Sphere
from pipeins.geometry.vessel import (Floor, sphere_patches, tank_floor, vessel_patches,
                                     vessel_volume_m3)
from pipeins.model import Fluid, Layer, Surface, Surroundings
from pipeins.solve import solve


@dataclass(frozen=True)
class _Vessel:
    specs: tuple
    wall_m: float = 0.01
    wall_conductivity_w_mk: float = 50.0
    kind: str = "vessel"
    basis: str = "W"

    def patches(self, surroundings):
        return [s.to_patch() for s in self.specs]


def _network_area(spec, total):
    c = {"od": np.array([3.0]), "wall": np.array([0.01]), "length": np.array([5.0])}
    c.update({k: np.broadcast_to(np.asarray(v, float), (1,)) for k, v in spec.shape.columns().items()})
    return spec.shape.network(c, [np.array([total])]).outer_area


@pytest.mark.parametrize("orientation", ["vertical", "horizontal"])
@pytest.mark.parametrize("heads", ["flat", "2:1", "hemispherical", "torispherical"])
def test_weight_times_shape_area_is_the_patch_area(orientation, heads):
    for spec in vessel_patches(3.0, 5.0, orientation, heads):
        total = 0.08
        area = spec.weight(total) * np.broadcast_to(_network_area(spec, total), (1,))
        assert float(area[0]) == pytest.approx(float(spec.outer_area_m2(total)), rel=1e-12), spec.name


def test_patch_kinds_and_correlation_keys():
    v = {p.name: p for p in vessel_patches(3.0, 5.0, "vertical", "flat")}
    assert v["shell"].shape.correlation_key == ("cylinder", "vertical") and v["shell"].shape.height_m == 5.0
    assert v["top head"].shape == Plane(0.75, "top") and v["bottom head"].shape == Plane(0.75, "bottom")
    h = vessel_patches(3.0, 5.0, "horizontal", "flat")
    assert h[0].shape.correlation_key == ("cylinder", "horizontal")
    assert h[1].name == "heads" and h[1].count == 2 and h[1].shape == Plane(3.0, "vertical")
    hemi = vessel_patches(3.0, 5.0, "vertical", "hemispherical")[1]
    assert isinstance(hemi.shape, Sphere) and float(hemi.weight(0.05)) == 0.5
    dished = vessel_patches(3.0, 5.0, "horizontal", "2:1")[1]
    assert isinstance(dished.shape, DishedHead) and dished.shape.correlation_key == ("sphere", "any")
    s = sphere_patches(2.5)[0]
    assert float(s.outer_area_m2(0.1)) == pytest.approx(4 * math.pi * 1.35**2)


def test_contents_volume_against_fluids_tank():
    # fluids.geometry.TANK (independent reference): shell plus two heads
    tank = pytest.importorskip("fluids.geometry").TANK
    for heads, side, a in [("2:1", "ellipsoidal", 0.5), ("hemispherical", "spherical", 1.0)]:
        ref = tank(D=2.0, L=3.0, horizontal=True, sideA=side, sideB=side, sideA_a=a, sideB_a=a).V_total
        assert float(vessel_volume_m3(2.0, 3.0, heads)) == pytest.approx(ref, rel=1e-10)
    assert float(vessel_volume_m3(2.0, 3.0, "2:1", floor=tank_floor("air"))) == pytest.approx(
        math.pi * 3 + math.pi * 8 / 24)


def test_vessel_through_the_solver_equals_the_closed_form_resistances():
    # Constant k, a fixed outer film and no inner film: every patch is a series network of
    # closed forms (Incropera et al., 6th ed., Eqs. 3.28 cylinder, 3.6 plane, 3.36 sphere, from memory).
    d, length, wall, kw, t, k, h, tf, ta = 3.0, 5.0, 0.01, 50.0, 0.08, 0.04, 9.0, 180.0, 15.0
    layers = [Layer(lookup_material(f"k={k}"), t)]
    ro = d / 2 + t

    def run(specs):
        r = solve(_Vessel(tuple(specs), wall, kw), layers, Fluid(tf), Surroundings(ta),
                  Surface(fixed_coefficient_w_m2k=h))
        return float(r.heat_flow)

    r_shell = (math.log((d / 2) / (d / 2 - wall)) / (2 * math.pi * kw * length)
               + math.log(ro / (d / 2)) / (2 * math.pi * k * length) + 1 / (h * 2 * math.pi * ro * length))
    area = math.pi * ro**2  # a flat head weighted by its outer face
    r_flat = (wall / kw + t / k + 1 / h) / area
    r_hemi = 2 * ((1 / (d / 2 - wall) - 1 / (d / 2)) / (4 * math.pi * kw)
                  + (1 / (d / 2) - 1 / ro) / (4 * math.pi * k) + 1 / (h * 4 * math.pi * ro**2))
    dt = tf - ta
    assert run(vessel_patches(d, length, "horizontal", "flat", wall_m=wall)) == pytest.approx(
        dt / r_shell + 2 * dt / r_flat, rel=1e-9)
    assert run(vessel_patches(d, length, "vertical", "hemispherical", wall_m=wall)) == pytest.approx(
        dt / r_shell + 2 * dt / r_hemi, rel=1e-9)


def test_tank_floor_to_the_ground_is_a_fixed_boundary():
    d, wall, kw, t, tf, tg, r_f = 10.0, 0.01, 50.0, 0.1, 60.0, 8.0, 2.0
    floor = tank_floor("ground", tg, r_f)
    specs = vessel_patches(d, 8.0, "vertical", "flat", floor=floor, wall_m=wall)
    assert [s.name for s in specs] == ["shell", "roof", "floor"]
    fl = specs[2]
    assert not fl.insulated and fl.boundary.temp_c == tg and fl.boundary.coefficient_w_m2k == pytest.approx(0.5)
    r = solve(_Vessel((fl,), wall, kw), [Layer(lookup_material("k=0.04"), t)], Fluid(tf), Surroundings(-5.0),
              Surface())
    # bare plate to the ground: q = A ΔT / (wall/k_w + R_f), the insulation and the air play no part
    assert float(r.heat_flow) == pytest.approx(math.pi * d**2 / 4 * (tf - tg) / (wall / kw + r_f), rel=1e-9)
    assert "to the ground at 8 °C" in fl.boundary.note


def test_default_floor_resistance_is_the_disc_on_a_half_space():
    # isothermal disc on a semi-infinite medium: S = 2D (Incropera et al., 6th ed., Table 4.1,
    # from memory); per m² R = πD/(8k); moist sand k = 1.5 W/(m·K) from tables/soils.csv
    floor = tank_floor("ground", 10.0)
    assert float(floor.resistance_for(12.0)) == pytest.approx(math.pi * 12.0 / (8 * 1.5))
    assert "moist sand" in floor.assumption(12.0)
    assert tank_floor("air").boundary(12.0) is None
    assert "open to the air" in tank_floor("air").assumption()


@pytest.mark.parametrize("call, message", [
    (lambda: tank_floor(None), "floor: a tank standing on a foundation needs its floor boundary"),
    (lambda: tank_floor("sand"), 'floor: unknown floor boundary "sand"; use air or ground'),
    (lambda: tank_floor("ground"), "floor_ground_temp_c: a tank floor to the ground needs the ground temperature"),
    (lambda: tank_floor("ground", 5.0, 0.0), "floor_resistance_m2k_w: the foundation resistance must be"),
    (lambda: tank_floor("ground", 5.0, soil="peat bog"), 'soil: unknown soil "peat bog"'),
    (lambda: vessel_patches(3.0, 5.0, "sideways", "flat"), '--vessel: unknown vessel orientation "sideways"'),
    (lambda: vessel_patches(3.0, 5.0, "vertical", "cone"), '--heads: unknown head shape "cone"'),
    (lambda: vessel_patches(0.0, 5.0, "vertical", "flat"), "--diameter: the vessel diameter must be greater than 0"),
    (lambda: vessel_patches(3.0, -1.0, "vertical", "flat"), "--length: the shell length must be greater than 0"),
    (lambda: vessel_patches(3.0, 5.0, "horizontal", "flat", floor=Floor("air")), "floor: only a vertical tank"),
    (lambda: sphere_patches(-2.5), "--sphere: the sphere diameter must be greater than 0"),
])
def test_bad_vessel_input(call, message):
    with pytest.raises(InputError) as err:
        call()
    assert str(err.value).startswith(message)


@pytest.mark.parametrize("heads", ["flat", "2:1", "hemispherical", "torispherical"])
@pytest.mark.parametrize("orientation", ["vertical", "horizontal"])
def test_thicker_insulation_never_raises_the_loss_of_any_patch(heads, orientation):
    # vessels are far past the critical radius (2k/h): every patch loses less as T grows
    t = np.array([0.01, 0.03, 0.06, 0.1, 0.2, 0.4])
    r = solve(_Vessel(tuple(vessel_patches(2.2, 4.0, orientation, heads))), [Layer(lookup_material("k=0.04"), t)],
              Fluid(150.0), Surroundings(10.0), Surface(fixed_coefficient_w_m2k=8.0))
    assert np.all(np.diff(r.heat_flow) < 0)
    for part in r.patches:
        assert np.all(np.diff(part.heat_flow) < 0), part.name
    assert float(np.sum([p.heat_flow for p in r.patches], axis=0)[0]) == pytest.approx(float(r.heat_flow[0]))
