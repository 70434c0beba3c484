"""Quantities with units at the edges: read user text into SI, show SI results in a unit system.

Everything inside pipeins is SI (temperatures in °C at the API).  The command line and the
project file give values as text such as ``1-1/2in``, ``350F``, ``10 barg`` or ``25 m3/h``;
:func:`parse_quantity` turns that text into an SI float.  Results go back out through
:func:`to_display`, :func:`unit_label` and :func:`format_quantity` in the chosen unit
system, ``"si"`` or ``"us"``.

Conversion factors are written out here by hand (no unit library at run time); each one is
checked against ``pint`` in ``tests/test_units.py``.  The exact definitions used:

* inch = 0.0254 m, foot = 0.3048 m, pound = 0.45359237 kg, US gallon = 231 in³
  (international yard and pound agreement, 1959);
* Btu is the International Table Btu, 1 Btu = 1055.05585262 J; therm = 100 000 Btu,
  MMBtu = 1 000 000 Btu; refrigeration ton = 12 000 Btu/h;
* °F difference = 5/9 K; psi = pound-force per square inch with standard gravity
  9.80665 m/s²; inHg and mmHg are the conventional mercury columns (13 595.1 kg/m³,
  standard gravity): 1 mmHg = 133.322387415 Pa, 1 inHg = 25.4 mmHg.

How text is read
----------------
* A number, optionally a fraction (``3/4``, ``1-1/2``, ``1 1/2``), then an optional unit;
  whitespace between number and unit is allowed.  A *bare* number is read in the unit the
  unit system displays (see :func:`unit_label`), except a flow, which always needs a unit.
* Units are matched case-insensitively (``KPA``, ``btu/HR-FT``, ``MM``), with one exception:
  mega (``MPa``, ``MW``, ``MJ``, ``MWh``) must start with a capital ``M`` because a
  lower-case ``m`` is the milli prefix; ``5 mpa`` is refused instead of being guessed
  (``5 MPA`` is read as 5 MPa).
  ``K`` and ``k`` alone both mean kelvin (kilo is never a unit on its own).
* Compound units: everything after a slash is in the denominator up to the next slash, so
  ``Btu/hr-ft``, ``Btu/h·ft``, ``Btu/(h*ft)`` and ``Btu/h/ft`` are all Btu/(h·ft), and
  ``W/m2K`` is W/(m²·K).  ``*``, ``·``, ``-``, a space or nothing at all multiply; exponents
  are digits, ``^2`` or ``²``.  Inside compound units ``C`` and ``F`` are temperature
  *differences*.
* An air pressure (kind ``pressure``) is absolute: ``bar``, ``psi`` and ``kPa`` mean
  absolute pressure there (as ``bara``, ``psia``); gauge readings are written ``barg``,
  ``psig`` or ``kPag`` (+ 101 325 Pa).
* A steam pressure (kind ``steam_pressure``) must say gauge or absolute, because plant
  staff read gauges: ``10 barg``/``10 bara``, ``150 psig``/``150 psia``, ``1 MPag``/``1 MPaa``,
  ``700 kPag``/``700 kPaa``; ``(g)``/``(a)`` and the words ``gauge``/``abs``/``absolute`` may
  follow the unit (``10 bar(g)``, ``1 MPa(a)``, ``10 bar gauge``).  ``10 bar``, ``150psi``
  and a bare number are refused with that hint.
* Percentages (RH, rates, reductions) are percent: ``80``, ``80%`` and ``80 %`` all mean
  80 %.  A bare value whose size is at most 1 (``0.8``) is refused, since it is usually a
  fraction typed by mistake; write ``0.8 %`` to mean 0.8 %.  An efficiency (kind
  ``efficiency``, returned as a fraction) takes ``88 %``, ``88`` (a bare value above 1 is
  percent) or ``0.88`` (a bare value at most 1 is a fraction).
* Every value must be finite and inside a physical range (see :data:`RANGES`): ``1e999m``,
  ``nan`` or a 1000 m insulation layer are refused with the input's name.
"""

from __future__ import annotations

import math
import numbers
import re
from dataclasses import dataclass

from pipeins.errors import InputError, closest_names

__all__ = [
    "UNIT_SYSTEMS",
    "KINDS",
    "DISPLAY_KINDS",
    "Flow",
    "RANGES",
    "parse_quantity",
    "parse_number",
    "material_in_si",
    "parse_money_per_energy",
    "energy_unit_joules",
    "to_display",
    "from_display",
    "unit_label",
    "format_quantity",
]

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
    "time": (-1e10, 1e10),
    "percent": (-1000.0, 1000.0),
    "efficiency": (0.0, 1.0),  # above 0, checked when read
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
    ("time", "si"): 0, ("time", "us"): 0,
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


def _inch_table_value(diameter_m: float) -> float | None:
    """The inch-table outside diameter [in] that *diameter_m* [m] rounds from, or None."""
    for od_in in _IPS_OD_IN:
        if abs(diameter_m - od_in * _INCH_M) <= 0.06e-3:
            return od_in
    inches = diameter_m / _INCH_M
    if 13.5 < inches < 80.5 and round(inches) % 2 == 0 and abs(diameter_m - round(inches) * _INCH_M) <= 0.5e-3:
        return float(round(inches))  # NPS 14 and up, even sizes: OD = NPS
    return None


@dataclass(frozen=True)
class Flow:
    """A flow read from text: ``value_si`` in kg/s (``basis="mass"``) or m³/s (``"volume"``)."""

    value_si: float
    basis: str  # "mass" | "volume"


# --------------------------------------------------------------------------------------
# Reading text
# --------------------------------------------------------------------------------------
_NUMBER_RE = re.compile(
    r"""\s*(?P<sign>[-+−]?)\s*
    (?:
        (?P<whole>\d+)(?:\s+|\s*-\s*)(?P<num>\d+)\s*/\s*(?P<den>\d+)(?![\d.])
      | (?P<fnum>\d+)\s*/\s*(?P<fden>\d+)(?![\d.])
      | (?P<dec>(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)
    )""",
    re.VERBOSE,
)
_UNICODE_FIXES = {
    "²": "2", "³": "3", "·": "*", "⋅": "*", "×": "*", "•": "*", "−": "-",
    "µ": "u", "º": "°", "”": '"', "″": '"', "Δ": "",
}
_WORD_CHARS = "A-Za-z°℃℉\"'%_"
_TOKEN_RE = re.compile(
    rf"\s*(?:(?P<word>[{_WORD_CHARS}]+)|(?P<exp>\^-?\d+|\d+)|(?P<op>[*/-])|(?P<lp>\()|(?P<rp>\)))"
)


class _Unreadable(Exception):
    """Internal: the unit text is not understood (turned into an InputError by the caller)."""


class _MegaCase(Exception):
    """Internal: a mega unit written with a lower-case m."""

    def __init__(self, canonical):
        self.canonical = canonical


def _split_number(text: str):
    """``"1-1/2 in"`` -> (1.5, "in"); None when the text does not start with a number."""
    match = _NUMBER_RE.match(text)
    if not match:
        return None
    g = match.groupdict()
    try:
        if g["whole"] is not None:
            value = int(g["whole"]) + int(g["num"]) / int(g["den"])
        elif g["fnum"] is not None:
            value = int(g["fnum"]) / int(g["fden"])
        else:
            value = float(g["dec"])
    except ZeroDivisionError:
        return None
    except (OverflowError, ValueError):  # digits beyond any float (or Python's int limit)
        value = math.inf
    if g["sign"] in ("-", "−"):
        value = -value
    return value, text[match.end():].strip()


def _normalise(unit: str) -> str:
    for old, new in _UNICODE_FIXES.items():
        unit = unit.replace(old, new)
    return unit.replace("**", "^").strip()


def _lookup_atom(word: str):
    if word in _ATOMS:
        return _ATOMS[word]
    lower = word.lower()
    if lower in _MEGA_LOWER:
        if word.startswith("M"):
            return _ATOMS[_MEGA_LOWER[lower]]
        raise _MegaCase(_MEGA_LOWER[lower])
    if lower in _ATOMS_LOWER:
        return _ATOMS[_ATOMS_LOWER[lower]]
    return None


def _split_word(word: str):
    """A run of letters -> unit atoms, whole word first, else greedy longest prefixes."""
    atom = _lookup_atom(word)
    if atom is not None:
        return [atom]
    atoms, pos = [], 0
    while pos < len(word):
        for end in range(len(word), pos, -1):
            try:
                atom = _lookup_atom(word[pos:end])
            except _MegaCase:
                atom = None  # inside a longer word, never guess a case
            if atom is not None:
                atoms.append(atom)
                pos = end
                break
        else:
            raise _Unreadable(word)
    return atoms


def _tokenise(unit: str):
    tokens, pos = [], 0
    while pos < len(unit):
        match = _TOKEN_RE.match(unit, pos)
        if not match or match.end() == pos:
            if unit[pos:].strip() == "":
                break
            raise _Unreadable(unit)
        pos = match.end()
        if match["word"]:
            tokens.extend(("atom", a) for a in _split_word(match["word"]))
        elif match["exp"]:
            tokens.append(("exp", int(match["exp"].lstrip("^"))))
        elif match["op"]:
            tokens.append(("op", "/" if match["op"] == "/" else "*"))
        elif match["lp"]:
            tokens.append(("lp", None))
        else:
            tokens.append(("rp", None))
    return tokens


def _parse_compound(unit: str):
    """Unit text -> (SI factor, dimension).  Multiplication binds tighter than ``/``."""
    tokens = _tokenise(_normalise(unit))
    pos = 0

    def peek():
        return tokens[pos] if pos < len(tokens) else (None, None)

    def power():
        nonlocal pos
        kind, value = peek()
        if kind == "atom":
            pos += 1
            factor, dim = value
        elif kind == "lp":
            pos += 1
            factor, dim = quotient()
            if peek()[0] != "rp":
                raise _Unreadable(unit)
            pos += 1
        else:
            raise _Unreadable(unit)
        if peek()[0] == "exp":
            exponent = peek()[1]
            pos += 1
            factor, dim = factor**exponent, tuple(exponent * x for x in dim)
        return factor, dim

    def product():
        nonlocal pos
        factor, dim = power()
        while True:
            kind, value = peek()
            if kind == "op" and value == "*":
                pos += 1
            elif kind not in ("atom", "lp"):
                return factor, dim
            f2, d2 = power()
            factor, dim = factor * f2, _dim_mul(dim, d2)

    def quotient():
        nonlocal pos
        factor, dim = product()
        while peek() == ("op", "/"):
            pos += 1
            f2, d2 = product()
            factor, dim = factor / f2, _dim_mul(dim, d2, -1)
        return factor, dim

    if not tokens:
        raise _Unreadable(unit)
    result = quotient()
    if pos != len(tokens):
        raise _Unreadable(unit)
    return result


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


def _cannot_read(option, text, spec: _Kind, extra: str = "") -> InputError:
    return InputError(
        option,
        f'cannot read "{text}" as {spec.article} {spec.noun}{extra}; use e.g. {spec.examples}',
    )


def _parse_temperature(number, unit, text, option, system, spec):
    if unit == "":
        scale = "C" if system == "si" else "F"
    else:
        scale = _TEMPERATURE_UNITS.get(_normalise(unit).replace(" ", "").lower())
        if scale is None:
            raise _cannot_read(option, text, spec)
    temp_c = {
        "C": number,
        "F": (number - 32.0) * _DEGF_DIFFERENCE_K,
        "K": number + _ABSOLUTE_ZERO_C,
        "R": number * _DEGF_DIFFERENCE_K + _ABSOLUTE_ZERO_C,
    }[scale]
    # Allow for the rounding of -459.67 °F and the like.
    if temp_c < _ABSOLUTE_ZERO_C - 1e-9:
        raise InputError(
            option, f'"{text}" is below absolute zero (-273.15 °C, -459.67 °F, 0 K)')
    return max(temp_c, _ABSOLUTE_ZERO_C)


_GAUGE_WORDS = (("absolute", "a"), ("abs", "a"), ("gauge", "g"), ("gage", "g"))
_STEAM_UNITS = {"barg", "bara", "psig", "psia", "kpag", "kpaa", "mpag", "mpaa"}


def _pressure_word(unit: str) -> str:
    """``"bar (g)"`` -> ``"barg"``, ``"bar gauge"`` -> ``"barg"``, ``"MPa(a)"`` -> ``"MPaa"``."""
    word = _normalise(unit).replace(" ", "").replace("(", "").replace(")", "")
    for long, short in _GAUGE_WORDS:
        if word.lower().endswith(long) and len(word) > len(long):
            word = word[: -len(long)] + short
            break
    return word


def _parse_pressure(number, unit, text, option, system, spec, steam=False):
    if steam:
        word = _pressure_word(unit)
        if word.lower() not in _STEAM_UNITS:
            base = {"psi": "psi", "kpa": "kPa", "mpa": "MPa"}.get(word.lower(), "bar")
            shown = f"{number:g}"
            if unit == "":
                head = f'"{text}" needs a unit that says gauge or absolute'
            elif word.lower() in ("bar", "psi", "kpa", "mpa"):
                head = f'"{text}" does not say gauge or absolute'
            else:
                head = f'cannot read "{text}" as a steam pressure, which must say gauge or absolute'
            raise InputError(option, f"{head}; write e.g. {shown} {base}g (gauge) or {shown} {base}a "
                                     f"(absolute)")
        unit = word
    if unit == "":
        pa_per_unit, gauge = (1e3, False) if system == "si" else (_PSI_PA, False)
    else:
        word = _pressure_word(unit)
        if word in _PRESSURE_UNITS:
            pa_per_unit, gauge = _PRESSURE_UNITS[word]
        elif word.lower() in _PRESSURE_MEGA_LOWER:
            canonical = _PRESSURE_MEGA_LOWER[word.lower()]
            if not word.startswith("M"):
                raise _cannot_read(option, text, spec,
                                   f' (write "{canonical}": lower-case m means milli)')
            pa_per_unit, gauge = _PRESSURE_UNITS[canonical]
        elif word.lower() in _PRESSURE_LOWER:
            pa_per_unit, gauge = _PRESSURE_UNITS[_PRESSURE_LOWER[word.lower()]]
        else:
            raise _cannot_read(option, text, spec)
    pressure_pa = number * pa_per_unit + (_STANDARD_ATMOSPHERE_PA if gauge else 0.0)
    if pressure_pa < 0.0:
        raise InputError(
            option,
            f'"{text}" is below zero absolute pressure; bar, psi and kPa mean absolute '
            f"(write barg, psig or kPag for gauge)" if not steam else
            f'"{text}" is below zero absolute pressure',
        )
    return pressure_pa


def _percent_sign(unit: str, text, option, spec) -> bool:
    """True when the unit is ``%``/``percent``, False when bare; anything else is refused."""
    word = unit.replace(" ", "").lower()
    if word not in ("", "%", "percent"):
        raise _cannot_read(option, text, spec)
    return word != ""


def _parse_percent(number, unit, text, option, spec):
    if not _percent_sign(unit, text, option, spec) and 0.0 < abs(number) <= 1.0:
        raise InputError(
            option, f"{text} is read as percent; did you mean {_nice(number * 100.0)} %? "
                    f"(write {text} % if you mean it)")
    return number


def _parse_efficiency(number, unit, text, option, spec):
    value = number / 100.0 if _percent_sign(unit, text, option, spec) or number > 1.0 else number
    if not 0.0 < value <= 1.0:
        raise InputError(option, f'"{text}" is out of range; an efficiency is above 0 and at most 100 % '
                                 "(88 %, 88 and 0.88 all mean 88 %)")
    return value


def _nice(value: float) -> str:
    """A limit or a value for a message: ``10,000``, ``0.1``, ``1e+09``."""
    if value == 0:
        return "0"
    if abs(value) < 1e15 and abs(value - round(value)) <= 1e-9 * abs(value):
        return f"{round(value):,}"
    return f"{value:.5g}"


def _range_text(kind: str, system: str, value: float, low: float, high: float) -> str:
    """``"from 0.1 to 10,000 W/(m²·K)"`` in the unit system's display unit; a range symmetric
    about zero (a sanity bound) is said from the side the value left it: ``"at most 2,000 mm"``."""
    if kind == "percent":
        lo, hi, label = low, high, "%"
    else:
        shown_kind = {"steam_pressure": "pressure"}.get(kind, kind)
        lo = to_display(low, shown_kind, system)
        hi = to_display(high, shown_kind, system)
        label = unit_label(shown_kind, system)
        if shown_kind == "pressure" and not label.endswith("a"):
            label += " absolute"
    if low == -high:
        return f"at most {_nice(hi)} {label}" if value > high else f"at least {_nice(lo)} {label}"
    return f"from {_nice(lo)} to {_nice(hi)} {label}"


def _check_range(value, kind, shown, option, system, spec, low, high, what):
    if not math.isfinite(value):
        raise InputError(option, f'"{shown}" is not a finite {spec.noun}')
    default_low, default_high = RANGES[kind]
    low = default_low if low is None else low
    high = default_high if high is None else high
    if not low <= value <= high:
        noun = what or f"{spec.article} {spec.noun}"
        raise InputError(option, f'"{shown}" is out of range; {noun} is '
                                 f"{_range_text(kind, system, value, low, high)}")
    return value


def parse_quantity(text, kind: str, option: str = "", units: str = "si", *,
                   low: float | None = None, high: float | None = None, what: str = ""):
    """Read a value with an optional unit suffix and return it in SI.

    Parameters
    ----------
    text : str or float
        What the user wrote, e.g. ``"1-1/2in"``, ``"350 °F"``, ``"10barg"``, ``"25 m3/h"``.
        A plain ``int``/``float`` (from a project file) is a bare number.
    kind : str
        One of :data:`KINDS`.  SI results: ``temperature`` [°C], ``temperature_difference``
        [K], ``thickness``/``diameter``/``length`` [m], ``speed`` [m/s], ``pressure``
        [Pa, absolute], ``steam_pressure`` [Pa, absolute; the text must say gauge or
        absolute], ``heat_flow_per_length`` [W/m], ``heat_flux`` [W/m²],
        ``heat_transfer_coefficient`` [W/(m²·K)], ``conductivity`` [W/(m·K)], ``time`` [s],
        ``percent`` [%], ``efficiency`` [fraction, 0..1], ``energy`` [J], ``power`` [W],
        ``mass_flow`` [kg/s], ``volume_flow`` [m³/s]; ``flow`` returns a :class:`Flow`
        (mass or volume).
    option : str
        Name of the input for error messages, e.g. ``"--thickness"``.
    units : {"si", "us"}
        Unit system that gives a bare number its unit (the system's display unit, see
        :func:`unit_label`): e.g. a bare thickness is mm in ``si`` and inches in ``us``;
        a bare temperature °C or °F; a bare pressure kPa or psia; a bare conductivity
        W/(m·K) or Btu·in/(h·ft²·°F); a bare coefficient W/(m²·K) or Btu/(h·ft²·°F).
        Time is hours in both.
    low, high : float, optional
        Narrower accepted range in SI (°C, fraction for ``efficiency``) than the kind's
        :data:`RANGES`, for inputs with a physical meaning of their own (a fixed outer
        coefficient, say); *what* names that quantity in the message.

    Returns
    -------
    float or Flow
        The value in SI units (°C for temperatures).

    Raises
    ------
    InputError
        Empty or unreadable text, a unit of the wrong kind, a value that is not finite or
        lies outside the range, a temperature below absolute zero, a negative absolute
        pressure, a flow without a unit, a steam pressure that says neither gauge nor
        absolute, or a bare percentage at most 1.

    Notes
    -----
    ``bar``, ``psi``, ``kPa`` and ``MPa`` are absolute pressures for an air pressure
    (``bara``, ``psia`` are accepted too); gauge readings are ``barg``, ``psig``,
    ``kPag``, ``MPag`` and add one standard atmosphere, 101 325 Pa.  A ``percent`` is a
    percentage: ``80`` and ``80 %`` are 80 %; ``0.5 %`` is half a percent, and a bare
    ``0.5`` is refused (did you mean 50 %?).  Btu is the International Table Btu
    (1055.05585262 J).

    Examples
    --------
    >>> round(parse_quantity("1-1/2in", "thickness"), 6)
    0.0381
    >>> parse_quantity("212 F", "temperature")
    100.0
    >>> round(parse_quantity("2", "thickness", units="us"), 6)
    0.0508
    >>> parse_quantity("0 barg", "pressure")
    101325.0
    >>> parse_quantity("10 barg", "steam_pressure")
    1101325.0
    >>> parse_quantity("88", "efficiency"), parse_quantity("0.88", "efficiency")
    (0.88, 0.88)
    >>> round(parse_quantity("50 Btu/hr-ft", "heat_flow_per_length"), 3)
    48.076
    >>> parse_quantity("5 m3/h", "flow")
    Flow(value_si=0.001388888888888889, basis='volume')
    >>> parse_quantity("5 parsecs", "length", "--length")
    Traceback (most recent call last):
    ...
    pipeins.errors.InputError: --length: cannot read "5 parsecs" as a length; use e.g. 30m, 100ft or 1500mm
    >>> parse_quantity("0.8", "percent", "--rh")
    Traceback (most recent call last):
    ...
    pipeins.errors.InputError: --rh: 0.8 is read as percent; did you mean 80 %? (write 0.8 % if you mean it)
    """
    spec = _get_kind(kind)
    system = _check_system(units)
    if isinstance(text, bool):
        raise _cannot_read(option, text, spec)
    if isinstance(text, numbers.Real):
        shown = str(text)
        try:
            number, unit = float(text), ""
        except OverflowError:  # an integer beyond any float
            raise InputError(option, f'"{_clip(shown)}" is not a finite {spec.noun}') from None
        if not math.isfinite(number):
            raise InputError(option, f'"{shown}" is not a finite {spec.noun}')
    else:
        shown = "" if text is None else str(text).strip()
        if shown == "":
            raise InputError(option, f"the {spec.noun} is missing; use e.g. {spec.examples}")
        split = _split_number(shown)
        if split is None:
            raise _cannot_read(option, _clip(shown), spec)
        number, unit = split
        if not math.isfinite(number):
            raise InputError(option, f'"{_clip(shown)}" is not a finite {spec.noun}')
    shown = _clip(shown)
    check = lambda value: _check_range(value, kind, shown, option, system, spec, low, high, what)  # noqa: E731

    if kind == "temperature":
        return check(_parse_temperature(number, unit, shown, option, system, spec))
    if kind in ("pressure", "steam_pressure"):
        return check(_parse_pressure(number, unit, shown, option, system, spec, kind == "steam_pressure"))
    if kind == "percent":
        return check(_parse_percent(number, unit, shown, option, spec))
    if kind == "efficiency":
        return check(_parse_efficiency(number, unit, shown, option, spec))
    if unit == "":
        if kind in ("flow", "mass_flow", "volume_flow"):
            raise InputError(option, f'"{shown}" needs a unit; use e.g. {spec.examples}')
        return check(number * spec.display[system][1])
    try:
        factor, dim = _parse_compound(unit)
    except _MegaCase as exc:
        raise _cannot_read(option, shown, spec,
                           f' (write "{exc.canonical}": lower-case m means milli)') from None
    except (_Unreadable, OverflowError, RecursionError, ZeroDivisionError):
        raise _cannot_read(option, shown, spec) from None
    if kind == "flow":
        if dim == _MASS_FLOW:
            value = _check_range(number * factor, "mass_flow", shown, option, system, spec, low, high, what)
            return Flow(value, "mass")
        if dim == _VOLUME_FLOW:
            value = _check_range(number * factor, "volume_flow", shown, option, system, spec, low, high, what)
            return Flow(value, "volume")
        raise _cannot_read(option, shown, spec)
    if dim != spec.dimension:
        raise _cannot_read(option, shown, spec)
    return check(number * factor)


def _clip(text: str, limit: int = 60) -> str:
    """Echo at most *limit* characters of what the user wrote (a 200-digit number, say)."""
    text = str(text)
    return text if len(text) <= limit else text[: limit - 1] + "…"


def parse_number(text, option: str, what: str, low: float | None = None, high: float | None = None,
                 low_open: bool = False) -> float:
    """A plain number (a COP, a count of years, an emittance), finite and in range.

    Parameters
    ----------
    text : str or float
        What the user wrote.
    option : str
        Name of the input for messages.
    what : str
        The quantity with its article, e.g. ``"a coefficient of performance"``.
    low, high : float, optional
        Accepted range, inclusive (exclusive at *low* when *low_open*); without them any
        finite number (the caller checks the range with its own words).

    Examples
    --------
    >>> parse_number("3.5", "--cop", "a coefficient of performance", 0, 50, low_open=True)
    3.5
    >>> parse_number("nan", "--cop", "a coefficient of performance", 0, 50, low_open=True)
    Traceback (most recent call last):
    ...
    pipeins.errors.InputError: --cop: cannot read "nan" as a coefficient of performance; give a number above 0 and at most 50
    """
    if low is None or high is None:
        allowed = "give a finite number"
    else:
        bound = f"above {_nice(low)}" if low_open else f"at least {_nice(low)}"
        allowed = f"give a number {bound} and at most {_nice(high)}"
    shown = _clip("" if text is None else str(text).strip())
    if isinstance(text, bool):
        value = math.nan
    elif isinstance(text, numbers.Real):
        try:
            value = float(text)
        except OverflowError:
            value = math.inf
    else:
        split = _split_number(shown)
        value = split[0] if split is not None and split[1] == "" else math.nan
    if math.isnan(value) or (low is None and math.isinf(value)):
        raise InputError(option, f'cannot read "{shown}" as {what}; {allowed}')
    if low is None or high is None:
        return value
    if not (low < value if low_open else low <= value) or not value <= high:
        raise InputError(option, f'"{shown}" is out of range for {what}; {allowed}')
    return value


def material_in_si(text, units: str = "si", option: str = "--layer") -> str:
    """A material as the library takes it: ``k=<value>`` turned into W/(m·K), names kept.

    A constant conductivity ``k=<value>`` may carry a unit (``k=0.25Btu·in/(h·ft²·°F)``,
    ``k=0.25 Btu-in/hr-ft2-F``, ``k=0.036W/mK``); a bare value is in the unit system's
    conductivity unit, W/(m·K) in ``si`` and Btu·in/(h·ft²·°F) in ``us``.  Any other text
    (a catalogue name) is returned unchanged.

    Examples
    --------
    >>> material_in_si("k=0.25", "us")
    'k=0.036057'
    >>> material_in_si("k=0.036 W/mK", "us")
    'k=0.036'
    >>> material_in_si("mineral wool", "us")
    'mineral wool'
    """
    text = str(text)
    match = re.match(r"\s*k\s*=(.*)$", text, re.I | re.S)
    if not match:
        return text
    value = parse_quantity(match.group(1), "conductivity", option, units,
                           what="a constant conductivity")
    return f"k={value:.6g}"


def energy_unit_joules(name: str) -> float:
    """Joules in one energy unit named for a price, e.g. ``"kWh"`` -> 3.6e6.

    Parameters
    ----------
    name : str
        ``kWh``, ``MWh``, ``Wh``, ``J``, ``kJ``, ``MJ``, ``GJ``, ``Btu``, ``kBtu``,
        ``MMBtu`` (10⁶ Btu) or ``therm`` (10⁵ Btu); Btu is the International Table Btu.
        Case-insensitive, except that ``MJ``/``MWh`` need a capital M (m means milli).

    Returns
    -------
    float
        Energy of one unit [J].

    Examples
    --------
    >>> energy_unit_joules("kWh")
    3600000.0
    >>> energy_unit_joules("therm")
    105505585.262
    """
    word = _normalise(str(name)).replace(" ", "")
    if word in _ENERGY_PRICE_UNITS:
        return _ATOMS[word][0]
    by_lower = {u.lower(): u for u in _ENERGY_PRICE_UNITS}
    if word.lower() in by_lower and (by_lower[word.lower()] not in _CASE_SENSITIVE
                                     or word.startswith("M")):
        return _ATOMS[by_lower[word.lower()]][0]
    raise InputError(
        "energy unit", f'unknown energy unit "{name}"; {closest_names(word, _ENERGY_PRICE_UNITS)}')


_PRICE_RE = re.compile(
    r"^\s*[$€£¥]?\s*(?P<number>(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*[$€£¥]?\s*"
    r"(?:/|\bper\b)\s*(?P<unit>\S+)\s*$",
    re.IGNORECASE,
)


def parse_money_per_energy(text, option: str = "--energy-price") -> float:
    """Read an energy price such as ``"0.12/kWh"`` and return money per joule.

    Parameters
    ----------
    text : str
        A price, ``<number>/<energy unit>`` or ``<number> per <energy unit>``; an optional
        currency sign (``$ € £ ¥``) before or after the number is ignored.  Units as in
        :func:`energy_unit_joules`.
    option : str
        Name of the input for error messages.

    Returns
    -------
    float
        Price per joule [currency/J], in whatever currency the number is in.

    Examples
    --------
    >>> round(parse_money_per_energy("0.12/kWh") * 3.6e6, 6)
    0.12
    >>> round(parse_money_per_energy("$1.05 per therm") * 1e9, 4)
    9.9521
    """
    examples = "use e.g. 0.12/kWh, 1.05/therm or 9/GJ"
    shown = "" if text is None else str(text).strip()
    if shown == "":
        raise InputError(option, f"the energy price is missing; {examples}")
    unreadable = InputError(option, f'cannot read "{shown}" as an energy price; {examples}')
    match = _PRICE_RE.match(shown)
    if not match:
        raise unreadable
    try:
        joules = energy_unit_joules(match["unit"])
    except InputError:
        raise unreadable from None
    value = float(match["number"]) / joules
    if not math.isfinite(value):
        raise InputError(option, f'"{_clip(shown)}" is not a finite number per unit of energy')
    if value * 3.6e6 > MAX_PER_KWH:
        raise InputError(option, f'"{_clip(shown)}" is out of range; give at most {_nice(MAX_PER_KWH)} per kWh '
                                 "(in any currency or kg)")
    return value


#: Largest price (or emission factor) per kWh read by :func:`parse_money_per_energy`: far above
#: any energy price in any currency (a unit slip or an overflow, not a price).
MAX_PER_KWH = 1e6


# --------------------------------------------------------------------------------------
# Showing results
# --------------------------------------------------------------------------------------
def _as_output(values):
    import numpy as np

    return float(values) if np.ndim(values) == 0 else values


def to_display(value_si, kind: str, units: str = "si"):
    """Convert SI values (°C for temperatures) to the display unit of a unit system.

    Parameters
    ----------
    value_si : float or array_like
        Values in SI (see :func:`parse_quantity` for each kind's SI unit).
    kind : str
        One of :data:`DISPLAY_KINDS`.
    units : {"si", "us"}
        Unit system; :func:`unit_label` names the unit shown.

    Returns
    -------
    float or numpy.ndarray
        A float for scalar input, else an array of the input's shape.

    Examples
    --------
    >>> to_display(100.0, "temperature", "us")
    212.0
    >>> to_display([0.0254, 0.0508], "thickness", "us")
    array([1., 2.])
    >>> to_display(3.6e6, "energy", "si")
    1.0
    """
    import numpy as np  # imported here: keeps "pipeins --help" fast

    spec = _get_kind(kind, display=True)
    system = _check_system(units)
    values = np.asarray(value_si, dtype=float)
    if kind == "temperature":
        out = values if system == "si" else values / _DEGF_DIFFERENCE_K + 32.0
    else:
        out = values / spec.display[system][1]
    return _as_output(out)


def from_display(value, kind: str, units: str = "si"):
    """Inverse of :func:`to_display`: display-unit values back to SI.

    Examples
    --------
    >>> from_display(212.0, "temperature", "us")
    100.0
    >>> from_display(2.0, "thickness", "us")
    0.0508
    """
    import numpy as np  # imported here: keeps "pipeins --help" fast

    spec = _get_kind(kind, display=True)
    system = _check_system(units)
    values = np.asarray(value, dtype=float)
    if kind == "temperature":
        out = values if system == "si" else (values - 32.0) * _DEGF_DIFFERENCE_K
    else:
        out = values * spec.display[system][1]
    return _as_output(out)


def unit_label(kind: str, units: str = "si") -> str:
    """Label of the unit :func:`to_display` shows, e.g. ``"mm"`` or ``"Btu/(h·ft)"``.

    Examples
    --------
    >>> unit_label("thickness", "si"), unit_label("heat_flow_per_length", "us")
    ('mm', 'Btu/(h·ft)')
    """
    return _get_kind(kind, display=True).display[_check_system(units)][0]


def format_quantity(value_si, kind: str, units: str = "si", digits: int | None = None):
    """Text for a report: the value in display units, rounded, with its unit label.

    Parameters
    ----------
    value_si : float or array_like
        Value(s) in SI.
    kind : str
        One of :data:`DISPLAY_KINDS`.
    units : {"si", "us"}
        Unit system.
    digits : int, optional
        Decimal places; default depends on kind and system (e.g. 0 for mm, 2 for inches,
        1 for temperatures).  A thickness in inches is shown with one decimal more than
        asked and never fewer than two (an inch is 25.4 mm: 1.0 in would hide a pick
        between 1 and 1.5 in).  An outside diameter in inches that the inch tables list
        (NPS 1/8 to 12) is shown as they print it: NPS 2 is 2.375 in, not the 2.374 in
        its rounded 60.3 mm converts to.

    Returns
    -------
    str or list of str
        ``"<value> <label>"``; a list for array input.

    Examples
    --------
    >>> format_quantity(0.0508, "thickness", "si")
    '51 mm'
    >>> format_quantity(0.0508, "thickness", "us")
    '2.00 in'
    >>> format_quantity([20.0, 100.0], "temperature", "us", digits=0)
    ['68 °F', '212 °F']
    >>> format_quantity(0.0603, "diameter", "us"), format_quantity(0.0254, "thickness", "us", 1)
    ('2.375 in', '1.00 in')
    """
    import numpy as np  # imported here: keeps "pipeins --help" fast

    system = _check_system(units)
    shown = to_display(value_si, kind, system)
    places = _DEFAULT_DIGITS[(kind, system)] if digits is None else int(digits)
    if kind == "thickness" and system == "us" and digits is not None:
        places = max(2, places + 1)
    label = unit_label(kind, system)
    if kind == "diameter" and system == "us":
        snapped = [_inch_table_value(float(v)) for v in np.ravel(value_si)]
        shown = np.where([x is not None for x in snapped],
                         [x if x is not None else 0.0 for x in snapped], np.ravel(shown))
        shown = float(shown[0]) if np.ndim(value_si) == 0 else shown

    def one(v):
        if not math.isfinite(v):
            return "–"  # never "nan" or "inf" in a report
        text = f"{v:.{places}f}"
        if text.startswith("-") and float(text) == 0.0:
            text = text[1:]  # no "-0.0"
        return f"{text} {label}"

    if np.ndim(shown) == 0:
        return one(shown)
    return [one(v) for v in np.ravel(shown)]
