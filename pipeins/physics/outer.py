"""The outer film: natural, forced and mixed convection from the jacket to the air.

:func:`outer_convection_coefficient` is called by the solver on every iteration for
all cases at once, so it is pure numpy: one air-property lookup per call, no loop over
cases.  It returns only the convective coefficient (radiation is separate, see
:mod:`pipeins.physics.radiation`; the two act in parallel).

Validity warnings are not returned by the coefficient function.  Call
:func:`outer_convection_warnings` with the same arguments (normally once, on the
converged surface temperatures) to get them as a list of one-line strings.

Geometry and length conventions
-------------------------------
``geometry="cylinder"`` (pipes):
    ``characteristic_length_m`` is the outer diameter D.  ``orientation="horizontal"``
    uses Churchill & Chu's horizontal-cylinder form on D; ``"vertical"`` uses the
    vertical-plate form over ``height_m`` with the thin-cylinder check and the Popiel
    curvature correction.  Wind is taken as cross flow in both orientations
    (Churchill & Bernstein on D).
``geometry="flat"`` (duct faces):
    ``orientation="vertical"`` is a side face: natural convection over ``height_m``.
    ``"top"`` and ``"bottom"`` are horizontal faces with ``characteristic_length_m`` =
    face area / perimeter; a face whose buoyant flow can leave it (hot top, cold
    bottom) gets the enhanced McAdams form, the other cases the reduced form.
    With wind, ``characteristic_length_m`` is also the flow length for the flat-plate
    forced correlation on every face.
``geometry="sphere"`` (a spherical vessel or a dished head), ``orientation="any"``:
    ``characteristic_length_m`` is the outer diameter D.  Natural convection by
    Churchill (1983) on D (with its turbulent term), wind by Whitaker (1972) on D with
    film-temperature properties and a viscosity ratio of 1.

Which correlation serves which geometry and orientation, with its range and source, is
looked up in :mod:`pipeins.physics.correlations`; the warnings come from the same records.

Forced and natural contributions are combined as Nu³ = Nu_F³ + Nu_N³ on a common
length (:func:`pipeins.physics.convection.nusselt_mixed_churchill`); with no wind the
natural value is used alone.
"""

from __future__ import annotations

from functools import lru_cache

import numpy as np

from pipeins.errors import InputError
from pipeins.physics import correlations as registry

__all__ = [
    "STANDARD_GRAVITY_M_S2",
    "GEOMETRIES",
    "outer_convection_coefficient",
    "outer_convection_warnings",
]

#: Standard acceleration of gravity [m/s²] (CGPM 1901, exact).
STANDARD_GRAVITY_M_S2 = 9.80665
#: Valid orientations for each geometry (from the correlation registry).
GEOMETRIES = registry.geometries("natural")

_LOW_RA_MIN_DELTA_K = 1.0  # low-Rayleigh warnings only where |Ts - Ta| exceeds this


@lru_cache(maxsize=None)
def _rules(geometry, orientation):
    """(hot-side natural, cold-side natural, forced, mixing) records of a geometry/orientation."""
    return tuple(registry.lookup(geometry, orientation, kind, side)
                 for kind, side in (("natural", "hot"), ("natural", "cold"), ("forced", "any"), ("mixing", "any")))


def _choices(names):
    quoted = [f'"{x}"' for x in names]
    return quoted[0] if len(quoted) == 1 else ", ".join(quoted[:-1]) + " or " + quoted[-1]


def _outer_film(
    surface_temp_c,
    air_temp_c,
    characteristic_length_m,
    wind_speed_m_s,
    orientation,
    height_m,
    pressure_pa,
    geometry,
    collect_warnings,
):
    from pipeins.props.air import TEMP_RANGE_C, air_properties

    if geometry not in GEOMETRIES:
        raise InputError("--geometry", f'unknown geometry "{geometry}"; use {_choices(GEOMETRIES)}')
    allowed = GEOMETRIES[geometry]
    if orientation not in allowed:
        names = ", ".join(f'"{x}"' for x in allowed)
        raise InputError("--orientation", f'"{orientation}" is not an orientation of a {geometry}; use {names}')
    hot_rule, cold_rule, forced_rule, mixing_rule = _rules(geometry, orientation)

    surface_temp_c, air_temp_c, length_m, wind_m_s, pressure_pa = np.broadcast_arrays(
        *(np.asarray(x, dtype=float) for x in (surface_temp_c, air_temp_c, characteristic_length_m, wind_speed_m_s, pressure_pa))
    )
    if not np.all(length_m > 0.0):
        raise InputError("characteristic_length_m", "must be greater than 0 m")
    if not np.all(wind_m_s >= 0.0):
        raise InputError("wind_m_s", "must be 0 m/s or more")
    if not np.all(pressure_pa > 0.0):
        raise InputError("pressure_pa", "must be greater than 0 Pa")
    if not np.all(air_temp_c > -273.15):
        raise InputError("air_temp_c", "must be above -273.15 °C")
    if not np.all(surface_temp_c > -273.15):
        raise InputError("surface_temp_c", "must be above -273.15 °C")

    on_height = hot_rule.length == "height"
    if on_height:
        if height_m is None:
            raise InputError("--height", "a vertical run needs its height in m (greater than 0)")
        height_m = np.asarray(height_m, dtype=float)
        if not np.all(height_m > 0.0):
            raise InputError("--height", "must be greater than 0 m")
        height_m = np.broadcast_to(height_m, length_m.shape)

    film_temp_c = 0.5 * (surface_temp_c + air_temp_c)
    air = air_properties(film_temp_c, pressure_pa)
    film_temp_k = film_temp_c + 273.15
    nu = air.kinematic_viscosity_m2_s
    alpha = air.diffusivity_m2_s
    k = air.conductivity_w_mk
    pr = air.prandtl
    delta_k = np.abs(surface_temp_c - air_temp_c)
    # g * beta * dT / (nu * alpha), beta = 1 / T_film (ideal gas); times L^3 gives Ra_L
    buoyancy_per_m3 = STANDARD_GRAVITY_M_S2 * delta_k / (film_temp_k * nu * alpha)

    notes = []  # (mask, what, consequence) for the warnings, from the records' ranges

    natural_length_m = height_m if on_height else length_m
    rayleigh = buoyancy_per_m3 * natural_length_m**3
    groups = {"Ra": rayleigh, "Pr": pr, "H": height_m, "D": length_m}
    if hot_rule is cold_rule:
        sides = ((hot_rule, True),)
        nusselt_natural = hot_rule.evaluate(groups)
    else:
        hot = surface_temp_c > air_temp_c
        sides = ((hot_rule, hot), (cold_rule, ~hot))
        nusselt_natural = np.where(hot, hot_rule.evaluate(groups), cold_rule.evaluate(groups))
    if collect_warnings:
        quiet = {"Ra": delta_k > _LOW_RA_MIN_DELTA_K}
        for rule, where in sorted(sides, key=lambda pair: registry.CORRELATIONS.index(pair[0])):
            values = {"Ra": rayleigh}
            if "H/D" in rule.ranges:
                values["H/D"] = height_m / length_m
            own = rule.in_regime(groups)
            if rule.base is not None:
                notes += registry.by_key(rule.base).excursions(values, where & ~own, quiet)
            notes += rule.excursions(values, where & own, quiet)
    h_natural = nusselt_natural * k / natural_length_m

    windy = wind_m_s > 0.0
    if np.any(windy):
        reynolds = wind_m_s * length_m / nu
        nusselt_forced = forced_rule.evaluate({"Re": reynolds, "Pr": pr})
        if collect_warnings:
            notes += forced_rule.excursions({"Re": reynolds, "RePr": reynolds * pr}, windy)
        nusselt_natural_on_length = h_natural * length_m / k
        h_mixed = mixing_rule.evaluate({"NuF": nusselt_forced, "NuN": nusselt_natural_on_length}) * k / length_m
        if collect_warnings:
            # Gr/Re² on the common length: natural and forced both matter between the record's bounds
            with np.errstate(divide="ignore", invalid="ignore"):
                richardson = buoyancy_per_m3 * length_m**3 * alpha / nu / np.maximum(reynolds, 1e-300) ** 2
            notes += mixing_rule.notices({"Gr/Re2": richardson}, windy & (delta_k > _LOW_RA_MIN_DELTA_K))
        h = np.where(windy, h_mixed, h_natural)
    else:
        h = h_natural

    warnings = []
    if collect_warnings:
        total = h.size

        def cases(mask):
            count = int(np.count_nonzero(mask))
            return count, (f" in {count} of {total} cases" if total > 1 else "")

        from pipeins.notes import note

        for mask, what, consequence in notes:
            count, where = cases(mask)
            if count:
                warnings.append(note("film.outer.range", what=what, where=where, consequence=consequence))
        count, where = cases((film_temp_c < TEMP_RANGE_C[0]) | (film_temp_c > TEMP_RANGE_C[1]))
        if count:
            warnings.append(note("film.outer.air_table_range", low_c=(TEMP_RANGE_C[0], "temperature"),
                                 high_c=(TEMP_RANGE_C[1], "temperature"), where=where))
    return h, warnings


def outer_convection_coefficient(
    surface_temp_c,
    air_temp_c,
    characteristic_length_m,
    wind_speed_m_s=0.0,
    orientation="horizontal",
    height_m=None,
    pressure_pa=101325.0,
    geometry="cylinder",
) -> np.ndarray:
    r"""Convective film coefficient on the outer surface [W/(m²·K)].

    Natural convection with air properties at the film temperature
    :math:`T_f = (T_s + T_a)/2`, :math:`\beta = 1/T_f` (ideal gas) and

    .. math::
        Ra_L = \frac{g\,\beta\,|T_s - T_a|\,L^3}{\nu\,\alpha}

    With wind, forced convection (:math:`Re = V L/\nu`) is combined with natural as
    :math:`Nu^3 = Nu_F^3 + Nu_N^3`.  See the module docstring for which correlation
    and length each geometry/orientation uses.  At :math:`T_s = T_a` the result is
    finite: each natural correlation takes its :math:`Ra \to 0` limit.

    Parameters
    ----------
    surface_temp_c : float or array_like
        Outer surface temperature [°C].
    air_temp_c : float or array_like
        Ambient air temperature [°C].
    characteristic_length_m : float or array_like
        Outer diameter [m] for a cylinder or a sphere; area/perimeter [m] for a top or
        bottom face; flow length [m] for wind along any flat face.  Greater than 0.
    wind_speed_m_s : float or array_like, optional
        Wind speed [m/s], 0 or more (0 = still air).
    orientation : str, optional
        ``"horizontal"`` or ``"vertical"`` for a cylinder; ``"vertical"``, ``"top"``
        or ``"bottom"`` for a flat face; ``"any"`` for a sphere (:data:`GEOMETRIES`).
    height_m : float or array_like, optional
        Height of a vertical run or face [m]; required (> 0) when orientation is
        ``"vertical"``, ignored otherwise.
    pressure_pa : float or array_like, optional
        Air pressure [Pa] (site altitude), greater than 0.
    geometry : {"cylinder", "flat", "sphere"}, optional
        Pipe or round duct (cylinder), face (flat), or sphere.

    Returns
    -------
    numpy.ndarray
        :math:`h_c` [W/(m²·K)], all array inputs broadcast together.

    Raises
    ------
    InputError
        Unknown geometry or orientation, missing or non-positive ``--height`` for a
        vertical run, negative ``--wind``, non-positive length or pressure.

    References
    ----------
    Churchill & Chu (1975a, b); Popiel, Wojtkowiak & Bober (2007); McAdams (1954);
    Churchill (1983); Churchill & Bernstein (1977); Whitaker (1972); Churchill (1977).
    See :mod:`pipeins.physics.convection` for equations and
    :mod:`pipeins.physics.correlations` for the ranges and sources.

    Examples
    --------
    A 150 mm jacket at 120 °C in still air at 15 °C:

    >>> round(float(outer_convection_coefficient(120.0, 15.0, 0.15)), 2)
    6.62
    >>> outer_convection_coefficient([40.0, 60.0], 20.0, 0.2, wind_speed_m_s=[0.0, 3.0]).round(2)
    array([ 4.17, 15.32])

    A 2.5 m sphere at 60 °C in still air at 15 °C:

    >>> round(float(outer_convection_coefficient(60.0, 15.0, 2.5, orientation="any", geometry="sphere")), 2)
    4.43
    """
    h, _ = _outer_film(
        surface_temp_c, air_temp_c, characteristic_length_m, wind_speed_m_s, orientation, height_m, pressure_pa, geometry,
        collect_warnings=False,
    )
    return h


def outer_convection_warnings(
    surface_temp_c,
    air_temp_c,
    characteristic_length_m,
    wind_speed_m_s=0.0,
    orientation="horizontal",
    height_m=None,
    pressure_pa=101325.0,
    geometry="cylinder",
) -> list[str]:
    """Validity warnings for :func:`outer_convection_coefficient` with the same arguments.

    Each line names the excursion, how many cases have it and what was done (the
    correlations all extrapolate smoothly, so no case is refused).  Low-Rayleigh
    warnings are suppressed where :math:`|T_s - T_a|` is 1 K or less: there the film
    coefficient barely matters to the heat flow.

    Returns
    -------
    list of Note
        Structured notes (:class:`pipeins.notes.Note`; the report layer writes them):
        ``film.outer.range`` (a group beyond a record's range, or the mixed regime; its
        words from the record) and ``film.outer.air_table_range`` (a film temperature beyond
        the air table; it cites temperatures).  Empty when every case is inside the validity
        of the correlations used.

    Examples
    --------
    >>> outer_convection_warnings(120.0, 15.0, 0.15)
    []
    >>> (found,) = outer_convection_warnings(60.0, 20.0, 5.0, orientation="top", geometry="flat")
    >>> found.code, found.word("what"), found.word("consequence")
    ('film.outer.range', 'Rayleigh number above 1e11 on a horizontal face (enhanced case)', 'beyond the McAdams range; extrapolated')
    """
    _, warnings = _outer_film(
        surface_temp_c, air_temp_c, characteristic_length_m, wind_speed_m_s, orientation, height_m, pressure_pa, geometry,
        collect_warnings=True,
    )
    return warnings
