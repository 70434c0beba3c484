"""The inside air film of a duct, from the air velocity or the volume flow.

Air properties come from the shipped air table (:func:`pipeins.props.air.air_properties`,
CoolProp's dry air tabulated once; no CoolProp import here) at the bulk air temperature.
The Reynolds number is formed on the hydraulic diameter D_h = 4A/P and the Nusselt
number is, for every shape,

.. math::
    Nu_{D_h} = \\begin{cases}
    Nu_{lam}(\\alpha) & Re < 2300 \\\\
    (1-\\gamma)\\,Nu_{lam}(\\alpha) + \\gamma\\,Nu_{Gn}(10^4, Pr) & 2300 \\le Re < 10^4,
    \\ \\gamma = (Re - 2300)/(10^4 - 2300) \\\\
    Nu_{Gn}(Re, Pr) & Re \\ge 10^4
    \\end{cases}

* :math:`Nu_{Gn}` is Gnielinski's turbulent correlation with the smooth-tube friction factor
  of Filonenko (:func:`pipeins.physics.convection.nusselt_pipe_gnielinski`), applied on the
  hydraulic diameter: for turbulent flow in rectangular ducts the round-tube correlation on
  D_h holds to about ±10 % (Incropera et al., 6th ed., §8.8; Shah and Bhatti in Kakaç,
  Shah and Aung, *Handbook of Single-Phase Convective Heat Transfer*, 1987, ch. 4, from
  memory).
* :math:`Nu_{lam}` is the fully developed value: 48/11 for a round duct (uniform heat flux,
  as for pipes) and for a rectangle with side ratio α = short/long the H1 value (uniform axial
  heat flux, uniform wall temperature round the perimeter — a metal sheet conducts round
  the section) of Shah and London (1978), Eq. for the rectangular duct, from memory:
  :math:`Nu_{H1} = 8.235(1 - 2.0421\\alpha + 3.0853\\alpha^2 - 2.4765\\alpha^3 + 1.0578\\alpha^4
  - 0.1861\\alpha^5)` — 3.61 for a square, 5.33 at 1:4, 6.49 at 1:8 (Incropera et al., 6th ed.,
  Table 8.1).
* The transition is the linear blend in Re of Gnielinski (1995, 2013 Eq. 12) that the pipe
  film uses, so the film is continuous in the flow.  Entry-length enhancement is neglected
  (the film is a little low near a fitting; the insulation and outer film carry almost all
  of the resistance anyway).

Dry air is assumed: moisture raises c_p by 1–2 % in ordinary HVAC air and changes the film
by less than that.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np

from pipeins.errors import InputError

__all__ = ["DuctInnerFilm", "hydraulic_diameter_m", "duct_area_m2", "nusselt_rectangular_duct_laminar_shah_london",
           "nusselt_duct_internal", "air_velocity_m_s", "duct_inner_film", "LAMINAR_NUSSELT_ROUND"]

#: Fully developed laminar Nusselt number of a round duct, uniform heat flux (48/11).
LAMINAR_NUSSELT_ROUND = 48.0 / 11.0
_RE_LAMINAR = 2300.0
_RE_TURBULENT = 1.0e4


def _positive(value, name, what):
    value = np.asarray(value, dtype=float)
    if not np.all(np.isfinite(value) & (value > 0.0)):
        raise InputError(name, f"must be greater than 0 {what}")
    return value


def _sides(width_m, height_m):
    width = _positive(width_m, "--duct", "m (a duct side or diameter)")
    if height_m is None:
        return width, None
    return width, _positive(height_m, "--duct", "m (a duct side)")


def duct_area_m2(width_m, height_m=None):
    """Inside cross-section area [m²]: π·D²/4 for a round duct (*height_m* None), W·H else.

    Parameters
    ----------
    width_m : float or array_like
        Diameter of a round duct, or width of a rectangular one [m].
    height_m : float or array_like, optional
        Height of a rectangular duct [m]; None for a round duct.

    Examples
    --------
    >>> round(float(duct_area_m2(0.45)), 5), float(duct_area_m2(0.6, 0.4))
    (0.15904, 0.24)
    """
    width, height = _sides(width_m, height_m)
    return math.pi * width**2 / 4.0 if height is None else width * height


def hydraulic_diameter_m(width_m, height_m=None):
    """Hydraulic diameter D_h = 4A/P [m]: the diameter of a round duct, 2WH/(W + H) of a rectangle.

    Parameters
    ----------
    width_m : float or array_like
        Diameter of a round duct, or width of a rectangular one [m].
    height_m : float or array_like, optional
        Height of a rectangular duct [m]; None for a round duct.

    Examples
    --------
    >>> float(hydraulic_diameter_m(0.6, 0.4)), float(hydraulic_diameter_m(0.45))
    (0.48, 0.45)
    """
    width, height = _sides(width_m, height_m)
    return width if height is None else 2.0 * width * height / (width + height)


def nusselt_rectangular_duct_laminar_shah_london(aspect_ratio):
    r"""Fully developed laminar Nusselt number of a rectangular duct (H1 boundary condition).

    .. math::
        Nu_{H1} = 8.235\,(1 - 2.0421\alpha + 3.0853\alpha^2 - 2.4765\alpha^3
        + 1.0578\alpha^4 - 0.1861\alpha^5)

    Parameters
    ----------
    aspect_ratio : float or array_like
        Side ratio α = short side / long side [-], above 0 and at most 1 (a value above 1
        is taken as long/short and inverted).

    Returns
    -------
    numpy.ndarray
        :math:`Nu_{D_h}` [-] on the hydraulic diameter.

    Notes
    -----
    Uniform axial heat flux with a uniform wall temperature round the perimeter; 8.235 is the
    parallel-plate limit (α → 0), 3.61 the square.

    References
    ----------
    Shah, R. K. and London, A. L. (1978), *Laminar Flow Forced Convection in Ducts*,
    Academic Press (the rectangular-duct fit; from memory).  Incropera et al., 6th ed.
    (2007), Table 8.1.

    Examples
    --------
    >>> [round(float(n), 2) for n in nusselt_rectangular_duct_laminar_shah_london([1.0, 0.25, 0.125])]
    [3.61, 5.33, 6.49]
    """
    alpha = _positive(aspect_ratio, "aspect_ratio", "(short side / long side)")
    alpha = np.where(alpha > 1.0, 1.0 / alpha, alpha)
    return 8.235 * (1 - 2.0421 * alpha + 3.0853 * alpha**2 - 2.4765 * alpha**3
                    + 1.0578 * alpha**4 - 0.1861 * alpha**5)


def nusselt_duct_internal(reynolds, prandtl, aspect_ratio=None):
    r"""Fully developed Nusselt number of a smooth duct, round or rectangular, for any Re.

    Laminar below Re 2300 (48/11 for a round duct, :func:`nusselt_rectangular_duct_laminar_shah_london`
    for a rectangle), Gnielinski from Re 10⁴, linear in Re between (see the module notes).

    Parameters
    ----------
    reynolds : float or array_like
        Reynolds number on the hydraulic diameter [-], 0 or more.
    prandtl : float or array_like
        Prandtl number [-], greater than 0.
    aspect_ratio : float or array_like, optional
        Short side / long side of a rectangular duct [-]; None (or nan) for a round duct.

    Returns
    -------
    numpy.ndarray
        :math:`Nu_{D_h}` [-], continuous in Re.

    Examples
    --------
    >>> [round(float(n), 2) for n in nusselt_duct_internal([1000.0, 1.0e5], 0.71, 0.5)]
    [4.13, 180.0]
    """
    from pipeins.physics.convection import nusselt_pipe_gnielinski

    reynolds = np.asarray(reynolds, dtype=float)
    if not np.all(np.isfinite(reynolds) & (reynolds >= 0)):
        raise InputError("reynolds", "must be 0 or more")
    prandtl = _positive(prandtl, "prandtl", "")
    if aspect_ratio is None:
        laminar = np.full(np.broadcast_shapes(reynolds.shape, prandtl.shape), LAMINAR_NUSSELT_ROUND)
    else:
        ratio = np.asarray(aspect_ratio, dtype=float)
        is_round = np.isnan(ratio)
        laminar = np.where(is_round, LAMINAR_NUSSELT_ROUND,
                           nusselt_rectangular_duct_laminar_shah_london(np.where(is_round, 1.0, ratio)))
    reynolds, prandtl, laminar = np.broadcast_arrays(reynolds, prandtl, laminar)
    turbulent = nusselt_pipe_gnielinski(np.maximum(reynolds, _RE_TURBULENT), prandtl)
    gamma = np.clip((reynolds - _RE_LAMINAR) / (_RE_TURBULENT - _RE_LAMINAR), 0.0, 1.0)
    return np.where(reynolds >= _RE_TURBULENT, turbulent, (1.0 - gamma) * laminar + gamma * turbulent)


def air_velocity_m_s(flow, width_m, height_m=None, temp_c=20.0, pressure_pa=101_325.0):
    """Mean air velocity in the duct [m/s] from a flow.

    Parameters
    ----------
    flow : float, array_like or pipeins.units.Flow
        A volume flow [m³/s] (a plain number), or a :class:`~pipeins.units.Flow` read from
        text (``parse_quantity("2000 m3/h", "flow")``, ``"1200 cfm"``, or a mass flow
        ``"0.5 kg/s"``, turned into volume with the air density at *temp_c*, *pressure_pa*).
    width_m, height_m : float or array_like
        Duct diameter (round, *height_m* None) or width and height [m].
    temp_c : float or array_like
        Air temperature [°C] (for a mass flow's density).
    pressure_pa : float or array_like
        Absolute air pressure [Pa].

    Raises
    ------
    InputError
        ``flow`` not greater than zero.

    Examples
    --------
    >>> from pipeins.units import parse_quantity
    >>> round(float(air_velocity_m_s(parse_quantity("3600 m3/h", "flow"), 0.5, 0.4)), 3)
    5.0
    """
    basis = getattr(flow, "basis", "volume")
    value = np.asarray(getattr(flow, "value_si", flow), dtype=float)
    if not np.all(np.isfinite(value) & (value > 0)):
        raise InputError("flow", "the duct air flow must be greater than zero")
    if basis == "mass":
        from pipeins.props.air import air_properties

        value = value / air_properties(temp_c, pressure_pa).density_kg_m3
    return value / duct_area_m2(width_m, height_m)


@dataclass
class DuctInnerFilm:
    """The inside film of a duct; every field an array of the broadcast case shape.

    Attributes
    ----------
    h_w_m2k : numpy.ndarray
        Film coefficient [W/(m²·K)] on the inside surface.
    velocity_m_s : numpy.ndarray
        Mean air velocity [m/s].
    hydraulic_diameter_m : numpy.ndarray
        D_h = 4A/P [m].
    reynolds, prandtl, nusselt : numpy.ndarray
        Re and Nu on D_h, Pr at the bulk air temperature [-].
    notes : list of Note
        Validity notes (``film.duct_inner.range``: laminar or transitional flow), each once,
        with the number of cases.
    """

    h_w_m2k: np.ndarray
    velocity_m_s: np.ndarray
    hydraulic_diameter_m: np.ndarray
    reynolds: np.ndarray
    prandtl: np.ndarray
    nusselt: np.ndarray
    notes: list = field(default_factory=list)


def duct_inner_film(width_m, height_m=None, air_temp_c=20.0, *, velocity_m_s=None, flow=None,
                    pressure_pa=101_325.0) -> DuctInnerFilm:
    """Inside film coefficient of air flowing in a round or rectangular duct [W/(m²·K)].

    h = Nu(Re, Pr, α)·k / D_h with :func:`nusselt_duct_internal`, Re = ρ·V·D_h/μ, and the air's
    ρ, μ, k, Pr from :func:`pipeins.props.air.air_properties` at the bulk air temperature.

    Parameters
    ----------
    width_m : float or array_like
        Diameter of a round duct, or width of a rectangular one [m].
    height_m : float or array_like, optional
        Height of a rectangular duct [m]; None for a round duct.
    air_temp_c : float or array_like
        Bulk air temperature in the duct [°C].
    velocity_m_s : float or array_like, optional
        Mean air velocity [m/s], greater than 0.
    flow : float, array_like or pipeins.units.Flow, optional
        Volume flow [m³/s] or a Flow (volume or mass); exactly one of *velocity_m_s* and
        *flow* is given.
    pressure_pa : float or array_like
        Absolute air pressure [Pa].

    Returns
    -------
    DuctInnerFilm

    Raises
    ------
    InputError
        Neither or both of velocity and flow; a velocity, flow or side not greater than 0.

    Examples
    --------
    Supply air at 14 °C, 5 m/s in a 600 x 400 mm duct:

    >>> film = duct_inner_film(0.6, 0.4, 14.0, velocity_m_s=5.0)
    >>> round(float(film.reynolds)), round(float(film.h_w_m2k), 2)
    (164777, 14.11)
    """
    from pipeins.props.air import air_properties

    if (velocity_m_s is None) == (flow is None):
        raise InputError("velocity_m_s", "give the duct air velocity or the air flow (one of them)")
    if velocity_m_s is not None:
        velocity = _positive(velocity_m_s, "velocity_m_s", "m/s (still air has no forced inside film)")
    else:
        velocity = air_velocity_m_s(flow, width_m, height_m, air_temp_c, pressure_pa)
    d_h = hydraulic_diameter_m(width_m, height_m)
    ratio = None
    if height_m is not None:
        width, height = _sides(width_m, height_m)
        ratio = np.minimum(width, height) / np.maximum(width, height)
    props = air_properties(air_temp_c, pressure_pa)
    reynolds = props.density_kg_m3 * velocity * d_h / props.viscosity_pa_s
    nusselt = nusselt_duct_internal(reynolds, props.prandtl, ratio)
    h = nusselt * props.conductivity_w_mk / d_h
    reynolds, prandtl, nusselt, h = np.broadcast_arrays(reynolds, props.prandtl, nusselt, h)
    return DuctInnerFilm(np.array(h), np.broadcast_to(velocity, h.shape).copy(),
                         np.broadcast_to(d_h, h.shape).copy(), np.array(reynolds), np.array(prandtl),
                         np.array(nusselt), _notes(reynolds))


def _notes(reynolds) -> list:
    """``film.duct_inner.range`` notes (:class:`pipeins.notes.Note`): laminar or transitional air."""
    from ..notes import note

    total = reynolds.size
    out = []
    for mask, what, consequence in (
            (reynolds < _RE_LAMINAR, "laminar air flow (Re below 2300)",
             "fully developed Nu used, entry-length enhancement neglected"),
            ((reynolds >= _RE_LAMINAR) & (reynolds < _RE_TURBULENT), "transitional air flow (Re 2300 to 10000)",
             "Gnielinski (1995) interpolation used")):
        count = int(np.count_nonzero(mask))
        if count:
            out.append(note("film.duct_inner.range", what=what, consequence=consequence,
                            where=f" in {count} of {total} cases" if total > 1 else ""))
    return out
