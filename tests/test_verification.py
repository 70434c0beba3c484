"""The shipped published checks (pipeins.verification) and ``pipeins verify``.

The same records drive the test below and the command, so the verification report cannot
drift from the tests.  Reference-library values shipped as data are recomputed here with
the live library (iapws, psychrolib, ht, fluids, CoolProp).
"""

import dataclasses
import json
import math

import pytest

from pipeins.verification import CHECKS, run_checks

IDS = [check.id for check in CHECKS]


@pytest.mark.parametrize("check", CHECKS, ids=IDS)
def test_published_check_passes(check):
    outcome = check.evaluate()
    assert math.isfinite(outcome.actual)
    assert outcome.passed, (check.source, check.expected, outcome.actual, outcome.deviation)


@pytest.mark.parametrize("check", CHECKS, ids=IDS)
def test_perturbed_check_fails(check):
    # the published value moved by three tolerances (or one unit of the last digit at least)
    shift = 3.0 * check.tolerance * (abs(check.expected) if check.relative else 1.0)
    perturbed = dataclasses.replace(check, expected=check.expected + shift)
    assert not perturbed.evaluate().passed


# ---------------------------------------------------------------- reference values recomputed live
def _iapws95(temp_k, attribute):
    from iapws import IAPWS95

    return lambda: getattr(IAPWS95(T=temp_k, x=0.0), attribute) * (1e3 if attribute == "cp" else 1.0)


def _iapws97_saturation():
    from iapws import IAPWS97

    return IAPWS97(P=0.1, x=0.0).T - 273.15


def _iapws97_latent():
    from iapws import IAPWS97

    return (IAPWS97(P=1.0, x=1.0).h - IAPWS97(P=1.0, x=0.0).h) * 1e3


def _iapws06_fusion():
    import warnings

    from iapws import IAPWS95
    from iapws._iapws import _Ice, _Melting_Pressure
    from scipy.optimize import brentq

    melt_k = brentq(lambda t: _Melting_Pressure(t) - 0.101325, 273.0, 273.16)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")  # brentq may land a hair above the melting curve
        return (IAPWS95(T=melt_k, P=0.101325).h - _Ice(melt_k, 0.101325)["h"]) * 1e3


def _dew_point(temp_c, rh_percent):
    def live():
        import psychrolib

        psychrolib.SetUnitSystem(psychrolib.SI)
        psychrolib.PSYCHROLIB_TOLERANCE = 1e-7
        return psychrolib.GetTDewPointFromRelHum(temp_c, rh_percent / 100.0)

    return live


def _ht_outer_film(surface_c, air_c, diameter_m):
    def live():
        import fluids.core
        from CoolProp.CoolProp import PropsSI
        from ht import conv_free_immersed

        film_k = 0.5 * (surface_c + air_c) + 273.15
        rho, mu, k, cp = (PropsSI(key, "T", film_k, "P", 101325.0, "Air") for key in ("D", "V", "L", "CPMASS"))
        gr = fluids.core.Grashof(diameter_m, 1.0 / film_k, surface_c, air_c, rho=rho, mu=mu)
        pr = fluids.core.Prandtl(Cp=cp, k=k, mu=mu)
        return conv_free_immersed.Nu_horizontal_cylinder_Churchill_Chu(pr, gr) * k / diameter_m

    return live


def _resistance(outer_m, wall_m, wall_k, thickness_m, k, h_in, h_out):
    """R' [m·K/W] of inner film (when h_in), wall, layer and outer film in series."""
    r_o = outer_m / 2
    r_in, r_s = r_o - wall_m, r_o + thickness_m
    total = (math.log(r_o / r_in) / (2 * math.pi * wall_k) + math.log(r_s / r_o) / (2 * math.pi * k)
             + 1 / (h_out * 2 * math.pi * r_s))
    return total + (1 / (h_in * 2 * math.pi * r_in) if h_in else 0.0)


def _run_outlet():
    # Incropera 6th ed. Eq. 8.46: T_o = T_a + (T_i − T_a) exp(−L / (R' ṁ c_p)), c_p (IAPWS-95) at the mean
    from iapws import IAPWS95

    r = _resistance(0.0603, 0.0039, 50.0, 0.03, 0.04, 500.0, 10.0)
    guess = 40.0 * math.exp(-100.0 / (r * 0.05 * 4180.0))
    cp = IAPWS95(T=0.5 * (40.0 + guess) + 273.15, P=0.101325).cp * 1e3
    return 40.0 * math.exp(-100.0 / (r * 0.05 * cp))


def _freeze_half():
    # Incropera 6th ed. Eq. 5.6 (lumped): t = C'R' ln((T_i − T_a)/(0 − T_a)) + m' f L R'/(0 − T_a)
    from iapws import IAPWS95

    inner, outer = 0.0334 - 2 * 0.00338, 0.0334
    water = IAPWS95(T=5.0 + 273.15, P=0.101325)
    rho0 = IAPWS95(T=0.01 + 273.15, P=0.101325).rho
    c_total = water.rho * water.cp * 1e3 * math.pi * inner**2 / 4 + 7854.0 * 434.0 * math.pi * (outer**2 - inner**2) / 4
    r = _resistance(outer, 0.00338, 50.0, 0.025, 0.04, None, 10.0)
    return c_total * r * math.log(20.0 / 10.0) + rho0 * math.pi * inner**2 / 4 * 0.5 * 333.55e3 * r / 10.0


def _coolprop(key, temp_c, name):
    def live():
        from CoolProp.CoolProp import PropsSI

        return PropsSI(key, "T", temp_c + 273.15, "P", 101325.0, name)

    return live


def _ht(function, *args):
    def live():
        from ht import conv_external, conv_free_immersed

        module = conv_free_immersed if function.endswith("Churchill_Chu") else conv_external
        return getattr(module, function)(*args)

    return live


def _nearest_pipe(index):
    def live():
        from fluids.piping import nearest_pipe

        return nearest_pipe(NPS=6, schedule="40")[index]

    return live


LIVE = {
    "fluids-nps6-sch40-od": ("fluids", _nearest_pipe(2)),
    "fluids-nps6-sch40-wall": ("fluids", _nearest_pipe(3)),
    "iapws95-water-density-20c": ("iapws", _iapws95(293.15, "rho")),
    "iapws95-water-cp-80c": ("iapws", _iapws95(353.15, "cp")),
    "iapws97-saturation-1bar": ("iapws", _iapws97_saturation),
    "iapws97-latent-heat-10bar": ("iapws", _iapws97_latent),
    "iapws06-latent-heat-fusion": ("iapws", _iapws06_fusion),
    "psychrolib-dew-point-20c-50": ("psychrolib", _dew_point(20.0, 50.0)),
    "psychrolib-dew-point-30c-80": ("psychrolib", _dew_point(30.0, 80.0)),
    "ht-churchill-chu-ra1e7": ("ht", _ht("Nu_horizontal_cylinder_Churchill_Chu", 0.7, 1e7 / 0.7)),
    "ht-churchill-bernstein-re1e4": ("ht", _ht("Nu_cylinder_Churchill_Bernstein", 1e4, 0.7)),
    "ht-coolprop-outer-film-60c": ("ht", _ht_outer_film(60.0, 20.0, 0.3)),
    "incropera-8.46-run-outlet": ("iapws", _run_outlet),
    "incropera-5.6-freeze-half": ("iapws", _freeze_half),
    "coolprop-propylene-glycol-30-density": ("CoolProp", _coolprop("D", -5.0, "INCOMP::MPG[0.3]")),
    "coolprop-propylene-glycol-30-viscosity": ("CoolProp", _coolprop("V", -5.0, "INCOMP::MPG[0.3]")),
}
LIBRARY_CHECKS = [check for check in CHECKS if check.kind == "reference library"]


def test_every_library_check_has_a_live_recomputation():
    assert sorted(LIVE) == sorted(check.id for check in LIBRARY_CHECKS)
    assert {check.kind for check in CHECKS} == {"worked example", "reference library"}


@pytest.mark.parametrize("check", LIBRARY_CHECKS, ids=[c.id for c in LIBRARY_CHECKS])
def test_shipped_reference_value_equals_live_library(check):
    import importlib.metadata

    library, live = LIVE[check.id]
    pytest.importorskip(library)
    # the shipped value names the installed version; recomputed, it agrees to its 12 printed digits
    version = importlib.metadata.version(library)
    assert f"{library} {version}" in check.source
    assert check.expected == pytest.approx(float(live()), rel=1e-11)


# ---------------------------------------------------------------- the command
def test_verify_command_text(run):
    code, out, _err = run("verify")
    assert code == 0, out
    for check in CHECKS:
        assert check.id in out and check.source in out
    assert f"all {len(CHECKS)} checks pass" in out
    assert "local codes" in out


def test_verify_command_json_contract(run):
    code, out, _err = run("verify", "--format", "json")
    assert code == 0
    data = json.loads(out)
    assert isinstance(data, list)  # the contract: a list of checks
    assert len(data) == len(CHECKS)
    for item, outcome in zip(data, run_checks()):
        assert {"source", "expected", "actual", "tolerance", "passed"} <= set(item)
        assert item["passed"] is True
        assert item["expected"] == outcome.check.expected
        assert item["actual"] == pytest.approx(outcome.actual, rel=1e-12)


def test_verify_command_reports_a_failing_check(run, monkeypatch):
    import pipeins.verification as verification

    wrong = dataclasses.replace(CHECKS[0], expected=CHECKS[0].expected * 1.5)
    monkeypatch.setattr(verification, "CHECKS", (wrong,) + CHECKS[1:])
    code, out, _err = run("verify", "--format", "json")
    assert code == 1
    data = json.loads(out)
    assert [item["passed"] for item in data] == [False] + [True] * (len(CHECKS) - 1)
    code, text, _err = run("verify", "--match", CHECKS[0].id)
    assert code == 1
    assert "FAIL" in text and f"1 of 1 checks fail: {CHECKS[0].id}" in text


def test_verify_match_filters_and_refuses_nothing(run):
    code, out, _err = run("verify", "--match", "iapws", "--format", "json")
    items = json.loads(out)
    assert code == 0 and items and all("iapws" in item["id"] + item["source"] for item in items)
    assert len(items) == sum("iapws" in c.id + c.source for c in CHECKS) < len(CHECKS)
    code, out, err = run("verify", "--match", "no such check")
    assert (code, out) == (2, "")
    assert err.strip() == 'Error: --match: no check id or source contains "no such check"'
