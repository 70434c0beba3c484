"""Code-minimum insulation thickness: rule sets stored as data, looked up by service and size.

A *rule set* is a CSV table (shipped in ``tables/code_*.csv`` or supplied by the user) with one
row per (fluid-temperature band, pipe-size band).  Each row gives the minimum thickness for an
insulation whose conductivity, at the row's mean rating temperature, lies in the row's
conductivity range; a material outside that range gets the equivalent thickness from
:func:`adjusted_thickness_m`.  Shipped rule sets (all values from memory; the adopted edition or
the law in force governs):

``ashrae-90.1-2019``
    ASHRAE Standard 90.1-2019 Tables 6.8.3-1 (heating and hot-water systems) and 6.8.3-2
    (cooling systems); IECC C403.11.3 repeats them.  Stored in the standard's own units
    (°F, inch, Btu·in/(h·ft²·°F)).
``de-geg-annex-8``
    The German building-energy rules' pipe-insulation annex (GEG 2020 Anlage 8): thickness
    tied to the inner diameter at a reference conductivity of 0.035 W/(m·K).

Table shape (columns; a rule set picks one unit variant per quantity)
--------------------------------------------------------------------
``rule_set``, ``service`` (``heating`` / ``cooling``), ``fluid_temp_range_c`` or
``fluid_temp_range_f``, ``conductivity_min_w_mk`` + ``conductivity_max_w_mk`` or
``conductivity_min_btu_in_h_ft2_f`` + ``conductivity_max_btu_in_h_ft2_f``,
``mean_rating_temp_c`` or ``mean_rating_temp_f``, one size band column of ``nps_range_in``,
``dn_range``, ``inner_diameter_range_mm`` or ``outer_diameter_range_mm``, ``thickness_mm`` or
``thickness_in``, optional ``thickness_rule`` (``fixed``, the default, or ``equal_to_size``:
thickness equals the size value in mm), and ``source``.

Ranges are written ``[a..b]`` with ``[``/``]`` including and ``(``/``)`` excluding the edge,
``inf`` allowed, e.g. ``(140..200]`` or ``[8..inf)``.  Bands of one rule set must not overlap
(checked on loading).  Comparisons are made in the table's own unit after rounding the input to
1e-9, so an edge given in the other unit (105 °F given as 40.5556 °C computed in floating point)
lands exactly on the edge.
"""

from __future__ import annotations

import functools
import math
import re
from collections.abc import Callable
from dataclasses import dataclass
from pathlib import Path

import numpy as np

from pipeins.errors import InputError, closest_names
from pipeins.tables import csv_rows

__all__ = [
    "Interval",
    "RuleRow",
    "RuleSet",
    "CodeRequirement",
    "adjusted_thickness_m",
    "load_rule_sets",
    "list_rules",
    "required_thickness",
]

_TEMP_UNITS = {"c": "°C", "f": "°F"}
# table unit suffix -> (label, unit system of pipeins.units whose display unit it is)
_CONDUCTIVITY_UNITS = {"w_mk": ("W/(m·K)", "si"), "btu_in_h_ft2_f": ("Btu·in/(h·ft²·°F)", "us")}
_THICKNESS_UNITS = {"mm": "si", "in": "us"}
# size column -> (keyword of required_thickness, description, unit label, size value is in mm)
_SIZE_COLUMNS = {
    "nps_range_in": ("nominal_size_in", "nominal pipe size", "in NPS", False),
    "dn_range": ("dn", "nominal diameter DN", "DN", True),
    "inner_diameter_range_mm": ("inner_diameter_m", "inner diameter", "mm inner diameter", True),
    "outer_diameter_range_mm": ("outer_diameter_m", "outer diameter", "mm outer diameter", True),
}
_CODE_TABLE = "--code-table"

_NUMBER = r"-?inf|[-+]?\d+(?:\.\d+)?(?:[eE][-+]?\d+)?"
_INTERVAL_RE = re.compile(rf"^\s*([\[(])\s*({_NUMBER})\s*\.\.\s*({_NUMBER})\s*([\])])\s*$")


@functools.cache
def _si_factor(kind: str, units: str) -> float:
    """SI value of one display unit (mm or in, W/(m·K) or Btu·in/(h·ft²·°F)) from pipeins.units."""
    from pipeins.units import from_display

    return float(from_display(1.0, kind, units))


def _k_factor(unit: str) -> float:
    return _si_factor("conductivity", _CONDUCTIVITY_UNITS[unit][1])


def _round(value: float) -> float:
    return round(float(value), 9)


def _fmt(value: float, digits: int = 2) -> str:
    text = f"{value:.{digits}f}".rstrip("0").rstrip(".")
    return "0" if text in ("-0", "") else text


@dataclass(frozen=True)
class Interval:
    """A range of numbers with each edge included or excluded.

    >>> band = Interval.parse("(140..200]")
    >>> band.contains(140.0), band.contains(200.0), str(band)
    (False, True, '(140..200]')
    """

    low: float
    high: float
    low_closed: bool
    high_closed: bool

    @classmethod
    def parse(cls, text: str) -> "Interval":
        """Read ``[a..b]``, ``(a..b]``, ``[a..inf)`` …; raises ``ValueError`` on anything else."""
        match = _INTERVAL_RE.match(text)
        if not match:
            raise ValueError(f'range "{text}" is not of the form [a..b], (a..b], [a..inf) or (-inf..b)')
        left, low, high, right = match.groups()
        interval = cls(float(low), float(high), left == "[", right == "]")
        if interval.low > interval.high or (interval.low == interval.high and not (interval.low_closed and interval.high_closed)):
            raise ValueError(f'range "{text}" is empty')
        if (math.isinf(interval.low) and interval.low_closed) or (math.isinf(interval.high) and interval.high_closed):
            raise ValueError(f'range "{text}" must use an open bracket at inf')
        return interval

    def contains(self, value: float) -> bool:
        """True when *value* (rounded to 1e-9) lies in the range."""
        value = _round(value)
        above = value > self.low or (self.low_closed and value == self.low)
        below = value < self.high or (self.high_closed and value == self.high)
        return above and below

    def overlaps(self, other: "Interval") -> bool:
        """True when the two ranges share at least one number."""
        if self.low > other.low or (self.low == other.low and not self.low_closed):
            low, low_closed = self.low, self.low_closed
        else:
            low, low_closed = other.low, other.low_closed
        if self.high < other.high or (self.high == other.high and not self.high_closed):
            high, high_closed = self.high, self.high_closed
        else:
            high, high_closed = other.high, other.high_closed
        return low < high or (low == high and low_closed and high_closed)

    def __str__(self) -> str:
        def num(x):
            return ("-inf" if x < 0 else "inf") if math.isinf(x) else _fmt(x, 9)

        return f"{'[' if self.low_closed else '('}{num(self.low)}..{num(self.high)}{']' if self.high_closed else ')'}"

    def text(self, unit: str) -> str:
        """The range for a report, never showing inf: ``[105..140] °F``, ``above 350 °F``,
        ``8 in NPS and above``, ``below 40 °F``, ``all``.

        >>> Interval.parse("(350..inf)").text("°F"), Interval.parse("[8..inf)").text("in NPS")
        ('above 350 °F', '8 in NPS and above')
        """
        low, high = (_fmt(x, 9) for x in (self.low, self.high))
        if math.isinf(self.low) and math.isinf(self.high):
            return f"all ({unit})"
        if math.isinf(self.high):
            return f"{low} {unit} and above" if self.low_closed else f"above {low} {unit}"
        if math.isinf(self.low):
            return f"{high} {unit} and below" if self.high_closed else f"below {high} {unit}"
        return f"{self} {unit}"


@dataclass(frozen=True)
class RuleRow:
    """One row of a rule set, values in the table's own units (see the module docstring)."""

    rule_set: str
    service: str
    temp_range: Interval
    temp_unit: str  # "c" or "f"
    conductivity_min: float
    conductivity_max: float
    conductivity_unit: str  # "w_mk" or "btu_in_h_ft2_f"
    mean_rating_temp: float
    size_column: str  # one of the _SIZE_COLUMNS keys
    size_range: Interval
    thickness: float | None  # None when thickness_rule is equal_to_size
    thickness_unit: str  # "mm" or "in"
    thickness_rule: str  # "fixed" or "equal_to_size"
    source: str
    origin: str  # "file.csv row N"

    @property
    def mean_rating_temp_c(self) -> float:
        """Mean rating temperature [°C]."""
        return _temp_to_c(self.mean_rating_temp, self.temp_unit)

    @property
    def conductivity_range_w_mk(self) -> tuple[float, float]:
        """Conductivity range [W/(m·K)] at the mean rating temperature."""
        factor = _k_factor(self.conductivity_unit)
        return self.conductivity_min * factor, self.conductivity_max * factor

    def table_thickness_m(self, size_value: float) -> float:
        """Thickness [m] the row prescribes for a pipe whose size key is *size_value*."""
        if self.thickness_rule == "equal_to_size":
            return float(size_value) * 1e-3
        return self.thickness * _si_factor("thickness", _THICKNESS_UNITS[self.thickness_unit])


@dataclass(frozen=True)
class RuleSet:
    """A named rule set: its rows and where they came from."""

    name: str
    rows: tuple[RuleRow, ...]
    origin: str

    @property
    def size_column(self) -> str:
        return self.rows[0].size_column

    @property
    def temp_unit(self) -> str:
        return self.rows[0].temp_unit


@dataclass(frozen=True)
class CodeRequirement:
    """Result of :func:`required_thickness`.

    ``thickness_m`` is None whenever ``covered`` is False; ``reason`` says which row applied and
    whether the conductivity adjustment was used, or why no row applies.
    """

    thickness_m: float | None
    covered: bool
    reason: str
    rule_row_source: str
    table_thickness_m: float | None = None
    rule_set: str = ""


def adjusted_thickness_m(table_thickness_m, pipe_outer_radius_m, k_material, k_table_upper):
    r"""Thickness giving the same heat loss per metre as the table thickness at the table's k.

    .. math:: T = r\left[\left(1 + \frac{t}{r}\right)^{K/k} - 1\right]

    with *r* the actual outside radius of the pipe [m], *t* the table thickness [m], *K* the
    conductivity of the chosen material at the mean rating temperature and *k* the upper value
    of the table's conductivity range (*K* and *k* in any one unit).  It equates the
    cylindrical resistances ln(1 + t/r)/k = ln(1 + T/r)/K, ignoring the surface film.

    Reference: ASHRAE Standard 90.1-2019, footnote to Tables 6.8.3-1 and 6.8.3-2 (from memory).
    Valid for any positive radius and conductivities; the result scales with the inputs' unit.

    Parameters
    ----------
    table_thickness_m : float or array_like
        Thickness from the table [m], ≥ 0.
    pipe_outer_radius_m : float or array_like
        Actual outside radius of the pipe [m], > 0.
    k_material, k_table_upper : float or array_like
        Conductivities [same unit], > 0.

    Returns
    -------
    numpy.ndarray
        Equivalent thickness [m].

    Examples
    --------
    NPS 4 (r = 2.25 in), table 2.0 in, K = 0.23 against k = 0.29 (values in inches):

    >>> round(float(adjusted_thickness_m(2.0, 2.25, 0.23, 0.29)), 3)
    1.476
    """
    t = np.asarray(table_thickness_m, dtype=float)
    r = np.asarray(pipe_outer_radius_m, dtype=float)
    k_mat = np.asarray(k_material, dtype=float)
    k_tab = np.asarray(k_table_upper, dtype=float)
    if not np.all(np.isfinite(t) & (t >= 0)):
        raise InputError("table_thickness_m", "table thickness must be a finite number ≥ 0 m")
    if not np.all(np.isfinite(r) & (r > 0)):
        raise InputError("pipe_outer_radius_m", "pipe outer radius must be a finite number > 0 m")
    if not np.all(np.isfinite(k_mat) & (k_mat > 0)):
        raise InputError("--conductivity", "material conductivity must be a finite number > 0")
    if not np.all(np.isfinite(k_tab) & (k_tab > 0)):
        raise InputError("k_table_upper", "table conductivity must be a finite number > 0")
    return r * np.expm1((k_mat / k_tab) * np.log1p(t / r))


# ----------------------------------------------------------------------------- loading


def _temp_to_c(value: float, unit: str) -> float:
    return (value - 32.0) * 5.0 / 9.0 if unit == "f" else value


def _temp_from_c(temp_c: float, unit: str) -> float:
    return temp_c * 9.0 / 5.0 + 32.0 if unit == "f" else temp_c


def _pick(columns, options: dict, what: str, where: str) -> str:
    found = [key for key in options if key in columns]
    if len(found) != 1:
        names = " or ".join(options)
        problem = "has none" if not found else "has more than one"
        raise InputError(_CODE_TABLE, f"{where} {problem} of the {what} columns {names}")
    return found[0]


def _parse_rows(rows, where: str) -> list[RuleRow]:
    """Turn dict rows (strings) of one file into RuleRows; *where* is the file's name."""
    if not rows:
        raise InputError(_CODE_TABLE, f"{where} has no rows")
    columns = set(rows[0])
    for needed in ("rule_set", "service", "source"):
        if needed not in columns:
            raise InputError(_CODE_TABLE, f'{where} has no "{needed}" column')
    temp_col = _pick(columns, {"fluid_temp_range_c": 0, "fluid_temp_range_f": 0}, "temperature range", where)
    temp_unit = temp_col[-1]
    mean_col = f"mean_rating_temp_{temp_unit}"
    k_unit = _pick(
        columns, {f"conductivity_max_{u}": 0 for u in _CONDUCTIVITY_UNITS}, "conductivity", where
    ).removeprefix("conductivity_max_")
    size_col = _pick(columns, _SIZE_COLUMNS, "size band", where)
    thick_col = _pick(columns, {"thickness_mm": 0, "thickness_in": 0}, "thickness", where)
    for needed in (mean_col, f"conductivity_min_{k_unit}"):
        if needed not in columns:
            raise InputError(_CODE_TABLE, f'{where} has no "{needed}" column')

    out = []
    for number, row in enumerate(rows, start=1):
        origin = f"{where} row {number}"

        def num(column, allow_blank=False):
            text = (row.get(column) or "").strip()
            if allow_blank and not text:
                return None
            try:
                value = float(text)
            except ValueError:
                raise InputError(_CODE_TABLE, f'{origin}: {column} "{text}" is not a number') from None
            if not math.isfinite(value):
                raise InputError(_CODE_TABLE, f'{origin}: {column} "{text}" is not a finite number')
            return value

        def interval(column):
            try:
                return Interval.parse(row.get(column) or "")
            except ValueError as exc:
                raise InputError(_CODE_TABLE, f"{origin}: {column} {exc}") from None

        rule = (row.get("thickness_rule") or "fixed").strip() or "fixed"
        if rule not in ("fixed", "equal_to_size"):
            raise InputError(_CODE_TABLE, f'{origin}: thickness_rule "{rule}" must be fixed or equal_to_size')
        if rule == "equal_to_size" and not _SIZE_COLUMNS[size_col][3]:
            raise InputError(_CODE_TABLE, f"{origin}: thickness_rule equal_to_size needs a size band in mm or DN")
        thickness = num(thick_col, allow_blank=rule == "equal_to_size")
        k_min, k_max = num(f"conductivity_min_{k_unit}"), num(f"conductivity_max_{k_unit}")
        if not 0 < k_min <= k_max:
            raise InputError(_CODE_TABLE, f"{origin}: conductivity range must satisfy 0 < min ≤ max")
        if thickness is not None and thickness < 0:
            raise InputError(_CODE_TABLE, f"{origin}: {thick_col} must be ≥ 0")
        name = (row.get("rule_set") or "").strip()
        source = (row.get("source") or "").strip()
        if not name or not source:
            raise InputError(_CODE_TABLE, f"{origin}: rule_set and source must not be blank")
        out.append(
            RuleRow(
                rule_set=name,
                service=(row.get("service") or "").strip() or "any",
                temp_range=interval(temp_col),
                temp_unit=temp_unit,
                conductivity_min=k_min,
                conductivity_max=k_max,
                conductivity_unit=k_unit,
                mean_rating_temp=num(mean_col),
                size_column=size_col,
                size_range=interval(size_col),
                thickness=thickness,
                thickness_unit=thick_col.removeprefix("thickness_"),
                thickness_rule=rule,
                source=source,
                origin=origin,
            )
        )
    return out


def _group(rows: list[RuleRow], where: str, known: dict[str, RuleSet]) -> dict[str, RuleSet]:
    sets: dict[str, list[RuleRow]] = {}
    for row in rows:
        sets.setdefault(row.rule_set, []).append(row)
    out = {}
    for name, members in sets.items():
        if name in known:
            raise InputError(_CODE_TABLE, f'{where} defines rule set "{name}", which {known[name].origin} already defines')
        for i, a in enumerate(members):
            for b in members[i + 1 :]:
                if a.temp_range.overlaps(b.temp_range) and a.size_range.overlaps(b.size_range):
                    raise InputError(_CODE_TABLE, f"{b.origin} overlaps {a.origin.removeprefix(where + ' ')} in temperature and size")
        out[name] = RuleSet(name=name, rows=tuple(members), origin=where)
    return out


def _read_csv_rows(path: Path) -> list[dict[str, str]]:
    from .fileio import read_text_input

    text = read_text_input(path, _CODE_TABLE)
    return [dict(row) for row in csv_rows(text)]


@functools.cache
def _builtin_rule_sets() -> dict[str, RuleSet]:
    from pipeins.tables import read_table, table_names

    out: dict[str, RuleSet] = {}
    for table in table_names():
        if table.startswith("code_"):
            where = f"{table}.csv"
            out.update(_group(_parse_rows(read_table(table), where), where, out))
    return out


def load_rule_sets(extra_paths=()) -> dict[str, RuleSet]:
    """Every rule set by name: the shipped ``tables/code_*.csv`` plus user CSVs of the same shape.

    A user file may not redefine a shipped rule set's name; bands may not overlap.

    >>> sorted(load_rule_sets())
    ['ashrae-90.1-2019', 'de-geg-annex-8']
    """
    sets = dict(_builtin_rule_sets())
    for path in extra_paths:
        where = Path(path).name
        sets.update(_group(_parse_rows(_read_csv_rows(Path(path)), where), where, sets))
    return sets


def _get_rule_set(rule_set, extra_paths=()) -> RuleSet:
    if isinstance(rule_set, RuleSet):
        return rule_set
    sets = load_rule_sets(extra_paths)
    if rule_set not in sets:
        raise InputError("--code", f'unknown rule set "{rule_set}"; {closest_names(str(rule_set), sets)}')
    return sets[rule_set]


def _temp_text_c(value_c: float, unit: str, table_value: float, units: str = "si") -> str:
    """A table's temperature bound: in SI in °C (and as the table writes it in °F), in US
    units in °F (the table's own value where it is in °F)."""
    if units != "si":
        return f"{_fmt(table_value if unit == 'f' else _in_units(value_c, 'temperature', units))} °F"
    text = f"{_fmt(value_c)} °C"
    return f"{text} / {_fmt(table_value)} °F" if unit == "f" else text


def _in_units(value_si: float, kind: str, units: str) -> float:
    from .units import to_display

    return float(to_display(value_si, kind, units))


def _said(value_si: float, kind: str, units: str, digits: int = 2) -> str:
    """*value_si* of *kind* as the reasons write it: trimmed digits and the unit system's unit."""
    from .units import unit_label

    return f"{_fmt(_in_units(value_si, kind, units), digits)} {unit_label(kind, units)}"


def _span_text(rows: list[RuleRow], units: str = "si") -> str:
    """Union span of the rows' temperature ranges, e.g. '≥ 40.56 °C / 105 °F' (US: '≥ 105 °F')."""
    unit = rows[0].temp_unit
    low = min(r.temp_range.low for r in rows)
    high = max(r.temp_range.high for r in rows)
    low_closed = any(r.temp_range.low == low and r.temp_range.low_closed for r in rows)
    high_closed = any(r.temp_range.high == high and r.temp_range.high_closed for r in rows)
    lo = _temp_text_c(_temp_to_c(low, unit), unit, low, units)
    hi = _temp_text_c(_temp_to_c(high, unit), unit, high, units)
    if math.isinf(low) and math.isinf(high):
        return "all temperatures"
    if math.isinf(low):
        return f"{'≤' if high_closed else '<'} {hi}"
    if math.isinf(high):
        return f"{'≥' if low_closed else '>'} {lo}"
    return f"{lo} to {hi}"


def _size_text(row_or_set, value: float) -> str:
    label = _SIZE_COLUMNS[row_or_set.size_column][2]
    return f"DN {_fmt(value, 3)}" if label == "DN" else f"{_fmt(value, 3)} {label}"


def list_rules(extra_paths=()) -> tuple[dict[str, str], ...]:
    """Every row of every rule set as display strings (for a table printout).

    >>> rows = list_rules()
    >>> rows[0]["rule_set"], rows[0]["fluid_temp"], rows[0]["size"], rows[0]["thickness"]
    ('ashrae-90.1-2019', 'above 350 °F', '[0..1) in NPS', '4.5 in')
    """
    out = []
    for rule_set in load_rule_sets(extra_paths).values():
        for row in rule_set.rows:
            k_label = _CONDUCTIVITY_UNITS[row.conductivity_unit][0]
            if row.thickness_rule == "equal_to_size":
                thickness = "equal to size"
            else:
                thickness = f"{_fmt(row.thickness, 3)} {row.thickness_unit}"
            out.append(
                {
                    "rule_set": row.rule_set,
                    "service": row.service,
                    "fluid_temp": row.temp_range.text(_TEMP_UNITS[row.temp_unit]),
                    "size": row.size_range.text(_SIZE_COLUMNS[row.size_column][2]),
                    "conductivity": f"{_fmt(row.conductivity_min, 4)}–{_fmt(row.conductivity_max, 4)} {k_label}",
                    "mean_rating_temp": f"{_fmt(row.mean_rating_temp)} {_TEMP_UNITS[row.temp_unit]}",
                    "thickness": thickness,
                    "source": row.source,
                }
            )
    return tuple(out)


# ----------------------------------------------------------------------------- lookup


def required_thickness(
    rule_set,
    service_temp_c: float,
    outer_diameter_m: float,
    conductivity_at_rating_w_mk: float | Callable[[float], float],
    *,
    nominal_size_in: float | None = None,
    dn: float | None = None,
    inner_diameter_m: float | None = None,
    extra_paths=(),
    units: str = "si",
) -> CodeRequirement:
    """Minimum insulation thickness a rule set requires for one pipe.

    The row is chosen by fluid temperature and pipe size (the rule set decides which size key:
    nominal pipe size in inches, DN, inner or outer diameter).  If the material's conductivity
    at the row's mean rating temperature lies inside the row's range the table thickness
    applies; otherwise the equivalent thickness from :func:`adjusted_thickness_m` with the upper
    value of the range (ASHRAE 90.1-2019 footnote to Tables 6.8.3-1/-2, from memory).  A service
    temperature or size outside every row gives ``covered=False`` and a reason, never a guess.

    Parameters
    ----------
    rule_set : str or RuleSet
        Name from :func:`load_rule_sets` (or a loaded rule set).
    service_temp_c : float
        Fluid operating temperature [°C].
    outer_diameter_m : float
        Actual outside diameter of the pipe [m] (the adjustment uses its radius).
    conductivity_at_rating_w_mk : float or callable
        Conductivity of the insulation [W/(m·K)], or a function k(mean_temp_c) evaluated at the
        row's mean rating temperature.
    nominal_size_in, dn, inner_diameter_m : float, optional
        The size key the rule set needs (an InputError names the missing one).
    extra_paths : sequence of path
        User rule-set CSVs to load alongside the shipped ones.
    units : str
        Unit system of the reason's own quantities ("si" or "us"; the row is quoted as the
        table writes it).

    Returns
    -------
    CodeRequirement

    Examples
    --------
    Heating water at 80 °C (176 °F) in NPS 4 (outside diameter 114.3 mm) with k = 0.040 W/(m·K)
    (0.277 Btu·in/(h·ft²·°F), inside 0.25–0.29): table thickness 2.0 in.

    >>> req = required_thickness("ashrae-90.1-2019", 80.0, 0.1143, 0.040, nominal_size_in=4)
    >>> req.covered, round(req.thickness_m / 0.0254, 3)
    (True, 2.0)
    >>> required_thickness("ashrae-90.1-2019", 30.0, 0.1143, 0.040, nominal_size_in=4).reason
    'ashrae-90.1-2019: 30 °C lies outside the heating ranges (≥ 40.56 °C / 105 °F) and cooling ranges (≤ 15.56 °C / 60 °F)'
    >>> required_thickness("ashrae-90.1-2019", 30.0, 0.1143, 0.040, nominal_size_in=4, units="us").reason
    'ashrae-90.1-2019: 86 °F lies outside the heating ranges (≥ 105 °F) and cooling ranges (≤ 60 °F)'
    """
    rs = _get_rule_set(rule_set, extra_paths)
    temp_c = float(service_temp_c)
    if not math.isfinite(temp_c):
        raise InputError("--fluid-temp", "fluid temperature must be a finite number in °C")
    od = float(outer_diameter_m)
    if not (math.isfinite(od) and od > 0):
        raise InputError("--pipe", "pipe outer diameter must be a finite number > 0 m")

    temp_table = _temp_from_c(temp_c, rs.temp_unit)
    by_temp = [row for row in rs.rows if row.temp_range.contains(temp_table)]
    if not by_temp:
        services: dict[str, list[RuleRow]] = {}
        for row in rs.rows:
            services.setdefault(row.service, []).append(row)
        spans = [f"{service} ranges ({_span_text(rows, units)})" for service, rows in services.items()]
        listed = spans[0] if len(spans) == 1 else ", ".join(spans[:-1]) + " and " + spans[-1]
        return CodeRequirement(None, False, f"{rs.name}: {_said(temp_c, 'temperature', units)} lies outside the "
                                            f"{listed}", "", rule_set=rs.name)

    keyword, description = _SIZE_COLUMNS[rs.size_column][:2]
    given = {"nominal_size_in": nominal_size_in, "dn": dn, "inner_diameter_m": inner_diameter_m, "outer_diameter_m": od}
    if given[keyword] is None:
        raise InputError("--pipe", f'rule set "{rs.name}" bands pipes by {description}; give {keyword}')
    size = float(given[keyword])
    if not (math.isfinite(size) and size > 0):
        raise InputError("--pipe", f"{keyword} must be a finite number > 0")
    if keyword.endswith("_m"):
        size = _round(size * 1000.0)  # bands in mm
    matches = [row for row in by_temp if row.size_range.contains(size)]
    if not matches:
        service = by_temp[0].service
        reason = f"{rs.name}: no {service} row at {_said(temp_c, 'temperature', units)} covers {_size_text(rs, size)}"
        return CodeRequirement(None, False, reason, "", rule_set=rs.name)
    row = matches[0]

    if callable(conductivity_at_rating_w_mk):
        k_material = float(np.asarray(conductivity_at_rating_w_mk(row.mean_rating_temp_c), dtype=float))
    else:
        k_material = float(conductivity_at_rating_w_mk)
    if not (math.isfinite(k_material) and k_material > 0):
        raise InputError("--conductivity", "material conductivity must be a finite number > 0 W/(m·K)")

    k_label, k_factor = _CONDUCTIVITY_UNITS[row.conductivity_unit][0], _k_factor(row.conductivity_unit)
    k_in_table_unit = _round(k_material / k_factor)
    table_m = row.table_thickness_m(size)
    t_unit = _TEMP_UNITS[row.temp_unit]
    head = (
        f"{rs.name} {row.service} row {row.temp_range} {t_unit}, {row.size_range} "
        f"{_SIZE_COLUMNS[row.size_column][2]}: table {_said(table_m, 'thickness', units, 1 if units == 'si' else 2)}"
        f" for k "
        f"{_fmt(row.conductivity_min, 4)}–{_fmt(row.conductivity_max, 4)} {k_label} at "
        f"{_fmt(row.mean_rating_temp)} {t_unit}; material k = {_fmt(k_in_table_unit, 4)}"
    )
    if row.conductivity_min <= k_in_table_unit <= row.conductivity_max:
        thickness_m = table_m
        reason = f"{head} is inside the range, table thickness applies"
    else:
        k_upper_w_mk = row.conductivity_max * k_factor
        thickness_m = float(adjusted_thickness_m(table_m, od / 2.0, k_material, k_upper_w_mk))
        reason = (f"{head} is outside the range, adjusted by T = r[(1 + t/r)^(K/k) − 1] to "
                  f"{_said(thickness_m, 'thickness', units, 1 if units == 'si' else 2)}")
    return CodeRequirement(thickness_m, True, reason, f"{row.source} ({row.origin})", table_m, rs.name)
