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
                       "--min-reduction", "90%", "--no-touch-check", "--finish", "aluminium, bright",
                       "--format", "json")
    assert code == 0
    data = json.loads(out)
    needed_mm = [c for c in data["criteria"] if c["key"] == "heat_flow"][0]["required_mm"]
    assert needed_mm == pytest.approx(hand_mm, abs=0.2)  # pipeins against the hand computation


def test_bare_surface_is_the_pipe_material():
    from pipeins.catalog.finishes import lookup_finish

    for key in ("carbon_steel", "stainless_steel", "copper", "pvc"):
        wall = lookup_wall_material(key)
        assert bare_surface(wall.name).emittance == lookup_finish(wall.bare_finish).emittance
    assert bare_surface("carbon steel").emittance == 0.80  # Perry's/Hottel oxidised steel (tables/finishes.csv)
    assert bare_surface("copper").emittance == 0.65
    assert bare_surface("stainless steel").surface_kind == "bare_metal"  # the pipe itself, not a jacket
    assert bare_surface("PVC").surface_kind == "non_metallic"
    for name in ("carbon steel", "copper"):
        assert bare_surface(name).name.startswith(f"bare {name}")


def test_finish_catalogue_agrees_with_bare_metals():
    # one value per bare metal: the finish rows a user can pick agree with the bare line
    from pipeins.catalog.finishes import lookup_finish

    assert lookup_finish("carbon steel, bare, oxidised").emittance == bare_surface("carbon steel").emittance
    assert lookup_finish("copper, oxidised").emittance == bare_surface("copper").emittance


def test_bare_copper_is_the_same_in_all_four_commands(run):
    # copper L 2 at 60 C in still 20 C air: check (no layer), size --min-reduction, cost and schedule
    line = ["--pipe", "copper L 2", "--fluid-temp", "60C", "--ambient-temp", "20C"]
    code, out, err = run("check", *line, "--format", "json")
    assert code == 0, err
    checked = json.loads(out)
    assert checked["line"]["emittance"] == 0.65  # tables/wall_materials.csv, copper
    bare_q = checked["heat_flow_w_per_m"]

    code, out, err = run("cost", *line, "--energy-price", "0.1/kWh", "--layer", "elastomeric foam:19mm",
                         "--format", "json")
    assert code == 0, err
    costed = json.loads(out)
    assert costed["bare"]["emittance"] == 0.65
    assert costed["bare"]["heat_flow_w_per_m"] == pytest.approx(bare_q, rel=1e-9)

    code, out, err = run("size", *line, "--material", "k=0.04", "--min-reduction", "80%", "--no-touch-check",
                         "--finish", "aluminium, bright")
    assert code == 0, err
    import re

    cap = float(re.search(r"under the cap of ([\d.]+) W/m", out).group(1))
    assert cap == pytest.approx(0.2 * bare_q, abs=0.05)  # 80 % below the same bare line (printed to 0.1 W/m)

    from pathlib import Path

    food = Path(__file__).resolve().parents[1] / "examples" / "food_factory_chilled.toml"
    code, out, err = run("schedule", str(food), "--format", "json")
    assert code == 0, err
    lines = json.loads(out)["lines"]
    assert {l["bare_emittance"] for l in lines} == {0.65}  # every line there is copper
    assert {l["bare_surface"] for l in lines} == {"bare copper pipe"}


def test_every_wall_material_has_a_bare_surface():
    from pipeins.catalog.materials import list_materials

    for row in list_materials("wall"):
        surface = bare_surface(row["name"])
        assert 0 < surface.emittance <= 1 and surface.surface_kind in ("bare_metal", "non_metallic")
