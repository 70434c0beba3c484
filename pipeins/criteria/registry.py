"""The sizing criteria as registered records: one :class:`CriterionRecord` per criterion.

A record says everything the rest of pipeins needs to know about a criterion, in one place:

* ``key`` — the JSON key (``criteria[].key``, ``required_mm``, ``governing``); stable;
* ``label`` — what the reports call it;
* ``inputs`` — the parameters it reads (:data:`pipeins.inputs.PARAMS` names: the
  :class:`~pipeins.criteria.Requirements` fields, and line or selection inputs such as the
  relative humidity or the code rule set); from them come its command-line options
  (:attr:`CriterionRecord.options`) and project-file keys (:attr:`CriterionRecord.file_keys`);
  ``asks`` are those of them whose value asks for the criterion;
* ``name`` — its word in a criteria list (a project service's ``criteria``, a design condition's
  ``criteria_here``, ``--condition "…: criteria=a+b"``); ``project`` — whether a project file
  takes it (its inputs have project keys);
* ``kinds`` — the section kinds it applies to (``pipe``, ``duct``, ``face``, ``sphere``,
  ``vessel``); asking for it on another kind is a one-line error;
* ``decide`` — for a criterion the search sizes for: a function of the line
  (:class:`Line`: its kind, requirements and temperatures, hot or cold) returning the
  :class:`~pipeins.criteria.base.Criterion`, a note saying why it does not apply, or None
  when it is not asked for;
* ``required`` — for a criterion whose thickness comes from elsewhere (code minimum,
  economic thickness): a function of the selection (:class:`Selecting`) returning its
  :class:`~pipeins.sizing.CriterionOutcome` (or None when not asked for), a lower bound
  on the commercial pick.

Functions are named ``"module:function"`` and imported only when a line uses them, so this
module imports nothing heavy (the project reader and the command line read it freely).

:func:`pipeins.criteria.build_criteria` walks the ``decide`` records in order, and
:func:`pipeins.selection.select` the ``required`` ones; the service limits of every layer
(``always``) are judged on the selected build-up.  The project file's criterion names
(:data:`pipeins.project.CRITERIA`), the words of ``--condition … criteria=``, the options that name an unmet criterion in an error
(:func:`error_option`) and a condition's criteria are derived from
the records; ``tests/test_criterion_registry.py`` walks every record through the command line
and the project reader.
"""

from __future__ import annotations

import importlib
from dataclasses import dataclass
from typing import Any, Callable

__all__ = ["CriterionRecord", "RECORDS", "records", "by_key", "by_name", "names", "project_names", "asked_names",
           "register", "Line", "Selecting", "SECTION_KINDS", "resolve", "requirements_for", "needed_keys",
           "error_option"]

#: Every section kind (:attr:`pipeins.line.LineSpec.section_kind`).
SECTION_KINDS = ("pipe", "duct", "face", "sphere", "vessel")
_KIND_WORDS = {"pipe": "pipes", "duct": "ducts", "face": "faces", "sphere": "spheres", "vessel": "vessels"}


def resolve(target):
    """The function a record names (``"module:function"``), imported on first use."""
    if target is None or callable(target):
        return target
    module, _, name = target.partition(":")
    return getattr(importlib.import_module(module), name)


@dataclass(frozen=True)
class CriterionRecord:
    """One sizing criterion (see the module docstring for each field)."""

    key: str
    label: str
    inputs: tuple[str, ...] = ()
    asks: tuple[str, ...] = ()
    name: str | None = None
    project: bool = True
    kinds: tuple[str, ...] = SECTION_KINDS
    decide: str | Callable | None = None
    required: str | Callable | None = None
    #: On in a project service that lists no criteria (touch, condensation).
    default: bool = False
    #: The outcome depends on the build-up under the sized layer: computed again when an
    #: inner layer is added (the economic thickness).
    per_build_up: bool = False
    #: Judged on every selected build-up, asked for or not (the service limits).
    always: bool = False
    #: Where a project line has several design conditions: a function of a condition
    #: (:class:`pipeins.project.Condition`) saying whether the criterion is checked under it
    #: (None: under every condition).
    under: str | Callable | None = None

    @property
    def fields(self) -> tuple[str, ...]:
        """The :class:`~pipeins.criteria.Requirements` fields it reads."""
        from dataclasses import fields

        from . import Requirements

        own = {f.name for f in fields(Requirements)}
        return tuple(n for n in self.inputs if n in own)

    @property
    def options(self) -> tuple[str, ...]:
        """Its command-line options (on ``size`` and ``table``); the first names it in an error."""
        from ..inputs import BY_NAME

        return tuple(BY_NAME[n].flag for n in self.inputs if n in BY_NAME and BY_NAME[n].flag)

    @property
    def file_keys(self) -> tuple[str, ...]:
        """Its project-file keys (services, conditions or [project])."""
        from ..inputs import BY_NAME

        return tuple(BY_NAME[n].key for n in self.inputs if n in BY_NAME and BY_NAME[n].key)

    def asked(self, *sources) -> bool:
        """Whether the inputs in *sources* (objects such as the requirements and the line, or
        dicts by parameter name; the first that has a name gives its value) ask for it."""
        def value(name):
            for source in sources:
                if isinstance(source, dict):
                    if name in source:
                        return source[name]
                elif hasattr(source, name):
                    return getattr(source, name)
            return None

        return any(value(n) is not None and value(n) is not False for n in self.asks)

    def check_kind(self, kind: str, name: str | None = None):
        """Refuse it on a section kind it does not apply to (one line, naming *name* or its
        first input)."""
        if kind in self.kinds:
            return
        from ..errors import InputError

        allowed = [_KIND_WORDS[k] for k in self.kinds]
        words = allowed[0] if len(allowed) == 1 else ", ".join(allowed[:-1]) + " and " + allowed[-1]
        raise InputError(name or (self.asks or self.inputs)[0], f"{self.label} applies to {words}, not to a {kind}")


#: The criteria, in the order reports list them (the criteria the search sizes for, then those
#: whose thickness comes from elsewhere, then the service limits).
RECORDS: list[CriterionRecord] = [
    CriterionRecord("surface_temp", "touch safety", ("touch_limit_c", "contact_time_s", "touch"),
                    asks=("touch",), name="touch", default=True, decide="pipeins.criteria.touch:decide"),
    CriterionRecord("condensation", "condensation control", ("rh_percent", "dew_margin_k"),
                    asks=("rh_percent",), name="condensation", default=True,
                    decide="pipeins.criteria.condensation:decide", under="pipeins.criteria.condensation:under"),
    CriterionRecord("heat_flow", "heat-flow cap", ("max_heat_flow_w_per_m", "min_reduction"),
                    asks=("max_heat_flow_w_per_m", "min_reduction"), name="heat_flow",
                    decide="pipeins.criteria.heat_flow:decide"),
    CriterionRecord("heat_flux", "heat-flux cap", ("max_heat_flux_w_m2",), asks=("max_heat_flux_w_m2",),
                    name="heat_flux", decide="pipeins.criteria.heat_flux:decide"),
    CriterionRecord("temp_change", "temperature change along the run", ("max_temp_change_k",),
                    asks=("max_temp_change_k",), name="temp_change", kinds=("pipe", "duct"),
                    decide="pipeins.criteria.temp_change:decide"),
    CriterionRecord("freeze", "freeze protection (hold time)", ("hold_time_s", "ice_fraction"),
                    asks=("hold_time_s",), name="freeze", kinds=("pipe",),
                    decide="pipeins.criteria.freeze:decide", under="pipeins.criteria.freeze:under"),
    CriterionRecord("tracer", "tracer output", ("tracer_output_w_per_m", "safety_factor_percent"),
                    asks=("tracer_output_w_per_m",), name="tracer", kinds=("pipe", "duct"),
                    decide="pipeins.criteria.tracer:decide"),
    CriterionRecord("code", "code minimum", ("code", "code_table", "duct_location", "duct_service", "climate_zone"),
                    asks=("code",), name="code", kinds=("pipe", "duct"),
                    required="pipeins.criteria.code:required"),
    CriterionRecord("economic", "economic thickness", ("price", "cost_table"), asks=("cost_table",),
                    name="economic", required="pipeins.criteria.economic:required", per_build_up=True),
    CriterionRecord("service_limit", "service temperature", ("material",), always=True),
]


def records() -> tuple[CriterionRecord, ...]:
    """Every registered criterion, in order."""
    return tuple(RECORDS)


def by_key(key: str) -> CriterionRecord:
    return next(r for r in RECORDS if r.key == key)


def error_option(key: str, default: str = "--series") -> str:
    """The command-line option an error names when the criterion *key* cannot be met: the
    first of its record's options (*default* for a key with none, or no criterion: the
    thickness series ran out).

    >>> error_option("heat_flow"), error_option("service_limit"), error_option("")
    ('--max-heat-flow', '--material', '--series')
    """
    record = next((r for r in RECORDS if r.key == key), None)
    return record.options[0] if record is not None and record.options else default


def by_name(name: str) -> CriterionRecord:
    """The record of the criteria-list word *name*."""
    return next(r for r in RECORDS if r.name == name)


def names() -> tuple[str, ...]:
    """Every criteria-list word, in order (``--condition … criteria=``)."""
    return tuple(r.name for r in RECORDS if r.name)


def project_names() -> tuple[str, ...]:
    """The names a project service's ``criteria`` list accepts, in order."""
    return tuple(r.name for r in RECORDS if r.name and r.project)


def asked_names(req, given: dict) -> tuple[str, ...]:
    """The criteria-list words of the criteria that *req* and the selection inputs *given*
    (parameter name → value: ``rh_percent``, ``code``, ``cost_table``) ask for, in order."""
    return tuple(r.name for r in RECORDS if r.name and r.asked(given, req))


def requirements_for(req, names):
    """*req* (a :class:`~pipeins.criteria.Requirements`) with only the criteria of the words
    *names* asked for: what asks for each other one switched off."""
    from dataclasses import fields, replace

    own = {f.name: f for f in fields(req)}
    off = {}
    for record in RECORDS:
        if record.name is None or record.name in names:
            continue
        for name in record.asks:
            if name in own:
                off[name] = False if isinstance(getattr(req, name), bool) else None
    return replace(req, **off)


def needed_keys(record) -> str:
    """The project-file keys that ask for *record*, in words (for an error)."""
    from ..inputs import BY_NAME

    params = [BY_NAME[n] for n in record.asks if n in BY_NAME and BY_NAME[n].key]
    text = " or ".join(f'"{p.key}"' for p in params)
    return text + (" (here or in [project])" if params and all("project" in p.tables for p in params) else "")


def register(record: CriterionRecord, before: str | None = None) -> CriterionRecord:
    """Add *record* (before the record keyed *before*, else last among those of its group)."""
    if any(r.key == record.key for r in RECORDS):
        raise ValueError(f'a criterion keyed "{record.key}" is registered already')
    if before is not None:
        RECORDS.insert(next(i for i, r in enumerate(RECORDS) if r.key == before), record)
    else:
        last = max((i for i, r in enumerate(RECORDS) if r.always == record.always), default=len(RECORDS) - 1)
        RECORDS.insert(last + 1, record)
    return record


class Line:
    """What a criterion's ``decide`` reads: the line (``spec``, a
    :class:`~pipeins.line.LineSpec`), the requirements ``req``, the section ``kind``, the fluid
    and air temperatures [°C] (arrays over the sizes), the outer surface's kind (for a burn
    threshold) and the unit system of the notes; with the extremes worked out once."""

    def __init__(self, spec, req, fluid_temp_c, air_temp_c, surface_kind: str, units: str = "si"):
        import numpy as np

        self.spec, self.req, self.surface_kind, self.units = spec, req, surface_kind, units
        self.kind = spec.section_kind
        self.fluid_temp_c, self.air_temp_c = fluid_temp_c, air_temp_c
        self.fluid_hot = float(np.max(fluid_temp_c))
        self.fluid_cold = float(np.min(fluid_temp_c))
        air = np.asarray(air_temp_c, dtype=float)
        self.radiant = np.asarray(spec.air_temp_c if spec.surroundings_temp_c is None else spec.surroundings_temp_c,
                                  dtype=float)
        self.air_warm = float(np.max(air))
        self.air_cold = float(np.min(air))
        self.air = air
        self.coldest_outside = float(min(np.min(air), np.min(self.radiant)))
        #: Surroundings colder than the air (a clear night sky): radiation can pull an insulated
        #: surface below the air temperature.
        self.cold_sky = float(np.min(self.radiant)) < float(np.min(air))


@dataclass
class Selecting:
    """What a ``required`` function reads: the line and requirements, the sizing problem
    (:class:`~pipeins.sizing.SizingProblem`: the model, the fluid, the surroundings), the
    material, the sizes and the selection's own inputs (``code``, ``code_paths``,
    ``economic``).  ``extras`` takes what a function hands back beside its outcome (the
    economic curves)."""

    spec: Any
    req: Any
    problem: Any
    material: Any
    sizes: list
    code: str | None = None
    code_paths: tuple = ()
    economic: Any = None
    extras: dict | None = None
    #: The unit system the outcomes' sentences are written in ("si" or "us").
    units: str = "si"

    @property
    def kind(self) -> str:
        return self.spec.section_kind

    def given(self) -> dict:
        """The selection inputs by parameter name (for :meth:`CriterionRecord.asked`)."""
        return {"code": self.code, "cost_table": None if self.economic is None else self.economic.cost_table}
