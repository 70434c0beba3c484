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

__all__ = ["Pipe", "FlatWall", "RoundDuct", "RectangularDuct", "VesselSection", "Layer", "BareLayer", "Fluid", "Surroundings", "Surface",
           "pressure_at_altitude_pa", "STANDARD_PRESSURE_PA"]

STANDARD_PRESSURE_PA = 101_325.0
#: Largest solar irradiance taken [W/m²]: above the solar constant (about 1361 W/m²,
#: Kopp & Lean 2011) with a margin; clear-sky irradiance at the ground is near 1000 W/m².
MAX_SOLAR_W_M2 = 1400.0
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
    #: Finish key of the bare sheet (tables/finishes.csv), for the bare line.
    bare_finish: str = "galvanised_new"

    def __post_init__(self):
        _positive("wall_m", self.wall_m, "wall thickness")
        _positive("length_m", self.length_m, "face length")
        if self.face not in FACES:
            raise InputError("face", f'unknown face "{self.face}"; use {", ".join(FACES)}')

    kind = "face"
    basis = "W/m²"

    def shape(self, surroundings):
        """The :class:`~pipeins.geometry.Plane` of this face (its own length and facing)."""
        from .geometry.plane import Plane

        return Plane(self.length_m, self.face)

    def patches(self, surroundings):
        """One patch: the face, taken as facing the sun (absorbing on its whole area) when it
        faces up or sideways; a face looking down gets no sun."""
        from .geometry.section import single_patch

        return single_patch("face", self.shape(surroundings), sun_factor=0.0 if self.face == "bottom" else 1.0)


@dataclass(frozen=True)
class RoundDuct:
    """A round sheet-metal duct: outside diameter and sheet thickness [m], sheet conductivity.

    One cylinder patch, heat flow per metre of run (W/m); the sun is absorbed on the
    projected area (1/π of the surface).
    """

    outer_diameter_m: Any
    wall_m: Any = 0.0008
    wall_conductivity_w_mk: Any = 50.0
    label: str = "round duct"
    wall_material: str = "galvanised steel sheet"
    bare_finish: str = "galvanised_new"

    kind = "round duct"
    basis = "W/m"

    def __post_init__(self):
        od = _positive("outer_diameter_m", self.outer_diameter_m, "duct diameter")
        wall = _positive("wall_m", self.wall_m, "sheet thickness")
        if np.any(wall >= od / 2):
            raise InputError("wall_m", "sheet thickness must be less than half the duct diameter")
        _positive("wall_material", self.wall_conductivity_w_mk, "sheet conductivity")

    @property
    def inner_diameter_m(self):
        return np.asarray(self.outer_diameter_m, float) - 2 * np.asarray(self.wall_m, float)

    @property
    def hydraulic_diameter_m(self):
        return self.inner_diameter_m

    def shape(self, surroundings):
        from .geometry.cylinder import Cylinder

        return Cylinder(self.outer_diameter_m, self.wall_m, surroundings.orientation, surroundings.height_m)

    def patches(self, surroundings):
        from .geometry.section import single_patch

        return single_patch("duct", self.shape(surroundings), sun_factor=1.0 / np.pi)


#: Largest side ratio of a rectangular duct the per-face model takes (common practice:
#: rectangular ducts are made up to about 1:8; flatter ones behave as two plates).
MAX_DUCT_ASPECT = 8.0


@dataclass(frozen=True)
class RectangularDuct:
    """A rectangular sheet-metal duct: outside width and height [m], sheet thickness [m].

    Four patches, heat flow per metre of run (W/m).  A horizontal run has a top (facing
    up), two sides (vertical, film height = the duct height) and a bottom (facing down);
    the horizontal faces' film length is half their width (area/perimeter of a long
    strip, McAdams 1954) and the wind's flow length is each face's own width.  A vertical
    run has four vertical faces on the run height.  Each face is a
    :class:`~pipeins.geometry.strip.Strip` whose layers widen at the corners (ISO 12241
    mean perimeter).  The sun is taken overhead on a horizontal run (the top absorbs it,
    sides and bottom none) and normal to one wide side of a vertical run.
    """

    width_m: Any
    height_m: Any
    wall_m: Any = 0.0008
    wall_conductivity_w_mk: Any = 50.0
    label: str = "rectangular duct"
    wall_material: str = "galvanised steel sheet"
    bare_finish: str = "galvanised_new"

    kind = "rectangular duct"
    basis = "W/m"

    def __post_init__(self):
        w = _positive("width_m", self.width_m, "duct width")
        h = _positive("height_m", self.height_m, "duct height")
        _positive("wall_m", self.wall_m, "sheet thickness")
        _positive("wall_material", self.wall_conductivity_w_mk, "sheet conductivity")
        ratio = np.maximum(w, h) / np.minimum(w, h)
        if np.any(ratio > MAX_DUCT_ASPECT):
            raise InputError("duct", f"side ratio {float(np.max(ratio)):.3g}:1 is beyond the 8:1 the per-face "
                             "model takes (common practice); solve a flatter duct as two faces")

    @property
    def hydraulic_diameter_m(self):
        w = np.asarray(self.width_m, float) - 2 * np.asarray(self.wall_m, float)
        h = np.asarray(self.height_m, float) - 2 * np.asarray(self.wall_m, float)
        return 2 * w * h / (w + h)

    @property
    def perimeter_m(self):
        return 2 * (np.asarray(self.width_m, float) + np.asarray(self.height_m, float))

    def patches(self, surroundings):
        from .geometry.section import Patch
        from .geometry.strip import Strip

        w, h = self.width_m, self.height_m
        if surroundings.orientation == "vertical":
            run = surroundings.height_m
            wide_first = np.all(np.asarray(w) >= np.asarray(h))
            return [Patch("wide side", Strip(w, w, "vertical", run), 1.0, 1.0 if wide_first else 0.0),
                    Patch("wide side (back)", Strip(w, w, "vertical", run), 1.0, 0.0),
                    Patch("narrow sides", Strip(h, h, "vertical", run), 1.0, 0.0 if wide_first else 1.0),
                    Patch("narrow side (back)", Strip(h, h, "vertical", run), 1.0, 0.0)]
        half = np.asarray(w, dtype=float) / 2
        return [Patch("top", Strip(w, half, "top"), 1.0, 1.0),
                Patch("sides", Strip(h, h, "vertical", h), 1.0, 0.0, count=2),
                Patch("bottom", Strip(w, half, "bottom"), 1.0, 0.0)]


@dataclass(frozen=True)
class VesselSection:
    """A sphere or a cylindrical vessel: its patches (see :mod:`pipeins.geometry.vessel`),
    heat flow for the whole vessel (W).

    ``kind`` is ``"sphere"`` or ``"vessel"``; ``orientation`` the axis of a cylindrical
    vessel; ``length_m`` its straight shell length; ``heads`` its head shape; ``floor`` the
    :class:`~pipeins.geometry.vessel.Floor` of a tank on a foundation (or None).
    """

    kind: str
    diameter_m: float
    wall_m: float
    wall_conductivity_w_mk: float
    patch_list: tuple
    label: str = "vessel"
    wall_material: str = "carbon steel"
    bare_finish: str = "steel_oxidised"
    orientation: str | None = None
    length_m: float | None = None
    heads: str | None = None
    floor: Any = None

    basis = "W"

    def patches(self, surroundings):
        return list(self.patch_list)

    def describe(self, units: str) -> str:
        from .units import format_quantity as fq

        d = fq(self.diameter_m, "length", units, digits=2)
        if self.kind == "sphere":
            return f"sphere, outside diameter {d}"
        text = (f"{self.orientation} cylindrical vessel, diameter {d}, shell length "
                f"{fq(self.length_m, 'length', units, digits=2)}")
        if self.floor is not None:
            where = "floor on its foundation" if self.floor.kind == "ground" else "bare floor, open beneath"
            roof = "flat roof" if self.heads in (None, "flat") else f"{self.heads} roof"
            return text + f", {roof}, {where}"
        return text + f", {self.heads} heads"


@dataclass(frozen=True)
class Layer:
    """One insulation layer: a catalogue material (see :mod:`pipeins.catalog.materials`)
    and its thickness [m] (scalar or array), nominal for a wrap (see
    :attr:`installed_thickness_m`)."""

    material: Any
    thickness_m: Any

    def __post_init__(self):
        t = np.asarray(self.thickness_m, dtype=float)
        if np.any(~np.isfinite(t) | (t <= 0)):
            raise InputError("thickness_m", f"thickness of {self.material.name} must be greater than zero")

    @property
    def installed_thickness_m(self):
        """The thickness the solver uses [m]: :attr:`thickness_m` as given (the nominal
        thickness a product is sold by), less the compression of a wrap as installed
        (``material.compression_percent``; duct wrap 25 %, common practice), the same
        for every other material."""
        fraction = getattr(self.material, "installed_fraction", 1.0)
        return self.thickness_m if fraction == 1.0 else np.asarray(self.thickness_m, dtype=float) * fraction


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
    film_notes: tuple = ()  # the inner film's range notes (pipeins.notes.Note)

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
    #: Solar irradiance on a surface normal to the sun [W/m²] (None: no sun).
    solar_irradiance_w_m2: Any = None

    def __post_init__(self):
        _temperature("air_temp_c", self.air_temp_c)
        if self.solar_irradiance_w_m2 is not None:
            g = _positive("solar_w_m2", self.solar_irradiance_w_m2, "solar irradiance", allow_zero=True)
            if np.any(g > MAX_SOLAR_W_M2):
                raise InputError("solar_w_m2", f"solar irradiance must be at most {MAX_SOLAR_W_M2:g} W/m² "
                                 "(the solar constant is about 1361 W/m²)")
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

    def without_sun(self) -> "Surroundings":
        """The same surroundings at night (condensation is judged without sun)."""
        from dataclasses import replace

        return self if self.solar_irradiance_w_m2 is None else replace(self, solar_irradiance_w_m2=None)


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
    #: Solar absorptance (0 to 1), used with the surroundings' solar irradiance.
    solar_absorptance: Any = None

    def __post_init__(self):
        if self.solar_absorptance is not None:
            a = np.asarray(self.solar_absorptance, dtype=float)
            if np.any(~np.isfinite(a) | (a < 0) | (a > 1)):
                raise InputError("absorptance", "solar absorptance must be from 0 to 1")
        e = np.asarray(self.emittance, dtype=float)
        if np.any(~np.isfinite(e) | (e <= 0) | (e > 1)):
            raise InputError("emittance", "emittance must be above 0 and at most 1")
        if self.fixed_coefficient_w_m2k is not None:
            _positive("outer_h_w_m2k", self.fixed_coefficient_w_m2k, "outer coefficient")

    @classmethod
    def from_finish(cls, finish) -> "Surface":
        """From a catalogue :class:`~pipeins.catalog.finishes.Finish`."""
        return cls(finish.emittance, finish.name, finish.surface_kind, solar_absorptance=finish.solar_absorptance)
