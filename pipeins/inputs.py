"""One description of the inputs, shared by every front end (command line, project file, API).

Each input is a :class:`Param`: its library name (the field of :class:`pipeins.line.LineSpec`,
:class:`pipeins.criteria.Requirements` or :class:`pipeins.annual.EnergyBasis` it fills), the
command-line flag, the project-file key and the tables that may hold it, how its text is
read and which values are allowed.  :func:`parse_value` is the ONE reader of a value: the
CLI and the TOML reader both call it, so a rule holds in both or in neither.
:func:`check_line` holds the rules between inputs (steam or temperature, a fixed outer
coefficient against wind, a height without a vertical run …).

Errors raised here and in the library name the *parameter* (``rh_percent``,
``touch_limit_c``); each front end turns that into its own word with :func:`cli_word`
(``--rh``) or the project reader's location (``hospital.toml: line 12 (condition "plant
room", rh): …``).  A message may name other inputs by their parameter name; the front
ends rewrite those words too (:func:`in_words`).

>>> parse_value("rh_percent", "80 %", "si")
80.0
>>> parse_value("years", "15 years", "si"), parse_value("years", 15, "si")
(15.0, 15.0)
>>> parse_value("discount_rate", "-99.5 %", "si")
-0.995
>>> in_words("give touch_limit_c or contact_time_s, not both", cli_word)
'give --touch-limit or --contact-time, not both'
"""

from __future__ import annotations

import functools
import math
import re
from dataclasses import dataclass

from .errors import InputError

__all__ = ["Param", "PARAMS", "BY_NAME", "parse_value", "check_line", "cli_word", "file_word", "in_words",
           "Problems", "parse_years", "CLI_ONLY", "FILE_ONLY"]


@dataclass(frozen=True)
class Param:
    """One input.  ``kind`` is a :data:`pipeins.units.KINDS` quantity kind, or one of
    ``text``, ``choice``, ``count``, ``fraction`` (a percentage stored as a fraction),
    ``efficiency``, ``number``, ``years``, ``price``, ``co2``, ``path``, ``list``."""

    name: str                  # library parameter
    flag: str | None           # command-line option, None when the CLI has none
    key: str | None            # project-file key, None when the file has none
    tables: tuple = ()         # project tables that may hold the key
    kind: str = "text"
    help: str = ""             # what it is, with its unit
    default: str = ""          # the default, as shown in the key reference
    low: float | None = None   # allowed range of the SI value (None: unbounded)
    high: float | None = None
    low_open: bool = False     # True: the value must be above low (not equal)
    choices: tuple = ()

    @property
    def dest(self) -> str | None:
        """The click parameter name of the flag (``--fluid-temp`` → ``fluid_temp``)."""
        if self.flag is None:
            return None
        return _DESTS.get(self.flag, self.flag.lstrip("-").replace("-", "_"))


_DESTS = {"--layer": "layers"}


_C, _S, _L = ("conditions",), ("services",), ("lines",)
_CL, _SL, _ALL = ("conditions", "lines"), ("services", "lines"), ("conditions", "services", "lines")
_E = ("energy", "services")
#: The tables of the sections other than a pipe run: flat faces and vessels (a duct is a [[lines]] run).
_F, _V = ("faces",), ("vessels",)
_LFV, _SLFV = ("lines", "faces", "vessels"), ("services", "lines", "faces", "vessels")

PARAMS: tuple[Param, ...] = (
    # -- the pipe ------------------------------------------------------------------------
    Param("pipe", "--pipe", "size", _L, "text", 'catalogue size: "NPS 2", "DN50", "copper L 1-1/8"', "(required)"),
    Param("schedule", "--schedule", "schedule", _S, "text", "steel schedule of NPS sizes (5S … XXS)", "40"),
    Param("outer_diameter_m", "--od", "od", _L, "diameter", "outside diameter of a pipe not in the catalogues, "
          "with wall instead of size [m]", "", 0.0, 2.0, True),
    Param("wall_m", "--wall", "wall", _L, "thickness", "wall thickness with od [m]", "", 0.0, 1.0, True),
    Param("pipe_material", "--pipe-material", "pipe_material", _SL, "text", "pipe wall material",
          "by pipe kind (carbon steel, copper)"),
    Param("length_m", "--length", "length", _LFV, "length", "run length; a vessel's shell length, tangent to tangent; a horizontal face's film length [m]", "(required in the file for a run or a vessel)", 0.0, None, True),
    # -- sections other than a pipe -------------------------------------------------------
    Param("duct", "--duct", "duct", _L, "text", 'duct size: rectangular "600x400mm", "24x16in"; round "450mm"', ""),
    Param("sheet", "--sheet", "sheet", _SLFV, "text", "sheet metal of a duct, face or vessel wall: galvanised steel, "
          "aluminium, stainless steel", "galvanised steel"),
    Param("face", "--face", "face", _F, "choice", "a flat face by its outward normal: vertical (a wall), up (a top), "
          "down (an underside); film length --height (vertical) or --length (up, down)", "",
          choices=("vertical", "up", "down")),
    Param("sphere_diameter_m", "--sphere", "sphere", _V, "length", "outside diameter of a spherical vessel [m]", "",
          0.0, 100.0, True),
    Param("vessel", "--vessel", "vessel", _V, "choice", "a cylindrical vessel by its axis, with --diameter, --length "
          "and --heads", "", choices=("vertical", "horizontal")),
    Param("vessel_diameter_m", "--diameter", "diameter", _V, "length", "outside diameter of a vessel shell [m]", "",
          0.0, 100.0, True),
    Param("heads", "--heads", "heads", _V, "choice", "vessel heads", "flat", choices=("flat", "2:1", "hemispherical")),
    Param("floor", "--floor", "floor", _V, "text", 'a vertical tank\'s flat floor, bare: "air" (open beneath) or '
          '"ground:TEMP" (on its foundation to the ground at TEMP)', "an insulated bottom head"),
    Param("area_m2", "--area", "area", _F, "area", "area of a flat face, insulated as one [m²]", "(required for a face)",
          0.0, None, True),
    Param("count", None, "count", _V, "count", "number of identical vessels", "1"),
    # -- the fluid -----------------------------------------------------------------------
    Param("fluid_temp_c", "--fluid-temp", "temperature", _S, "temperature", "fluid temperature [°C]",
          "(this or steam_pressure)"),
    Param("steam_pressure_pa", "--steam-pressure", "steam_pressure", _S, "steam_pressure",
          "saturated steam pressure, gauge or absolute said (10 barg, 150 psig) [Pa absolute]", "", 0.0, None, True),
    Param("fluid", "--fluid", "fluid", _S, "text", 'fluid: water, "30% ethylene glycol", a CoolProp name',
          "water (none for steam)"),
    Param("velocity_m_s", "--velocity", "velocity", _SL, "speed", "mean fluid velocity, for the inner film [m/s]",
          "", 0.0, None, True),
    Param("flow", "--flow", "flow", _SL, "flow", "fluid flow, mass or volume (5 m3/h, 1.2 kg/s, 20 gpm)", "",
          0.0, None, True),
    Param("inner_h_w_m2k", "--inner-h", "inner_h", _S, "heat_transfer_coefficient",
          "fixed inner film coefficient [W/(m²·K)]", "no inner film", 1.0, 1e5),
    # -- the surroundings ----------------------------------------------------------------
    Param("air_temp_c", "--ambient-temp", "air", _C, "temperature", "air temperature [°C]",
          "20 °C on the command line; required in the file"),
    Param("surroundings_temp_c", "--surroundings-temp", "surroundings", _C, "temperature",
          "mean radiant temperature of the surroundings [°C]", "the air temperature"),
    Param("rh_percent", "--rh", "rh", _C, "percent", "relative humidity [%] (gives the dew point)", "not given",
          0.0, 100.0, True),
    Param("wind_m_s", "--wind", "wind", _C, "speed", "wind speed [m/s]", "0 (still air)", 0.0, 100.0),
    Param("orientation", "--orientation", "orientation", _CL, "choice", "run orientation", "horizontal",
          choices=("horizontal", "vertical")),
    Param("height_m", "--height", "height", _CL + _F, "length", "height of a vertical run; a vertical face's height (its film length) [m]", "", 0.0, 1000.0, True),
    Param("pressure_pa", "--air-pressure", "air_pressure", _C, "pressure", "air pressure [Pa]", "101.325 kPa",
          0.0, None, True),
    Param("altitude_m", "--altitude", "altitude", _C, "length", "site altitude instead of air_pressure "
          "(standard atmosphere) [m]", "0 m", -500.0, 11_000.0),
    Param("solar_w_m2", "--solar", "solar", _C, "heat_flux", "solar irradiance on a surface normal to the sun "
          "[W/m²] (absorbed on the projected area; not at night)", "none", 0.0, 1400.0),
    Param("absorptance", "--absorptance", "absorptance", _C, "number", "solar absorptance of the outer surface (0 to 1)",
          "the finish's", 0.0, 1.0),
    Param("outer_h_w_m2k", "--outer-h", "outer_h", _C, "heat_transfer_coefficient",
          "fixed combined outer coefficient, replaces convection and radiation [W/(m²·K)]", "", 0.1, 1e4),
    # -- the build-up --------------------------------------------------------------------
    Param("layers", "--layer", None, (), "list", "insulation layers MATERIAL:THICKNESS, inner to outer"),
    Param("material", "--material", "material", _SLFV, "text", 'the insulation (the layer sized): a catalogue '
          'material or "k=0.040"', "(required for a service)"),
    Param("thickness_m", None, "thickness", _LFV, "thickness", "a fixed thickness of the material instead of "
          "sizing it (must still meet the service's criteria) [m]", "sized", 0.0, 2.0, True),
    Param("series", "--series", "series", _S, "text", "thickness series name (see `pipeins list series`)",
          "the material's series"),
    Param("finish", "--finish", "finish", _SLFV, "text", "outer finish from the catalogue",
          "painted or plastic jacket (emittance 0.9)"),
    Param("emittance", "--emittance", "emittance", _SLFV, "number", "outer surface emittance, instead of or "
          "over the finish's", "the finish's", 0.0, 1.0, True),
    # -- requirements --------------------------------------------------------------------
    Param("touch_limit_c", "--touch-limit", "touch_limit", _S, "temperature", "surface temperature limit [°C]",
          "60 °C (common practice)"),
    Param("touch", "--no-touch-check", None, (), "flag", "size for touch safety on hot lines", "on"),
    Param("contact_time_s", "--contact-time", "contact_time", _S, "time", "touch limit from burn thresholds "
          "for this contact time (1 s to 8 h) [s]", "", 0.0, None, True),
    Param("dew_margin_k", "--dew-margin", "dew_margin", _S, "temperature_difference",
          "surface margin above the dew point [K]", "1 K (common practice)", 0.0),
    Param("max_heat_flow_w_per_m", "--max-heat-flow", "max_heat_flow", _S, "heat_flow_per_length",
          "cap on the magnitude of the heat flow [W/m]", "", 0.0, None, True),
    Param("min_reduction", "--min-reduction", "min_reduction", _S, "fraction",
          "least reduction against the bare line [%]", "", 0.0, 1.0, True),
    Param("max_heat_flux_w_m2", "--max-heat-flux", "max_heat_flux", _S, "heat_flux",
          "cap on the magnitude of the outer heat flux of the worst part, per m² of outer surface [W/m²]", "",
          0.0, None, True),
    Param("duct_location", "--duct-location", "duct_location", _SL, "choice", "where a duct runs, for a duct code minimum",
          "", choices=("conditioned", "unconditioned", "outdoors", "envelope")),
    Param("duct_service", "--duct-service", "duct_service", _SL, "choice", "a duct's service, for a duct code minimum",
          "supply", choices=("supply", "return")),
    Param("climate_zone", "--climate-zone", "climate_zone", ("project", "services"), "text", "climate zone of a duct code minimum (e.g. 4, 5A)",
          ""),
    Param("max_temp_change_k", "--max-temp-change", "max_temp_change", _S, "temperature_difference",
          "cap on the fluid temperature change along the run, with flow [K]", "", 0.0, None, True),
    Param("hold_time_s", "--hold-time", "hold_time", _S, "time", "still water stays above 0 °C this long [s]",
          "", 0.0, None, True),
    Param("ice_fraction", "--ice-fraction", "ice_fraction", _S, "fraction", "with hold_time: the ice fraction "
          "allowed to form [%]", "0 %", 0.0, 1.0),
    Param("tracer_output_w_per_m", "--tracer-output", "tracer_output", _S, "heat_flow_per_length",
          "a heat tracer's output at the maintain temperature [W/m] (in the file: compared with the design heat "
          "loss of each traced line; sized for with criteria = [\"tracer\"])", "", 0.0, None, True),
    Param("safety_factor_percent", "--safety-factor", "safety_factor", _S, "percent",
          "safety factor on the heat loss a tracer makes up [%]", "20 %", 0.0, 100.0),
    Param("maintain_temp_c", "--maintain-temp", "maintain_temp", _S, "temperature", "heat tracing: the "
          "temperature the tracer holds [°C]; gives each line's design heat loss (pipeins.tracing)", "not traced"),
    Param("min_ambient_c", "--min-ambient", "min_ambient", _S, "temperature", "heat tracing: the minimum design "
          "ambient [°C]", "the location's air"),
    Param("code", "--code", "code", ("project", "services"), "text", "code-minimum rule set "
          "(see `pipeins list rules`)", "none"),
    Param("code_table", "--code-table", "code_tables", ("project",), "path", "extra rule-set CSV files", "none"),
    # -- the energy basis ----------------------------------------------------------------
    Param("hours_per_year", "--hours", "hours", _E, "time", "operating hours per year [h]", "8760 h",
          0.0, 8784 * 3600.0, True),
    Param("price", "--energy-price", "price", _E, "price", "price of the energy bought (0.09/kWh, 1.05/therm)",
          "none"),
    Param("currency", "--currency", "currency", ("project",), "text", "currency shown with costs", "none"),
    Param("efficiency", "--efficiency", "efficiency", _E, "efficiency", "heat source efficiency for heat losses "
          "(88 % or 0.88)", "1 (100 %)", 0.0, 1.0, True),
    Param("cop", "--cop", "cop", _E, "number", "chiller coefficient of performance for heat gains", "none",
          0.1, 100.0),
    Param("emission", "--co2-factor", "co2", _E, "co2", "CO2 per unit of energy bought (0.20/kWh, 0.20 kg/kWh)",
          "none"),
    Param("discount_rate", "--discount-rate", "discount_rate", _E, "fraction", "discount rate per year [%]", "5 %",
          -1.0, None, True),
    Param("years", "--years", "life", _E, "years", "evaluation life [years]", "20 years", 0.0, 200.0, True),
    Param("escalation", "--escalation", "escalation", _E, "fraction", "energy price rise per year [%]", "0 %",
          -1.0, None, True),
    Param("maintenance_fraction", "--maintenance", "maintenance", _E, "fraction", "annual maintenance as a share "
          "of installed cost [%]", "0 %", 0.0, 1.0),
    Param("cost_table", "--cost-table", "cost_table", ("project", "services"), "path",
          "CSV of installed insulation cost per metre by size and thickness", "none"),
    # -- fittings ------------------------------------------------------------------------
    Param("valves", "--valves", "valves", _L, "count", "bare valves on the run", "0"),
    Param("flanges", "--flanges", "flanges", _L, "count", "bare flange pairs on the run", "0"),
    Param("strainers", "--strainers", "strainers", _L, "count", "bare strainers on the run", "0"),
    # -- fittings as objects and their covers (pipeins.fittings, pipeins.schedule_fittings) ----
    Param("valve", "--valve", "valve", _L, "list", "valves and strainers on the line as objects, each "
          "KIND[:SIZE[:CLASS]] (gate, globe, ball, butterfly, check, strainer; the size defaults to the line's): "
          "solved bare and covered in their own schedule section", "none"),
    Param("flange", "--flange", "flange", _L, "list", "flanged joints on the line as objects, each [SIZE][:CLASS] "
          "(the size defaults to the line's)", "none"),
    Param("cover", "--cover", "cover", _L, "text", "removable cover of the line's listed fittings, "
          "MATERIAL:THICKNESS", "bare"),
    # -- buried lines (pipeins.buried, pipeins.twin_casing; pipeins.schedule_buried) ----------
    Param("depth_m", "--buried", "buried", _SL, "length", "buried line: depth of the pipe centre (a twin casing's "
          "centre) below the ground surface [m]; the soil replaces the air film and radiation", "not buried",
          0.0, 100.0, True),
    Param("soil", "--soil", "soil", _SL, "text", 'buried line: soil type of tables/soils.csv ("moist sand"), '
          "instead of soil_k", ""),
    Param("soil_k_w_mk", "--soil-k", "soil_k", _SL, "conductivity", "buried line: soil conductivity [W/(m·K)]",
          "", 0.1, 5.0),
    Param("ground_temp_c", "--ground-temp", "ground_temp", _SL, "temperature", "buried line: ground surface "
          "temperature [°C]", "(required for a buried line)"),
    Param("twin_spacing_m", "--twin-spacing", "twin_spacing", _SL, "length", "buried line: a return pipe beside it "
          "(or in its twin casing), the distance between the centres [m], with return_temp", "", 0.0, 100.0, True),
    Param("return_temp_c", "--return-temp", "return_temp", _SL, "temperature", "buried line: the return pipe's "
          "fluid temperature [°C], with twin_spacing", ""),
    Param("casing_diameter_m", "--twin-casing", "twin_casing", _SL, "diameter", "buried line: supply and return in "
          "ONE casing of this outer diameter [m] (pipeins.twin_casing), with twin_spacing and return_temp", "",
          0.0, 5.0, True),
    Param("casing_insulation", "--casing-insulation", "casing_insulation", _SL, "text", "buried line: the "
          "insulation filling a twin casing", "the service's material"),
    # -- design conductivity (pipeins.user_materials) -----------------------------------------
    Param("ageing_percent", "--ageing-factor", "ageing_factor", _S, "percent", "design-conductivity allowance "
          "for ageing [%] (the service's material)", "0 %", 0.0, 200.0),
    Param("moisture_percent", "--moisture-factor", "moisture_factor", _S, "percent", "design-conductivity "
          "allowance for moisture in service [%]", "0 %", 0.0, 200.0),
    Param("joints_percent", "--joints-factor", "joints_factor", _S, "percent", "design-conductivity allowance "
          "for joints and gaps [%]", "0 %", 0.0, 200.0),
)

BY_NAME = {p.name: p for p in PARAMS}
_BY_DEST = {p.dest: p for p in PARAMS if p.flag}

#: Command-line options with no project-file key, and why (checked by a test that walks
#: every option of check, size, table and cost).
CLI_ONLY = {
    "--format": "output format; `pipeins schedule --format` chooses it for a project",
    "--output": "output path; `pipeins schedule --output` gives it for a project",
    "--units": "unit system; [project] units sets it for a project",
    "--layer": "fixed build-ups of one line; a service's build-up is its material (sized) or a line's thickness",
    "--no-touch-check": "the project file lists its criteria: leave \"touch\" out of criteria",
    "--sizes": "a table's size range; the project file lists its lines, each with its size",
    "--matrix": "an output layout of the table command",
    "--profile": "an operating profile of one line; a project service runs at one temperature",
    "--plot": "an extra chart file beside one command's output; the schedule's formats carry their charts",
    "--ascii": "how the console draws one command's text output (plain ASCII rules); not part of a project",
    "--condition": "several design conditions of one line checked or sized on the command line; a project file "
                   "names its [conditions.NAME] tables and a service's or line's conditions list",
    "--ducts": "a table's duct sizes; the project file lists its lines, each with its size",
    "--materials": "a user's materials file for one checked line (pipeins.user_materials); a project names its "
                   "own with [project] materials_file",
}
#: Project-file keys with no command-line option, and why.
FILE_ONLY = {
    "materials_file": "the project's user materials file (relative to the project file); check --materials gives one "
                      "for a single line",
    "name": "the project's name, shown in its schedule",
    "service": "a line names its service",
    "condition": "a line names its location",
    "conditions": "a service or line sized under several design conditions (pipeins.design_conditions); the "
                  "command line solves one",
    "criteria_here": "the criteria a design condition takes when a line has several; the command line solves one",
    "tag": "a line's own name",
    "criteria": "the criteria a service is sized for; on the command line, the options given choose them",
    "thickness": "a line's fixed thickness; on the command line, check and cost take --layer",
    "units": "the project's unit system; --units on the command line",
    "lines_file": "a line list gives a project many lines; the command line describes one",
    "lines_sheet": "the sheet of a project's XLSX line list",
    "count": "identical vessels in a project's [[vessels]]; check and size solve one",
}


_BY_FLAG = {p.flag: p for p in PARAMS if p.flag}
#: Flags that name no parameter of their own, and their project-file word.
_FLAG_KEYS = {"--sizes": "size", "--layer": "material"}


def cli_word(name: str) -> str:
    """The command-line flag of parameter *name* (a flag, or an unknown name, comes back as it is)."""
    param = BY_NAME.get(name)
    return param.flag if param is not None and param.flag else name


def file_word(name: str) -> str:
    """The project-file key of parameter *name* (or of a command-line flag)."""
    param = BY_NAME.get(name) or _BY_FLAG.get(name)
    if param is not None and param.key:
        return param.key
    return _FLAG_KEYS.get(name, name)


@functools.cache
def _word_re() -> re.Pattern:
    """Every parameter name with an underscore, every flag: compiled on the first message
    (a few milliseconds that a run without one does not pay)."""
    return re.compile(r"(?<![\w-])(" + "|".join(
        sorted([re.escape(p.name) for p in PARAMS if "_" in p.name] + [re.escape(f) for f in _BY_FLAG] +
               [re.escape(f) for f in _FLAG_KEYS], key=len, reverse=True)) + r")(?![\w-])")


def in_words(message: str, word) -> str:
    """*message* with every parameter name that contains an underscore, and every flag,
    rewritten by *word* (:func:`cli_word` or :func:`file_word`)."""
    message = re.sub(r"\{(\w+)\}", lambda m: word(m.group(1)), message)
    return _word_re().sub(lambda m: word(m.group(1)), message)


def cli_line(name: str, message: str) -> str:
    """One error line body as the command line shows it: ``--rh: …``."""
    text = in_words(message, cli_word)
    return f"{cli_word(name)}: {text}" if name else text


class Problems(InputError):
    """Several bad inputs at once: ``items`` is a list of (parameter, message).  The CLI
    prints one ``Error:`` line per item (``problems``), with its flag."""

    def __init__(self, items: list[tuple[str, str]]):
        self.items = list(dict.fromkeys(items))
        super().__init__(self.items[0][0], self.items[0][1])
        self.problems = [f"{name}: {in_words(msg, str)}" if name else in_words(msg, str) for name, msg in self.items]


def collect(items: list, name: str, func, *args, **kw):
    """Call *func*; an :class:`InputError` is appended to *items* as (parameter, message)
    (the error's own name when it names a parameter, else *name*) and None returned."""
    try:
        return func(*args, **kw)
    except Problems as exc:
        items.extend(exc.items)
    except InputError as exc:
        items.append((exc.name if exc.name in BY_NAME or exc.name in _BY_FLAG else name, exc.message))
    return None


# --------------------------------------------------------------------------- one value
def parse_years(value, name: str = "years") -> float:
    """A life in years: ``15``, ``"15"``, ``"15 years"``, ``"15 yr"``, ``"15 a"``."""
    if isinstance(value, bool):
        raise InputError(name, f'cannot read {value!r} as a life; use e.g. "15 years" or 15')
    if isinstance(value, (int, float)):
        number = float(value)
    else:
        m = re.match(r"^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(years?|yrs?|a)?\s*$", str(value), re.I)
        if not m:
            raise InputError(name, f'cannot read "{value}" as a life; use e.g. "15 years" or 15')
        number = float(m.group(1))
    return number


def _efficiency(value, name: str, units: str) -> float:
    from .units import parse_quantity

    return parse_quantity(value, "efficiency", name, units)  # 88 %, 88 or 0.88 (pipeins.units)


def _plain_number(value, name: str, what: str) -> float:
    if isinstance(value, bool):
        raise InputError(name, f"cannot read {value!r} as {what}")
    try:
        return float(value)
    except (TypeError, ValueError):
        raise InputError(name, f'cannot read "{value}" as {what}') from None


def _co2(value, name: str):
    from .annual import emission_from_text

    text = re.sub(r"(?i)kg\s*(?:co2|co₂)?\s*(?=/|\bper\b)", "", str(value))
    return emission_from_text(text, name)


#: Short nouns for messages where the help text is too long.
_NOUNS = {"rh_percent": "relative humidity", "emittance": "emittance", "efficiency": "the efficiency",
          "years": "the evaluation life", "hours_per_year": "operating hours", "cop": "the COP",
          "length_m": "run length", "flow": "flow", "velocity_m_s": "velocity", "outer_h_w_m2k": "outer coefficient",
          "inner_h_w_m2k": "inner film coefficient", "steam_pressure_pa": "the steam pressure",
          "pressure_pa": "air pressure", "altitude_m": "altitude", "wind_m_s": "wind speed",
          "discount_rate": "the discount rate", "escalation": "the escalation",
          "maintenance_fraction": "maintenance", "min_reduction": "the reduction",
          "ice_fraction": "the ice fraction", "thickness_m": "the thickness", "height_m": "height",
          "max_heat_flow_w_per_m": "the heat-flow cap", "max_temp_change_k": "the temperature change limit",
          "hold_time_s": "the hold time", "contact_time_s": "the contact time",
          "dew_margin_k": "the dew-point margin", "outer_diameter_m": "outside diameter",
          "wall_m": "wall thickness", "depth_m": "the burial depth", "soil_k_w_mk": "the soil conductivity",
          "twin_spacing_m": "the spacing of the pipe centres", "casing_diameter_m": "the casing diameter"}
#: The unit a range is stated in, by kind.
_RANGE_UNITS = {"fraction": " %", "percent": " %", "years": " years", "time": "", "thickness": " m",
                "diameter": " m", "length": " m", "heat_transfer_coefficient": " W/(m²·K)", "speed": " m/s"}


def noun(p: Param) -> str:
    return _NOUNS.get(p.name, p.help.split(" [")[0].split(",")[0].split(" (")[0])


def allowed(p: Param, units: str = "si") -> str:
    """The allowed range of *p*, in words, in the unit system *units* (``above 0 and at
    most 100 %``, ``from 0 to 223.7 mph``)."""
    from .units import KINDS, to_display, unit_label

    shown = lambda x: f"{x:g}"  # noqa: E731
    unit = _RANGE_UNITS.get(p.kind, "")
    if p.kind == "fraction":
        shown = lambda x: f"{100 * x:g}"  # noqa: E731
    elif p.kind == "time":
        shown, unit = (lambda x: f"{x / 3600:g}"), " h"
    elif p.kind in KINDS and p.kind not in ("percent", "temperature"):
        label = unit_label(p.kind, units)
        def shown(x):
            v = float(to_display(x, p.kind, units))
            return f"{v:.4g}" if abs(v) < 1e4 else f"{v:.0f}"
        unit = f" {label}" if label else ""
    if p.low == 0.0 and p.high is None:
        return "greater than zero" if p.low_open else "zero or more"
    low = "" if p.low is None else (f"above {shown(p.low)}" if p.low_open else f"{shown(p.low)} or more")
    high = "" if p.high is None else f"at most {shown(p.high)}"
    if low and high and not p.low_open:
        return f"from {shown(p.low)} to {shown(p.high)}{unit}"
    return " and ".join(x for x in (low, high) if x) + unit


def parse_value(name: str, value, units: str = "si"):
    """Read the value of parameter *name* as the user wrote it (text with a unit, or a
    number from a project file) and check it against the parameter's range.  Returns the
    SI value (a fraction for percentages of rates, °C for temperatures).  Raises
    :class:`InputError` naming the parameter."""
    from .units import parse_quantity

    p = BY_NAME[name]
    kind = p.kind
    if kind == "text":
        if not isinstance(value, str) or not value.strip():
            raise InputError(name, "give it as text, e.g. \"…\"")
        return value.strip()
    if kind == "choice":
        if value not in p.choices:
            raise InputError(name, f'unknown {name.replace("_", " ")} "{value}"; use {" or ".join(p.choices)}')
        return value
    if kind == "count":
        if isinstance(value, bool) or not isinstance(value, int) or value < 0:
            if isinstance(value, str) and value.strip().isdigit():
                value = int(value.strip())
            else:
                raise InputError(name, "must be a whole number, 0 or more")
        if value > 1_000_000:
            raise InputError(name, f"{value} is more than 1000000; give the count on the run")
        return int(value)
    if kind == "price":
        from .annual import price_from_text

        return price_from_text(str(value), "", name)
    if kind == "co2":
        return _co2(value, name)
    if kind in ("path", "list", "flag"):
        return value
    if kind == "years":
        number, unit = parse_years(value, name), "years"
    elif kind == "efficiency":
        number, unit = _efficiency(value, name, units), ""
    elif kind == "number":
        from .units import parse_number

        if isinstance(value, bool):
            raise InputError(name, f"cannot read {value!r} as a number")
        number, unit = parse_number(value, name, f"the {noun(p)}"), ""
    elif kind == "fraction":
        number, unit = parse_quantity(value, "percent", name, units) / 100.0, "%"
    else:
        if isinstance(value, bool) or not isinstance(value, (str, int, float)):
            raise InputError(name, "give a number or text with a unit, e.g. \"…\"")
        number = parse_quantity(value, kind, name, units)
        unit = ""
    si = number.value_si if hasattr(number, "value_si") else number
    if not math.isfinite(si):
        raise InputError(name, f'"{value}" is not a finite number')
    low_bad = p.low is not None and (si <= p.low if p.low_open else si < p.low)
    high_bad = p.high is not None and si > p.high
    if low_bad or high_bad:
        raise InputError(name, f"{noun(p)} must be {allowed(p, units)}")
    return number


# --------------------------------------------------------------------------- between values
def check_line(given: dict) -> list[tuple[str, str]]:
    """The rules between inputs of one line, on the parameters *given* (name → value, None
    or absent when not given): a list of (parameter, message), empty when all is well."""
    out = []
    has = lambda n: given.get(n) not in (None, "", ())  # noqa: E731
    if has("outer_h_w_m2k"):
        for other in ("wind_m_s", "finish", "emittance", "surroundings_temp_c"):
            if has(other) and not (other == "wind_m_s" and given[other] == 0):
                out.append(("outer_h_w_m2k", "a fixed outer coefficient replaces convection and radiation; "
                                             f"drop {other}"))
                break
    kinds = [n for n in ("pipe", "outer_diameter_m", "duct", "face", "sphere_diameter_m", "vessel") if has(n)]
    if len(kinds) > 1 and kinds[:2] != ["pipe", "outer_diameter_m"]:
        out.append((kinds[1], f"give one section: {kinds[0]} or {kinds[1]}, not both"))
    if has("vessel") and not has("vessel_diameter_m"):
        out.append(("vessel_diameter_m", "a vessel needs its diameter"))
    if has("vessel") and not has("length_m"):
        out.append(("length_m", "a vessel needs its length (the shell's, tangent to tangent)"))
    for n in ("vessel_diameter_m", "heads", "floor"):
        if has(n) and not has("vessel"):
            out.append((n, f"{n} belongs to a vessel; add {{vessel}} vertical or horizontal"))
    if has("floor") and given.get("vessel") == "horizontal":
        out.append(("floor", "a horizontal vessel has two heads, no floor; drop {floor}"))
    if has("absorptance") and not has("solar_w_m2"):
        out.append(("absorptance", "the absorptance applies with sun; add solar_w_m2"))
    if has("face"):
        if given["face"] == "vertical" and not has("height_m"):
            out.append(("height_m", "a vertical face needs its height (the film length)"))
        if given["face"] in ("up", "down") and not has("length_m"):
            out.append(("length_m", "a horizontal face needs its length along the film (area/perimeter, or the "
                                    "short side)"))
        if given["face"] in ("up", "down") and has("height_m"):
            out.append(("height_m", "the height applies to a vertical face; a horizontal one takes length_m"))
        if (given.get("orientation") or "horizontal") == "vertical":
            out.append(("orientation", "a face has its own facing ({face}); drop {orientation}"))
        return out + [x for x in _common_rules(given, has)]
    if has("vessel"):
        if has("orientation") and given.get("orientation") not in (None, "horizontal"):
            out.append(("orientation", "a vessel has its own axis ({vessel}); drop {orientation}"))
        return out + [x for x in _common_rules(given, has)]
    if has("sphere_diameter_m"):
        return out + [x for x in _common_rules(given, has)]
    if has("height_m") and (given.get("orientation") or "horizontal") != "vertical":
        out.append(("height_m", "the height applies to a vertical run; add {orientation} vertical"))
    if (given.get("orientation") == "vertical") and not has("height_m"):
        out.append(("height_m", "a vertical run needs its height"))
    return out + _common_rules(given, has)


def _common_rules(given, has) -> list:
    out = []
    if has("pressure_pa") and has("altitude_m"):
        out.append(("altitude_m", "give pressure_pa or altitude_m, not both"))
    if has("fluid_temp_c") and has("steam_pressure_pa"):
        out.append(("steam_pressure_pa", "give steam_pressure_pa or fluid_temp_c, not both"))
    if has("touch_limit_c") and has("contact_time_s"):
        out.append(("contact_time_s", "give touch_limit_c or contact_time_s, not both"))
    return out


# --------------------------------------------------------------------------- whole inputs
#: Parameters that describe the line (LineSpec fields, and the altitude that gives the pressure).
LINE_PARAMS = ("pipe", "schedule", "outer_diameter_m", "wall_m", "pipe_material", "layers", "fluid_temp_c",
               "steam_pressure_pa", "fluid", "velocity_m_s", "flow", "inner_h_w_m2k", "air_temp_c",
               "surroundings_temp_c", "rh_percent", "wind_m_s", "orientation", "height_m", "pressure_pa",
               "altitude_m", "finish", "emittance", "outer_h_w_m2k", "touch_limit_c", "length_m",
               "duct", "sheet", "face", "sphere_diameter_m", "vessel", "vessel_diameter_m", "heads", "floor",
               "solar_w_m2", "absorptance")
#: Parameters of the sizing requirements (:class:`pipeins.criteria.Requirements`).
REQUIREMENT_PARAMS = ("touch", "touch_limit_c", "contact_time_s", "dew_margin_k", "max_heat_flow_w_per_m",
                      "max_heat_flux_w_m2", "duct_location", "duct_service", "climate_zone", "min_reduction", "max_temp_change_k", "hold_time_s", "ice_fraction",
                      "tracer_output_w_per_m", "safety_factor_percent")


def values_from_options(opts: dict, names) -> dict:
    """The given command-line values of the parameters *names*, keyed by parameter."""
    out = {}
    for name in names:
        p = BY_NAME[name]
        if p.dest in opts and opts[p.dest] not in (None, (), ""):
            out[name] = opts[p.dest]
    return out


def parse_layer(text: str, units: str, name: str = "layers") -> tuple[str, float]:
    """``MATERIAL:THICKNESS`` → (material, thickness_m)."""
    if not isinstance(text, str) or ":" not in text:
        raise InputError(name, f'"{text}" needs MATERIAL:THICKNESS, e.g. "mineral wool:50mm" or "k=0.040:2in"')
    material, thickness = text.rsplit(":", 1)
    from .units import parse_quantity

    value = parse_quantity(thickness, "thickness", name, units)
    if not value > 0:
        raise InputError(name, f'thickness of "{material.strip()}" must be greater than zero')
    from .units import material_in_si

    return material_in_si(material.strip(), units, name), value


def _parsed(raw: dict, units: str, items: list) -> dict:
    values = {}
    for name, value in raw.items():
        if name == "layers":
            layers = [collect(items, "layers", parse_layer, t, units) for t in value]
            values["layers"] = tuple(x for x in layers if x is not None)
        elif name in BY_NAME:
            parsed = collect(items, name, parse_value, name, value, units)
            if parsed is not None:
                values[name] = parsed
    return values


def line_spec(raw: dict, units: str = "si", items: list | None = None):
    """The :class:`pipeins.line.LineSpec` of the line values *raw* (parameter → text as the
    user wrote it).  Every problem is collected: with *items* given they are appended there
    (and None returned when there are any), else :class:`Problems` is raised."""
    from .line import LineSpec

    own = [] if items is None else items
    start = len(own)
    values = _parsed({k: v for k, v in raw.items() if k in LINE_PARAMS}, units, own)
    own += check_line({**raw, **values})
    altitude = values.pop("altitude_m", None)
    if altitude is not None and "pressure_pa" not in values:
        from .model import pressure_at_altitude_pa

        pressure = collect(own, "altitude_m", pressure_at_altitude_pa, altitude)
        if pressure is not None:
            values["pressure_pa"] = float(pressure)
    if isinstance(values.get("floor"), str) and ":" in values["floor"]:  # ground:TEMP in the unit system
        kind, _, temp = values["floor"].partition(":")
        from .units import parse_quantity

        value = collect(own, "floor", parse_quantity, temp.strip(), "temperature", "floor", units)
        if value is not None:
            values["floor"] = f"{kind}:{value!r}C"
    spec = None
    if len(own) == start:
        spec = collect(own, "pipe", LineSpec, rh_as_written=True, **values)
        if spec is not None:
            # surface and surroundings checks of the model, named by their parameter
            collect(own, "pipe", spec.build_surroundings)
            collect(own, "finish", spec.build_surface)
            if spec.pipe is not None or spec.outer_diameter_m is not None:
                collect(own, "pipe", spec.pipe_sizes)
            for material, _ in spec.layers:
                from .catalog.materials import lookup_material

                collect(own, "layers", lookup_material, material)
    if items is None and own:
        raise Problems(own)
    return spec if len(own) == start else None


def requirements(raw: dict, units: str = "si", items: list | None = None):
    """The :class:`pipeins.criteria.Requirements` of the sizing values *raw*; problems as
    in :func:`line_spec`."""
    from .criteria import Requirements

    own = [] if items is None else items
    start = len(own)
    values = _parsed({k: v for k, v in raw.items() if k in REQUIREMENT_PARAMS and k != "touch"}, units, own)
    own += [x for x in check_line(values) if x[0] == "contact_time_s"]
    if items is None and own:
        raise Problems(own)
    if len(own) > start:
        return None
    kw = {k: v for k, v in values.items()}
    return Requirements(touch=bool(raw.get("touch", True)), **kw)
