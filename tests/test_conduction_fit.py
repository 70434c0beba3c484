"""The k(T) fit of pipeins.physics.conduction without numpy.polynomial: ``polyfit`` gives the
coefficients of numpy's own ``numpy.polynomial.polynomial.polyfit`` (the reference
implementation, NumPy on PyPI) to the last bit, on every catalogue material and on random
points (hypothesis)."""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from pipeins.catalog.materials import list_materials, lookup_material
from pipeins.physics.conduction import Conductivity, polyfit


def _reference(x, y, degree):
    return np.polynomial.polynomial.polyfit(x, y, degree)


@pytest.mark.parametrize("name", [m["name"] for m in list_materials()])
def test_every_catalogue_fit_is_numpys_to_the_bit(name):
    points = np.asarray(lookup_material(name).points, dtype=float).reshape(-1, 2)
    for degree in range(1, min(2, len(points) - 1) + 1):
        ours, ref = polyfit(points[:, 0], points[:, 1], degree), _reference(points[:, 0], points[:, 1], degree)
        assert ours.dtype == ref.dtype and ours.shape == ref.shape
        assert np.array_equal(ours, ref), (name, degree, ours, ref)


@settings(max_examples=200, deadline=None)
@given(st.lists(st.tuples(st.floats(-200, 1200, allow_nan=False), st.floats(0.005, 2.0, allow_nan=False)),
                min_size=2, max_size=9, unique_by=lambda p: round(p[0], 3)),
       st.integers(1, 3))
def test_random_points_fit_as_numpy_does(points, degree):
    pts = np.asarray(points, dtype=float)
    degree = min(degree, len(pts) - 1)
    assert np.array_equal(polyfit(pts[:, 0], pts[:, 1], degree), _reference(pts[:, 0], pts[:, 1], degree))


def test_rank_loss_warns_as_numpy_does():
    x, y = np.array([1.0, 1.0, 1.0]), np.array([0.03, 0.04, 0.05])
    with pytest.warns(np.exceptions.RankWarning):
        _reference(x, y, 2)
    with pytest.warns(np.exceptions.RankWarning):
        ours = polyfit(x, y, 2)
    with pytest.warns(np.exceptions.RankWarning):
        assert np.array_equal(ours, _reference(x, y, 2))


def test_fitted_conductivity_of_three_points():
    """Three points, a quadratic through them exactly (a check against the points themselves)."""
    k = Conductivity.from_points([(10, 0.033), (50, 0.037), (100, 0.043)], -20, 250)
    assert [round(float(k.conductivity(t)), 12) for t in (10, 50, 100)] == [0.033, 0.037, 0.043]
