"""Options shared by ``size`` and ``table``: the layer to size, the series and the criteria."""

from __future__ import annotations

import re

import click

__all__ = ["sizing_options", "requirements_from_options", "parse_series"]

SIZING_OPTIONS = [
    click.option("--material", required=True,
                 help='The layer to size (outermost): a catalogue material or "k=0.040".'),
    click.option("--series", help="Thickness series name (see `pipeins list series`) or a list, e.g. "
                                  '"25,40,50,80mm" or "1,1.5,2in". Default: the material\'s series.'),
    click.option("--no-touch-check", is_flag=True, help="Do not size for touch safety on hot lines."),
    click.option("--contact-time", help="Pick the touch limit from burn thresholds for this contact "
                                        "time (1 s to 8 h) and the finish's kind of surface."),
    click.option("--dew-margin", help="Surface margin above the dew point on cold lines (default 1 K, "
                                      "common practice)."),
    click.option("--max-heat-flow", help="Cap on the magnitude of the heat flow, e.g. 30W/m."),
    click.option("--max-heat-flux", help="Cap on the outer heat flux of the worst part (a duct's face), "
                                         "per m² of outer surface, e.g. 15W/m2."),
    click.option("--duct-location", help="With --code on a duct: where it runs (conditioned, unconditioned, "
                                         "outdoors, envelope)."),
    click.option("--duct-service", help="With --code on a duct: supply (default) or return."),
    click.option("--climate-zone", help="With --code on a duct: the climate zone, e.g. 4 or 5A."),
    click.option("--min-reduction", help="Least reduction against the bare line, e.g. 90%."),
    click.option("--max-temp-change", help="Cap on the fluid temperature change over --length at --flow."),
    click.option("--hold-time", help="Still water must stay above 0 °C this long, e.g. 8h."),
    click.option("--ice-fraction", help="With --hold-time: the ice fraction allowed to form (default 0)."),
    click.option("--tracer-output", help="Heat tracing: the tracer's output, e.g. 15W/m; the line's fluid "
                                         "temperature is the maintain temperature, its air the minimum ambient."),
    click.option("--safety-factor", help="With --tracer-output: safety factor on the heat loss, percent "
                                         "(default 20 %)."),
]


def sizing_options(func):
    for option in reversed(SIZING_OPTIONS):
        func = option(func)
    return func


def parse_series(text: str | None, units: str):
    """A series name, or a comma list of thicknesses (a unit on the last item applies to
    the bare ones before it), as a tuple in metres."""
    from ..units import parse_quantity

    if text is None:
        return None
    items = [x.strip() for x in text.split(",") if x.strip()]
    if len(items) == 1 and not re.match(r"^[\d.]", items[0]):
        return items[0]
    if not items:
        from ..errors import InputError

        raise InputError("--series", "the thickness series needs at least one thickness above zero")
    unit = re.sub(r"^[\d.\s/-]+", "", items[-1])
    values = [parse_quantity(x if re.search(r"[A-Za-z\"]", x) else x + unit, "thickness", "--series", units)
              for x in items]
    return tuple(values)


def requirements_from_options(opts: dict, units: str, items: list | None = None):
    """The :class:`pipeins.criteria.Requirements` of the sizing options, built by
    :func:`pipeins.inputs.requirements` as the project file's services are."""
    from ..inputs import REQUIREMENT_PARAMS, requirements, values_from_options

    raw = values_from_options(opts, [n for n in REQUIREMENT_PARAMS if n != "touch"])
    raw["touch"] = not opts.get("no_touch_check")
    return requirements(raw, units, items)
