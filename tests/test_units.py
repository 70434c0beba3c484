"""Tests for pipeins.units: every factor and suffix against pint, error lines, round trips.

pint (a test dependency only) is the outside reference for each conversion; ids name it.
"""

from __future__ import annotations

import math

import numpy as np
import pint
import pytest
from hypothesis import assume, given, settings
from hypothesis import strategies as st

from pipeins.errors import InputError
from pipeins.units.definitions import FLOORS
from pipeins.units import (
    DISPLAY_KINDS,
    KINDS,
    RANGES,
    UNIT_SYSTEMS,
    Flow,
    energy_unit_joules,
    format_quantity,
    from_display,
    parse_money_per_energy,
    parse_quantity,
    to_display,
    unit_label,
)

ureg = pint.UnitRegistry()
Q_ = ureg.Quantity
ATM_PA = Q_(1, "atm").to("Pa").magnitude  # gauge offset, pint's standard atmosphere


def pint_si(value, unit, target):
    return Q_(value, unit).to(target).magnitude


# --------------------------------------------------------------------------------------
# Every suffix vs pint: (text, kind, expected SI value computed by pint)
# --------------------------------------------------------------------------------------
SUFFIX_CASES = [
    # temperature (levels) -> °C
    ("180F", "temperature", lambda: pint_si(180, "degF", "degC")),
    ("180 °F", "temperature", lambda: pint_si(180, "degF", "degC")),
    ("180degF", "temperature", lambda: pint_si(180, "degF", "degC")),
    ("-40 F", "temperature", lambda: pint_si(-40, "degF", "degC")),
    ("122℉", "temperature", lambda: pint_si(122, "degF", "degC")),
    ("300K", "temperature", lambda: pint_si(300, "kelvin", "degC")),
    ("300 k", "temperature", lambda: pint_si(300, "kelvin", "degC")),
    ("540R", "temperature", lambda: pint_si(540, "degR", "degC")),
    ("25C", "temperature", lambda: pint_si(25, "degC", "degC")),
    ("25 °C", "temperature", lambda: pint_si(25, "degC", "degC")),
    ("25degC", "temperature", lambda: pint_si(25, "degC", "degC")),
    ("25 deg C", "temperature", lambda: pint_si(25, "degC", "degC")),
    # temperature differences -> K
    ("18F", "temperature_difference", lambda: pint_si(18, "delta_degF", "K")),
    ("18 °F", "temperature_difference", lambda: pint_si(18, "delta_degF", "K")),
    ("18 degF", "temperature_difference", lambda: pint_si(18, "delta_degF", "K")),
    ("18R", "temperature_difference", lambda: pint_si(18, "degR", "K")),
    ("10C", "temperature_difference", lambda: pint_si(10, "delta_degC", "K")),
    ("10 degC", "temperature_difference", lambda: pint_si(10, "delta_degC", "K")),
    ("10K", "temperature_difference", lambda: pint_si(10, "K", "K")),
    # thickness / diameter / length -> m
    ("2in", "thickness", lambda: pint_si(2, "inch", "m")),
    ('2"', "thickness", lambda: pint_si(2, "inch", "m")),
    ("2 inches", "thickness", lambda: pint_si(2, "inch", "m")),
    ("1-1/2in", "thickness", lambda: pint_si(1.5, "inch", "m")),
    ("1 1/2 in", "thickness", lambda: pint_si(1.5, "inch", "m")),
    ("3/4in", "thickness", lambda: pint_si(0.75, "inch", "m")),
    ("1.5 in", "thickness", lambda: pint_si(1.5, "inch", "m")),
    ("50mm", "thickness", lambda: pint_si(50, "mm", "m")),
    ("50 MM", "thickness", lambda: pint_si(50, "mm", "m")),
    ("5cm", "thickness", lambda: pint_si(5, "cm", "m")),
    ("0.05m", "thickness", lambda: pint_si(0.05, "m", "m")),
    ("1e-3 m", "thickness", lambda: pint_si(1e-3, "m", "m")),
    ("0.25ft", "thickness", lambda: pint_si(0.25, "ft", "m")),
    ("4.5in", "diameter", lambda: pint_si(4.5, "inch", "m")),
    ("114.3 mm", "diameter", lambda: pint_si(114.3, "mm", "m")),
    ("100ft", "length", lambda: pint_si(100, "ft", "m")),
    ("100 feet", "length", lambda: pint_si(100, "ft", "m")),
    ("1.2 km", "length", lambda: pint_si(1.2, "km", "m")),
    ("30 m", "length", lambda: pint_si(30, "m", "m")),
    # speed -> m/s
    ("3 m/s", "speed", lambda: pint_si(3, "m/s", "m/s")),
    ("10 km/h", "speed", lambda: pint_si(10, "km/hour", "m/s")),
    ("10 kph", "speed", lambda: pint_si(10, "km/hour", "m/s")),
    ("7 mph", "speed", lambda: pint_si(7, "mph", "m/s")),
    ("5 ft/s", "speed", lambda: pint_si(5, "ft/s", "m/s")),
    ("200 ft/min", "speed", lambda: pint_si(200, "ft/minute", "m/s")),
    ("200 fpm", "speed", lambda: pint_si(200, "ft/minute", "m/s")),
    # pressure -> Pa absolute
    ("500 Pa", "pressure", lambda: pint_si(500, "Pa", "Pa")),
    ("101.325 kPa", "pressure", lambda: pint_si(101.325, "kPa", "Pa")),
    ("101.325 KPA", "pressure", lambda: pint_si(101.325, "kPa", "Pa")),
    ("1.2 MPa", "pressure", lambda: pint_si(1.2, "MPa", "Pa")),
    ("1013 hPa", "pressure", lambda: pint_si(1013, "hPa", "Pa")),
    ("1013 mbar", "pressure", lambda: pint_si(1013, "mbar", "Pa")),
    ("10 bar", "pressure", lambda: pint_si(10, "bar", "Pa")),
    ("10 bara", "pressure", lambda: pint_si(10, "bar", "Pa")),
    ("10 barg", "pressure", lambda: pint_si(10, "bar", "Pa") + ATM_PA),
    ("10 bar(g)", "pressure", lambda: pint_si(10, "bar", "Pa") + ATM_PA),
    ("200 kPag", "pressure", lambda: pint_si(200, "kPa", "Pa") + ATM_PA),
    ("1 MPag", "pressure", lambda: pint_si(1, "MPa", "Pa") + ATM_PA),
    ("14.7 psi", "pressure", lambda: pint_si(14.7, "psi", "Pa")),
    ("14.7 psia", "pressure", lambda: pint_si(14.7, "psi", "Pa")),
    ("150 psig", "pressure", lambda: pint_si(150, "psi", "Pa") + ATM_PA),
    ("29.92 inHg", "pressure", lambda: pint_si(29.92, "inHg", "Pa")),
    ("760 mmHg", "pressure", lambda: pint_si(760, "mmHg", "Pa")),
    ("760 torr", "pressure", lambda: pint_si(760, "torr", "Pa")),
    ("1 atm", "pressure", lambda: pint_si(1, "atm", "Pa")),
    # heat flow per length -> W/m
    ("45 W/m", "heat_flow_per_length", lambda: pint_si(45, "W/m", "W/m")),
    ("50 Btu/h/ft", "heat_flow_per_length", lambda: pint_si(50, "Btu_it/hour/ft", "W/m")),
    ("50 Btu/(h*ft)", "heat_flow_per_length", lambda: pint_si(50, "Btu_it/hour/ft", "W/m")),
    ("50 Btu/hr-ft", "heat_flow_per_length", lambda: pint_si(50, "Btu_it/hour/ft", "W/m")),
    ("50 Btu/(h·ft)", "heat_flow_per_length", lambda: pint_si(50, "Btu_it/hour/ft", "W/m")),
    ("50 BTU/HR/FT", "heat_flow_per_length", lambda: pint_si(50, "Btu_it/hour/ft", "W/m")),
    # heat flux -> W/m²
    ("100 W/m2", "heat_flux", lambda: pint_si(100, "W/m**2", "W/m**2")),
    ("100 W/m^2", "heat_flux", lambda: pint_si(100, "W/m**2", "W/m**2")),
    ("30 Btu/h/ft2", "heat_flux", lambda: pint_si(30, "Btu_it/hour/ft**2", "W/m**2")),
    ("30 Btu/(h·ft²)", "heat_flux", lambda: pint_si(30, "Btu_it/hour/ft**2", "W/m**2")),
    # heat transfer coefficient -> W/(m²·K)
    ("10 W/m2K", "heat_transfer_coefficient", lambda: 10.0),
    ("10 W/(m2*K)", "heat_transfer_coefficient", lambda: 10.0),
    ("10 W/(m²·K)", "heat_transfer_coefficient", lambda: 10.0),
    ("1.8 Btu/h/ft2/F", "heat_transfer_coefficient",
     lambda: pint_si(1.8, "Btu_it/(hour*ft**2*delta_degF)", "W/(m**2*K)")),
    ("1.8 Btu/(h·ft²·°F)", "heat_transfer_coefficient",
     lambda: pint_si(1.8, "Btu_it/(hour*ft**2*delta_degF)", "W/(m**2*K)")),
    ("1.8 Btu/hr-ft2-F", "heat_transfer_coefficient",
     lambda: pint_si(1.8, "Btu_it/(hour*ft**2*delta_degF)", "W/(m**2*K)")),
    # conductivity -> W/(m·K)
    ("0.04 W/mK", "conductivity", lambda: 0.04),
    ("0.04 W/(m*K)", "conductivity", lambda: 0.04),
    ("0.04 W/(m·K)", "conductivity", lambda: 0.04),
    ("0.28 Btu*in/(h*ft2*F)", "conductivity",
     lambda: pint_si(0.28, "Btu_it*inch/(hour*ft**2*delta_degF)", "W/(m*K)")),
    ("0.28 Btu·in/(h·ft²·°F)", "conductivity",
     lambda: pint_si(0.28, "Btu_it*inch/(hour*ft**2*delta_degF)", "W/(m*K)")),
    ("0.023 Btu/h/ft/F", "conductivity",
     lambda: pint_si(0.023, "Btu_it/(hour*ft*delta_degF)", "W/(m*K)")),
    # time -> s
    ("90 s", "time", lambda: pint_si(90, "s", "s")),
    ("30 min", "time", lambda: pint_si(30, "minute", "s")),
    ("8760 h", "time", lambda: pint_si(8760, "hour", "s")),
    ("8760 hr", "time", lambda: pint_si(8760, "hour", "s")),
    ("2d", "time", lambda: pint_si(2, "day", "s")),
    ("2 day", "time", lambda: pint_si(2, "day", "s")),
    # energy -> J (Btu is the International Table Btu: pint's Btu_it)
    ("5 J", "energy", lambda: pint_si(5, "J", "J")),
    ("5 kJ", "energy", lambda: pint_si(5, "kJ", "J")),
    ("5 MJ", "energy", lambda: pint_si(5, "MJ", "J")),
    ("5 GJ", "energy", lambda: pint_si(5, "GJ", "J")),
    ("5 kWh", "energy", lambda: pint_si(5, "kWh", "J")),
    ("5 MWh", "energy", lambda: pint_si(5, "MWh", "J")),
    ("5 Btu", "energy", lambda: pint_si(5, "Btu_it", "J")),
    ("5 therm", "energy", lambda: pint_si(5e5, "Btu_it", "J")),
    ("5 MMBtu", "energy", lambda: pint_si(5e6, "Btu_it", "J")),
    # power -> W
    ("5 W", "power", lambda: pint_si(5, "W", "W")),
    ("5 kW", "power", lambda: pint_si(5, "kW", "W")),
    ("5 KW", "power", lambda: pint_si(5, "kW", "W")),
    ("5 MW", "power", lambda: pint_si(5, "MW", "W")),
    ("1700 Btu/h", "power", lambda: pint_si(1700, "Btu_it/hour", "W")),
    ("1700 Btu/hr", "power", lambda: pint_si(1700, "Btu_it/hour", "W")),
    ("12 MBH", "power", lambda: pint_si(12e3, "Btu_it/hour", "W")),
    ("3 ton", "power", lambda: pint_si(36e3, "Btu_it/hour", "W")),
]


@pytest.mark.parametrize(
    "text, kind, expected",
    [pytest.param(t, k, e, id=f"pint:{k}:{t}") for t, k, e in SUFFIX_CASES],
)
def test_suffix_against_pint(text, kind, expected):
    assert parse_quantity(text, kind) == pytest.approx(expected(), rel=1e-12, abs=1e-12)


FLOW_CASES = [
    ("5 m3/h", "volume", lambda: pint_si(5, "m**3/hour", "m**3/s")),
    ("5 m³/h", "volume", lambda: pint_si(5, "m**3/hour", "m**3/s")),
    ("0.01 m3/s", "volume", lambda: pint_si(0.01, "m**3/s", "m**3/s")),
    ("2 L/s", "volume", lambda: pint_si(2, "L/s", "m**3/s")),
    ("2 l/s", "volume", lambda: pint_si(2, "L/s", "m**3/s")),
    ("40 L/min", "volume", lambda: pint_si(40, "L/minute", "m**3/s")),
    ("20 gpm", "volume", lambda: pint_si(20, "gallon/minute", "m**3/s")),
    ("20 gal/min", "volume", lambda: pint_si(20, "gallon/minute", "m**3/s")),
    ("300 cfm", "volume", lambda: pint_si(300, "ft**3/minute", "m**3/s")),
    ("2 kg/s", "mass", lambda: pint_si(2, "kg/s", "kg/s")),
    ("7200 kg/h", "mass", lambda: pint_si(7200, "kg/hour", "kg/s")),
    ("5000 lb/h", "mass", lambda: pint_si(5000, "lb/hour", "kg/s")),
    ("5000 lb/hr", "mass", lambda: pint_si(5000, "lb/hour", "kg/s")),
    ("3 t/h", "mass", lambda: pint_si(3, "tonne/hour", "kg/s")),
]


@pytest.mark.parametrize(
    "text, basis, expected",
    [pytest.param(t, b, e, id=f"pint:flow:{t}") for t, b, e in FLOW_CASES],
)
def test_flow_against_pint(text, basis, expected):
    flow = parse_quantity(text, "flow")
    assert isinstance(flow, Flow)
    assert flow.basis == basis
    assert flow.value_si == pytest.approx(expected(), rel=1e-12)


@pytest.mark.parametrize(
    "text, kind, expected",
    [
        # pint's ton_of_refrigeration is built on its ISO Btu (1055.056 J), ours on Btu_IT
        pytest.param("1 ton", "power", lambda: pint_si(1, "ton_of_refrigeration", "W"),
                     id="pint:ton_of_refrigeration"),
        # NIST's US therm (pint US_therm, 1.054804e8 J) is based on the 59 °F Btu; we use
        # 100 000 Btu_IT as gas is billed: the two differ by 2.4e-4 relative.
        pytest.param("1 therm", "energy", lambda: pint_si(1, "US_therm", "J"),
                     id="pint:US_therm"),
    ],
)
def test_btu_variants_close_to_pint(text, kind, expected):
    assert parse_quantity(text, kind) == pytest.approx(expected(), rel=3e-4)


@pytest.mark.parametrize(
    "text, kind, expected",
    [
        # NIST SP 811 (2008) Appendix B.9 factors, 7 significant digits (from memory)
        pytest.param("1 psi", "pressure", 6.894757e3, id="NIST SP 811 B.9 psi (from memory)"),
        pytest.param("1 inHg", "pressure", 3.386389e3, id="NIST SP 811 B.9 inHg 32F (from memory)"),
        pytest.param("1 Btu", "energy", 1.055056e3, id="NIST SP 811 B.9 Btu_IT (from memory)"),
        pytest.param("1 Btu/h", "power", 2.930711e-1, id="NIST SP 811 B.9 Btu_IT/h (from memory)"),
        pytest.param("1 Btu/h/ft2/F", "heat_transfer_coefficient", 5.678263,
                     id="NIST SP 811 B.9 Btu_IT/(h ft2 F) (from memory)"),
        pytest.param("1 Btu*in/(h*ft2*F)", "conductivity", 1.442279e-1,
                     id="NIST SP 811 B.9 Btu_IT in/(h ft2 F) (from memory)"),
        pytest.param("1 ton", "power", 3.516853e3, id="NIST SP 811 B.9 ton refrigeration (from memory)"),
    ],
)
def test_factors_against_nist_sp811(text, kind, expected):
    assert parse_quantity(text, kind) == pytest.approx(expected, rel=1e-6)


# --------------------------------------------------------------------------------------
# Bare numbers, percentages, units systems
# --------------------------------------------------------------------------------------
@pytest.mark.parametrize(
    "text, kind, units, expected",
    [
        pytest.param("150", "temperature", "si", lambda: 150.0, id="bare si degC"),
        pytest.param("300", "temperature", "us", lambda: pint_si(300, "degF", "degC"), id="pint:bare us degF"),
        pytest.param("10", "temperature_difference", "us", lambda: pint_si(10, "delta_degF", "K"),
                     id="pint:bare us delta_degF"),
        pytest.param("50", "thickness", "si", lambda: pint_si(50, "mm", "m"), id="pint:bare si mm"),
        pytest.param("2", "thickness", "us", lambda: pint_si(2, "inch", "m"), id="pint:bare us in"),
        pytest.param("4.5", "diameter", "us", lambda: pint_si(4.5, "inch", "m"), id="pint:bare us diameter in"),
        pytest.param("30", "length", "si", lambda: 30.0, id="bare si length m"),
        pytest.param("100", "length", "us", lambda: pint_si(100, "ft", "m"), id="pint:bare us ft"),
        pytest.param("3", "speed", "si", lambda: 3.0, id="bare si m/s"),
        pytest.param("7", "speed", "us", lambda: pint_si(7, "mph", "m/s"), id="pint:bare us mph"),
        pytest.param("101.325", "pressure", "si", lambda: 101325.0, id="bare si kPa"),
        pytest.param("14.7", "pressure", "us", lambda: pint_si(14.7, "psi", "Pa"), id="pint:bare us psia"),
        pytest.param("50", "heat_flow_per_length", "us", lambda: pint_si(50, "Btu_it/hour/ft", "W/m"),
                     id="pint:bare us Btu/(h ft)"),
        pytest.param("1.8", "heat_transfer_coefficient", "us",
                     lambda: pint_si(1.8, "Btu_it/(hour*ft**2*delta_degF)", "W/(m**2*K)"),
                     id="pint:bare us Btu/(h ft2 F)"),
        pytest.param("0.28", "conductivity", "us",
                     lambda: pint_si(0.28, "Btu_it*inch/(hour*ft**2*delta_degF)", "W/(m*K)"),
                     id="pint:bare us Btu in/(h ft2 F)"),
        pytest.param("8760", "time", "si", lambda: pint_si(8760, "hour", "s"), id="pint:bare si hours"),
        pytest.param("8760", "time", "us", lambda: pint_si(8760, "hour", "s"), id="pint:bare us hours"),
        pytest.param("1700", "power", "us", lambda: pint_si(1700, "Btu_it/hour", "W"), id="pint:bare us Btu/h"),
        pytest.param("4", "energy", "us", lambda: pint_si(4e6, "Btu_it", "J"), id="pint:bare us MMBtu"),
        pytest.param("1200", "energy", "si", lambda: pint_si(1200, "kWh", "J"), id="pint:bare si kWh"),
        pytest.param(2, "thickness", "us", lambda: pint_si(2, "inch", "m"), id="pint:number from project file"),
    ],
)
def test_bare_number_reads_in_system_display_unit(text, kind, units, expected):
    assert parse_quantity(text, kind, units=units) == pytest.approx(expected(), rel=1e-12)


@pytest.mark.parametrize(
    "text, expected",
    [
        pytest.param("50", 50.0, id="bare percent (project convention)"),
        pytest.param("50%", 50.0, id="percent sign (project convention)"),
        pytest.param("50 %", 50.0, id="percent sign spaced (project convention)"),
        pytest.param("0.5 %", 0.5, id="0.5 % with the sign is half a percent (project convention)"),
        pytest.param("1.5", 1.5, id="a bare value above 1 is percent (project convention)"),
    ],
)
def test_percent(text, expected):
    assert parse_quantity(text, "percent") == expected


def test_absolute_zero_itself_is_allowed():
    # pint: 0 K = -273.15 degC = -459.67 degF
    assert parse_quantity("0 K", "temperature") == pint_si(0, "K", "degC")
    assert parse_quantity("-459.67F", "temperature") == pytest.approx(pint_si(-459.67, "degF", "degC"))


def test_case_rules_for_mega():
    assert parse_quantity("1.2 MPA", "pressure") == pint_si(1.2, "MPa", "Pa")  # pint
    assert parse_quantity("2 MWH", "energy") == pint_si(2, "MWh", "J")  # pint


# --------------------------------------------------------------------------------------
# Error lines, asserted exactly
# --------------------------------------------------------------------------------------
@pytest.mark.parametrize(
    "text, kind, option, units, message",
    [
        pytest.param("5 parsecs", "length", "--length", "si",
                     '--length: cannot read "5 parsecs" as a length; use e.g. 30m, 100ft or 1500mm',
                     id="unknown unit"),
        pytest.param("5 m/s", "thickness", "--thickness", "si",
                     '--thickness: cannot read "5 m/s" as a thickness; use e.g. 50mm, 2in or 0.05m',
                     id="wrong kind of unit"),
        pytest.param("", "thickness", "--thickness", "si",
                     "--thickness: the thickness is missing; use e.g. 50mm, 2in or 0.05m",
                     id="empty"),
        pytest.param("   ", "temperature", "--ambient", "si",
                     "--ambient: the temperature is missing; use e.g. 150C, 300F or 423K",
                     id="blank"),
        pytest.param("-500F", "temperature", "--fluid-temp", "si",
                     '--fluid-temp: "-500F" is below absolute zero (-273.15 °C, -459.67 °F, 0 K)',
                     id="below absolute zero F"),
        pytest.param("-1 K", "temperature", "--fluid-temp", "si",
                     '--fluid-temp: "-1 K" is below absolute zero (-273.15 °C, -459.67 °F, 0 K)',
                     id="below absolute zero K"),
        pytest.param("-280", "temperature", "--fluid-temp", "si",
                     '--fluid-temp: "-280" is below absolute zero (-273.15 °C, -459.67 °F, 0 K)',
                     id="below absolute zero bare"),
        pytest.param("5", "flow", "--flow", "si",
                     '--flow: "5" needs a unit; use e.g. 2kg/s, 5m3/h or 20gpm',
                     id="bare flow"),
        pytest.param("2 m", "flow", "--flow", "si",
                     '--flow: cannot read "2 m" as a flow; use e.g. 2kg/s, 5m3/h or 20gpm',
                     id="flow of wrong kind"),
        pytest.param("-2 bar", "pressure", "--pressure", "si",
                     '--pressure: "-2 bar" is below zero absolute pressure; bar, psi and kPa mean '
                     "absolute (write barg, psig or kPag for gauge)",
                     id="negative absolute pressure"),
        pytest.param("5 mpa", "pressure", "--pressure", "si",
                     '--pressure: cannot read "5 mpa" as a pressure (write "MPa": lower-case m '
                     "means milli); use e.g. 101.325kPa, 10barg or 150psig",
                     id="milli vs mega pressure"),
        pytest.param("5 mwh", "energy", "--energy", "si",
                     '--energy: cannot read "5 mwh" as an energy (write "MWh": lower-case m '
                     "means milli); use e.g. 1200kWh, 5GJ or 4MMBtu",
                     id="milli vs mega energy"),
        pytest.param("fifty", "percent", "--rh", "si",
                     '--rh: cannot read "fifty" as a percentage; use e.g. 50, 50% or 12.5%',
                     id="no number"),
        pytest.param("1 1/0 in", "thickness", "--thickness", "si",
                     '--thickness: cannot read "1 1/0 in" as a thickness; use e.g. 50mm, 2in or 0.05m',
                     id="zero denominator"),
        pytest.param("2 ft 6 in", "length", "--length", "si",
                     '--length: cannot read "2 ft 6 in" as a length; use e.g. 30m, 100ft or 1500mm',
                     id="feet and inches not combined"),
        pytest.param("50 mm", "thickness", "--thickness", "metric",
                     'units: unknown unit system "metric"; use "si" or "us"',
                     id="unknown unit system"),
    ],
)
def test_error_lines(text, kind, option, units, message):
    with pytest.raises(InputError) as info:
        parse_quantity(text, kind, option, units=units)
    assert str(info.value) == message


def test_error_carries_option_name():
    with pytest.raises(InputError) as info:
        parse_quantity("5 parsecs", "length", "--length")
    assert info.value.name == "--length"
    assert info.value.message.startswith('cannot read "5 parsecs"')


def test_unknown_kind_names_close_kinds():
    with pytest.raises(InputError, match='unknown quantity kind "thicknes"; did you mean "thickness"'):
        parse_quantity("5 mm", "thicknes")


# --------------------------------------------------------------------------------------
# Prices
# --------------------------------------------------------------------------------------
@pytest.mark.parametrize(
    "name, expected",
    [
        pytest.param("kWh", lambda: pint_si(1, "kWh", "J"), id="pint:kWh"),
        pytest.param("MWh", lambda: pint_si(1, "MWh", "J"), id="pint:MWh"),
        pytest.param("MJ", lambda: pint_si(1, "MJ", "J"), id="pint:MJ"),
        pytest.param("GJ", lambda: pint_si(1, "GJ", "J"), id="pint:GJ"),
        pytest.param("therm", lambda: pint_si(1e5, "Btu_it", "J"), id="pint:therm=1e5 Btu_it"),
        pytest.param("MMBtu", lambda: pint_si(1e6, "Btu_it", "J"), id="pint:MMBtu=1e6 Btu_it"),
        pytest.param("mmbtu", lambda: pint_si(1e6, "Btu_it", "J"), id="pint:mmbtu any case"),
    ],
)
def test_energy_unit_joules(name, expected):
    assert energy_unit_joules(name) == pytest.approx(expected(), rel=1e-12)


@pytest.mark.parametrize(
    "text, expected",
    [
        pytest.param("0.12/kWh", lambda: 0.12 / pint_si(1, "kWh", "J"), id="pint:per kWh"),
        pytest.param("$1.05 per therm", lambda: 1.05 / pint_si(1e5, "Btu_it", "J"), id="pint:per therm"),
        pytest.param("9 €/GJ", lambda: 9 / pint_si(1, "GJ", "J"), id="pint:per GJ"),
        pytest.param("8/MMBtu", lambda: 8 / pint_si(1e6, "Btu_it", "J"), id="pint:per MMBtu"),
        pytest.param("60 / MWh", lambda: 60 / pint_si(1, "MWh", "J"), id="pint:per MWh"),
    ],
)
def test_money_per_energy(text, expected):
    assert parse_money_per_energy(text) == pytest.approx(expected(), rel=1e-12)


@pytest.mark.parametrize("text", ["0.12", "0.12/parsec", "0.12/mwh", "cheap"])
def test_money_per_energy_errors(text):
    with pytest.raises(InputError) as info:
        parse_money_per_energy(text, "--price")
    assert str(info.value) == (
        f'--price: cannot read "{text}" as an energy price; use e.g. 0.12/kWh, 1.05/therm or 9/GJ'
    )


# --------------------------------------------------------------------------------------
# Display side
# --------------------------------------------------------------------------------------
# kind -> (SI unit in pint, {system: display unit in pint})
DISPLAY_PINT = {
    "temperature_difference": ("K", {"si": "K", "us": "delta_degF"}),
    "thickness": ("m", {"si": "mm", "us": "inch"}),
    "diameter": ("m", {"si": "mm", "us": "inch"}),
    "length": ("m", {"si": "m", "us": "ft"}),
    "speed": ("m/s", {"si": "m/s", "us": "mph"}),
    "pressure": ("Pa", {"si": "kPa", "us": "psi"}),
    "heat_flow_per_length": ("W/m", {"si": "W/m", "us": "Btu_it/(hour*ft)"}),
    "heat_flux": ("W/m**2", {"si": "W/m**2", "us": "Btu_it/(hour*ft**2)"}),
    "heat_transfer_coefficient": ("W/(m**2*K)",
                                  {"si": "W/(m**2*K)", "us": "Btu_it/(hour*ft**2*delta_degF)"}),
    "conductivity": ("W/(m*K)", {"si": "W/(m*K)", "us": "Btu_it*inch/(hour*ft**2*delta_degF)"}),
    "thermal_resistance_per_length": ("m*K/W", {"si": "m*K/W", "us": "hour*ft*delta_degF/Btu_it"}),
    "time": ("s", {"si": "hour", "us": "hour"}),
    "percent": ("percent", {"si": "percent", "us": "percent"}),
    "mass_flow": ("kg/s", {"si": "kg/hour", "us": "lb/hour"}),
    "volume_flow": ("m**3/s", {"si": "m**3/hour", "us": "gallon/minute"}),
    "energy": ("J", {"si": "kWh", "us": "MMBtu_it"}),
    "power": ("W", {"si": "W", "us": "Btu_it/hour"}),
    "area": ("m**2", {"si": "m**2", "us": "ft**2"}),
    "area_per_length": ("m**2/m", {"si": "m**2/m", "us": "ft**2/ft"}),
}
ureg.define("MMBtu_it = 1e6 * Btu_it")

DISPLAY_CASES = [
    pytest.param(kind, system, id=f"pint:{kind}:{system}")
    for kind in DISPLAY_PINT
    for system in UNIT_SYSTEMS
]


@pytest.mark.parametrize("kind, system", DISPLAY_CASES)
def test_display_against_pint(kind, system):
    si_unit, shown = DISPLAY_PINT[kind]
    values = np.array([0.5, 3.0, 1234.5])
    expected = [Q_(v, si_unit).to(shown[system]).magnitude for v in values]
    np.testing.assert_allclose(to_display(values, kind, system), expected, rtol=1e-12)


@pytest.mark.parametrize(
    "value_c, system, expected",
    [
        pytest.param(100.0, "us", lambda: Q_(100.0, "degC").to("degF").magnitude, id="pint:degC->degF"),
        pytest.param(-40.0, "us", lambda: Q_(-40.0, "degC").to("degF").magnitude, id="pint:-40"),
        pytest.param(20.0, "si", lambda: 20.0, id="si stays degC"),
    ],
)
def test_temperature_display_against_pint(value_c, system, expected):
    assert to_display(value_c, "temperature", system) == pytest.approx(expected(), rel=1e-12)


def test_every_display_kind_covered_and_parsable():
    assert set(DISPLAY_PINT) | {"temperature"} == set(DISPLAY_KINDS)
    assert set(DISPLAY_KINDS) | {"flow", "steam_pressure", "efficiency"} == set(KINDS)


def test_display_is_vectorised():
    values = np.array([[20.0, 100.0], [0.0, -40.0]])
    out = to_display(values, "temperature", "us")
    assert isinstance(out, np.ndarray) and out.shape == (2, 2)
    np.testing.assert_allclose(out, Q_(values, "degC").to("degF").magnitude)  # pint
    assert isinstance(to_display(0.05, "thickness", "si"), float)


@pytest.mark.parametrize(
    "kind, system, label",
    [
        pytest.param("temperature", "si", "°C", id="project convention"),
        pytest.param("temperature", "us", "°F", id="project convention"),
        pytest.param("temperature_difference", "si", "K", id="project convention"),
        pytest.param("temperature_difference", "us", "°F", id="project convention"),
        pytest.param("thickness", "si", "mm", id="project convention"),
        pytest.param("thickness", "us", "in", id="project convention"),
        pytest.param("length", "us", "ft", id="project convention"),
        pytest.param("heat_flow_per_length", "si", "W/m", id="project convention"),
        pytest.param("heat_flow_per_length", "us", "Btu/(h·ft)", id="project convention"),
        pytest.param("heat_flux", "us", "Btu/(h·ft²)", id="project convention"),
        pytest.param("heat_transfer_coefficient", "us", "Btu/(h·ft²·°F)", id="project convention"),
        pytest.param("conductivity", "si", "W/(m·K)", id="project convention"),
        pytest.param("speed", "us", "mph", id="project convention"),
        pytest.param("power", "us", "Btu/h", id="project convention"),
        pytest.param("energy", "si", "kWh", id="project convention"),
        pytest.param("energy", "us", "MMBtu", id="project convention"),
        pytest.param("mass_flow", "si", "kg/h", id="project convention"),
        pytest.param("mass_flow", "us", "lb/h", id="project convention"),
    ],
)
def test_unit_labels(kind, system, label):  # project convention
    assert unit_label(kind, system) == label


@pytest.mark.parametrize(
    "value, kind, system, digits, text",
    [
        pytest.param(0.0508, "thickness", "si", None, "51 mm", id="format"),
        pytest.param(0.0508, "thickness", "us", None, "2.00 in", id="format"),
        pytest.param(100.0, "temperature", "us", None, "212.0 °F", id="format"),
        pytest.param(-0.01, "temperature", "si", None, "0.0 °C", id="format no minus zero"),
        pytest.param(48.0759, "heat_flow_per_length", "si", 2, "48.08 W/m", id="format digits"),
        pytest.param([20.0, 100.0], "temperature", "us", 0, ["68 °F", "212 °F"], id="format list"),
    ],
)
def test_format_quantity(value, kind, system, digits, text):  # project convention
    assert format_quantity(value, kind, system, digits) == text


# --------------------------------------------------------------------------------------
# Round trips: text in display units -> SI -> display units
# --------------------------------------------------------------------------------------
POSITIVE = st.floats(min_value=1e-3, max_value=1e6, allow_nan=False, allow_infinity=False)
LINEAR_KINDS = [k for k in DISPLAY_KINDS if k not in ("temperature", "mass_flow", "volume_flow")]


@settings(max_examples=150, deadline=None, derandomize=True)
@given(x=POSITIVE, kind=st.sampled_from(LINEAR_KINDS), system=st.sampled_from(UNIT_SYSTEMS),
       labelled=st.booleans())
def test_round_trip_parse_then_display(x, kind, system, labelled):
    assume(abs(from_display(x, kind, system)) <= RANGES[kind][1])  # inside the physical range
    assume(abs(from_display(x, kind, system)) >= FLOORS.get(kind, 0.0))  # and above its floor
    assume(kind != "percent" or labelled or x > 1)  # a bare 0 < x <= 1 is refused (see below)
    text = f"{x!r} {unit_label(kind, system)}" if labelled else repr(x)
    value_si = parse_quantity(text, kind, units=system)
    assert to_display(value_si, kind, system) == pytest.approx(x, rel=1e-12)


@settings(max_examples=60, deadline=None)
@given(x=POSITIVE, kind=st.sampled_from(["mass_flow", "volume_flow"]),
       system=st.sampled_from(UNIT_SYSTEMS))
def test_round_trip_flows(x, kind, system):
    label = unit_label(kind, system)
    value_si = parse_quantity(f"{x!r} {label}", kind, units=system)
    flow = parse_quantity(f"{x!r} {label}", "flow")
    assert flow.value_si == pytest.approx(value_si, rel=1e-15)
    assert flow.basis == kind.split("_")[0]
    assert to_display(value_si, kind, system) == pytest.approx(x, rel=1e-12)


@settings(max_examples=80, deadline=None)
@given(x=st.floats(min_value=-200.0, max_value=1200.0, allow_nan=False),
       system=st.sampled_from(UNIT_SYSTEMS), labelled=st.booleans())
def test_round_trip_temperature(x, system, labelled):
    text = f"{x!r}{unit_label('temperature', system)}" if labelled else repr(x)
    value_c = parse_quantity(text, "temperature", units=system)
    assert to_display(value_c, "temperature", system) == pytest.approx(x, rel=1e-12, abs=1e-9)


@settings(max_examples=60, deadline=None)
@given(x=POSITIVE, kind=st.sampled_from(list(DISPLAY_KINDS)), system=st.sampled_from(UNIT_SYSTEMS))
def test_from_display_inverts_to_display(x, kind, system):
    assert from_display(to_display(x, kind, system), kind, system) == pytest.approx(x, rel=1e-12)


@settings(max_examples=60, deadline=None)
@given(whole=st.integers(0, 40), num=st.integers(1, 15), den=st.sampled_from([2, 4, 8, 16]),
       sep=st.sampled_from(["-", " ", " - "]), suffix=st.sampled_from(["in", " in", '"', " inch"]))
def test_fractional_inches(whole, num, den, sep, suffix):
    text = f"{whole}{sep}{num}/{den}{suffix}" if whole else f"{num}/{den}{suffix}"
    expected = Q_(whole + num / den, "inch").to("m").magnitude  # pint
    assert parse_quantity(text, "thickness") == pytest.approx(expected, rel=1e-12)


def test_no_nan_sneaks_through():
    with pytest.raises(InputError):
        parse_quantity(math.nan, "length")
    with pytest.raises(InputError):
        parse_quantity("nan", "length")


# --------------------------------------------------------------------------------------
# The edge rules of percent, efficiency, steam pressure, ranges (exact lines)
# --------------------------------------------------------------------------------------
@pytest.mark.parametrize(
    "text, kind, units, line",
    [
        pytest.param("0.8", "percent", "si",
                     "--x: 0.8 is read as percent; did you mean 80 %? (write 0.8 % if you mean it)",
                     id="bare fraction refused"),
        pytest.param(0.05, "percent", "si",
                     "--x: 0.05 is read as percent; did you mean 5 %? (write 0.05 % if you mean it)",
                     id="bare float from a file refused"),
        pytest.param("-0.5", "percent", "si",
                     "--x: -0.5 is read as percent; did you mean -50 %? (write -0.5 % if you mean it)",
                     id="negative fraction refused"),
        pytest.param("10", "steam_pressure", "si",
                     '--x: "10" needs a unit that says gauge or absolute; write e.g. 10 barg (gauge) or '
                     "10 bara (absolute)", id="bare steam pressure"),
        pytest.param("150psi", "steam_pressure", "us",
                     '--x: "150psi" does not say gauge or absolute; write e.g. 150 psig (gauge) or '
                     "150 psia (absolute)", id="psi steam pressure"),
        pytest.param("10 atm", "steam_pressure", "si",
                     '--x: cannot read "10 atm" as a steam pressure, which must say gauge or absolute; '
                     "write e.g. 10 barg (gauge) or 10 bara (absolute)", id="atm steam pressure"),
        pytest.param("150 %", "efficiency", "si",
                     '--x: "150 %" is out of range; an efficiency is from 1 % to 100 % '
                     "(88 %, 88 and 0.88 all mean 88 %)", id="efficiency above 100 %"),
        pytest.param("1e999m", "length", "si", '--x: "1e999m" is not a finite length', id="inf length"),
        pytest.param(math.inf, "length", "si", '--x: "inf" is not a finite length', id="inf float"),
        pytest.param("1000m", "thickness", "si",
                     '--x: "1000m" is out of range; a thickness is at most 2,000 mm', id="1000 m layer"),
        pytest.param("100ft", "thickness", "us",
                     '--x: "100ft" is out of range; a thickness is at most 78.74 in', id="layer in us"),
        pytest.param("1e999C", "temperature", "si", '--x: "1e999C" is not a finite temperature',
                     id="inf temperature"),
        pytest.param("3000C", "temperature", "si",
                     '--x: "3000C" is out of range; a temperature is from -273.15 to 2,000 °C',
                     id="temperature range"),
        pytest.param("1" + "0" * 200, "length", "si",
                     '--x: "' + "1" + "0" * 58 + '…" is out of range; a length is at most 1,000,000 m',
                     id="200 digits"),
        pytest.param(10**400, "length", "si",
                     '--x: "' + "1" + "0" * 58 + '…" is not a finite length', id="huge integer from a file"),
        pytest.param("1e6%", "percent", "si",
                     '--x: "1e6%" is out of range; a percentage is at most 1,000 %', id="huge percentage"),
    ],
)
def test_edge_rule_lines(text, kind, units, line):
    with pytest.raises(InputError) as info:
        parse_quantity(text, kind, "--x", units)
    assert str(info.value) == line


@pytest.mark.parametrize(
    "text, expected",
    [
        pytest.param("10 barg", lambda: pint_si(10, "bar", "Pa") + ATM_PA, id="pint:barg"),
        pytest.param("10 bara", lambda: pint_si(10, "bar", "Pa"), id="pint:bara"),
        pytest.param("10 bar(g)", lambda: pint_si(10, "bar", "Pa") + ATM_PA, id="pint:bar(g)"),
        pytest.param("10 bar (a)", lambda: pint_si(10, "bar", "Pa"), id="pint:bar (a)"),
        pytest.param("10 bar gauge", lambda: pint_si(10, "bar", "Pa") + ATM_PA, id="pint:bar gauge"),
        pytest.param("10 bar abs", lambda: pint_si(10, "bar", "Pa"), id="pint:bar abs"),
        pytest.param("150 psig", lambda: pint_si(150, "psi", "Pa") + ATM_PA, id="pint:psig"),
        pytest.param("150 PSIA", lambda: pint_si(150, "psi", "Pa"), id="pint:psia"),
        pytest.param("1 MPa(a)", lambda: pint_si(1, "MPa", "Pa"), id="pint:MPa(a)"),
        pytest.param("1 MPag", lambda: pint_si(1, "MPa", "Pa") + ATM_PA, id="pint:MPag"),
        pytest.param("700 kPag", lambda: pint_si(700, "kPa", "Pa") + ATM_PA, id="pint:kPag"),
        pytest.param("700 kPa(a)", lambda: pint_si(700, "kPa", "Pa"), id="pint:kPa(a)"),
    ],
)
def test_steam_pressure_spellings_against_pint(text, expected):
    assert parse_quantity(text, "steam_pressure") == pytest.approx(expected(), rel=1e-12)


@pytest.mark.parametrize(
    "text, expected",
    [("88%", 0.88), ("88 %", 0.88), ("88", 0.88), ("0.88", 0.88), ("1", 1.0), ("100%", 1.0),
     ("1.5", 0.015), (0.92, 0.92), (92, 0.92)],
)
def test_efficiency_rule(text, expected):  # project rule: bare above 1 is percent, at most 1 a fraction
    assert parse_quantity(text, "efficiency") == pytest.approx(expected, rel=1e-12)


def test_air_pressure_stays_absolute():
    # an air pressure is absolute by nature: bar and kPa are accepted as they are
    assert parse_quantity("95 kPa", "pressure") == 95_000.0
    assert parse_quantity("1 bar", "pressure") == 100_000.0


@pytest.mark.parametrize(
    "text, units, number, unit",
    [
        pytest.param("k=0.25", "us", 0.25, "Btu_it*inch/(hour*ft**2*delta_degF)", id="pint:bare k in us"),
        pytest.param("k=0.25Btu·in/(h·ft²·°F)", "si", 0.25, "Btu_it*inch/(hour*ft**2*delta_degF)",
                     id="pint:Btu·in"),
        pytest.param("k=0.25 Btu-in/hr-ft2-F", "si", 0.25, "Btu_it*inch/(hour*ft**2*delta_degF)",
                     id="pint:Btu-in"),
        pytest.param("k = 0.036W/mK", "us", 0.036, "W/(m*K)", id="pint:W/mK in us"),
        pytest.param("k=0.04", "si", 0.04, "W/(m*K)", id="pint:bare k in si"),
    ],
)
def test_material_k_against_pint(text, units, number, unit):
    from pipeins.units import material_in_si

    expected = Q_(number, unit).to("W/(m*K)").magnitude
    out = material_in_si(text, units)
    assert out.startswith("k=")
    assert float(out[2:]) == pytest.approx(expected, rel=1e-5)  # six significant digits kept


def test_material_names_pass_unchanged():
    from pipeins.units import material_in_si

    assert material_in_si("mineral wool", "us") == "mineral wool"


def test_parse_quantity_narrower_range():
    with pytest.raises(InputError) as info:
        parse_quantity("1e9", "heat_transfer_coefficient", "--outer-h", low=0.1, high=1e4,
                       what="a fixed outer coefficient")
    assert str(info.value) == ('--outer-h: "1e9" is out of range; a fixed outer coefficient is from '
                               "0.1 to 10,000 W/(m²·K)")


# --------------------------------------------------------------------------------------
# Display precision: inch tables, inch thicknesses; aliases
# --------------------------------------------------------------------------------------
def test_inch_outside_diameters_as_the_inch_tables_print_them():
    # fluids.piping NPS_D1785/S40o_D1785 hold the IPS outside diameters of ASTM D1785 [mm],
    # converted exactly from the inch values ASME B36.10M prints; our steel table holds
    # B36.10M's mm column (60.3 for NPS 2), which must still show as the inch value.
    from fractions import Fraction

    import fluids.piping

    from pipeins.catalog.pipes import lookup_pipe

    checked = 0
    for nps, od_mm in zip(fluids.piping.NPS_D1785, fluids.piping.S40o_D1785):
        whole, part = divmod(Fraction(nps).limit_denominator(8), 1)
        label = "NPS " + ("-".join(x for x in (str(whole) if whole else "", str(part) if part else "") if x))
        expected = f"{od_mm / 25.4:.3f} in"
        assert format_quantity(lookup_pipe(label).outer_diameter_m, "diameter", "us") == expected, label
        checked += 1
    assert checked >= 18
    assert format_quantity(lookup_pipe("NPS 2").outer_diameter_m, "diameter", "us") == "2.375 in"


@pytest.mark.parametrize("value_m, digits, text", [
    (0.0254, 1, "1.00 in"), (0.0381, 1, "1.50 in"), (0.0254, None, "1.00 in"), (0.02546, 2, "1.002 in"),
    (0.0254, 0, "1.00 in"),
])
def test_inch_thickness_shows_the_pick(value_m, digits, text):  # project convention
    assert format_quantity(value_m, "thickness", "us", digits) == text


def test_no_nan_or_inf_in_text():
    assert format_quantity(math.inf, "heat_flow_per_length", "si") == "–"
    assert format_quantity(math.nan, "temperature", "us") == "–"


@pytest.mark.parametrize("name, key", [
    ("fiberglass", "glass_wool"), ("Fiberglass pipe section", "glass_wool"), ("fibreglass", "glass_wool"),
    ("rock wool", "mineral_wool"), ("stone wool", "mineral_wool"), ("calsil", "calcium_silicate"),
    ("polyiso", "polyisocyanurate_foam"), ("PIR", "polyisocyanurate_foam"), ("perlite", "expanded_perlite"),
])
def test_material_trade_words(name, key):  # common practice: trade names of material types
    from pipeins.catalog.materials import lookup_material

    assert lookup_material(name).key == key


@pytest.mark.parametrize("name, key", [
    ("aluminum, oxidized", "aluminium_weathered"), ("Aluminum, bright", "aluminium_bright"),
    ("galvanized steel, new", "galvanised_new"), ("painted steel, any color", "painted_steel"),
    ("ASJ", "paper_facing"), ("all-service jacket", "paper_facing"),
    ("stainless steel, oxidized", "stainless_weathered"),
])
def test_finish_us_spellings(name, key):  # common practice: US spellings and trade words
    from pipeins.catalog.finishes import lookup_finish

    assert lookup_finish(name).key == key


def test_every_trade_word_finds_a_catalogue_entry():
    from pipeins.catalog.aliases import TRADE_WORDS
    from pipeins.catalog.finishes import lookup_finish
    from pipeins.catalog.materials import lookup_material

    for word in TRADE_WORDS:
        found = []
        for lookup in (lookup_material, lookup_finish):
            try:
                found.append(lookup(word))
            except InputError:
                pass
        assert found, word
