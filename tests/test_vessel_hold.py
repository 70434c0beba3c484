"""Cool-down and freeze hold of a vessel's contents (pipeins.vessel_hold): the marched and
integrated cool-down against the lumped closed form (Incropera, DeWitt et al., 6th ed.,
Eq. 5.6, from memory), a UA varying with temperature against its own closed form, the
freeze hold against a hand calculation, and the bad input."""

import math

import numpy as np
import pytest

from pipeins.errors import InputError
from pipeins.props.liquids import LATENT_HEAT_FUSION_J_KG
from pipeins.vessel_hold import (contents_heat_capacity_j_k, contents_mass_kg, freeze_hold_s,
                                 march_temperature_c, temperature_after_c, time_to_temperature_s,
                                 ua_table_from_heat_flow)

C, UA, T0, TA = 5.2e7, 85.0, 70.0, 5.0  # a 12.5 m³ water tank of an invented site


def test_marched_cool_down_matches_the_closed_form():
    times = np.linspace(0.0, 10 * 86400.0, 11)
    marched = march_temperature_c(times, C, UA, T0, TA, steps_per_interval=10)
    closed = TA + (T0 - TA) * np.exp(-UA * times / C)
    np.testing.assert_allclose(marched, closed, rtol=1e-6)           # brief: within 0.5 %
    np.testing.assert_allclose(temperature_after_c(times, C, UA, T0, TA), closed, rtol=1e-14)


def test_time_to_temperature_matches_the_closed_form_and_the_march():
    t = time_to_temperature_s(C, UA, T0, 30.0, TA)
    assert t == pytest.approx(C / UA * math.log((T0 - TA) / (30.0 - TA)), rel=1e-12)
    assert march_temperature_c([0.0, float(t)], C, UA, T0, TA, 200)[-1] == pytest.approx(30.0, abs=1e-6)
    # warm-up of a chilled tank towards a warm ambient, same law
    warm = time_to_temperature_s(C, UA, 4.0, 10.0, 30.0)
    assert warm == pytest.approx(C / UA * math.log(26.0 / 20.0), rel=1e-12)


def test_ua_varying_with_temperature():
    # UA = a + b(T − Ta): t = (C/a)·[s − ln(a + b·e^s)] between s = ln(T − Ta) limits (closed form)
    a, b = 60.0, 0.8

    def exact(t_end):
        f = lambda s: s - math.log(a + b * math.exp(s))  # noqa: E731
        return C / a * (f(math.log(T0 - TA)) - f(math.log(t_end - TA)))

    ua = lambda temp: a + b * (np.asarray(temp) - TA)  # noqa: E731
    assert time_to_temperature_s(C, ua, T0, 20.0, TA) == pytest.approx(exact(20.0), rel=1e-10)
    # as a table of solved values (linear in T, so interpolation is exact)
    temps = np.linspace(10.0, 80.0, 8)
    table = ua_table_from_heat_flow(temps, ua(temps) * (temps - TA), TA)
    assert time_to_temperature_s(C, table, T0, 20.0, TA) == pytest.approx(exact(20.0), rel=1e-10)
    t20 = exact(20.0)
    assert march_temperature_c([0.0, t20], C, table, T0, TA, 100)[-1] == pytest.approx(20.0, abs=1e-6)


def test_contents_mass_and_capacity_from_the_water_table():
    # water at 20 °C: 998.2 kg/m³; c_p ≈ 4.18 kJ/(kg·K) (IAPWS-95, any steam table, from memory)
    assert float(contents_mass_kg(12.5, "water", 20.0)) == pytest.approx(12.5 * 998.2, rel=2e-4)
    assert float(contents_heat_capacity_j_k(1000.0, "water", 10.0, 60.0)) == pytest.approx(4.183e6, rel=2e-3)


def test_freeze_hold_against_a_hand_calculation():
    # Hand calculation: 8 t of water at 12 °C, UA 30 W/K, air −15 °C, a quarter frozen.
    # Sensible: C = m·c̄_p (c̄_p over 0–12 °C ≈ 4.197 kJ/(kg·K), IAPWS-95 from memory),
    # t0 = C/UA·ln(27/15); latent: m·0.25·L_f / (UA·15 K).
    m, ua, start, air, f = 8000.0, 30.0, 12.0, -15.0, 0.25
    t0 = m * 4197.0 / ua * math.log(27.0 / 15.0)
    tf = m * f * LATENT_HEAT_FUSION_J_KG / (ua * 15.0)
    assert float(freeze_hold_s(m, ua, start, air, f)) == pytest.approx(t0 + tf, rel=2e-3)
    # the wall's capacity lengthens the sensible part only
    extra = float(freeze_hold_s(m, ua, start, air, f, wall_capacity_j_k=2e6)) - float(freeze_hold_s(m, ua, start, air, f))
    assert extra == pytest.approx(2e6 / ua * math.log(27.0 / 15.0), rel=1e-9)
    assert freeze_hold_s(m, ua, start, 2.0) == math.inf   # air above 0 °C: never freezes


@pytest.mark.parametrize("target", [5.0, 0.0, -3.0, 80.0])
def test_a_target_never_reached_is_refused(target):
    with pytest.raises(InputError) as err:
        time_to_temperature_s(C, UA, T0, target, TA)
    assert str(err.value).startswith(f"--target-temp: the contents never reach {target:g} °C: they cool from "
                                     "70 °C towards the ambient 5 °C")


@pytest.mark.parametrize("call, message", [
    (lambda: time_to_temperature_s(C, -1.0, T0, 30.0, TA), "ua_w_k: UA must be greater than 0 W/K"),
    (lambda: time_to_temperature_s(0.0, UA, T0, 30.0, TA), "capacity_j_k: the heat capacity"),
    (lambda: time_to_temperature_s(C, ([1.0], [2.0]), T0, 30.0, TA), "ua_w_k: a UA table needs two or more"),
    (lambda: time_to_temperature_s(C, UA, TA, 30.0, TA), "--fluid-temp: the contents start at the ambient"),
    (lambda: freeze_hold_s(1000.0, UA, 10.0, -5.0, 1.5), "--ice-fraction: the ice fraction must be from 0"),
    (lambda: freeze_hold_s(1000.0, UA, -1.0, -5.0), "--fluid-temp: the water must start above 0 °C"),
    (lambda: freeze_hold_s(1000.0, UA, 10.0, -5.0, fluid="30% propylene glycol"), "--fluid: the freezing model"),
    (lambda: contents_mass_kg(0.0), "volume_m3: the contents volume must be greater than 0"),
    (lambda: march_temperature_c([5.0, 1.0], C, UA, T0, TA), "times_s: the times must be finite"),
])
def test_bad_hold_input(call, message):
    with pytest.raises(InputError) as err:
        call()
    assert str(err.value).startswith(message)
