"""Commercial insulation thickness series, per product family, in mm and in inches.

Read from ``tables/thickness_series.csv``. Series names are ``mm_<family>`` and
``in_<family>`` (e.g. ``mm_pipe_section``, ``in_elastomeric``). The largest value of a
series is the thickest single layer normally made; thicker insulation is built from
several layers (that logic lives with the sizing code, not here).
"""

from __future__ import annotations

import functools

from pipeins.errors import near_hint
from pipeins.errors import InputError
from pipeins.tables import read_table

__all__ = ["series_names", "thickness_series_m", "default_series", "series_families", "DUCT_FAMILY",
           "OWN_SERIES_ON_DUCTS"]

#: The family of duct wrap and duct board, and of the series a duct takes by default.
DUCT_FAMILY = "duct"
#: Families whose own series a duct keeps (sheet and blanket sold in those thicknesses for
#: ducts too); a material made for pipes (sections, blocks, a ``k=`` layer) takes the duct series
#: on a duct.
OWN_SERIES_ON_DUCTS = ("duct", "elastomeric", "aerogel")

_UNIT_M = {"mm": 0.001, "in": 0.0254}
_UNIT_SYSTEMS = {"si": "mm", "us": "in", "ip": "in"}


@functools.cache
def _series() -> dict[str, dict]:
    out: dict[str, dict] = {}
    for row in read_table("thickness_series"):
        entry = out.setdefault(row["series"], {"family": row["family"], "unit": row["unit"],
                                                "values": []})
        entry["values"].append(float(row["thickness"]) * _UNIT_M[row["unit"]])
    return out


def series_names() -> list[str]:
    """Names of every thickness series, in table order.

    Examples
    --------
    >>> series_names()[:2]
    ['mm_pipe_section', 'in_pipe_section']
    """
    return list(_series())


def series_families() -> list[str]:
    """Product families that have a thickness series.

    Examples
    --------
    >>> "elastomeric" in series_families()
    True
    """
    return list(dict.fromkeys(entry["family"] for entry in _series().values()))


def thickness_series_m(name: str) -> tuple[float, ...]:
    """Thicknesses of series *name* in metres, thinnest first.

    Raises
    ------
    InputError
        ``--series`` for an unknown series.

    Examples
    --------
    >>> thickness_series_m("mm_elastomeric")[:3]
    (0.009, 0.013, 0.019)
    >>> [round(t, 4) for t in thickness_series_m("in_pipe_section")[:2]]
    [0.0127, 0.0254]
    """
    key = str(name).strip().lower()
    if key not in _series():
        raise InputError("series", f'unknown thickness series "{str(name).strip()}"; '
                                     f"{near_hint(key, series_names())}")
    return tuple(sorted(round(v, 9) for v in _series()[key]["values"]))


def default_series(family: str, units: str = "si", section_kind: str = "pipe") -> str:
    """Name of the mm (``units="si"``) or inch (``units="us"``, also ``"ip"``) series of a family.

    A ``generic`` family (constant-k layer) uses the pipe-section series.  On a duct
    (*section_kind* ``"duct"``) every family but those of :data:`OWN_SERIES_ON_DUCTS` takes the
    duct series (``mm_duct``: 25, 38, 50, 75 mm; ``in_duct``: 1, 1.5, 2, 3 in; duct wrap and
    duct board, common practice): pipe sections are not sold for ducts.

    Raises
    ------
    InputError
        ``--series`` for a family without series, ``--units`` for other unit systems.

    Examples
    --------
    >>> default_series("elastomeric")
    'mm_elastomeric'
    >>> default_series("block", "us")
    'in_block'
    >>> default_series("pipe_section", "us", "duct"), default_series("elastomeric", "si", "duct")
    ('in_duct', 'mm_elastomeric')
    """
    system = str(units).strip().lower()
    if system not in _UNIT_SYSTEMS:
        raise InputError("--units", f'unknown unit system "{units}"; use si or us')
    fam = "pipe_section" if family == "generic" else str(family).strip().lower()
    if section_kind == "duct" and fam not in OWN_SERIES_ON_DUCTS:
        fam = DUCT_FAMILY
    name = f"{_UNIT_SYSTEMS[system]}_{fam}"
    if name not in _series():
        raise InputError("series", f'no thickness series for material family "{family}"; '
                                     f"families: {', '.join(series_families())}")
    return name
