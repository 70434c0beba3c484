"""Shipped glycol, brine and oil tables (pipeins.props.fluid_tables) against live CoolProp.

Reference: CoolProp's incompressible fits (the tables' own source, evaluated live here):
at every grid point to the printed digits, between grid points within the stated
interpolation error; and the common CLI paths import neither CoolProp, scipy nor matplotlib.
"""

import json
import subprocess
import sys
from pathlib import Path

import numpy as np
import pytest

from pipeins.errors import InputError
from pipeins.props import generate
from pipeins.props.fluid_tables import GRID_STEP_K, OILS, SOLUTIONS, shipped_table
from pipeins.props.liquids import fluid_properties, fluid_temp_range_c, freezing_point_c, normalise_fluid
from pipeins.tables import read_table

CP = pytest.importorskip("CoolProp.CoolProp")

ROOT = Path(__file__).resolve().parents[1]
FLUID_TABLES = [name for name in generate.TABLE_BUILDERS if name.startswith("fluid_")]
SHIPPED = [
    (f"{percent:g}% {label}", f"INCOMP::{family.code}[{percent / 100:g}]")
    for label, family in SOLUTIONS.items()
    for percent in family.shipped_percents
] + [(name, name) for name in OILS]
FIELDS = {"density_kg_m3": "D", "viscosity_pa_s": "V", "conductivity_w_mk": "L", "heat_capacity_j_kgk": "CPMASS"}

#: Largest relative error between grid points (measured: viscosity 5.8e-5 for 45 %
#: potassium acetate just above its freezing point; the other properties below 2e-6).
INTERPOLATION_BOUND = {"viscosity_pa_s": 1e-4, "prandtl": 1e-4}
OTHER_BOUND = 1e-5


def _live(coolprop_name, temp_c):
    temp_k = np.asarray(temp_c, float) + 273.15
    pressure = np.full(temp_k.shape, generate.INCOMP_PRESSURE_PA)
    out = {field: np.asarray(CP.PropsSI(key, "T", temp_k, "P", pressure, coolprop_name)) for field, key in FIELDS.items()}
    out["prandtl"] = out["viscosity_pa_s"] * out["heat_capacity_j_kgk"] / out["conductivity_w_mk"]
    return out


# ---------------------------------------------------------------- at every grid point
@pytest.mark.parametrize("name", FLUID_TABLES)
def test_table_regenerates_exactly_from_live_coolprop(name):
    builder, _comment = generate.TABLE_BUILDERS[name]
    fresh = builder()  # CoolProp, live, rounded to the printed digits
    shipped = read_table(name)
    assert len(shipped) == len(fresh) and list(shipped[0]) == list(fresh[0])
    for old, new in zip(shipped, fresh):
        for column, value in new.items():
            if isinstance(value, str):
                assert old[column] == value
            else:
                assert float(old[column]) == value, (name, column, old, new)


@pytest.mark.parametrize("fluid, coolprop_name", SHIPPED, ids=[c for _f, c in SHIPPED])
def test_grid_is_uniform_over_coolprop_range(fluid, coolprop_name):
    table = shipped_table(fluid)
    temps = table["temp_c"]
    steps = np.diff(temps)
    assert steps.max() <= GRID_STEP_K + 1e-6
    np.testing.assert_allclose(steps, steps.mean(), atol=2e-6)  # uniform to the printed digits
    top_c = CP.PropsSI("Tmax", coolprop_name) - 273.15
    if fluid in OILS:
        low_c, freezes = CP.PropsSI("Tmin", coolprop_name) - 273.15, False
        assert freezing_point_c(fluid) == float("-inf")
    else:
        low_c, freezes = CP.PropsSI("T_freeze", coolprop_name) - 273.15, True
        assert freezing_point_c(fluid) == pytest.approx(low_c, abs=1e-6)  # CoolProp T_freeze
    assert table["freezes"] is freezes
    assert fluid_temp_range_c(fluid) == pytest.approx((low_c, top_c), abs=1e-6)  # CoolProp limits


# ---------------------------------------------------------------- between grid points
def test_interpolation_error_between_grid_points_is_bounded():
    worst = {}
    for fluid, coolprop_name in SHIPPED:
        temps = shipped_table(fluid)["temp_c"]
        middle = 0.5 * (temps[1:] + temps[:-1])
        quarter = temps[:-1] + 0.25 * np.diff(temps)
        for probe in (middle, quarter):
            ours = fluid_properties(fluid, probe)
            for field, expected in _live(coolprop_name, probe).items():
                error = float(np.max(np.abs(getattr(ours, field) / expected - 1.0)))
                worst[field] = max(worst.get(field, 0.0), error)
    for field, error in worst.items():
        assert error < INTERPOLATION_BOUND.get(field, OTHER_BOUND), (field, error)  # CoolProp live
    # the bound is not slack by orders of magnitude: it is what the grid gives
    assert worst["viscosity_pa_s"] > 1e-5


def test_synthetic_oil_above_its_normal_boiling_point():
    # CoolProp evaluates INCOMP::TVP1 only above its vapour pressure; the fits do not
    # depend on pressure, so the table (evaluated at 100 bar) covers 12 to 397 C.
    props = fluid_properties("INCOMP::TVP1", [250.0, 300.0, 396.9])
    live = _live("INCOMP::TVP1", [250.0, 300.0, 396.9])
    for field, expected in live.items():
        np.testing.assert_allclose(getattr(props, field), expected, rtol=1e-4, err_msg=field)  # CoolProp


# ---------------------------------------------------------------- other contents go live
@pytest.mark.parametrize(
    "name, coolprop_name",
    [("33% propylene glycol", "INCOMP::MPG[0.33]"), ("CaCl2 22%", "INCOMP::MCA[0.22]"),
     ("INCOMP::T66", "INCOMP::T66")],
)
def test_unshipped_fluid_through_coolprop(name, coolprop_name):
    fluid = normalise_fluid(name)
    assert shipped_table(fluid) is None
    low_c, high_c = fluid_temp_range_c(fluid)
    temps = np.linspace(low_c + 0.1, high_c - 0.1, 7)
    ours = fluid_properties(fluid, temps)
    for field, expected in _live(coolprop_name, temps).items():
        np.testing.assert_allclose(getattr(ours, field), expected, rtol=1e-4, err_msg=field)  # CoolProp live


@pytest.mark.parametrize("label", list(SOLUTIONS))
def test_content_limit_matches_coolprop_fit(label):
    family = SOLUTIONS[label]
    top = family.max_percent
    assert CP.PropsSI("D", "T", 280.0, "P", 1e5, f"INCOMP::{family.code}[{top / 100:g}]") > 900.0
    with pytest.raises(ValueError):  # CoolProp refuses 1 % above the fit's limit
        CP.PropsSI("D", "T", 280.0, "P", 1e5, f"INCOMP::{family.code}[{(top + 1) / 100:g}]")
    assert normalise_fluid(f"{top:g}% {label}") == f"{top:g}% {label}"
    with pytest.raises(InputError) as info:
        normalise_fluid(f"{top + 1:g}% {label}")
    assert info.value.message == (
        f'"{top + 1:g}% {label}": {family.content_word} content {top + 1:g} % is outside 0 to {top:g} % by mass'
    )


@pytest.mark.parametrize(
    "spelling, canonical",
    [
        ("CaCl2 25%", "25% calcium chloride"),
        ("25 % calcium chloride", "25% calcium chloride"),
        ("INCOMP::MCA[0.2]", "20% calcium chloride"),
        ("NaCl 20 %", "20% sodium chloride"),
        ("sodium chloride 23%", "23% sodium chloride"),
        ("40% potassium formate", "40% potassium formate"),
        ("MKA-30%", "30% potassium acetate"),
        ("incomp::tvp1", "INCOMP::TVP1"),
        ("INCOMP::PNF", "INCOMP::PNF"),
        ("MEG 50", "50% ethylene glycol"),
    ],
)
def test_brine_and_oil_spellings(spelling, canonical):
    assert normalise_fluid(spelling) == canonical


# ---------------------------------------------------------------- no heavy import on the common path
_PROBE = """
import sys, json
from pipeins.cli import main
heavy = lambda: sorted({m.split('.')[0] for m in sys.modules} & {'CoolProp', 'scipy', 'matplotlib', 'openpyxl'})
seen = {'import pipeins.cli': heavy()}
for args in json.loads(sys.argv[1]):
    try:
        main(args)
    except SystemExit as stop:
        assert stop.code in (0, None), (args, stop.code)
    seen[' '.join(args)] = heavy()
print(json.dumps(seen))
"""


def test_common_commands_import_no_coolprop_scipy_or_matplotlib():
    runs = [
        ["check", "--pipe", "NPS 2", "--fluid-temp", "60C", "--layer", "mineral wool:25mm", "--velocity", "1m/s",
         "--format", "json"],
        ["check", "--pipe", "DN50", "--fluid", "30% propylene glycol", "--fluid-temp", "-5C", "--velocity", "1m/s",
         "--rh", "70", "--layer", "flexible elastomeric foam:25mm", "--format", "json"],
        ["check", "--pipe", "DN80", "--fluid", "CaCl2 25%", "--fluid-temp", "-20C", "--velocity", "1m/s",
         "--layer", "flexible elastomeric foam:32mm", "--format", "json"],
        ["schedule", str(ROOT / "examples" / "food_factory_chilled.toml"), "--format", "json"],
        # sizing: one line, and a table with three criteria (touch, cap, code minimum)
        ["size", "--pipe", "NPS 4", "--fluid-temp", "5C", "--ambient-temp", "30C", "--rh", "70",
         "--material", "flexible elastomeric foam", "--format", "json"],
        ["table", "--sizes", "DN10..DN600", "--fluid-temp", "180C", "--ambient-temp", "25C",
         "--material", "mineral wool", "--max-heat-flow", "150W/m", "--code", "ashrae-90.1-2019"],
    ]
    out = subprocess.run([sys.executable, "-c", _PROBE, json.dumps(runs)], cwd=ROOT, capture_output=True,
                         text=True, check=True).stdout
    seen = json.loads(out.splitlines()[-1])
    assert len(seen) == len(runs) + 1
    assert all(modules == [] for modules in seen.values()), seen


def test_every_shipped_fluid_without_coolprop():
    code = (
        "import sys\n"
        "from pipeins.props.liquids import fluid_properties, fluid_temp_range_c, normalise_fluid\n"
        f"for name in {[fluid for fluid, _c in SHIPPED]!r}:\n"
        "    fluid = normalise_fluid(name)\n"
        "    low, high = fluid_temp_range_c(fluid)\n"
        "    fluid_properties(fluid, [low, 0.5 * (low + high), high])\n"
        "assert not [m for m in sys.modules if m.startswith('CoolProp')]\n"
    )
    subprocess.run([sys.executable, "-c", code], cwd=ROOT, check=True)
