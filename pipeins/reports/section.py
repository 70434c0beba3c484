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

__all__ = ["section_report", "BASIS_KINDS", "describe_section"]

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
    for patch in result.patches or ():
        if not patch.exposed and patch.note:
            rows.append([patch.name, patch.note])
    floor = getattr(section, "floor", None)
    if floor is not None and floor.kind != "ground":
        rows.append(["floor", floor.assumption(section.diameter_m)])
    if getattr(result.inputs["surroundings"], "solar_irradiance_w_m2", None) is not None:
        rows.append(["sun direction", {"rectangular duct": "overhead on a horizontal run (the top takes it), normal "
                                       "to one wide side of a vertical run",
                                       "face": "normal to a face looking up or sideways; none on one looking down",
                                       }.get(result.kind, "on the projected area; none on floors and undersides")])
    return rows


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
    warnings = list(result.warnings) + list(extra_warnings)
    surface = _f(result.surface_temp_c)
    if result.touch_limit_c is not None and surface > result.touch_limit_c:
        warnings.append(f"surface {surface:.1f} °C is above the touch limit of {result.touch_limit_c:g} °C")
    air = result.inputs["surroundings"]
    if air.relative_humidity_percent is None and float(np.min(result.inputs["fluid"].temp_c)) < float(np.min(air.air_temp_c)):
        warnings.append("condensation not checked: the section is colder than the air; give --rh")
    if result.dew_point_c is not None and surface < _f(result.dew_point_c):
        warnings.append(f"coldest surface {surface:.1f} °C is below the dew point {_f(result.dew_point_c):.1f} °C: "
                        "it will sweat")
    if getattr(air, "solar_irradiance_w_m2", None) is not None and air.relative_humidity_percent is not None:
        warnings.append("sun raises the surface only by day: condensation is judged at night, without sun")
    warnings = list(dict.fromkeys(warnings))
    data = check_data(spec, result, extra_data)
    data["line"] = {"kind": result.kind, "section": section_text(result.inputs["pipe"], "si"),
                    **{k: v for k, v in data["line"].items() if k not in ("pipe", "outer_diameter_m")}}
    report = Report(f"Heat flow check: {result.inputs['pipe'].label}", tables, data, warnings,
                    cautions_for(spec, result), csv_table=1)
    report.data["warnings"] = warnings
    report.data["cautions"] = report.cautions
    return report
