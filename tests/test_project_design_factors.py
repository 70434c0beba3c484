"""Design-conductivity factors of a project service (ageing_factor, moisture_factor, joints_factor):
the service is sized and solved with the declared conductivity × (1 + a)(1 + m)(1 + j) (in the
manner of EN ISO 10456, from memory), as ``check --ageing-factor …`` solves one line.

The case: an invented heating-water service of a fictional depot.  Sources: the factor product
by hand (1.10 × 1.05 = 1.155); the line's heat flow against ``check`` with the same factors and
thickness (the command line's path through pipeins.user_materials).
"""

import json

import pytest

from pipeins.catalog.materials import lookup_material
from pipeins.project import ProjectError, parse_project
from pipeins.schedule import compute_schedule
from pipeins.user_materials import materials_in_use

PROJECT = """\
[project]
name = "Invented depot heating"
[conditions.store]
air = "15 C"
[services.heating]
temperature = "80 C"
material = "mineral wool"
criteria = ["touch"]
{factors}
[[lines]]
tag = "H-1"
service = "heating"
size = "DN65"
length = "40 m"
condition = "store"
"""


def _project(factors):
    return parse_project(PROJECT.replace("{factors}", factors), "depot.toml")


def test_design_material_is_the_declared_times_the_factors():
    project = _project('ageing_factor = 10\nmoisture_factor = "5 %"')
    service = project.services["heating"]
    with materials_in_use(project.materials):
        design = lookup_material(service.material)
    assert design.name == "design ×1.155: mineral wool pipe section (ageing 10 %, moisture 5 %)"
    declared = lookup_material("mineral wool")
    assert [t for t, _ in design.points] == [t for t, _ in declared.points]
    for (_, k_design), (_, k_declared) in zip(design.points, declared.points):
        assert k_design == pytest.approx(k_declared * 1.10 * 1.05, rel=1e-12)   # by hand: 1.155


def test_schedule_line_matches_check_with_the_same_factors(run):
    sched = compute_schedule(_project('ageing_factor = 10\nmoisture_factor = "5 %"'))
    line = sched.lines[0]
    code, out, err = run("check", "--pipe", "DN65", "--fluid-temp", "80C", "--ambient-temp", "15C",
                         "--layer", f"mineral wool:{line.thickness_m * 1000:g}mm", "--ageing-factor", "10",
                         "--moisture-factor", "5", "--format", "json")
    assert code == 0, err
    assert line.heat_flow_w_per_m == pytest.approx(json.loads(out)["heat_flow_w_per_m"], rel=1e-9)
    code, out, err = run("check", "--pipe", "DN65", "--fluid-temp", "80C", "--ambient-temp", "15C",
                         "--layer", f"mineral wool:{line.thickness_m * 1000:g}mm", "--format", "json")
    assert line.heat_flow_w_per_m > json.loads(out)["heat_flow_w_per_m"]   # more conductive in service


def test_factors_are_read_with_their_range():
    with pytest.raises(ProjectError) as exc:
        _project("joints_factor = 250")
    assert exc.value.problems == ['depot.toml: line 9 (service "heating"): joints_factor: design-conductivity '
                                  'allowance for joints and gaps must be from 0 to 200 %']
