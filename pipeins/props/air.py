"""Dry-air properties for the outer film, tabulated once from CoolProp and interpolated.

CoolProp's pseudo-pure ``Air`` (Lemmon et al. 2000 equation of state; Lemmon and
Jacobsen 2004 viscosity and conductivity) is evaluated once per process on a 1 K grid
from -100 °C to 1000 °C at the reference pressure 101 325 Pa.  At another pressure the
air is treated as an ideal gas: density scales with pressure, while viscosity,
conductivity, heat capacity and Prandtl number are taken as pressure-independent
(true to better than 0.5 % between 50 and 120 kPa).  The grid is fine enough that linear
interpolation errs by less than 1e-5 relative.
"""

from __future__ import annotations

import functools
from dataclasses import dataclass

import numpy as np

__all__ = ["AirProperties", "air_properties", "REFERENCE_PRESSURE_PA", "TEMP_RANGE_C"]

REFERENCE_PRESSURE_PA = 101_325.0
TEMP_RANGE_C = (-100.0, 1000.0)


@dataclass(frozen=True)
class AirProperties:
    """Air properties at the film temperature; every field an array of the input's shape."""

    density_kg_m3: np.ndarray
    viscosity_pa_s: np.ndarray
    conductivity_w_mk: np.ndarray
    heat_capacity_j_kgk: np.ndarray
    prandtl: np.ndarray

    @property
    def kinematic_viscosity_m2_s(self) -> np.ndarray:
        return self.viscosity_pa_s / self.density_kg_m3

    @property
    def diffusivity_m2_s(self) -> np.ndarray:
        return self.conductivity_w_mk / (self.density_kg_m3 * self.heat_capacity_j_kgk)


@functools.cache
def _table() -> dict[str, np.ndarray]:
    from CoolProp.CoolProp import PropsSI  # heavy import: only when air is first needed

    temp_c = np.arange(TEMP_RANGE_C[0], TEMP_RANGE_C[1] + 0.5, 1.0)
    t_k = temp_c + 273.15
    p = np.full_like(t_k, REFERENCE_PRESSURE_PA)
    out = {"temp_c": temp_c}
    for key, name in (("D", "rho"), ("V", "mu"), ("L", "k"), ("CPMASS", "cp")):
        out[name] = np.asarray(PropsSI(key, "T", t_k, "P", p, "Air"), dtype=float)
    out["pr"] = out["mu"] * out["cp"] / out["k"]
    return out


def air_properties(temp_c, pressure_pa=REFERENCE_PRESSURE_PA) -> AirProperties:
    """Air properties at *temp_c* [°C] and *pressure_pa* [Pa], broadcast together.

    Temperatures outside -100 to 1000 °C are clamped to the table's ends (the solver
    never asks for them: film temperatures lie between the fluid and the air).

    >>> props = air_properties(20.0)
    >>> round(float(props.conductivity_w_mk), 4), round(float(props.prandtl), 3)
    (0.0257, 0.713)
    """
    tab = _table()
    temp_c, pressure_pa = np.broadcast_arrays(np.asarray(temp_c, float), np.asarray(pressure_pa, float))
    t = np.clip(temp_c, *TEMP_RANGE_C)

    def at(name):
        return np.interp(t, tab["temp_c"], tab[name])

    return AirProperties(
        density_kg_m3=at("rho") * (pressure_pa / REFERENCE_PRESSURE_PA),
        viscosity_pa_s=at("mu"),
        conductivity_w_mk=at("k"),
        heat_capacity_j_kgk=at("cp"),
        prandtl=at("pr"),
    )
