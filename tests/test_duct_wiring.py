"""Ducts through the front door: the inside air film, the air along the run, the duct
criteria of ``size``, the duct table (issue 10 §2, §5).

References outside the project: CoolProp's dry air (density, viscosity, conductivity, c_p);
``ht.conv_internal.turbulent_Gnielinski`` (Gnielinski 1976) with Filonenko's smooth-tube
friction factor f = (1.82·log10 Re − 1.64)⁻² (from memory, as in Incropera et al., 6th ed.,
Eq. 8.21); the closed-form exponential of a run with a fixed conductance (any
heat-transfer text: T(L) = T_a + (T_0 − T_a)·exp(−UA'·L/(ṁ·c_p))); the plane-layer
resistance R = t/k (ASTM C680).
"""

from __future__ import annotations

import json
import math

import numpy as np
import pytest

from pipeins.line import LineSpec

DUCT = ("--duct", "600x400mm", "--fluid-temp", "14C", "--ambient-temp", "30C")


def _json(run, *args):
    code, out, err = run(*args, "--format", "json")
    assert code == 0, err
    return json.loads(out)


# ----------------------------------------------------------------------------- inner film
def _coolprop_air(temp_c, pressure_pa=101325.0):
    from CoolProp.CoolProp import PropsSI

    t = temp_c + 273.15
    return {k: PropsSI(k, "T", t, "P", pressure_pa, "Air") for k in ("D", "V", "L", "C")}


@pytest.mark.parametrize("duct, inside, velocity", [("600x400mm", (0.5984, 0.3984), 5.0),
                                                    ("450mm", (0.4484, None), 7.0)])
def test_inner_film_is_gnielinski_on_the_hydraulic_diameter(duct, inside, velocity):
    """Reference: ht's Gnielinski (1976) with Filonenko's friction factor, CoolProp air
    properties at 14 °C, on the inside dimensions (0.8 mm sheet)."""
    from ht.conv_internal import turbulent_Gnielinski

    spec = LineSpec(duct=duct, layers=(("k=0.040", 0.025),), fluid_temp_c=14.0, air_temp_c=30.0,
                    velocity_m_s=velocity)
    fluid = spec.build_model()[2]
    w, h = inside
    d_h = w if h is None else 2 * w * h / (w + h)
    air = _coolprop_air(14.0)
    re = air["D"] * velocity * d_h / air["V"]
    pr = air["C"] * air["V"] / air["L"]
    fd = (1.82 * math.log10(re) - 1.64) ** -2
    expected = turbulent_Gnielinski(re, pr, fd) * air["L"] / d_h
    assert fluid.name == "air"
    assert float(fluid.film_coefficient_w_m2k) == pytest.approx(expected, rel=0.01)


def test_inner_film_from_flow_equals_the_film_at_the_mean_velocity():
    """1500 cfm = 0.70792 m³/s (1 ft³ = 0.0283168 m³, NIST SP 811) over the inside area."""
    from pipeins.units import parse_quantity

    flow = LineSpec(duct="600x400mm", fluid_temp_c=14.0, air_temp_c=30.0, layers=(("k=0.040", 0.025),),
                    flow=parse_quantity("1500 cfm", "flow", units="us")).build_model()[2]
    velocity = 1500 * 0.028316846592 / 60 / (0.5984 * 0.3984)
    speed = LineSpec(duct="600x400mm", fluid_temp_c=14.0, air_temp_c=30.0, layers=(("k=0.040", 0.025),),
                     velocity_m_s=velocity).build_model()[2]
    assert float(flow.film_coefficient_w_m2k) == pytest.approx(float(speed.film_coefficient_w_m2k), rel=1e-9)


def test_a_duct_without_fluid_is_air(run):
    code, out, _ = run("check", *DUCT, "--layer", "mineral wool:25mm", "--velocity", "5m/s")
    assert code == 0 and "air at 14.0 °C; inner film 14.1" in out


@pytest.mark.parametrize("args, line", [
    (("check", *DUCT, "--fluid", "water", "--flow", "1m3/s", "--layer", "mineral wool:25mm"),
     'Error: --fluid: "water" in a duct: the inside film of a duct is worked out for air only; leave fluid out '
     '(air) or give --inner-h'),
    (("check", "--face", "vertical", "--height", "2m", "--fluid-temp", "14C", "--ambient-temp", "30C",
      "--layer", "mineral wool:25mm", "--flow", "1m3/s"),
     "Error: --flow: a face has no computed inside film; give the inside film coefficient --inner-h instead"),
    (("check", "--sphere", "2m", "--fluid-temp", "14C", "--ambient-temp", "30C",
      "--layer", "mineral wool:25mm", "--velocity", "1m/s"),
     "Error: --velocity: a sphere has no computed inside film; give the inside film coefficient --inner-h "
     "instead"),
    (("check", *DUCT, "--layer", "mineral wool:25mm", "--flow", "5cfm", "--length", "300m"),
     "Error: --flow: an air flow of 0.002902 kg/s is too small for 300 m of duct: the air comes within 1 % of "
     "the surrounding temperature after about 58.7 m; give a larger flow, a shorter run or more insulation"),
])
def test_bad_duct_flow_input_is_one_line(run, tmp_path, args, line):
    target = tmp_path / "out.json"
    code, out, err = run(*args, "--output", str(target))
    assert (code, out, err.splitlines()) == (2, "", [line])
    assert list(tmp_path.iterdir()) == []


# ----------------------------------------------------------------------------- the run
@pytest.mark.parametrize("units, length, flow", [("si", "40m", "0.6kg/s"), ("us", "131.2ft", "1.322lb/s")])
def test_leaving_air_matches_the_closed_form_exponential(run, units, length, flow):
    """A fixed outer coefficient and a constant k make q' = UA'(T − T_a) exactly linear, so
    the leaving air follows the closed form; UA' from the CLI's own heat flow at the entry,
    c_p of dry air from CoolProp at the mean air temperature."""
    d = _json(run, "check", *DUCT, "--layer", "k=0.040:25mm", "--outer-h", "8",
              "--length", length, "--flow", flow, "--units", units)
    mdot = d["mass_flow_kg_s"]
    length_m = 40.0 if units == "si" else 131.2 * 0.3048
    assert mdot == pytest.approx(0.6 if units == "si" else 1.322 * 0.45359237, rel=1e-9)
    ua = d["heat_flow_w_per_m"] / (14.0 - 30.0)
    leaving = d["leaving_temp_c"]
    cp = _coolprop_air(0.5 * (14.0 + leaving))["C"]
    expected = 30.0 + (14.0 - 30.0) * math.exp(-ua * length_m / (mdot * cp))
    assert leaving == pytest.approx(expected, abs=0.01)
    assert d["temp_change_k"] == pytest.approx(leaving - 14.0, abs=1e-12)
    # the heat over the run is the air's enthalpy rise: a gain, reported apart
    assert d["heat_gain_w"] == pytest.approx(mdot * cp * (leaving - 14.0), rel=2e-3)
    assert "heat_loss_w" not in d and d["heat_flow_w"] < 0
