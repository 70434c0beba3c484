"""One line as an engineer describes it, turned into the solver's model objects.

:class:`LineSpec` holds what the command line or a project file says about a line, in SI
and by catalogue name: the pipe size or its dimensions, the layers, the fluid (or the
steam pressure), the surroundings and the finish.  :meth:`LineSpec.solve` builds the
:mod:`pipeins.model` objects and calls :func:`pipeins.solve.solve`.  Notebook users can
use it directly or build the model objects themselves.

>>> spec = LineSpec(pipe="NPS 2", layers=(("mineral wool", 0.040),), fluid_temp_c=150.0,
...                 air_temp_c=20.0, finish="aluminium, bright")
>>> result = spec.solve()
>>> 15 < float(result.heat_flow_w_per_m) < 40
True
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass, replace
from typing import Any

import numpy as np

from .errors import InputError
from .model import Fluid, Layer, Pipe, Surface, Surroundings, STANDARD_PRESSURE_PA
from .catalog.touch import DEFAULT_TOUCH_LIMIT_C
__all__ = ["LineSpec", "inner_film_for_flow"]


def inner_film_for_flow(fluid: str, temp_c, inner_diameter_m, velocity_m_s=None, flow=None):
    """Inner film coefficient [W/(m²·K)] and mean velocity [m/s] of *fluid* flowing at
    *velocity_m_s* or at *flow* (a :class:`pipeins.units.Flow`, mass or volume)."""
    from .physics.inner import inner_film_coefficient
    from .props.liquids import fluid_properties

    props = fluid_properties(fluid, temp_c)
    area = math.pi * np.asarray(inner_diameter_m) ** 2 / 4
    if velocity_m_s is None:
        if flow is None:
            raise InputError("velocity_m_s", f"the inner film of {fluid} needs the velocity or the flow")
        volume = flow.value_si / props.density_kg_m3 if flow.basis == "mass" else flow.value_si
        velocity_m_s = volume / area
    h = inner_film_coefficient(velocity_m_s, inner_diameter_m, props.density_kg_m3,
                               props.viscosity_pa_s, props.conductivity_w_mk, props.heat_capacity_j_kgk)
    return h, np.asarray(velocity_m_s, dtype=float)


#: Numeric fields of :class:`LineSpec`: (unit shown in hints, example value, upper bound
#: or None, what the bound guards against).  Every one takes a number or an array.
NUMERIC_FIELDS = {
    "outer_diameter_m": ("m", 0.0603, 2.0),
    "wall_m": ("m", 0.0039, 2.0),
    "fluid_temp_c": ("°C", 150.0, None),
    "steam_pressure_pa": ("Pa absolute", 1.1e6, None),
    "velocity_m_s": ("m/s", 1.5, None),
    "inner_h_w_m2k": ("W/(m²·K)", 1000.0, None),
    "air_temp_c": ("°C", 20.0, None),
    "surroundings_temp_c": ("°C", 20.0, None),
    "rh_percent": ("%", 80.0, None),
    "wind_m_s": ("m/s", 3.0, None),
    "height_m": ("m", 6.0, None),
    "pressure_pa": ("Pa", 101325.0, None),
    "emittance": ("(0 to 1)", 0.9, None),
    "outer_h_w_m2k": ("W/(m²·K)", 10.0, None),
    "touch_limit_c": ("°C", 60.0, None),
    "length_m": ("m", 120.0, None),
    "sphere_diameter_m": ("m", 2.5, 100.0),
    "vessel_diameter_m": ("m", 3.0, 100.0),
    "solar_w_m2": ("W/m²", 800.0, None),
    "absorptance": ("(0 to 1)", 0.6, None),
}
#: Section kinds by the field that gives them.
SECTION_FIELDS = {"duct": "duct", "face": "face", "sphere_diameter_m": "sphere", "vessel": "vessel"}
#: Face words (the outward normal) → the flat face's facing.
FACE_WORDS = {"vertical": "vertical", "up": "top", "down": "bottom"}
#: The largest layer thickness, outside diameter or wall [m] taken as meant: more is
#: almost always a number in millimetres given as metres.
MAX_THICKNESS_M = 2.0


def _text_hint(name: str, value: str, unit: str, example) -> InputError:
    return InputError(name, f'"{value}" is text; give the number in {unit}, e.g. {name}={example!r} '
                            "(pipeins.units.parse_quantity reads text with units)")


def _number_or_array(name: str, value, unit: str, example, upper=None):
    """*value* as a float (scalar) or a float array, finite, or an InputError naming *name*."""
    if isinstance(value, str) or (isinstance(value, np.ndarray) and value.dtype.kind in "USO"
                                  and any(isinstance(v, str) for v in np.ravel(value))):
        shown = value if isinstance(value, str) else next(v for v in np.ravel(value) if isinstance(v, str))
        raise _text_hint(name, shown, unit, example)
    if isinstance(value, (list, tuple)) and any(isinstance(v, str) for v in np.ravel(np.asarray(value, dtype=object))):
        shown = next(v for v in np.ravel(np.asarray(value, dtype=object)) if isinstance(v, str))
        raise _text_hint(name, shown, unit, example)
    if isinstance(value, bool):
        raise InputError(name, f"{value!r} is not a number; give the number in {unit}, e.g. {name}={example!r}")
    try:
        array = np.asarray(value, dtype=float)
    except (TypeError, ValueError):
        raise InputError(name, f"cannot read {value!r} as a number; give the number in {unit}, "
                               f"e.g. {name}={example!r}") from None
    if not np.all(np.isfinite(array)):
        raise InputError(name, f"must be finite (got {value!r}); give the number in {unit}")
    if upper is not None and np.any(array > upper):
        worst = float(np.max(array))
        raise InputError(name, f"{worst:g} m is more than {upper:g} m; lengths are in metres "
                               f"(did you mean {worst / 1000:g}, i.e. {worst:g} mm?)")
    return float(array) if array.ndim == 0 else array


def _layer(index: int, layer) -> tuple:
    name = f"layers[{index}]"
    if isinstance(layer, str) or not hasattr(layer, "__len__") or len(layer) != 2:
        raise InputError(name, f"give (material, thickness_m), e.g. (\"mineral wool\", 0.05); got {layer!r}")
    material, thickness = layer
    if not isinstance(material, str):
        raise InputError(name, f"the material is a catalogue name or \"k=0.040\"; got {material!r}")
    value = _number_or_array(f"{name} thickness", thickness, "m", 0.05, MAX_THICKNESS_M)
    if np.any(np.asarray(value) <= 0):
        raise InputError(f"{name} thickness", "the thickness must be greater than zero [m]")
    return (material, value)


@dataclass(frozen=True, eq=False)
class LineSpec:
    """A line in the words of its specification; every number SI (temperatures in °C).

    Give the pipe as a catalogue size (``pipe="NPS 2"``, ``"DN50"``, ``"copper L 1-1/8"``,
    with ``schedule``), an array of sizes (``pipe=["NPS 1", "NPS 2"]``), or by
    ``outer_diameter_m`` and ``wall_m``.  ``layers`` is a tuple of ``(material,
    thickness_m)`` from the inside out, where material is a catalogue name or
    ``"k=0.040"``.  The fluid temperature is ``fluid_temp_c`` or, for saturated steam,
    ``steam_pressure_pa`` (absolute).  The inner film is absent unless ``inner_h_w_m2k`` is
    given or ``fluid`` flows at ``velocity_m_s`` or ``flow``.

    Every numeric field (and each layer thickness) takes a number or an array; they
    broadcast against each other and against the array of pipe sizes, numpy style, and
    the result's arrays have the broadcast shape.  Text with units (``"150C"``), a
    thickness above 2 m (``50`` meant as mm) and other impossible values raise
    :class:`~pipeins.errors.InputError` naming the field, with a hint.

    >>> import numpy as np
    >>> spec = LineSpec(pipe=np.array(["NPS 1", "NPS 4"])[:, None],
    ...                 layers=(("mineral wool", np.array([0.025, 0.05])),),
    ...                 fluid_temp_c=150.0, air_temp_c=20.0)
    >>> spec.solve().heat_flow_w_per_m.shape
    (2, 2)
    >>> LineSpec(pipe="NPS 2", fluid_temp_c="150C")
    Traceback (most recent call last):
    ...
    pipeins.errors.InputError: fluid_temp_c: "150C" is text; give the number in °C, e.g. fluid_temp_c=150.0 (pipeins.units.parse_quantity reads text with units)
    """

    pipe: Any = None
    schedule: str | None = None
    outer_diameter_m: Any = None
    wall_m: Any = None
    pipe_material: str | None = None
    layers: tuple[tuple[str, Any], ...] = ()
    fluid_temp_c: Any = None
    steam_pressure_pa: Any = None
    fluid: str | None = None
    velocity_m_s: Any = None
    flow: Any = None
    inner_h_w_m2k: Any = None
    air_temp_c: Any = 20.0
    surroundings_temp_c: Any = None
    rh_percent: Any = None
    wind_m_s: Any = 0.0
    orientation: str = "horizontal"
    height_m: Any = None
    pressure_pa: Any = STANDARD_PRESSURE_PA
    finish: str | None = None
    emittance: Any = None
    outer_h_w_m2k: Any = None
    touch_limit_c: Any = DEFAULT_TOUCH_LIMIT_C
    length_m: Any = None
    #: Sections other than a pipe: a duct size text, a face's outward normal, a sphere's
    #: diameter [m], a cylindrical vessel's axis with its diameter [m], heads and floor.
    duct: str | None = None
    sheet: str | None = None
    face: str | None = None
    sphere_diameter_m: Any = None
    vessel: str | None = None
    vessel_diameter_m: Any = None
    heads: str | None = None
    floor: str | None = None
    #: Solar irradiance [W/m²] on a surface normal to the sun, and the surface's absorptance.
    solar_w_m2: Any = None
    absorptance: Any = None
    #: True when a front end has already read the RH by the percent rule (a value at or below
    #: 1 % was written with its % sign): the fraction guard below then stands aside.
    rh_as_written: bool = False

    def __post_init__(self):
        for name, (unit, example, upper) in NUMERIC_FIELDS.items():
            value = getattr(self, name)
            if value is not None:
                object.__setattr__(self, name, _number_or_array(name, value, unit, example, upper))
        if self.air_temp_c is None:
            raise InputError("air_temp_c", "the air temperature is missing [°C]")
        if not isinstance(self.layers, (tuple, list)):
            raise InputError("layers", "give a tuple of (material, thickness_m), e.g. ((\"mineral wool\", 0.05),)")
        object.__setattr__(self, "layers", tuple(_layer(i, layer) for i, layer in enumerate(self.layers)))
        if self.pipe is not None and not isinstance(self.pipe, str):
            names = np.asarray(self.pipe, dtype=object)
            if names.size == 0 or not all(isinstance(x, str) for x in names.ravel()):
                raise InputError("pipe", "give a catalogue size or an array of them, e.g. [\"NPS 1\", \"NPS 2\"]")
        if self.rh_percent is not None and not self.rh_as_written and np.any(np.asarray(self.rh_percent) <= 1):
            low = float(np.min(self.rh_percent))
            if low > 0:
                raise InputError("rh_percent", f"{low:g} looks like a fraction; relative humidity is in percent "
                                               f"(did you mean {low * 100:g}?)")
        if self.orientation not in ("horizontal", "vertical"):
            raise InputError("orientation", f'unknown orientation "{self.orientation}"; use horizontal or vertical')

    def shape(self) -> tuple:
        """The broadcast shape of every array input (pipe sizes included); () for one case."""
        shapes = [np.shape(getattr(self, name)) for name in NUMERIC_FIELDS if getattr(self, name) is not None]
        shapes += [np.shape(t) for _, t in self.layers]
        if self.pipe is not None and not isinstance(self.pipe, str):
            shapes.append(np.shape(self.pipe))
        try:
            return np.broadcast_shapes(*shapes)
        except ValueError:
            described = ", ".join(f"{n} {np.shape(getattr(self, n))}" for n in NUMERIC_FIELDS
                                  if np.ndim(getattr(self, n)) > 0)
            raise InputError("shape", f"the arrays do not broadcast together: {described}") from None

    # -- the pieces -------------------------------------------------------------------
    @property
    def section_kind(self) -> str:
        """"pipe", "duct", "face", "sphere" or "vessel"."""
        for name, kind in SECTION_FIELDS.items():
            if getattr(self, name) is not None:
                return kind
        return "pipe"

    def _sheet(self):
        from .catalog.ducts import DEFAULT_SHEET, lookup_sheet

        return lookup_sheet(self.sheet or DEFAULT_SHEET)

    def build_section(self):
        """The duct, face, sphere or vessel of this spec (sheet-metal wall from ``sheet``)."""
        from . import model

        sheet = self._sheet()
        wall = self.wall_m if self.wall_m is not None else None
        common = dict(wall_conductivity_w_mk=sheet.conductivity_w_mk, wall_material=f"{sheet.name} sheet",
                      bare_finish=sheet.bare_finish)
        kind = self.section_kind
        if kind == "duct":
            from .catalog.ducts import parse_duct_size

            if not re.search(r"[A-Za-z\"]", re.sub(r"(?<=\d)\s*[xX×]\s*(?=[\d.])", " ", str(self.duct))):
                raise InputError("duct", f'"{self.duct}" has no unit; write it with one: "600x400mm", "24x16in", '
                                         '"450mm"')
            size = parse_duct_size(self.duct)
            wall = 0.0008 if wall is None else wall
            if size.kind == "round":
                return model.RoundDuct(size.diameter_m, wall, label=f"round duct {self.duct}", **common)
            return model.RectangularDuct(size.width_m, size.height_m, wall, label=f"rectangular duct {self.duct}",
                                         **common)
        if kind == "face":
            facing = FACE_WORDS[self.face]
            length = self.height_m if facing == "vertical" else self.length_m
            return model.FlatWall(0.002 if wall is None else wall, length_m=length, face=facing,
                                  label=f"{self.face} face", **common)
        from .sections import build_vessel  # sphere and cylindrical vessels

        return build_vessel(self, sheet if self.sheet else None, wall)

    def section_size(self):
        """A size row for a duct, face or vessel (its label; the outside diameter of a round
        section, the perimeter over π of a rectangular duct, NaN for a face)."""
        from .catalog.pipes import PipeSize

        section = self.build_section()
        kind = section.kind
        if kind == "rectangular duct":
            od = float(section.perimeter_m) / math.pi
        elif kind == "round duct":
            od = float(section.outer_diameter_m)
        elif kind in ("sphere", "vessel"):
            od = float(section.diameter_m)
        else:
            od = float("nan")
        return PipeSize(section.label, kind, self.duct or self.face or "", None, od, float(section.wall_m))

    def pipe_size(self):
        """The catalogue :class:`PipeSize` (or a custom one from the dimensions); for an
        array of sizes, the first."""
        return self.pipe_sizes()[0]

    def pipe_sizes(self) -> list:
        """The catalogue sizes of ``pipe`` (one, or every name of an array, flattened), or a
        custom one from the dimensions."""
        from .catalog import pipes

        if self.section_kind != "pipe":
            return [self.section_size()]
        if self.pipe is not None:
            if self.outer_diameter_m is not None or self.wall_m is not None:
                raise InputError("pipe", "give a catalogue size or outer_diameter_m/wall_m, not both")
            names = [self.pipe] if isinstance(self.pipe, str) else list(np.ravel(np.asarray(self.pipe, dtype=object)))
            return [pipes.lookup_pipe(name, self.schedule) for name in names]
        if self.outer_diameter_m is None or self.wall_m is None:
            raise InputError("pipe", "give a pipe size (NPS 2, DN50, copper L 1-1/8) or both outer_diameter_m "
                                     "and wall_m")
        od, wall = np.broadcast_arrays(self.outer_diameter_m, self.wall_m)
        if od.ndim == 0:
            return [pipes.custom_pipe(float(od), float(wall))]
        return [pipes.custom_pipe(float(o), float(w)) for o, w in zip(od.ravel(), wall.ravel())]

    def build_pipe(self, sizes=None) -> Pipe:
        """The pipe; with *sizes* (a list of catalogue sizes) one row per size, shape (n, 1).
        An array of sizes in ``pipe`` keeps its own shape."""
        from .catalog.materials import default_wall_material, lookup_wall_material

        if sizes is None and self.section_kind != "pipe":
            return self.build_section()
        if self.section_kind == "duct":
            from .sections import duct_rows

            return duct_rows(self, [s.nominal for s in sizes])
        if sizes is None:
            sizes = self.pipe_sizes()
            if isinstance(self.pipe, str) or self.pipe is None:
                shape = () if self.pipe is not None or np.ndim(self.outer_diameter_m) == 0 \
                    else np.broadcast_shapes(np.shape(self.outer_diameter_m), np.shape(self.wall_m))
            else:
                shape = np.shape(self.pipe)
        else:
            shape = (len(sizes), 1)
        if self.pipe_material:
            walls_k = [lookup_wall_material(self.pipe_material)] * len(sizes)
        else:
            walls_k = [default_wall_material(s.kind) for s in sizes]
        od = np.reshape([s.outer_diameter_m for s in sizes], shape)
        walls = np.reshape([s.wall_m for s in sizes], shape)
        k = np.reshape([w.conductivity_w_mk for w in walls_k], shape)
        if np.all(k == k.flat[0]):
            k = float(k.flat[0])
        label = sizes[0].label if len(sizes) == 1 else f"{sizes[0].label} to {sizes[-1].label}"
        names = sorted({w.name for w in walls_k})
        return Pipe(od, walls, k, label, " / ".join(names))

    def build_layers(self) -> list[Layer]:
        from .catalog.materials import lookup_material

        return [Layer(lookup_material(name), thickness) for name, thickness in self.layers]

    def fluid_temperature_c(self):
        if self.steam_pressure_pa is not None:
            if self.fluid_temp_c is not None:
                raise InputError("steam_pressure_pa", "give the steam pressure or the fluid temperature, not both")
            from .props.steam import saturation_temp_c

            return saturation_temp_c(self.steam_pressure_pa)
        if self.fluid_temp_c is None:
            raise InputError("fluid_temp_c", "the fluid temperature is missing (or give steam_pressure_pa)")
        return self.fluid_temp_c

    def fluid_name(self) -> str | None:
        if self.steam_pressure_pa is not None:
            return "steam"
        if self.fluid is None and self.section_kind == "duct":
            return "air"  # the fluid of a duct is its air unless said otherwise
        return self.fluid

    def _flowing(self) -> bool:
        return self.velocity_m_s is not None or self.flow is not None

    def _duct_air_film(self, section, temp):
        """The inside air film of a duct from ``velocity_m_s`` or ``flow`` (see
        :func:`pipeins.physics.duct_inner.duct_inner_film`), on the inside dimensions."""
        from .physics.duct_inner import duct_inner_film

        if self.fluid not in (None, "air"):
            raise InputError("fluid", f'"{self.fluid}" in a duct: the inside film of a duct is worked out for air '
                                      "only; leave fluid out (air) or give inner_h_w_m2k")
        wall = np.asarray(section.wall_m, dtype=float)
        if section.kind == "round duct":
            width, height = section.inner_diameter_m, None
        else:
            width = np.asarray(section.width_m, dtype=float) - 2 * wall
            height = np.asarray(section.height_m, dtype=float) - 2 * wall
        film = duct_inner_film(width, height, temp, velocity_m_s=self.velocity_m_s, flow=self.flow,
                               pressure_pa=self.pressure_pa)
        return film.h_w_m2k, tuple(film.notes)

    def build_fluid(self, pipe: Pipe) -> Fluid:
        temp = self.fluid_temperature_c()
        kind = self.section_kind
        if kind != "pipe" and self.inner_h_w_m2k is None and self._flowing():
            if kind == "duct":
                h, notes = self._duct_air_film(pipe, temp)
                return Fluid(self._broadcast_temp(temp), h, "air", notes)
            raise InputError("flow" if self.flow is not None else "velocity_m_s",
                             f"a {kind} has no computed inside film; give the inside film coefficient "
                             "inner_h_w_m2k instead")
        if kind == "duct" and self.fluid not in (None, "air"):
            raise InputError("fluid", f'"{self.fluid}" in a duct: a duct carries air; leave fluid out or give air')
        if self.fluid and self.steam_pressure_pa is None and not (kind == "duct"):
            from .props.liquids import check_fluid_temp

            check_fluid_temp(self.fluid, temp)
        h, notes = self.inner_h_w_m2k, ()
        if h is None and self.fluid and (self.velocity_m_s is not None or self.flow is not None):
            if self.steam_pressure_pa is not None:
                raise InputError("fluid", "condensing steam has no computed inner film; give a fixed inner film "
                                          "coefficient or none")
            h, velocity = inner_film_for_flow(self.fluid, temp, pipe.inner_diameter_m, self.velocity_m_s, self.flow)
            from .physics.inner import inner_film_notes

            notes = inner_film_notes(self.fluid, temp, pipe.inner_diameter_m, velocity)
        return Fluid(self._broadcast_temp(temp), h, self.fluid_name() or "", notes)

    def _broadcast_temp(self, temp):
        shape = self.shape()
        if np.shape(temp) != shape:  # every array input broadcasts, RH included
            temp = np.broadcast_to(np.asarray(temp, dtype=float), np.broadcast_shapes(np.shape(temp), shape))
        return temp

    def build_surroundings(self) -> Surroundings:
        kind = self.section_kind
        orientation, height = self.orientation, self.height_m
        if kind in ("face", "sphere"):
            orientation, height = "horizontal", None  # a face has its own facing and film length
        elif kind == "vessel":
            orientation = self.vessel
            height = self.length_m if self.vessel == "vertical" else None
        return Surroundings(self.air_temp_c, self.surroundings_temp_c, self.wind_m_s, self.rh_percent,
                            self.pressure_pa, orientation, height, self.solar_w_m2)

    def build_surface(self, insulated: bool | None = None) -> Surface:
        surface = self._build_surface(insulated)
        if self.absorptance is not None:
            surface = replace(surface, solar_absorptance=self.absorptance)
        return surface

    def _build_surface(self, insulated: bool | None = None) -> Surface:
        """The outer surface: the finish, the emittance, or a fixed coefficient.  Without
        either, a bare pipe (no layers, unless *insulated*) is its own material
        (:func:`pipeins.bare.bare_surface`) and an
        insulated one a painted or plastic jacket (emittance 0.9)."""
        from .catalog.finishes import lookup_finish

        if self.outer_h_w_m2k is not None:
            return Surface(1.0 if self.emittance is None else self.emittance, "fixed outer coefficient",
                           fixed_coefficient_w_m2k=self.outer_h_w_m2k)
        if self.finish is not None:
            surface = Surface.from_finish(lookup_finish(self.finish))
            if self.emittance is not None:
                surface = replace(surface, emittance=self.emittance)
            return surface
        if self.emittance is not None:
            return Surface(self.emittance, "surface of given emittance")
        if not (self.layers or insulated):
            from .bare import bare_surface  # the one bare line: the pipe's own material

            return bare_surface(self.build_pipe())
        return Surface()

    def build_model(self, sizes=None, insulated: bool | None = None):
        """(pipe, layers, fluid, surroundings, surface) ready for :func:`pipeins.solve.solve`."""
        pipe = self.build_pipe(sizes)
        return (pipe, self.build_layers(), self.build_fluid(pipe), self.build_surroundings(),
                self.build_surface(insulated))

    def solve(self):
        """Solve the line (arrays broadcast as in :func:`pipeins.solve.solve`)."""
        from .solve import solve

        return solve(*self.build_model(), touch_limit_c=self.touch_limit_c)
