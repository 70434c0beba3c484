"""``pipeins sweep``: vary one input over a range; heat flow and thickness per value."""

from __future__ import annotations

import re

import click

from .options import emit, line_options, output_options, plot_option, spec_from_options
from .sizing_options import sizing_options

#: Names ``--vary`` takes: name -> (library variable, the line option it replaces or None).
NAMES = {
    "wind": ("wind_m_s", "--wind"),
    "emittance": ("emittance", "--emittance"),
    "ambient-temp": ("air_temp_c", "--ambient-temp"),
    "surroundings-temp": ("surroundings_temp_c", "--surroundings-temp"),
    "rh": ("rh_percent", "--rh"),
    "fluid-temp": ("fluid_temp_c", "--fluid-temp"),
    "k-factor": ("conductivity_factor", None),
}
ALIASES = {"ambient": "ambient-temp", "air": "ambient-temp", "surroundings": "surroundings-temp",
           "conductivity-factor": "k-factor", "humidity": "rh"}
#: Points a sweep may have.
MIN_POINTS, MAX_POINTS, DEFAULT_POINTS = 2, 201, 11
_FORM = "write NAME=START..STOP[unit]:N, e.g. wind=0..10m/s:11"
_RANGE_RE = re.compile(r"^\s*(?P<name>[A-Za-z][\w-]*)\s*=\s*(?P<start>.+?)\s*\.\.\s*(?P<stop>[^:]+?)\s*"
                       r"(?::\s*(?P<n>[^:]*?)\s*)?$")
_NUMBER_RE = re.compile(r"^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?")


def _allowed() -> str:
    return ", ".join(NAMES)


def _with_unit(text: str, other: str) -> str:
    """*text* with the unit of *other* when *text* is a bare number (``0`` of ``0..10m/s``)."""
    m, o = _NUMBER_RE.match(text), _NUMBER_RE.match(other)
    if m and m.end() == len(text) and o and o.end() < len(other):
        return text + other[o.end():]
    return text


def parse_vary(text: str, units: str = "si") -> tuple[str, str, list]:
    """``NAME=START..STOP[unit]:N`` → (name, library variable, N values in SI, evenly spaced
    from START to STOP).  A unit written on one end applies to a bare other end; without
    ``:N``, 11 values."""
    import numpy as np

    from ..errors import InputError, near_hint
    from ..inputs import BY_NAME, parse_value
    from ..sweep import LIMITS
    from ..units import parse_number

    shown = f'"{text.strip()}"'
    m = _RANGE_RE.match(text)
    if not m:
        raise InputError("--vary", f"{shown}: {_FORM}; NAME is one of {_allowed()}")
    raw = m.group("name").lower().replace("_", "-")
    name = ALIASES.get(raw, raw)
    if name not in NAMES:
        raise InputError("--vary", f'unknown input "{m.group("name")}"; {near_hint(raw, list(NAMES))} '
                                   f"(vary one of {_allowed()})")
    variable = NAMES[name][0]
    count = m.group("n")
    if count is None:
        n = DEFAULT_POINTS
    elif not re.fullmatch(r"\d+", count):
        raise InputError("--vary", f'{shown}: the number of points "{count}" is not a whole number; {_FORM}')
    else:
        n = int(count)
    if not MIN_POINTS <= n <= MAX_POINTS:
        raise InputError("--vary", f"{shown}: a sweep has {MIN_POINTS} to {MAX_POINTS} points (got {n})")
    start, stop = m.group("start"), m.group("stop")
    start, stop = _with_unit(start, stop), _with_unit(stop, start)
    ends = []
    for end in (start, stop):
        try:
            if variable == "conductivity_factor":
                low, high, _ = LIMITS[variable]
                ends.append(parse_number(end, "--vary", "a conductivity factor", low, high, low_open=True))
            else:
                ends.append(float(parse_value(variable, end, units)))
        except InputError as exc:
            from ..inputs import in_words

            raise InputError("--vary", f"{shown}: {in_words(exc.message, lambda w: w)}") from None
    low, high, open_low = LIMITS[variable]
    for value in ends:
        if (value <= low if open_low else value < low) or value > high:
            bound = "above" if open_low else "at least"
            what = BY_NAME[variable].help.split(" [")[0] if variable in BY_NAME else variable
            raise InputError("--vary", f"{shown}: {what} must be {bound} {low:g} and at most {high:g} °C")
    if ends[0] == ends[1]:
        raise InputError("--vary", f"{shown}: the range is empty (start equals stop); give two different ends")
    return name, variable, list(np.linspace(ends[0], ends[1], n))


@click.command()
@click.option("--vary", required=True, metavar="NAME=START..STOP[unit]:N",
              help="The input to sweep and its range, N evenly spaced values from START to STOP (default "
                   f"N {DEFAULT_POINTS}). NAME: wind, emittance, ambient-temp, surroundings-temp, rh, "
                   "fluid-temp, or k-factor (a factor on every insulation layer's conductivity).")
@line_options
@sizing_options
@output_options
@plot_option
def sweep(fmt, units, output, vary, material, series, **opts):
    """Vary one input over a range: heat flow and the thickness each criterion needs.

    At every value of the swept input, prints the heat flow and surface temperature of the
    line's own build-up (its --layer options; the bare line without them) and, with
    --material, the least thickness of that material over the build-up for each criterion
    that applies (touch safety, condensation, heat-flow cap, temperature change, freeze
    hold; as `pipeins size` sizes them), the commercial pick, the governing criterion and
    the heat flow at the pick. Losses and gains are shown apart. The line options are
    those of `pipeins size`; the swept input is not given as its own option. Code minimums
    and the economic thickness do not depend on these inputs' ranges in the same way and
    are left to `pipeins size` and `pipeins cost`.

    \b
    Example:
      pipeins sweep --vary wind=0..10m/s:11 --pipe "NPS 4" --fluid-temp 180C \\
          --ambient-temp 5C --layer "mineral wool:50mm"
      pipeins sweep --vary k-factor=1..1.5:6 --pipe "NPS 6" --steam-pressure 10barg \\
          --material "mineral wool" --finish "aluminium, dull or aged" --max-heat-flow 90W/m
      pipeins sweep --vary rh=50..90%:9 --pipe DN50 --fluid-temp 6C --ambient-temp 28C \\
          --material "flexible elastomeric foam" --format html -o rh-sweep.html
    """
    from ..errors import InputError
    from ..inputs import Problems, collect
    from ..reports.sweep import sweep_report
    from ..sweep import sweep as run_sweep
    from ..units import material_in_si
    from .sizing_options import parse_series, requirements_from_options

    name, variable, values = parse_vary(vary, units)
    replaced = NAMES[name][1]
    if replaced is not None and opts.get(replaced[2:].replace("-", "_")) is not None:
        raise InputError("--vary", f"{name} is swept; drop {replaced}")
    if variable == "conductivity_factor" and not opts.get("layers") and material is None:
        raise InputError("--vary", "k-factor scales the insulation's conductivity; give --layer or --material")
    items: list = []
    spec = spec_from_options(opts, units, items)
    req = requirements_from_options(opts, units, items) if material is not None else None
    if items:
        raise Problems(items)
    if material is not None:
        material = material_in_si(material, units, "--material")
    try:
        result = run_sweep(spec, variable, values, material, req, parse_series(series, units), units)
    except InputError as exc:
        if exc.name in ("steam_pressure_pa", "outer_h_w_m2k"):
            from ..inputs import cli_line

            raise InputError("--vary", cli_line("", exc.message)) from None
        raise
    emit(sweep_report(result, units, vary.strip()), fmt, units, output)


# --material is optional here: without it the sweep shows the build-up's heat flow only.
for _param in sweep.params:
    if _param.name == "material":
        _param.required = False
        _param.help = ("The layer to size over the build-up (outermost): a catalogue material or "
                       '"k=0.040". Without it, only the heat flow of the build-up.')
