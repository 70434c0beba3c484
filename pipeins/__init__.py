"""pipeins: thermal insulation sizing for pipes and ducts.

The library is used directly from Python (a notebook, a script) as well as through the
``pipeins`` command.  The main entry points:

* :class:`pipeins.line.LineSpec`: a line described by catalogue names, solved with
  :meth:`~pipeins.line.LineSpec.solve`;
* :func:`pipeins.solve.solve`: the vectorised solver over :mod:`pipeins.model` objects;
* :mod:`pipeins.sizing`: the least thickness meeting each criterion.

Bad input raises :class:`pipeins.InputError` naming the input and what is allowed.
Heavy modules load on first use, so ``import pipeins`` stays cheap.
"""

from __future__ import annotations

import importlib

from .errors import InputError

__version__ = "0.1.0"
__all__ = ["InputError", "LineSpec", "solve", "Pipe", "FlatWall", "Layer", "Fluid", "Surroundings",
           "Surface", "__version__"]

_LAZY = {
    "LineSpec": "pipeins.line",
    "solve": "pipeins.solve",
    "Pipe": "pipeins.model",
    "FlatWall": "pipeins.model",
    "Layer": "pipeins.model",
    "Fluid": "pipeins.model",
    "Surroundings": "pipeins.model",
    "Surface": "pipeins.model",
}


def __getattr__(name):
    if name in _LAZY:
        return getattr(importlib.import_module(_LAZY[name]), name)
    raise AttributeError(f"module 'pipeins' has no attribute {name!r}")
