"""The bare line: one definition for every command.

"Bare" in pipeins always means the same thing: the pipe with no insulation layer and no
jacket, its outer surface the pipe's own material as installed.  The wall-material
catalogue (``tables/wall_materials.csv``) names for each material the finish row of
``tables/finishes.csv`` that describes its bare surface (carbon steel: "carbon steel, bare,
oxidised"; copper: "copper, oxidised"; stainless steel: "stainless steel, weathered";
plastics: "plastic pipe, bare"), so the emittance has one source, and the touch kind of
the bare pipe (bare metal or non-metallic). The
film coefficients follow from the surroundings as for any other surface; a fixed outer
coefficient given by the user is kept (it replaces convection and radiation on both).

``check`` (a line with no layer), ``size --min-reduction`` (the reduction is measured
against this line), ``cost`` and ``schedule`` all call :func:`bare_surface` or
:func:`solve_bare`.
"""

from __future__ import annotations

from dataclasses import replace

from .model import Pipe, Surface

__all__ = ["bare_surface", "bare_line", "solve_bare"]


def bare_surface(pipe: Pipe | str, surface: Surface | None = None) -> Surface:
    """The outer surface of the bare line of *pipe*.

    Parameters
    ----------
    pipe : Pipe or str
        The pipe (its ``wall_material`` is used) or a wall-material name or key.
    surface : Surface, optional
        The insulated line's surface; only a fixed outer coefficient is carried over.

    Returns
    -------
    Surface
        Emittance [-] (of the material's bare finish row) and touch kind of the bare pipe, labelled
        ``"bare <material> pipe"``.

    Examples
    --------
    >>> s = bare_surface("copper")
    >>> s.emittance, s.surface_kind, s.name
    (0.65, 'bare_metal', 'bare copper pipe')
    """
    from .catalog.finishes import lookup_finish
    from .catalog.materials import lookup_wall_material

    if getattr(pipe, "bare_finish", None):  # a duct, face or vessel: its sheet's bare finish
        finish = lookup_finish(pipe.bare_finish)
        out = Surface(finish.emittance, f"bare {pipe.wall_material}", finish.surface_kind,
                      solar_absorptance=finish.solar_absorptance)
        if surface is not None and surface.fixed_coefficient_w_m2k is not None:
            out = replace(out, fixed_coefficient_w_m2k=surface.fixed_coefficient_w_m2k, name="fixed outer coefficient")
        return out
    name = pipe.wall_material if isinstance(pipe, Pipe) else pipe
    wall = lookup_wall_material(name)
    finish = lookup_finish(wall.bare_finish)
    out = Surface(finish.emittance, f"bare {wall.name} pipe", wall.surface_kind,
                  solar_absorptance=finish.solar_absorptance)
    if surface is not None and surface.fixed_coefficient_w_m2k is not None:
        out = replace(out, fixed_coefficient_w_m2k=surface.fixed_coefficient_w_m2k, name="fixed outer coefficient")
    return out


def bare_line(pipe: Pipe, surface: Surface | None = None) -> tuple[list, Surface]:
    """The layers (an empty list) and the outer surface of the bare line of *pipe*:
    ``layers, bare = bare_line(pipe)``, then ``solve(pipe, layers, fluid, air, bare)``."""
    return [], bare_surface(pipe, surface)


def solve_bare(pipe: Pipe, fluid, surroundings, surface: Surface | None = None, **kwargs):
    """Solve the bare line of *pipe* (see :func:`bare_surface`); keyword arguments go to
    :func:`pipeins.solve.solve`."""
    from .solve import solve

    layers, bare = bare_line(pipe, surface)
    return solve(pipe, layers, fluid, surroundings, bare, **kwargs)
