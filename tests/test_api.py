"""The Python API as a notebook uses it: pipeins.solve, LineSpec with arrays, clear errors."""

import subprocess
import sys

import numpy as np
import pytest

import pipeins
from pipeins import InputError, LineSpec


def test_pipeins_solve_is_the_function_whatever_was_imported_first():
    # a fresh interpreter: importing the solver module first must not rebind pipeins.solve
    code = ("import pipeins.sizing, pipeins.solve\n"
            "from pipeins import solve\n"
            "from pipeins.solve import solve as inner, RELATIVE_TOLERANCE\n"
            "import pipeins\n"
            "assert callable(solve) and solve is inner is pipeins.solve, (solve, inner)\n"
            "print('ok')\n")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, cwd=".")
    assert out.returncode == 0, out.stderr
    assert out.stdout.strip() == "ok"


def test_pipeins_solve_solves():
    from pipeins.catalog.materials import lookup_material

    r = pipeins.solve(pipeins.Pipe(0.0603, 0.0039), [pipeins.Layer(lookup_material("k=0.040"), 0.040)],
                      pipeins.Fluid(80.0), pipeins.Surroundings(20.0))
    assert 10 < float(r.heat_flow_w_per_m) < 25


def test_sizes_times_thicknesses_broadcast_like_one_solve_per_case():
    sizes = ["NPS 1", "NPS 2", "NPS 4"]
    thick = [0.025, 0.05, 0.1]
    grid = LineSpec(pipe=np.array(sizes)[:, None], layers=(("mineral wool", np.array(thick)),),
                    fluid_temp_c=150.0, air_temp_c=20.0, finish="aluminium, weathered").solve()
    assert grid.heat_flow_w_per_m.shape == (3, 3)
    for i, size in enumerate(sizes):
        for j, t in enumerate(thick):
            one = LineSpec(pipe=size, layers=(("mineral wool", t),), fluid_temp_c=150.0, air_temp_c=20.0,
                           finish="aluminium, weathered").solve()
            assert grid.heat_flow_w_per_m[i, j] == pytest.approx(float(one.heat_flow_w_per_m), rel=1e-8)
    # heat loss falls with thickness, rises with size (well past the critical radius here)
    assert np.all(np.diff(grid.heat_flow_w_per_m, axis=1) < 0)
    assert np.all(np.diff(grid.heat_flow_w_per_m, axis=0) > 0)


def test_list_of_sizes_gives_one_case_per_size():
    r = LineSpec(pipe=["NPS 2", "copper L 1-1/8", "DN50"], layers=(("k=0.04", 0.03),), fluid_temp_c=60.0).solve()
    assert r.heat_flow_w_per_m.shape == (3,)


def test_rh_array_broadcasts_and_dew_point_matches_psychrolib():
    psychrolib = pytest.importorskip("psychrolib")
    psychrolib.SetUnitSystem(psychrolib.SI)
    rh = np.array([40.0, 60.0, 80.0])
    r = LineSpec(pipe="NPS 2", layers=(("flexible elastomeric foam", 0.019),), fluid_temp_c=6.0,
                 air_temp_c=28.0, rh_percent=rh).solve()
    assert r.heat_flow_w_per_m.shape == (3,)
    for value, dew in zip(rh, r.dew_point_c):
        # reference: psychrolib.GetTDewPointFromRelHum (ASHRAE Handbook–Fundamentals 2017 ch. 1)
        assert dew == pytest.approx(psychrolib.GetTDewPointFromRelHum(28.0, value / 100), abs=0.05)


def test_every_numeric_field_takes_an_array():
    base = dict(pipe="NPS 2", layers=(("k=0.04", 0.03),), fluid_temp_c=80.0)
    for name, values in [("air_temp_c", [10.0, 20.0]), ("wind_m_s", [0.0, 5.0]), ("emittance", [0.1, 0.9]),
                         ("surroundings_temp_c", [0.0, 20.0]), ("pressure_pa", [80e3, 101e3]),
                         ("fluid_temp_c", [60.0, 90.0]), ("inner_h_w_m2k", [50.0, 5000.0])]:
        r = LineSpec(**{**base, name: np.array(values)}).solve()
        assert r.heat_flow_w_per_m.shape == (2,), name


@pytest.mark.parametrize("kw, message", [
    (dict(fluid_temp_c="150C"), 'fluid_temp_c: "150C" is text; give the number in °C, e.g. fluid_temp_c=150.0 '
                                "(pipeins.units.parse_quantity reads text with units)"),
    (dict(air_temp_c=["20", 30.0]), 'air_temp_c: "20" is text; give the number in °C, e.g. air_temp_c=20.0 '
                                    "(pipeins.units.parse_quantity reads text with units)"),
    (dict(layers=(("mineral wool", 50),)), "layers[0] thickness: 50 m is more than 2 m; lengths are in metres "
                                           "(did you mean 0.05, i.e. 50 mm?)"),
    (dict(layers=(("mineral wool", [0.05, 80]),)), "layers[0] thickness: 80 m is more than 2 m; lengths are in "
                                                   "metres (did you mean 0.08, i.e. 80 mm?)"),
    (dict(rh_percent=0.8), "rh_percent: 0.8 looks like a fraction; relative humidity is in percent "
                           "(did you mean 80?)"),
    (dict(wind_m_s=float("nan")), "wind_m_s: must be finite (got nan); give the number in m/s"),
    (dict(orientation="diagonal"), 'orientation: unknown orientation "diagonal"; use horizontal or vertical'),
    (dict(pipe=["NPS 2", 3]), 'pipe: give a catalogue size or an array of them, e.g. ["NPS 1", "NPS 2"]'),
])
def test_bad_api_input_is_an_input_error_with_a_hint(kw, message):
    with pytest.raises(InputError) as info:
        LineSpec(**{"pipe": "NPS 2", "fluid_temp_c": 80.0, **kw})
    assert str(info.value) == message


def test_api_errors_name_the_parameter_not_a_flag():
    with pytest.raises(InputError) as info:
        LineSpec(pipe="NPS 2", fluid_temp_c=80.0, air_temp_c=-300.0).solve()
    assert info.value.name == "air_temp_c"
    with pytest.raises(InputError) as info:
        LineSpec(pipe="NPS 2").solve()
    assert str(info.value) == "fluid_temp_c: the fluid temperature is missing (or give steam_pressure_pa)"


def test_arrays_that_do_not_broadcast_say_which():
    with pytest.raises(InputError) as info:
        LineSpec(pipe="NPS 2", fluid_temp_c=[60.0, 70.0], air_temp_c=[10.0, 20.0, 30.0]).solve()
    assert str(info.value) == "shape: the arrays do not broadcast together: fluid_temp_c (2,), air_temp_c (3,)"


def test_readme_notebook_example_prints_what_the_readme_shows(capsys):
    import pathlib
    import re

    text = pathlib.Path(__file__).resolve().parents[1].joinpath("README.md").read_text(encoding="utf-8")
    m = re.search(r"Sizes down, thicknesses across:\n\n```python\n(.*?)```\n\nprints\n\n```\n(.*?)```", text, re.S)
    assert m, "README lost its sizes x thicknesses example"
    exec(compile(m.group(1), "README.md", "exec"), {})
    assert capsys.readouterr().out.strip() == m.group(2).strip()
