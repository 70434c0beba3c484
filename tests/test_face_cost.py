"""``pipeins cost`` of a flat face: per m² of face by default, over ``--area`` when given.

Checked against hand arithmetic outside the library's money path: the year's energy is the
heat flow per m² times the area times the hours over the efficiency (E = q·A·h/η, the
definition of energy over time), the installed cost the table's cost per m² times the area,
the payback that cost over the yearly saving.  The bare face's heat flow is checked against
a hand solve of the plate's energy balance with ht's vertical-plate correlation
(``ht.conv_free_immersed.Nu_vertical_plate_Churchill``, called directly), CoolProp air at the
film temperature and σ·ε·(Ts⁴ − Tr⁴).  The cost tables used are the invented demo tables of
examples/.
"""

from __future__ import annotations

import json
from pathlib import Path

import openpyxl
import pytest

EXAMPLES = Path(__file__).resolve().parents[1] / "examples"
TABLE = str(EXAMPLES / "costs_duct_demo.csv")          # invented, EUR per m² by thickness (mm)
TABLE_US = str(EXAMPLES / "costs_duct_demo_us.csv")    # invented, per ft² by thickness (in)
FACE = ("--face", "vertical", "--height", "2m", "--fluid-temp", "150C", "--ambient-temp", "20C",
        "--layer", "mineral wool:50mm", "--energy-price", "0.09/kWh", "--hours", "6000h", "--efficiency", "0.9",
        "--co2-factor", "0.2/kWh")
HOURS, EFFICIENCY, PRICE_PER_KWH, CO2_PER_KWH = 6000.0, 0.9, 0.09, 0.2


def _json(run, *args):
    code, out, err = run("cost", *args, "--format", "json")
    assert code == 0, err
    return json.loads(out)


def _face_heat_flux(run, *layers):
    """The face's heat flow per m² as ``check`` gives it (the bare face: no --layer)."""
    args = [a for a in FACE[:8]] + list(layers)
    code, out, err = run("check", *args, "--format", "json")
    assert code == 0, err
    return json.loads(out)["heat_flow_w_per_m2"]


def test_face_energy_is_heat_flux_times_area_times_hours(run):
    # Hand calculation: E = q [W/m²] · A [m²] · h [h] · 3600 s/h / η; cost = E/3.6e6 · price; CO2 alike.
    d = _json(run, *FACE, "--area", "12m2")
    assert d["area_m2"] == 12.0 and d["area_given"] is True and "length_m" not in d
    q_ins = _face_heat_flux(run, "--layer", "mineral wool:50mm")
    for case, q in (("insulated", q_ins), ("bare", d["bare"]["heat_flow_w_per_m2"])):
        block = d[case]
        assert block["heat_flow_w_per_m2"] == pytest.approx(q, rel=1e-9)  # check's JSON: 12 digits
        q = block["heat_flow_w_per_m2"]
        assert block["heat_flow_w"] == pytest.approx(q * 12.0, rel=1e-12)
        energy = q * 12.0 * HOURS * 3600.0 / EFFICIENCY
        assert block["heating"]["energy_j"] == pytest.approx(energy, rel=1e-12)
        assert block["heating"]["cost"] == pytest.approx(energy / 3.6e6 * PRICE_PER_KWH, rel=1e-12)
        assert block["heating"]["co2_kg"] == pytest.approx(energy / 3.6e6 * CO2_PER_KWH, rel=1e-12)
        assert block["cooling"]["energy_j"] == 0.0 and block["heat_gain_w"] == 0.0


def test_bare_minus_insulated_is_the_saving(run):
    d = _json(run, *FACE, "--area", "12m2")
    for duty in ("heating", "cooling"):
        for key in ("energy_j", "cost", "co2_kg"):
            assert d["saving"][duty][key] == pytest.approx(d["bare"][duty][key] - d["insulated"][duty][key],
                                                           rel=1e-12, abs=1e-9)
    assert d["saving"]["heat_loss_w"] == pytest.approx(d["bare"]["heat_loss_w"] - d["insulated"]["heat_loss_w"],
                                                       rel=1e-12)
    assert d["saving"]["cost"] == pytest.approx(d["bare"]["cost"] - d["insulated"]["cost"], rel=1e-12)


def test_without_an_area_the_figures_are_per_m2_of_face(run):
    per_m2 = _json(run, *FACE)
    over = _json(run, *FACE, "--area", "12m2")
    assert per_m2["area_m2"] == 1.0 and per_m2["area_given"] is False
    assert per_m2["priced_per"].startswith("per m² of face")
    assert per_m2["bare"]["heat_flow_w"] == per_m2["bare"]["heat_flow_w_per_m2"]
    for case in ("bare", "insulated"):
        assert over[case]["heating"]["energy_j"] == pytest.approx(12.0 * per_m2[case]["heating"]["energy_j"],
                                                                  rel=1e-12)
    code, text, _ = run("cost", *FACE)
    assert code == 0
    assert "Bare against insulated, per m² of face (no --area given)" in text
    assert "heat loss, per m² of face [W]" in text and "over the face" not in text


def test_the_bare_face_is_the_one_bare_surface(run):
    # "Bare" is pipeins.bare.bare_surface of the section, as in every other command.
    from pipeins.bare import bare_surface
    from pipeins.line import LineSpec
    from pipeins.solve import solve

    spec = LineSpec(face="vertical", height_m=2.0, fluid_temp_c=150.0, air_temp_c=20.0)
    section, _, fluid, air, surface = spec.build_model()
    bare = bare_surface(section, surface)
    d = _json(run, *FACE)
    assert d["bare"]["surface"] == bare.name and d["bare"]["emittance"] == pytest.approx(float(bare.emittance))
    assert d["bare"]["heat_flow_w_per_m2"] == pytest.approx(
        float(solve(section, [], fluid, air, bare).heat_flow), rel=1e-12)


def test_bare_face_heat_flux_against_a_hand_solve_with_ht():
    # Bare vertical sheet, no inner film: (Tf − Ts)·k/t = h_c(Ts)(Ts − Ta) + εσ(Ts⁴ − Ta⁴), h_c from
    # ht.conv_free_immersed.Nu_vertical_plate_Churchill on the height, CoolProp air at the film temperature.
    from CoolProp.CoolProp import PropsSI
    from ht.conv_free_immersed import Nu_vertical_plate_Churchill
    from scipy.optimize import brentq

    from pipeins.bare import bare_surface
    from pipeins.catalog.ducts import lookup_sheet
    from pipeins.line import LineSpec
    from pipeins.solve import solve

    spec = LineSpec(face="vertical", height_m=2.0, fluid_temp_c=150.0, air_temp_c=20.0)
    section, _, fluid, air, surface = spec.build_model()
    bare = bare_surface(section, surface)
    eps, k_sheet, t_sheet = float(bare.emittance), lookup_sheet("galvanised steel").conductivity_w_mk, 0.002
    tf, ta, height, sigma = 150.0, 20.0, 2.0, 5.670374419e-8

    def outer(ts):
        film = (ts + ta) / 2 + 273.15
        k, mu = PropsSI("L", "T", film, "P", 101325, "Air"), PropsSI("V", "T", film, "P", 101325, "Air")
        rho, cp = PropsSI("D", "T", film, "P", 101325, "Air"), PropsSI("C", "T", film, "P", 101325, "Air")
        pr = cp * mu / k
        gr = 9.80665 * (1 / film) * (ts - ta) * height ** 3 * rho ** 2 / mu ** 2
        h_c = Nu_vertical_plate_Churchill(pr, gr) * k / height
        return h_c * (ts - ta) + eps * sigma * ((ts + 273.15) ** 4 - (ta + 273.15) ** 4)

    ts = brentq(lambda ts: (tf - ts) * k_sheet / t_sheet - outer(ts), ta + 1e-6, tf)
    ours = float(solve(section, [], fluid, air, bare).heat_flow)
    assert ours == pytest.approx(outer(ts), rel=1e-3)  # shipped air table against CoolProp: 0.1 %


def test_installed_cost_and_payback_of_a_face(run):
    # Installed cost = the table's cost per m² (examples/costs_duct_demo.csv: 50 mm at 31.80) × 12 m².
    d = _json(run, *FACE, "--area", "12m2", "--cost-table", TABLE)
    assert d["installed_cost"] == pytest.approx(31.80 * 12.0, abs=0.005)
    assert d["simple_payback_years"] == pytest.approx(31.80 * 12.0 / d["saving"]["cost"], abs=0.006)
    curve = d["economic_curve"]
    assert curve["per"] == "m²" and "installed_per_m2" in curve
    assert curve["installed_per_m2"] == pytest.approx([24.40, 27.90, 31.80, 39.60], abs=1e-9)  # per m², any area


def test_us_units_read_and_print_the_same_face(run):
    # The same face given in US units: JSON (SI) equal; text in ft², Btu/h and money per ft².
    si_args = tuple("mineral wool:2in" if a == "mineral wool:50mm" else a for a in FACE)
    si = _json(run, *si_args, "--area", "12m2", "--cost-table", TABLE_US)
    us_args = ("--face", "vertical", "--height", f"{2 / 0.3048!r}", "--fluid-temp", "302", "--ambient-temp", "68",
               "--layer", "mineral wool:2", "--energy-price", "0.09/kWh", "--hours", "6000h", "--efficiency",
               "0.9", "--co2-factor", "0.2/kWh", "--area", f"{12 / 0.09290304!r}", "--cost-table", TABLE_US,
               "--units", "us")
    us = _json(run, *us_args)
    assert us["area_m2"] == pytest.approx(12.0, rel=1e-12)
    for case in ("bare", "insulated"):
        assert us[case]["heat_flow_w"] == pytest.approx(si[case]["heat_flow_w"], rel=1e-9)
        assert us[case]["heating"]["energy_j"] == pytest.approx(si[case]["heating"]["energy_j"], rel=1e-9)
    code, text, _ = run("cost", *us_args)
    assert code == 0
    assert "Bare against insulated over 129.2 ft² of face" in text
    assert "heat flow [Btu/(h·ft²)]" in text and "over the face [Btu/h]" in text
    assert "installed [per ft²]" in text and "priced over 129.2 ft² of face" in text
    # the demo's 2 in row is 3.20 per ft² (examples/costs_duct_demo_us.csv)
    assert "\n2.00              3.20 " in text


@pytest.mark.parametrize("fmt", ["csv", "markdown", "html"])
def test_every_format_states_the_basis(run, fmt):
    code, out, err = run("cost", *FACE, "--area", "12m2", "--cost-table", TABLE, "--format", fmt)
    assert code == 0, err
    assert "12.00 m² of face" in out
    code, out, err = run("cost", *FACE, "--format", fmt)
    assert code == 0 and "per m² of face (no --area given)" in out


def test_the_workbook_states_the_basis(run, tmp_path):
    path = tmp_path / "face.xlsx"
    code, _, err = run("cost", *FACE, "--area", "12m2", "--format", "xlsx", "--output", str(path))
    assert code == 0, err
    cells = [str(c) for ws in openpyxl.load_workbook(path) for row in ws.iter_rows(values_only=True) for c in row if c]
    assert "priced over 12.00 m² of face" in cells


def test_a_cold_face_is_priced_as_cooling(run):
    d = _json(run, "--face", "down", "--length", "1.5m", "--fluid-temp", "5C", "--ambient-temp", "28C",
              "--layer", "k=0.035:40mm", "--energy-price", "0.2/kWh", "--cop", "3.5", "--hours", "3000h",
              "--area", "8m2")
    ins = d["insulated"]
    assert ins["heat_loss_w"] == 0.0 and ins["heat_flow_w_per_m2"] < 0
    assert ins["cooling"]["energy_j"] == pytest.approx(-ins["heat_flow_w_per_m2"] * 8.0 * 3000 * 3600 / 3.5,
                                                       rel=1e-12)


@pytest.mark.parametrize("args, line", [
    (FACE + ("--area", "0m2"), "Error: --area: area of a flat face must be greater than zero"),
    (FACE + ("--area", "0"), "Error: --area: area of a flat face must be greater than zero"),
    (("--pipe", "NPS 2", "--fluid-temp", "80C", "--energy-price", "0.09/kWh", "--area", "12m2"),
     "Error: --area: only a flat face (--face) is priced by its area; a pipe is priced over its run (--length)"),
    (("--duct", "600x400mm", "--fluid-temp", "40C", "--energy-price", "0.09/kWh", "--area", "12m2"),
     "Error: --area: only a flat face (--face) is priced by its area; a duct is priced over its run (--length)"),
    (("--vessel", "vertical", "--diameter", "3m", "--length", "5m", "--fluid-temp", "80C", "--energy-price",
      "0.09/kWh", "--area", "12m2"),
     "Error: --area: only a flat face (--face) is priced by its area; a vessel is priced whole"),
    (FACE + ("--valves", "2"), "Error: --valves: a face is priced on its heat flow alone: no fittings"),
])
def test_bad_face_cost_input(run, args, line):
    code, out, err = run("cost", *args)
    assert code == 2 and out == "" and err == line + "\n"


def test_negative_area_is_refused(run):
    code, out, err = run("cost", *FACE, "--area", "-3m2")
    assert code == 2 and out == ""
    assert err == 'Error: --area: "-3m2" is out of range; an area is from 0 to 10,000,000 m²\n'


def test_a_bare_face_alone(run):
    # no --layer: the bare face priced alone, over its area (E = q·A·h/η, hand arithmetic)
    code, out, err = run("cost", *FACE[:8], "--energy-price", "0.09/kWh", "--area", "12m2", "--format", "json")
    assert code == 0, err
    d = json.loads(out)
    assert d["insulated"] is None and d["saving"] is None
    q = d["bare"]["heat_flow_w_per_m2"]
    assert d["bare"]["heating"]["energy_j"] == pytest.approx(q * 12.0 * 8760 * 3600, rel=1e-12)
    code, text, _ = run("cost", *FACE[:8], "--energy-price", "0.09/kWh", "--area", "12m2")
    assert "Bare, over 12.00 m² of face" in text and "The bare face: the face's own surface" in text
