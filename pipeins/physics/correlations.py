"""The registry of film correlations: which one serves which shape, where it holds, whence it comes.

Each :class:`Correlation` record names one function of :mod:`pipeins.physics.convection`,
the shape and orientation it serves, its kind (natural, forced, the mixing rule, or in-tube),
the dimensionless groups it takes, the published ranges of those groups and its source.
The films look their correlations up here by (geometry, orientation, kind) with
:func:`lookup` and make their range warnings from the records
(:meth:`Correlation.excursions`), so a new correlation is one function plus one record.

Keys of the lookup
------------------
geometry
    ``"cylinder"`` (a pipe, a round duct), ``"flat"`` (a face), ``"sphere"``; ``"pipe"`` for
    the in-tube film; ``"any"`` for a rule that serves every shape (the mixing rule).
orientation
    ``"horizontal"``/``"vertical"`` for a cylinder's axis; ``"vertical"``, ``"top"`` (facing
    up) or ``"bottom"`` (facing down) for a face; ``"any"`` where it does not matter.
side
    ``"hot"`` (surface above the air) or ``"cold"``; only horizontal faces care (the
    buoyant flow leaves a hot top and a cold bottom, and is held against the other two).

Ranges
------
``ranges`` maps a group (``"Ra"``, ``"Re"``, ``"RePr"``, ``"Pr"``, ``"H/D"``,
``"Gr/Re2"``) to its published (low, high) bounds, ``None`` for an open end.  The outer
film checks every group but Pr: its fluid is air, whose Prandtl number (0.70 to 0.74 over
the shipped table) is the fluid the outer correlations were fitted to, so a Pr bound
there is recorded for the reader, not warned on.  The ranges are those of the original
papers as quoted in Incropera, DeWitt, Bergman & Lavine, *Fundamentals of Heat and Mass
Transfer*, 6th ed. (2007), from memory, unless the record says otherwise.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from functools import lru_cache
from typing import Callable, Mapping

import numpy as np

from pipeins.errors import InputError, closest_names
from pipeins.physics import convection as cv

__all__ = [
    "Source",
    "Correlation",
    "CORRELATIONS",
    "GROUP_LABELS",
    "by_key",
    "lookup",
    "geometries",
    "group_text",
]

#: How the warnings name each dimensionless group (a record may say it otherwise).
GROUP_LABELS = {
    "Ra": "Rayleigh number",
    "Re": "Reynolds number",
    "RePr": "Re·Pr",
    "Pr": "Prandtl number",
    "H/D": "height over diameter",
    "Gr/Re2": "Gr/Re²",
}


@dataclass(frozen=True)
class Source:
    """Where a correlation is published: authors, year, and the equation (paper, textbook)."""

    authors: str
    year: int
    equation: str

    def __str__(self) -> str:
        return f"{self.authors} ({self.year}), {self.equation}"


@dataclass(frozen=True, kw_only=True, eq=False)  # a record is itself: compared and hashed by identity
class Correlation:
    """One registered correlation and where it holds.

    Attributes
    ----------
    key : str
        Unique name, ``<kind>_<what>`` (``"natural_horizontal_cylinder"``).
    function : callable
        The function of :mod:`pipeins.physics.convection`, called with the groups named
        by ``inputs`` in that order and the keyword arguments ``options``.
    geometry, orientations, kind, side
        What it serves (see the module docstring for the names).
    inputs : tuple of str
        The groups it takes: ``"Ra"``, ``"Re"``, ``"Pr"``, ``"H"`` (height [m]), ``"D"``
        (diameter [m]), ``"NuF"``/``"NuN"`` (the mixing rule's parts).
    length : str
        The length its Ra, Re and Nu are on: ``"diameter"``, ``"height"``,
        ``"area/perimeter"``, ``"flow length"``, ``"common"`` (the mixing rule),
        ``"inner diameter"``.
    ranges : mapping
        Group -> (low, high) published bounds, ``None`` for an open end.
    source : Source
        Authors, year, equation.
    range_name : str
        How the warnings name its range (``"the McAdams range"``).
    labels, scope, messages
        Wording of its warnings: group labels that differ from :data:`GROUP_LABELS`, text
        before and after the group, and whole (what, consequence) templates per
        (group, end) where the default ("above/below … ; beyond/below the range;
        extrapolated") does not fit; ``{bound}`` is replaced by the bound.
    base, regime
        A record whose own ranges hold only where ``regime`` (called with ``inputs``) is
        True; the ranges of the record named ``base`` hold elsewhere (the slender and
        thick vertical cylinder).
    inside : (str, str) or None
        A notice where every ranged group is inside its range (the mixed regime);
        ``{low}`` and ``{high}`` are replaced by the bounds.
    options : mapping
        Keyword arguments passed to ``function``.
    """

    key: str
    function: Callable
    geometry: str
    orientations: tuple[str, ...]
    kind: str
    inputs: tuple[str, ...]
    length: str
    ranges: Mapping[str, tuple]
    source: Source
    range_name: str = ""
    side: str = "any"
    labels: Mapping[str, str] = field(default_factory=dict)
    scope: tuple[str, str] = ("", "")
    messages: Mapping[tuple[str, int], tuple] = field(default_factory=dict)
    base: str | None = None
    regime: Callable | None = None
    inside: tuple[str, str] | None = None
    options: Mapping[str, object] = field(default_factory=dict)

    def evaluate(self, groups: Mapping[str, np.ndarray]) -> np.ndarray:
        """The correlation at *groups* (a mapping holding at least its ``inputs``)."""
        args = [groups[name] for name in self.inputs]
        return self.function(*args, **self.options) if self.options else self.function(*args)

    def in_regime(self, groups: Mapping[str, np.ndarray]):
        """Where this record's own ranges hold (True everywhere without a ``regime``)."""
        if self.regime is None:
            return True
        return self.regime(*(groups[name] for name in self.inputs))

    def bound(self, group: str, end: int):
        """The lower (*end* 0) or upper (*end* 1) bound of *group*."""
        return self.ranges[group][end]

    def excursions(self, values: Mapping[str, np.ndarray], where=True, quiet=None) -> list[tuple]:
        """(mask, what, consequence) for every range end that some case crosses.

        Parameters
        ----------
        values : mapping
            Group -> array of the groups to check; groups not in it are not checked.
        where : bool or array of bool
            The cases this record serves.
        quiet : mapping, optional
            Group -> array of bool: low-end excursions count only where it is True (the
            outer film's low-Rayleigh cases with |Ts − Ta| ≤ 1 K are left out).

        Returns
        -------
        list of tuple
            In the order of ``ranges``, the upper end before the lower.
        """
        quiet = quiet or {}
        found = []
        prefix, suffix = self.scope
        for group, (low, high) in self.ranges.items():
            if group not in values:
                continue
            value = values[group]
            label = self.labels.get(group, GROUP_LABELS[group])
            for end, bound in ((1, high), (0, low)):
                if bound is None:
                    continue
                mask = where & (value > bound) if end else where & (value < bound)
                if not end and group in quiet:
                    mask = mask & quiet[group]
                what, consequence = self.messages.get((group, end), (None, None))
                text = group_text(bound)
                what = (what or f"{prefix}{label} {'above' if end else 'below'} {{bound}}{suffix}")
                consequence = consequence or f"{'beyond' if end else 'below'} {self.range_name}; extrapolated"
                found.append((mask, what.format(bound=text), consequence.format(bound=text)))
        return found

    def notices(self, values: Mapping[str, np.ndarray], where=True) -> list[tuple]:
        """(mask, what, consequence) where every ranged group is strictly inside its range
        (only for a record with ``inside``, the mixing rule's regime)."""
        if self.inside is None:
            return []
        mask = where
        bounds = {}
        for group, (low, high) in self.ranges.items():
            value = values[group]
            mask = mask & (value > low) & (value < high)
            bounds = {"low": group_text(low), "high": group_text(high)}
        what, consequence = self.inside
        return [(mask, what.format(**bounds), consequence.format(**bounds))]


def group_text(value: float) -> str:
    """A bound as the warnings write it: ``1e12``, ``7.6e4``, ``0.2``, ``60``.

    >>> group_text(1.0e12), group_text(1.0e4), group_text(7.6e4), group_text(0.2), group_text(60.0)
    ('1e12', '1e4', '7.6e4', '0.2', '60')
    """
    if value >= 1.0e4:
        mantissa, exponent = f"{value:e}".split("e")
        return f"{mantissa.rstrip('0').rstrip('.')}e{int(exponent)}"
    return f"{value:g}"


_INCROPERA = "Incropera et al., 6th ed. (2007)"
_HORIZONTAL_FACE = " on a horizontal face ({} case)"

#: Every registered correlation, in the order the warnings list them.
CORRELATIONS: tuple[Correlation, ...] = (
    # ------------------------------------------------------------------ natural
    Correlation(
        key="natural_horizontal_cylinder", function=cv.nusselt_horizontal_cylinder_churchill_chu,
        geometry="cylinder", orientations=("horizontal",), kind="natural", inputs=("Ra", "Pr"), length="diameter",
        ranges={"Ra": (None, 1.0e12)},
        source=Source("Churchill & Chu", 1975, f"Int. J. Heat Mass Transfer 18:1049, Eq. (10); {_INCROPERA} Eq. 9.34"),
        range_name="the Churchill & Chu (1975) horizontal-cylinder range"),
    Correlation(
        # the correction is applied everywhere (it tends to 1 for thick cylinders): the heat flow
        # must be continuous in the surface temperature for the solver's bracket to close
        key="natural_vertical_cylinder", function=cv.nusselt_vertical_cylinder_popiel_churchill,
        geometry="cylinder", orientations=("vertical",), kind="natural", inputs=("Ra", "Pr", "H", "D"),
        length="height", ranges={"Ra": (1.0e4, 1.0e9), "Pr": (0.01, 100.0), "H/D": (None, 60.0)},
        source=Source("Popiel, Wojtkowiak & Bober", 2007,
                      "Exp. Thermal Fluid Sci. 32:607, curvature correction on Churchill & Chu's vertical plate"),
        range_name="the Popiel (2007) curvature-correction range",
        labels={"Ra": "Rayleigh number on the height"}, scope=("slender vertical cylinder with ", ""),
        messages={("Ra", 0): (None, "Popiel (2007) correction held at its Ra = {bound} value"),
                  ("H/D", 1): ("vertical cylinder taller than {bound} diameters", None)},
        base="natural_vertical_plate", regime=cv.vertical_cylinder_is_thin, options={"plate_when_thick": False}),
    Correlation(
        key="natural_vertical_plate", function=cv.nusselt_vertical_plate_churchill_chu,
        geometry="flat", orientations=("vertical",), kind="natural", inputs=("Ra", "Pr"), length="height",
        ranges={"Ra": (None, 1.0e12)},
        source=Source("Churchill & Chu", 1975, f"Int. J. Heat Mass Transfer 18:1323, Eq. (4); {_INCROPERA} Eq. 9.26"),
        range_name="the Churchill & Chu (1975) vertical-plate range", labels={"Ra": "Rayleigh number on the height"}),
    # horizontal faces: the buoyant flow leaves a hot top and a cold bottom (enhanced), and is
    # held against a cold top and a hot bottom (reduced); enhanced first, as the warnings list them
    *(Correlation(
        key=f"natural_horizontal_plate_{facing}_{side}", function=cv.nusselt_horizontal_plate_up_mcadams,
        geometry="flat", orientations=(orientation,), side=side, kind="natural", inputs=("Ra",),
        length="area/perimeter", ranges={"Ra": (1.0e4, 1.0e11), "Pr": (0.7, None)},
        source=Source("McAdams", 1954, f"Heat Transmission, 3rd ed., ch. 7, length A/P (Lloyd & Moran 1974); "
                                       f"{_INCROPERA} Eqs. 9.30-9.31"),
        range_name="the McAdams range", scope=("", _HORIZONTAL_FACE.format("enhanced")))
      for facing, orientation, side in (("up", "top", "hot"), ("down", "bottom", "cold"))),
    *(Correlation(
        key=f"natural_horizontal_plate_{facing}_{side}", function=cv.nusselt_horizontal_plate_down_mcadams,
        geometry="flat", orientations=(orientation,), side=side, kind="natural", inputs=("Ra",),
        length="area/perimeter", ranges={"Ra": (1.0e5, 1.0e10), "Pr": (0.7, None)},
        source=Source("McAdams", 1954, f"Heat Transmission, 3rd ed., ch. 7, length A/P; {_INCROPERA} Eq. 9.32"),
        range_name="the McAdams range", scope=("", _HORIZONTAL_FACE.format("reduced")))
      for facing, orientation, side in (("up", "top", "cold"), ("down", "bottom", "hot"))),
    Correlation(
        # the full form, with Churchill's turbulent term: the laminar form (Incropera Eq. 9.35,
        # Ra <= 1e11, Pr >= 0.7) is the same within 0.5 % only up to Ra of about 2.5e6
        key="natural_sphere", function=cv.nusselt_sphere_churchill, geometry="sphere", orientations=("any",),
        kind="natural", inputs=("Ra", "Pr"), length="diameter", ranges={"Ra": (None, 1.0e13)},
        source=Source("Churchill", 1983, "Heat Exchanger Design Handbook sec. 2.5.7, laminar and turbulent "
                                         f"terms (range as documented by ht); laminar form {_INCROPERA} Eq. 9.35"),
        range_name="the Churchill (1983) sphere range", scope=("", " on a sphere")),
    # ------------------------------------------------------------------ forced
    Correlation(
        key="forced_cylinder_crossflow", function=cv.nusselt_cylinder_crossflow_churchill_bernstein,
        geometry="cylinder", orientations=("horizontal", "vertical"), kind="forced", inputs=("Re", "Pr"),
        length="diameter", ranges={"RePr": (0.2, None), "Re": (None, 1.0e7)},
        source=Source("Churchill & Bernstein", 1977, f"J. Heat Transfer 99:300; {_INCROPERA} Eq. 7.54"),
        range_name="the Churchill & Bernstein (1977) range", scope=("", " in cross flow")),
    Correlation(
        key="forced_flat_plate", function=cv.nusselt_flat_plate_pohlhausen_colburn,
        geometry="flat", orientations=("vertical", "top", "bottom"), kind="forced", inputs=("Re", "Pr"),
        length="flow length", ranges={"Re": (None, 1.0e8), "Pr": (0.6, 60.0)},
        source=Source("Pohlhausen (1921) and Colburn", 1933, f"laminar and turbulent plate, mixed boundary layer; "
                                                                    f"{_INCROPERA} Eqs. 7.30 and 7.38"),
        range_name="the flat-plate correlation range", scope=("", " along a flat face")),
    Correlation(
        # film-temperature properties and a viscosity ratio of 1, as for every outer record
        key="forced_sphere", function=cv.nusselt_sphere_whitaker, geometry="sphere", orientations=("any",),
        kind="forced", inputs=("Re", "Pr"), length="diameter",
        ranges={"Re": (3.5, 7.6e4), "Pr": (0.71, 380.0)},
        source=Source("Whitaker", 1972, f"AIChE J. 18:361, viscosity ratio taken as 1; {_INCROPERA} Eq. 7.56"),
        range_name="the Whitaker (1972) sphere range", scope=("", " over a sphere")),
    # ------------------------------------------------------------------ the mixing rule
    Correlation(
        key="mixing_churchill", function=cv.nusselt_mixed_churchill, geometry="any", orientations=("any",),
        kind="mixing", inputs=("NuF", "NuN"), length="common", ranges={"Gr/Re2": (0.1, 10.0)},
        source=Source("Churchill", 1977, f"AIChE J. 23:10, Nu³ = Nu_F³ + Nu_N³; {_INCROPERA} Eq. 9.64 and "
                                         "sec. 9.9 (mixed regime where Gr/Re² is about 1)"),
        inside=("mixed convection (Gr/Re² between {low} and {high})",
                "natural and forced combined as Nu³ = Nu_F³ + Nu_N³ (Churchill 1977); less certain than either alone")),
    # ------------------------------------------------------------------ in-tube
    Correlation(
        key="internal_pipe", function=cv.nusselt_pipe_internal, geometry="pipe", orientations=("any",),
        kind="internal", inputs=("Re", "Pr"), length="inner diameter",
        ranges={"Re": (cv.REYNOLDS_TURBULENT_LIMIT, 5.0e6), "Pr": (0.5, 2000.0)},
        source=Source("Gnielinski", 1976, "Int. Chem. Eng. 16:359; laminar 48/11 below Re 2300, interpolated to "
                                          f"1e4 (Gnielinski 1995); {_INCROPERA} Eq. 8.62"),
        range_name="the Gnielinski (1976) range"),
)

_BY_KEY = {record.key: record for record in CORRELATIONS}
_INDEX: dict[tuple[str, str, str, str], Correlation] = {}
for _record in CORRELATIONS:
    for _orientation in _record.orientations:
        _slot = (_record.geometry, _orientation, _record.kind, _record.side)
        if _slot in _INDEX:  # pragma: no cover - a registry error, caught by the tests at import
            raise RuntimeError(f"two correlations registered for {_slot}: {_INDEX[_slot].key}, {_record.key}")
        _INDEX[_slot] = _record
del _record, _orientation, _slot


def by_key(key: str) -> Correlation:
    """The record registered under *key*.

    >>> by_key("natural_horizontal_cylinder").bound("Ra", 1)
    1000000000000.0
    >>> by_key("natural_horizontal_cylindre")
    Traceback (most recent call last):
    ...
    pipeins.errors.InputError: correlation: unknown correlation "natural_horizontal_cylindre" (did you mean "natural_horizontal_cylinder"?)
    """
    try:
        return _BY_KEY[key]
    except KeyError:
        hint = closest_names(key, _BY_KEY, n=1)
        tail = f" ({hint})" if hint.startswith("did you mean") else f"; {hint}"
        raise InputError("correlation", f'unknown correlation "{key}"{tail}') from None


def lookup(geometry: str, orientation: str, kind: str, side: str = "any") -> Correlation:
    """The correlation of *kind* that serves a *geometry* in an *orientation* on a *side*.

    A record registered for ``"any"`` side, orientation or geometry serves all of them.

    Parameters
    ----------
    geometry : str
        ``"cylinder"``, ``"flat"``, ``"sphere"`` or ``"pipe"``.
    orientation : str
        ``"horizontal"``, ``"vertical"``, ``"top"``, ``"bottom"`` or ``"any"``.
    kind : str
        ``"natural"``, ``"forced"``, ``"mixing"`` or ``"internal"``.
    side : str, optional
        ``"hot"`` or ``"cold"`` (surface against the air); ``"any"`` by default.

    Returns
    -------
    Correlation

    Raises
    ------
    InputError
        When nothing is registered for that combination.

    Examples
    --------
    >>> lookup("cylinder", "horizontal", "natural").key
    'natural_horizontal_cylinder'
    >>> lookup("flat", "bottom", "natural", "hot").key
    'natural_horizontal_plate_down_hot'
    >>> lookup("cylinder", "vertical", "mixing").key
    'mixing_churchill'
    """
    for slot in ((geometry, orientation, kind, side), (geometry, orientation, kind, "any"),
                 (geometry, "any", kind, side), (geometry, "any", kind, "any"), ("any", "any", kind, "any")):
        record = _INDEX.get(slot)
        if record is not None:
            return record
    on = f" ({side} side)" if side != "any" else ""
    raise InputError("correlation", f"no {kind} correlation registered for a {orientation} {geometry}{on}")


@lru_cache(maxsize=None)
def geometries(kind: str = "natural") -> dict[str, tuple[str, ...]]:
    """Each geometry with a *kind* correlation and its orientations, in registry order.

    >>> geometries()
    {'cylinder': ('horizontal', 'vertical'), 'flat': ('vertical', 'top', 'bottom'), 'sphere': ('any',)}
    """
    found: dict[str, list[str]] = {}
    for record in CORRELATIONS:
        if record.kind == kind:
            names = found.setdefault(record.geometry, [])
            names += [o for o in record.orientations if o not in names]
    return {geometry: tuple(names) for geometry, names in found.items()}
