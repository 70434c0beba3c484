"""A user's own materials file and the design-conductivity factors.

Checks: a file declaring one constant conductivity reproduces ``k=`` exactly (same heat
flow to the last bit); the design factors scale the least-squares fit of the declared
curve by their product, as stated (the fit is linear in the data: EN ISO 10456-style
conversion factors multiply, from memory); the file's errors name file, line and column.
"""

from __future__ import annotations

import json

import numpy as np
import pytest

from pipeins.catalog.materials import lookup_material
from pipeins.cli import main
from pipeins.errors import InputError
from pipeins.line import LineSpec
from pipeins.physics.conduction import conductivity_of
from pipeins.user_materials import DesignFactors, design_material, materials_in_use, parse_materials

HEADER = "key,name,family,mean_temp_c,conductivity_w_mk,min_temp_c,max_temp_c,density_kg_m3,source\n"
CONSTANT = HEADER + "".join(f"flat_k,plant foam,elastomeric,{t},0.040,-50,150,50,declared\n" for t in (0, 40, 80))
RISING = HEADER + ("site_wool,site wool section,pipe_section,10,0.034,-20,600,90,declared\n"
                   "site_wool,site wool section,pipe_section,100,0.043,-20,600,90,declared\n"
                   "site_wool,site wool section,pipe_section,200,0.057,-20,600,90,declared\n")


def _run(capsys, *args):
    code = 0
    try:
        main(list(args))
    except SystemExit as exc:
        code = exc.code or 0
    out, err = capsys.readouterr()
    return code, out, err


def test_constant_file_reproduces_k_exactly(tmp_path, capsys):
    materials, warnings = parse_materials(CONSTANT, "plant.csv")
    assert warnings == []
    with materials_in_use(materials):
        mine = LineSpec(pipe="DN50", fluid_temp_c=80.0, layers=(("plant foam", 0.03),)).solve()
    given = LineSpec(pipe="DN50", fluid_temp_c=80.0, layers=(("k=0.040", 0.03),)).solve()
    assert float(mine.heat_flow_w_per_m) == float(given.heat_flow_w_per_m)
    assert float(mine.surface_temp_c) == float(given.surface_temp_c)
    path = tmp_path / "plant.csv"
    path.write_text(CONSTANT, encoding="utf-8")
    base = ("check", "--pipe", "DN50", "--fluid-temp", "80C", "--format", "json")
    code, out, err = _run(capsys, *base, "--layer", "flat_k:30mm", "--materials", str(path))
    assert code == 0, err
    code2, out2, _ = _run(capsys, *base, "--layer", "k=0.040:30mm")
    assert json.loads(out)["heat_flow_w_per_m"] == json.loads(out2)["heat_flow_w_per_m"]
    # the file's names are not left in use after the command
    with pytest.raises(InputError, match="unknown material"):
        lookup_material("flat_k")


def test_design_factors_scale_the_fitted_curve():
    materials, _ = parse_materials(RISING, "site.csv")
    declared = materials["site_wool"]
    factors = DesignFactors(ageing_percent=10, moisture_percent=5, joints_percent=3)
    assert factors.factor == pytest.approx(1.10 * 1.05 * 1.03, rel=1e-15)
    design = design_material(declared, factors)
    fit_d, fit_x = conductivity_of(declared), conductivity_of(design)
    assert np.allclose(fit_x.coefficients, np.multiply(fit_d.coefficients, factors.factor), rtol=1e-9, atol=1e-15)
    t = np.linspace(-20, 600, 17)
    assert np.allclose(fit_x.conductivity(t), factors.factor * fit_d.conductivity(t), rtol=1e-9)
    # a constant layer with the factors is k × factor: its heat flow equals that of k=0.040·F
    const, _ = parse_materials(CONSTANT, "plant.csv")
    with materials_in_use(const, factors):
        scaled = LineSpec(pipe="DN50", fluid_temp_c=80.0, layers=(("plant foam", 0.03),)).solve()
    by_hand = LineSpec(pipe="DN50", fluid_temp_c=80.0, layers=((f"k={0.040 * factors.factor!r}", 0.03),)).solve()
    assert float(scaled.heat_flow_w_per_m) == pytest.approx(float(by_hand.heat_flow_w_per_m), rel=1e-12)


def test_check_reports_declared_and_design_side_by_side(tmp_path, capsys):
    path = tmp_path / "site.csv"
    path.write_text(RISING, encoding="utf-8")
    code, out, err = _run(capsys, "check", "--pipe", "DN80", "--fluid-temp", "150C", "--layer", "site wool:50mm",
                          "--materials", str(path), "--ageing-factor", "10 %", "--moisture-factor", "5",
                          "--format", "json")
    assert code == 0, err
    data = json.loads(out)["materials"]
    layer = data["layers"][0]
    assert data["design_factors"]["factor"] == pytest.approx(1.155)
    assert layer["design_conductivity_w_mk"] == pytest.approx(1.155 * layer["declared_conductivity_w_mk"], rel=1e-9)
    declared_at_mean = float(conductivity_of(parse_materials(RISING, "x")[0]["site_wool"]).conductivity(
        layer["mean_temp_c"]))
    assert layer["declared_conductivity_w_mk"] == pytest.approx(declared_at_mean, rel=1e-7)
    code, text, err = _run(capsys, "check", "--pipe", "DN80", "--fluid-temp", "150C", "--layer", "site wool:50mm",
                           "--materials", str(path), "--joints-factor", "4", "--units", "us")
    assert code == 0 and "declared k" in text and "EN ISO 10456" in text and "Btu" in text


def test_falling_conductivity_warns(tmp_path, capsys):
    falling = HEADER + ("odd,odd foam,elastomeric,0,0.040,-40,100,50,x\n"
                        "odd,odd foam,elastomeric,50,0.036,-40,100,50,x\n")
    materials, warnings = parse_materials(falling, "odd.csv")
    assert len(warnings) == 1 and warnings[0].code == "materials.conductivity_falls"
    assert warnings[0].word("file") == "odd.csv" and warnings[0].word("material") == "odd"
    path = tmp_path / "odd.csv"
    path.write_text(falling, encoding="utf-8")
    code, out, err = _run(capsys, "check", "--pipe", "DN50", "--fluid-temp", "40C", "--layer", "odd foam:20mm",
                          "--materials", str(path), "--format", "json")
    assert code == 0, err
    assert any("falling with temperature" in w for w in json.loads(out)["warnings"])


@pytest.mark.parametrize("text, message", [
    ("key,name,family,mean_temp_c,min_temp_c,max_temp_c\n", 'm.csv:1: missing column "conductivity_w_mk"'),
    ("# note\n" + HEADER + "a,b,c,10,abc,0,100,1,s\n", 'm.csv:3: conductivity_w_mk: "abc" is not a number'),
    (HEADER + "a,b,c,10,0.03,0,100,1,s\na,b,c,50,-0.1,0,100,1,s\n", "m.csv:3: conductivity_w_mk"),
    (HEADER + "a,b,c,10,0.03,100,0,1,s\n", "m.csv:2: max_temp_c"),
    (HEADER + "a,b,c,10,0.03,0,100\n", "m.csv:2: 7 cells where the header has 9 columns"),
    (HEADER, "m.csv: no materials"),
])
def test_bad_file_is_one_line_naming_file_line_column(tmp_path, capsys, text, message):
    path = tmp_path / "m.csv"
    path.write_text(text, encoding="utf-8")
    target = tmp_path / "out.json"
    code, out, err = _run(capsys, "check", "--pipe", "DN50", "--fluid-temp", "80C", "--layer", "k=0.04:30mm",
                          "--materials", str(path), "-o", str(target))
    assert code == 2 and out == "" and err.count("\n") == 1 and message in err, err
    assert not target.exists()


def test_bad_factor(capsys):
    code, out, err = _run(capsys, "check", "--pipe", "DN50", "--fluid-temp", "80C", "--layer", "k=0.04:30mm",
                          "--ageing-factor", "500")
    assert code == 2 and err.startswith("Error: --ageing-factor: the design factor must be from 0 to 200 %"), err


# -- the project-file key materials_file --------------------------------------------------------

PROJECT = """\
[project]
name = "Riverside depot (invented)"
{extra}

[conditions.room]
air = "20 C"

[services.hot]
fluid = "water"
temperature = "80 C"
material = "plant foam"
criteria = ["heat_flow"]
max_heat_flow = "20 W/m"

[[lines]]
service = "hot"
size = "NPS 2"
length = "10 m"
condition = "room"
"""


def test_project_materials_file_is_picked_up_relative_to_the_project(tmp_path):
    from pipeins.project import ProjectError, load_project
    from pipeins.schedule import compute_schedule

    (tmp_path / "data").mkdir()
    (tmp_path / "data" / "mats.csv").write_text(CONSTANT, encoding="utf-8")
    path = tmp_path / "depot.toml"
    path.write_text(PROJECT.format(extra='materials_file = "data/mats.csv"'), encoding="utf-8")
    project = load_project(path)
    assert list(project.materials) == ["flat_k"]
    line = compute_schedule(project).lines[0]
    # the user's constant 0.040 W/(m·K) solves exactly as k=0.040 at the thickness picked
    ref = LineSpec(pipe="NPS 2", layers=(("k=0.040", line.thickness_m),), fluid_temp_c=80.0, air_temp_c=20.0).solve()
    assert line.heat_flow_w_per_m == float(ref.heat_flow_w_per_m)
    with pytest.raises(InputError):  # in use only while the project is read and scheduled
        lookup_material("plant foam")
    path.write_text(PROJECT.format(extra=""), encoding="utf-8")
    with pytest.raises(ProjectError) as exc:
        load_project(path)
    assert 'material: unknown material "plant foam"' in str(exc.value)


@pytest.mark.parametrize("extra, message", [
    ('materials_file = "none.csv"', 'depot.toml: line 3 (project): materials_file: file "none.csv" not found next '
                                    "to depot.toml"),
    ('materials_file = "bad.csv"', 'depot.toml: line 3 (project): materials_file: bad.csv:1: missing column '
                                   '"mean_temp_c"'),
])
def test_project_materials_file_problems_name_the_key(tmp_path, extra, message):
    from pipeins.project import ProjectError, load_project

    (tmp_path / "bad.csv").write_text("key,name,family,conductivity_w_mk,min_temp_c,max_temp_c\n", encoding="utf-8")
    path = tmp_path / "depot.toml"
    path.write_text(PROJECT.format(extra=extra), encoding="utf-8")
    with pytest.raises(ProjectError) as exc:
        load_project(path)
    assert any(p.startswith(message) for p in exc.value.problems), exc.value.problems
