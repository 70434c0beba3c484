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
* ``{name:SPEC}`` on a plain number (kind ``number``): Python's format.

:func:`render` writes one note; :func:`note_dict` is its JSON object (SI values, plus the
rendered ``text``).
"""

from __future__ import annotations

import string
from typing import Any, Iterable

from ..notes import Note

__all__ = ["TEMPLATES", "render", "render_all", "note_dict", "notes_json"]

#: Note code → its sentence (see the module docstring for the placeholders).
TEMPLATES: dict[str, str | dict[str, str]] = {
    # runs (pipeins.runs)
    "run.freezes": "the fluid cools to its freezing point ({freeze_c:.1f|}) along the run; "
                   "beyond that point the result is not valid",
    "run.needs_fluid": "the temperature change along the run needs the fluid (--fluid)",
}


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

    def format_field(self, value, spec):
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
    """The sentence of *note* in the unit system *units* ("si" or "us")."""
    template = TEMPLATES.get(note.code)
    if template is None:
        raise KeyError(f"no sentence for note code {note.code!r}: add it to pipeins.reports.notes.TEMPLATES")
    if isinstance(template, dict):
        template = template.get(units, template["si"])
    return _Formatter(note, units).format(template)


def render_all(items: Iterable[Note | str], units: str = "si") -> list[str]:
    """Each note rendered (a plain string passes as it is), each text once, in order."""
    return list(dict.fromkeys(x if isinstance(x, str) else render(x, units) for x in items))


def note_dict(note: Note, units: str = "si") -> dict[str, Any]:
    """The JSON object of *note*: code, severity, subject, SI values with units, and its text."""
    return {**note.to_dict(), "text": render(note, units)}


def notes_json(items: Iterable[Note], units: str = "si") -> list[dict[str, Any]]:
    """:func:`note_dict` of each distinct note, in order."""
    return [note_dict(n, units) for n in dict.fromkeys(items)]
