"""The report of one solved section other than a pipe: a duct, a flat face, a sphere, a vessel.

Words and units are written here only; the library hands over numbers
(:class:`pipeins.results.Result` with its ``patches``).  The heat flow is shown in the
section's own basis (W/m of duct run, W/m² of face, W for a vessel), and per patch where
there are several; the surface temperature that governs is the hottest exposed patch of
a section losing heat and the coldest of one gaining it.
"""

from __future__ import annotations

import numpy as np

from . import Column, Report, Table
from .cautions import cautions_for

__all__ = ["section_report", "BASIS_KINDS", "describe_section", "section_basis", "SUN_DIRECTIONS"]

#: Display kind of a heat flow by the section's basis.
BASIS_KINDS = {"W/m": "heat_flow_per_length", "W/m²": "heat_flux", "W": "power"}
#: Display kind of a patch area by the section's basis.
AREA_KINDS = {"W/m": "area_per_length", "W/m²": None, "W": "area"}
_PER = {"W/m": "per metre of run", "W/m²": "per m² of face", "W": "for the whole vessel"}
_PER_US = {"W/m": "per foot of run", "W/m²": "per ft² of face", "W": "for the whole vessel"}


def _f(x):
    return None if x is None else float(np.asarray(x).ravel()[0])


def describe_section(spec, result, units: str) -> list[list[str]]:
    """(item, description) rows echoing what was solved."""
    from ..units import format_quantity as fq
    from .check import describe_line

    section = result.inputs["pipe"]
    rows = describe_line(spec, result, units)[1:]  # fluid, layers, surface, surroundings
    rows.insert(0, [result.kind, section_text(section, units)])
    contents = "air" if "duct" in result.kind else "contents" if result.basis == "W" else ""
    if contents and not spec.fluid:
        rows[1][1] = rows[1][1].replace("fluid at", f"{contents} at", 1)
    return rows


#: Where the sun is taken to shine from, by section kind (stated, not computed).
SUN_DIRECTIONS = {"rectangular duct": "overhead on a horizontal run (the top takes it), normal to one wide side of "
                                      "a vertical run",
                  "face": "normal to a face looking up or sideways; none on one looking down"}
_SUN_ELSEWHERE = "on the projected area; none on floors and undersides"


def section_basis(spec, result) -> list[dict]:
    """The assumptions of a solved section as basis lines: ``name``, ``value`` (SI: a number
    or a text), ``kind`` (the display kind of a number, None for text or a plain number),
    ``unit`` (the SI unit of a number) and ``source``.

    The outer film length of every exposed part (and the wind's flow length), the corners of a
    rectangular duct (ISO 12241 mean perimeter), the tank floor's boundary, and with sun its
    direction, irradiance and absorptance.
    """
    from ..physics.correlations import lookup
    from ..units import unit_label

    section, layers = result.inputs["pipe"], result.inputs["layers"]
    surroundings = result.inputs["surroundings"]
    patches = result.inputs.get("patches") or section.patches(surroundings)
    solved = result.patches or [None] * len(patches)
    thick = [np.asarray(l.installed_thickness_m, dtype=float) for l in layers]
    total = float(sum(np.max(t) for t in thick)) if thick else 0.0
    air = _f(surroundings.air_temp_c)
    wind = float(np.max(surroundings.wind_speed_m_s))
    out = []

    def line(name, value, kind, source, unit=None):
        out.append({"name": name, "value": value, "kind": kind,
                    "unit": unit if unit is not None else (unit_label(kind, "si") if kind else None), "source": source})

    for patch, part in zip(patches, solved):
        if patch.boundary is not None:
            continue
        columns = {k: np.asarray(v, dtype=float) for k, v in patch.shape.columns().items()}
        columns["wall"] = np.asarray(section.wall_m, dtype=float)
        net = patch.shape.network(columns, [t if patch.insulated else np.zeros_like(t) for t in thick])
        natural = net.film_length_m if net.film_height_m is None else net.film_height_m
        ts = _f(result.surface_temp_c if part is None else part.result.surface_temp_c)
        geometry, orientation = patch.shape.correlation_key
        record = lookup(geometry, orientation, "natural", "hot" if ts >= air else "cold")
        where = "" if len(patches) == 1 else f", {patch.name}"
        line(f"outer film length{where}", _f(natural), "length",
             f"the {record.length} of the natural-convection film: {record.source}")
        if wind > 0:
            forced = lookup(geometry, orientation, "forced")
            line(f"wind flow length{where}", _f(net.film_length_m), "length",
                 f"the {forced.length} of the forced film: {forced.source}")
    if getattr(section, "kind", "") == "rectangular duct" and layers:
        mean = float(np.max(section.perimeter_m)) + 4 * total
        line("corners: mean perimeter of the insulation", mean, "length",
             "the layers widen at the corners (outer width w + 2T), each conducting over the mean of its inner and "
             "outer widths: ISO 12241 (2008) §4.2.3 rectangular duct, R = 2d/(λ(P_i + P_e)) per metre (from memory)")
    floor = getattr(section, "floor", None)
    if floor is not None:
        line("tank floor", "open to the air, bare" if floor.kind == "air" else "on the ground, bare", None,
             "assumption (--floor): a bare plate facing down, open to the air beneath (on legs or a ring)"
             if floor.kind == "air" else
             "assumption (--floor): the floor plate uninsulated on its foundation, to the ground through the "
             "resistance below; steady state")
        if floor.kind == "ground":
            line("ground temperature beneath the tank", float(floor.ground_temp_c), "temperature", "input (--floor)")
            resistance = float(np.max(floor.resistance_for(section.diameter_m)))
            line("floor-to-ground resistance", resistance, None,
                 "stated (input)" if floor.resistance_m2k_w is not None else
                 f"spreading resistance πD/(8k) of a disc on a half-space of {floor.soil}, pad neglected "
                 "(common practice for an estimate; the disc's constriction resistance, from memory)",
                 unit="m²·K/W")
    sun = getattr(surroundings, "solar_irradiance_w_m2", None)
    if sun is not None:
        direction = SUN_DIRECTIONS.get(result.kind, _SUN_ELSEWHERE)
        if result.kind == "rectangular duct":
            direction = ("normal to one wide side (a vertical run)" if surroundings.orientation == "vertical"
                         else "overhead on a horizontal run (the top takes it, sides and bottom none)")
        line("sun direction", direction, None,
             "assumption: the worst steady case for heat gain (sun absorbed on the projected area)")
        line("solar irradiance", _f(sun), "heat_flux", "input (--solar), on a surface normal to the sun")
        absorptance = getattr(result.inputs["surface"], "solar_absorptance", None)
        if absorptance is not None:
            line("solar absorptance", _f(absorptance), None,
                 "input (--absorptance)" if spec.absorptance is not None else "the finish's (tables/finishes.csv)",
                 unit="")
    return out


def _basis_row(entry, units: str) -> list:
    """A basis line as table cells: item, value (a number in *units*, or text), unit, source."""
    from ..units import format_quantity as fq
    from ..units import unit_label

    value, kind = entry["value"], entry["kind"]
    if isinstance(value, str):
        return [entry["name"], value, "", entry["source"]]
    if kind is None:
        if entry["unit"] == "m²·K/W" and units == "us":
            return [entry["name"], f"{value * 5.678263337:.3g}", "h·ft²·°F/Btu", entry["source"]]
        return [entry["name"], f"{value:.3g}", entry["unit"] or "", entry["source"]]
    label = unit_label(kind, units)
    text = fq(value, kind, units, 3 if kind == "length" else None)
    return [entry["name"], text[: -len(label)].strip() if text.endswith(label) else text, label, entry["source"]]


def section_text(section, units: str) -> str:
    """A one-line description of a section's dimensions and wall."""
    from ..units import format_quantity as fq

    kind = getattr(section, "kind", "")
    wall = f"{section.wall_material} {fq(_f(section.wall_m), 'diameter', units)}"
    if kind == "rectangular duct":
        size = f"{fq(_f(section.width_m), 'diameter', units)} × {fq(_f(section.height_m), 'diameter', units)}"
    elif kind == "round duct":
        size = f"diameter {fq(_f(section.outer_diameter_m), 'diameter', units)}"
    elif kind == "face":
        facing = {"vertical": "vertical, facing sideways", "top": "horizontal, facing up",
                  "bottom": "horizontal, facing down"}[section.face]
        size = f"{facing}, film length {fq(_f(section.length_m), 'length', units)}"
    else:
        size = getattr(section, "describe", lambda u: "")(units)
    return f"{size}; {wall}"


def section_report(spec, result, units: str = "si", extra_rows=(), extra_data=None, extra_warnings=()) -> Report:
    """The report of a solved duct, face, sphere or vessel."""
    from .check import check_data

    basis = result.basis
    flow_kind = BASIS_KINDS[basis]
    q = _f(result.heat_flow)
    loss = q >= 0
    main = Table("Results", [
        Column("heat loss" if loss else "heat gain", flow_kind),
        Column("mean outer heat flux", "heat_flux"),
        Column("governing surface", "temperature"),
        Column("dew point", "temperature"),
    ], [[abs(q), abs(_f(result.outer_heat_flux_w_m2)), _f(result.surface_temp_c), _f(result.dew_point_c)]],
        note=f"heat {'loss out of' if loss else 'gain into'} the {'contents' if basis == 'W' else 'air' if 'duct' in result.kind else 'fluid'}, "
             f"{_PER_US[basis] if units == 'us' else _PER[basis]}; the governing surface is the {'hottest' if loss else 'coldest'} exposed part")
    tables = [Table("Section", [Column("item"), Column("description")], describe_section(spec, result, units)), main]
    area_kind = AREA_KINDS[basis]
    if result.patches and len(result.patches) > 1:
        cols = [Column("part")]
        if area_kind:
            cols.append(Column("outer area", area_kind))
        cols += [Column("surface", "temperature"), Column("heat flow", flow_kind), Column("heat flux", "heat_flux"),
                 Column("h conv", "heat_transfer_coefficient"), Column("h rad", "heat_transfer_coefficient")]
        rows = []
        for p in result.patches:
            row = [p.name + ("" if p.exposed else " (boundary)")]
            if area_kind:
                row.append(_f(p.area_m2))
            row += [_f(p.result.surface_temp_c), _f(p.heat_flow), _f(p.result.outer_heat_flux_w_m2),
                    _f(p.result.h_conv_w_m2k), _f(p.result.h_rad_w_m2k)]
            rows.append(row)
        tables.append(Table("Parts", cols, rows, note="heat flow positive out of the fluid (loss), negative a gain; "
                                                      "the parts add up to the whole"))
    layers = result.inputs["layers"]
    names = ["inner face of the wall", "outer face of the wall"] + [
        f"outside layer {j} ({l.material.name})" for j, l in enumerate(layers, 1)]
    thick = [0.0, _f(result.inputs["pipe"].wall_m)]
    for layer in layers:
        thick.append(thick[-1] + _f(layer.installed_thickness_m))  # as installed (a wrap compressed)
    tables.append(Table("Temperatures through the build-up (governing part)",
                        [Column("position"), Column("depth from the inner face", "thickness"),
                         Column("temperature", "temperature")],
                        [[n, d, _f(t)] for n, d, t in zip(names, thick, result.interface_temps_c)]))
    if extra_rows:
        tables.append(Table("Along the run and over time", [Column("item"), Column("value")], list(extra_rows)))
    basis_lines = section_basis(spec, result)
    if basis_lines:
        tables.append(Table("Basis: assumptions", [Column("item"), Column("value"), Column("unit"), Column("source")],
                            [_basis_row(b, units) for b in basis_lines],
                            note="the assumptions behind the numbers above"))
    warnings = list(result.warnings) + list(extra_warnings)
    surface = _f(result.surface_temp_c)
    from ..notes import note

    if result.touch_limit_c is not None and surface > result.touch_limit_c:
        warnings.append(note("surface.above_touch_limit", surface_c=(surface, "temperature"),
                             limit_c=(result.touch_limit_c, "temperature")))
    air = result.inputs["surroundings"]
    if air.relative_humidity_percent is None and float(np.min(result.inputs["fluid"].temp_c)) < float(np.min(air.air_temp_c)):
        warnings.append(note("condensation.not_checked.cold_line", what="section"))
    if result.dew_point_c is not None and surface < _f(result.dew_point_c):
        warnings.append(note("surface.below_dew_point", where="coldest surface", surface_c=(surface, "temperature"),
                             dew_point_c=(_f(result.dew_point_c), "temperature")))
    if getattr(air, "solar_irradiance_w_m2", None) is not None and air.relative_humidity_percent is not None:
        warnings.append("sun raises the surface only by day: condensation is judged at night, without sun")
    from .notes import notes_of, render_all

    items = list(dict.fromkeys(warnings))
    warnings = render_all(items, units)
    data = check_data(spec, result, extra_data)
    data["line"] = {"kind": result.kind, "section": section_text(result.inputs["pipe"], "si"),
                    **{k: v for k, v in data["line"].items() if k not in ("pipe", "outer_diameter_m")}}
    report = Report(f"Heat flow check: {result.inputs['pipe'].label}", tables, data, warnings,
                    cautions_for(spec, result), csv_table="all", notes=notes_of(items))
    report.data["warnings"] = warnings
    report.data["cautions"] = report.cautions
    report.data["basis"] = [{k: b[k] for k in ("name", "value", "unit", "source")} for b in basis_lines]
    return report
