"""Bare fittings (valves, flanges, strainers) as an equivalent length of bare pipe.

Read from ``tables/fitting_lengths.csv``: for each fitting kind, bands of pipe outside
diameter, each with the length of bare pipe of that size that loses the same heat as one
uninsulated fitting.
"""

from __future__ import annotations

import functools

from pipeins.errors import near_hint
from pipeins.errors import InputError
from pipeins.tables import read_table

__all__ = ["equivalent_length_m", "fitting_kinds"]


@functools.cache
def _bands() -> dict[str, tuple[tuple[float, ...], tuple[float, ...], str]]:
    grouped: dict[str, list[tuple[float, float, str]]] = {}
    for row in read_table("fitting_lengths"):
        grouped.setdefault(row["fitting"], []).append(
            (float(row["max_outer_diameter_mm"]) / 1000.0, float(row["equivalent_length_m"]),
             row["source"]))
    out = {}
    for kind, rows in grouped.items():
        rows.sort()
        out[kind] = (tuple(r[0] for r in rows), tuple(r[1] for r in rows),
                     "; ".join(dict.fromkeys(r[2] for r in rows)))
    return out


def fitting_kinds() -> list[str]:
    """Fitting kinds in the table.

    Examples
    --------
    >>> fitting_kinds()
    ['valve', 'flange', 'strainer']
    """
    return list(_bands())


def equivalent_length_m(fitting: str, outer_diameter_m):
    """Length of bare pipe [m] that loses as much heat as one bare *fitting*.

    Step lookup: the band is the first whose upper outside diameter is at least
    *outer_diameter_m*; no interpolation between bands. Rounded figures of common
    practice (see the table's source column).

    Parameters
    ----------
    fitting : {"valve", "flange", "strainer"}
    outer_diameter_m : float or array_like
        Pipe outside diameter [m], above 0 and within the largest band.

    Returns
    -------
    numpy.ndarray
        Equivalent length [m], shape of *outer_diameter_m* (0-d for a scalar).

    Raises
    ------
    InputError
        ``--fitting`` for an unknown kind, ``--outer-diameter`` outside the table.

    Examples
    --------
    >>> float(equivalent_length_m("valve", 0.1143))
    1.5
    >>> equivalent_length_m("flange", [0.0603, 0.3239]).tolist()
    [0.4, 0.9]
    """
    import numpy as np

    bands = _bands()
    if fitting not in bands:
        raise InputError("--fitting", f'unknown fitting "{fitting}"; '
                                      f"{near_hint(str(fitting), list(bands))}")
    upper_m, length_m, _ = bands[fitting]
    d = np.asarray(outer_diameter_m, dtype=float)
    if not np.all(np.isfinite(d)) or np.any(d <= 0.0) or np.any(d > upper_m[-1]):
        raise InputError("--outer-diameter", f"outside diameter must be above 0 and at most "
                                             f"{upper_m[-1] * 1000:g} mm for fitting lengths")
    index = np.searchsorted(np.asarray(upper_m), d, side="left")
    return np.asarray(length_m)[index]
