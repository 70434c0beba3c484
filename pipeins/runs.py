"""Along a run and over time: placeholder until the run model lands."""

from __future__ import annotations


def run_extras(spec, result, units):
    return [], {}, []
