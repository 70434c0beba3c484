"""Shapes behind one small protocol (:mod:`pipeins.geometry.base`): cylinder, plane, sphere.

:func:`shape_of` gives the shape of a model section (``Pipe``, ``FlatWall``, ``Sphere``)
in its surroundings; the solver uses only the protocol.
"""

from __future__ import annotations

from .base import BASES, Network, Shape
from .cylinder import Cylinder
from .plane import Plane

__all__ = ["Shape", "Network", "BASES", "Cylinder", "Plane", "SHAPES", "shape_of"]

#: Every shape by its correlation-key name.
SHAPES = {"cylinder": Cylinder, "flat": Plane}


def shape_of(section, surroundings) -> Shape:
    """The :class:`Shape` of *section* (anything with ``shape(surroundings)``)."""
    return section.shape(surroundings)
