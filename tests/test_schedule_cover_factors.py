"""Design-conductivity factors on the removable covers of a project's fittings.

A cover in service ages, takes moisture and has joints as the pipe insulation does, so a service's
``ageing_factor``/``moisture_factor``/``joints_factor`` apply to its fittings' covers too (in the
manner of EN ISO 10456 conversion factors, from memory).  Checks: a cover with a 10 % factor gives
the heat flow of the same cover solved with its conductivity × 1.10 (by hand: a constant
conductivity k=0.040 → k=0.044); the same through ``check --cover --ageing-factor``; the basis is
named in the report.  The case: an invented dye-house header of a fictional textile works.
"""

import json

import pytest

PROJECT = """\
[project]
name = "Marlow Lane textile works (invented)"
[conditions.plant]
air = "20 C"
[services.hot]
temperature = "95 C"
material = "mineral wool"
criteria = ["touch"]
{factors}
[[lines]]
tag = "DH-1"
service = "hot"
size = "DN80"
length = "20 m"
condition = "plant"
valve = ["gate", "globe"]
flange = ["DN80"]
cover = "{cover}"
"""


def _fittings(run, tmp_path, factors, cover):
    path = tmp_path / "works.toml"
    path.write_text(PROJECT.format(factors=factors, cover=cover), encoding="utf-8")
    code, out, err = run("schedule", str(path), "--format", "json")
    assert code == 0, err
    return json.loads(out)["fittings"]


def test_a_ten_percent_factor_is_the_cover_at_k_times_1_10(run, tmp_path):
    aged = _fittings(run, tmp_path, "ageing_factor = 10", "k=0.040:40mm")
    by_hand = _fittings(run, tmp_path, "", f"k={0.040 * 1.10!r}:40mm")   # the cover's k × 1.10, given
    assert len(aged["items"]) == 3
    for a, b in zip(aged["items"], by_hand["items"]):
        assert a["covered_heat_flow_w"] == pytest.approx(b["covered_heat_flow_w"], rel=1e-12)
        assert a["heat_flow_w"] == b["heat_flow_w"]   # the bare fitting is bare: no factor
    plain = _fittings(run, tmp_path, "", "k=0.040:40mm")
    assert all(a["covered_heat_flow_w"] > p["covered_heat_flow_w"] for a, p in zip(aged["items"], plain["items"]))


def test_the_factors_multiply_on_a_catalogue_cover_and_the_basis_is_named(run, tmp_path):
    aged = _fittings(run, tmp_path, "ageing_factor = 10\nmoisture_factor = 5", "mineral wool:50mm")
    [valve, *_] = aged["items"]
    assert valve["cover"].startswith("design ×1.155: mineral wool pipe section (ageing 10 %, moisture 5 %)")
    assert "design factors" in aged["method"]
    code, out, err = run("check", "--pipe", "DN80", "--fluid-temp", "95C", "--ambient-temp", "20C", "--layer",
                         "mineral wool:50mm", "--valve", "gate:DN80", "--cover", "mineral wool:50mm",
                         "--ageing-factor", "10", "--moisture-factor", "5", "--format", "json")
    assert code == 0, err
    [theirs, *_] = json.loads(out)["fittings"]
    assert valve["covered_heat_flow_w"] == pytest.approx(theirs["covered_heat_flow_w"], rel=1e-9)
