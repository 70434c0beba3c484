"""`pipeins size`, `pipeins table`: JSON contract, formats, and exact error lines."""

import json

import pytest

from pipeins.catalog.pipes import pipe_range

HOT = ("--fluid-temp", "180C", "--ambient-temp", "25C", "--material", "mineral wool")


def test_size_json_contract(run):
    code, out, err = run("size", "--pipe", "NPS 4", *HOT, "--max-heat-flow", "60W/m", "--format", "json")
    assert code == 0, err
    data = json.loads(out)
    req = data["required_thickness_mm"]
    assert set(req) >= {"surface_temp", "condensation", "heat_flow"}
    assert req["condensation"] is None  # not active on a hot line
    assert req["surface_temp"] > 0 and req["heat_flow"] > 0
    assert data["governing"] in ("surface_temp", "heat_flow")
    assert data["feasible"] is True
    assert data["selected_thickness_mm"] >= max(req["surface_temp"], req["heat_flow"])
    # the check at the selected thickness carries the check contract
    result = data["result"]
    assert abs(result["heat_flow_w_per_m"]) <= 60.0 + 1e-6
    assert result["interface_temps_c"][-1] == result["surface_temp_c"]
    assert result["line"]["layers"][-1]["thickness_m"] * 1000 == pytest.approx(data["selected_thickness_mm"])


def test_size_text_shows_the_touch_limit_and_its_source(run):
    code, out, _ = run("size", "--pipe", "NPS 4", *HOT, "--finish", "aluminium, dull or aged")
    assert code == 0
    assert "touch limit 60 °C: common practice, after ASTM C1055" in out
    assert "metal jacket's low emittance makes its surface run hotter" in out


def test_size_touch_limit_from_contact_time(run):
    # Limit picked from tables/touch_limits.csv for the kind of surface (ISO 13732-1, from memory).
    code, out, err = run("size", "--pipe", "NPS 4", *HOT, "--contact-time", "10min", "--format", "json")
    assert code == 0, err
    assert data_limit(out) < 60.0


def data_limit(out):
    data = json.loads(out)
    return data["result"]["touch_limit_c"]


def test_condensation_sizing_on_a_chilled_line(run):
    code, out, err = run("size", "--pipe", "DN80", "--fluid-temp", "6C", "--ambient-temp", "30C", "--rh", "80",
                         "--material", "elastomeric foam", "--format", "json")
    assert code == 0, err
    data = json.loads(out)
    assert data["governing"] == "condensation"
    assert data["result"]["surface_temp_c"] >= data["result"]["dew_point_c"] + 1.0 - 0.05
    assert any("vapour retarder" in c for c in data["cautions"])


def test_table_json_rows_and_sizes_against_fluids(run):
    # Sizes of the table against fluids.piping.nearest_pipe (ASME B36.10M) through the JSON od_mm.
    from fluids.piping import nearest_pipe

    code, out, err = run("table", "--sizes", "NPS 1/2..NPS 6", *HOT, "--max-heat-flow", "50W/m", "--format", "json")
    assert code == 0, err
    rows = json.loads(out)["rows"]
    assert [r["size"] for r in rows] == [s.label for s in pipe_range("NPS 1/2..NPS 6")]
    for row in rows:
        assert set(row) >= {"size", "od_mm", "required_thickness_mm", "selected_thickness_mm", "governing",
                            "heat_flow_w_per_m", "surface_temp_c"}
        nps = float(eval(row["size"].split()[1].replace("-", "+")))
        assert row["od_mm"] == pytest.approx(nearest_pipe(NPS=nps, schedule="40")[2] * 1000, abs=0.01)
        assert abs(row["heat_flow_w_per_m"]) <= 50.0 + 1e-6


def test_table_us_units_and_footer(run):
    code, out, _ = run("table", "--sizes", "NPS 1..NPS 3", *HOT, "--units", "us")
    assert code == 0
    assert "OD [in]" in out and "heat flow [Btu/(h·ft)]" in out and "surface [°F]" in out
    assert "Basis" in out and "material mineral wool" in out and "Cautions" in out


def test_matrix_layout(run):
    code, out, _ = run("table", "--sizes", "NPS 1..NPS 3", *HOT, "--matrix", "heat-flow", "--format", "csv")
    assert code == 0
    body = [x for x in out.strip().splitlines() if not x.startswith("#")]  # comment lines: basis, cautions
    header = body[0].split(",")
    assert header[:2] == ["size", "OD [mm]"] and len(header) > 5
    assert len(body) == 1 + len(pipe_range("NPS 1..NPS 3"))


@pytest.mark.parametrize("args, line", [
    (("size", "--pipe", "NPS 2", "--fluid-temp", "150C", "--ambient-temp", "45C", "--touch-limit", "40C",
      "--material", "mineral wool"),
     "Error: --touch-limit: the touch limit 40 °C must be above the air temperature 45 °C"),
    (("size", "--pipe", "NPS 2", "--fluid-temp", "5C", "--ambient-temp", "30C", "--rh", "0",
      "--material", "elastomeric foam"),
     "Error: --rh: relative humidity must be above 0 and at most 100 %"),
    (("size", "--pipe", "NPS 2", "--fluid-temp", "5C", "--ambient-temp", "30C", "--rh", "120",
      "--material", "elastomeric foam"),
     "Error: --rh: relative humidity must be above 0 and at most 100 %"),
    (("size", "--pipe", "NPS 2", *HOT, "--series", ","),
     "Error: --series: the thickness series needs at least one thickness above zero"),
    (("table", "--sizes", "NPS 1..DN50", *HOT),
     'Error: --sizes: range "NPS 1..DN50" mixes catalogues (steel and metric); give one catalogue per run'),
    (("table", "--sizes", "NPS 4..NPS 2", *HOT),
     'Error: --sizes: range "NPS 4..NPS 2" runs backwards; write the smaller size first'),
    (("size", "--pipe", "NPS 24", "--fluid-temp", "400C", "--material", "mineral wool", "--no-touch-check",
      "--max-heat-flow", "5W/m"),
     None),
    (("size", "--pipe", "NPS 2", *HOT, "--format", "xml"),
     'Error: --format: unknown format "xml"; use text, json, csv, markdown, html, xlsx'),
])
def test_bad_input_lines(run, args, line):
    code, out, err = run(*args)
    assert code == 2 and out == ""
    assert len(err.strip().splitlines()) == 1
    if line is None:  # an impossible target says by how much it misses
        assert err.startswith("Error: --max-heat-flow: heat-flow cap cannot be met: with 240 mm the heat flow is still")
    else:
        assert err.strip() == line


def test_material_above_its_service_limit_gets_an_inner_layer(run):
    # elastomeric foam serves up to 105 °C (tables/insulation_materials.csv): on a 300 °C line the
    # selection puts a layer rated for it underneath, and says so
    code, out, err = run("size", "--pipe", "NPS 2", "--fluid-temp", "300C", "--material", "elastomeric foam",
                         "--format", "json")
    assert code == 0, err
    data = json.loads(out)
    assert data["inner_layer"]["material"] == "mineral wool pipe section"
    assert data["inner_layer"]["interface_temp_c"] <= 105.0
    assert not any("above its usable limit" in w for w in data["warnings"])
    assert any(w.startswith("flexible elastomeric foam tube serves -50.0 °C to 105.0 °C: an inner layer of "
                            "mineral wool pipe section") for w in data["warnings"])


def test_matrix_names_the_cells_that_fail_a_criterion(run):
    # A cell of the matrix fails condensation control exactly when the sized table needs more than
    # its thickness (consistency of the two layouts on the same solver).
    args = ("--sizes", "DN15..DN50", "--fluid-temp", "7C", "--ambient-temp", "30C", "--rh", "75",
            "--material", "elastomeric foam", "--format", "json")
    _, out, _ = run("table", *args, "--matrix", "surface-temp")
    warnings = json.loads(out)["warnings"]
    _, out, _ = run("table", *args)
    for row in json.loads(out)["rows"]:
        need = row["required_thickness_mm"]["condensation"]
        failing = [w for w in warnings if w.startswith(row["size"] + ": fails condensation control")]
        assert bool(failing) == (need > 9.0)  # 9 mm is the thinnest of the elastomeric series
