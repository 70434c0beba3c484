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


def test_cool_down_of_a_solved_vessel_with_real_films():
    # An invented site's horizontal 2.4 m × 6 m hot-water vessel with flat heads: heat flows solved
    # for a grid of contents temperatures in ONE solver call (natural convection and radiation),
    # their UA table, and the hours to cool; the quadrature and the march agree.
    from dataclasses import dataclass

    from pipeins.catalog.materials import lookup_material
    from pipeins.geometry.vessel import vessel_patches, vessel_volume_m3
    from pipeins.model import Fluid, Layer, Surface, Surroundings
    from pipeins.solve import solve

    @dataclass(frozen=True)
    class Vessel:
        wall_m: float = 0.01
        wall_conductivity_w_mk: float = 50.0
        kind: str = "vessel"
        basis: str = "W"

        def patches(self, surroundings):
            return [p.to_patch() for p in vessel_patches(2.4, 6.0, "horizontal", "flat", wall_m=self.wall_m)]

    temps = np.linspace(20.0, 90.0, 15)
    r = solve(Vessel(), [Layer(lookup_material("mineral wool"), 0.08)], Fluid(temps), Surroundings(10.0),
              Surface(0.3))
    table = ua_table_from_heat_flow(temps, r.heat_flow, 10.0)
    assert np.all(table[1] > 0)
    capacity = contents_heat_capacity_j_k(contents_mass_kg(vessel_volume_m3(2.38, 6.0, "flat"), "water", 85.0),
                                          "water", 40.0, 85.0)
    t = float(time_to_temperature_s(capacity, table, 85.0, 40.0, 10.0, points=48))
    assert 24 * 3600 < t < 60 * 86400  # days, not minutes or years, for a well insulated vessel
    assert march_temperature_c([0.0, t], capacity, table, 85.0, 10.0, 400)[-1] == pytest.approx(40.0, abs=2e-3)


def test_scalar_and_array_inputs_agree():
    starts = np.array([60.0, 70.0, 80.0])
    t_arr = time_to_temperature_s(C, UA, starts, 30.0, TA)
    for s, t in zip(starts, t_arr):
        assert float(time_to_temperature_s(C, UA, s, 30.0, TA)) == pytest.approx(t, rel=1e-14)
    assert freeze_hold_s([1000.0, 2000.0], UA, 10.0, -5.0).shape == (2,)
