"""pipeins: thermal insulation sizing for pipes and ducts.

The library is used directly from Python (a notebook, a script) as well as through the
``pipeins`` command.  The main entry points:

* :class:`pipeins.LineSpec`: a line described by catalogue names, solved with
  :meth:`~pipeins.line.LineSpec.solve` (arrays of sizes, thicknesses, RH… broadcast);
* :func:`pipeins.solve`: the vectorised solver over :mod:`pipeins.model` objects
  (``pipeins.solve`` is the function; its module stays importable as
  ``from pipeins.solve import solve``);
* :mod:`pipeins.sizing`: the least thickness meeting each criterion.

Bad input raises :class:`pipeins.InputError` naming the input and what is allowed.
Heavy modules load on first use, so ``import pipeins`` stays cheap.

>>> import pipeins
>>> callable(pipeins.solve) and pipeins.solve.__name__
'solve'
"""

from __future__ import annotations

import importlib
import sys
import types

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


class _Package(types.ModuleType):
    """The package module.  Importing the submodule ``pipeins.solve`` would bind the name
    ``solve`` on the package to that module (Python's import system does so for every
    submodule); here the function of the same name is bound instead, so ``pipeins.solve``
    and ``from pipeins import solve`` are always the solver function, while
    ``from pipeins.solve import …`` still reads the module through ``sys.modules``."""

    def __setattr__(self, name, value):
        if name in _FUNCTIONS and isinstance(value, types.ModuleType):
            value = getattr(value, name)
        super().__setattr__(name, value)


#: Names that are both a submodule and the function it exports.
_FUNCTIONS = ("solve",)
sys.modules[__name__].__class__ = _Package
