"""Properties of the fluid inside the pipe: water, glycols, brines, oils, any CoolProp fluid.

Shipped (no CoolProp import, fast):

* ``water`` – saturated liquid water, 0 to 200 °C, from ``tables/water_properties.csv``
  (CoolProp ``Water``: IAPWS-95; IAPWS 2008 viscosity; IAPWS 2011 conductivity).
  Liquid water is treated as incompressible: going from saturation to 100 bar changes
  density, viscosity, conductivity and heat capacity by less than 1.5 %, so
  *pressure_pa* is not used for water.
* ``air`` – dry air (ducts), from :mod:`pipeins.props.air`, density scaled with pressure.
* ``N% ethylene glycol`` / ``N% propylene glycol`` at N = 10, 20, 25, 30, 35, 40, 50,
  60; ``N% calcium chloride`` (10–30, every 5), ``N% sodium chloride`` (5, 10, 15, 20,
  23), ``N% potassium formate`` (10, 20, 30, 40, 48), ``N% potassium acetate`` (10, 20,
  30, 40, 45), percent by mass in water; the oils ``INCOMP::PNF`` and ``INCOMP::TVP1``.
  CoolProp's incompressible fits tabulated in ``tables/fluid_*.csv`` (the set and why:
  :mod:`pipeins.props.fluid_tables`), from the freezing point (CoolProp's ``T_freeze``;
  an oil: CoolProp's lower limit) to CoolProp's upper limit.  Pressure-independent.

Through CoolProp (imported inside the function; the first call costs about 2 s, then
the fluid is tabulated once per process on the same kind of grid and interpolated):

* the same solutions at another content (``33% propylene glycol``; 0 < N ≤ the fit's
  limit: 60 % for the glycols, 30 % calcium chloride, 23 % sodium chloride, 48 %
  potassium formate, 45 % potassium acetate) – CoolProp's ``INCOMP::MPG[0.33]`` …;
* any other CoolProp fluid name (``R134a``, ``INCOMP::T66`` …) – an ``INCOMP::`` fluid
  from its lower to its upper limit; a pure fluid as saturated liquid from its triple
  point to 98 % of its critical temperature [K], or, when *pressure_pa* is given, as
  compressed liquid at that pressure up to 0.5 K below its boiling point.

Viscosity is interpolated in ln μ, everything else linearly, on grids of at most 0.5 K;
between grid points the shipped tables err by at most 6e-5 relative (viscosity of 45 %
potassium acetate near its freezing point; density, conductivity and heat capacity
below 2e-6), as measured against CoolProp by ``tests/test_props_fluids.py``.  The
Prandtl number is μ c_p / k of the interpolated values.
"""

from __future__ import annotations

import functools
import re

import numpy as np

from pipeins.errors import InputError

from . import TransportProperties
from .fluid_tables import GRID_STEP_K, OILS, SOLUTIONS, SolutionFamily, grid_k, shipped_table

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
_UNKNOWN = (
    'unknown fluid "{}"; use water, N% ethylene or propylene glycol, N% calcium or sodium '
    "chloride, N% potassium formate or acetate, or a CoolProp fluid name"
)

_NUMBER = r"(?P<pct>\d+(?:\.\d*)?|\.\d+)"
_FAMILY_BY_ALIAS = tuple(
    (re.compile(rf"^(?:{alias})$"), family)
    for family in SOLUTIONS.values()
    for alias in family.aliases
)
_KIND = "(?P<kind>" + "|".join(
    f"(?:{alias})" for family in SOLUTIONS.values() for alias in family.aliases
) + ")"
_SOLUTION_PATTERNS = (
    re.compile(rf"^{_NUMBER}\s*%?\s*(?:by\s+mass\s+)?{_KIND}$"),
    re.compile(rf"^{_KIND}\s*[-_ ]?\s*{_NUMBER}\s*%?$"),
)
_INCOMP_FRACTION = re.compile(r"^incomp::(?P<code>[a-z0-9]+)\[(?P<frac>\d*\.?\d+)\]$")
_FAMILY_BY_CODE = {family.code.lower(): family for family in SOLUTIONS.values()}
_OIL_BY_LOWER = {name.lower(): name for name in OILS}
_WATER_NAMES = {"water", "h2o", "heos::water", "water (liquid)", "liquid water"}
_AIR_NAMES = {"air", "dry air", "heos::air"}


class FluidProperties(TransportProperties):
    """Fluid properties at the bulk temperature; every field an array of the input's shape."""


def _solution_name(percent: float, family: SolutionFamily, original: str) -> str:
    if not 0.0 < percent <= family.max_percent:
        raise InputError(
            "--fluid",
            f'"{original}": {family.content_word} content {percent:g} % is outside 0 to '
            f"{family.max_percent:g} % by mass",
        )
    return f"{percent:g}% {family.label}"


def _family_of(kind: str) -> SolutionFamily:
    for pattern, family in _FAMILY_BY_ALIAS:
        if pattern.match(kind):
            return family
    raise AssertionError(kind)  # the kind came from the same aliases


@functools.cache
def normalise_fluid(name: str) -> str:
    """The canonical fluid name for *name*, or ``InputError('--fluid', …)``.

    Canonical names: ``"water"``, ``"air"``, ``"<N>% <solute>"`` (percent by mass in
    water; solutes: ethylene glycol, propylene glycol, calcium chloride, sodium chloride,
    potassium formate, potassium acetate), or a CoolProp fluid name as CoolProp spells
    it.  Accepted spellings include "30% ethylene glycol", "ethylene glycol 30%",
    "MEG30", "EG 30 %", "PG 40%", "INCOMP::MEG[0.3]", "INCOMP::MEG-30%", "CaCl2 25%",
    "20 % sodium chloride", "NaCl 20%".  Only a name that is none of these and not a
    shipped oil (``INCOMP::PNF``, ``INCOMP::TVP1``) imports CoolProp, to check it.

    Examples
    --------
    >>> normalise_fluid("MEG30"), normalise_fluid("PG 40%"), normalise_fluid("Water")
    ('30% ethylene glycol', '40% propylene glycol', 'water')
    >>> normalise_fluid("INCOMP::MEG[0.3]"), normalise_fluid("CaCl2 25 %")
    ('30% ethylene glycol', '25% calcium chloride')
    """
    text = " ".join(str(name).split())
    low = text.lower()
    if low in _WATER_NAMES:
        return "water"
    if low in _AIR_NAMES:
        return "air"
    if low in _OIL_BY_LOWER:
        return _OIL_BY_LOWER[low]
    bare = low.removeprefix("incomp::")
    for pattern in _SOLUTION_PATTERNS:
        match = pattern.match(bare)
        if match:
            return _solution_name(float(match["pct"]), _family_of(match["kind"]), text)
    match = _INCOMP_FRACTION.match(low)
    if match and match["code"] in _FAMILY_BY_CODE:
        return _solution_name(100.0 * float(match["frac"]), _FAMILY_BY_CODE[match["code"]], text)
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
    percent, _, label = fluid.partition("% ")
    family = SOLUTIONS.get(label)
    if family is not None:
        return f"INCOMP::{family.code}[{float(percent) / 100.0:g}]"
    return fluid


@functools.cache
def _coolprop_table(fluid: str, pressure_pa: float | None) -> dict:
    """Tabulate a CoolProp fluid once over its liquid range on a uniform grid of at most
    0.5 K (:func:`pipeins.props.fluid_tables.grid_k`)."""
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
        # the fits do not depend on pressure, but refuse states below their vapour pressure
        pressure = 1.0e7
    else:
        low_k, freezes = PropsSI("Ttriple", name), True
        if pressure_pa is None:
            top_k = 0.98 * PropsSI("Tcrit", name)
        elif pressure_pa < PropsSI("pcrit", name):
            top_k = PropsSI("T", "P", pressure_pa, "Q", 0, name) - 0.5
        else:
            top_k = PropsSI("Tmax", name)
        pressure = pressure_pa
    temp_k = grid_k(low_k, top_k, GRID_STEP_K)
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
    shipped = shipped_table(fluid)
    if shipped is not None:
        return shipped
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
