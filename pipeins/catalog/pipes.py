"""Pipe and tube sizes: steel NPS × schedule, copper tube by type, metric DN.

Three catalogues are read from ``tables/``:

* ``pipes_steel`` – NPS 1/8 to NPS 36, schedules of ASME B36.10M (carbon steel: 10 … 160,
  STD, XS, XXS) and ASME B36.19M (stainless: 5S, 10S, 40S, 80S); labels ``"NPS 1-1/2"``.
* ``pipes_copper`` – ASTM B88 copper water tube, types K, L and M, 1/4 to 6 in;
  labels ``"copper L 1"`` give the nominal (standard) size; the outside diameter is
  1/8 in larger. A size that is not a nominal size but is the outside diameter of one
  (``"copper L 1-1/8"``) names that tube; ``"copper L 3/4 OD"`` forces the reading as
  outside diameter where a value is both.
* ``pipes_metric`` – DN 10 to DN 600, outside diameter per EN 10220 series 1 and a usual
  wall; labels ``"DN50"``.

Sizes are written as in the labels, case-insensitive; ``"NPS 1 1/2"``, ``"NPS 1.5"``,
``"DN 50"``, ``"copper type l 3/4"`` are accepted too.
"""

from __future__ import annotations

import functools
import math
import re
from dataclasses import dataclass
from fractions import Fraction

from pipeins.errors import near_hint
from pipeins.errors import InputError
from pipeins.tables import read_table

__all__ = [
    "PipeSize",
    "lookup_pipe",
    "custom_pipe",
    "pipe_range",
    "list_pipes",
    "DEFAULT_SCHEDULE",
    "SCHEDULE_ORDER",
]

#: Steel schedule used when none is given (``"STD"`` for the few sizes without schedule 40).
DEFAULT_SCHEDULE = "40"

#: Order in which schedules are listed (thin to thick, S and identification names beside
#: their numbered twins).
SCHEDULE_ORDER = (
    "5S", "10S", "10", "20", "30", "40", "40S", "STD", "60",
    "80", "80S", "XS", "100", "120", "140", "160", "XXS",
)

_INCH_M = 0.0254


@dataclass(frozen=True)
class PipeSize:
    """One pipe or tube size.

    Attributes
    ----------
    label : str
        Size as written by the user interface, e.g. ``"NPS 2"``, ``"DN50"``,
        ``"copper L 3/4"`` or ``"OD 60 mm"``.
    kind : str
        Catalogue: ``"steel"``, ``"copper"``, ``"metric"`` or ``"custom"``.
    nominal : str
        Nominal size without prefix, e.g. ``"1-1/2"`` or ``"50"``.
    schedule : str or None
        Steel schedule (``"40"``, ``"STD"``, ``"10S"`` …), copper tube type (``"K"``,
        ``"L"``, ``"M"``), or None for metric and custom sizes.
    outer_diameter_m : float
        Outside diameter [m].
    wall_m : float
        Wall thickness [m].
    """

    label: str
    kind: str
    nominal: str
    schedule: str | None
    outer_diameter_m: float
    wall_m: float

    @property
    def inner_diameter_m(self) -> float:
        """Inside diameter [m], ``outer_diameter_m - 2 * wall_m``."""
        return self.outer_diameter_m - 2.0 * self.wall_m


# --------------------------------------------------------------------------- parsing
@functools.lru_cache(maxsize=1024)  # a table repeats each size once per schedule; Fractions are immutable
def _nominal_value(text: str) -> Fraction | None:
    """``"1-1/2"``, ``"1 1/2"``, ``"1.5"``, ``"3/4"``, ``"2"`` → Fraction; None if not a size."""
    text = text.strip()
    m = re.fullmatch(r"(\d+)\s*(?:-|\s)\s*(\d+)\s*/\s*(\d+)", text)
    if m:
        whole, num, den = (int(g) for g in m.groups())
        return Fraction(whole) + Fraction(num, den) if den else None
    m = re.fullmatch(r"(\d+)\s*/\s*(\d+)", text)
    if m:
        num, den = (int(g) for g in m.groups())
        return Fraction(num, den) if den else None
    m = re.fullmatch(r"\d+(?:\.\d+)?", text)
    if m:
        return Fraction(text)
    return None


def _schedule_key(schedule: str) -> str:
    """Normalise a schedule as typed: ``"sch 40"`` → ``"40"``, ``"std"`` → ``"STD"``."""
    text = re.sub(r"^\s*(schedule|sch\.?)\s*(?=\d)", "", str(schedule).strip(), flags=re.I)
    return text.replace(" ", "").upper()


@dataclass(frozen=True)
class _Entry:
    kind: str
    group: str  # "" for steel and metric, the tube type for copper
    nominal: str
    value: Fraction
    label: str


@functools.cache
def _steel() -> dict[Fraction, dict]:
    sizes: dict[Fraction, dict] = {}
    for row in read_table("pipes_steel"):
        value = _nominal_value(row["nps"])
        entry = sizes.setdefault(value, {"nominal": row["nps"], "schedules": {}})
        entry["schedules"][row["schedule"].upper()] = (
            float(row["outer_diameter_mm"]) / 1000.0,
            float(row["wall_mm"]) / 1000.0,
            row["source"],
        )
    return dict(sorted(sizes.items()))


@functools.cache
def _copper() -> dict[str, dict[Fraction, tuple]]:
    types: dict[str, dict[Fraction, tuple]] = {}
    for row in read_table("pipes_copper"):
        value = _nominal_value(row["nominal"])
        types.setdefault(row["type"].upper(), {})[value] = (
            row["nominal"],
            float(row["outer_diameter_in"]) * _INCH_M,
            float(row["wall_in"]) * _INCH_M,
            row["source"],
        )
    return {t: dict(sorted(v.items())) for t, v in sorted(types.items())}


@functools.cache
def _metric() -> dict[Fraction, tuple]:
    sizes = {}
    for row in read_table("pipes_metric"):
        sizes[Fraction(int(row["dn"]))] = (
            row["dn"],
            float(row["outer_diameter_mm"]) / 1000.0,
            float(row["wall_mm"]) / 1000.0,
            row["source"],
        )
    return dict(sorted(sizes.items()))


@functools.cache
def _entries(kind: str, group: str = "") -> tuple[_Entry, ...]:
    """Every size of one catalogue (and copper type), smallest first."""
    if kind == "steel":
        return tuple(_Entry("steel", "", e["nominal"], v, f"NPS {e['nominal']}")
                     for v, e in _steel().items())
    if kind == "copper":
        return tuple(_Entry("copper", group, e[0], v, f"copper {group} {e[0]}")
                     for v, e in _copper()[group].items())
    return tuple(_Entry("metric", "", e[0], v, f"DN{e[0]}") for v, e in _metric().items())


@functools.cache
def _all_labels() -> tuple[str, ...]:
    labels = [e.label for e in _entries("steel")] + [e.label for e in _entries("metric")]
    for group in _copper():
        labels += [e.label for e in _entries("copper", group)]
    return tuple(labels)


_STEEL_RE = re.compile(r"nps\s*(?P<size>.+)", re.I)
_METRIC_RE = re.compile(r"dn\s*(?P<size>.+)", re.I)
_COPPER_RE = re.compile(r"(?:copper|cu)\s+(?:type\s*)?(?P<group>[a-z])\s+(?P<size>.+)", re.I)


def _parse(text: str) -> tuple[str, str, Fraction | None] | None:
    """``(kind, group, nominal value)`` of a size text, or None if it names no catalogue."""
    text = str(text).strip()
    for kind, pattern in (("steel", _STEEL_RE), ("metric", _METRIC_RE), ("copper", _COPPER_RE)):
        m = pattern.fullmatch(text)
        if m:
            group = m.group("group").upper() if kind == "copper" else ""
            size = m.group("size")
            if kind == "copper":
                size = re.sub(r"\s*od\s*$", "", size, flags=re.I)
            return kind, group, _nominal_value(size)
    return None


def _unknown(text: str, name: str = "pipe") -> InputError:
    """The 'unknown pipe size' error, naming the neighbouring sizes when the catalogue is clear."""
    parsed = _parse(text)
    hint = None
    if parsed and parsed[2] is not None and (parsed[0] != "copper" or parsed[1] in _copper()):
        kind, group, value = parsed
        entries = _entries(kind, group)
        below = [e.label for e in entries if e.value < value][-1:]
        above = [e.label for e in entries if e.value > value][:1]
        near = below + above
        if near:
            hint = "did you mean " + " or ".join(f'"{x}"' for x in near) + "?"
    if hint is None:
        hint = near_hint(str(text).strip(), _all_labels())
    return InputError(name, f'unknown pipe size "{str(text).strip()}"; {hint}')


def _find(text: str, name: str = "pipe") -> _Entry:
    parsed = _parse(text)
    if parsed is None or parsed[2] is None:
        raise _unknown(text, name)
    kind, group, value = parsed
    if kind == "copper" and group not in _copper():
        raise InputError(name, f'unknown copper tube type "{group}" in "{str(text).strip()}"; '
                               f"types: {', '.join(_copper())}")
    by_od = kind == "copper" and re.search(r"\bod\s*$", str(text), re.I) is not None
    if not by_od:
        for entry in _entries(kind, group):
            if entry.value == value:
                return entry
    if kind == "copper":
        # copper tube is also named by its outside diameter ("copper L 1-1/8" = nominal 1)
        for entry in _entries(kind, group):
            od_in = _copper()[group][entry.value][1] / _INCH_M
            if abs(od_in - float(value)) < 1e-6:
                return entry
    raise _unknown(text, name)


def _make(entry: _Entry, schedule: str | None) -> PipeSize:
    if entry.kind == "steel":
        schedules = _steel()[entry.value]["schedules"]
        if schedule is None:
            key = DEFAULT_SCHEDULE if DEFAULT_SCHEDULE in schedules else "STD"
        else:
            key = _schedule_key(schedule)
        if key not in schedules:
            available = ", ".join(s for s in SCHEDULE_ORDER if s in schedules)
            raise InputError("schedule", f"{entry.label} has no schedule {key}; "
                                           f"available: {available}")
        od, wall, _ = schedules[key]
        return PipeSize(entry.label, "steel", entry.nominal, key, od, wall)
    if schedule is not None:
        raise InputError("schedule", f"{entry.label} takes no schedule (schedules apply to NPS "
                                       "steel pipe; copper tube gives its type in the size, e.g. "
                                       '"copper L 3/4")')
    if entry.kind == "copper":
        _, od, wall, _ = _copper()[entry.group][entry.value]
        return PipeSize(entry.label, "copper", entry.nominal, entry.group, od, wall)
    _, od, wall, _ = _metric()[entry.value]
    return PipeSize(entry.label, "metric", entry.nominal, None, od, wall)


# --------------------------------------------------------------------------- public API
def lookup_pipe(text: str, schedule: str | None = None) -> PipeSize:
    """The catalogue size named by *text*.

    Parameters
    ----------
    text : str
        ``"NPS 2"``, ``"NPS 1-1/2"`` (also ``"NPS 1 1/2"``, ``"NPS 1.5"``), ``"DN50"`` /
        ``"DN 50"``, ``"copper L 1-1/8"`` / ``"copper K 3/4"``; case-insensitive.
    schedule : str, optional
        Steel schedule: ``"40"``, ``"80"``, ``"STD"``, ``"XS"``, ``"XXS"``, ``"10S"``,
        ``"40S"`` … (``"sch 40"`` is accepted). Default ``"40"``, or ``"STD"`` for the
        sizes that have no schedule 40. Copper and DN sizes take no schedule.

    Returns
    -------
    PipeSize

    Raises
    ------
    InputError
        ``--pipe`` for an unknown size, ``--schedule`` for a schedule that size lacks.

    Examples
    --------
    >>> p = lookup_pipe("NPS 2")
    >>> p.label, p.schedule, round(p.outer_diameter_m * 1000, 1), round(p.wall_m * 1000, 2)
    ('NPS 2', '40', 60.3, 3.91)
    >>> round(lookup_pipe("copper L 3/4").outer_diameter_m * 1000, 3)
    22.225
    >>> lookup_pipe("dn 50").label
    'DN50'
    """
    return _make(_find(text), schedule)


def custom_pipe(outer_diameter_m: float, wall_m: float) -> PipeSize:
    """A pipe of any outside diameter and wall, kind ``"custom"``.

    Parameters
    ----------
    outer_diameter_m : float
        Outside diameter [m], greater than 0.
    wall_m : float
        Wall thickness [m], greater than 0 and less than half the outside diameter.

    Examples
    --------
    >>> p = custom_pipe(0.0603, 0.004)
    >>> p.label, round(p.inner_diameter_m, 4)
    ('OD 60.3 mm', 0.0523)
    """
    try:
        od = float(outer_diameter_m)
    except (TypeError, ValueError):
        raise InputError("outer_diameter_m", f"{outer_diameter_m!r} is not a number; give the "
                                             "outside diameter in metres") from None
    try:
        wall = float(wall_m)
    except (TypeError, ValueError):
        raise InputError("wall_m", f"{wall_m!r} is not a number; give the wall thickness in "
                                   "metres") from None
    if not math.isfinite(od) or od <= 0.0:
        raise InputError("outer_diameter_m", f"{od:g} m: the outside diameter must be above 0")
    if not math.isfinite(wall) or wall <= 0.0 or wall >= od / 2.0:
        raise InputError("wall_m", f"{wall:g} m: the wall must be above 0 and below half the "
                                   f"outside diameter ({od / 2.0:g} m)")
    return PipeSize(f"OD {od * 1000:g} mm", "custom", f"{od * 1000:g} mm", None, od, wall)


def _catalogue_of(entry: _Entry) -> str:
    return f"copper type {entry.group}" if entry.kind == "copper" else entry.kind


def _range_entries(text: str) -> list[_Entry]:
    left, right = (part.strip() for part in text.split("..", 1))
    if not left or not right:
        raise InputError("--sizes", f'range "{text}" needs a size on both sides of ".."')
    first = _find(left, "--sizes")
    if _parse(right) is None and _nominal_value(right) is not None:
        # "copper L 1/2..4", "DN15..300": the right end inherits the left end's prefix
        prefix = {"steel": "NPS ", "metric": "DN", "copper": f"copper {first.group} "}[first.kind]
        right = prefix + right
    last = _find(right, "--sizes")
    if (first.kind, first.group) != (last.kind, last.group):
        raise InputError("--sizes", f'range "{text}" mixes catalogues ({_catalogue_of(first)} and '
                                    f"{_catalogue_of(last)}); give one catalogue per run")
    if last.value < first.value:
        raise InputError("--sizes", f'range "{text}" runs backwards; write the smaller size first')
    return [e for e in _entries(first.kind, first.group) if first.value <= e.value <= last.value]


def pipe_range(text: str, schedule: str | None = None) -> list[PipeSize]:
    """The sizes of a range ``"A..B"`` (both ends included) or a comma list, in catalogue order.

    Parameters
    ----------
    text : str
        ``"NPS 1/2..NPS 12"``, ``"DN15..DN300"`` (also ``"DN15..300"``),
        ``"copper L 1/2..4"``, or a comma list such as ``"NPS 1, NPS 2, NPS 4"`` whose
        items may themselves be ranges. All sizes must come from one catalogue (and one
        copper type).
    schedule : str, optional
        Steel schedule applied to every size (see :func:`lookup_pipe`); a size in the
        range that lacks it is an error.

    Returns
    -------
    list of PipeSize

    Raises
    ------
    InputError
        ``--sizes`` for an empty or backwards range, an unknown size or mixed catalogues;
        ``--schedule`` as in :func:`lookup_pipe`.

    Examples
    --------
    >>> [p.label for p in pipe_range("NPS 1..NPS 2")]
    ['NPS 1', 'NPS 1-1/4', 'NPS 1-1/2', 'NPS 2']
    >>> len(pipe_range("DN15..DN300"))
    14
    """
    text = str(text).strip()
    items = [item.strip() for item in text.split(",")]
    if not text or not any(items):
        raise InputError("--sizes", 'no pipe sizes given; write e.g. "NPS 1/2..NPS 12" or '
                                    '"DN25, DN50, DN80"')
    if not all(items):
        raise InputError("--sizes", f'empty item in the size list "{text}"')
    entries: list[_Entry] = []
    for item in items:
        entries += _range_entries(item) if ".." in item else [_find(item, "--sizes")]
    catalogues = []
    for entry in entries:
        if _catalogue_of(entry) not in catalogues:
            catalogues.append(_catalogue_of(entry))
    if len(catalogues) > 1:
        raise InputError("--sizes", f'"{text}" mixes catalogues ({" and ".join(catalogues)}); '
                                    "give one catalogue per run")
    return [_make(entry, schedule) for entry in entries]


def list_pipes(kind: str | None = None) -> list[dict]:
    """Rows for a size listing: every catalogue size (steel: one row per schedule).

    Parameters
    ----------
    kind : {"steel", "copper", "metric"}, optional
        Only this catalogue; all three when None.

    Returns
    -------
    list of dict
        Keys ``label``, ``kind``, ``schedule`` (steel schedule or copper type, "" for DN),
        ``outer_diameter_mm``, ``wall_mm``, ``source``.

    Examples
    --------
    >>> rows = list_pipes("metric")
    >>> rows[0]["label"], rows[0]["outer_diameter_mm"]
    ('DN10', 17.2)
    """
    kinds = ("steel", "copper", "metric")
    if kind is not None and kind not in kinds:
        raise InputError("--kind", f'unknown pipe catalogue "{kind}"; catalogues: {", ".join(kinds)}')
    rows: list[dict] = []

    def row(label, k, sched, od_m, wall_m, source):
        return {"label": label, "kind": k, "schedule": sched,
                "outer_diameter_mm": round(od_m * 1000.0, 3), "wall_mm": round(wall_m * 1000.0, 3),
                "source": source}

    if kind in (None, "steel"):
        for value, e in _steel().items():
            for sched in SCHEDULE_ORDER:
                if sched in e["schedules"]:
                    od, wall, source = e["schedules"][sched]
                    rows.append(row(f"NPS {e['nominal']}", "steel", sched, od, wall, source))
    if kind in (None, "copper"):
        for group, sizes in _copper().items():
            for nominal, od, wall, source in sizes.values():
                rows.append(row(f"copper {group} {nominal}", "copper", group, od, wall, source))
    if kind in (None, "metric"):
        for dn, od, wall, source in _metric().values():
            rows.append(row(f"DN{dn}", "metric", "", od, wall, source))
    return rows
