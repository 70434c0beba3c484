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

from .definitions import _DEFAULT_DIGITS, DISPLAY_KINDS, KINDS, RANGES, UNIT_SYSTEMS, Flow  # noqa: F401
from .display import format_quantity, from_display, to_display, unit_label
from .parser import (
    MAX_PER_KWH,
    energy_unit_joules,
    material_in_si,
    parse_money_per_energy,
    parse_number,
    parse_quantity,
)

__all__ = [
    "UNIT_SYSTEMS",
    "KINDS",
    "DISPLAY_KINDS",
    "Flow",
    "RANGES",
    "MAX_PER_KWH",
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
