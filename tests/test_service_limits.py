"""Layers inside their limits: every layer of a selected build-up has both faces inside its
material's service range (min_temp_c..max_temp_c of tables/insulation_materials.csv), the
sizing adds an inner layer where the sized material cannot serve, and reports the interface
temperature.  Each selection is re-solved independently through LineSpec and judged against
the limits read straight from the CSV.
"""

from __future__ import annotations

import csv
import json
from pathlib import Path

import numpy as np
import pytest

from pipeins.criteria import Requirements
from pipeins.line import LineSpec
from pipeins.project import ProjectError, parse_project
from pipeins.schedule import compute_schedule
from pipeins.selection import select

_CSV = Path(__file__).resolve().parent.parent / "tables" / "insulation_materials.csv"


def _limits() -> dict[str, tuple[float, float]]:
    rows = csv.DictReader(line for line in _CSV.read_text(encoding="utf-8").splitlines()
                          if line.strip() and not line.startswith("#"))
    return {r["name"]: (float(r["min_temp_c"]), float(r["max_temp_c"])) for r in rows}


def _assert_inside(result):
    """Both faces of every layer inside the CSV limits of its material."""
    limits, temps = _limits(), np.asarray(result.interface_temps_c, dtype=float)
    for j, layer in enumerate(result.inputs["layers"]):
        low, high = limits[layer.material.name]
        faces = temps[j + 1: j + 3]
        assert np.all(faces <= high + 1e-6), (layer.material.name, faces.max(), high)
        assert np.all(faces >= low - 1e-6), (layer.material.name, faces.min(), low)


def test_foam_over_calcium_silicate_at_300c(run):
    # the reproduction of issue 8: foam must not be selected at 129 °C against its 105 °C limit
    code, out, err = run("size", "--pipe", "NPS 4", "--fluid-temp", "300C", "--layer", "calcium silicate:25mm",
                         "--material", "flexible elastomeric foam", "--format", "json")
    assert code == 0, err
    data = json.loads(out)
    inner = data["inner_layer"]
    assert inner["material"] == "mineral wool pipe section" and inner["thickness_mm"] > 0
    spec = LineSpec(pipe="NPS 4", fluid_temp_c=300.0, layers=(
        ("calcium silicate", 0.025), ("mineral wool", inner["thickness_mm"] / 1000),
        ("flexible elastomeric foam", data["selected_thickness_mm"] / 1000)))
    result = spec.solve()
    _assert_inside(result)
    # the interface reported is the foam's hot face of the independent solve
    assert inner["interface_temp_c"] == pytest.approx(float(result.interface_temps_c[3]), abs=0.01)
    assert float(result.interface_temps_c[3]) <= 105.0
    # the check at the selected thickness shows the whole build-up
    assert len(data["result"]["line"]["layers"]) == 3
    assert not any("above its usable limit" in w for w in data["warnings"])


def test_foam_on_a_150c_line_is_not_picked_alone(run):
    code, out, err = run("size", "--pipe", "NPS 4", "--fluid-temp", "150C", "--material", "flexible elastomeric foam",
                         "--format", "json")
    assert code == 0, err
    data = json.loads(out)
    assert data["inner_layer"] is not None
    spec = LineSpec(pipe="NPS 4", fluid_temp_c=150.0, layers=(
        ("mineral wool", data["inner_layer"]["thickness_mm"] / 1000),
        ("flexible elastomeric foam", data["selected_thickness_mm"] / 1000)))
    _assert_inside(spec.solve())


def test_text_and_us_units_show_the_interface(run):
    code, out, _ = run("size", "--pipe", "NPS 4", "--fluid-temp", "150C", "--material", "flexible elastomeric foam")
    assert code == 0 and "Inner layer" in out and "interface [°C]" in out
    code, out, _ = run("size", "--units", "us", "--pipe", "NPS 4", "--fluid-temp", "302F",
                       "--material", "flexible elastomeric foam")
    assert code == 0 and "interface [°F]" in out and "-58.0 °F to 221.0 °F" in out
    code, out, _ = run("size", "--pipe", "NPS 4", "--fluid-temp", "150C", "--material", "flexible elastomeric foam",
                       "--format", "markdown")
    assert code == 0 and "Inner layer" in out


def test_table_every_size_inside_its_limits(run):
    code, out, err = run("table", "--sizes", "NPS 1,NPS 4,NPS 10", "--fluid-temp", "180C",
                         "--material", "polyisocyanurate foam", "--format", "json")
    assert code == 0, err
    for row in json.loads(out)["rows"]:
        assert row["feasible"] and row["inner_layer"] is not None
        spec = LineSpec(pipe=row["size"], fluid_temp_c=180.0, layers=(
            ("mineral wool", row["inner_layer"]["thickness_mm"] / 1000),
            ("polyisocyanurate foam", row["selected_thickness_mm"] / 1000)))
        result = spec.solve()
        _assert_inside(result)
        assert row["inner_layer"]["interface_temp_c"] == pytest.approx(float(result.interface_temps_c[2]), abs=0.01)


def test_cold_line_gets_a_cold_rated_inner_layer():
    # -100 °C is below the foam's -50 °C limit: cellular glass (to -200 °C) goes underneath
    spec = LineSpec(pipe="NPS 2", fluid_temp_c=-100.0, air_temp_c=25.0, rh_percent=70.0)
    sel = select(spec, "flexible elastomeric foam", Requirements())
    assert sel.inner_layer[0].name == "cellular glass pipe section"
    assert bool(sel.outcome.feasible[0])
    layers = tuple((n, t) for n, t in sel.added_layers(0))
    _assert_inside(LineSpec(pipe="NPS 2", fluid_temp_c=-100.0, air_temp_c=25.0, layers=layers).solve())


def test_a_material_that_serves_needs_no_inner_layer():
    sel = select(LineSpec(pipe="NPS 4", fluid_temp_c=150.0), "mineral wool", Requirements())
    assert sel.inner_layer is None and sel.added_layers(0) == (("mineral_wool", float(sel.outcome.selected_m[0])),)
    assert "service_limit" in [c.key for c in sel.outcome.criteria]
    _assert_inside(sel.outcome.result)


def test_without_inner_layers_the_size_cannot_be_met_and_names_materials():
    sel = select(LineSpec(pipe="NPS 4", fluid_temp_c=150.0), "flexible elastomeric foam", Requirements(),
                 add_inner_layer=False)
    assert not sel.outcome.feasible[0]
    message = next(m for m in sel.outcome.messages[0] if m.startswith("service temperature cannot be met"))
    assert "flexible elastomeric foam tube" in message and "above its 105 °C limit" in message
    assert "rated for 150.0 °C: mineral wool pipe section" in message


def test_a_given_layer_beyond_its_limit_is_refused(run):
    code, _, err = run("size", "--pipe", "NPS 4", "--fluid-temp", "150C", "--layer", "flexible elastomeric foam:10mm",
                       "--material", "mineral wool")
    assert code == 2
    assert err.startswith("Error: --material: service temperature cannot be met: layer 1 (flexible elastomeric foam "
                          "tube) hot face 150.0 °C, 45.0 K above its 105 °C limit; that layer is given, not sized")
    # check keeps warning on the same build-up
    code, out, _ = run("check", "--pipe", "NPS 4", "--fluid-temp", "150C", "--layer", "flexible elastomeric foam:10mm",
                       "--format", "json")
    assert code == 0
    assert any("above its usable limit of 105 °C" in w for w in json.loads(out)["warnings"])


def test_schedule_refuses_a_service_whose_material_cannot_serve():
    text = """\
[project]
name = "Invented test site"

[conditions.plant]
air = "20 C"

[services.hot]
fluid = "water"
temperature = "150 C"
material = "flexible elastomeric foam"
criteria = ["touch"]

[[lines]]
service = "hot"
size = "NPS 2"
length = "10 m"
condition = "plant"
"""
    with pytest.raises(ProjectError) as info:
        compute_schedule(parse_project(text, "site.toml"))
    assert any("service temperature cannot be met" in p and "rated for 150.0 °C: mineral wool pipe section" in p
               for p in info.value.problems)
