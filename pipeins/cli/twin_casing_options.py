"""``check --buried … --twin-casing DIAMETER --casing-insulation MATERIAL --twin-spacing E
--return-temp T``: a supply and a return pipe in one pre-insulated casing (pipeins.twin_casing).

The check's own Results are those of the supply pipe alone, centred in a casing of the same
diameter (the reference); the section "Twin pipes in one casing" and the JSON object
``twin_casing`` hold the two heat flows, each apart.
"""

from __future__ import annotations

__all__ = ["centred_in_casing", "add_twin_casing"]


def _read(field: dict, units: str):
    from ..errors import InputError
    from ..units import parse_quantity

    if field.get("twin_casing") is None:
        raise InputError("--casing-insulation", "is the insulation of a twin casing: give --twin-casing DIAMETER too")
    if field.get("casing_insulation") is None:
        raise InputError("--casing-insulation", "a twin casing needs its insulation, e.g. "
                                                '--casing-insulation "polyisocyanurate foam"')
    diameter = parse_quantity(field["twin_casing"], "diameter", "--twin-casing", units)
    if not diameter > 0:
        raise InputError("--twin-casing", "the casing diameter must be greater than zero")
    for name in ("twin_spacing", "return_temp"):
        if field.get(name) is None:
            raise InputError("--" + name.replace("_", "-"), "pipes in one casing need --twin-spacing (between the "
                                                            "centres) and --return-temp")
    spacing = parse_quantity(field["twin_spacing"], "length", "--twin-spacing", units)
    ret = parse_quantity(field["return_temp"], "temperature", "--return-temp", units)
    return diameter, spacing, ret


def centred_in_casing(spec, field: dict, units: str):
    """The reference line: *spec*'s pipe alone, centred in the casing, the casing's insulation
    filling it (checked before the line is buried)."""
    from dataclasses import replace

    import numpy as np

    from ..catalog.materials import lookup_material
    from ..errors import InputError

    diameter, spacing, _ = _read(field, units)
    if spec.layers:
        raise InputError("--layer", "pipes in one casing take the casing's insulation (--casing-insulation); "
                                    "leave out --layer")
    try:
        material = lookup_material(field["casing_insulation"], "--casing-insulation")
    except InputError as exc:
        raise InputError("--casing-insulation", exc.message) from None
    od = float(np.ravel(spec.build_pipe().outer_diameter_m)[0])
    from ..twin_casing import check_geometry

    try:
        check_geometry(od / 2, spacing / 2, diameter / 2)
    except InputError as exc:
        raise InputError("--twin-spacing", exc.message) from None
    return replace(spec, layers=((material.key if material.key else material.name, (diameter - od) / 2),))


def add_twin_casing(report, spec, field: dict, buried: dict, units: str) -> None:
    """Solve the two pipes in the casing and add their section and JSON ``twin_casing``."""
    from ..errors import InputError
    from ..reports.twin_casing import twin_casing_table
    from ..twin_casing import solve_twin_casing

    diameter, spacing, ret = _read(field, units)
    try:
        twin = solve_twin_casing(spec, diameter, spacing, buried["depth_m"], buried["soil_k_w_mk"],
                                 buried["ground_temp_c"], ret, field["casing_insulation"])
    except InputError as exc:
        words = {"twin_spacing_m": "--twin-spacing", "depth_m": "--buried", "casing_diameter_m": "--twin-casing",
                 "twin_casing": "--casing-insulation", "layers": "--layer", "soil_k_w_mk": "--soil-k"}
        raise InputError(words.get(exc.name, exc.name), exc.message) from None
    data = twin.to_dict()
    data["alone_heat_flow_w_per_m"] = buried["heat_flow_w_per_m"]
    report.tables.append(twin_casing_table(data, units))
    report.data["twin_casing"] = data
    text = ("the Results above are of the supply pipe alone, centred in the casing (a reference); the two pipes "
            "in the casing are in the section \"Twin pipes in one casing\"")
    if text not in report.warnings:
        report.warnings.append(text)
    report.data["warnings"] = report.warnings
