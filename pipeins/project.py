"""The project file: a whole job's lines, services and surroundings in one TOML file.

A project file has six kinds of table (see ``examples/*.toml``)::

    [project]               name, units ("si" or "us"), currency, code, cost_table, code_tables
    [energy]                price, co2, efficiency, cop, hours, discount_rate, life, escalation
    [conditions.<name>]     air, rh, wind, surroundings, altitude
    [services.<name>]       fluid, temperature or steam_pressure, material, finish, series,
                            schedule, criteria, max_heat_flow, min_reduction, flow,
                            max_temp_change, hold_time, ice_fraction, touch_limit,
                            contact_time, dew_margin, code, cost_table, and the energy keys
                            (price, co2, efficiency, cop, hours) to override [energy]
    [[lines]]               service, size, length, condition, valves, flanges, strainers, tag
    [report]                project, number, client, revision, date, prepared_by, checked_by
                            (the title block of the HTML and XLSX reports; text)

Quantities are text with their unit (``"82 C"``, ``"2 in"``, ``"120 m"``, ``"10 barg"``,
``"0.09/kWh"``); a bare number takes the unit of the project's unit system
(:func:`pipeins.units.parse_quantity`).  Paths are relative to the project file.

:func:`load_project` reads and checks the whole file and raises ONE :class:`ProjectError`
that lists every problem, each as ``<file>: line <n> (<entry>, <key>): <message>``.

>>> text = '''
... [project]
... name = "Demo"
... [conditions.room]
... air = "20 C"
... [services.hot]
... temperature = "80 C"
... material = "mineral wool"
... [[lines]]
... service = "hot"
... size = "NPS 2"
... length = "10 m"
... condition = "room"
... '''
>>> project = parse_project(text, "demo.toml")
>>> project.lines[0].size.label, project.lines[0].length_m, project.services["hot"].temp_c
('NPS 2', 10.0, 80.0)
>>> parse_project(text.replace("mineral wool", "glas wool"), "demo.toml")
Traceback (most recent call last):
...
pipeins.project.ProjectError: demo.toml: line 8 (service "hot", material): unknown material "glas wool"; did you mean "glass wool"?
"""

from __future__ import annotations

import re
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

from .errors import InputError, closest_names

__all__ = ["ProjectError", "Project", "Energy", "Condition", "Service", "Line", "load_project",
           "parse_project", "CRITERIA", "DEFAULT_HOURS_PER_YEAR"]

#: Criteria a service may list, in report order.
CRITERIA = ("code", "touch", "condensation", "heat_flow", "temp_change", "freeze", "economic")
#: Operating hours per year when none are given: all year (common practice for a first estimate).
DEFAULT_HOURS_PER_YEAR = 8760.0
_FITTINGS = {"valves": "valve", "flanges": "flange", "strainers": "strainer"}

_KEYS = {
    "project": {"name", "units", "currency", "code", "cost_table", "code_tables"},
    "energy": {"price", "co2", "efficiency", "cop", "hours", "discount_rate", "life", "escalation"},
    "conditions": {"air", "rh", "wind", "surroundings", "altitude"},
    "services": {"fluid", "temperature", "steam_pressure", "material", "finish", "series", "schedule",
                 "criteria", "max_heat_flow", "min_reduction", "flow", "max_temp_change", "hold_time",
                 "ice_fraction", "touch_limit", "contact_time", "dew_margin", "code", "cost_table",
                 "price", "co2", "efficiency", "cop", "hours"},
    "lines": {"service", "size", "length", "condition", "tag"} | set(_FITTINGS),
    # the title block of the HTML and XLSX reports (pipeins.reports.html.TITLE_BLOCK_KEYS)
    "report": {"project", "number", "client", "revision", "date", "prepared_by", "checked_by"},
}
_TOP = ("project", "energy", "conditions", "services", "lines", "report")


class ProjectError(InputError):
    """Every problem of a project file at once.

    ``problems`` is the list of one-line messages, each starting with the file name;
    ``str(exc)`` joins them with newlines.
    """

    def __init__(self, problems: list[str]):
        self.problems = list(problems)
        super().__init__("", "\n".join(self.problems))


@dataclass(frozen=True)
class Energy:
    """The money side of a service (``[energy]`` merged with the service's overrides)."""

    price: Any = None          # pipeins.economics.EnergyPrice
    co2: Any = None            # pipeins.economics.EmissionFactor
    efficiency: float = 1.0
    cop: float | None = None
    hours_per_year: float = DEFAULT_HOURS_PER_YEAR
    discount_rate: float = 0.05
    years: float = 20.0
    escalation: float = 0.0


@dataclass(frozen=True)
class Condition:
    """Surroundings of a location, SI (°C, %, m/s, Pa)."""

    name: str
    air_temp_c: float
    rh_percent: float | None = None
    wind_m_s: float = 0.0
    surroundings_temp_c: float | None = None
    pressure_pa: float = 101_325.0
    file_line: int = 0


@dataclass(frozen=True)
class Service:
    """One service (fluid, temperature, material, finish and what it is sized for), SI."""

    name: str
    fluid: str | None
    temp_c: float | None
    steam_pressure_pa: float | None
    material: str
    finish: str | None
    series: Any
    schedule: str | None
    criteria: tuple[str, ...]
    requirements: Any          # pipeins.criteria.Requirements
    flow: Any                  # pipeins.units.Flow or None
    code: str | None
    energy: Energy
    cost_table: Any            # pipeins.economics.CostTable or None
    file_line: int = 0

    @property
    def fluid_temp_c(self) -> float:
        """The fluid temperature [°C] (saturation temperature for steam)."""
        if self.steam_pressure_pa is not None:
            from .props.steam import saturation_temp_c

            return float(saturation_temp_c(self.steam_pressure_pa))
        return float(self.temp_c)


@dataclass(frozen=True)
class Line:
    """One run of pipe: its service, size, length, location and bare fittings."""

    index: int                 # 1-based position among [[lines]]
    tag: str
    service: str
    size: Any                  # pipeins.catalog.pipes.PipeSize
    length_m: float
    condition: str
    fittings: dict = field(default_factory=dict)   # "valve"/"flange"/"strainer" -> count
    file_line: int = 0


@dataclass
class Project:
    name: str
    units: str
    currency: str
    path: Path
    code: str | None
    code_paths: tuple
    energy: Energy
    conditions: dict[str, Condition]
    services: dict[str, Service]
    lines: list[Line]
    cost_table: Any = None
    file_name: str = ""
    report: dict = field(default_factory=dict)  # [report]: title block texts by key

    def where(self, file_line: int, entry: str, key: str | None = None) -> str:
        return _where(self.file_name, file_line, entry, key)


# --------------------------------------------------------------------------- positions
def _split_path(text: str) -> tuple[str, ...]:
    parts, buf, quote = [], "", None
    for ch in text:
        if quote:
            if ch == quote:
                quote = None
            else:
                buf += ch
        elif ch in "\"'":
            quote = ch
        elif ch == ".":
            parts.append(buf.strip())
            buf = ""
        else:
            buf += ch
    parts.append(buf.strip())
    return tuple(parts)


_HEADER_RE = re.compile(r"^\s*(\[\[|\[)\s*([^\]]+?)\s*\]\]?\s*(#.*)?$")
_KEY_RE = re.compile(r"""^\s*("[^"]*"|'[^']*'|[A-Za-z0-9_\-]+)\s*=""")


class _Positions:
    """Line numbers of table headers and keys (tomllib gives none): found in the text."""

    def __init__(self, text: str):
        self.headers: dict[tuple, int] = {}
        self.keys: dict[tuple, int] = {}
        counts: dict[tuple, int] = {}
        current: tuple = ()
        for number, raw in enumerate(text.splitlines(), start=1):
            m = _HEADER_RE.match(raw)
            if m and not raw.lstrip().startswith("#"):
                path = _split_path(m.group(2))
                if m.group(1) == "[[":
                    counts[path] = counts.get(path, 0) + 1
                    path = path + (counts[path],)
                current = path
                self.headers.setdefault(current, number)
                continue
            k = _KEY_RE.match(raw)
            if k:
                key = k.group(1).strip("\"'")
                self.keys.setdefault(current + (key,), number)

    def header(self, path: tuple) -> int:
        return self.headers.get(path, 0)

    def key(self, path: tuple, key: str) -> int:
        return self.keys.get(path + (key,), self.headers.get(path, 0))


def _where(file_name: str, file_line: int, entry: str, key: str | None = None) -> str:
    place = f"line {file_line} " if file_line else ""
    inside = f"{entry}, {key}" if key else entry
    return f"{file_name}: {place}({inside})"


# --------------------------------------------------------------------------- the reader
class _Reader:
    def __init__(self, text: str, file_name: str, base_dir: Path):
        self.text = text
        self.file_name = file_name
        self.base = base_dir
        self.pos = _Positions(text)
        self.problems: list[str] = []
        self.units = "si"

    # -- reporting --------------------------------------------------------------------
    def problem(self, path: tuple, entry: str, key: str | None, message: str) -> None:
        line = self.pos.key(path, key) if key else self.pos.header(path)
        self.problems.append(f"{_where(self.file_name, line, entry, key)}: {message}")

    def guard(self, path, entry, key, func, *args, **kw):
        """Call *func*; an InputError becomes a problem at (path, key) and the result None."""
        try:
            return func(*args, **kw)
        except InputError as exc:
            self.problem(path, entry, key, exc.message)
            return None

    # -- typed values -----------------------------------------------------------------
    def check_keys(self, table: dict, kind: str, path: tuple, entry: str, required=()):
        allowed = _KEYS[kind]
        for key in table:
            if key not in allowed:
                hint = closest_names(key, sorted(allowed))
                self.problem(path, entry, key, f'unknown key "{key}"; {hint}')
        for key in required:
            if key not in table:
                self.problem(path, entry, None, f'the key "{key}" is missing')

    def text_value(self, table, key, path, entry, default=None):
        if key not in table:
            return default
        value = table[key]
        if not isinstance(value, str) or not value.strip():
            self.problem(path, entry, key, f"{key} must be text in quotes, e.g. {key} = \"…\"")
            return default
        return value.strip()

    def quantity(self, table, key, kind, path, entry, default=None, positive=False, at_least_zero=False):
        if key not in table:
            return default
        from .units import parse_quantity

        value = table[key]
        if isinstance(value, bool) or not isinstance(value, (str, int, float)):
            self.problem(path, entry, key, f"{key} must be a number or text with a unit, e.g. {key} = \"…\"")
            return default
        result = self.guard(path, entry, key, parse_quantity, value, kind, key, self.units)
        if result is None:
            return default
        number = getattr(result, "value_si", result)
        if positive and not number > 0:
            self.problem(path, entry, key, f"{key} must be greater than zero")
            return default
        if at_least_zero and not number >= 0:
            self.problem(path, entry, key, f"{key} must be zero or more")
            return default
        return result

    def fraction(self, table, key, path, entry, default=None, low=0.0, high=None, what=""):
        """A percentage ("6%", or a bare number read as percent) → fraction."""
        value = self.quantity(table, key, "percent", path, entry)
        if value is None:
            return default
        frac = value / 100.0
        if frac < low or (high is not None and frac > high):
            self.problem(path, entry, key, what)
            return default
        return frac

    def number(self, table, key, path, entry, default=None, check=None, what=""):
        if key not in table:
            return default
        value = table[key]
        if isinstance(value, bool) or not isinstance(value, (int, float)):
            self.problem(path, entry, key, f"{key} must be a plain number; {what}")
            return default
        if check is not None and not check(float(value)):
            self.problem(path, entry, key, f"{value:g} is not allowed; {what}")
            return default
        return float(value)

    def count(self, table, key, path, entry):
        if key not in table:
            return 0
        value = table[key]
        if isinstance(value, bool) or not isinstance(value, int) or value < 0:
            self.problem(path, entry, key, f"{key} must be a whole number, 0 or more")
            return 0
        return int(value)

    def per_energy(self, table, key, path, entry, what):
        """"0.085/kWh" (price) or "0.20 kg/kWh" (CO2) → (number, unit)."""
        if key not in table:
            return None
        value = table[key]
        m = re.match(r"^\s*[$€£¥]?\s*(\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?\s*[$€£¥]?\s*(?:kg\s*)?(?:/|\bper\b)\s*(\S+)\s*$",
                     value if isinstance(value, str) else "", re.IGNORECASE)
        if not m:
            self.problem(path, entry, key, f'cannot read {value!r} as {what}; use e.g. "0.09/kWh", "9/GJ" '
                                           'or "1.05/therm"')
            return None
        from .units import energy_unit_joules

        if self.guard(path, entry, key, energy_unit_joules, m.group(2)) is None:
            return None
        return float(m.group(1)), m.group(2)

    def years(self, table, key, path, entry):
        if key not in table:
            return None
        value = table[key]
        m = re.match(r"^\s*(\d+\.?\d*)\s*(years?|yr|a)?\s*$", value if isinstance(value, str) else "", re.I)
        if isinstance(value, (int, float)) and not isinstance(value, bool):
            number = float(value)
        elif m:
            number = float(m.group(1))
        else:
            self.problem(path, entry, key, f'cannot read {value!r} as a life; use e.g. "15 years" or 15')
            return None
        if not number > 0:
            self.problem(path, entry, key, "the life must be greater than zero years")
            return None
        return number

    def path_value(self, table, key, path, entry):
        name = self.text_value(table, key, path, entry)
        if name is None:
            return None
        if "\x00" in name:
            self.problem(path, entry, key, "the file name contains a NUL byte")
            return None
        full = (self.base / name).resolve()
        if not full.is_file():
            self.problem(path, entry, key, f'file "{name}" not found next to {self.file_name}')
            return None
        return full

    # -- tables -----------------------------------------------------------------------
    def energy_fields(self, table, path, entry, base: Energy | None) -> Energy:
        from .economics import EmissionFactor, EnergyPrice

        base = base or Energy()
        kw = dict(base.__dict__)
        price = self.per_energy(table, "price", path, entry, "an energy price")
        if price is not None:
            kw["price"] = self.guard(path, entry, "price", EnergyPrice, price[0], price[1], self.currency)
        co2 = self.per_energy(table, "co2", path, entry, "an emission factor (kg CO2 per unit)")
        if co2 is not None:
            kw["co2"] = self.guard(path, entry, "co2", EmissionFactor, co2[0], co2[1])
        kw["efficiency"] = self.quantity(table, "efficiency", "efficiency", path, entry, base.efficiency)
        kw["cop"] = self.number(table, "cop", path, entry, base.cop, lambda x: x > 0, "the COP is greater than 0")
        hours = self.quantity(table, "hours", "time", path, entry)
        if hours is not None:
            if not 0 < hours / 3600 <= 8784:
                self.problem(path, entry, "hours", "operating hours must be above 0 and at most 8784 h per year")
            else:
                kw["hours_per_year"] = hours / 3600
        if "discount_rate" in table:
            kw["discount_rate"] = self.fraction(table, "discount_rate", path, entry, base.discount_rate, -0.99, None,
                                                "the discount rate must be above -100 %")
        if "escalation" in table:
            kw["escalation"] = self.fraction(table, "escalation", path, entry, base.escalation, -0.99, None,
                                             "the escalation must be above -100 %")
        life = self.years(table, "life", path, entry)
        if life is not None:
            kw["years"] = life
        return Energy(**kw)

    def rule_set(self, table, path, entry, default):
        name = self.text_value(table, "code", path, entry)
        if name is None:
            return default
        from .codes import load_rule_sets

        sets = self.guard(path, entry, "code", load_rule_sets, self.code_paths)
        if sets is None:
            return default
        if name not in sets:
            self.problem(path, entry, "code", f'unknown rule set "{name}"; {closest_names(name, list(sets))}')
            return default
        return name

    def cost_table(self, table, path, entry):
        full = self.path_value(table, "cost_table", path, entry)
        if full is None:
            return None
        from .economics import CostTable

        return self.guard(path, entry, "cost_table", CostTable.from_csv, full)


def parse_project(text: str, file_name: str = "project.toml", base_dir=".") -> Project:
    """Read a project from TOML *text*; *file_name* names it in errors and *base_dir*
    anchors its relative paths.  Raises :class:`ProjectError` listing every problem."""
    import tomllib

    from .fileio import load_toml

    try:
        data = load_toml(text, file_name)
    except tomllib.TOMLDecodeError as exc:
        message = str(exc)
        m = re.search(r"\(at line (\d+), column \d+\)", message)
        line = f"line {m.group(1)}: " if m else ""
        raise ProjectError([f"{file_name}: {line}not valid TOML: {message}"]) from None

    r = _Reader(text, file_name, Path(base_dir))
    for key in data:
        if key not in _TOP:
            line = r.pos.header((key,)) or r.pos.key((), key)
            from .errors import near_hint

            r.problems.append(f"{_where(file_name, line, 'file')}: unknown table [{key}]; "
                              f"{near_hint(key, _TOP)}")

    # [project]
    head = data.get("project")
    path = ("project",)
    if not isinstance(head, dict):
        r.problems.append(f"{file_name}: the table [project] is missing; it needs at least name = \"…\"")
        head = {}
    r.check_keys(head, "project", path, "project", required=("name",) if "project" in data else ())
    name = r.text_value(head, "name", path, "project", "")
    units = r.text_value(head, "units", path, "project", "si")
    if units not in ("si", "us"):
        r.problem(path, "project", "units", f'unknown unit system "{units}"; use "si" or "us"')
        units = "si"
    r.units = units
    r.currency = r.text_value(head, "currency", path, "project", "")
    code_paths = []
    if "code_tables" in head:
        items = head["code_tables"]
        if not isinstance(items, list) or not all(isinstance(x, str) for x in items):
            r.problem(path, "project", "code_tables", 'code_tables must be a list of file names, e.g. ["rules.csv"]')
        else:
            for item in items:
                if "\x00" in item:
                    r.problem(path, "project", "code_tables", "the file name contains a NUL byte")
                    continue
                full = (r.base / item).resolve()
                if full.is_file():
                    code_paths.append(full)
                else:
                    r.problem(path, "project", "code_tables", f'file "{item}" not found next to {file_name}')
    r.code_paths = tuple(code_paths)
    code = r.rule_set(head, path, "project", None)
    cost_table = r.cost_table(head, path, "project")

    # [report]: title-block texts (a TOML date is taken as written)
    report_block = {}
    report_table = data.get("report", {})
    if not isinstance(report_table, dict):
        r.problems.append(f"{file_name}: report must be a table [report]")
    else:
        r.check_keys(report_table, "report", ("report",), "report")
        for key in sorted(report_table.keys() & _KEYS["report"]):
            if hasattr(report_table[key], "isoformat"):
                report_block[key] = report_table[key].isoformat()
            else:
                report_block[key] = r.text_value(report_table, key, ("report",), "report")

    # [energy]
    energy_table = data.get("energy", {})
    energy = Energy()
    if isinstance(energy_table, dict):
        r.check_keys(energy_table, "energy", ("energy",), "energy")
        energy = r.energy_fields(energy_table, ("energy",), "energy", None)

    # [conditions.*]
    conditions: dict[str, Condition] = {}
    for cname, table in _named_tables(r, data, "conditions", "condition").items():
        p, entry = ("conditions", cname), f'condition "{cname}"'
        r.check_keys(table, "conditions", p, entry, required=("air",))
        air = r.quantity(table, "air", "temperature", p, entry)
        rh = r.quantity(table, "rh", "percent", p, entry)
        if rh is not None and not 0 < rh <= 100:
            r.problem(p, entry, "rh", f"{rh:g} % is not allowed; relative humidity is above 0 and at most 100 %")
            rh = None
        wind = r.quantity(table, "wind", "speed", p, entry, 0.0, at_least_zero=True)
        surroundings = r.quantity(table, "surroundings", "temperature", p, entry)
        altitude = r.quantity(table, "altitude", "length", p, entry)
        pressure = 101_325.0
        if altitude is not None:
            from .model import pressure_at_altitude_pa

            pressure = r.guard(p, entry, "altitude", lambda a: float(pressure_at_altitude_pa(a)), altitude) or pressure
        if air is not None:
            conditions[cname] = Condition(cname, air, rh, wind, surroundings, pressure, r.pos.header(p))

    # [services.*]
    services: dict[str, Service] = {}
    for sname, table in _named_tables(r, data, "services", "service").items():
        service = _service(r, sname, table, energy, code, cost_table)
        if service is not None:
            services[sname] = service

    # [[lines]]
    lines: list[Line] = []
    raw_lines = data.get("lines", [])
    if not isinstance(raw_lines, list) or not all(isinstance(x, dict) for x in raw_lines):
        r.problems.append(f"{file_name}: lines must be [[lines]] tables")
        raw_lines = []
    if not raw_lines:
        r.problems.append(f"{file_name}: no [[lines]]: add at least one line with service, size, length "
                              "and condition")
    counter: dict[tuple, int] = {}
    for index, table in enumerate(raw_lines, start=1):
        line = _line(r, index, table, services, conditions, data.get("services", {}), data.get("conditions", {}))
        if line is not None:
            lines.append(line)
    # tags name lines: unique ones
    seen: dict[str, int] = {}
    for line in lines:
        if not line.tag:
            continue
        if line.tag in seen:
            r.problem(("lines", line.index), f"lines entry {line.index}", "tag",
                      f'tag "{line.tag}" is already used by lines entry {seen[line.tag]}')
        seen.setdefault(line.tag, line.index)
    if r.problems:
        raise ProjectError(r.problems)
    # automatic ids: "service size condition #n"
    out = []
    for line in lines:
        if line.tag:
            out.append(line)
            continue
        key = (line.service, line.size.label, line.condition)
        counter[key] = counter.get(key, 0) + 1
        out.append(Line(line.index, f"{line.service} {line.size.label} {line.condition} #{counter[key]}",
                        line.service, line.size, line.length_m, line.condition, line.fittings, line.file_line))
    return Project(name, units, r.currency, Path(base_dir) / file_name, code, r.code_paths, energy, conditions,
                   services, out, cost_table, file_name, {k: v for k, v in report_block.items() if v})


def load_project(path) -> Project:
    """Read and check the project file at *path* (see :func:`parse_project`)."""
    from .fileio import read_text_input

    text = read_text_input(path, "PROJECT")
    path = Path(path)
    return parse_project(text, path.name, path.parent)


def _named_tables(r: _Reader, data: dict, top: str, what: str) -> dict[str, dict]:
    tables = data.get(top, {})
    if not isinstance(tables, dict):
        r.problems.append(f"{r.file_name}: {top} must be tables like [{top}.name]")
        return {}
    out = {}
    for name, table in tables.items():
        if not isinstance(table, dict):
            line = r.pos.key((top,), name)
            r.problems.append(f"{_where(r.file_name, line, f'{what} {name!r}')}: "
                              f"write the {what} as a table [{top}.{name}] with keys")
            continue
        out[name] = table
    return out


def _service(r: _Reader, sname: str, table: dict, energy: Energy, code, cost_table) -> Service | None:
    from .criteria import Requirements
    from .sizing import DEFAULT_DEW_MARGIN_K

    p, entry = ("services", sname), f'service "{sname}"'
    r.check_keys(table, "services", p, entry, required=("material",))
    ok_before = len(r.problems)
    temp = r.quantity(table, "temperature", "temperature", p, entry)
    steam = r.quantity(table, "steam_pressure", "steam_pressure", p, entry, positive=True)
    if "temperature" in table and "steam_pressure" in table:
        r.problem(p, entry, "steam_pressure", "give temperature or steam_pressure, not both")
    elif "temperature" not in table and "steam_pressure" not in table:
        r.problem(p, entry, None, 'the key "temperature" (or "steam_pressure" for steam) is missing')
    fluid = r.text_value(table, "fluid", p, entry, None if "steam_pressure" in table else "water")
    if fluid is not None and "steam_pressure" in table and "temperature" not in table:
        r.problem(p, entry, "fluid", "a steam service takes no fluid (it is steam)")
        fluid = None
    if fluid is not None:
        from .props.liquids import normalise_fluid

        checked = r.guard(p, entry, "fluid", normalise_fluid, fluid)
        if checked is not None and temp is not None:
            from .props.liquids import check_fluid_temp

            r.guard(p, entry, "temperature", check_fluid_temp, checked, temp)
    material = r.text_value(table, "material", p, entry)
    if material is not None:
        from .units import material_in_si

        material = r.guard(p, entry, "material", material_in_si, material, r.units, "material")
    if material is not None:
        from .catalog.materials import lookup_material

        r.guard(p, entry, "material", lookup_material, material)
    finish = r.text_value(table, "finish", p, entry)
    if finish is not None:
        from .catalog.finishes import lookup_finish

        r.guard(p, entry, "finish", lookup_finish, finish)
    series = r.text_value(table, "series", p, entry)
    if series is not None:
        from .catalog.series import series_names

        if series not in series_names():
            r.problem(p, entry, "series", f'unknown thickness series "{series}"; {closest_names(series, series_names())}')
    schedule = r.text_value(table, "schedule", p, entry)
    criteria = None
    if "criteria" in table:
        items = table["criteria"]
        if not isinstance(items, list) or not all(isinstance(x, str) for x in items):
            r.problem(p, entry, "criteria", 'criteria must be a list, e.g. ["touch", "heat_flow"]')
        else:
            criteria = []
            for item in items:
                if item not in CRITERIA:
                    r.problem(p, entry, "criteria", f'unknown criterion "{item}"; {closest_names(item, CRITERIA)}')
                else:
                    criteria.append(item)
    max_q = r.quantity(table, "max_heat_flow", "heat_flow_per_length", p, entry, positive=True)
    reduction = r.fraction(table, "min_reduction", p, entry, None, 0.0, 1.0,
                           "the reduction must be above 0 % and below 100 %")
    flow = r.quantity(table, "flow", "flow", p, entry, positive=True)
    max_dt = r.quantity(table, "max_temp_change", "temperature_difference", p, entry, positive=True)
    hold = r.quantity(table, "hold_time", "time", p, entry, positive=True)
    ice = r.fraction(table, "ice_fraction", p, entry, 0.0, 0.0, 1.0, "the ice fraction is from 0 to 100 %")
    touch_limit = r.quantity(table, "touch_limit", "temperature", p, entry)
    contact = r.quantity(table, "contact_time", "time", p, entry, positive=True)
    dew = r.quantity(table, "dew_margin", "temperature_difference", p, entry, DEFAULT_DEW_MARGIN_K, at_least_zero=True)
    scode = r.rule_set(table, p, entry, code)
    scost = r.cost_table(table, p, entry) if "cost_table" in table else cost_table
    senergy = r.energy_fields(table, p, entry, energy)

    given = {"heat_flow": max_q is not None or reduction is not None, "temp_change": max_dt is not None,
             "freeze": hold is not None, "code": scode is not None, "economic": scost is not None}
    if criteria is None:  # default: every criterion the service gives the data for
        criteria = ["touch", "condensation"] + [k for k in ("heat_flow", "temp_change", "freeze", "code", "economic")
                                                 if given[k]]
    else:
        needs = {"heat_flow": '"max_heat_flow" or "min_reduction"', "temp_change": '"max_temp_change"',
                 "freeze": '"hold_time"', "code": '"code" (here or in [project])',
                 "economic": '"cost_table" (here or in [project])'}
        for key, what in needs.items():
            if key in criteria and not given[key]:
                r.problem(p, entry, "criteria", f'criterion "{key}" needs the key {what}')
        if "economic" in criteria and senergy.price is None:
            r.problem(p, entry, "criteria", 'criterion "economic" needs an energy price ("price" here or in [energy])')
        if not table["criteria"]:
            r.problem(p, entry, "criteria", f"give at least one criterion of {', '.join(CRITERIA)}")
    if "temp_change" in criteria:
        if steam is not None:
            r.problem(p, entry, "max_temp_change", "condensing steam stays at its saturation temperature; "
                                                   "a temperature change applies to liquids")
        elif flow is None:
            r.problem(p, entry, "max_temp_change", 'the temperature change needs the key "flow"')
    if "freeze" in criteria and fluid is not None:
        from .props.liquids import normalise_fluid

        if r.guard(p, entry, "fluid", normalise_fluid, fluid) not in ("water", None):
            r.problem(p, entry, "hold_time", "the freeze hold time is for water lines only")
    if len(r.problems) > ok_before:
        return None
    req = Requirements(
        touch="touch" in criteria,
        touch_limit_c=touch_limit, contact_time_s=contact, dew_margin_k=dew,
        max_heat_flow_w_per_m=max_q if "heat_flow" in criteria else None,
        min_reduction=reduction if "heat_flow" in criteria else None,
        max_temp_change_k=max_dt if "temp_change" in criteria else None,
        hold_time_s=hold if "freeze" in criteria else None,
        ice_fraction=ice,
    )
    return Service(sname, fluid, temp, steam, material, finish, series, schedule, tuple(criteria), req, flow,
                   scode if "code" in criteria else None, senergy,
                   scost, r.pos.header(p))


def _line(r: _Reader, index: int, table: dict, services: dict, conditions: dict, raw_services,
          raw_conditions) -> Line | None:
    p = ("lines", index)
    tag = table.get("tag") if isinstance(table.get("tag"), str) else ""
    entry = f"lines entry {index}" + (f' "{tag}"' if tag else "")
    r.check_keys(table, "lines", p, entry, required=("service", "size", "length", "condition"))
    before = len(r.problems)
    if "tag" in table:
        r.text_value(table, "tag", p, entry)
    sname = r.text_value(table, "service", p, entry)
    if sname is not None and sname not in raw_services:
        r.problem(p, entry, "service", f'unknown service "{sname}"; {closest_names(sname, list(raw_services) or ["(none)"])}')
    cname = r.text_value(table, "condition", p, entry)
    if cname is not None and cname not in raw_conditions:
        known = list(raw_conditions) or ["(none)"]
        r.problem(p, entry, "condition", f'unknown condition "{cname}"; {closest_names(cname, known)}')
    size_text = r.text_value(table, "size", p, entry)
    size = None
    if size_text is not None:
        from .catalog.pipes import lookup_pipe

        service = services.get(sname)
        schedule = service.schedule if service is not None else None
        if schedule is not None and not size_text.strip().upper().startswith("NPS"):
            schedule = None  # a steel schedule applies to NPS sizes only
        size = r.guard(p, entry, "size", lookup_pipe, size_text, schedule)
    length = r.quantity(table, "length", "length", p, entry, positive=True)
    fittings = {kind: r.count(table, key, p, entry) for key, kind in _FITTINGS.items()}
    if size is not None and any(fittings.values()):
        from .catalog.fittings import equivalent_length_m

        for kind, n in fittings.items():
            if n:
                r.guard(p, entry, kind + "s", equivalent_length_m, kind, size.outer_diameter_m)
    if len(r.problems) > before or sname not in services or cname not in conditions:
        return None
    return Line(index, tag, sname, size, length, cname, fittings, r.pos.header(p))
