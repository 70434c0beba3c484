"""What is being solved: the pipe, its layers, the fluid inside and the air outside.

Every numeric field takes a scalar or a numpy array; the solver broadcasts all of them
together, so one call can hold many sizes × thicknesses × conditions.  Materials are
per layer (a layer is one material over all cases).
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

import numpy as np

from .errors import InputError

__all__ = ["Pipe", "FlatWall", "Layer", "Fluid", "Surroundings", "Surface",
           "pressure_at_altitude_pa", "STANDARD_PRESSURE_PA"]

STANDARD_PRESSURE_PA = 101_325.0
ORIENTATIONS = ("horizontal", "vertical")
FACES = ("vertical", "top", "bottom")


def _positive(name: str, value, what: str, allow_zero: bool = False):
    arr = np.asarray(value, dtype=float)
    bad = ~np.isfinite(arr) | ((arr < 0) if allow_zero else (arr <= 0))
    if np.any(bad):
        first = float(np.ravel(arr)[np.argmax(np.ravel(bad))])
        limit = "zero or more" if allow_zero else "greater than zero"
        raise InputError(name, f"{what} must be {limit} (got {first:g})")
    return arr


MAX_TEMP_C = 1000.0  # the end of the air-property table


def _temperature(name: str, value):
    arr = np.asarray(value, dtype=float)
    if np.any(~np.isfinite(arr) | (arr < -273.15) | (arr > MAX_TEMP_C)):
        raise InputError(name, f"temperature must be above absolute zero (-273.15 °C) and at most {MAX_TEMP_C:g} °C")
    return arr


def pressure_at_altitude_pa(altitude_m):
    """Standard-atmosphere pressure at *altitude_m* [Pa].

    p = 101 325 · (1 − 2.25577e-5 · Z)^5.2559, ASHRAE Handbook—Fundamentals (2017),
    ch. 1, Eq. 3 (valid from −500 m to 11 000 m).

    >>> round(float(pressure_at_altitude_pa(1500.0)))
    84556
    """
    z = np.asarray(altitude_m, dtype=float)
    if np.any((z < -500) | (z > 11_000)):
        raise InputError("altitude_m", "altitude must be between -500 m and 11000 m")
    return STANDARD_PRESSURE_PA * (1 - 2.25577e-5 * z) ** 5.2559


@dataclass(frozen=True)
class Pipe:
    """A round pipe or tube: outside diameter and wall thickness [m]; wall conductivity
    [W/(m·K)] (default: carbon steel, 50)."""

    outer_diameter_m: Any
    wall_m: Any
    wall_conductivity_w_mk: Any = 50.0
    label: str = ""
    wall_material: str = "carbon steel"

    def __post_init__(self):
        od = _positive("outer_diameter_m", self.outer_diameter_m, "outside diameter")
        wall = _positive("wall_m", self.wall_m, "wall thickness")
        if np.any(wall >= od / 2):
            raise InputError("wall_m", "wall thickness must be less than half the outside diameter")
        _positive("pipe_material", self.wall_conductivity_w_mk, "wall conductivity")

    @property
    def inner_diameter_m(self):
        return np.asarray(self.outer_diameter_m, float) - 2 * np.asarray(self.wall_m, float)

    def shape(self, surroundings):
        """The :class:`~pipeins.geometry.Cylinder` of this pipe in *surroundings* (its
        orientation and, for a vertical run, height)."""
        from .geometry.cylinder import Cylinder

        return Cylinder(self.outer_diameter_m, self.wall_m, surroundings.orientation, surroundings.height_m)


@dataclass(frozen=True)
class FlatWall:
    """A flat face (duct side, tank wall): sheet thickness [m] and conductivity.

    ``length_m`` is the face's extent along the flow of air that sets natural convection
    (its height for a vertical face; area/perimeter for a horizontal one); ``face`` is
    ``"vertical"``, ``"top"`` (facing up) or ``"bottom"`` (facing down).
    """

    wall_m: Any = 0.001
    wall_conductivity_w_mk: Any = 50.0
    length_m: Any = 1.0
    face: str = "vertical"
    label: str = "flat face"
    wall_material: str = "galvanised steel sheet"

    def __post_init__(self):
        _positive("wall_m", self.wall_m, "wall thickness")
        _positive("length_m", self.length_m, "face length")
        if self.face not in FACES:
            raise InputError("face", f'unknown face "{self.face}"; use {", ".join(FACES)}')

    def shape(self, surroundings):
        """The :class:`~pipeins.geometry.Plane` of this face (its own length and facing)."""
        from .geometry.plane import Plane

        return Plane(self.length_m, self.face)


@dataclass(frozen=True)
class Layer:
    """One insulation layer: a catalogue material (see :mod:`pipeins.catalog.materials`)
    and its thickness [m] (scalar or array)."""

    material: Any
    thickness_m: Any

    def __post_init__(self):
        t = np.asarray(self.thickness_m, dtype=float)
        if np.any(~np.isfinite(t) | (t <= 0)):
            raise InputError("thickness_m", f"thickness of {self.material.name} must be greater than zero")


class BareLayer(Layer):
    """A layer at zero thickness: the build-up of a patch left bare inside an insulated
    section (a tank floor), so that every patch has the same interfaces."""

    def __init__(self, material):
        object.__setattr__(self, "material", material)
        object.__setattr__(self, "thickness_m", 0.0)


@dataclass(frozen=True)
class Fluid:
    """The fluid inside: its temperature [°C] and the inner film coefficient [W/(m²·K)].

    ``film_coefficient_w_m2k=None`` puts the bore at the fluid temperature (no inner
    film resistance), the usual assumption for liquids and condensing steam.  Use
    :func:`pipeins.flow.film_coefficient` to compute it from a flowing fluid.
    """

    temp_c: Any
    film_coefficient_w_m2k: Any = None
    name: str = ""
    #: Validity notes of the correlation that gave the film coefficient (carried into results).
    film_notes: tuple[str, ...] = ()

    def __post_init__(self):
        _temperature("fluid_temp_c", self.temp_c)
        if self.film_coefficient_w_m2k is not None:
            _positive("inner_h_w_m2k", self.film_coefficient_w_m2k, "inner film coefficient")


@dataclass(frozen=True)
class Surroundings:
    """The air and the surfaces around the pipe.

    ``surroundings_temp_c`` is the mean radiant temperature of what the pipe sees
    (default: the air temperature); ``relative_humidity_percent`` (0–100, optional)
    gives the dew point; ``orientation`` is ``"horizontal"`` or ``"vertical"`` (a vertical
    run needs ``height_m``).
    """

    air_temp_c: Any
    surroundings_temp_c: Any = None
    wind_speed_m_s: Any = 0.0
    relative_humidity_percent: Any = None
    pressure_pa: Any = STANDARD_PRESSURE_PA
    orientation: str = "horizontal"
    height_m: Any = None

    def __post_init__(self):
        _temperature("air_temp_c", self.air_temp_c)
        if self.surroundings_temp_c is not None:
            _temperature("surroundings_temp_c", self.surroundings_temp_c)
        _positive("wind_m_s", self.wind_speed_m_s, "wind speed", allow_zero=True)
        _positive("pressure_pa", self.pressure_pa, "air pressure")
        if self.relative_humidity_percent is not None:
            rh = np.asarray(self.relative_humidity_percent, dtype=float)
            if np.any(~np.isfinite(rh) | (rh <= 0) | (rh > 100)):
                raise InputError("rh_percent", "relative humidity must be above 0 and at most 100 %")
        if self.orientation not in ORIENTATIONS:
            raise InputError("orientation", f'unknown orientation "{self.orientation}"; use horizontal or vertical')
        if self.orientation == "vertical":
            if self.height_m is None:
                raise InputError("height_m", "a vertical run needs its height")
            _positive("height_m", self.height_m, "height")

    @property
    def radiant_temp_c(self):
        return self.air_temp_c if self.surroundings_temp_c is None else self.surroundings_temp_c


@dataclass(frozen=True)
class Surface:
    """The outer surface: its emittance (0 < ε ≤ 1), the kind of surface for touch limits
    (``bare_metal``, ``metal_jacket``, ``non_metallic``), or a fixed combined outer
    coefficient [W/(m²·K)] that replaces the convection correlations and radiation."""

    emittance: Any = 0.9
    name: str = "painted or plastic jacket"
    surface_kind: str = "non_metallic"
    fixed_coefficient_w_m2k: Any = None
    extra: dict = field(default_factory=dict, compare=False)

    def __post_init__(self):
        e = np.asarray(self.emittance, dtype=float)
        if np.any(~np.isfinite(e) | (e <= 0) | (e > 1)):
            raise InputError("emittance", "emittance must be above 0 and at most 1")
        if self.fixed_coefficient_w_m2k is not None:
            _positive("outer_h_w_m2k", self.fixed_coefficient_w_m2k, "outer coefficient")

    @classmethod
    def from_finish(cls, finish) -> "Surface":
        """From a catalogue :class:`~pipeins.catalog.finishes.Finish`."""
        return cls(finish.emittance, finish.name, finish.surface_kind)
