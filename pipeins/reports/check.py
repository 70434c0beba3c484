"""The report of one solved line: inputs echoed, results, temperatures through the wall."""

from __future__ import annotations

import numpy as np

from . import Column, Report, Table
from .cautions import cautions_for

__all__ = ["check_report", "check_data", "describe_line"]


def _f(x):
    return None if x is None else float(np.asarray(x).ravel()[0])


def describe_line(spec, result, units: str) -> list[list[str]]:
    """(item, description) rows echoing what was solved, in display units."""
    from ..units import format_quantity as fq

    pipe, layers = result.inputs["pipe"], result.inputs["layers"]
    fluid, air, surface = result.inputs["fluid"], result.inputs["surroundings"], result.inputs["surface"]
    rows = []
    label = pipe.label or "custom pipe"
    if hasattr(pipe, "kind"):  # a duct, face or vessel
        from .section import section_text

        rows.append([pipe.kind, section_text(pipe, units)])
    else:
        rows.append(["pipe", f"{label}: OD {fq(_f(pipe.outer_diameter_m), 'diameter', units)}, "
                             f"wall {fq(_f(pipe.wall_m), 'diameter', units)}, {pipe.wall_material}"])
    if spec.steam_pressure_pa is not None:
        what = (f"saturated steam at {fq(spec.steam_pressure_pa, 'pressure', units)} abs, "
                f"{fq(_f(fluid.temp_c), 'temperature', units)}")
    else:
        what = f"{spec.fluid or 'fluid'} at {fq(_f(fluid.temp_c), 'temperature', units)}"
    film = ("no inner film (bore at fluid temperature)" if fluid.film_coefficient_w_m2k is None else
            f"inner film {fq(_f(fluid.film_coefficient_w_m2k), 'heat_transfer_coefficient', units)}")
    rows.append(["fluid", f"{what}; {film}"])
    if layers:
        for j, layer in enumerate(layers, 1):
            text = f"{layer.material.name}, {fq(_f(layer.thickness_m), 'thickness', units)}"
            if getattr(layer.material, "is_wrap", False):  # a wrap: nominal as sold, installed as solved
                text += (f" nominal, {fq(_f(layer.installed_thickness_m), 'thickness', units, 2 if units == 'si' else None)} installed "
                         f"({layer.material.compression_percent:g} % compression)")
            rows.append([f"layer {j}", text])
    else:
        rows.append(["layers", "none (bare pipe)" if not hasattr(pipe, "kind") else f"none (bare {pipe.kind})"])
    if surface.fixed_coefficient_w_m2k is not None:
        rows.append(["outer surface", "fixed combined coefficient "
                     f"{fq(_f(surface.fixed_coefficient_w_m2k), 'heat_transfer_coefficient', units)}"])
    else:
        rows.append(["outer surface", f"{surface.name}, emittance {_f(surface.emittance):.2f}"])
    wind = _f(air.wind_speed_m_s)
    air_text = (f"air {fq(_f(air.air_temp_c), 'temperature', units)}, radiant "
                f"{fq(_f(air.radiant_temp_c), 'temperature', units)}, "
                + ("still air" if wind == 0 else f"wind {fq(wind, 'speed', units)}")
                + f", {fq(_f(air.pressure_pa), 'pressure', units)}"
                + ("" if getattr(pipe, "kind", "pipe") in ("face", "sphere", "vessel") else f", {air.orientation}"))
    if air.orientation == "vertical":
        air_text += f" over {fq(_f(air.height_m), 'length', units)}"
    if air.relative_humidity_percent is not None:
        air_text += f", RH {_f(air.relative_humidity_percent):.0f} %"
    rows.append(["surroundings", air_text])
    if getattr(air, "solar_irradiance_w_m2", None) is not None:
        alpha = surface.solar_absorptance
        rows.append(["sun", f"{fq(_f(air.solar_irradiance_w_m2), 'heat_flux', units)} normal to the sun, "
                            f"absorptance {_f(alpha):.2f}, absorbed on the projected area"])
    return rows


def check_data(spec, result, extra: dict | None = None) -> dict:
    """The JSON payload of a check (SI)."""
    data = {"line": spec_summary(spec, result)}
    data.update(result.to_dict())
    if extra:
        data.update(extra)
    return data


def spec_summary(spec, result) -> dict:
    pipe = result.inputs["pipe"]
    return {
        "pipe": pipe.label,
        "outer_diameter_m": _f(getattr(pipe, "outer_diameter_m", None)),
        "wall_m": _f(pipe.wall_m),
        "wall_material": pipe.wall_material,
        "layers": [{"material": l.material.name, "thickness_m": _f(l.thickness_m),
                    **({"installed_thickness_m": _f(l.installed_thickness_m),
                        "compression_percent": l.material.compression_percent}
                       if getattr(l.material, "is_wrap", False) else {})}
                   for l in result.inputs["layers"]],
        "fluid_temp_c": _f(result.inputs["fluid"].temp_c),
        "air_temp_c": _f(result.inputs["surroundings"].air_temp_c),
        "surroundings_temp_c": _f(result.inputs["surroundings"].radiant_temp_c),
        "wind_m_s": _f(result.inputs["surroundings"].wind_speed_m_s),
        "emittance": _f(result.inputs["surface"].emittance),
    }


def check_report(spec, result, units: str = "si", extra_rows=(), extra_data=None,
                 extra_warnings=(), title: str | None = None) -> Report:
    """The report of a single solved line."""
    layers = result.inputs["layers"]
    q = _f(result.heat_flow_w_per_m)
    main = Table("Results", [
        Column("heat flow", "heat_flow_per_length"),
        Column("outer heat flux", "heat_flux"),
        Column("surface", "temperature"),
        Column("h conv", "heat_transfer_coefficient"),
        Column("h rad", "heat_transfer_coefficient"),
        Column("dew point", "temperature"),
    ], [[q, _f(result.outer_heat_flux_w_m2), _f(result.surface_temp_c), _f(result.h_conv_w_m2k),
         _f(result.h_rad_w_m2k), _f(result.dew_point_c)]],
        note=("heat flow is positive out of the fluid (loss); negative means heat gain"
              if q < 0 else ""))
    pipe = result.inputs["pipe"]
    od = _f(pipe.outer_diameter_m)
    diameters = [od - 2 * _f(pipe.wall_m), od]
    for layer in layers:
        diameters.append(diameters[-1] + 2 * _f(layer.installed_thickness_m))
    names = ["bore", "pipe outside"] + [f"outside layer {j} ({l.material.name})" for j, l in enumerate(layers, 1)]
    temps = [_f(t) for t in result.interface_temps_c]
    wall = Table("Temperatures through the wall", [Column("position"), Column("diameter", "diameter"),
                                                   Column("temperature", "temperature")],
                 [[n, d, t] for n, d, t in zip(names, diameters, temps)])
    line = Table("Line", [Column("item"), Column("description")], describe_line(spec, result, units))
    tables = [line, main, wall]
    if extra_rows:
        tables.append(Table("Along the run and over time", [Column("item"), Column("value")], list(extra_rows)))
    warnings = list(result.warnings) + list(extra_warnings)
    surface = _f(result.surface_temp_c)
    from ..notes import note

    if result.touch_limit_c is not None and surface > result.touch_limit_c:
        warnings.append(note("surface.above_touch_limit", surface_c=(surface, "temperature"),
                             limit_c=(result.touch_limit_c, "temperature")))
    air = result.inputs["surroundings"]
    if air.relative_humidity_percent is None:
        if float(np.min(result.inputs["fluid"].temp_c)) < float(np.min(air.air_temp_c)):
            warnings.append(note("condensation.not_checked.cold_line", what="line"))
        elif surface < float(np.min(air.air_temp_c)):
            warnings.append(note("condensation.not_checked.cold_surroundings", surface_c=(surface, "temperature")))
    if result.dew_point_c is not None and surface < _f(result.dew_point_c):
        warnings.append(note("surface.below_dew_point", where="surface", surface_c=(surface, "temperature"),
                             dew_point_c=(_f(result.dew_point_c), "temperature")))
    from .notes import notes_of, render_all

    items = list(dict.fromkeys(warnings))
    warnings = render_all(items, units)
    report = Report(title or f"Heat flow check: {pipe.label or 'custom pipe'}", tables,
                    check_data(spec, result, extra_data), warnings,
                    cautions_for(spec, result), csv_table=1, notes=notes_of(items))
    report.data["warnings"] = warnings
    report.data["cautions"] = report.cautions
    return report
