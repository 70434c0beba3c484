"""Dry-air properties for the outer film, read from a shipped table and interpolated.

The table ``tables/air_properties.csv`` holds CoolProp's pseudo-pure ``Air`` (Lemmon et
al. 2000 equation of state; Lemmon and Jacobsen 2004 viscosity and conductivity) on a
2 K grid from -100 °C to 1000 °C at the reference pressure 101 325 Pa; it is written by
``python -m pipeins.props.generate`` so that CoolProp (seconds to import) is not needed
at run time.  At another pressure the air is treated as an ideal gas: density scales
with pressure, while viscosity, conductivity, heat capacity and Prandtl number are taken
as pressure-independent (true to better than 0.5 % between 50 and 120 kPa).  Linear
interpolation on the 2 K grid errs by less than 5e-5 relative.
"""

from __future__ import annotations

import functools

import numpy as np

from . import TransportProperties

__all__ = ["AirProperties", "air_properties", "REFERENCE_PRESSURE_PA", "TEMP_RANGE_C"]

REFERENCE_PRESSURE_PA = 101_325.0
TEMP_RANGE_C = (-100.0, 1000.0)


class AirProperties(TransportProperties):
    """Air properties at the film temperature; every field an array of the input's shape."""


@functools.cache
def _table() -> dict[str, np.ndarray]:
    from pipeins.props._shipped import numeric_columns

    cols = numeric_columns("air_properties")
    return {
        "temp_c": cols["temp_c"],
        "rho": cols["density_kg_m3"] * (REFERENCE_PRESSURE_PA / cols["pressure_pa"]),
        "mu": cols["viscosity_pa_s"],
        "k": cols["conductivity_w_mk"],
        "cp": cols["heat_capacity_j_kgk"],
        "pr": cols["viscosity_pa_s"] * cols["heat_capacity_j_kgk"] / cols["conductivity_w_mk"],
    }


def air_properties(temp_c, pressure_pa=REFERENCE_PRESSURE_PA) -> AirProperties:
    """Air properties at *temp_c* [°C] and *pressure_pa* [Pa], broadcast together.

    Temperatures outside -100 to 1000 °C are clamped to the table's ends (the solver
    never asks for them: film temperatures lie between the fluid and the air).

    >>> props = air_properties(20.0)
    >>> round(float(props.conductivity_w_mk), 4), round(float(props.prandtl), 3)
    (0.0259, 0.708)
    """
    temp_c, pressure_pa = np.broadcast_arrays(np.asarray(temp_c, float), np.asarray(pressure_pa, float))
    at = _grid()(np.clip(temp_c, *TEMP_RANGE_C))  # the table is on an even 2 K grid
    return AirProperties(
        density_kg_m3=np.asarray(at["rho"] * (pressure_pa / REFERENCE_PRESSURE_PA)),
        viscosity_pa_s=at["mu"],
        conductivity_w_mk=at["k"],
        heat_capacity_j_kgk=at["cp"],
        prandtl=at["pr"],
    )


@functools.cache
def _grid():
    from pipeins.props._shipped import UniformGrid

    tab = _table()
    return UniformGrid(tab["temp_c"], {k: v for k, v in tab.items() if k != "temp_c"})
