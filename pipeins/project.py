"""The project file: a whole job's lines, services and surroundings in one TOML file.

A project file has six kinds of table (see ``examples/*.toml``; every key, with its unit
and default, in ``docs/project-file.md``)::

    [project]               name, units ("si" or "us"), currency, code, cost_table, code_tables
    [energy]                price, co2, efficiency, cop, hours, discount_rate, life, escalation,
                            maintenance
    [conditions.<name>]     air, rh, wind, surroundings, altitude or air_pressure, orientation,
                            height, outer_h
    [services.<name>]       fluid, temperature or steam_pressure, material, finish, emittance,
                            series, schedule, pipe_material, criteria and their keys, flow,
                            velocity, inner_h, code, cost_table, and the energy keys
    [[lines]]               service, size (or od and wall), length, condition, tag, fittings,
                            and per-line overrides: material, thickness, finish, emittance,
                            pipe_material, orientation, height
    [report]                project, number, client, revision, date, prepared_by, checked_by
                            (the title block of the HTML and XLSX reports; text)

Every value is read by :func:`pipeins.inputs.parse_value`, the reader the command line
uses too, so the file and the flags accept and refuse the same things.  Quantities are
text with their unit (``"82 C"``, ``"2 in"``, ``"120 m"``, ``"10 barg"``, ``"0.09/kWh"``); a
bare number takes the unit of the project's unit system.  Paths are relative to the
project file.

A line that overrides its service's build-up (material, thickness, finish …) or its
location (orientation, height) is scheduled under a service or location of its own,
named after the original with the overrides, e.g. ``hot water (cellular glass)`` or
``plant_room (vertical, 12 m)``.

:func:`load_project` reads and checks the whole file and raises ONE :class:`ProjectError`
that lists every problem, each as ``<file>: line <n> (<entry>): <key>: <message>``.

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
pipeins.project.ProjectError: demo.toml: line 8 (service "hot"): material: unknown material "glas wool"; did you mean "glass wool"?
"""

from __future__ import annotations

import re
from dataclasses import dataclass, field, replace
from pathlib import Path
from typing import Any

from .criteria.registry import project_names as _criterion_names
from .errors import InputError, closest_names
from .inputs import BY_NAME, PARAMS, check_line, file_word, in_words, parse_value

__all__ = ["ProjectError", "Project", "Energy", "Condition", "Service", "Line", "load_project",
           "parse_project", "CRITERIA", "DEFAULT_HOURS_PER_YEAR", "KEYS"]

#: Criteria a service may list, in report order.
#: The names a service's ``criteria`` list accepts (the registered criteria, :mod:`pipeins.criteria.registry`).
CRITERIA = _criterion_names()
#: Operating hours per year when none are given: all year (common practice for a first estimate).
DEFAULT_HOURS_PER_YEAR = 8760.0
_FITTINGS = {"valves": "valve", "flanges": "flange", "strainers": "strainer"}


def _param_keys(table: str) -> set:
    return {p.key for p in PARAMS if p.key and table in p.tables}


#: Every key the reader knows, per kind of table (the key reference, docs/project-file.md,
#: lists each one; a test checks it).
KEYS = {
    "project": {"name", "units", "lines_file", "lines_sheet", "materials_file"} | _param_keys("project"),
    "energy": _param_keys("energy"),
    "conditions": _param_keys("conditions") | {"criteria_here"},
    "services": _param_keys("services") | {"criteria", "conditions"},
    "lines": _param_keys("lines") | {"service", "condition", "conditions", "tag"},
    "faces": _param_keys("faces") | {"service", "condition", "conditions", "tag"},
    "vessels": _param_keys("vessels") | {"service", "condition", "conditions", "tag"},
    # the title block of the HTML and XLSX reports (pipeins.reports.html.TITLE_BLOCK_KEYS)
    "report": {"project", "number", "client", "revision", "date", "prepared_by", "checked_by"},
}
_KEYS = KEYS
#: (table, key) -> the parameter it fills.
_PARAM_OF = {(t, p.key): p.name for p in PARAMS if p.key for t in p.tables}
_TOP = ("project", "energy", "conditions", "services", "lines", "faces", "vessels", "report", "lines_columns")
#: The tables of items: runs of pipe or duct, flat faces, vessels (and spheres).
ITEM_TABLES = ("lines", "faces", "vessels")
#: Line keys that give the line a build-up (or a service) of its own, and those that give it a
#: location of its own (a run's; a face's height is its own size).
_LINE_SERVICE_KEYS = ("material", "thickness", "finish", "emittance", "pipe_material", "sheet", "flow", "velocity",
                      "duct_location", "duct_service", "buried", "soil", "soil_k", "ground_temp", "twin_spacing",
                      "return_temp", "twin_casing", "casing_insulation")
#: The parameters of a buried line (pipeins.buried): the depth, then the rest.
_BURIED = ("depth_m", "soil", "soil_k_w_mk", "ground_temp_c", "twin_spacing_m", "return_temp_c", "casing_diameter_m",
           "casing_insulation")
_LINE_CONDITION_KEYS = ("orientation", "height")
#: The keys of an item read as its own values (service, condition(s), tag and size are read apart).
_LINE_OWN_KEYS = {t: frozenset(KEYS[t] - {"service", "condition", "conditions", "tag", "size"}) for t in ITEM_TABLES}
#: The keys that say what section a [[lines]] row of a line list is (a face or a vessel).
_ROW_KINDS = {"face": "faces", "area": "faces", "vessel": "vessels", "sphere": "vessels", "diameter": "vessels",
              "count": "vessels", "heads": "vessels", "floor": "vessels"}


class ProjectError(InputError):
    """Every problem of a project file at once.

    ``problems`` is the list of one-line messages, each starting with the file name;
    ``str(exc)`` joins them with newlines.
    """

    def __init__(self, problems: list[str]):
        self.problems = list(dict.fromkeys(problems))
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
    maintenance: float = 0.0   # share of the installed cost per year


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
    orientation: str = "horizontal"
    height_m: float | None = None
    outer_h_w_m2k: float | None = None
    #: The criteria this condition takes when a line has several (None: the default rule of
    #: :func:`pipeins.design_conditions.criteria_under`).
    criteria_here: tuple | None = None
    solar_w_m2: float | None = None     # sun [W/m²] on a surface normal to it
    absorptance: float | None = None    # solar absorptance (None: the finish's)

    @property
    def spec_kw(self) -> dict:
        """The :class:`pipeins.line.LineSpec` fields this location sets beyond air, RH, wind,
        surroundings and pressure."""
        kw = {"orientation": self.orientation, "height_m": self.height_m}
        for name in ("outer_h_w_m2k", "solar_w_m2", "absorptance"):
            if getattr(self, name) is not None:
                kw[name] = getattr(self, name)
        return kw


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
    emittance: float | None = None
    pipe_material: str | None = None
    velocity_m_s: float | None = None
    inner_h_w_m2k: float | None = None
    conditions: tuple = ()     # the conditions of its lines that name none
    base: str | None = None    # the service a line's overrides derive this one from
    thickness_m: float | None = None   # a line's given thickness: checked, not sized
    entry: str | None = None           # where a derived service comes from ("lines entry 3")
    #: Heat tracing of its lines, ((parameter, value), …) of maintain_temp_c, min_ambient_c,
    #: safety_factor_percent, tracer_output_w_per_m as given, or None: pipeins.schedule_tracing.
    tracing: Any = None
    sheet: str | None = None           # sheet metal of a duct, face or vessel wall
    fluid_given: bool = True           # False: the fluid is the default (water; air in a duct)
    #: A buried line's inputs, ((parameter, value), …) of depth_m, soil or soil_k_w_mk,
    #: ground_temp_c and a twin's twin_spacing_m, return_temp_c, casing_diameter_m,
    #: casing_insulation, or None (in air): pipeins.schedule_buried.
    buried: Any = None
    #: The design-conductivity factors (pipeins.user_materials.DesignFactors) of its material, or
    #: None: they apply to its fittings' covers too (pipeins.schedule_fittings).
    design_factors: Any = None
    criteria_listed: bool = True       # False: the criteria are the defaults (none listed)

    @property
    def buried_inputs(self) -> dict:
        """The buried-line inputs by parameter name ({} for a line in air)."""
        return dict(self.buried or ())

    @property
    def fluid_temp_c(self) -> float:
        """The fluid temperature [°C] (saturation temperature for steam)."""
        if self.steam_pressure_pa is not None:
            from .props.steam import saturation_temp_c

            return float(saturation_temp_c(self.steam_pressure_pa))
        return float(self.temp_c)

    @property
    def spec_kw(self) -> dict:
        """The :class:`pipeins.line.LineSpec` fields this service sets beyond fluid,
        temperature, flow and finish."""
        kw = {"emittance": self.emittance, "pipe_material": self.pipe_material,
              "velocity_m_s": self.velocity_m_s, "inner_h_w_m2k": self.inner_h_w_m2k, "sheet": self.sheet}
        return {k: v for k, v in kw.items() if v is not None}


@dataclass(frozen=True, slots=True)
class Line:
    """One item of the schedule: a run of pipe or duct (its length), a flat face (its area)
    or a vessel (its count), with its service, size, location and bare fittings.

    ``kind`` is ``"pipe"``, ``"duct"``, ``"face"``, ``"vessel"`` or ``"sphere"``; ``section``
    holds the :class:`pipeins.line.LineSpec` fields of a section other than a pipe, as
    ``(field, value)`` pairs (``duct``; ``face`` with ``height_m`` or ``length_m``; ``vessel``
    with ``vessel_diameter_m``, ``length_m``, ``heads``, ``floor``; ``sphere_diameter_m``).
    ``length_m`` is the run length of a pipe or duct (None for a face or vessel)."""

    index: int                 # 1-based position among [[lines]] (or [[faces]], [[vessels]])
    tag: str
    service: str
    size: Any                  # pipeins.catalog.pipes.PipeSize (a section's: pipeins.line.LineSpec.section_size)
    length_m: float | None
    condition: str
    fittings: dict = field(default_factory=dict)   # "valve"/"flange"/"strainer" -> count
    file_line: int = 0
    kind: str = "pipe"
    section: tuple = ()
    area_m2: float | None = None   # a face's area [m²]
    count: int | None = None       # a vessel line's number of identical vessels
    table: str = "lines"           # the table it was given in
    #: Fittings listed as objects (pipeins.catalog.fittings.Fitting) and their cover
    #: (material, thickness [m]) or None: pipeins.schedule_fittings.
    fitting_objects: tuple = ()
    cover: tuple | None = None

    @property
    def quantity(self) -> float:
        """The line's amount in its own basis: length [m], area [m²] or count."""
        if self.kind == "face":
            return float(self.area_m2)
        if self.kind in ("vessel", "sphere"):
            return float(self.count)
        return float(self.length_m)


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
    materials: dict = field(default_factory=dict)  # materials_file: user materials by key (pipeins.user_materials)
    materials_warnings: list = field(default_factory=list)
    #: A line's several conditions: the name it is scheduled under ("summer + winter") -> the
    #: names of its conditions (pipeins.design_conditions).
    condition_sets: dict = field(default_factory=dict)

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
        self.text = text
        self.headers: dict[tuple, int] = {}
        self._keys: dict[tuple, int] | None = None  # found on the first problem (most files have none)
        self._scan(keys=False)

    def _scan(self, keys: bool) -> None:
        found: dict[tuple, int] = {}
        counts: dict[tuple, int] = {}
        current: tuple = ()
        for number, raw in enumerate(self.text.splitlines(), start=1):
            if raw.lstrip().startswith("["):  # only such a line can be a header
                m = _HEADER_RE.match(raw)
                if m:
                    path = _split_path(m.group(2))
                    if m.group(1) == "[[":
                        counts[path] = counts.get(path, 0) + 1
                        path = path + (counts[path],)
                    current = path
                    self.headers.setdefault(current, number)
                    continue
            if keys:
                k = _KEY_RE.match(raw)
                if k:
                    key = k.group(1).strip("\"'")
                    found.setdefault(current + (key,), number)
        if keys:
            self._keys = found

    @property
    def keys(self) -> dict[tuple, int]:
        if self._keys is None:
            self._scan(keys=True)
        return self._keys

    def header(self, path: tuple) -> int:
        return self.headers.get(path, 0)

    def key(self, path: tuple, key: str) -> int:
        return self.keys.get(path + (key,), self.headers.get(path, 0))


def _where(file_name: str, file_line: int, entry: str, key: str | None = None) -> str:
    place = f"line {file_line} " if file_line else ""
    return f"{file_name}: {place}({entry})" + (f": {key}" if key else "")


# --------------------------------------------------------------------------- the reader
class _Reader:
    def __init__(self, text: str, file_name: str, base_dir: Path):
        self.text = text
        self.file_name = file_name
        self.base = base_dir
        self.pos = _Positions(text)
        self.problems: list[str] = []
        self.units = "si"
        self.currency = ""
        self.code_paths: tuple = ()
        self.places: dict = {}  # ("lines", index) of a line-list row -> its place (pipeins.linelist)
        # Line lists repeat the same texts ("50 m", "NPS 2") thousands of times: each distinct
        # value is read once; what it gave (a value or the refusal) is replayed for the rest.
        self._memo: dict = {}

    # -- reporting --------------------------------------------------------------------
    def problem(self, path: tuple, entry: str, key: str | None, message: str) -> None:
        if path in self.places:  # a line-list row: its file, sheet, row and column
            self.problems.append(self.places[path](key, in_words(message, file_word)))
            return
        line = self.pos.key(path, key) if key else self.pos.header(path)
        self.problems.append(f"{_where(self.file_name, line, entry, key)}: {in_words(message, file_word)}")

    def guard(self, path, entry, key, func, *args, **kw):
        """Call *func*; an InputError becomes a problem at (path, key) and the result None."""
        try:
            return func(*args, **kw)
        except InputError as exc:
            self._refused(path, entry, key, exc)
            return None

    def _refused(self, path, entry, key, exc: InputError) -> None:
        for name, message in getattr(exc, "items", None) or [(exc.name, exc.message)]:
            self.problem(path, entry, key, message)

    def cached(self, path, entry, key, func, *args):
        """:meth:`guard` for a pure *func* of hashable *args*: each distinct call runs once;
        a repeat gives the same value, or the same problems at its own place."""
        memo_key = (func, *((type(a), a) for a in args))
        try:
            hit = self._memo.get(memo_key)
        except TypeError:  # an unhashable argument: no memo
            return self.guard(path, entry, key, func, *args)
        if hit is None:
            try:
                hit = (func(*args), None)
            except InputError as exc:
                hit = (None, exc)
            self._memo[memo_key] = hit
        if hit[1] is not None:
            self._refused(path, entry, key, hit[1])
        return hit[0]

    # -- typed values -----------------------------------------------------------------
    def check_keys(self, table: dict, kind: str, path: tuple, entry: str, required=()):
        allowed = KEYS[kind]
        for key in table:
            if key not in allowed:
                hint = closest_names(str(key), sorted(allowed))
                self.problem(path, entry, str(key), f'unknown key "{key}"; {hint}')
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

    def value(self, table, kind, key, path, entry, default=None):
        """The value of *key*, read by :func:`pipeins.inputs.parse_value` (the command
        line's reader) for the parameter the key fills; *default* when absent or refused."""
        if key not in table:
            return default
        param = BY_NAME[_PARAM_OF[(kind, key)]]
        raw = table[key]
        if param.kind == "text":
            return self.text_value(table, key, path, entry, default)
        if param.kind == "list":   # a list of texts, or one text of items split by ";" (a line list's cell)
            items = raw.split(";") if isinstance(raw, str) else raw
            if not isinstance(items, list) or not all(isinstance(x, str) for x in items):
                self.problem(path, entry, key, f'{key} must be a list of texts, e.g. {key} = ["…", "…"]')
                return default
            return tuple(x.strip() for x in items if x.strip())
        if param.kind not in ("count", "choice") and (isinstance(raw, bool) or not isinstance(raw, (str, int, float))):
            self.problem(path, entry, key, f"{key} must be a number or text with a unit, e.g. {key} = \"…\"")
            return default
        result = self.cached(path, entry, key, parse_value, param.name, raw, self.units)
        return default if result is None else result

    def values(self, table, kind, path, entry, keys) -> dict:
        """Parameter → value of every *keys* present in *table* (refused ones left out)."""
        out = {}
        for key in keys:
            if key in table:
                v = self.value(table, kind, key, path, entry)
                if v is not None:
                    out[_PARAM_OF[(kind, key)]] = v
        return out

    def cross_check(self, given: dict, origin: dict, fallback: tuple, skip=()) -> None:
        """The rules between inputs (:func:`pipeins.inputs.check_line`), each problem
        placed at the key of the parameter it names (``origin``: parameter → (path,
        entry, key), or a function that builds it when a problem needs it)."""
        try:
            memo_key = (check_line, tuple((k, type(v), v) for k, v in given.items()))
            found = self._memo.get(memo_key)
        except TypeError:  # an unhashable value: no memo
            memo_key, found = None, None
        if found is None:
            found = check_line(given)
            if memo_key is not None:
                self._memo[memo_key] = found
        for name, message in found:
            if (name, message) in skip:
                continue
            if callable(origin):
                origin = origin()
            path, entry, key = origin.get(name) or fallback
            self.problem(path, entry, key, message)

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
        base = base or Energy()
        kw = dict(base.__dict__)
        v = self.values(table, "energy", path, entry, [k for k in KEYS["energy"] if k in table])
        if "price" in v:
            kw["price"] = replace(v["price"], currency=self.currency or v["price"].currency)
        if "emission" in v:
            kw["co2"] = v["emission"]
        for name, target in (("efficiency", "efficiency"), ("cop", "cop"), ("discount_rate", "discount_rate"),
                             ("years", "years"), ("escalation", "escalation"),
                             ("maintenance_fraction", "maintenance")):
            if name in v:
                kw[target] = v[name]
        if "hours_per_year" in v:
            kw["hours_per_year"] = v["hours_per_year"] / 3600.0
        return Energy(**kw)

    def rule_set(self, table, path, entry, default):
        name = self.text_value(table, "code", path, entry)
        if name is None:
            return default
        from .codes import load_rule_sets

        sets = self.guard(path, entry, "code", load_rule_sets, self.code_paths)
        if sets is None:
            return default
        from .duct_codes import load_duct_rule_sets

        sets = list(sets) + list(load_duct_rule_sets())  # pipe rule sets and duct rule sets
        if name not in sets:
            self.problem(path, entry, "code", f'unknown rule set "{name}"; {closest_names(name, sets)}')
            return default
        return name

    def climate_zone_value(self, table, path, entry, default):
        """The climate zone of a duct code minimum (checked as the duct rule sets read it)."""
        zone = self.text_value(table, "climate_zone", path, entry)
        if zone is None:
            return default
        from .duct_codes import parse_climate_zone

        self.guard(path, entry, "climate_zone", parse_climate_zone, zone)
        return zone

    def cost_table(self, table, path, entry):
        full = self.path_value(table, "cost_table", path, entry)
        if full is None:
            return None
        from .economics import CostTable

        return self.guard(path, entry, "cost_table", CostTable.from_csv, full)


def parse_project(text: str, file_name: str = "project.toml", base_dir=".", progress=None) -> Project:
    """Read a project from TOML *text*; *file_name* names it in errors and *base_dir*
    anchors its relative paths.  Raises :class:`ProjectError` listing every problem.
    *progress*, when given, is called as ``progress("reading lines", done, total)`` every
    thousand lines (a front end's progress bar; the library never prints)."""
    import tomllib

    from .bulk import paused_gc
    from .fileio import load_toml
    from .user_materials import materials_in_use, project_materials

    try:
        with paused_gc():
            data = load_toml(text, file_name)  # read once: the materials hook and the reader share it
    except tomllib.TOMLDecodeError as exc:
        message = str(exc)
        m = re.search(r"\(at line (\d+), column \d+\)", message)
        line = f"line {m.group(1)}: " if m else ""
        raise ProjectError([f"{file_name}: {line}not valid TOML: {message}"]) from None
    materials = project_materials(text, file_name, base_dir, data)  # [project] materials_file, found first
    with materials_in_use(materials[0]), paused_gc():
        return replace(_parse_project(data, text, file_name, base_dir, materials[2], progress), materials=materials[0],
                       materials_warnings=materials[1])


def _parse_project(data: dict, text: str, file_name: str, base_dir, materials_problem: str | None,
                   progress=None) -> Project:
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
    if materials_problem:
        r.problem(path, "project", "materials_file", materials_problem)
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
    r.climate_zone = r.climate_zone_value(head, path, "project", None)

    # [report]: title-block texts (a TOML date is taken as written)
    report_block = {}
    report_table = data.get("report", {})
    if not isinstance(report_table, dict):
        r.problems.append(f"{file_name}: report must be a table [report]")
    else:
        r.check_keys(report_table, "report", ("report",), "report")
        for key in sorted(report_table.keys() & KEYS["report"]):
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
    else:
        r.problems.append(f"{file_name}: energy must be a table [energy] with keys")

    # [conditions.*]
    conditions: dict[str, Condition] = {}
    condition_values: dict[str, tuple] = {}
    for cname, table in _named_tables(r, data, "conditions", "condition").items():
        p, entry = ("conditions", cname), f'condition "{cname}"'
        r.check_keys(table, "conditions", p, entry, required=("air",))
        before = len(r.problems)
        v = r.values(table, "conditions", p, entry, [k for k in KEYS["conditions"] if k in table and
                                                     k != "criteria_here"])
        here = _criteria_list(r, table, "criteria_here", p, entry) if "criteria_here" in table else None
        origin = {_PARAM_OF[("conditions", k)]: (p, entry, k) for k in table if ("conditions", k) in _PARAM_OF}
        r.cross_check(v, origin, (p, entry, None))
        condition_values[cname] = (v, origin)
        pressure = v.get("pressure_pa", 101_325.0)
        if "altitude_m" in v and "pressure_pa" not in v:
            from .model import pressure_at_altitude_pa

            pressure = r.guard(p, entry, "altitude", lambda a: float(pressure_at_altitude_pa(a)),
                               v["altitude_m"]) or pressure
        if "air_temp_c" in v and len(r.problems) == before:
            conditions[cname] = Condition(cname, v["air_temp_c"], v.get("rh_percent"), v.get("wind_m_s", 0.0),
                                          v.get("surroundings_temp_c"), pressure, r.pos.header(p),
                                          v.get("orientation", "horizontal"), v.get("height_m"),
                                          v.get("outer_h_w_m2k"), here, v.get("solar_w_m2"),
                                          v.get("absorptance"))

    r.conditions_read = conditions
    # [services.*]
    services: dict[str, Service] = {}
    service_values: dict[str, tuple] = {}
    for sname, table in _named_tables(r, data, "services", "service").items():
        service = _service(r, sname, table, energy, code, cost_table, service_values)
        if service is not None and "conditions" in table:
            service = replace(service, conditions=_condition_list(
                r, table, ("services", sname), f'service "{sname}"', data.get("conditions", {})))
        if service is not None:
            services[sname] = service

    # [[lines]]
    lines: list[Line] = []
    raw_lines = data.get("lines", [])
    if not isinstance(raw_lines, list) or not all(isinstance(x, dict) for x in raw_lines):
        r.problems.append(f"{file_name}: lines must be [[lines]] tables")
        raw_lines = []
    if "lines_file" in head:  # the rows of a CSV/XLSX line list join [[lines]] (pipeins.linelist)
        from .linelist import add_line_list

        raw_lines = add_line_list(r, head, data.get("lines_columns"), raw_lines)
    elif "lines_columns" in data:
        r.problems.append(f"{file_name}: [lines_columns] maps the columns of a line list; add lines_file to "
                          "[project]")
    items = [("lines", raw_lines)]
    for top in ("faces", "vessels"):  # flat faces (by area) and vessels (by count) beside the runs
        raw = data.get(top, [])
        if not isinstance(raw, list) or not all(isinstance(x, dict) for x in raw):
            r.problems.append(f"{file_name}: {top} must be [[{top}]] tables")
            raw = []
        items.append((top, raw))
    if not any(raw for _, raw in items) and "lines_file" not in head:
        r.problems.append(f"{file_name}: no [[lines]]: add at least one line with service, size, length "
                          "and condition (or [[faces]], [[vessels]])")
    raw_services = data.get("services", {}) if isinstance(data.get("services"), dict) else {}
    raw_conditions = data.get("conditions", {}) if isinstance(data.get("conditions"), dict) else {}
    seen: dict[str, str] = {}
    repeats: dict[tuple, Line] = {}  # the first clean run of each shape (pipeins.project._repeat_shape)
    for top, raw in items:
        for index, table in enumerate(raw, start=1):
            if progress is not None and index % 1000 == 0:
                progress("reading lines", index, len(raw))
            # tags name lines: a repeated one is reported with the line's other problems
            tag = table.get("tag") if isinstance(table.get("tag"), str) else ""
            duplicate = seen.get(tag) if tag else None
            if tag:
                seen.setdefault(tag, f"{top} entry {index}")
            kind = top
            if top == "lines" and ("lines", index) in r.places:  # a line-list row: the item its columns say
                kind = next((t for k, t in _ROW_KINDS.items() if k in table), "lines")
            shape = _repeat_shape(kind, table)
            if shape is not None and shape in repeats:  # a run as an earlier one but for its tag and length
                line = _repeat(r, repeats[shape], index, table, duplicate, (top, index))
            else:
                before = len(r.problems)
                line = _line(r, index, table, services, conditions, raw_services, raw_conditions, service_values,
                             condition_values, duplicate, kind, (top, index))
                if shape is not None and line is not None and len(r.problems) == before:
                    repeats[shape] = line
            if line is not None:
                lines.append(line)
    if r.problems:
        raise ProjectError(r.problems)
    # automatic ids: "service size condition #n"
    counter: dict[tuple, int] = {}
    out = []
    for line in lines:
        if line.tag:
            out.append(line)
            continue
        key = (line.service, line.size.label, line.condition)
        counter[key] = counter.get(key, 0) + 1
        out.append(_with(line, tag=f"{line.service} {line.size.label} {line.condition} #{counter[key]}"))
    return Project(name, units, r.currency, Path(base_dir) / file_name, code, r.code_paths, energy, conditions,
                   services, out, cost_table, file_name, {k: v for k, v in report_block.items() if v},
                   condition_sets=r.__dict__.get("condition_sets", {}))


def load_project(path, progress=None) -> Project:
    """Read and check the project file at *path* (see :func:`parse_project`)."""
    from .fileio import read_text_input

    text = read_text_input(path, "PROJECT")
    path = Path(path)
    return parse_project(text, path.name, path.parent, progress)


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


def _service(r: _Reader, sname: str, table: dict, energy: Energy, code, cost_table, service_values) -> Service | None:
    from .criteria import Requirements
    from .criteria.registry import needed_keys, records, requirements_for
    from .inputs import REQUIREMENT_PARAMS

    p, entry = ("services", sname), f'service "{sname}"'
    r.check_keys(table, "services", p, entry, required=("material",))
    ok_before = len(r.problems)
    quantity_keys = [k for k in KEYS["services"] if k in table and k not in
                     ("criteria", "conditions", "code", "cost_table", "fluid", "material", "finish", "series", "schedule",
                      "pipe_material", "climate_zone") and k not in KEYS["energy"]]
    v = r.values(table, "services", p, entry, quantity_keys)
    origin = {_PARAM_OF[("services", k)]: (p, entry, k) for k in table if ("services", k) in _PARAM_OF}
    temp, steam = v.get("fluid_temp_c"), v.get("steam_pressure_pa")
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

        found = r.guard(p, entry, "material", lookup_material, material)
        factors = {k: v[k] for k in ("ageing_percent", "moisture_percent", "joints_percent") if k in v}
        design_factors = None
        if found is not None and factors:   # the design conductivity (pipeins.user_materials)
            from .user_materials import DesignFactors, register_design_material

            design_factors = r.guard(p, entry, "ageing_factor", DesignFactors, **factors)
            material = r.guard(p, entry, "ageing_factor", lambda: register_design_material(
                found, DesignFactors(**factors)))
    finish = r.text_value(table, "finish", p, entry)
    if finish is not None:
        from .catalog.finishes import lookup_finish

        r.guard(p, entry, "finish", lookup_finish, finish)
    pipe_material = r.text_value(table, "pipe_material", p, entry)
    if pipe_material is not None:
        from .catalog.materials import lookup_wall_material

        r.guard(p, entry, "pipe_material", lookup_wall_material, pipe_material)
    if v.get("sheet") is not None:
        from .catalog.ducts import lookup_sheet

        r.guard(p, entry, "sheet", lookup_sheet, v["sheet"])
    zone = r.climate_zone_value(table, p, entry, getattr(r, "climate_zone", None))
    series = r.text_value(table, "series", p, entry)
    if series is not None:
        from .catalog.series import series_names

        if series not in series_names():
            r.problem(p, entry, "series", f'unknown thickness series "{series}"; {closest_names(series, series_names())}')
    schedule = r.text_value(table, "schedule", p, entry)
    given = {**v, "finish": finish}
    r.cross_check({k: x for k, x in given.items() if k not in ("fluid_temp_c", "steam_pressure_pa")}, origin,
                  (p, entry, None))
    service_values[sname] = (given, origin)
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
    flow = v.get("flow")
    scode = r.rule_set(table, p, entry, code)
    scost = r.cost_table(table, p, entry) if "cost_table" in table else cost_table
    senergy = r.energy_fields(table, p, entry, energy)

    # what asks for each registered criterion is given (pipeins.criteria.registry)
    registered = [c for c in records() if c.name in CRITERIA]
    given = {c.name: c.default or c.asked(v, {"code": scode, "cost_table": scost}) for c in registered}
    listed = criteria is not None
    if criteria is None:  # default: every criterion the service gives the data for
        # (a tracer output alone is compared with the traced lines' design heat loss, sized for only when listed)
        criteria = [c.name for c in registered if c.default] + [
            c.name for c in registered if not c.default and given[c.name] and c.name != "tracer"]
        if any(k in v for k in _BURIED):   # a buried line: only what applies in the soil
            from .buried import SIZED_FOR

            criteria = [c for c in criteria if c in SIZED_FOR]
    else:
        for c in registered:
            if c.name in criteria and not given[c.name]:
                r.problem(p, entry, "criteria", f'criterion "{c.name}" needs the key {needed_keys(c)}')
        if "economic" in criteria and senergy.price is None:
            r.problem(p, entry, "criteria", 'criterion "economic" needs an energy price ("price" here or in [energy])')
        if not table["criteria"]:
            r.problem(p, entry, "criteria", f"give at least one criterion of {', '.join(CRITERIA)}")
    if "temp_change" in criteria:
        if steam is not None:
            r.problem(p, entry, "max_temp_change", "condensing steam stays at its saturation temperature; "
                                                   "a temperature change applies to liquids")
        elif flow is None and v.get("velocity_m_s") is None:
            r.problem(p, entry, "max_temp_change", 'the temperature change needs the key "flow" (or "velocity" '
                                                   'for a duct)')
    if "freeze" in criteria and fluid is not None:
        from .props.liquids import normalise_fluid

        if r.guard(p, entry, "fluid", normalise_fluid, fluid) not in ("water", None):
            r.problem(p, entry, "hold_time", "the freeze hold time is for water lines only")
    tracing = {k: v[k] for k in ("maintain_temp_c", "min_ambient_c", "safety_factor_percent", "tracer_output_w_per_m")
               if k in v} or None   # heat tracing of the service's lines (pipeins.schedule_tracing)
    if tracing is not None and "maintain_temp_c" not in tracing:
        r.problem(p, entry, file_word(next(iter(tracing))), "is a heat-tracing input: give maintain_temp too")
    buried = {k: v[k] for k in _BURIED if k in v} or None   # a buried line (pipeins.schedule_buried)
    if buried is not None and all(_PARAM_OF[("services", k)] in v for k in table if ("services", k) in _PARAM_OF
                                  and _PARAM_OF[("services", k)] in _BURIED):   # (a refused value is reported)
        _check_buried(r, p, entry, table, buried, None)
        if tracing is not None:
            r.problem(p, entry, file_word(next(iter(tracing))), "heat tracing is worked out for a line in air; a "
                                                                "buried line's tracer is not modelled")
    if "tracer" in criteria and tracing is None:   # (tracing keys without maintain_temp are said above)
        r.problem(p, entry, "criteria", 'criterion "tracer" needs the key "maintain_temp" (the temperature the '
                                        "tracer holds; the tracer output is sized for there, at min_ambient)")
    if len(r.problems) > ok_before:
        return None
    # every requirement the service gives, then only its criteria asked for
    req = requirements_for(Requirements(**{k: x for k, x in v.items() if k in REQUIREMENT_PARAMS}, climate_zone=zone),
                           criteria)
    return Service(sname, fluid, temp, steam, material, finish, series, schedule, tuple(criteria), req, flow,
                   scode if "code" in criteria else None, senergy, scost, r.pos.header(p),
                   emittance=v.get("emittance"), pipe_material=pipe_material, velocity_m_s=v.get("velocity_m_s"),
                   inner_h_w_m2k=v.get("inner_h_w_m2k"), sheet=v.get("sheet"),
                   fluid_given="fluid" in table or "steam_pressure" in table,
                   tracing=tuple(tracing.items()) if tracing else None,
                   buried=tuple(buried.items()) if buried else None, criteria_listed=listed,
                   design_factors=design_factors if material is not None else None)


def _line(r: _Reader, index: int, table: dict, services: dict, conditions: dict, raw_services, raw_conditions,
          service_values, condition_values, duplicate: str | None, top: str = "lines",
          path: tuple | None = None) -> Line | None:
    """One item of *top* (``lines``, ``faces`` or ``vessels``): a run of pipe or duct, a flat
    face, a vessel.  A line-list row is read as the item its columns describe."""
    p = path or (top, index)
    tag = table.get("tag") if isinstance(table.get("tag"), str) else ""
    entry = f"{top} entry {index}" + (f' "{tag}"' if tag else "")
    raw_service = raw_services.get(table.get("service")) if isinstance(table.get("service"), str) else None
    several = "conditions" in table or (isinstance(raw_service, dict) and "conditions" in raw_service)
    if top == "faces":
        required = ("service", "face", "area")
    elif top == "vessels":
        required = ("service",) + (() if "sphere" in table else ("vessel",))
    else:
        required = ("service", "length") + (() if "od" in table or "wall" in table or "duct" in table else ("size",))
    required += () if several else ("condition",)
    r.check_keys(table, top, p, entry, required=required)
    before = len(r.problems)
    if "tag" in table:
        r.text_value(table, "tag", p, entry)
    if duplicate is not None:
        r.problem(p, entry, "tag", f'tag "{tag}" is already used by {duplicate}')
    sname = r.text_value(table, "service", p, entry)
    if sname is not None and sname not in raw_services:
        r.problem(p, entry, "service", f'unknown service "{sname}"; {closest_names(sname, list(raw_services) or ["(none)"])}')
    cname = r.text_value(table, "condition", p, entry)
    if cname is not None and cname not in raw_conditions:
        known = list(raw_conditions) or ["(none)"]
        r.problem(p, entry, "condition", f'unknown condition "{cname}"; {closest_names(cname, known)}')
    names = _line_conditions(r, table, p, entry, services.get(sname), raw_conditions, cname)
    cname = names[0] if names else cname
    own_keys = [k for k in table if k in _LINE_OWN_KEYS[top]]
    v = r.values(table, top, p, entry, own_keys)
    size_text = r.text_value(table, "size", p, entry)
    service = services.get(sname)
    size = None
    kind = {"faces": "face", "vessels": "sphere" if "sphere" in table else "vessel"}.get(top, "pipe")
    if top == "lines" and "duct" in table:
        kind = "duct"
        for key in ("size", "od", "wall", "pipe_material", "valves", "flanges", "strainers"):
            if key in table:
                r.problem(p, entry, key, f"{key} belongs to a pipe; a duct line gives its duct size (and sheet)")
    elif top == "lines":
        for key in ("sheet", "duct_location", "duct_service"):
            if key in table:
                r.problem(p, entry, key, f"{key} belongs to a duct; give duct = \"600x400mm\" (or a round size)")
    if size_text is not None and kind == "pipe":
        from .catalog.pipes import lookup_pipe

        schedule = service.schedule if service is not None else None
        if schedule is not None and not size_text.strip().upper().startswith("NPS"):
            schedule = None  # a steel schedule applies to NPS sizes only
        size = r.cached(p, entry, "size", lookup_pipe, size_text, schedule)
    if kind == "pipe" and ("od" in table or "wall" in table):
        if size_text is not None:
            r.problem(p, entry, "od", "give a catalogue size or od with wall, not both")
        elif "outer_diameter_m" in v and "wall_m" in v:
            from .catalog.pipes import custom_pipe

            size = r.guard(p, entry, "wall", custom_pipe, v["outer_diameter_m"], v["wall_m"])
        elif "od" not in table or "wall" not in table:
            r.problem(p, entry, "od" if "od" not in table else "wall", "a pipe not in the catalogues needs both "
                                                                        "od and wall")
    if "material" in v:
        from .units import material_in_si

        v["material"] = r.guard(p, entry, "material", material_in_si, v["material"], r.units, "material")
        if v["material"] is None:
            del v["material"]
    for key in ("material", "finish", "pipe_material", "sheet"):
        if key in v:
            from .catalog.ducts import lookup_sheet
            from .catalog.finishes import lookup_finish
            from .catalog.materials import lookup_material, lookup_wall_material

            look = {"material": lookup_material, "finish": lookup_finish, "pipe_material": lookup_wall_material,
                    "sheet": lookup_sheet}[key]
            r.guard(p, entry, key, look, v[key])
    # the rules between inputs, over what this line gets from its location, its service and itself
    cvals, corigin = condition_values.get(cname, ({}, {}))
    svals, sorigin = service_values.get(sname, ({}, {}))
    merged = {**cvals, **{k: x for k, x in svals.items() if k not in ("fluid_temp_c", "steam_pressure_pa")}, **v}
    for key in ("face", "vessel"):  # a refused facing or axis still says what the item is
        if key in table and key not in merged:
            merged[key] = str(table[key])
    if v.get("count", 1) == 0:
        r.problem(p, entry, "count", "count must be 1 or more (leave the vessel out to count none)")
    already = _reported(r, sname, cname, cvals, svals)

    def origin():  # built only when a rule is broken
        own = {_PARAM_OF[(top, k)]: (p, entry, k) for k in table if (top, k) in _PARAM_OF}
        return {**corigin, **sorigin, **own}

    r.cross_check(merged, origin, (p, entry, None), skip=already)
    fittings = {}
    for key, fitting in _FITTINGS.items():
        fittings[fitting] = v.get(key, 0) if key in v else 0
    if size is not None and any(fittings.values()):
        from .catalog.fittings import equivalent_length_m

        for fitting, n in fittings.items():
            if n:
                r.cached(p, entry, fitting + "s", equivalent_length_m, fitting, size.outer_diameter_m)
    objects, cover = (), None
    if any(k in v for k in ("valve", "flange", "cover")):   # fittings as objects (pipeins.schedule_fittings)
        from .schedule_fittings import parse_line_fittings

        try:
            if kind != "pipe":
                raise InputError(next(k for k in ("valve", "flange", "cover") if k in v),
                                 "fittings as objects are listed on pipe lines")
            if size is not None:
                objects, cover = parse_line_fittings(v.get("valve"), v.get("flange"), v.get("cover"), size.label,
                                                     r.units)
        except InputError as exc:
            r.problem(p, entry, exc.name if exc.name in ("valve", "flange", "cover") else "valve", exc.message)
    if service is not None and (service.buried or any(k in v for k in _BURIED)):   # a buried line
        _buried_line(r, p, entry, table, v, service, kind, size)
    if service is not None and service.code is not None and "code" in service.criteria:
        _code_for(r, p, entry, kind, service)
    section = ()
    if kind != "pipe" and len(r.problems) == before:
        section, size = _section_of(r, p, entry, kind, table, v, service)
    if (len(r.problems) > before or sname not in services or cname not in conditions or size is None
            or (top == "lines" and "length_m" not in v)):
        return None
    sname = _line_service(services, sname, table, v, r.pos.header(p), entry)
    if names and any(n not in conditions for n in names):
        return None
    if len(names) > 1:  # several conditions: scheduled under their set (pipeins.design_conditions)
        cname = _condition_set(r, conditions, [_line_condition(conditions, n, table, v, top) for n in names])
    else:
        cname = _line_condition(conditions, cname, table, v, top)
    length = v["length_m"] if top == "lines" else None
    return Line(index, tag, sname, size, length, cname, fittings, r.pos.header(p), kind, section,
                v.get("area_m2"), v.get("count", 1) if top == "vessels" else None, top, objects, cover)


def _buried_given(service, v: dict) -> dict:
    """The buried-line inputs of a line: its service's, with the line's own over them."""
    return {**service.buried_inputs, **{k: v[k] for k in _BURIED if k in v}}


def _merged_buried(service, v: dict) -> tuple | None:
    """:func:`_buried_given` as a service's ``buried`` (None for a line in air)."""
    merged = _buried_given(service, v)
    return tuple(merged.items()) if merged else None


def _check_buried(r: _Reader, p, entry, table: dict, given: dict, service) -> None:
    """The rules between a service's or line's buried inputs (:func:`pipeins.buried.check_buried`),
    each problem at the key it names (or at ``buried``); a line's (*service* given) only those
    its own keys add to its service's."""
    from .buried import check_buried

    found = check_buried(given)
    if service is not None:
        already = set(check_buried(service.buried_inputs)) if service.buried else set()
        found = [x for x in found if x not in already]
    for name, message in found:
        key = file_word(name)
        r.problem(p, entry, key if key in table else ("buried" if "buried" in table else None), message)
    if given.get("casing_insulation") is not None:
        from .catalog.materials import lookup_material

        r.guard(p, entry, "casing_insulation", lookup_material, given["casing_insulation"])


def _buried_line(r: _Reader, p, entry, table: dict, v: dict, service, kind: str, size) -> None:
    """A buried pipe line: its inputs (the service's with its own over them) checked together
    and against its pipe (the depth beyond the pipe's or the given build-up's radius, the
    return pipe beside it or in the casing)."""
    from .buried import SIZED_FOR, check_buried

    given = _buried_given(service, v)
    if any(file_word(k) in table and k not in v for k in _BURIED):   # a refused value is reported already
        return
    before = len(r.problems)
    if any(k in v for k in _BURIED):
        _check_buried(r, p, entry, table, given, service)
        if "depth_m" not in given:
            return
    if len(r.problems) > before or check_buried(given):
        return
    if (not set(service.criteria) & set(SIZED_FOR) and "thickness_m" not in v and service.thickness_m is None
            and given.get("casing_diameter_m") is None):
        sname = service.base or service.name
        r.problem(("services", sname), f'service "{sname}"', "criteria",
                  f"a buried line is sized for {', '.join(SIZED_FOR)} (touch and condensation do not apply to a "
                  f"buried line): list one in criteria, or give its lines a thickness")
    key = next((file_word(k) for k in _BURIED if file_word(k) in table), "size")
    for fitting in ("valves", "flanges", "strainers", "valve", "flange", "cover"):
        if fitting in table:
            r.problem(p, entry, fitting, "fittings are solved in air: a buried line's fittings (in a chamber) are not "
                                         "modelled; leave them out of a buried line")
    if kind != "pipe":
        r.problem(p, entry, key if key in table else kind, f"a buried line is a pipe; a {kind} is solved in air")
        return
    if size is None:
        return
    from .units import format_quantity as fq

    od, depth = float(size.outer_diameter_m), given["depth_m"]
    twin_casing = given.get("casing_diameter_m")
    if twin_casing is not None:
        if "thickness_m" in v:
            r.problem(p, entry, "thickness", "a twin casing's insulation fills the casing (twin_casing); drop thickness")
            return
        from .twin_casing import check_geometry

        def fits():
            try:
                check_geometry(od / 2, given["twin_spacing_m"] / 2, twin_casing / 2)
            except InputError as exc:
                raise InputError("twin_spacing_m", f"{size.label} (outside diameter {fq(od, 'diameter', r.units)}): "
                                                   f"{exc.message}") from None

        r.guard(p, entry, "twin_spacing" if "twin_spacing" in table else key, fits)
        return
    radius = od / 2 + v.get("thickness_m", service.thickness_m or 0.0)
    what = "the pipe radius" if "thickness_m" not in v and service.thickness_m is None else \
        "the casing radius (pipe and given thickness)"
    if not depth > radius:
        r.problem(p, entry, "buried" if "buried" in table else key,
                  f"the burial depth {fq(depth, 'length', r.units, digits=2)} (to the pipe centre) must be more than "
                  f"{what} {fq(radius, 'diameter', r.units)} of {size.label}")
    spacing = given.get("twin_spacing_m")
    if spacing is not None and not spacing > 2 * radius:
        r.problem(p, entry, "twin_spacing" if "twin_spacing" in table else key,
                  f"the two pipes' centres must be more than a casing diameter apart "
                  f"({fq(2 * radius, 'diameter', r.units)} for {size.label})")


def _repeat_shape(kind: str, table: dict) -> tuple | None:
    """What a run of pipe or duct is, but for its tag and length: the key under which a line
    list's many runs of one service, size and location are read once (None for a face, a
    vessel, or a value that cannot be a key).  A run's length enters no rule between inputs
    (:func:`pipeins.inputs.check_line`) and nothing else a run is made of, so two runs of one
    shape differ only in their tag, length and place in the file."""
    if kind != "lines" or "length" not in table:
        return None
    try:
        shape = tuple(sorted((k, type(v), tuple(v) if isinstance(v, list) else v)
                             for k, v in table.items() if k not in ("tag", "length")))
        hash(shape)
    except TypeError:  # an unhashable value, or keys that do not sort: read it in full
        return None
    return shape


def _repeat(r: _Reader, first: Line, index: int, table: dict, duplicate: str | None, p: tuple) -> Line | None:
    """A run of the shape of *first* (an earlier clean run): its tag and length read as
    :func:`_line` reads them, the rest taken from *first*."""
    tag = table.get("tag") if isinstance(table.get("tag"), str) else ""
    entry = f"lines entry {index}" + (f' "{tag}"' if tag else "")
    before = len(r.problems)
    if "tag" in table:
        r.text_value(table, "tag", p, entry)
    if duplicate is not None:
        r.problem(p, entry, "tag", f'tag "{tag}" is already used by {duplicate}')
    length = r.value(table, "lines", "length", p, entry)
    if len(r.problems) > before or length is None:
        return None
    return _with(first, index=index, tag=tag, length_m=length, file_line=r.pos.header(p))


def _with(line: Line, **changes) -> Line:
    """*line* with *changes*: :func:`dataclasses.replace` without its per-call field walk
    (a 100,000-line project makes one per line); the new line shares *line*'s values,
    its fittings dict among them, which nothing changes once read."""
    return Line(*[changes[n] if n in changes else getattr(line, n) for n in Line.__slots__])


def _code_for(r: _Reader, p, entry, kind: str, service) -> None:
    """A code minimum fits the item: a pipe rule set for a pipe, a duct rule set for a duct;
    a face or vessel takes none (the rule sets band pipes by size and ducts by location)."""
    from .duct_codes import load_duct_rule_sets

    duct_set = service.code in load_duct_rule_sets()
    name = service.base or service.name
    if kind in ("face", "vessel", "sphere"):
        r.problem(p, entry, "service", f'service "{name}" asks for the code minimum "{service.code}"; code '
                                       "minimums band pipes by size and ducts by location, not faces or vessels: "
                                       'give this item a service without "code" in its criteria')
    elif kind == "pipe" and duct_set:
        r.problem(p, entry, "service", f'service "{name}" has the duct rule set "{service.code}"; a pipe takes a '
                                       "pipe rule set (see `pipeins list rules`)")
    elif kind == "duct" and not duct_set:
        sets = " or ".join(sorted(load_duct_rule_sets()))
        r.problem(p, entry, "service", f'service "{name}" has the pipe rule set "{service.code}"; a duct takes a '
                                       f"duct rule set: {sets}")


#: The LineSpec fields of a section, by kind, from the item's values.
_SECTION_FIELDS = {"duct": ("duct",), "face": ("face", "height_m", "length_m"),
                   "vessel": ("vessel", "vessel_diameter_m", "length_m", "heads", "floor"),
                   "sphere": ("sphere_diameter_m",)}


def _section_of(r: _Reader, p, entry, kind: str, table: dict, v: dict, service) -> tuple:
    """``(section fields, size row)`` of a duct, face, vessel or sphere item (size None when
    refused): the fields as :class:`pipeins.line.LineSpec` takes them, the size row that
    names it in the schedule (:meth:`pipeins.line.LineSpec.section_size`), labelled with the
    dimensions as written."""
    fields = {k: v[k] for k in _SECTION_FIELDS[kind] if k in v}
    if kind == "face":  # the film length: a vertical face's height, a horizontal face's length
        fields.pop("length_m" if fields.get("face") == "vertical" else "height_m", None)
    if isinstance(fields.get("floor"), str):  # ground:TEMP, the temperature in the unit system
        ground, _, temp = fields["floor"].partition(":")
        if temp.strip():
            from .units import parse_quantity

            value = r.guard(p, entry, "floor", parse_quantity, temp.strip(), "temperature", "floor", r.units)
            if value is None:
                return (), None
            fields["floor"] = f"{ground.strip()}:{value!r}C"
    sheet = v.get("sheet", service.sheet if service is not None else None)
    if kind == "duct" and service is not None:
        if service.steam_pressure_pa is not None or (service.fluid_given and service.fluid not in ("air", None)):
            r.problem(p, entry, "service", f'a duct carries air; service "{service.name}" has '
                                           f'{"steam" if service.fluid is None else service.fluid}: give the duct '
                                           'a service with fluid = "air" (or no fluid)')
            return (), None
    memo_key = (_section_size, tuple(sorted(fields.items())), sheet)
    if memo_key not in r._memo:
        try:
            r._memo[memo_key] = (_section_size(*memo_key[1:]), None)
        except InputError as exc:
            r._memo[memo_key] = (None, exc)
    size, refused = r._memo[memo_key]
    if refused is not None:  # placed at the key of the input it names (floor, heads …), else the section's
        named = file_word(refused.name)
        r.problem(p, entry, named if named in table else kind, refused.message)
        return (), None
    from dataclasses import replace as _replace

    return tuple(sorted(fields.items())), _replace(size, label=_section_label(kind, table))


def _section_size(fields: tuple, sheet):
    from .line import LineSpec

    return LineSpec(sheet=sheet, **dict(fields)).section_size()


def _section_label(kind: str, table: dict) -> str:
    """A section's name in the schedule, with its dimensions as written."""
    w = lambda k: str(table[k]).strip()  # noqa: E731
    if kind == "duct":
        return f"duct {w('duct')}"
    if kind == "sphere":
        return f"sphere {w('sphere')}"
    if kind == "face":
        film = f"{w('height')} high" if table.get("face") == "vertical" else f"film length {w('length')}"
        return f"face {table['face']}, {film}"
    heads = table.get("heads", "flat")
    floor = f", floor {w('floor')}" if "floor" in table else ""
    return f"{table['vessel']} vessel {w('diameter')} x {w('length')}, {heads} heads{floor}"


def _reported(r: _Reader, sname, cname, cvals: dict, svals: dict) -> set:
    """The problems of a line's location and service on their own (reported with them), once
    per pair."""
    memo = r.__dict__.setdefault("_reported", {})
    key = (sname, cname)
    if key not in memo:
        memo[key] = set(check_line(cvals)) | set(check_line(svals))
    return memo[key]


def _written(table: dict, keys) -> str:
    return ", ".join(str(table[k]) for k in keys if k in table)


def _line_service(services: dict, sname: str, table: dict, v: dict, file_line: int, entry: str) -> str:
    """The service a line is scheduled under: its own service, or one derived from it
    with the line's build-up (material, thickness, finish, emittance, pipe material)."""
    if not any(k in table for k in _LINE_SERVICE_KEYS):
        return sname
    base = services[sname]
    name = f"{sname} ({_written(table, _LINE_SERVICE_KEYS)})"
    if name not in services:
        services[name] = replace(
            base, name=name, material=v.get("material", base.material), finish=v.get("finish", base.finish),
            emittance=v.get("emittance", base.emittance), pipe_material=v.get("pipe_material", base.pipe_material),
            series=(v["thickness_m"],) if "thickness_m" in v else base.series, file_line=file_line, base=sname,
            thickness_m=v.get("thickness_m", base.thickness_m), entry=entry, sheet=v.get("sheet", base.sheet),
            flow=v.get("flow", base.flow), velocity_m_s=v.get("velocity_m_s", base.velocity_m_s),
            buried=_merged_buried(base, v),
            requirements=replace(base.requirements,
                                 duct_location=v.get("duct_location", base.requirements.duct_location),
                                 duct_service=v.get("duct_service", base.requirements.duct_service)))
    return name


def _line_condition(conditions: dict, cname: str, table: dict, v: dict, top: str = "lines") -> str:
    """The location a line is scheduled in: its own, or one derived with the line's
    orientation and height (a run's; a face's height is its size)."""
    if top != "lines" or not any(k in table for k in _LINE_CONDITION_KEYS):
        return cname
    base = conditions[cname]
    name = f"{cname} ({_written(table, _LINE_CONDITION_KEYS)})"
    if name not in conditions:
        orientation = v.get("orientation", base.orientation)
        conditions[name] = replace(base, name=name, orientation=orientation,
                                   height_m=v.get("height_m", base.height_m if orientation == "vertical" else None))
    return name


# --------------------------------------------------------------------------- several conditions
def _criteria_list(r: _Reader, table: dict, key: str, p: tuple, entry: str) -> tuple | None:
    """A list of criterion names at *key* (None when refused)."""
    items = table[key]
    if not isinstance(items, list) or not items or not all(isinstance(x, str) for x in items):
        r.problem(p, entry, key, f'{key} must be a list of criteria, e.g. {key} = ["condensation", "touch"]')
        return None
    bad = [x for x in items if x not in CRITERIA]
    for x in bad:
        r.problem(p, entry, key, f'unknown criterion "{x}"; {closest_names(x, CRITERIA)}')
    return None if bad else tuple(items)


def _condition_list(r: _Reader, table: dict, p: tuple, entry: str, raw_conditions) -> tuple:
    """The names of a service's or line's ``conditions = [...]`` (unknown ones reported)."""
    items = table["conditions"]
    if isinstance(items, str) and p in r.places:   # a line list's cell: "summer; winter"
        items = [x.strip() for x in items.split(";") if x.strip()]
    if not isinstance(items, list) or not items or not all(isinstance(x, str) and x for x in items):
        r.problem(p, entry, "conditions", 'conditions must be a list of [conditions.NAME] names, e.g. '
                                          'conditions = ["summer", "winter"]')
        return ()
    known = list(raw_conditions) or ["(none)"]
    for x in items:
        if x not in raw_conditions:
            r.problem(p, entry, "conditions", f'unknown condition "{x}"; {closest_names(x, known)}')
        elif items.count(x) > 1:
            r.problem(p, entry, "conditions", f'condition "{x}" is listed twice')
    return tuple(dict.fromkeys(items))


def _line_conditions(r: _Reader, table: dict, p: tuple, entry: str, service, raw_conditions, cname) -> list:
    """A line's conditions when it has a list (its own, or its service's when it names no
    condition); [] for a line with one ``condition``.  A condition of the list that no
    criterion of the service uses is refused."""
    if "conditions" in table:
        if "condition" in table:
            r.problem(p, entry, "conditions", "give condition or conditions, not both")
            return []
        names, where = list(_condition_list(r, table, p, entry, raw_conditions)), (p, entry)
    elif cname is None and service is not None and service.conditions:
        names = list(service.conditions)
        where = (("services", service.base or service.name), f'service "{service.base or service.name}"')
    else:
        return []
    if service is not None and len(names) > 1:
        from .design_conditions import criteria_under, why_unused

        conditions = r.__dict__.get("conditions_read", {})
        for n in names:
            if n in conditions and not criteria_under(conditions[n], service.criteria):
                r.problem(*where, "conditions", f'condition "{n}" is used by no criterion of service '
                                                f'"{service.name}" ({", ".join(service.criteria)}): '
                                                f"{why_unused(conditions[n])}; drop it or give it criteria_here")
    return names


def _condition_set(r: _Reader, conditions: dict, names: list) -> str:
    """The name a line with several conditions is scheduled under ("summer + winter"): a
    location with the first condition's surroundings (its heat flow and energy are reported
    there), the set kept in ``Project.condition_sets``."""
    name = " + ".join(names)
    sets = r.__dict__.setdefault("condition_sets", {})
    if name not in sets:
        sets[name] = tuple(names)
        conditions[name] = replace(conditions[names[0]], name=name)
    return name
