"""Building many small objects at once (a long line list, its results, its report).

Python's cyclic garbage collector runs every few hundred new container objects and walks
every live one each time it reaches the oldest generation: over a 100,000-line schedule
that is a quarter of the run.  The objects built here form no reference cycles, so
reference counting frees them all the same; :func:`paused_gc` turns the collector off for
the build and back on after it, as it was.
"""

from __future__ import annotations

import gc
from contextlib import contextmanager

__all__ = ["paused_gc"]


@contextmanager
def paused_gc():
    """Run the block with the cyclic garbage collector off; restore it after (nests).

    >>> import gc
    >>> with paused_gc():
    ...     gc.isenabled()
    False
    >>> gc.isenabled()
    True
    """
    was_enabled = gc.isenabled()
    gc.disable()
    try:
        yield
    finally:
        if was_enabled:
            gc.enable()
