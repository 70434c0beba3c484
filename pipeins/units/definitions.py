"""Unit definitions: exact factors, unit atoms, quantity kinds, their ranges and display units.

Data only (plus two small lookups); reading text is :mod:`pipeins.units.parser`, showing
values :mod:`pipeins.units.display`.  The exact definitions behind every factor are listed
in :mod:`pipeins.units`.
"""

from __future__ import annotations

from dataclasses import dataclass

from pipeins.errors import InputError, closest_names

UNIT_SYSTEMS = ("si", "us")

# --------------------------------------------------------------------------------------
# Exact definitions (SI value of one unit)
# --------------------------------------------------------------------------------------
_INCH_M = 0.0254
_FOOT_M = 0.3048
_MILE_M = 1609.344
_POUND_KG = 0.45359237
_US_GALLON_M3 = 231.0 * _INCH_M**3  # 3.785411784e-3 m³
_STANDARD_GRAVITY_M_S2 = 9.80665
_BTU_IT_J = 1055.05585262  # International Table Btu
_HOUR_S = 3600.0
_DEGF_DIFFERENCE_K = 5.0 / 9.0
_STANDARD_ATMOSPHERE_PA = 101_325.0
_PSI_PA = _POUND_KG * _STANDARD_GRAVITY_M_S2 / _INCH_M**2  # 6894.757293168361 Pa
_MMHG_PA = 133.322387415  # 13 595.1 kg/m³ × 9.80665 m/s² × 0.001 m
_INHG_PA = 25.4 * _MMHG_PA
_ABSOLUTE_ZERO_C = -273.15

# Dimension vectors: exponents of (length, mass, time, temperature).
_LENGTH = (1, 0, 0, 0)
_MASS = (0, 1, 0, 0)
_TIME = (0, 0, 1, 0)
_TEMP = (0, 0, 0, 1)
_ENERGY = (2, 1, -2, 0)
_POWER = (2, 1, -3, 0)
_VOLUME = (3, 0, 0, 0)
_NONE = (0, 0, 0, 0)


def _dim_mul(a, b, power=1):
    return tuple(x + power * y for x, y in zip(a, b))


_SPEED = _dim_mul(_LENGTH, _TIME, -1)
_VOLUME_FLOW = _dim_mul(_VOLUME, _TIME, -1)
_MASS_FLOW = _dim_mul(_MASS, _TIME, -1)

# Atoms of compound units: canonical spelling -> (SI factor, dimension).
_ATOMS: dict[str, tuple[float, tuple[int, int, int, int]]] = {
    # length
    "m": (1.0, _LENGTH),
    "mm": (1e-3, _LENGTH),
    "cm": (1e-2, _LENGTH),
    "km": (1e3, _LENGTH),
    "in": (_INCH_M, _LENGTH),
    "inch": (_INCH_M, _LENGTH),
    "inches": (_INCH_M, _LENGTH),
    '"': (_INCH_M, _LENGTH),
    "ft": (_FOOT_M, _LENGTH),
    "foot": (_FOOT_M, _LENGTH),
    "feet": (_FOOT_M, _LENGTH),
    "mi": (_MILE_M, _LENGTH),
    # volume
    "L": (1e-3, _VOLUME),
    "liter": (1e-3, _VOLUME),
    "litre": (1e-3, _VOLUME),
    "gal": (_US_GALLON_M3, _VOLUME),
    # mass
    "kg": (1.0, _MASS),
    "g": (1e-3, _MASS),
    "t": (1e3, _MASS),
    "lb": (_POUND_KG, _MASS),
    "lbm": (_POUND_KG, _MASS),
    # time
    "s": (1.0, _TIME),
    "sec": (1.0, _TIME),
    "min": (60.0, _TIME),
    "h": (_HOUR_S, _TIME),
    "hr": (_HOUR_S, _TIME),
    "d": (86_400.0, _TIME),
    "day": (86_400.0, _TIME),
    "days": (86_400.0, _TIME),
    # temperature difference
    "K": (1.0, _TEMP),
    "C": (1.0, _TEMP),
    "°C": (1.0, _TEMP),
    "degC": (1.0, _TEMP),
    "delta_degC": (1.0, _TEMP),
    "F": (_DEGF_DIFFERENCE_K, _TEMP),
    "°F": (_DEGF_DIFFERENCE_K, _TEMP),
    "degF": (_DEGF_DIFFERENCE_K, _TEMP),
    "delta_degF": (_DEGF_DIFFERENCE_K, _TEMP),
    "R": (_DEGF_DIFFERENCE_K, _TEMP),
    "°R": (_DEGF_DIFFERENCE_K, _TEMP),
    "degR": (_DEGF_DIFFERENCE_K, _TEMP),
    # energy
    "J": (1.0, _ENERGY),
    "kJ": (1e3, _ENERGY),
    "MJ": (1e6, _ENERGY),
    "GJ": (1e9, _ENERGY),
    "Wh": (_HOUR_S, _ENERGY),
    "kWh": (1e3 * _HOUR_S, _ENERGY),
    "MWh": (1e6 * _HOUR_S, _ENERGY),
    "GWh": (1e9 * _HOUR_S, _ENERGY),
    "Btu": (_BTU_IT_J, _ENERGY),
    "kBtu": (1e3 * _BTU_IT_J, _ENERGY),
    "MMBtu": (1e6 * _BTU_IT_J, _ENERGY),
    "therm": (1e5 * _BTU_IT_J, _ENERGY),
    # power
    "W": (1.0, _POWER),
    "kW": (1e3, _POWER),
    "MW": (1e6, _POWER),
    "MBH": (1e3 * _BTU_IT_J / _HOUR_S, _POWER),
    "ton": (12_000.0 * _BTU_IT_J / _HOUR_S, _POWER),
    # ready-made rates
    "mph": (_MILE_M / _HOUR_S, _SPEED),
    "kph": (1e3 / _HOUR_S, _SPEED),
    "fps": (_FOOT_M, _SPEED),
    "fpm": (_FOOT_M / 60.0, _SPEED),
    "gpm": (_US_GALLON_M3 / 60.0, _VOLUME_FLOW),
    "cfm": (_FOOT_M**3 / 60.0, _VOLUME_FLOW),
}
# Mega units whose lower-case spelling is a milli unit: matched only as written.
_CASE_SENSITIVE = {"MJ", "MW", "MWh"}
_ATOMS_LOWER = {k.lower(): k for k in _ATOMS if k not in _CASE_SENSITIVE}
_MEGA_LOWER = {k.lower(): k for k in _CASE_SENSITIVE}

# Pressure: spelling -> (Pa per unit, gauge?).  Not compound: read as one word.
_PRESSURE_UNITS: dict[str, tuple[float, bool]] = {
    "Pa": (1.0, False),
    "hPa": (1e2, False),
    "kPa": (1e3, False),
    "kPaa": (1e3, False),
    "kPag": (1e3, True),
    "MPa": (1e6, False),
    "MPaa": (1e6, False),
    "MPag": (1e6, True),
    "mbar": (1e2, False),
    "bar": (1e5, False),
    "bara": (1e5, False),
    "barg": (1e5, True),
    "psi": (_PSI_PA, False),
    "psia": (_PSI_PA, False),
    "psig": (_PSI_PA, True),
    "inHg": (_INHG_PA, False),
    "mmHg": (_MMHG_PA, False),
    "torr": (_STANDARD_ATMOSPHERE_PA / 760.0, False),
    "atm": (_STANDARD_ATMOSPHERE_PA, False),
}
_PRESSURE_LOWER = {k.lower(): k for k in _PRESSURE_UNITS if not k.startswith("MPa")}
_PRESSURE_MEGA_LOWER = {k.lower(): k for k in _PRESSURE_UNITS if k.startswith("MPa")}

# Temperature (a level, not a difference): spelling (lower case) -> scale.
_TEMPERATURE_UNITS = {
    "c": "C", "°c": "C", "degc": "C", "℃": "C", "celsius": "C",
    "f": "F", "°f": "F", "degf": "F", "℉": "F", "fahrenheit": "F",
    "k": "K", "°k": "K", "kelvin": "K", "degk": "K",
    "r": "R", "°r": "R", "degr": "R", "rankine": "R",
}

_ENERGY_PRICE_UNITS = ("kWh", "MWh", "MJ", "GJ", "therm", "MMBtu", "Btu", "kBtu", "J", "kJ", "Wh")


# --------------------------------------------------------------------------------------
# Kinds: what a quantity is, its SI unit, dimension, display units per system
# --------------------------------------------------------------------------------------
@dataclass(frozen=True)
class _Kind:
    noun: str  # "thickness"
    article: str  # "a" / "an"
    examples: str  # "50mm, 2in or 0.05m"
    dimension: tuple[int, int, int, int] | None  # None: read specially
    display: dict  # system -> (label, SI value of one display unit)


_KINDS: dict[str, _Kind] = {
    "temperature": _Kind(
        "temperature", "a", "150C, 300F or 423K", None,
        {"si": ("°C", None), "us": ("°F", None)}),
    "temperature_difference": _Kind(
        "temperature difference", "a", "10K, 10C or 18F", _TEMP,
        {"si": ("K", 1.0), "us": ("°F", _DEGF_DIFFERENCE_K)}),
    "thickness": _Kind(
        "thickness", "a", "50mm, 2in or 0.05m", _LENGTH,
        {"si": ("mm", 1e-3), "us": ("in", _INCH_M)}),
    "diameter": _Kind(
        "diameter", "a", "114.3mm, 4.5in or 0.1143m", _LENGTH,
        {"si": ("mm", 1e-3), "us": ("in", _INCH_M)}),
    "length": _Kind(
        "length", "a", "30m, 100ft or 1500mm", _LENGTH,
        {"si": ("m", 1.0), "us": ("ft", _FOOT_M)}),
    "speed": _Kind(
        "speed", "a", "3m/s, 10km/h or 7mph", _SPEED,
        {"si": ("m/s", 1.0), "us": ("mph", _MILE_M / _HOUR_S)}),
    "pressure": _Kind(
        "pressure", "a", "101.325kPa, 10barg or 150psig", None,
        {"si": ("kPa", 1e3), "us": ("psia", _PSI_PA)}),
    "heat_flow_per_length": _Kind(
        "heat flow per length", "a", "45W/m or 47Btu/h/ft", _dim_mul(_POWER, _LENGTH, -1),
        {"si": ("W/m", 1.0), "us": ("Btu/(h·ft)", _BTU_IT_J / _HOUR_S / _FOOT_M)}),
    "heat_flux": _Kind(
        "heat flux", "a", "100W/m2 or 30Btu/h/ft2", _dim_mul(_POWER, _LENGTH, -2),
        {"si": ("W/m²", 1.0), "us": ("Btu/(h·ft²)", _BTU_IT_J / _HOUR_S / _FOOT_M**2)}),
    "heat_transfer_coefficient": _Kind(
        "heat transfer coefficient", "a", "10W/m2K or 1.8Btu/h/ft2/F",
        _dim_mul(_dim_mul(_POWER, _LENGTH, -2), _TEMP, -1),
        {"si": ("W/(m²·K)", 1.0),
         "us": ("Btu/(h·ft²·°F)", _BTU_IT_J / _HOUR_S / _FOOT_M**2 / _DEGF_DIFFERENCE_K)}),
    "conductivity": _Kind(
        "thermal conductivity", "a", "0.04W/mK or 0.28Btu*in/(h*ft2*F)",
        _dim_mul(_dim_mul(_POWER, _LENGTH, -1), _TEMP, -1),
        {"si": ("W/(m·K)", 1.0),
         "us": ("Btu·in/(h·ft²·°F)",
                _BTU_IT_J * _INCH_M / _HOUR_S / _FOOT_M**2 / _DEGF_DIFFERENCE_K)}),
    "thermal_resistance_per_length": _Kind(
        "thermal resistance per length", "a", "0.5m*K/W or 0.87h*ft*F/Btu",
        _dim_mul(_dim_mul(_TEMP, _LENGTH), _POWER, -1),
        {"si": ("m·K/W", 1.0), "us": ("h·ft·°F/Btu", _HOUR_S * _FOOT_M * _DEGF_DIFFERENCE_K / _BTU_IT_J)}),
    "area": _Kind(
        "area", "an", "12m2 or 130ft2", _dim_mul(_LENGTH, _LENGTH),
        {"si": ("m²", 1.0), "us": ("ft²", _FOOT_M**2)}),
    "area_per_length": _Kind(
        "area per length", "an", "2.1m2/m or 6.9ft2/ft", _LENGTH,
        {"si": ("m²/m", 1.0), "us": ("ft²/ft", _FOOT_M)}),
    "time": _Kind(
        "time", "a", "8760h, 30min or 2d", _TIME,
        {"si": ("h", _HOUR_S), "us": ("h", _HOUR_S)}),
    "steam_pressure": _Kind(
        "steam pressure", "a", "10barg, 11bara, 150psig or 1MPa(a)", None,
        {}),
    "percent": _Kind(
        "percentage", "a", "50, 50% or 12.5%", None,
        {"si": ("%", 1.0), "us": ("%", 1.0)}),
    "efficiency": _Kind(
        "efficiency", "an", "88%, 88 or 0.88", None,
        {}),
    "flow": _Kind(
        "flow", "a", "2kg/s, 5m3/h or 20gpm", None,
        {}),
    "mass_flow": _Kind(
        "mass flow", "a", "2kg/s, 7200kg/h or 5000lb/h", _MASS_FLOW,
        {"si": ("kg/h", 1.0 / _HOUR_S), "us": ("lb/h", _POUND_KG / _HOUR_S)}),
    "volume_flow": _Kind(
        "volume flow", "a", "5m3/h, 2L/s or 20gpm", _VOLUME_FLOW,
        {"si": ("m³/h", 1.0 / _HOUR_S), "us": ("gpm", _US_GALLON_M3 / 60.0)}),
    "energy": _Kind(
        "energy", "an", "1200kWh, 5GJ or 4MMBtu", _ENERGY,
        {"si": ("kWh", 1e3 * _HOUR_S), "us": ("MMBtu", 1e6 * _BTU_IT_J)}),
    "power": _Kind(
        "power", "a", "500W, 2kW or 1700Btu/h", _POWER,
        {"si": ("W", 1.0), "us": ("Btu/h", _BTU_IT_J / _HOUR_S)}),
}

# Physical range of every kind, SI (°C for temperatures): (lowest, highest) accepted.  Wide
# on purpose (they catch unit slips and overflow, not design mistakes); inputs with a
# narrower meaning pass their own ``low``/``high`` to parse_quantity.  Signs are left to the
# caller (its own "must be greater than zero" message) where a kind can be negative.
RANGES: dict[str, tuple[float, float]] = {
    "temperature": (_ABSOLUTE_ZERO_C, 2000.0),
    "temperature_difference": (-2000.0, 2000.0),
    "thickness": (-2.0, 2.0),
    "diameter": (-20.0, 20.0),
    "length": (-1e6, 1e6),
    "speed": (-200.0, 200.0),
    "pressure": (0.0, 1e8),
    "steam_pressure": (0.0, 1e8),
    "heat_flow_per_length": (-1e7, 1e7),
    "heat_flux": (-1e8, 1e8),
    "heat_transfer_coefficient": (-1e9, 1e9),
    "conductivity": (-1e4, 1e4),
    "thermal_resistance_per_length": (-1e6, 1e6),
    "time": (-1e10, 1e10),
    "area": (0.0, 1e7),
    "area_per_length": (0.0, 1e4),
    "percent": (-1000.0, 1000.0),
    "efficiency": (0.01, 1.0),  # checked when read
    "flow": (-1e6, 1e6),
    "mass_flow": (-1e6, 1e6),
    "volume_flow": (-1e4, 1e4),
    "energy": (-1e20, 1e20),
    "power": (-1e12, 1e12),
}
"""Accepted range of each kind in SI (°C, K, m, m/s, Pa, W/m, W/m², W/(m²·K), W/(m·K), s,
%, fraction, kg/s or m³/s, J, W); :func:`parse_quantity` refuses values outside it.
Thickness: at most 2 m (a thicker "layer" is a unit slip); temperature: absolute zero to
2000 °C; percentages: -1000 to 1000 %."""

# Smallest magnitude other than zero accepted, SI: a heat flow of 1e-320 W/m is no design value
# and overflows the sizing search's divisions.
FLOORS: dict[str, float] = {"heat_flow_per_length": 1e-3, "heat_flux": 1e-3}

KINDS = tuple(_KINDS)
"""Every kind :func:`parse_quantity` reads."""

DISPLAY_KINDS = tuple(k for k, v in _KINDS.items() if v.display)
"""Every kind :func:`to_display`, :func:`unit_label` and :func:`format_quantity` show."""

# Decimal places used by format_quantity when none are given: (kind, system) -> digits.
_DEFAULT_DIGITS = {
    ("temperature", "si"): 1, ("temperature", "us"): 1,
    ("temperature_difference", "si"): 1, ("temperature_difference", "us"): 1,
    ("thickness", "si"): 0, ("thickness", "us"): 2,
    ("diameter", "si"): 1, ("diameter", "us"): 3,
    ("length", "si"): 1, ("length", "us"): 1,
    ("speed", "si"): 1, ("speed", "us"): 1,
    ("pressure", "si"): 1, ("pressure", "us"): 2,
    ("heat_flow_per_length", "si"): 1, ("heat_flow_per_length", "us"): 1,
    ("heat_flux", "si"): 1, ("heat_flux", "us"): 1,
    ("heat_transfer_coefficient", "si"): 2, ("heat_transfer_coefficient", "us"): 3,
    ("conductivity", "si"): 4, ("conductivity", "us"): 3,
    ("thermal_resistance_per_length", "si"): 4, ("thermal_resistance_per_length", "us"): 4,
    ("time", "si"): 0, ("time", "us"): 0,
    ("area", "si"): 2, ("area", "us"): 1,
    ("area_per_length", "si"): 3, ("area_per_length", "us"): 2,
    ("percent", "si"): 1, ("percent", "us"): 1,
    ("mass_flow", "si"): 0, ("mass_flow", "us"): 0,
    ("volume_flow", "si"): 2, ("volume_flow", "us"): 1,
    ("energy", "si"): 0, ("energy", "us"): 2,
    ("power", "si"): 0, ("power", "us"): 0,
}


# Outside diameters of NPS 1/8 to 12 in inches, as the inch tables print them (ASME B36.10M,
# B36.19M and the IPS sizes of ASTM D1785 share them); the steel catalogue holds the mm column,
# rounded to 0.1 mm, so 60.3 mm reads 2.374 in where the table says 2.375.  From NPS 14 up the
# outside diameter is the NPS itself, and the mm column is rounded to whole millimetres
# (457 mm for 18 in).  format_quantity shows a diameter within that rounding of one of these
# (0.06 mm up to NPS 12, 0.5 mm above) as the inch value.
_IPS_OD_IN = (0.405, 0.540, 0.675, 0.840, 1.050, 1.315, 1.660, 1.900, 2.375, 2.875, 3.500, 4.000,
              4.500, 5.563, 6.625, 8.625, 10.750, 12.750)


@dataclass(frozen=True)
class Flow:
    """A flow read from text: ``value_si`` in kg/s (``basis="mass"``) or m³/s (``"volume"``)."""

    value_si: float
    basis: str  # "mass" | "volume"


def _check_system(units: str) -> str:
    system = str(units).strip().lower()
    if system not in UNIT_SYSTEMS:
        raise InputError("units", f'unknown unit system "{units}"; use "si" or "us"')
    return system


def _get_kind(kind: str, display: bool = False) -> _Kind:
    if kind not in _KINDS or (display and not _KINDS[kind].display):
        names = DISPLAY_KINDS if display else KINDS
        raise InputError("kind", f'unknown quantity kind "{kind}"; {closest_names(kind, names)}')
    return _KINDS[kind]
