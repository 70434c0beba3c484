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

Forced and natural contributions are combined as Nu³ = Nu_F³ + Nu_N³ on a common
length (:func:`pipeins.physics.convection.nusselt_mixed_churchill`); with no wind the
natural value is used alone.
"""

from __future__ import annotations

import numpy as np

from pipeins.errors import InputError
from pipeins.physics import convection as cv

__all__ = [
    "STANDARD_GRAVITY_M_S2",
    "GEOMETRIES",
    "outer_convection_coefficient",
    "outer_convection_warnings",
]

#: Standard acceleration of gravity [m/s²] (CGPM 1901, exact).
STANDARD_GRAVITY_M_S2 = 9.80665
#: Valid orientations for each geometry.
GEOMETRIES = {"cylinder": ("horizontal", "vertical"), "flat": ("vertical", "top", "bottom")}

_LOW_RA_MIN_DELTA_K = 1.0  # low-Rayleigh warnings only where |Ts - Ta| exceeds this


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
        raise InputError("--geometry", f'unknown geometry "{geometry}"; use "cylinder" or "flat"')
    allowed = GEOMETRIES[geometry]
    if orientation not in allowed:
        names = ", ".join(f'"{x}"' for x in allowed)
        raise InputError("--orientation", f'"{orientation}" is not an orientation of a {geometry}; use {names}')

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

    vertical = orientation == "vertical"
    if vertical:
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

    notes = []  # (mask, what, consequence) for the warnings, bounds from the correlations' records
    g = cv.group_text

    natural_length_m = height_m if vertical else length_m
    rayleigh = buoyancy_per_m3 * natural_length_m**3
    if geometry == "cylinder" and not vertical:
        nusselt_natural = cv.nusselt_horizontal_cylinder_churchill_chu(rayleigh, pr)
        if collect_warnings:
            top = cv.validity("natural", "horizontal_cylinder").bound("Ra", 1)
            notes.append((rayleigh > top, f"Rayleigh number above {g(top)}",
                          "beyond the Churchill & Chu (1975) horizontal-cylinder range; extrapolated"))
    elif geometry == "cylinder":
        # Correction applied everywhere (it tends to 1 for thick cylinders): the heat flow
        # must be continuous in the surface temperature for the solver's bracket to close.
        nusselt_natural = cv.nusselt_vertical_cylinder_popiel_churchill(rayleigh, pr, height_m, length_m,
                                                                        plate_when_thick=False)
        if collect_warnings:
            thin = cv.vertical_cylinder_is_thin(rayleigh, pr, height_m, length_m)
            plate_top = cv.validity("natural", "vertical_plate").bound("Ra", 1)
            popiel = cv.validity("natural", "vertical_cylinder")
            low, high = popiel.ranges["Ra"]
            tallest = popiel.bound("H/D", 1)
            notes += [
                (~thin & (rayleigh > plate_top), f"Rayleigh number on the height above {g(plate_top)}",
                 "beyond the Churchill & Chu (1975) vertical-plate range; extrapolated"),
                (thin & (rayleigh > high), f"slender vertical cylinder with Rayleigh number on the height above {g(high)}",
                 "beyond the Popiel (2007) curvature-correction range; extrapolated"),
                (thin & (rayleigh < low) & (delta_k > _LOW_RA_MIN_DELTA_K),
                 f"slender vertical cylinder with Rayleigh number on the height below {g(low)}",
                 f"Popiel (2007) correction held at its Ra = {g(low)} value"),
                (thin & (height_m / length_m > tallest), f"vertical cylinder taller than {g(tallest)} diameters",
                 "beyond the Popiel (2007) curvature-correction range; extrapolated"),
            ]
    elif vertical:
        nusselt_natural = cv.nusselt_vertical_plate_churchill_chu(rayleigh, pr)
        if collect_warnings:
            top = cv.validity("natural", "vertical_plate").bound("Ra", 1)
            notes.append((rayleigh > top, f"Rayleigh number on the height above {g(top)}",
                          "beyond the Churchill & Chu (1975) vertical-plate range; extrapolated"))
    else:
        hot = surface_temp_c > air_temp_c
        enhanced = hot if orientation == "top" else ~hot
        nusselt_natural = np.where(
            enhanced, cv.nusselt_horizontal_plate_up_mcadams(rayleigh), cv.nusselt_horizontal_plate_down_mcadams(rayleigh)
        )
        if collect_warnings:
            big = delta_k > _LOW_RA_MIN_DELTA_K
            up_low, up_high = cv.validity("natural", "horizontal_plate_up").ranges["Ra"]
            down_low, down_high = cv.validity("natural", "horizontal_plate_down").ranges["Ra"]
            notes += [
                (enhanced & (rayleigh > up_high),
                 f"Rayleigh number above {g(up_high)} on a horizontal face (enhanced case)",
                 "beyond the McAdams range; extrapolated"),
                (enhanced & (rayleigh < up_low) & big,
                 f"Rayleigh number below {g(up_low)} on a horizontal face (enhanced case)",
                 "below the McAdams range; extrapolated"),
                (~enhanced & (rayleigh > down_high),
                 f"Rayleigh number above {g(down_high)} on a horizontal face (reduced case)",
                 "beyond the McAdams range; extrapolated"),
                (~enhanced & (rayleigh < down_low) & big,
                 f"Rayleigh number below {g(down_low)} on a horizontal face (reduced case)",
                 "below the McAdams range; extrapolated"),
            ]
    h_natural = nusselt_natural * k / natural_length_m

    windy = wind_m_s > 0.0
    if np.any(windy):
        reynolds = wind_m_s * length_m / nu
        if geometry == "cylinder":
            nusselt_forced = cv.nusselt_cylinder_crossflow_churchill_bernstein(reynolds, pr)
            if collect_warnings:
                cross = cv.validity("forced", "cylinder_crossflow")
                lowest, highest = cross.bound("RePr", 0), cross.bound("Re", 1)
                notes += [
                    (windy & (reynolds * pr < lowest), f"Re·Pr below {g(lowest)} in cross flow",
                     "below the Churchill & Bernstein (1977) range; extrapolated"),
                    (windy & (reynolds > highest), f"Reynolds number above {g(highest)} in cross flow",
                     "beyond the Churchill & Bernstein (1977) range; extrapolated"),
                ]
        else:
            nusselt_forced = cv.nusselt_flat_plate_pohlhausen_colburn(reynolds, pr)
            if collect_warnings:
                highest = cv.validity("forced", "flat_plate").bound("Re", 1)
                notes.append((windy & (reynolds > highest), f"Reynolds number above {g(highest)} along a flat face",
                              "beyond the flat-plate correlation range; extrapolated"))
        nusselt_natural_on_length = h_natural * length_m / k
        h_mixed = cv.nusselt_mixed_churchill(nusselt_forced, nusselt_natural_on_length) * k / length_m
        if collect_warnings:
            # Gr/Re² on the common length: natural and forced both matter between 0.1 and 10
            # (common practice; Incropera et al., 6th ed., sec. 9.9, puts the mixed regime at Gr/Re² ≈ 1)
            with np.errstate(divide="ignore", invalid="ignore"):
                richardson = buoyancy_per_m3 * length_m**3 * alpha / nu / np.maximum(reynolds, 1e-300) ** 2
            low, high = cv.validity("mixed", "churchill").ranges["Gr/Re2"]
            notes.append((windy & (richardson > low) & (richardson < high) & (delta_k > _LOW_RA_MIN_DELTA_K),
                          f"mixed convection (Gr/Re² between {g(low)} and {g(high)})",
                          "natural and forced combined as Nu³ = Nu_F³ + Nu_N³ (Churchill 1977); "
                          "less certain than either alone"))
        h = np.where(windy, h_mixed, h_natural)
    else:
        h = h_natural

    warnings = []
    if collect_warnings:
        outside = (film_temp_c < TEMP_RANGE_C[0]) | (film_temp_c > TEMP_RANGE_C[1])
        notes.append((outside, f"film temperature outside {TEMP_RANGE_C[0]:g} to {TEMP_RANGE_C[1]:g} °C",
                      "air properties taken at the nearer end of the table"))
        total = h.size
        for mask, what, consequence in notes:
            count = int(np.count_nonzero(mask))
            if count:
                where = f" in {count} of {total} cases" if total > 1 else ""
                warnings.append(f"outer film: {what}{where}; {consequence}")
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
        Outer diameter [m] for a cylinder; area/perimeter [m] for a top or bottom
        face; flow length [m] for wind along any flat face.  Greater than 0.
    wind_speed_m_s : float or array_like, optional
        Wind speed [m/s], 0 or more (0 = still air).
    orientation : str, optional
        ``"horizontal"`` or ``"vertical"`` for a cylinder; ``"vertical"``, ``"top"``
        or ``"bottom"`` for a flat face.
    height_m : float or array_like, optional
        Height of a vertical run or face [m]; required (> 0) when orientation is
        ``"vertical"``, ignored otherwise.
    pressure_pa : float or array_like, optional
        Air pressure [Pa] (site altitude), greater than 0.
    geometry : {"cylinder", "flat"}, optional
        Pipe (cylinder) or duct face (flat).

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
    Churchill & Bernstein (1977); Churchill (1977).  See
    :mod:`pipeins.physics.convection` for equations and ranges.

    Examples
    --------
    A 150 mm jacket at 120 °C in still air at 15 °C:

    >>> round(float(outer_convection_coefficient(120.0, 15.0, 0.15)), 2)
    6.62
    >>> outer_convection_coefficient([40.0, 60.0], 20.0, 0.2, wind_speed_m_s=[0.0, 3.0]).round(2)
    array([ 4.17, 15.32])
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
    list of str
        Empty when every case is inside the validity of the correlations used.

    Examples
    --------
    >>> outer_convection_warnings(120.0, 15.0, 0.15)
    []
    >>> outer_convection_warnings(60.0, 20.0, 5.0, orientation="top", geometry="flat")
    ['outer film: Rayleigh number above 1e11 on a horizontal face (enhanced case); beyond the McAdams range; extrapolated']
    """
    _, warnings = _outer_film(
        surface_temp_c, air_temp_c, characteristic_length_m, wind_speed_m_s, orientation, height_m, pressure_pa, geometry,
        collect_warnings=True,
    )
    return warnings
