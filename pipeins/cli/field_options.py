"""Field-condition options of ``check``: heat tracing, buried lines, fittings and user
materials (:data:`FITTING_OPTIONS` also on ``cost``).

:func:`field_options` adds the options; :func:`pop_field_options` takes their text out of
the command's options before the line is built; :func:`field_line` turns the line into the
one solved (buried in soil); :func:`add_field_sections` solves what they ask for and adds
its sections to the check report.  Every problem is an
:class:`~pipeins.errors.InputError` naming the flag, raised before anything is written.
"""

from __future__ import annotations

import click

__all__ = ["field_options", "fitting_options", "pop_field_options", "field_line", "add_field_sections",
           "parse_fittings", "FIELD_FLAGS", "FITTING_FLAGS"]

FITTING_OPTIONS = [
    click.option("--valve", "valve", multiple=True, metavar="KIND:SIZE[:CLASS]",
                 help="A bare valve on the line, repeatable: KIND gate, globe, ball, butterfly, check or strainer; "
                      'SIZE as the catalogue names it (DN50, "NPS 2"); CLASS PN16, PN40, 150 or 300 (default '
                      "PN16 for DN, class 150 for NPS), e.g. gate:DN50:PN40 (tables/fitting_areas.csv)."),
    click.option("--flange", "flange", multiple=True, metavar="SIZE[:CLASS]",
                 help="A bare flanged joint (a pair of flanges) on the line, repeatable, e.g. DN100 or \"NPS 4:300\"."),
    click.option("--cover", metavar="MATERIAL:THICKNESS",
                 help='Insulated removable cover on every --valve and --flange, e.g. "mineral wool:50mm": '
                      "the covered heat flow and the saving."),
]
#: click destinations of the fitting options.
FITTING_FLAGS = ("valve", "flange", "cover")

FIELD_OPTIONS = [
    click.option("--maintain-temp", help="Heat tracing: the temperature the tracer must hold, e.g. 5C; "
                                         "gives the design heat loss per metre."),
    click.option("--min-ambient", help="Heat tracing: the minimum design ambient (default --ambient-temp)."),
    click.option("--safety-factor", help="Heat tracing: safety factor on the calculated heat loss, percent "
                                         "(default 20 %, common practice after IEEE 515 / IEC/IEEE 60079-30-2)."),
    click.option("--tracer-output", help="Heat tracing: the tracer's output at the maintain temperature, "
                                         "e.g. 15W/m, compared with the design heat loss."),
    click.option("--buried", help="Buried line: depth of the pipe centre below the ground surface, e.g. 0.8m; "
                                  "the soil replaces the air film and radiation."),
    click.option("--soil-k", help="Buried line: soil conductivity, W/(m·K) (0.1 to 5)."),
    click.option("--soil", help='Buried line: soil type instead of --soil-k, e.g. "moist sand" '
                                "(tables/soils.csv)."),
    click.option("--ground-temp", help="Buried line: ground surface temperature, e.g. 8C."),
    click.option("--twin-spacing", help="Buried line: a second pipe of the same build-up in the same trench, its "
                                        "centre this far away (e.g. 0.5m), with --return-temp."),
    click.option("--return-temp", help="Buried line: the second pipe's fluid temperature, e.g. 45C."),
    click.option("--twin-casing", help="Buried line: the supply (this pipe) and a return of the same size in ONE "
                                       "casing of this outer diameter, e.g. 250mm, centres --twin-spacing apart, "
                                       "filled with --casing-insulation (multipole method)."),
    click.option("--casing-insulation", help='With --twin-casing: the casing\'s insulation, e.g. '
                                             '"polyisocyanurate foam" (a catalogue or --materials name).'),
    click.option("--materials", type=click.Path(), help="A CSV of your own insulation materials (declared "
                 "conductivity against mean temperature, the columns of tables/insulation_materials.csv); "
                 "their names are found before the catalogue's."),
    click.option("--ageing-factor", help="Design conductivity: allowance for ageing, percent, e.g. 10 %."),
    click.option("--moisture-factor", help="Design conductivity: allowance for moisture in service, percent."),
    click.option("--joints-factor", help="Design conductivity: allowance for joints and gaps, percent."),
] + FITTING_OPTIONS
#: click destinations of the options above.
FIELD_FLAGS = ("maintain_temp", "min_ambient", "safety_factor", "tracer_output", "buried", "soil_k", "soil",
               "ground_temp", "twin_spacing", "return_temp", "twin_casing", "casing_insulation", "materials", "ageing_factor", "moisture_factor", "joints_factor") + FITTING_FLAGS
_WORDS = {"maintain_temp_c": "--maintain-temp", "safety_factor_percent": "--safety-factor",
          "tracer_output_w_per_m": "--tracer-output", "depth_m": "--buried", "soil_k_w_mk": "--soil-k",
          "soil": "--soil", "outer_h_w_m2k": "--outer-h", "ageing_percent": "--ageing-factor",
          "moisture_percent": "--moisture-factor", "joints_percent": "--joints-factor"}


def field_options(func):
    for option in reversed(FIELD_OPTIONS):
        func = option(func)
    return func


def fitting_options(func):
    """Add ``--valve``, ``--flange`` and ``--cover`` (for commands without the other field options)."""
    for option in reversed(FITTING_OPTIONS):
        func = option(func)
    return func


def parse_fittings(field: dict, units: str):
    """``(fittings, cover)`` of the fitting options' text in *field*: catalogue fittings in the
    order given (``--valve`` first), and the cover ``(material, thickness_m)`` or None."""
    if not (field.get("valve") or field.get("flange")) and field.get("cover") is None:
        return [], None
    from ..catalog.fittings import lookup_fitting
    from ..errors import InputError

    fittings = []
    for text in field.get("valve") or ():
        kind, sep, rest = str(text).partition(":")
        if not sep or not rest.strip():
            raise InputError("--valve", f'"{text}" needs KIND:SIZE[:CLASS], e.g. gate:DN50 or globe:"NPS 2":300')
        size, _, cls = rest.partition(":")
        from ..catalog.fittings import VALVE_KINDS

        if kind.strip().lower() == "flange":
            raise InputError("--valve", "a flanged joint is --flange SIZE[:CLASS]")
        if kind.strip().lower() not in VALVE_KINDS + ("strainer",):
            raise InputError("--valve", f'unknown fitting kind "{kind.strip()}"; known: '
                                        f'{", ".join(VALVE_KINDS + ("strainer",))}')
        fittings.append(lookup_fitting(kind, size, cls or None, "--valve"))
    for text in field.get("flange") or ():
        size, _, cls = str(text).partition(":")
        if not size.strip():
            raise InputError("--flange", f'"{text}" needs SIZE[:CLASS], e.g. DN100 or "NPS 4:300"')
        fittings.append(lookup_fitting("flange", size, cls or None, "--flange"))
    cover = None
    if field.get("cover") is not None:
        if not fittings:
            raise InputError("--cover", "covers the fittings: give --valve or --flange too")
        from ..inputs import parse_layer

        cover = parse_layer(field["cover"], units, "--cover")
        from ..catalog.materials import lookup_material

        try:
            lookup_material(cover[0])
        except InputError as exc:
            raise InputError("--cover", exc.message) from None
    return fittings, cover


def pop_field_options(opts: dict, units: str = "si") -> dict:
    """The field options' text (None where not given), removed from *opts*.  A materials file
    and design factors are put in use for the rest of the command (the click context)."""
    field = {name: opts.pop(name, None) for name in FIELD_FLAGS}
    names = ("ageing_factor", "moisture_factor", "joints_factor")
    if field["materials"] is None and all(field[n] is None for n in names):
        return field
    from ..errors import InputError
    from ..user_materials import DesignFactors, materials_in_use, read_materials_file

    q = _reader(field, units)
    try:
        factors = DesignFactors(*(q(n, "percent") or 0.0 for n in names))
    except InputError as exc:
        raise _in_words(exc) from None
    materials, warnings = read_materials_file(field["materials"]) if field["materials"] is not None else ({}, [])
    given = any(field[n] is not None for n in names)
    click.get_current_context().with_resource(materials_in_use(materials, factors if given else None))
    field["_materials"] = dict(file=field["materials"], names=sorted(materials), warnings=warnings,
                               factors=factors if given else None)
    return field


def _flag(name: str) -> str:
    return "--" + name.replace("_", "-")


def _reader(field: dict, units: str):
    from ..units import parse_quantity

    def q(name, kind):
        text = field.get(name)
        return None if text is None else parse_quantity(text, kind, _flag(name), units)

    return q


def _in_words(exc):
    """*exc* (an InputError naming a library parameter) named by its flag."""
    from ..errors import InputError

    if exc.name in _WORDS:
        return InputError(_WORDS[exc.name], exc.message)
    return exc


def field_line(spec, field: dict, units: str):
    """The line to solve: *spec*, or *spec* buried in soil with ``--buried`` (the buried
    line's particulars are kept in *field* under ``"_buried"`` for its section)."""
    from ..errors import InputError

    q = _reader(field, units)
    depth = q("buried", "length")
    given = [n for n in ("soil_k", "soil", "ground_temp", "twin_casing", "casing_insulation")
             if field.get(n) is not None]
    if depth is None:
        if given:
            raise InputError(_flag(given[0]), "is a buried-line input: give --buried DEPTH too")
        return spec
    k = q("soil_k", "conductivity") if field.get("soil_k") is not None else None
    if (k is None) == (field.get("soil") is None):
        raise InputError("--soil-k", "a buried line needs the soil: give --soil-k or --soil, one of them")
    ground = q("ground_temp", "temperature")
    if ground is None:
        raise InputError("--ground-temp", "a buried line needs the ground surface temperature")
    from ..buried import buried_spec, lookup_soil

    if field.get("twin_casing") is not None or field.get("casing_insulation") is not None:
        from .twin_casing_options import centred_in_casing

        field["_unburied"] = spec
        spec = centred_in_casing(spec, field, units)
    try:
        soil = lookup_soil(field["soil"]) if field.get("soil") is not None else None
        k = soil.conductivity_w_mk if soil is not None else k
        buried, diameter, s, r, h = buried_spec(spec, depth, k, ground)
    except InputError as exc:
        raise _in_words(exc) from None
    field["_buried"] = dict(depth_m=depth, soil_name=soil.name if soil else "given", soil_k_w_mk=k,
                            soil_source=soil.source if soil else "given", ground_temp_c=ground,
                            casing_diameter_m=diameter, shape_factor_per_m=s, soil_resistance_mk_w=r,
                            soil_coefficient_w_m2k=h)
    return buried


def _twin(report, spec, field, data, units, q) -> None:
    """A second pipe in the trench (``--twin-spacing`` with ``--return-temp``): both heat flows."""
    from dataclasses import replace

    import numpy as np

    from ..errors import InputError

    spacing, ret = q("twin_spacing", "length"), q("return_temp", "temperature")
    if spacing is None and ret is None:
        return
    if spacing is None or ret is None:
        raise InputError("--twin-spacing" if spacing is None else "--return-temp",
                         "two pipes in one trench need both --twin-spacing and --return-temp")
    casing = data["casing_diameter_m"]
    if not spacing > casing:
        raise InputError("--twin-spacing", f"the centres must be more than a casing diameter apart "
                                           f"({casing * 1000:.0f} mm)")
    from ..buried import buried_spec, mutual_resistance_mk_w, twin_heat_flows
    from ..reports.field import twin_table

    ground, k, depth = data["ground_temp_c"], data["soil_k_w_mk"], data["depth_m"]
    supply_t = float(np.ravel(spec.fluid_temperature_c())[0])
    back, *_ = buried_spec(replace(spec, fluid_temp_c=ret, steam_pressure_pa=None, outer_h_w_m2k=None), depth, k, ground)
    alone = [(supply_t, data["heat_flow_w_per_m"], data["casing_temp_c"]),
             (ret, float(np.ravel(back.solve().heat_flow_w_per_m)[0]), None)]
    own = []
    for t, qq, _ in alone:  # each pipe's own resistance, from its solve alone: R_i = ΔT/q − R_s
        own.append((t - ground) / qq - data["soil_resistance_mk_w"] if qq else float("inf"))
    r_m = float(mutual_resistance_mk_w(depth, spacing, k))
    q1, q2 = twin_heat_flows(own, data["soil_resistance_mk_w"], r_m, (supply_t - ground, ret - ground))
    twin = {"spacing_m": spacing, "return_temp_c": ret, "mutual_resistance_mk_w": r_m,
            "own_resistance_mk_w": own, "supply_heat_flow_w_per_m": q1, "return_heat_flow_w_per_m": q2,
            "alone_heat_flow_w_per_m": [alone[0][1], alone[1][1]],
            "method": "each pipe's own resistance from its solve alone; the mutual soil resistance "
                      "ln(sqrt(1 + (2z/E)²))/(2π k_s) of a line source and its image (Wallentén 1991, from memory)"}
    report.tables.append(twin_table(twin, units))
    report.data["twin"] = twin


def add_field_sections(report, spec, field: dict, units: str) -> None:
    """Solve what the field options ask for and add the sections (and JSON keys) to *report*."""
    from ..errors import InputError

    q = _reader(field, units)
    if field.get("_buried") is not None:
        from ..reports.field import buried_table

        data = dict(field["_buried"])
        data["heat_flow_w_per_m"] = float(report.data["heat_flow_w_per_m"])
        data["casing_temp_c"] = float(report.data["surface_temp_c"])
        report.tables.append(buried_table(data, units))
        report.data["buried"] = data
        if field.get("_unburied") is not None:
            from .twin_casing_options import add_twin_casing

            add_twin_casing(report, field["_unburied"], field, data, units)
        else:
            _twin(report, spec, field, data, units, q)
    if field.get("_materials") is not None:
        from ..reports.field import materials_table

        info = field["_materials"]
        table, data = materials_table(report, info, units)
        report.tables.append(table)
        report.data["materials"] = data
        report.warnings.extend(w for w in info["warnings"] if w not in report.warnings)
        report.data["warnings"] = report.warnings

    fittings, cover = parse_fittings(field, units)
    if fittings:
        if field.get("_buried") is not None:
            raise InputError("--valve" if field.get("valve") else "--flange",
                             "fittings are solved in air: a buried line's fittings (in a chamber) are not modelled")
        from ..fittings import solve_fittings
        from ..reports.field import add_fittings

        add_fittings(report, spec, solve_fittings(spec, fittings, cover), units)

    maintain = q("maintain_temp", "temperature")
    others = [n for n in ("min_ambient", "safety_factor", "tracer_output") if field.get(n) is not None]
    if maintain is None:
        if others:
            raise InputError(_flag(others[0]), "is a heat-tracing input: give --maintain-temp too")
        return
    from ..tracing import DEFAULT_SAFETY_FACTOR_PERCENT, design_heat_loss

    sf = q("safety_factor", "percent")
    output = q("tracer_output", "heat_flow_per_length")
    words = _WORDS
    fittings_w = None
    if fittings:  # the fittings allowance: bare or covered as given, at the tracing conditions
        from ..fittings import solve_fittings
        from ..tracing import tracing_spec

        at_design = solve_fittings(tracing_spec(spec, maintain, q("min_ambient", "temperature")), fittings, cover)
        fittings_w = at_design.total_bare_w if cover is None else at_design.total_covered_w
    try:
        design = design_heat_loss(spec, maintain, DEFAULT_SAFETY_FACTOR_PERCENT if sf is None else sf,
                                  min_ambient_c=q("min_ambient", "temperature"), tracer_output_w_per_m=output,
                                  fittings_heat_loss_w=fittings_w, units=units)
    except InputError as exc:
        if exc.name in words:
            raise InputError(words[exc.name], exc.message.replace("minimum design ambient",
                                                                  "minimum design ambient (--min-ambient)")) from None
        raise
    from ..reports.field import tracing_table

    report.tables.append(tracing_table(design, units))
    report.data["tracing"] = design.to_dict()
    for text in design.warnings:
        if text not in report.warnings:
            report.warnings.append(text)
    if design.sufficient is False:
        report.warnings.append("the tracer output is below the design heat loss: the line will not hold "
                               "the maintain temperature at the minimum design ambient")
    report.data["warnings"] = report.warnings
