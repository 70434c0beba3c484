"""One bare line for every command (pipeins.bare): the pipe's own material, its own emittance.

The min-reduction reproduction is checked against a hand computation that does not use the
pipeins solver: successive substitution at fixed film coefficients (films from ht's
Churchill & Chu horizontal-cylinder correlation with CoolProp air properties at the film
temperature, radiation from the Stefan-Boltzmann law), then bisection on the thickness.
"""

import json
import math

import pytest

from pipeins.bare import bare_surface
from pipeins.catalog.materials import lookup_wall_material

SIGMA = 5.670374419e-8  # W/(m2 K4), CODATA 2018


def _h_conv(ts_c, ta_c, d_m):
    """ht Nu_horizontal_cylinder_Churchill_Chu with CoolProp air at the film temperature."""
    import fluids.core
    from CoolProp.CoolProp import PropsSI
    from ht import conv_free_immersed

    film_k = 0.5 * (ts_c + ta_c) + 273.15
    rho, mu, k, cp = (PropsSI(key, "T", film_k, "P", 101325.0, "Air") for key in ("D", "V", "L", "CPMASS"))
    gr = fluids.core.Grashof(d_m, 1.0 / film_k, ts_c, ta_c, rho=rho, mu=mu)
    pr = fluids.core.Prandtl(Cp=cp, k=k, mu=mu)
    return conv_free_immersed.Nu_horizontal_cylinder_Churchill_Chu(pr, gr) * k / d_m


def _hand_heat_flow(fluid_c, air_c, r_wall_in, r_wall_out, k_wall, thickness_m, k_ins, emittance):
    """Heat flow [W/m] by successive substitution at fixed films (no inner film)."""
    r_out = r_wall_out + thickness_m
    r_cond = math.log(r_wall_out / r_wall_in) / (2 * math.pi * k_wall)
    if thickness_m > 0:
        r_cond += math.log(r_out / r_wall_out) / (2 * math.pi * k_ins)
    ts = 0.5 * (fluid_c + air_c)
    for _ in range(200):
        h_c = _h_conv(ts, air_c, 2 * r_out)
        t_s_k, t_a_k = ts + 273.15, air_c + 273.15
        h_r = emittance * SIGMA * (t_s_k**4 - t_a_k**4) / (ts - air_c)
        r_film = 1.0 / ((h_c + h_r) * 2 * math.pi * r_out)
        q = (fluid_c - air_c) / (r_cond + r_film)
        new = air_c + q * r_film
        if abs(new - ts) < 1e-7:
            break
        ts = 0.5 * (ts + new)
    return q


def test_min_reduction_against_bare_steel_by_hand(run):
    # NPS 4 schedule 40: OD 114.3 mm, wall 6.02 mm (ASME B36.10M); carbon steel k = 60.5 W/(m K).
    od, wall, k_wall = 0.1143, 0.00602, 60.5
    ro, ri = od / 2, od / 2 - wall
    bare = _hand_heat_flow(180.0, 20.0, ri, ro, k_wall, 0.0, 0.045, 0.80)  # bare oxidised steel
    cap = 0.10 * bare
    lo, hi = 0.001, 0.2
    for _ in range(60):  # bisection: heat flow falls with thickness here (well past the critical radius)
        mid = 0.5 * (lo + hi)
        if _hand_heat_flow(180.0, 20.0, ri, ro, k_wall, mid, 0.045, 0.05) > cap:
            lo = mid
        else:
            hi = mid
    hand_mm = 1000 * hi
    assert hand_mm == pytest.approx(24.4, abs=0.3)  # the bare-steel basis of issue 8
    code, out, _ = run("size", "--pipe", "NPS 4", "--fluid-temp", "180C", "--material", "k=0.045",
                       "--min-reduction", "90%", "--no-touch-check", "--finish", "aluminium jacket, new",
                       "--format", "json")
    assert code == 0
    data = json.loads(out)
    needed_mm = [c for c in data["criteria"] if c["key"] == "heat_flow"][0]["required_mm"]
    assert needed_mm == pytest.approx(hand_mm, abs=0.2)  # pipeins against the hand computation


def test_bare_surface_is_the_pipe_material():
    assert bare_surface("carbon steel").emittance == lookup_wall_material("carbon_steel").bare_emittance
    assert bare_surface("copper").emittance == 0.65
    assert bare_surface("stainless steel").emittance == 0.40
    assert bare_surface("PVC").surface_kind == "non_metallic"
    for name in ("carbon steel", "copper"):
        assert bare_surface(name).name.startswith(f"bare {name}")


def test_finish_catalogue_agrees_with_bare_metals():
    # one value per bare metal: the finish rows a user can pick agree with the bare line
    from pipeins.catalog.finishes import lookup_finish

    assert lookup_finish("bare steel, oxidised").emittance == bare_surface("carbon steel").emittance
    assert lookup_finish("bare copper, oxidised").emittance == bare_surface("copper").emittance

