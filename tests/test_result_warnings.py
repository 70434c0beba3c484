"""Warnings that reach the user: correlation validity ranges carried by every result, once
each, in every command and format; criteria that do not apply say so; criteria that cannot
be met say by how much.

Ranges are those the correlations' own sources state (Churchill & Chu 1975, Popiel 2007,
McAdams 1954, laminar below Re 2300 as in every heat-transfer text); the dimensionless
numbers that put the cases outside them are computed here from CoolProp properties, apart
from the tool's own property tables.  The messages are this tool's own contract.
"""

from __future__ import annotations

import json

import pytest
from CoolProp.CoolProp import PropsSI

from pipeins.catalog.materials import lookup_material
from pipeins.criteria import CONDENSATION_NOT_APPLICABLE, FREEZE_NOT_APPLICABLE
from pipeins.model import FlatWall, Fluid, Layer, Surroundings
from pipeins.reports.notes import render_all
from pipeins.solve import solve

G = 9.80665


def _air_rayleigh(surface_c, air_c, length_m):
    """Ra_L = g β ΔT L³ / (ν α), air at the film temperature (CoolProp), β = 1/T_film."""
    film_k = 0.5 * (surface_c + air_c) + 273.15
    rho = PropsSI("D", "T", film_k, "P", 101325.0, "Air")
    mu = PropsSI("V", "T", film_k, "P", 101325.0, "Air")
    k = PropsSI("L", "T", film_k, "P", 101325.0, "Air")
    cp = PropsSI("C", "T", film_k, "P", 101325.0, "Air")
    nu, alpha = mu / rho, k / (rho * cp)
    return G * abs(surface_c - air_c) * length_m ** 3 / (film_k * nu * alpha)


def _json(run, *args):
    code, out, err = run(*args, "--format", "json")
    assert code == 0, err
    return json.loads(out)


RISER = ("--pipe", "NPS 4", "--fluid-temp", "180C", "--ambient-temp", "20C",
         "--orientation", "vertical", "--height", "30m")


def test_tall_vertical_bare_riser_warns_in_json(run):
    data = _json(run, "check", *RISER)
    surface = data["surface_temp_c"]
    # Popiel (2007) curvature correction: 1e4 <= Ra_H <= 1e9 and H/D <= 60
    assert _air_rayleigh(surface, 20.0, 30.0) > 1e9 and 30.0 / 0.1143 > 60
    assert ("outer film: slender vertical cylinder with Rayleigh number on the height above 1e9; "
            "beyond the Popiel (2007) curvature-correction range; extrapolated") in data["warnings"]
    assert ("outer film: vertical cylinder taller than 60 diameters; beyond the Popiel (2007) "
            "curvature-correction range; extrapolated") in data["warnings"]
    assert len(data["warnings"]) == len(set(data["warnings"]))


@pytest.mark.parametrize("fmt", ["text", "markdown", "html"])  # CSV: warnings as comment lines (issue 8 §10)
def test_riser_warning_in_every_format(run, fmt):
    code, out, err = run("check", *RISER, "--format", fmt)
    assert code == 0, err
    assert out.count("taller than 60 diameters") == 1


def test_riser_warning_in_us_units(run):
    data = _json(run, "check", "--units", "us", "--pipe", "NPS 4", "--fluid-temp", "356F",
                 "--ambient-temp", "68F", "--orientation", "vertical", "--height", "98ft")
    assert any("taller than 60 diameters" in w for w in data["warnings"])


def test_riser_warning_in_size_and_table(run):
    args = ("--fluid-temp", "180C", "--ambient-temp", "20C", "--orientation", "vertical", "--height", "30m",
            "--material", "mineral wool")
    size = _json(run, "size", "--pipe", "NPS 4", *args)
    assert any("vertical cylinder taller than 60 diameters" in w for w in size["warnings"])
    table = _json(run, "table", "--sizes", "NPS 2,NPS 4", *args)
    assert any("vertical cylinder taller than 60 diameters in 2 of 2 cases" in w for w in table["warnings"])


def test_high_rayleigh_flat_top_warns_in_json():
    # a 5 m (area/perimeter) hot top face: McAdams' enhanced-case range ends at Ra 1e11
    r = solve(FlatWall(length_m=5.0, face="top"), [Layer(lookup_material("k=0.04"), 0.05)], Fluid(150.0),
              Surroundings(20.0))
    assert _air_rayleigh(float(r.surface_temp_c), 20.0, 5.0) > 1e11
    assert ("outer film: Rayleigh number above 1e11 on a horizontal face (enhanced case); "
            "beyond the McAdams range; extrapolated") in render_all(r.warnings)
    warnings = json.loads(json.dumps(r.to_dict()))["warnings"]  # the API's JSON: the note objects
    assert {"code": "film.outer.range", "severity": "warning",
            "words": {"what": "Rayleigh number above 1e11 on a horizontal face (enhanced case)", "where": "",
                      "consequence": "beyond the McAdams range; extrapolated"}} in warnings


def test_fixed_outer_coefficient_has_no_outer_film_warning(run):
    data = _json(run, "check", "--pipe", "NPS 4", "--fluid-temp", "180C", "--layer", "mineral wool:50mm",
                 "--outer-h", "10")
    assert not any(w.startswith("outer film") for w in data["warnings"])


GLYCOL = ("--pipe", "NPS 2", "--fluid", "30% propylene glycol", "--fluid-temp", "-5C", "--velocity", "0.1m/s",
          "--ambient-temp", "20C", "--layer", "elastomeric foam:25mm")
LAMINAR = ("inner film: laminar flow (Re below 2300); fully developed Nu = 4.36 used, "
           "entry-length enhancement neglected")


def test_laminar_glycol_warns_in_json(run):
    # Re = rho V D / mu with CoolProp's 30 % propylene glycol at -5 °C, NPS 2 Sch 40 bore 52.5 mm
    rho = PropsSI("D", "T", 268.15, "P", 101325.0, "INCOMP::MPG[0.3]")
    mu = PropsSI("V", "T", 268.15, "P", 101325.0, "INCOMP::MPG[0.3]")
    assert rho * 0.1 * 0.0525 / mu < 2300
    data = _json(run, "check", *GLYCOL)
    assert LAMINAR in data["warnings"]
    sized = _json(run, "size", *GLYCOL[:-2], "--rh", "60", "--material", "elastomeric foam")
    assert LAMINAR in sized["warnings"]


def test_turbulent_water_has_no_inner_warning(run):
    data = _json(run, "check", "--pipe", "NPS 2", "--fluid", "water", "--fluid-temp", "80C", "--velocity",
                 "1.5m/s", "--layer", "mineral wool:40mm")
    assert not any(w.startswith("inner film") for w in data["warnings"])


def test_laminar_glycol_warns_in_schedule(tmp_path, run):
    project = tmp_path / "site.toml"
    project.write_text("""\
[project]
name = "Invented test site"

[conditions.plant]
air = "20 C"
rh = 60

[services.glycol]
fluid = "30% propylene glycol"
temperature = "-5 C"
flow = "0.2 kg/s"
material = "elastomeric foam"
criteria = ["condensation"]

[[lines]]
service = "glycol"
size = "NPS 2"
length = "10 m"
condition = "plant"
""")
    data = _json(run, "schedule", str(project))
    assert any(w.endswith(LAMINAR) for w in data["warnings"]), data["warnings"]
    assert len(data["warnings"]) == len(set(data["warnings"]))


# ------------------------------------------------------------------ criteria that do not apply
def test_condensation_not_applicable_message(run):
    # 15 °C water in 25 °C air at 40 %: dew point about 10.5 °C, below the bare surface
    data = _json(run, "size", "--pipe", "NPS 2", "--fluid-temp", "15C", "--ambient-temp", "25C", "--rh", "40",
                 "--material", "k=0.04", "--max-heat-flow", "10W/m")
    assert CONDENSATION_NOT_APPLICABLE == ("condensation control does not apply: the surface stays above "
                                           "the dew point bare")
    assert CONDENSATION_NOT_APPLICABLE in data["warnings"]
    assert [c["key"] for c in data["criteria"]] == ["heat_flow", "service_limit"]


def test_condensation_alone_not_applicable_is_one_error_line(run):
    code, _, err = run("size", "--pipe", "NPS 2", "--fluid-temp", "15C", "--ambient-temp", "25C", "--rh", "40",
                       "--material", "k=0.04")
    assert code == 2
    assert err.strip() == ("Error: --touch-limit: no sizing criterion applies to this line (" +
                           CONDENSATION_NOT_APPLICABLE + "); give one of --touch-limit, --max-heat-flow, "
                           "--min-reduction or a code minimum")


def test_freeze_hold_on_a_line_in_warm_air_does_not_apply(run):
    data = _json(run, "size", "--pipe", "NPS 2", "--fluid-temp", "80C", "--ambient-temp", "20C",
                 "--hold-time", "8h", "--material", "mineral wool")
    assert FREEZE_NOT_APPLICABLE in data["warnings"]
    assert FREEZE_NOT_APPLICABLE.startswith("freeze hold does not apply: fluid above 0 °C")
    assert "freeze" not in [c["key"] for c in data["criteria"]]
    code, out, _ = run("size", "--pipe", "NPS 2", "--fluid-temp", "80C", "--ambient-temp", "20C",
                       "--hold-time", "8h", "--material", "mineral wool")
    assert "inf h" not in out and "freeze protection" not in out


def test_freeze_hold_in_frost_still_applies(run):
    data = _json(run, "size", "--pipe", "NPS 2", "--fluid-temp", "60C", "--ambient-temp", "-10C",
                 "--hold-time", "8h", "--material", "mineral wool")
    assert "freeze" in [c["key"] for c in data["criteria"]]


def test_cold_sky_makes_condensation_active(run):
    # 15 °C line in 10 °C air at 80 % under a -20 °C sky: insulation cools the surface below
    # the dew point (6.7 °C; psychrolib agrees in test_humid), so condensation control is
    # active, as an upper bound on the thickness (test_condensation_bound.py checks the bound).
    args = ("size", "--pipe", "NPS 4", "--fluid-temp", "15C", "--ambient-temp", "10C",
            "--surroundings-temp", "-20C", "--rh", "80", "--material", "k=0.04")
    data = _json(run, *args)
    assert "condensation" in [c["key"] for c in data["criteria"]]
    assert any("more than 2.7 mm would make the surface sweat" in w for w in data["warnings"])
    # the same line, checked at 240 mm, is below the dew point
    data = _json(run, "check", *args[1:-2], "--layer", "k=0.04:240mm")
    assert data["surface_temp_c"] < data["dew_point_c"]


def test_touch_not_applicable_message(run):
    data = _json(run, "size", "--pipe", "NPS 2", "--fluid-temp", "40C", "--touch-limit", "50C",
                 "--max-heat-flow", "10W/m", "--material", "k=0.04")
    assert ("touch safety does not apply: the fluid (40 °C) is not above the 50 °C limit, so no surface "
            "can exceed it") in data["warnings"]


def _richardson(surface_c, air_c, diameter_m, wind_m_s):
    """Gr/Re² on the diameter with CoolProp air at the film temperature."""
    film_k = 0.5 * (surface_c + air_c) + 273.15
    rho = PropsSI("D", "T", film_k, "P", 101325.0, "Air")
    nu = PropsSI("V", "T", film_k, "P", 101325.0, "Air") / rho
    grashof = G * abs(surface_c - air_c) * diameter_m ** 3 / (film_k * nu ** 2)
    return grashof / (wind_m_s * diameter_m / nu) ** 2


@pytest.mark.parametrize("wind, mixed", [("0.5m/s", True), ("8m/s", False)])
def test_mixed_convection_range_warns(run, wind, mixed):
    data = _json(run, "check", "--pipe", "NPS 8", "--fluid-temp", "180C", "--wind", wind)
    ri = _richardson(data["surface_temp_c"], 20.0, 0.2191, float(wind[:-3]))
    assert (0.1 < ri < 10) is mixed  # the mixed regime, Gr/Re² about 1 (Incropera et al. sec. 9.9)
    found = any(w.startswith("outer film: mixed convection (Gr/Re² between 0.1 and 10)") for w in data["warnings"])
    assert found is mixed


def test_not_applicable_and_state_texts_in_us_units(run):
    data = _json(run, "size", "--units", "us", "--pipe", "NPS 2", "--fluid-temp", "176F", "--ambient-temp", "68F",
                 "--hold-time", "8h", "--material", "mineral wool")
    assert ("freeze hold does not apply: fluid above 32.0 °F in air and surroundings at or above 32.0 °F, so still "
            "water does not freeze") in data["warnings"]
    code, out, _ = run("size", "--units", "us", "--pipe", "NPS 2", "--fluid-temp", "176F", "--ambient-temp", "68F",
                       "--material", "mineral wool")
    assert code == 0 and "140.0 °F limit" in out and "60 °C limit" not in out
