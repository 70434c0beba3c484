"""``pipeins list``: show the catalogues the other commands draw on.

Five catalogues: ``pipes`` (steel NPS × schedule, copper tube, metric DN), ``materials``
(insulation with conductivity against mean temperature, or pipe wall materials),
``finishes`` (outer surfaces and their emittance), ``series`` (commercial thickness series)
and ``rules`` (code-minimum rule sets).  Every row shows where its numbers come from.
Text, CSV and Markdown show the chosen unit system; JSON is SI whatever ``--units`` says.
"""

from __future__ import annotations

import re

import click

from .options import emit, output_options

__all__ = ["list_", "CATALOGUES", "catalogue_report"]

#: Catalogue names accepted by ``pipeins list``.
CATALOGUES = ("pipes", "materials", "finishes", "series", "rules")

_PIPE_KINDS = ("steel", "copper", "metric")
_MATERIAL_KINDS = ("insulation", "wall")

# Unit conversions for the two quantities pipeins.units has no display kind for.
_LB_FT3_PER_KG_M3 = 0.45359237**-1 * 0.3048**3  # 1 kg/m³ = 0.062428 lb/ft³
_J_KGK_PER_BTU_LBF = 4186.8  # 1 Btu/(lb·°F) = 4186.8 J/(kg·K) (International Table Btu)


def _words(text) -> str:
    """Lower case, spaces/underscores/hyphens/commas alike, for --match and --family."""
    return re.sub(r"[\s_\-,]+", " ", str(text).strip().lower()).strip()


def _schedule_word(text: str) -> str:
    return re.sub(r"^(schedule|sch\.?)\s*", "", str(text).strip(), flags=re.I).replace(" ", "").upper()


def _refuse(option: str, value, catalogue: str, applies_to: str) -> None:
    from ..errors import InputError

    if value is not None:
        raise InputError(option, f"does not apply to {catalogue}; it filters {applies_to}")


def _match(rows: list[dict], match: str | None, fields: tuple[str, ...]) -> list[dict]:
    if match is None:
        return rows
    wanted = _words(match)
    return [r for r in rows if any(wanted in _words(r[f]) for f in fields)]


def _family_filter(rows: list[dict], family: str | None, families: list[str]) -> list[dict]:
    from ..errors import near_hint
    from ..errors import InputError

    if family is None:
        return rows
    wanted = _words(family).replace(" ", "_")
    if wanted not in families:
        raise InputError("--family", f'unknown family "{family.strip()}"; {near_hint(wanted, families)}')
    return [r for r in rows if r["family"] == wanted]


# ----------------------------------------------------------------------------- catalogues
def _pipes(kind, schedule, match, units):
    from ..catalog.pipes import SCHEDULE_ORDER, list_pipes
    from ..errors import InputError
    from ..reports import Column, Table
    from ..units import to_display, unit_label

    rows = list_pipes(kind)
    if schedule is not None:
        wanted = _schedule_word(schedule)
        present = [s for s in SCHEDULE_ORDER + ("K", "L", "M") if any(r["schedule"] == s for r in rows)]
        if wanted not in present:
            raise InputError("--schedule", f'no schedule or tube type "{schedule.strip()}" in this list; '
                                           f"use {', '.join(present)}")
        rows = [r for r in rows if r["schedule"] == wanted]
    rows = _match(rows, match, ("label",))
    mm_label = unit_label("diameter", units)

    def size(mm: float) -> str:  # SI: the value as the standard prints it; US: inches to 3 places
        return f"{mm:g}" if units == "si" else f"{to_display(mm / 1000.0, 'diameter', units):.3f}"

    def outside(mm: float) -> str:  # US: as the inch tables print it (NPS 2 is 2.375 in)
        from ..units import format_quantity

        return f"{mm:g}" if units == "si" else format_quantity(mm / 1000.0, "diameter", units, 3).split(" ")[0]

    table = Table("Pipe and tube sizes", [
        Column("size"), Column("catalogue"), Column("schedule or type"),
        Column(f"outside diameter [{mm_label}]"), Column(f"wall [{mm_label}]"),
        Column(f"inside diameter [{mm_label}]"), Column("source"),
    ], [[r["label"], r["kind"], r["schedule"] or "–", outside(r["outer_diameter_mm"]), size(r["wall_mm"]),
         size(round(r["outer_diameter_mm"] - 2.0 * r["wall_mm"], 3)), r["source"]] for r in rows])
    data = [{"label": r["label"], "kind": r["kind"], "schedule": r["schedule"] or None,
             "outer_diameter_m": round(r["outer_diameter_mm"] / 1000.0, 9),
             "wall_m": round(r["wall_mm"] / 1000.0, 9), "source": r["source"]} for r in rows]
    return table, data


def _k_text(points, units: str) -> str:
    from ..units import format_quantity, to_display

    parts = []
    for temp_c, k in points:
        k_shown = to_display(k, "conductivity", units)
        parts.append(f"{k_shown:.3g} @ {format_quantity(temp_c, 'temperature', units, 0)}")
    return "; ".join(parts)


def _density_text(density_kg_m3: float, units: str) -> str:
    import math

    if math.isnan(density_kg_m3):
        return "–"
    if units == "si":
        return f"{density_kg_m3:.0f}"
    return f"{density_kg_m3 * _LB_FT3_PER_KG_M3:.1f}"


def _insulation(family, match, units):
    from ..catalog.materials import list_materials, lookup_material
    from ..reports import Column, Table
    from ..units import unit_label

    materials = [lookup_material(row["key"]) for row in list_materials("insulation")]
    rows = [{"key": m.key, "name": m.name, "family": m.family, "m": m} for m in materials]
    rows = _family_filter(rows, family, list(dict.fromkeys(m.family for m in materials)))
    rows = _match(rows, match, ("key", "name"))
    density = "kg/m³" if units == "si" else "lb/ft³"
    k_label = unit_label("conductivity", units)
    table = Table("Insulation materials", [
        Column("key"), Column("name"), Column("family"),
        Column(f"conductivity [{k_label}] @ mean temperature"),
        Column("lowest service", "temperature", 0), Column("highest service", "temperature", 0),
        Column(f"density [{density}]"), Column("compression as installed [%]", digits=0), Column("source"),
    ], [[r["key"], r["name"], r["family"], _k_text(r["m"].points, units), r["m"].min_temp_c,
         r["m"].max_temp_c, _density_text(r["m"].density_kg_m3, units), r["m"].compression_percent,
         r["m"].source] for r in rows],
        note='A layer may also be a constant conductivity: --layer "k=0.040:50mm". A wrap (compression above 0, '
             'common practice: duct wrap 25 %) is given and sized by its nominal thickness and solved at its '
             'installed one.')
    data = [{"key": r["key"], "name": r["name"], "family": r["family"],
             "conductivity_w_mk": [{"mean_temp_c": t, "conductivity_w_mk": k} for t, k in r["m"].points],
             "min_temp_c": r["m"].min_temp_c, "max_temp_c": r["m"].max_temp_c,
             "density_kg_m3": r["m"].density_kg_m3, "compression_percent": r["m"].compression_percent,
             "source": r["m"].source} for r in rows]
    return table, data


def _walls(match, units):
    from ..catalog.materials import list_materials
    from ..reports import Column, Table

    rows = _match(list_materials("wall"), match, ("key", "name"))
    density = "kg/m³" if units == "si" else "lb/ft³"
    cp = "J/(kg·K)" if units == "si" else "Btu/(lb·°F)"
    cp_text = (lambda v: f"{v:.0f}") if units == "si" else (lambda v: f"{v / _J_KGK_PER_BTU_LBF:.3f}")
    table = Table("Pipe wall materials", [
        Column("key"), Column("name"), Column("conductivity", "conductivity", 3 if units == "si" else 1),
        Column(f"density [{density}]"), Column(f"heat capacity [{cp}]"), Column("source"),
    ], [[r["key"], r["name"], r["conductivity_w_mk"], _density_text(r["density_kg_m3"], units),
         cp_text(r["heat_capacity_j_kgk"]), r["source"]] for r in rows])
    return table, [dict(r) for r in rows]


def _finishes(match, units):
    from ..catalog.finishes import list_finishes
    from ..reports import Column, Table

    rows = _match(list_finishes(), match, ("key", "name", "family", "aliases"))
    table = Table("Outer surface finishes", [
        Column("family"), Column("key"), Column("name"), Column("condition"),
        Column("source range, low", unit="-", digits=2), Column("source range, high", unit="-", digits=2),
        Column("emittance", unit="-", digits=2), Column("surface kind"), Column("source"),
    ], [[r["family"], r["key"], r["name"], r["condition"], r["emittance_low"], r["emittance_high"],
         r["emittance"], r["surface_kind"], r["source"]] for r in rows],
        note="Emittance is the total hemispherical emittance near room temperature: the range the "
             "source gives and the value used. Any other value: --emittance.")
    return table, [dict(r) for r in rows]


def _series(family, match, units):
    from ..catalog.series import series_families, series_names, thickness_series_m
    from ..reports import Column, Table
    from ..tables import read_table

    info: dict[str, dict] = {}
    for row in read_table("thickness_series"):
        entry = info.setdefault(row["series"], {"family": row["family"], "unit": row["unit"], "sources": []})
        if row["source"] not in entry["sources"]:
            entry["sources"].append(row["source"])
    rows = [{"series": name, "family": info[name]["family"], "unit": info[name]["unit"],
             "thicknesses_m": list(thickness_series_m(name)), "source": "; ".join(info[name]["sources"])}
            for name in series_names()]
    rows = _family_filter(rows, family, series_families())
    rows = _match(rows, match, ("series", "family"))
    per_unit = {"mm": 0.001, "in": 0.0254}
    table = Table("Thickness series", [
        Column("series"), Column("family"), Column("thicknesses (in the series' own unit)"), Column("source"),
    ], [[r["series"], r["family"],
         ", ".join(f"{t / per_unit[r['unit']]:g}" for t in r["thicknesses_m"]) + f" {r['unit']}",
         r["source"]] for r in rows],
        note="The largest value is the thickest single layer normally made; thicker insulation "
             "is built from several layers.")
    data = [{k: v for k, v in r.items() if k != "unit"} for r in rows]
    return table, data


def _rules(match, units):
    from ..codes import list_rules
    from ..reports import Column, Table

    rows = _match([dict(r) for r in list_rules()], match, ("rule_set", "service"))
    table = Table("Code-minimum rule sets", [
        Column("rule set"), Column("service"), Column("fluid temperature"), Column("size"),
        Column("conductivity"), Column("mean rating temperature"), Column("minimum thickness"),
        Column("source"),
    ], [[r["rule_set"], r["service"], r["fluid_temp"], r["size"], r["conductivity"],
         r["mean_rating_temp"], r["thickness"], r["source"]] for r in rows],
        note="Values in the units the rule set prints; the adopted edition or the law in force governs.")
    return table, rows


def catalogue_report(catalogue: str, kind: str | None = None, schedule: str | None = None,
                     family: str | None = None, match: str | None = None, units: str = "si"):
    """The :class:`pipeins.reports.Report` of one catalogue, filtered.

    Parameters
    ----------
    catalogue : {"pipes", "materials", "finishes", "series", "rules"}
    kind : str, optional
        Pipes: ``steel``, ``copper`` or ``metric``; materials: ``insulation`` (default) or ``wall``.
    schedule : str, optional
        Pipes: a steel schedule (``40``, ``STD``, ``10S`` …) or a copper tube type (``L``).
    family : str, optional
        Insulation materials and series: a product family such as ``pipe_section``.
    match : str, optional
        Keep rows whose name contains this text (case-insensitive; spaces, underscores and
        hyphens alike).
    units : {"si", "us"}
        Units shown by text, CSV and Markdown (the JSON payload is SI).

    Raises
    ------
    InputError
        ``CATALOGUE`` for an unknown catalogue; the option's name for a filter that does not
        apply to the catalogue or an unknown kind, schedule or family.

    Examples
    --------
    >>> report = catalogue_report("pipes", kind="metric", match="DN50")
    >>> [(row["label"], row["outer_diameter_m"]) for row in report.data["rows"]]
    [('DN50', 0.0603), ('DN500', 0.508)]
    """
    from ..errors import InputError
    from ..reports import Report

    name = str(catalogue).strip().lower()
    if name not in CATALOGUES:
        raise InputError("CATALOGUE", f'unknown catalogue "{str(catalogue).strip()}"; '
                                      "use pipes, materials, finishes, series or rules")
    if name != "pipes":
        _refuse("--schedule", schedule, name, "pipes")
    if name not in ("materials", "series"):
        _refuse("--family", family, name, "materials and series")
    if name not in ("pipes", "materials"):
        _refuse("--kind", kind, name, "pipes (steel, copper, metric) and materials (insulation, wall)")
    if name == "pipes":
        if kind is not None and kind.strip().lower() not in _PIPE_KINDS:
            raise InputError("--kind", f'unknown pipe kind "{kind.strip()}"; use steel, copper or metric')
        table, rows = _pipes(None if kind is None else kind.strip().lower(), schedule, match, units)
    elif name == "materials":
        which = "insulation" if kind is None else kind.strip().lower()
        if which not in _MATERIAL_KINDS:
            raise InputError("--kind", f'unknown material kind "{kind.strip()}"; use insulation or wall')
        if which == "wall":
            _refuse("--family", family, "wall materials", "insulation materials and series")
            table, rows = _walls(match, units)
        else:
            table, rows = _insulation(family, match, units)
    elif name == "finishes":
        table, rows = _finishes(match, units)
    elif name == "series":
        table, rows = _series(family, match, units)
    else:
        table, rows = _rules(match, units)
    if not rows:
        table.note = "No rows match the filters."
    title = f"Catalogue: {name}" + (f" ({kind.strip().lower()})" if kind else "")
    return Report(title, [table], {"catalogue": name, "count": len(rows), "rows": rows})


@click.command(name="list")
@click.argument("catalogue", metavar="CATALOGUE")
@click.option("--kind", help="pipes: steel, copper or metric; materials: insulation (default) or wall.")
@click.option("--schedule", help="pipes: one steel schedule (40, STD, 10S …) or copper tube type (K, L, M).")
@click.option("--family", help="materials and series: one product family, e.g. pipe_section, elastomeric.")
@click.option("--match", metavar="TEXT", help="Keep rows whose name contains TEXT (case-insensitive).")
@output_options
def list_(catalogue, kind, schedule, family, match, fmt, units, output):
    """Show a catalogue: pipes, materials, finishes, series or rules.

    Every row names its source. Text, CSV and Markdown show the --units system;
    JSON is SI whatever --units says.

    \b
    Example:
      pipeins list pipes --kind steel --schedule 40 --match "NPS 2"
      pipeins list materials --family pipe_section --units us
      pipeins list materials --kind wall --format json
      pipeins list series --family elastomeric
    """
    report = catalogue_report(catalogue, kind, schedule, family, match, units)
    emit(report, fmt, units, output)
