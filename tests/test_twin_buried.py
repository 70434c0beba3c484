"""Two buried pipes in one trench (issue 13 §3): the mutual resistance of a line source and its
image in the ground surface (Wallentén 1991, from memory), checked by its limits and by
superposition computed here independently."""

import json
import math

import pytest

from pipeins.buried import mutual_resistance_mk_w, soil_resistance_mk_w, twin_heat_flows


def test_mutual_resistance_is_a_source_and_its_image():
    # Superposition: the temperature rise at pipe 1 per W/m of pipe 2, a line source at distance E
    # and its negative image at sqrt(E² + (2z)²): ln(r_image / E) / (2π k) (method of images).
    z, e, k = 1.0, 0.4, 1.5
    want = math.log(math.hypot(e, 2 * z) / e) / (2 * math.pi * k)
    assert float(mutual_resistance_mk_w(z, e, k)) == pytest.approx(want, rel=1e-12)
    assert float(mutual_resistance_mk_w(z, 1e6, k)) < 1e-9  # far apart: no influence


def test_twin_flows_reduce_to_the_single_pipe_and_solve_the_pair():
    r_s = float(soil_resistance_mk_w(0.9, 0.2, 1.5))
    r_m = float(mutual_resistance_mk_w(0.9, 0.45, 1.5))
    own = (3.0, 3.4)
    q1, q2 = twin_heat_flows(own, r_s, 0.0, (70.0, 40.0))
    assert (q1, q2) == pytest.approx((70.0 / (3.0 + r_s), 40.0 / (3.4 + r_s)), rel=1e-12)
    q1, q2 = twin_heat_flows(own, r_s, r_m, (70.0, 40.0))
    # the pair satisfies ΔT_i = (R_i + R_s)·q_i + R_m·q_j (each pipe's temperature rise is its own and the other's)
    assert 70.0 == pytest.approx((3.0 + r_s) * q1 + r_m * q2, rel=1e-12)
    assert 40.0 == pytest.approx((3.4 + r_s) * q2 + r_m * q1, rel=1e-12)
    q_same, _ = twin_heat_flows((3.0, 3.0), r_s, r_m, (50.0, 50.0))
    assert q_same == pytest.approx(50.0 / (3.0 + r_s + r_m), rel=1e-12)


def test_cli_twin_pipes(run):
    base = ("check", "--pipe", "DN100", "--fluid-temp", "80C", "--layer", "polyisocyanurate foam:50mm",
            "--buried", "0.9m", "--soil", "moist sand", "--ground-temp", "8C", "--format", "json")
    code, out, err = run(*base, "--twin-spacing", "0.45m", "--return-temp", "50C")
    assert code == 0, err
    twin = json.loads(out)["twin"]
    assert twin["supply_heat_flow_w_per_m"] < twin["alone_heat_flow_w_per_m"][0]  # the warm neighbour cuts the loss
    assert twin["return_heat_flow_w_per_m"] < twin["alone_heat_flow_w_per_m"][1]
    code, out, err = run(*base, "--twin-spacing", "0.1m", "--return-temp", "50C")
    assert code == 2 and err.startswith("Error: --twin-spacing")
    code, out, err = run(*base, "--return-temp", "50C")
    assert code == 2 and err.startswith("Error: --twin-spacing")
