"""The sentences of the library's notes (:class:`pipeins.notes.Note`), in one place.

:data:`TEMPLATES` maps each note code to its sentence: a format string, or a dict of one
per unit system (``{"si": ..., "us": ...}``) where the words differ.  A placeholder names a
field of the note:

* ``{name}``: a word as it is, or a quantity by :func:`pipeins.units.format_quantity`
  with the kind's usual decimal places;
* ``{name:N}``: a quantity with N decimal places in every unit system;
* ``{name:SPEC|N}``: a quantity written in SI as ``f"{display value:SPEC} {unit}"`` (e.g.
  ``{length_m:g|}`` gives ``120 m``), in another system by ``format_quantity`` with N decimal
  places (the kind's usual ones when N is empty; an empty SPEC: the kind's usual SI ones);
* ``{name:SPEC}`` on a plain number (kind ``number``): Python's format;
* ``{name!n:…}``: a quantity as above without its unit, the first of a span that names the
  unit once (``{low_c!n:.1f|} to {high_c:.1f|}`` gives ``20.0 to 30.0 °C``).

:func:`render` writes one note; :func:`note_dict` is its JSON object (SI values, plus the
rendered ``text``).
"""

from __future__ import annotations

import string
from typing import Any, Iterable

from ..notes import Note, with_subject  # noqa: F401  (with_subject: re-exported)

__all__ = ["TEMPLATES", "render", "render_all", "note_dict", "notes_json", "notes_of", "report_notes",
           "with_subject",
           "TEXT_CODE"]

#: Code of a warning that a library part still gives as text (no structured note yet).
TEXT_CODE = "text"

#: Note code → its sentence (see the module docstring for the placeholders).
TEMPLATES: dict[str, str | dict[str, str]] = {
    # runs (pipeins.runs)
    "run.freezes": "the fluid cools to its freezing point ({freeze_c:.1f|}) along the run; "
                   "beyond that point the result is not valid",
    "run.needs_fluid": "the temperature change along the run needs the fluid (--fluid)",
    # the solver (pipeins.solve): a layer's service range, the critical radius
    "layer.above_service_limit": "layer {layer} ({material}): reaches {temp_c:.1f|}, above its usable limit of "
                                 "{limit_c:g|0}; choose a material rated for it or add an inner layer",
    "layer.above_service_limit.span": "layer {layer} ({material}): reaches {low_c!n:.1f|} to {high_c:.1f|}, above "
                                      "its usable limit of {limit_c:g|0}; choose a material rated for it or add an "
                                      "inner layer",
    "layer.below_service_limit": "layer {layer} ({material}): falls to {temp_c:.1f|}, below its usable limit of "
                                 "{limit_c:g|0}",
    "layer.below_service_limit.span": "layer {layer} ({material}): falls to {low_c!n:.1f|} to {high_c:.1f|}, below "
                                      "its usable limit of {limit_c:g|0}",
    "layer.below_critical_radius": "outer radius below the critical radius ({radius_m:.1f|}) for {material}: more "
                                   "of it raises the heat flow at first",
    # the selection (pipeins.selection): an inner layer under a material that cannot serve the fluid
    "selection.inner_layer": "{material} serves {low_c} to {high_c}: an inner layer of {inner} ({thickness_m}) "
                             "keeps it inside its range",
    "selection.inner_layer.span": "{material} serves {low_c} to {high_c}: an inner layer of {inner} "
                                  "({thinnest_m!n} to {thickest_m}, by size) keeps it inside its range",
    # the films' correlation ranges (pipeins.physics.outer, .inner, .duct_inner; words from the records)
    "film.outer.range": "outer film: {what}{where}; {consequence}",
    "film.inner.range": "inner film: {what}{where}; {consequence}",
    "film.duct_inner.range": "duct inner film: {what}; {consequence}{where}",
    "film.outer.air_table_range": "outer film: film temperature outside {low_c!n:g|0} to {high_c:g|0}{where}; "
                                  "air properties taken at the nearer end of the table",
    # costs (pipeins.costing)
    "cost.bare_fittings": "bare fittings count as {length_m:.1f|} of bare pipe; insulating them "
                          "(removable covers) saves most of their share",
    # a user's materials file (pipeins.user_materials)
    "materials.conductivity_falls": '{file}: material "{material}" declares a conductivity falling with temperature; '
                                    "insulants conduct more when warmer: check the declaration",
    # the schedule's money (pipeins.schedule)
    "schedule.payback_partial": "installed cost, cost saving and payback cover {covered:,.0f} of {total:,.0f} lines; "
                                "left out: {lines}",
    "schedule.no_price": "{table} has no price for {size} at {thickness_m:g|}",
    "schedule.table_per_metre": "{table} prices insulation per metre of pipe by size; the {kind} {size} is priced "
                                "per m² of its surface (a table with cost_per_m2)",
    "schedule.no_energy_price": "no energy price: {lines} have no cost saving or payback",
    "schedule.gain_without_cop": 'service "{service}" gains heat with no chiller COP (give cop in [energy] or the '
                                 "service): {lines} left out of the energy, cost and CO2 columns",
    # buried pairs (pipeins.schedule_buried)
    "buried.return_beyond_supply": "the return ({return_c:.1f|}) is {direction} than the supply ({supply_c:.1f|}) "
                                   "with the ground at {ground_c:.1f|}: check return_temp",
    "buried.pair_directions_differ": "the supply ({supply_c:.1f|}) and the return ({return_c:.1f|}) lie on either "
                                     "side of the ground ({ground_c:.1f|}): one pipe loses heat, the other gains it; "
                                     "check return_temp and ground_temp",
    "buried.no_driving_difference": "the supply is at the ground temperature ({ground_c:.1f|}): no heat flows "
                                    "between it and the ground; check ground_temp",
    "buried.pair_above_cap": "the {role} pipe of the pair has {heat_flow:.1f|} in the soil beside the other pipe, "
                             "above the heat-flow cap {cap:.1f|} (the pair is sized as its supply alone)",
    # the economic thickness (pipeins.economics)
    "economic.at_thickest": "the cheapest candidate is the thickest given ({thickness_m:g|}); "
                            "the optimum may be thicker",
    "economic.at_thinnest": "the cheapest candidate is the thinnest given ({thickness_m:g|}); "
                            "the optimum may be thinner",
    # a checked line or section (pipeins.reports.check, pipeins.reports.section)
    "surface.above_touch_limit": "surface {surface_c:.1f|} is above the touch limit of {limit_c:g|}",
    "surface.below_dew_point": "{where} {surface_c:.1f|} is below the dew point {dew_point_c:.1f|}: it will sweat",
    "surface.below_dew_point.night": "at night, without sun, the surface falls to {surface_c:.1f|}, below the dew "
                                     "point {dew_point_c:.1f|}: it will sweat",
    # a vessel's contents (pipeins.sections)
    "vessel.contents_not_worked_out": "contents hold not worked out: {reason}",
    "vessel.freeze_hold_lumped": "freeze hold is a lumped estimate for still, mixed contents; local codes and "
                                 "licensed practice govern freeze protection",
    "condensation.not_checked.cold_line": "condensation not checked: the {what} is colder than the air; give --rh",
    "condensation.not_checked.cold_surroundings": "condensation not checked: surroundings colder than the air "
                                                  "cool the surface to {surface_c:.1f|}, below the air; give --rh",
    # cautions (pipeins.cautions): where the work can hurt someone
    "caution.general": ("Results are engineering estimates for the stated steady conditions; real surfaces vary with "
                        "wind, sun, finish ageing, wet or damaged insulation and workmanship. Local codes, the owner's "
                        "rules and licensed practice govern."),
    "caution.hot": ("Hot surface: burn risk depends on surface temperature, material and contact time (ISO 13732-1, "
                    "ASTM C1055). Guard, label or insulate surfaces people can touch; check bare flanges, valves and "
                    "supports, which run at the fluid temperature."),
    "caution.metal_jacket": ("A metal jacket's low emittance makes its surface run hotter than a painted or plastic one "
                             "at the same thickness, and bare metal burns faster at the same temperature."),
    "caution.cold": ("Cold line: a continuous, sealed vapour retarder is needed regardless of thickness; without it "
                     "moisture migrates into the insulation, condenses and ruins it."),
    "caution.freeze": ("Insulation only delays freezing; it never prevents it. Water that stands long enough in a cold "
                       "space will freeze unless the pipe is heat-traced or kept flowing."),
    "caution.code": ("Code minimum thicknesses are from the edition named and may be from memory: the edition adopted "
                     "locally and its amendments govern; confirm with the authority having jurisdiction."),
}


class _Bare:
    """A field to be written without its unit (the ``!n`` conversion)."""

    def __init__(self, field):
        self.field = field


class _Formatter(string.Formatter):
    def __init__(self, note: Note, units: str):
        super().__init__()
        self.fields = note.fields()
        self.units = units
        self.code = note.code

    def get_value(self, key, args, kwargs):
        if key not in self.fields:
            raise KeyError(f"note {self.code}: its template cites {key!r}, which the note does not carry")
        return self.fields[key]

    def convert_field(self, value, conversion):
        if conversion == "n":  # the number alone, without its unit
            return _Bare(value)
        return super().convert_field(value, conversion)

    def format_field(self, value, spec):
        if isinstance(value, _Bare):
            from ..units import unit_label

            text = self.format_field(value.field, spec)
            label = unit_label(value.field[1], self.units) if not isinstance(value.field, str) else ""
            return text[: -len(label)].rstrip() if label and text.endswith(label) else text
        if isinstance(value, str):
            return format(value, spec)
        number, kind = value
        if kind == "number":
            return format(number, spec)
        from ..units import format_quantity, to_display, unit_label

        if "|" in spec:
            si_spec, digits = spec.split("|", 1)
            if self.units == "si" and si_spec:
                return f"{to_display(number, kind, 'si'):{si_spec}} {unit_label(kind, 'si')}"
            if self.units == "si":
                return format_quantity(number, kind, "si")
            return format_quantity(number, kind, self.units, int(digits) if digits else None)
        return format_quantity(number, kind, self.units, int(spec) if spec else None)


def render(note: Note, units: str = "si") -> str:
    """The sentence of *note* in the unit system *units* ("si" or "us"), after its subject
    (``service "chw": …``) when it has one."""
    template = TEMPLATES.get(note.code)
    if template is None:
        raise KeyError(f"no sentence for note code {note.code!r}: add it to pipeins.reports.notes.TEMPLATES")
    if isinstance(template, dict):
        template = template.get(units, template["si"])
    text = _Formatter(note, units).format(template)
    return f"{note.subject}: {text}" if note.subject else text


def render_all(items: Iterable[Note | str], units: str = "si") -> list[str]:
    """Each note rendered (a plain string passes as it is), each text once, in order."""
    return list(dict.fromkeys(x if isinstance(x, str) else render(x, units) for x in items))


def note_dict(note: Note, units: str = "si") -> dict[str, Any]:
    """The JSON object of *note*: code, severity, subject, SI values with units, and its text."""
    return {**note.to_dict(), "text": render(note, units)}


def notes_json(items: Iterable[Note], units: str = "si") -> list[dict[str, Any]]:
    """:func:`note_dict` of each distinct note, in order."""
    return [note_dict(n, units) for n in dict.fromkeys(items)]


def notes_of(items: Iterable[Note | str]) -> list[Note]:
    """The structured notes among *items* (text left out), each once."""
    return list(dict.fromkeys(x for x in items if isinstance(x, Note)))


def report_notes(report, units: str = "si") -> list[dict[str, Any]]:
    """Every warning of *report* as a JSON note object, in the order of ``report.warnings``:
    the structured note that renders to it, or ``{"code": "text", "severity": "warning",
    "text": …}`` for a warning still given as text."""
    by_text = {}
    for n in getattr(report, "notes", ()) or ():
        by_text.setdefault(render(n, units), n)
    out = []
    for text in report.warnings:
        n = by_text.get(text)
        out.append(note_dict(n, units) if n is not None else {"code": TEXT_CODE, "severity": "warning",
                                                              "text": text})
    return out

