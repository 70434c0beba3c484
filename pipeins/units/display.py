"""Showing SI values in a unit system: :func:`to_display`, :func:`format_quantity` and friends."""

from __future__ import annotations

import math

from .definitions import (
    _DEFAULT_DIGITS,
    _DEGF_DIFFERENCE_K,
    _INCH_M,
    _IPS_OD_IN,
    _check_system,
    _get_kind,
)


def _inch_table_value(diameter_m: float) -> float | None:
    """The inch-table outside diameter [in] that *diameter_m* [m] rounds from, or None."""
    for od_in in _IPS_OD_IN:
        if abs(diameter_m - od_in * _INCH_M) <= 0.06e-3:
            return od_in
    inches = diameter_m / _INCH_M
    if 13.5 < inches < 80.5 and round(inches) % 2 == 0 and abs(diameter_m - round(inches) * _INCH_M) <= 0.5e-3:
        return float(round(inches))  # NPS 14 and up, even sizes: OD = NPS
    return None


# --------------------------------------------------------------------------------------
# Showing results
# --------------------------------------------------------------------------------------
def _as_output(values):
    import numpy as np

    return float(values) if np.ndim(values) == 0 else values


def to_display(value_si, kind: str, units: str = "si"):
    """Convert SI values (°C for temperatures) to the display unit of a unit system.

    Parameters
    ----------
    value_si : float or array_like
        Values in SI (see :func:`parse_quantity` for each kind's SI unit).
    kind : str
        One of :data:`DISPLAY_KINDS`.
    units : {"si", "us"}
        Unit system; :func:`unit_label` names the unit shown.

    Returns
    -------
    float or numpy.ndarray
        A float for scalar input, else an array of the input's shape.

    Examples
    --------
    >>> to_display(100.0, "temperature", "us")
    212.0
    >>> to_display([0.0254, 0.0508], "thickness", "us")
    array([1., 2.])
    >>> to_display(3.6e6, "energy", "si")
    1.0
    """
    import numpy as np  # imported here: keeps "pipeins --help" fast

    spec = _get_kind(kind, display=True)
    system = _check_system(units)
    values = np.asarray(value_si, dtype=float)
    if kind == "temperature":
        out = values if system == "si" else values / _DEGF_DIFFERENCE_K + 32.0
    else:
        out = values / spec.display[system][1]
    return _as_output(out)


def from_display(value, kind: str, units: str = "si"):
    """Inverse of :func:`to_display`: display-unit values back to SI.

    Examples
    --------
    >>> from_display(212.0, "temperature", "us")
    100.0
    >>> from_display(2.0, "thickness", "us")
    0.0508
    """
    import numpy as np  # imported here: keeps "pipeins --help" fast

    spec = _get_kind(kind, display=True)
    system = _check_system(units)
    values = np.asarray(value, dtype=float)
    if kind == "temperature":
        out = values if system == "si" else (values - 32.0) * _DEGF_DIFFERENCE_K
    else:
        out = values * spec.display[system][1]
    return _as_output(out)


def unit_label(kind: str, units: str = "si") -> str:
    """Label of the unit :func:`to_display` shows, e.g. ``"mm"`` or ``"Btu/(h·ft)"``.

    Examples
    --------
    >>> unit_label("thickness", "si"), unit_label("heat_flow_per_length", "us")
    ('mm', 'Btu/(h·ft)')
    """
    return _get_kind(kind, display=True).display[_check_system(units)][0]


def format_quantity(value_si, kind: str, units: str = "si", digits: int | None = None):
    """Text for a report: the value in display units, rounded, with its unit label.

    Parameters
    ----------
    value_si : float or array_like
        Value(s) in SI.
    kind : str
        One of :data:`DISPLAY_KINDS`.
    units : {"si", "us"}
        Unit system.
    digits : int, optional
        Decimal places; default depends on kind and system (e.g. 0 for mm, 2 for inches,
        1 for temperatures).  A thickness in inches is shown with one decimal more than
        asked and never fewer than two (an inch is 25.4 mm: 1.0 in would hide a pick
        between 1 and 1.5 in).  An outside diameter in inches that the inch tables list
        (NPS 1/8 to 12) is shown as they print it: NPS 2 is 2.375 in, not the 2.374 in
        its rounded 60.3 mm converts to.

    Returns
    -------
    str or list of str
        ``"<value> <label>"``; a list for array input.

    Examples
    --------
    >>> format_quantity(0.0508, "thickness", "si")
    '51 mm'
    >>> format_quantity(0.0508, "thickness", "us")
    '2.00 in'
    >>> format_quantity([20.0, 100.0], "temperature", "us", digits=0)
    ['68 °F', '212 °F']
    >>> format_quantity(0.0603, "diameter", "us"), format_quantity(0.0254, "thickness", "us", 1)
    ('2.375 in', '1.00 in')
    """
    import numpy as np  # imported here: keeps "pipeins --help" fast

    system = _check_system(units)
    shown = to_display(value_si, kind, system)
    places = _DEFAULT_DIGITS[(kind, system)] if digits is None else int(digits)
    if kind == "thickness" and system == "us" and digits is not None:
        places = max(2, places + 1)
    label = unit_label(kind, system)
    if kind == "diameter" and system == "us":
        snapped = [_inch_table_value(float(v)) for v in np.ravel(value_si)]
        shown = np.where([x is not None for x in snapped],
                         [x if x is not None else 0.0 for x in snapped], np.ravel(shown))
        shown = float(shown[0]) if np.ndim(value_si) == 0 else shown

    def one(v):
        if not math.isfinite(v):
            return "–"  # never "nan" or "inf" in a report
        text = f"{v:.{places}f}"
        if text.startswith("-") and float(text) == 0.0:
            text = text[1:]  # no "-0.0"
        return f"{text} {label}"

    if np.ndim(shown) == 0:
        return one(shown)
    return [one(v) for v in np.ravel(shown)]
