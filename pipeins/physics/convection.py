"""Dimensionless convection correlations: natural, forced, mixed and in-tube.

Each correlation is one function of dimensionless groups that takes scalars or numpy
arrays (broadcast together) and returns a float array.  Nothing here knows about
temperatures or air properties; :mod:`pipeins.physics.outer` and
:mod:`pipeins.physics.inner` build the groups and call these.

Inputs that cannot exist (negative Rayleigh or Reynolds numbers, non-positive Prandtl
numbers or lengths) raise :class:`pipeins.errors.InputError`.  Inputs that are merely
outside a correlation's validity are evaluated anyway (every form here extrapolates
smoothly); the callers in ``outer`` and ``inner`` report them as warning strings.

Which correlation applies to which shape, over which range and from which source is
recorded in :mod:`pipeins.physics.correlations` (the registry the films look up).
"""

from __future__ import annotations

import numpy as np

from pipeins.errors import InputError

__all__ = [
    "nusselt_horizontal_cylinder_churchill_chu",
    "nusselt_vertical_plate_churchill_chu",
    "nusselt_vertical_cylinder_popiel_churchill",
    "nusselt_horizontal_plate_up_mcadams",
    "nusselt_horizontal_plate_down_mcadams",
    "nusselt_sphere_churchill",
    "nusselt_cylinder_crossflow_churchill_bernstein",
    "nusselt_flat_plate_pohlhausen_colburn",
    "nusselt_sphere_whitaker",
    "nusselt_mixed_churchill",
    "friction_factor_smooth_filonenko",
    "nusselt_pipe_gnielinski",
    "nusselt_pipe_laminar",
    "nusselt_pipe_internal",
    "vertical_cylinder_is_thin",
    "LAMINAR_NUSSELT_CONSTANT_WALL_TEMPERATURE",
    "LAMINAR_NUSSELT_CONSTANT_HEAT_FLUX",
    "REYNOLDS_LAMINAR_LIMIT",
    "REYNOLDS_TURBULENT_LIMIT",
    "REYNOLDS_PLATE_TRANSITION",
]

#: Fully developed laminar Nusselt number, circular tube, uniform wall temperature
#: (Shah & London 1978; Incropera 6th ed. Eq. 8.55).
LAMINAR_NUSSELT_CONSTANT_WALL_TEMPERATURE = 3.66
#: Fully developed laminar Nusselt number, circular tube, uniform wall heat flux,
#: exactly 48/11 (Shah & London 1978; Incropera 6th ed. Eq. 8.53).
LAMINAR_NUSSELT_CONSTANT_HEAT_FLUX = 48.0 / 11.0
#: Upper end of fully laminar pipe flow used by :func:`nusselt_pipe_internal`.
REYNOLDS_LAMINAR_LIMIT = 2300.0
#: Lower end of fully turbulent pipe flow used by :func:`nusselt_pipe_internal`.
REYNOLDS_TURBULENT_LIMIT = 1.0e4
#: Critical Reynolds number of a flat plate boundary layer (Incropera 6th ed. Eq. 7.38).
REYNOLDS_PLATE_TRANSITION = 5.0e5


def _nonnegative(value, name):
    value = np.asarray(value, dtype=float)
    if np.any(value < 0.0) or np.any(np.isnan(value)):
        raise InputError(name, "must be a number of 0 or more")
    return value


def _positive(value, name):
    value = np.asarray(value, dtype=float)
    if not np.all(value > 0.0):
        raise InputError(name, "must be a number greater than 0")
    return value


# --------------------------------------------------------------------------- natural


def nusselt_horizontal_cylinder_churchill_chu(rayleigh, prandtl):
    r"""Mean Nusselt number of an isothermal horizontal cylinder in free convection.

    .. math::
        Nu_D = \left[0.60 + \frac{0.387\,Ra_D^{1/6}}
               {\left[1 + (0.559/Pr)^{9/16}\right]^{8/27}}\right]^2

    Parameters
    ----------
    rayleigh : float or array_like
        Rayleigh number on the outer diameter, :math:`Ra_D` [-], 0 or more.
    prandtl : float or array_like
        Prandtl number at the film temperature [-], greater than 0.

    Returns
    -------
    numpy.ndarray
        :math:`Nu_D` [-]; at :math:`Ra_D = 0` it takes its limit 0.36.

    Notes
    -----
    Validity: :math:`10^{-5} \le Ra_D \le 10^{12}`, all Pr.  A single expression
    spans the laminar and turbulent regimes.

    References
    ----------
    Churchill, S. W. and Chu, H. H. S. (1975), "Correlating equations for laminar and
    turbulent free convection from a horizontal cylinder", Int. J. Heat Mass Transfer
    18(9):1049-1053, Eq. (10).  Incropera, DeWitt, Bergman & Lavine, *Fundamentals of
    Heat and Mass Transfer*, 6th ed. (2007), Eq. 9.34.

    Examples
    --------
    >>> round(float(nusselt_horizontal_cylinder_churchill_chu(5.0e6, 0.70)), 2)
    23.01
    """
    rayleigh = _nonnegative(rayleigh, "rayleigh")
    prandtl = _positive(prandtl, "prandtl")
    shape = (1.0 + (0.559 / prandtl) ** (9.0 / 16.0)) ** (8.0 / 27.0)
    return (0.60 + 0.387 * rayleigh ** (1.0 / 6.0) / shape) ** 2


def nusselt_vertical_plate_churchill_chu(rayleigh, prandtl):
    r"""Mean Nusselt number of an isothermal vertical plate in free convection.

    Full-range form (laminar and turbulent in one expression):

    .. math::
        Nu_L = \left[0.825 + \frac{0.387\,Ra_L^{1/6}}
               {\left[1 + (0.492/Pr)^{9/16}\right]^{8/27}}\right]^2

    Parameters
    ----------
    rayleigh : float or array_like
        Rayleigh number on the plate height, :math:`Ra_L` [-], 0 or more.
    prandtl : float or array_like
        Prandtl number at the film temperature [-], greater than 0.

    Returns
    -------
    numpy.ndarray
        :math:`Nu_L` [-]; at :math:`Ra_L = 0` it takes its limit 0.825² = 0.681.

    Notes
    -----
    Validity: :math:`10^{-1} \le Ra_L \le 10^{12}`, all Pr.

    References
    ----------
    Churchill, S. W. and Chu, H. H. S. (1975), "Correlating equations for laminar and
    turbulent free convection from a vertical plate", Int. J. Heat Mass Transfer
    18(11):1323-1329, Eq. (4).  Incropera et al., 6th ed. (2007), Eq. 9.26.

    Examples
    --------
    >>> round(float(nusselt_vertical_plate_churchill_chu(1.0e9, 0.71)), 1)
    122.9
    """
    rayleigh = _nonnegative(rayleigh, "rayleigh")
    prandtl = _positive(prandtl, "prandtl")
    shape = (1.0 + (0.492 / prandtl) ** (9.0 / 16.0)) ** (8.0 / 27.0)
    return (0.825 + 0.387 * rayleigh ** (1.0 / 6.0) / shape) ** 2


def vertical_cylinder_is_thin(rayleigh, prandtl, height_m, diameter_m):
    r"""True where a vertical cylinder is too slender to be treated as a flat plate.

    A vertical cylinder behaves as a vertical plate of the same height when

    .. math::
        \frac{D}{L} \ge \frac{35}{Gr_L^{1/4}}, \qquad Gr_L = Ra_L / Pr

    (evaluated here as :math:`(D/L)\,Gr_L^{1/4} \ge 35` so that
    :math:`Gr_L = 0` needs no division).

    Parameters
    ----------
    rayleigh : float or array_like
        Rayleigh number on the height [-].
    prandtl : float or array_like
        Prandtl number [-].
    height_m : float or array_like
        Cylinder height L [m].
    diameter_m : float or array_like
        Cylinder outer diameter D [m].

    Returns
    -------
    numpy.ndarray of bool
        True where the curvature correction is needed.

    References
    ----------
    Sparrow, E. M. and Gregg, J. L. (1956), "Laminar free convection heat transfer
    from the outer surface of a vertical circular cylinder", Trans. ASME 78:1823-1829.
    Incropera et al., 6th ed. (2007), Eq. 9.33.

    Examples
    --------
    >>> bool(vertical_cylinder_is_thin(1.0e9, 0.7, 3.0, 0.05))
    True
    >>> bool(vertical_cylinder_is_thin(1.0e9, 0.7, 3.0, 1.0))
    False
    """
    rayleigh = _nonnegative(rayleigh, "rayleigh")
    prandtl = _positive(prandtl, "prandtl")
    height_m = _positive(height_m, "height_m")
    diameter_m = _positive(diameter_m, "diameter_m")
    return (diameter_m / height_m) * (rayleigh / prandtl) ** 0.25 < 35.0


def nusselt_vertical_cylinder_popiel_churchill(rayleigh, prandtl, height_m, diameter_m, plate_when_thick=True):
    r"""Mean Nusselt number of an isothermal vertical cylinder in free convection.

    Where the cylinder is thick (:func:`vertical_cylinder_is_thin` is False) the
    vertical-plate result :func:`nusselt_vertical_plate_churchill_chu` over the height
    is returned unchanged.  Where it is slender, the plate result is multiplied by the
    curvature correction of Popiel, Wojtkowiak & Bober:

    .. math::
        \frac{Nu_L}{Nu_{L,\,plate}} = 1 + B\left[32^{0.5}\,Gr_L^{-1/4}\,
        \frac{L}{D}\right]^{C}

        B = 0.0571322 + 0.20305\,Pr^{-0.43}

        C = 0.9165 - 0.0043\,Pr^{0.5} + 0.01333\ln Pr + 0.0004809/Pr

    Parameters
    ----------
    rayleigh : float or array_like
        Rayleigh number on the height, :math:`Ra_L` [-], 0 or more.
    prandtl : float or array_like
        Prandtl number at the film temperature [-], greater than 0.
    height_m : float or array_like
        Cylinder height L [m], greater than 0.
    diameter_m : float or array_like
        Cylinder outer diameter D [m], greater than 0.
    plate_when_thick : bool, optional
        True (default): use the plain plate result where the thin-cylinder criterion
        says the cylinder is thick.  False: apply the curvature correction everywhere
        (it tends to 1 for thick cylinders), which makes the result continuous and
        monotonic in the temperature difference.

    Returns
    -------
    numpy.ndarray
        :math:`Nu_L` on the height [-].

    Notes
    -----
    Validity of the correction: :math:`10^4 \le Ra_L \le 10^9`,
    :math:`0.01 \le Pr \le 100`, :math:`L/D \le 60` (range from memory).
    Below :math:`Ra_L = 10^4` the correction is held at its value for
    :math:`Ra_L = 10^4` (it would grow without bound as :math:`Gr_L \to 0`), so the
    result stays finite at zero temperature difference.  At the thin/thick boundary
    the correction jumps by about 6 % for air (a property of the criterion, not of
    this implementation), so with ``plate_when_thick=True`` the film coefficient can
    drop by that much as the temperature difference grows across the boundary.

    References
    ----------
    Popiel, C. O., Wojtkowiak, J. and Bober, K. (2007), "Laminar free convective heat
    transfer from isothermal vertical slender cylinder", Exp. Thermal Fluid Sci.
    32(2):607-613.  Popiel, C. O. (2008), "Free convection heat transfer from vertical
    slender cylinders: a review", Heat Transfer Eng. 29(6):521-536.

    Examples
    --------
    >>> round(float(nusselt_vertical_cylinder_popiel_churchill(1.0e8, 0.71, 3.0, 0.05)), 1)
    111.2
    >>> float(nusselt_vertical_cylinder_popiel_churchill(1.0e8, 0.71, 3.0, 2.0)) == float(
    ...     nusselt_vertical_plate_churchill_chu(1.0e8, 0.71))
    True
    """
    rayleigh = _nonnegative(rayleigh, "rayleigh")
    prandtl = _positive(prandtl, "prandtl")
    height_m = _positive(height_m, "height_m")
    diameter_m = _positive(diameter_m, "diameter_m")
    plate = nusselt_vertical_plate_churchill_chu(rayleigh, prandtl)
    thin = vertical_cylinder_is_thin(rayleigh, prandtl, height_m, diameter_m)
    grashof = np.maximum(rayleigh, 1.0e4) / prandtl
    b = 0.0571322 + 0.20305 * prandtl**-0.43
    c = 0.9165 - 0.0043 * prandtl**0.5 + 0.01333 * np.log(prandtl) + 0.0004809 / prandtl
    correction = 1.0 + b * (32.0**0.5 * grashof**-0.25 * height_m / diameter_m) ** c
    if not plate_when_thick:
        return plate * correction
    return np.where(thin, plate * correction, plate)


def nusselt_horizontal_plate_up_mcadams(rayleigh):
    r"""Mean Nusselt number of a horizontal plate whose buoyant flow leaves the face.

    Applies to the upper face of a hot plate or the lower face of a cold plate
    (enhanced case).  Characteristic length L = area / perimeter.

    .. math::
        Nu_L = 0.54\,Ra_L^{1/4} \quad (Ra_L \le 10^7), \qquad
        Nu_L = 0.15\,Ra_L^{1/3} \quad (Ra_L > 10^7)

    Parameters
    ----------
    rayleigh : float or array_like
        Rayleigh number on L = area / perimeter [-], 0 or more.

    Returns
    -------
    numpy.ndarray
        :math:`Nu_L` [-]; 0 at :math:`Ra_L = 0`.

    Notes
    -----
    Validity: :math:`10^4 \le Ra_L \le 10^{11}`, :math:`Pr \ge 0.7`.  The two branches
    differ by about 6 % at the switch.

    References
    ----------
    McAdams, W. H. (1954), *Heat Transmission*, 3rd ed., McGraw-Hill, ch. 7; with the
    length A/P of Goldstein, Sparrow & Jones (1973) and Lloyd, J. R. and Moran, W. R.
    (1974), "Natural convection adjacent to horizontal surface of various planforms",
    J. Heat Transfer 96(4):443-447.  Incropera et al., 6th ed. (2007), Eqs. 9.30-9.31.

    Examples
    --------
    >>> round(float(nusselt_horizontal_plate_up_mcadams(1.0e6)), 2)
    17.08
    """
    rayleigh = _nonnegative(rayleigh, "rayleigh")
    return np.where(rayleigh <= 1.0e7, 0.54 * rayleigh**0.25, 0.15 * np.cbrt(rayleigh))


def nusselt_horizontal_plate_down_mcadams(rayleigh):
    r"""Mean Nusselt number of a horizontal plate whose buoyant flow is held against it.

    Applies to the lower face of a hot plate or the upper face of a cold plate
    (reduced case).  Characteristic length L = area / perimeter.

    .. math::
        Nu_L = 0.27\,Ra_L^{1/4}

    Parameters
    ----------
    rayleigh : float or array_like
        Rayleigh number on L = area / perimeter [-], 0 or more.

    Returns
    -------
    numpy.ndarray
        :math:`Nu_L` [-]; 0 at :math:`Ra_L = 0`.

    Notes
    -----
    Validity: :math:`10^5 \le Ra_L \le 10^{10}`, :math:`Pr \ge 0.7`.  Above
    :math:`10^{10}` the same expression is extrapolated (no jump).

    References
    ----------
    McAdams, W. H. (1954), *Heat Transmission*, 3rd ed., McGraw-Hill, ch. 7.
    Incropera et al., 6th ed. (2007), Eq. 9.32.

    Examples
    --------
    >>> round(float(nusselt_horizontal_plate_down_mcadams(1.0e8)), 2)
    27.0
    """
    rayleigh = _nonnegative(rayleigh, "rayleigh")
    return 0.27 * rayleigh**0.25


def nusselt_sphere_churchill(rayleigh, prandtl, turbulent=True):
    r"""Mean Nusselt number of an isothermal sphere in free convection.

    .. math::
        Nu_D = 2 + \frac{0.589\,Ra_D^{1/4}}{\psi^{4/9}}
               \left[1 + \frac{7.44\times10^{-8}\,Ra_D}{\psi^{16/9}}\right]^{1/12},
        \qquad \psi = 1 + (0.469/Pr)^{9/16}

    The bracket is Churchill's turbulent term; with ``turbulent=False`` it is left out,
    which is the laminar form :math:`Nu_D = 2 + 0.589\,Ra_D^{1/4}/\psi^{4/9}` quoted for
    :math:`Ra_D \le 10^{11}`, :math:`Pr \ge 0.7`.  The two agree within 0.5 % up to
    :math:`Ra_D \approx 2.5\times10^6`; above it the laminar form falls behind (by about
    37 % at :math:`Ra_D = 10^{10}`, a 1.4 m sphere 50 K above the air), where the full
    form stays close to the horizontal cylinder's Churchill & Chu value, as a turbulent
    boundary layer should.  pipeins uses the full form.

    Parameters
    ----------
    rayleigh : float or array_like
        Rayleigh number on the outer diameter, :math:`Ra_D` [-], 0 or more.
    prandtl : float or array_like
        Prandtl number at the film temperature [-], greater than 0.
    turbulent : bool, optional
        Keep the turbulent term (default) or give the laminar form.

    Returns
    -------
    numpy.ndarray
        :math:`Nu_D` [-]; 2 (conduction to still surroundings) at :math:`Ra_D = 0`.

    Notes
    -----
    Validity of the full form: :math:`Ra_D < 10^{13}`, all Pr (as the reference library
    ``ht`` documents it, checked there with the original source).

    References
    ----------
    Churchill, S. W. (1983), "Free convection around immersed bodies", in Schlünder, E. U.
    (ed.), *Heat Exchanger Design Handbook*, Hemisphere, sec. 2.5.7.  Laminar form:
    Incropera et al., 6th ed. (2007), Eq. 9.35.

    Examples
    --------
    >>> round(float(nusselt_sphere_churchill(0.7e7, 0.7)), 2)
    25.67
    >>> round(float(nusselt_sphere_churchill(0.7e7, 0.7, turbulent=False)), 2)
    25.34
    """
    rayleigh = _nonnegative(rayleigh, "rayleigh")
    prandtl = _positive(prandtl, "prandtl")
    psi = 1.0 + (0.469 / prandtl) ** (9.0 / 16.0)
    laminar = 0.589 * rayleigh**0.25 / psi ** (4.0 / 9.0)
    if not turbulent:
        return 2.0 + laminar
    return 2.0 + laminar * (1.0 + 7.44e-8 * rayleigh / psi ** (16.0 / 9.0)) ** (1.0 / 12.0)


# --------------------------------------------------------------------------- forced


def nusselt_cylinder_crossflow_churchill_bernstein(reynolds, prandtl):
    r"""Mean Nusselt number of a circular cylinder in cross flow.

    .. math::
        Nu_D = 0.3 + \frac{0.62\,Re_D^{1/2}\,Pr^{1/3}}
               {\left[1 + (0.4/Pr)^{2/3}\right]^{1/4}}
               \left[1 + \left(\frac{Re_D}{282\,000}\right)^{5/8}\right]^{4/5}

    Parameters
    ----------
    reynolds : float or array_like
        Reynolds number on the outer diameter, :math:`Re_D` [-], 0 or more.
    prandtl : float or array_like
        Prandtl number at the film temperature [-], greater than 0.

    Returns
    -------
    numpy.ndarray
        :math:`Nu_D` [-]; 0.3 at :math:`Re_D = 0`.

    Notes
    -----
    Validity: :math:`Re_D\,Pr \ge 0.2`, Re up to about :math:`10^7`.

    References
    ----------
    Churchill, S. W. and Bernstein, M. (1977), "A correlating equation for forced
    convection from gases and liquids to a circular cylinder in crossflow",
    J. Heat Transfer 99(2):300-306.  Incropera et al., 6th ed. (2007), Eq. 7.54.

    Examples
    --------
    >>> round(float(nusselt_cylinder_crossflow_churchill_bernstein(12000.0, 0.71)), 2)
    59.34
    """
    reynolds = _nonnegative(reynolds, "reynolds")
    prandtl = _positive(prandtl, "prandtl")
    shape = (1.0 + (0.4 / prandtl) ** (2.0 / 3.0)) ** 0.25
    turbulent = (1.0 + (reynolds / 282000.0) ** 0.625) ** 0.8
    return 0.3 + 0.62 * np.sqrt(reynolds) * np.cbrt(prandtl) / shape * turbulent


def nusselt_flat_plate_pohlhausen_colburn(reynolds, prandtl):
    r"""Mean Nusselt number of an isothermal flat plate in parallel flow.

    Laminar over the whole plate up to the critical Reynolds number
    :math:`Re_c = 5\times10^5`, mixed laminar/turbulent above it:

    .. math::
        Nu_L = 0.664\,Re_L^{1/2}\,Pr^{1/3} \quad (Re_L \le Re_c)

        Nu_L = \left(0.037\,Re_L^{4/5} - A\right) Pr^{1/3}, \quad
        A = 0.037\,Re_c^{4/5} - 0.664\,Re_c^{1/2} \approx 871 \quad (Re_L > Re_c)

    The second form integrates the laminar local result (Pohlhausen) up to
    :math:`Re_c` and the turbulent Colburn local result :math:`0.0296\,Re_x^{4/5}Pr^{1/3}`
    beyond it; with A computed exactly the two branches meet without a jump.

    Parameters
    ----------
    reynolds : float or array_like
        Reynolds number on the plate length in the flow direction [-], 0 or more.
    prandtl : float or array_like
        Prandtl number at the film temperature [-], greater than 0.

    Returns
    -------
    numpy.ndarray
        :math:`Nu_L` [-].

    Notes
    -----
    Validity: laminar branch :math:`Pr \ge 0.6`; mixed branch
    :math:`0.6 \le Pr \le 60`, :math:`5\times10^5 \le Re_L \le 10^8`.

    References
    ----------
    Pohlhausen, E. (1921), Z. Angew. Math. Mech. 1:115-121; Colburn, A. P. (1933),
    Trans. AIChE 29:174-210.  Incropera et al., 6th ed. (2007), Eqs. 7.30 and 7.38.

    Examples
    --------
    >>> round(float(nusselt_flat_plate_pohlhausen_colburn(1.0e5, 0.70)), 1)
    186.4
    >>> round(float(nusselt_flat_plate_pohlhausen_colburn(1.0e7, 0.70)), 0)
    12305.0
    """
    reynolds = _nonnegative(reynolds, "reynolds")
    prandtl = _positive(prandtl, "prandtl")
    re_c = REYNOLDS_PLATE_TRANSITION
    offset = 0.037 * re_c**0.8 - 0.664 * re_c**0.5
    laminar = 0.664 * np.sqrt(reynolds)
    mixed = 0.037 * reynolds**0.8 - offset
    return np.where(reynolds <= re_c, laminar, mixed) * np.cbrt(prandtl)


def nusselt_sphere_whitaker(reynolds, prandtl, viscosity_ratio=1.0):
    r"""Mean Nusselt number of a sphere in a uniform stream.

    .. math::
        Nu_D = 2 + \left(0.4\,Re_D^{1/2} + 0.06\,Re_D^{2/3}\right) Pr^{0.4}
               \left(\mu_\infty/\mu_s\right)^{1/4}

    Whitaker evaluates the properties at the free-stream temperature and the viscosity
    ratio with :math:`\mu_s` at the surface.  pipeins evaluates the outer film at the
    film temperature, like its other outer correlations, and takes the viscosity ratio
    as 1 (the default here): for air the ratio would be below 1 on a hot surface (a gas
    grows more viscous as it warms), so h is then somewhat overstated (about 7 % at a
    150 °C surface in 20 °C air), on the side of a larger heat flow.

    Parameters
    ----------
    reynolds : float or array_like
        Reynolds number on the outer diameter, :math:`Re_D` [-], 0 or more.
    prandtl : float or array_like
        Prandtl number [-], greater than 0.
    viscosity_ratio : float or array_like, optional
        :math:`\mu_\infty/\mu_s` [-], greater than 0.

    Returns
    -------
    numpy.ndarray
        :math:`Nu_D` [-]; 2 at :math:`Re_D = 0`.

    Notes
    -----
    Validity: :math:`3.5 \le Re_D \le 7.6\times10^4`, :math:`0.71 \le Pr \le 380`,
    :math:`1 \le \mu_\infty/\mu_s \le 3.2`.

    References
    ----------
    Whitaker, S. (1972), "Forced convection heat transfer correlations for flow in pipes,
    past flat plates, single cylinders, single spheres, and for flow in packed beds and
    tube bundles", AIChE J. 18(2):361-371.  Incropera et al., 6th ed. (2007), Eq. 7.56.

    Examples
    --------
    >>> round(float(nusselt_sphere_whitaker(1.0e4, 0.71)), 2)
    61.16
    """
    reynolds = _nonnegative(reynolds, "reynolds")
    prandtl = _positive(prandtl, "prandtl")
    viscosity_ratio = _positive(viscosity_ratio, "viscosity_ratio")
    return 2.0 + (0.4 * np.sqrt(reynolds) + 0.06 * reynolds ** (2.0 / 3.0)) * prandtl**0.4 * viscosity_ratio**0.25


def nusselt_mixed_churchill(nusselt_forced, nusselt_natural, exponent=3.0):
    r"""Combine forced and natural convection Nusselt numbers (assisting/transverse flow).

    .. math::
        Nu^n = Nu_F^n + Nu_N^n

    Rule used throughout pipeins: the wind is taken as transverse to (or assisting)
    the buoyant flow, so the two contributions always add with n = 3; the opposing
    case (minus sign) is not used because wind direction relative to the plume is not
    known for an outdoor pipe.  Both Nusselt numbers must refer to the same length.

    Parameters
    ----------
    nusselt_forced : float or array_like
        Forced-convection Nusselt number [-], 0 or more.
    nusselt_natural : float or array_like
        Natural-convection Nusselt number on the same length [-], 0 or more.
    exponent : float, optional
        Blending exponent n [-], 1 or more (3 for transverse and assisting flow over
        cylinders and vertical plates; 3.5 to 4 is sometimes used for plates).

    Returns
    -------
    numpy.ndarray
        Mixed-convection Nusselt number [-], never less than the larger input.

    References
    ----------
    Churchill, S. W. (1977), "A comprehensive correlating equation for laminar,
    assisting, forced and free convection", AIChE J. 23(1):10-16.
    Incropera et al., 6th ed. (2007), Eq. 9.64.

    Examples
    --------
    >>> round(float(nusselt_mixed_churchill(30.0, 20.0)), 3)
    32.711
    """
    nusselt_forced = _nonnegative(nusselt_forced, "nusselt_forced")
    nusselt_natural = _nonnegative(nusselt_natural, "nusselt_natural")
    exponent = np.asarray(exponent, dtype=float)
    if not np.all(exponent >= 1.0):
        raise InputError("exponent", "must be 1 or more")
    # scale by the larger part so that tiny or huge values neither underflow nor overflow
    larger = np.maximum(nusselt_forced, nusselt_natural)
    safe = np.where(larger > 0.0, larger, 1.0)
    ratio_sum = (nusselt_forced / safe) ** exponent + (nusselt_natural / safe) ** exponent
    return larger * ratio_sum ** (1.0 / exponent)


# --------------------------------------------------------------------------- internal


def friction_factor_smooth_filonenko(reynolds):
    r"""Darcy friction factor of a hydraulically smooth round tube, turbulent flow.

    .. math::
        f = \left(1.82\,\log_{10} Re - 1.64\right)^{-2}

    This is the form Gnielinski (1976) used inside his Nusselt correlation; it is the
    same as Petukhov's :math:`(0.790\ln Re - 1.64)^{-2}` to within 0.1 %.

    Parameters
    ----------
    reynolds : float or array_like
        Reynolds number on the inner diameter [-], greater than 1.

    Returns
    -------
    numpy.ndarray
        Darcy friction factor f [-].

    Notes
    -----
    Validity: :math:`4\times10^3 \le Re \le 10^{12}` (smooth tube).  It is also
    evaluated down to Re = 2300 by :func:`nusselt_pipe_gnielinski`, as Gnielinski did.

    References
    ----------
    Filonenko, G. K. (1954), "Hydraulic resistance in pipes", Teploenergetika 1(4):40-44
    (in Russian).  Gnielinski, V. (1976), Int. Chem. Eng. 16(2):359-368.
    Incropera et al., 6th ed. (2007), Eq. 8.21 (Petukhov form).

    Examples
    --------
    >>> round(float(friction_factor_smooth_filonenko(1.0e5)), 5)
    0.01797
    """
    reynolds = np.asarray(reynolds, dtype=float)
    if not np.all(reynolds > 1.0):
        raise InputError("reynolds", "must be greater than 1 for the turbulent friction factor")
    return (1.82 * np.log10(reynolds) - 1.64) ** -2


def nusselt_pipe_gnielinski(reynolds, prandtl):
    r"""Mean Nusselt number for turbulent flow in a smooth round tube (fully developed).

    .. math::
        Nu_D = \frac{(f/8)(Re_D - 1000)\,Pr}{1 + 12.7\,(f/8)^{1/2}\,(Pr^{2/3} - 1)}

    with f from :func:`friction_factor_smooth_filonenko`.  No entry-length or
    property-ratio correction is applied.

    Parameters
    ----------
    reynolds : float or array_like
        Reynolds number on the inner diameter [-], greater than 1000.
    prandtl : float or array_like
        Prandtl number at the bulk temperature [-], greater than 0.

    Returns
    -------
    numpy.ndarray
        :math:`Nu_D` [-].

    Notes
    -----
    Validity: :math:`3000 \le Re_D \le 5\times10^6`, :math:`0.5 \le Pr \le 2000`.

    References
    ----------
    Gnielinski, V. (1976), "New equations for heat and mass transfer in turbulent pipe
    and channel flow", Int. Chem. Eng. 16(2):359-368.  Incropera et al., 6th ed.
    (2007), Eq. 8.62.

    Examples
    --------
    >>> round(float(nusselt_pipe_gnielinski(1.0e5, 7.0)), 1)
    598.5
    """
    reynolds = np.asarray(reynolds, dtype=float)
    if not np.all(reynolds > 1000.0):
        raise InputError("reynolds", "must be greater than 1000 for the turbulent correlation")
    prandtl = _positive(prandtl, "prandtl")
    f8 = friction_factor_smooth_filonenko(reynolds) / 8.0
    return f8 * (reynolds - 1000.0) * prandtl / (1.0 + 12.7 * np.sqrt(f8) * (prandtl ** (2.0 / 3.0) - 1.0))


def nusselt_pipe_laminar(reynolds, prandtl, wall="constant_heat_flux"):
    r"""Fully developed laminar Nusselt number of a round tube.

    .. math::
        Nu_D = 48/11 \approx 4.36 \ \text{(uniform heat flux)}, \qquad
        Nu_D = 3.66 \ \text{(uniform wall temperature)}

    pipeins uses the uniform-heat-flux value by default: on an insulated pipe the
    insulation and outer film carry nearly all of the resistance (wall Biot number
    small), so the local heat flux is fixed by the outside, not by the fluid, and the
    uniform-flux limit is the closer one.  The difference only matters when the inner
    film is a noticeable part of the total resistance, which it rarely is.

    Parameters
    ----------
    reynolds : float or array_like
        Reynolds number [-], 0 or more (only its shape is used: Nu is constant).
    prandtl : float or array_like
        Prandtl number [-], greater than 0 (only its shape is used).
    wall : {"constant_heat_flux", "constant_temperature"}, optional
        Thermal boundary condition at the wall.

    Returns
    -------
    numpy.ndarray
        :math:`Nu_D` [-], broadcast to the shape of the inputs.

    Notes
    -----
    Validity: :math:`Re_D < 2300`, thermally and hydrodynamically fully developed
    flow (entry-length enhancement neglected, which under-predicts the film
    coefficient and hence slightly under-predicts the heat loss of short runs).

    References
    ----------
    Shah, R. K. and London, A. L. (1978), *Laminar Flow Forced Convection in Ducts*,
    Academic Press.  Incropera et al., 6th ed. (2007), Eqs. 8.53 and 8.55.

    Examples
    --------
    >>> round(float(nusselt_pipe_laminar(1000.0, 7.0)), 3)
    4.364
    >>> float(nusselt_pipe_laminar(1000.0, 7.0, wall="constant_temperature"))
    3.66
    """
    reynolds = _nonnegative(reynolds, "reynolds")
    prandtl = _positive(prandtl, "prandtl")
    values = {
        "constant_heat_flux": LAMINAR_NUSSELT_CONSTANT_HEAT_FLUX,
        "constant_temperature": LAMINAR_NUSSELT_CONSTANT_WALL_TEMPERATURE,
    }
    if wall not in values:
        raise InputError("wall", f'unknown wall condition "{wall}"; use "constant_heat_flux" or "constant_temperature"')
    return np.full(np.broadcast_shapes(reynolds.shape, prandtl.shape), values[wall])


def nusselt_pipe_internal(reynolds, prandtl):
    r"""Fully developed Nusselt number of a smooth round tube for any Reynolds number.

    .. math::
        Nu_D = \begin{cases}
        Nu_{lam} & Re < 2300 \\
        (1 - \gamma)\,Nu_{lam} + \gamma\,Nu_{Gn}(10^4, Pr) & 2300 \le Re < 10^4,\quad
        \gamma = \dfrac{Re - 2300}{10^4 - 2300} \\
        Nu_{Gn}(Re, Pr) & Re \ge 10^4
        \end{cases}

    :math:`Nu_{lam}` is the uniform-flux value 48/11 of :func:`nusselt_pipe_laminar`
    (fully developed, so its value at Re = 2300 is the same constant) and
    :math:`Nu_{Gn}` is :func:`nusselt_pipe_gnielinski`.  The result is continuous in
    Re.

    Parameters
    ----------
    reynolds : float or array_like
        Reynolds number on the inner diameter [-], 0 or more.
    prandtl : float or array_like
        Prandtl number at the bulk temperature [-], greater than 0.

    Returns
    -------
    numpy.ndarray
        :math:`Nu_D` [-].

    Notes
    -----
    Validity as for the parts: :math:`0.5 \le Pr \le 2000`, :math:`Re \le 5\times10^6`.

    References
    ----------
    Gnielinski, V. (1995), "Ein neues Berechnungsverfahren für die Wärmeübertragung im
    Übergangsbereich zwischen laminarer und turbulenter Rohrströmung", Forsch.
    Ingenieurwes. 61(9):240-248.  Gnielinski, V. (2013), "On heat transfer in tubes",
    Int. J. Heat Mass Transfer 63:134-140, Eq. (12).

    Examples
    --------
    >>> [round(float(x), 2) for x in nusselt_pipe_internal([1000.0, 6150.0, 1.0e5], 0.7)]
    [4.36, 17.07, 178.38]
    """
    reynolds = _nonnegative(reynolds, "reynolds")
    prandtl = _positive(prandtl, "prandtl")
    reynolds, prandtl = np.broadcast_arrays(reynolds, prandtl)
    laminar = nusselt_pipe_laminar(reynolds, prandtl)
    turbulent = nusselt_pipe_gnielinski(np.maximum(reynolds, REYNOLDS_TURBULENT_LIMIT), prandtl)
    gamma = np.clip(
        (reynolds - REYNOLDS_LAMINAR_LIMIT) / (REYNOLDS_TURBULENT_LIMIT - REYNOLDS_LAMINAR_LIMIT), 0.0, 1.0
    )
    blended = (1.0 - gamma) * laminar + gamma * turbulent
    return np.where(reynolds >= REYNOLDS_TURBULENT_LIMIT, turbulent, blended)
