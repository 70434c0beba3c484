"""``--condition``: several design conditions for one line on the command line (``check``, ``size``,
``table``).

Each ``--condition`` names one condition and what differs in it, in the words of the line
options without their dashes::

    --condition "summer: ambient-temp=32C, rh=75, solar=800W/m2"
    --condition "winter: ambient-temp=-15C, wind=8m/s"
    --condition "night: ambient-temp=22C, rh=90, criteria=condensation"

The keys are ``ambient-temp``, ``surroundings-temp``, ``rh``, ``wind``, ``air-pressure``,
``altitude``, ``solar``, ``absorptance`` and ``outer-h`` (read as the option of that name),
and ``criteria`` (the criteria this condition takes, joined by ``+``, as a project file's
``criteria_here``).  The line's own options of those names are shared by every condition
that does not set them; ``KEY=none`` drops a shared value in one condition (``rh=none``).
Every condition needs its air temperature (``ambient-temp=`` or ``--ambient-temp``).

:func:`parse_conditions` reads the texts; :func:`conditions_from_options` builds, per
condition, the :class:`~pipeins.line.LineSpec` and the condition record that
:func:`pipeins.design_conditions.select_over_conditions` takes.
"""

from __future__ import annotations

import click

from ..criteria.registry import names as _criterion_words

__all__ = ["condition_option", "parse_conditions", "conditions_from_options", "CONDITION_KEYS",
           "criteria_asked", "select_under_conditions"]

#: The settings a condition may hold: its key → the click destination of the line option.
CONDITION_KEYS = {"ambient-temp": "ambient_temp", "surroundings-temp": "surroundings_temp", "rh": "rh",
                  "wind": "wind", "air-pressure": "air_pressure", "altitude": "altitude", "solar": "solar",
                  "absorptance": "absorptance", "outer-h": "outer_h"}
#: The library parameter each condition key fills (for errors named by the key).
_PARAM_KEY = {"air_temp_c": "ambient-temp", "surroundings_temp_c": "surroundings-temp", "rh_percent": "rh",
              "wind_m_s": "wind", "pressure_pa": "air-pressure", "altitude_m": "altitude", "solar_w_m2": "solar",
              "absorptance": "absorptance", "outer_h_w_m2k": "outer-h"}
#: Criteria a condition may name (the registered criteria's words, :mod:`pipeins.criteria.registry`:
#: the project file's names and ``tracer`` beside them).
CRITERIA_WORDS = _criterion_words()
_FLAG = "--condition"


def condition_option(func):
    """Add the repeatable ``--condition NAME: KEY=VALUE, …`` option."""
    return click.option(
        "--condition", "condition", multiple=True, metavar='"NAME: KEY=VALUE, ..."',
        help="A design condition, repeatable: its name and what differs in it, e.g. "
             '"summer: ambient-temp=32C, rh=75" "winter: ambient-temp=-15C, wind=8m/s". Keys: '
             + ", ".join(CONDITION_KEYS) + ", criteria (joined by +, e.g. criteria=condensation+touch). "
             "Each criterion is checked under the conditions it belongs to and the largest requirement "
             "governs; the report names the governing condition.")(func)


def parse_conditions(texts) -> list[tuple[str, dict, tuple | None]]:
    """``[(name, settings, criteria_here), …]`` of the ``--condition`` texts: *settings* maps
    click destinations to text (None: the shared value dropped); *criteria_here* is None
    when the condition names none."""
    from ..errors import InputError, closest_names

    out, names = [], set()
    for text in texts or ():
        name, sep, rest = str(text).partition(":")
        name = name.strip()
        if not sep or not name:
            raise InputError(_FLAG, f'"{text}" needs NAME: KEY=VALUE, …, e.g. "summer: ambient-temp=32C, rh=75"')
        if name in names:
            raise InputError(_FLAG, f'"{name}" is given twice; name each condition once')
        names.add(name)
        settings, here = {}, None
        for item in (x.strip() for x in rest.split(",")):
            if not item:
                continue
            key, eq, value = item.partition("=")
            key, value = key.strip().lower().lstrip("-"), value.strip()
            if not eq or not value:
                raise InputError(_FLAG, f'"{name}": "{item}" needs KEY=VALUE, e.g. ambient-temp=32C')
            if key in ("criteria", "criteria-here", "criteria_here"):
                if here is not None:
                    raise InputError(_FLAG, f'"{name}": criteria is given twice')
                here = _criteria(name, value)
                continue
            if key not in CONDITION_KEYS:
                raise InputError(_FLAG, f'"{name}": unknown key "{key}"; '
                                        f'{closest_names(key, list(CONDITION_KEYS) + ["criteria"])}')
            dest = CONDITION_KEYS[key]
            if dest in settings:
                raise InputError(_FLAG, f'"{name}": {key} is given twice')
            settings[dest] = None if value.lower() == "none" else value
        out.append((name, settings, here))
    return out


def _criteria(name: str, value: str) -> tuple:
    from ..errors import InputError, closest_names

    items = [x.strip().lower().replace("-", "_") for x in value.split("+") if x.strip()]
    for item in items:
        if item not in CRITERIA_WORDS:
            raise InputError(_FLAG, f'"{name}": unknown criterion "{item}"; {closest_names(item, CRITERIA_WORDS)}')
    if not items:
        raise InputError(_FLAG, f'"{name}": criteria needs at least one criterion, e.g. criteria=condensation+touch')
    return tuple(dict.fromkeys(items))


def criteria_asked(req, conditions_rh, code=None, economic=None) -> tuple:
    """The criteria (project-file names) the sizing options ask for: touch unless turned off,
    condensation where a condition gives a relative humidity, and each cap, hold time, tracer
    output, code minimum and economic thickness given."""
    from ..criteria.registry import asked_names

    return asked_names(req, {"rh_percent": True if any(conditions_rh) else None, "code": code,
                             "cost_table": economic})


def conditions_from_options(parsed, opts: dict, units: str, items: list):
    """Per condition of *parsed* (:func:`parse_conditions`): ``(condition, spec)``, the
    :class:`pipeins.design_conditions.CommandCondition` and the line under it.  Problems are
    appended to *items* as (``--condition``, message), each naming the condition and its key."""
    from ..design_conditions import CommandCondition
    from ..inputs import cli_word, in_words
    from .options import spec_from_options

    out = []
    for name, settings, here in parsed:
        own = {**opts, **settings}
        if own.get("ambient_temp") is None:
            items.append((_FLAG, f'"{name}" needs its air temperature: ambient-temp=… (or --ambient-temp for '
                                 "every condition)"))
            continue
        sub: list = []
        spec = spec_from_options(own, units, sub)
        for param, message in sub:
            key = _PARAM_KEY.get(param)
            if key is None or CONDITION_KEYS[key] not in settings:
                continue   # a problem of the line's own options, said once under their flag
            items.append((_FLAG, f'"{name}" {key}: {in_words(message, cli_word)}'))
        if spec is None:
            continue
        given = {k: v for k, v in settings.items() if v is not None}
        out.append((CommandCondition(name, float(spec.air_temp_c),
                                     None if spec.rh_percent is None else float(spec.rh_percent),
                                     float(spec.wind_m_s or 0.0), here, given), spec))
    return out


def select_under_conditions(under, material, req, series, units, code, economic, code_paths, sizes=None):
    """``(combined, selection)``: :func:`pipeins.design_conditions.select_over_conditions` over the
    (condition, spec) pairs *under*, and a :class:`pipeins.selection.Selection` to report from:
    for one size the governing condition's own; for several (``table``) the first condition's,
    its outcome holding per criterion the largest requirement over the conditions and per size
    the governing condition's pick, heat flow and surface temperature."""
    from dataclasses import replace
    from types import SimpleNamespace

    import numpy as np

    from ..design_conditions import criteria_under, governing_selection, select_over_conditions, why_unused
    from ..errors import InputError

    conds = [c for c, _ in under]
    specs = {c.name: s for c, s in under}
    criteria = criteria_asked(req, [c.rh_percent is not None for c in conds], code, economic)
    for c in conds:
        for key in c.criteria_here or ():
            if key not in criteria:
                raise InputError(_FLAG, f'"{c.name}": criterion "{key}" is not asked for on this command line '
                                        f"(asked: {', '.join(criteria) or 'none'})")
        if len(conds) > 1 and not criteria_under(c, criteria):
            raise InputError(_FLAG, f'"{c.name}" takes none of the criteria asked for '
                                    f"({', '.join(criteria) or 'none'}): {why_unused(c)}")

    def spec_of(cond, with_rh):
        spec = specs[cond.name]
        return spec if with_rh or spec.rh_percent is None else replace(spec, rh_percent=None)

    combined = select_over_conditions(spec_of, conds, criteria, material, req, series, units, sizes=sizes,
                                      code=code, economic=economic, code_paths=code_paths, skip_unsized=True)
    if sizes is None:
        return combined, governing_selection(combined)
    out = combined.outcome
    first = next(iter(combined.selections.values()))
    govs = [combined.selections[name].outcome for name in combined.governing_condition]
    n = len(govs)

    def per_size(attr):
        return np.array([float(np.ravel(getattr(o.result, attr))[i]) for i, o in enumerate(govs)])

    records, seen = [], set()
    for c in out.criteria:   # one record per criterion: the largest requirement over the conditions
        if c.key in seen:
            continue
        seen.add(c.key)
        required = combined.required_m.get(c.key, c.required_m)
        base = next(r for o in (s.outcome for s in combined.selections.values()) for r in o.criteria
                    if r.key == c.key)
        records.append(replace(base, required_m=np.asarray(required, dtype=float),
                               feasible=np.all([r.feasible for o in (s.outcome for s in combined.selections.values())
                                                for r in o.criteria if r.key == c.key], axis=0)))
    result = SimpleNamespace(heat_flow_w_per_m=per_size("heat_flow_w_per_m"), surface_temp_c=per_size("surface_temp_c"),
                             warnings=list(out.result.warnings), shape=(n, 1))
    merged = replace(out, criteria=records, result=result)
    return combined, replace(first, outcome=merged, notes=list(dict.fromkeys(list(first.notes) + combined.notes)))
