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
from dataclasses import dataclass, replace
from typing import Any

import numpy as np

from .errors import InputError
from .model import Fluid, Layer, Pipe, Surface, Surroundings, STANDARD_PRESSURE_PA
from .catalog.touch import DEFAULT_TOUCH_LIMIT_C
from .solve import solve

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
            raise InputError("--velocity", f"the inner film of {fluid} needs --velocity or --flow")
        volume = flow.value_si / props.density_kg_m3 if flow.basis == "mass" else flow.value_si
        velocity_m_s = volume / area
    h = inner_film_coefficient(velocity_m_s, inner_diameter_m, props.density_kg_m3,
                               props.viscosity_pa_s, props.conductivity_w_mk, props.heat_capacity_j_kgk)
    return h, np.asarray(velocity_m_s, dtype=float)


@dataclass(frozen=True)
class LineSpec:
    """A line in the words of its specification; every number SI (temperatures in °C).

    Give the pipe as a catalogue size (``pipe="NPS 2"``, ``"DN50"``, ``"copper L 1-1/8"``,
    with ``schedule``) or by ``outer_diameter_m`` and ``wall_m``.  ``layers`` is a tuple of
    ``(material, thickness_m)`` from the inside out, where material is a catalogue name
    or ``"k=0.040"``.  The fluid temperature is ``fluid_temp_c`` or, for saturated steam,
    ``steam_pressure_pa`` (absolute).  The inner film is absent unless ``inner_h_w_m2k`` is
    given or ``fluid`` flows at ``velocity_m_s`` or ``flow``.
    """

    pipe: str | None = None
    schedule: str | None = None
    outer_diameter_m: float | None = None
    wall_m: float | None = None
    pipe_material: str | None = None
    layers: tuple[tuple[str, Any], ...] = ()
    fluid_temp_c: Any = None
    steam_pressure_pa: float | None = None
    fluid: str | None = None
    velocity_m_s: float | None = None
    flow: Any = None
    inner_h_w_m2k: float | None = None
    air_temp_c: Any = 20.0
    surroundings_temp_c: Any = None
    rh_percent: Any = None
    wind_m_s: Any = 0.0
    orientation: str = "horizontal"
    height_m: float | None = None
    pressure_pa: Any = STANDARD_PRESSURE_PA
    finish: str | None = None
    emittance: float | None = None
    outer_h_w_m2k: float | None = None
    touch_limit_c: float = DEFAULT_TOUCH_LIMIT_C
    length_m: float | None = None

    # -- the pieces -------------------------------------------------------------------
    def pipe_size(self):
        """The catalogue :class:`PipeSize` (or a custom one from the dimensions)."""
        from .catalog import pipes

        if self.pipe is not None:
            if self.outer_diameter_m is not None or self.wall_m is not None:
                raise InputError("--pipe", "give a catalogue size or --od/--wall, not both")
            return pipes.lookup_pipe(self.pipe, self.schedule)
        if self.outer_diameter_m is None or self.wall_m is None:
            raise InputError("--pipe", "give a pipe size (NPS 2, DN50, copper L 1-1/8) or both --od and --wall")
        return pipes.custom_pipe(self.outer_diameter_m, self.wall_m)

    def build_pipe(self, sizes=None) -> Pipe:
        """The pipe; with *sizes* (a list of catalogue sizes) one row per size, shape (n, 1)."""
        from .catalog.materials import default_wall_material, lookup_wall_material

        if sizes is None:
            sizes = [self.pipe_size()]
            shape = ()
        else:
            shape = (len(sizes), 1)
        wall = lookup_wall_material(self.pipe_material) if self.pipe_material else default_wall_material(sizes[0].kind)
        od = np.reshape([s.outer_diameter_m for s in sizes], shape or ())
        walls = np.reshape([s.wall_m for s in sizes], shape or ())
        label = sizes[0].label if len(sizes) == 1 else f"{sizes[0].label} to {sizes[-1].label}"
        return Pipe(od, walls, wall.conductivity_w_mk, label, wall.name)

    def build_layers(self) -> list[Layer]:
        from .catalog.materials import lookup_material

        return [Layer(lookup_material(name), thickness) for name, thickness in self.layers]

    def fluid_temperature_c(self):
        if self.steam_pressure_pa is not None:
            if self.fluid_temp_c is not None:
                raise InputError("--steam-pressure", "give the steam pressure or the fluid temperature, not both")
            from .props.steam import saturation_temp_c

            return saturation_temp_c(self.steam_pressure_pa)
        if self.fluid_temp_c is None:
            raise InputError("--fluid-temp", "the fluid temperature is missing (or give --steam-pressure)")
        return self.fluid_temp_c

    def fluid_name(self) -> str | None:
        return "steam" if self.steam_pressure_pa is not None else self.fluid

    def build_fluid(self, pipe: Pipe) -> Fluid:
        temp = self.fluid_temperature_c()
        if self.fluid and self.steam_pressure_pa is None:
            from .props.liquids import check_fluid_temp

            check_fluid_temp(self.fluid, temp)
        h = self.inner_h_w_m2k
        if h is None and self.fluid and (self.velocity_m_s is not None or self.flow is not None):
            if self.steam_pressure_pa is not None:
                raise InputError("--fluid", "condensing steam has no computed inner film; give --inner-h or none")
            h, _ = inner_film_for_flow(self.fluid, temp, pipe.inner_diameter_m, self.velocity_m_s, self.flow)
        return Fluid(temp, h, self.fluid_name() or "")

    def build_surroundings(self) -> Surroundings:
        return Surroundings(self.air_temp_c, self.surroundings_temp_c, self.wind_m_s, self.rh_percent,
                            self.pressure_pa, self.orientation, self.height_m)

    def build_surface(self, insulated: bool | None = None) -> Surface:
        """The outer surface: the finish, the emittance, or a fixed coefficient.  Without
        either, a bare pipe (no layers, unless *insulated*) is oxidised steel and an
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
            return Surface.from_finish(lookup_finish("bare_steel_oxidised"))
        return Surface()

    def build_model(self, sizes=None, insulated: bool | None = None):
        """(pipe, layers, fluid, surroundings, surface) ready for :func:`pipeins.solve.solve`."""
        pipe = self.build_pipe(sizes)
        return (pipe, self.build_layers(), self.build_fluid(pipe), self.build_surroundings(),
                self.build_surface(insulated))

    def solve(self):
        """Solve the line (arrays broadcast as in :func:`pipeins.solve.solve`)."""
        return solve(*self.build_model(), touch_limit_c=self.touch_limit_c)
