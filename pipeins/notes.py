"""Structured notes: what the library says about a result, without the words.

A :class:`Note` is a stable code (``"run.freezes"``, ``"criterion.not_applicable.freeze"``), a
severity, the quantities it cites as SI values with their kind (see :mod:`pipeins.units`),
unit-free words it cites (a material's name, a face's name) and its subject (which input or
patch it is about).  The library builds notes; it never writes their sentences.  The report
layer (:mod:`pipeins.reports.notes`) holds one template per code and writes each note in the
chosen unit system; JSON carries the note as an object beside its text.

Adding a note: pick a dotted code (area first: ``run.``, ``freeze.``, ``code.``, ``duct_code.``),
build it with :func:`note` where the library finds the condition, and add the code's template
to :data:`pipeins.reports.notes.TEMPLATES` (a test renders every template in SI and US).
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

__all__ = ["Note", "note", "with_subject", "SEVERITIES", "SI_UNITS"]

#: What a note is: ``warning`` (the result may not hold as stated), ``note`` (a fact the
#: engineer should know), ``caution`` (a hazard to heed).
SEVERITIES = ("warning", "note", "caution")

#: The SI unit a note's value of each quantity kind is in (JSON says it beside the value).
SI_UNITS = {
    "temperature": "°C", "temperature_difference": "K", "thickness": "m", "diameter": "m",
    "length": "m", "speed": "m/s", "pressure": "Pa", "steam_pressure": "Pa",
    "heat_flow_per_length": "W/m", "heat_flux": "W/m²", "heat_transfer_coefficient": "W/(m²·K)",
    "conductivity": "W/(m·K)", "thermal_resistance_per_length": "m·K/W", "area": "m²", "area_per_length": "m²/m", "time": "s",
    "percent": "%", "efficiency": "1", "mass_flow": "kg/s", "volume_flow": "m³/s", "energy": "J",
    "power": "W", "number": "1",
}


@dataclass(frozen=True)
class Note:
    """One structured note (SI values; no sentence).

    ``values`` holds ``(name, value_si, kind)`` triples (kind ``"number"`` for a plain
    number such as a count); ``words`` holds ``(name, text)`` pairs of unit-free text the
    sentence cites; ``subject`` names the input or patch the note is about ("" for the
    whole result).  Equal notes compare equal, so a list of notes is de-duplicated with
    ``dict.fromkeys``.
    """

    code: str
    severity: str = "warning"
    values: tuple[tuple[str, float, str], ...] = ()
    words: tuple[tuple[str, str], ...] = ()
    subject: str = ""

    def __post_init__(self):
        if self.severity not in SEVERITIES:
            raise ValueError(f'note severity "{self.severity}" is not one of {", ".join(SEVERITIES)}')
        for _, _, kind in self.values:
            if kind not in SI_UNITS:
                raise ValueError(f'note {self.code}: unknown quantity kind "{kind}"')

    def value(self, name: str) -> float:
        """The SI value cited as *name*."""
        for key, value, _ in self.values:
            if key == name:
                return value
        raise KeyError(name)

    def word(self, name: str) -> str:
        """The text cited as *name*."""
        return dict(self.words)[name]

    def fields(self) -> dict[str, Any]:
        """Every cited field by name: ``(value_si, kind)`` for a quantity, text for a word."""
        return {**{k: (v, kind) for k, v, kind in self.values}, **dict(self.words)}

    def to_dict(self) -> dict[str, Any]:
        """JSON-ready: the code, severity, subject, words, and each value with its SI unit."""
        out: dict[str, Any] = {"code": self.code, "severity": self.severity}
        if self.subject:
            out["subject"] = self.subject
        if self.values:
            out["values"] = {k: {"value": _plain(v), "unit": SI_UNITS[kind]} for k, v, kind in self.values}
        if self.words:
            out["words"] = dict(self.words)
        return out


def _plain(value):
    import math

    x = float(value)
    return round(x, 9) if math.isfinite(x) else None


def note(code: str, severity: str = "warning", subject: str = "", **fields) -> Note:
    """A :class:`Note`: each keyword is a quantity ``(value_si, kind)`` or a word (a str).

    Examples
    --------
    >>> n = note("run.freezes", freeze_c=(0.0, "temperature"))
    >>> n.code, n.value("freeze_c"), n.to_dict()["values"]
    ('run.freezes', 0.0, {'freeze_c': {'value': 0.0, 'unit': '°C'}})
    """
    values, words = [], []
    for name, item in fields.items():
        if isinstance(item, str):
            words.append((name, item))
        else:
            value, kind = item
            values.append((name, float(value), kind))
    return Note(code, severity, tuple(values), tuple(words), subject)


def with_subject(item, subject: str):
    """*item* (a :class:`Note` or a text) said of *subject*: a note with its subject set (before
    any it had; the report writes ``subject: sentence``), a text as ``"subject: text"``.

    >>> with_subject("needs --rh", "DN50"), with_subject(note("run.needs_fluid"), "DN50").subject
    ('DN50: needs --rh', 'DN50')
    """
    if isinstance(item, str):
        return f"{subject}: {item}"
    from dataclasses import replace

    return replace(item, subject=f"{subject}: {item.subject}" if item.subject else subject)
