"""Properties of the fluid inside the pipe: water, glycol mixtures, any CoolProp fluid.

Shipped (no CoolProp import, fast):

* ``water`` – saturated liquid water, 0 to 200 °C, from ``tables/water_properties.csv``
  (CoolProp ``Water``: IAPWS-95; IAPWS 2008 viscosity; IAPWS 2011 conductivity).
  Liquid water is treated as incompressible: going from saturation to 100 bar changes
  density, viscosity, conductivity and heat capacity by less than 1.5 %, so
  *pressure_pa* is not used for water.
* ``air`` – dry air (ducts), from :mod:`pipeins.props.air`, density scaled with pressure.

Through CoolProp (imported inside the function; the first call costs about 2 s, then
the fluid is tabulated once per process on a 0.5 K grid and interpolated):

* ``N% ethylene glycol`` / ``N% propylene glycol`` – CoolProp's incompressible
  ``INCOMP::MEG[x]`` / ``INCOMP::MPG[x]`` (x = N/100, mass fraction, 0 < N <= 60), from
  freezing point (CoolProp's ``T_freeze``) to CoolProp's upper limit (100 °C).
  Pressure-independent.
* any other CoolProp fluid name (``R134a``, ``INCOMP::TVP1`` …) – an ``INCOMP::`` fluid
  from its lower to its upper limit; a pure fluid as saturated liquid from its triple
  point to 98 % of its critical temperature [K], or, when *pressure_pa* is given, as
  compressed liquid at that pressure up to 0.5 K below its boiling point.

Viscosity is interpolated in ln μ, everything else linearly; the interpolation errs by
less than 1e-4 relative.  The Prandtl number is μ c_p / k of the interpolated values.
"""

from __future__ import annotations

import functools
import re

import numpy as np

from . import TransportProperties

from pipeins.errors import InputError

__all__ = [
    "FluidProperties",
    "LATENT_HEAT_FUSION_J_KG",
    "normalise_fluid",
    "freezing_point_c",
    "fluid_temp_range_c",
    "check_fluid_temp",
    "fluid_properties",
]

#: Latent heat of fusion of ice Ih at 0 °C and 101 325 Pa [J/kg].  333.55 kJ/kg is the
#: CRC Handbook of Chemistry and Physics value (from memory: 6.01 kJ/mol / 18.015 g/mol);
#: IAPWS R10-06(2009) ice Ih with IAPWS-95 liquid gives 333.43 kJ/kg at the normal
#: melting point (273.1525 K), 0.04 % lower (checked in tests/test_props.py).
LATENT_HEAT_FUSION_J_KG = 333.55e3

_CELSIUS_TO_KELVIN = 273.15
_GRID_STEP_K = 0.5
# CoolProp's MEG and MPG fits (Melinder 2010, from memory) cover 0-60 % by mass.
_GLYCOL_MAX_PERCENT = 60.0
_GLYCOLS = {"ethylene": "MEG", "propylene": "MPG"}
_UNKNOWN = 'unknown fluid "{}"; use water, N% ethylene glycol, N% propylene glycol or a CoolProp fluid name'

_NUMBER = r"(?P<pct>\d+(?:\.\d*)?|\.\d+)"
_KIND = (
    r"(?P<kind>(?:mono)?ethylene\s*glycol|(?:mono)?propylene\s*glycol|meg|mpg|eg|pg)"
)
_GLYCOL_PATTERNS = (
    re.compile(rf"^{_NUMBER}\s*%?\s*(?:by\s+mass\s+)?{_KIND}$"),
    re.compile(rf"^{_KIND}\s*[-_ ]?\s*{_NUMBER}\s*%?$"),
)
_INCOMP_FRACTION = re.compile(r"^incomp::(?P<code>meg|mpg)\[(?P<frac>\d*\.?\d+)\]$")
_WATER_NAMES = {"water", "h2o", "heos::water", "water (liquid)", "liquid water"}
_AIR_NAMES = {"air", "dry air", "heos::air"}


class FluidProperties(TransportProperties):
    """Fluid properties at the bulk temperature; every field an array of the input's shape."""


def _glycol_name(percent: float, kind: str, original: str) -> str:
    if not 0.0 < percent <= _GLYCOL_MAX_PERCENT:
        raise InputError(
            "--fluid",
            f'"{original}": glycol content {percent:g} % is outside 0 to '
            f"{_GLYCOL_MAX_PERCENT:g} % by mass",
        )
    return f"{percent:g}% {kind} glycol"


@functools.cache
def normalise_fluid(name: str) -> str:
    """The canonical fluid name for *name*, or ``InputError('--fluid', …)``.

    Canonical names: ``"water"``, ``"air"``, ``"30% ethylene glycol"``,
    ``"40% propylene glycol"`` (percent by mass), or a CoolProp fluid name as CoolProp
    spells it.  Accepted glycol spellings include "30% ethylene glycol",
    "ethylene glycol 30%", "MEG30", "EG 30 %", "PG 40%", "INCOMP::MEG[0.3]" and
    "INCOMP::MEG-30%".  Only a name that is none of these imports CoolProp, to check it.

    Examples
    --------
    >>> normalise_fluid("MEG30"), normalise_fluid("PG 40%"), normalise_fluid("Water")
    ('30% ethylene glycol', '40% propylene glycol', 'water')
    >>> normalise_fluid("INCOMP::MEG[0.3]")
    '30% ethylene glycol'
    """
    text = " ".join(str(name).split())
    low = text.lower()
    if low in _WATER_NAMES:
        return "water"
    if low in _AIR_NAMES:
        return "air"
    bare = low.removeprefix("incomp::")
    for pattern in _GLYCOL_PATTERNS:
        match = pattern.match(bare)
        if match:
            kind = "propylene" if "p" in match["kind"].removeprefix("mono")[:2] else "ethylene"
            return _glycol_name(float(match["pct"]), kind, text)
    match = _INCOMP_FRACTION.match(low)
    if match:
        kind = "ethylene" if match["code"] == "meg" else "propylene"
        return _glycol_name(100.0 * float(match["frac"]), kind, text)
    if not text:
        raise InputError("--fluid", _UNKNOWN.format(text))
    return _coolprop_canonical(text)


def _coolprop_canonical(text: str) -> str:
    from CoolProp.CoolProp import PropsSI, get_fluid_param_string

    try:
        PropsSI("Tmax", text)
    except ValueError:
        raise InputError("--fluid", _UNKNOWN.format(text)) from None
    if text.upper().startswith("INCOMP::"):
        return text
    try:
        canonical = get_fluid_param_string(text, "name")
    except ValueError:
        return text
    return "water" if canonical == "Water" else "air" if canonical == "Air" else canonical


def _coolprop_name(fluid: str) -> str:
    match = re.fullmatch(r"(?P<pct>[\d.]+)% (?P<kind>ethylene|propylene) glycol", fluid)
    if match:
        return f"INCOMP::{_GLYCOLS[match['kind']]}[{float(match['pct']) / 100.0:g}]"
    return fluid


@functools.cache
def _coolprop_table(fluid: str, pressure_pa: float | None) -> dict:
    """Tabulate a CoolProp fluid once over its liquid range on a 0.5 K grid."""
    from CoolProp.CoolProp import PropsSI

    name = _coolprop_name(fluid)
    incompressible = name.upper().startswith("INCOMP::")
    if incompressible:
        top_k = PropsSI("Tmax", name)
        try:
            low_k = PropsSI("T_freeze", name)
            freezes = True
        except ValueError:
            low_k, freezes = PropsSI("Tmin", name), False
        pressure = 101_325.0 if pressure_pa is None else pressure_pa
    else:
        low_k, freezes = PropsSI("Ttriple", name), True
        if pressure_pa is None:
            top_k = 0.98 * PropsSI("Tcrit", name)
        elif pressure_pa < PropsSI("pcrit", name):
            top_k = PropsSI("T", "P", pressure_pa, "Q", 0, name) - 0.5
        else:
            top_k = PropsSI("Tmax", name)
        pressure = pressure_pa
    temp_k = np.arange(low_k, top_k, _GRID_STEP_K)
    temp_k = np.append(temp_k[temp_k < top_k - 1e-6], top_k)
    if pressure is None:
        state = ("Q", np.zeros_like(temp_k))
    else:
        state = ("P", np.full_like(temp_k, pressure))
    cols = {
        key: np.asarray(PropsSI(key, "T", temp_k, *state, name), float)
        for key in ("D", "V", "L", "CPMASS")
    }
    return {
        "temp_c": temp_k - _CELSIUS_TO_KELVIN,
        "density_kg_m3": cols["D"],
        "ln_viscosity": np.log(cols["V"]),
        "conductivity_w_mk": cols["L"],
        "heat_capacity_j_kgk": cols["CPMASS"],
        "freezes": freezes,
    }


@functools.cache
def _water_table() -> dict:
    from pipeins.props._shipped import numeric_columns

    cols = numeric_columns("water_properties")
    return {
        "temp_c": cols["temp_c"],
        "density_kg_m3": cols["density_kg_m3"],
        "ln_viscosity": np.log(cols["viscosity_pa_s"]),
        "conductivity_w_mk": cols["conductivity_w_mk"],
        "heat_capacity_j_kgk": cols["heat_capacity_j_kgk"],
        "freezes": True,
    }


def _table(fluid: str, pressure_pa=None) -> dict:
    if fluid == "water":
        return _water_table()
    if fluid == "air":
        from pipeins.props.air import TEMP_RANGE_C

        return {"temp_c": np.array(TEMP_RANGE_C), "freezes": False}
    return _coolprop_table(fluid, None if pressure_pa is None else float(pressure_pa))


def freezing_point_c(fluid: str) -> float:
    """Freezing point [°C] of *fluid* at atmospheric pressure.

    Water: 0 °C.  Glycol mixtures and other ``INCOMP::`` fluids: CoolProp's ``T_freeze``
    of the incompressible fit.  Pure CoolProp fluids: the triple-point temperature.
    Air and fluids without freezing data: ``-inf`` (they do not freeze in range).

    Examples
    --------
    >>> freezing_point_c("water")
    0.0
    """
    fluid = normalise_fluid(fluid)
    if fluid == "water":
        return 0.0
    table = _table(fluid)
    return float(table["temp_c"][0]) if table["freezes"] else float("-inf")


def fluid_temp_range_c(fluid: str, pressure_pa=None) -> tuple[float, float]:
    """(lowest, highest) temperature [°C] the property table of *fluid* covers.

    The lowest is the freezing point where the fluid freezes in range.

    Examples
    --------
    >>> fluid_temp_range_c("water")
    (0.0, 200.0)
    """
    temps = _table(normalise_fluid(fluid), pressure_pa)["temp_c"]
    return float(temps[0]), float(temps[-1])


def check_fluid_temp(fluid: str, temp_c, pressure_pa=None) -> np.ndarray:
    """*temp_c* as a float array, or ``InputError('--fluid-temp', …)`` outside the table.

    Examples
    --------
    >>> check_fluid_temp("water", -2.0)
    Traceback (most recent call last):
    ...
    pipeins.errors.InputError: --fluid-temp: -2 °C is below the freezing point of water (0.0 °C)
    """
    fluid = normalise_fluid(fluid)
    t = np.asarray(temp_c, dtype=float)
    table = _table(fluid, pressure_pa)
    low, high = float(table["temp_c"][0]), float(table["temp_c"][-1])
    if not np.all(np.isfinite(t)):
        raise InputError("--fluid-temp", "must be a finite number of °C")
    if np.any(t < low - 1e-9):
        where = "the freezing point of" if table["freezes"] else "the bottom of the property table for"
        raise InputError(
            "--fluid-temp", f"{float(t.min()):g} °C is below {where} {fluid} ({low:.1f} °C)"
        )
    if np.any(t > high + 1e-9):
        raise InputError(
            "--fluid-temp",
            f"{float(t.max()):g} °C is above the top of the property table for {fluid} "
            f"({high:.1f} °C)",
        )
    return t


def fluid_properties(fluid: str, temp_c, pressure_pa=None) -> FluidProperties:
    """Density, viscosity, conductivity, heat capacity and Prandtl number of *fluid*.

    Interpolates the fluid's table (see the module docstring) at *temp_c* [°C];
    temperatures below the freezing point or above the table raise
    ``InputError('--fluid-temp', …)``.

    Parameters
    ----------
    fluid : str
        Any name :func:`normalise_fluid` accepts.
    temp_c : float or array_like
        Bulk fluid temperature [°C].
    pressure_pa : float, optional
        Absolute pressure [Pa]: used for air (density) and pure CoolProp fluids
        (compressed liquid); ignored for water and incompressible mixtures.

    Returns
    -------
    FluidProperties
        Arrays of the shape of *temp_c*.

    References
    ----------
    IAPWS-95 (Wagner and Pruss 2002), IAPWS 2008 viscosity (Huber et al. 2009), IAPWS
    2011 conductivity (Huber et al. 2012) for water; CoolProp incompressible fits
    (Bell et al. 2014, Ind. Eng. Chem. Res. 53, 2498) for mixtures.

    Examples
    --------
    >>> props = fluid_properties("water", [0.0, 80.0])
    >>> props.density_kg_m3.round(2), props.heat_capacity_j_kgk.round(0)
    (array([999.79, 971.77]), array([4220., 4197.]))
    """
    fluid = normalise_fluid(fluid)
    if fluid == "air":
        from pipeins.props.air import REFERENCE_PRESSURE_PA, air_properties

        t = check_fluid_temp(fluid, temp_c)
        air = air_properties(t, REFERENCE_PRESSURE_PA if pressure_pa is None else pressure_pa)
        return FluidProperties(
            air.density_kg_m3, air.viscosity_pa_s, air.conductivity_w_mk,
            air.heat_capacity_j_kgk, air.prandtl,
        )
    if fluid == "water" or _coolprop_name(fluid).upper().startswith("INCOMP::"):
        pressure_pa = None
    t = check_fluid_temp(fluid, temp_c, pressure_pa)
    table = _table(fluid, pressure_pa)

    def at(column):
        return np.asarray(np.interp(t, table["temp_c"], table[column]))

    viscosity = np.asarray(np.exp(at("ln_viscosity")))
    conductivity = at("conductivity_w_mk")
    heat_capacity = at("heat_capacity_j_kgk")
    return FluidProperties(
        density_kg_m3=at("density_kg_m3"),
        viscosity_pa_s=viscosity,
        conductivity_w_mk=conductivity,
        heat_capacity_j_kgk=heat_capacity,
        prandtl=np.asarray(viscosity * heat_capacity / conductivity),
    )
