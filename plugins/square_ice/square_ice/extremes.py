"""Closed-form extreme height functions of square ice on the (n+1) x (n+1) corner grid.

Neighbouring corners differ by exactly 1, so (Thurston's formula for
difference constraints; common practice) the greatest height function is
    greatest(v) = min over border corners b of h(b) + d(b, v),
and the least is max over b of h(b) - d(b, v), where d is the graph distance,
here the Manhattan distance (the grid is a full square). Both are L1 distance
transforms, separable into one pass along columns and one along rows, each a
pair of running minima: O(n^2) in numpy, against a label-correcting search in
the general engine. When the border cannot be filled (some corner is reached
with a contradiction) the transform does not reproduce the border, and the
region falls back to the general engine, which names the place.
"""
from __future__ import annotations

from typing import Optional, Tuple

import numpy as np

_FAR = np.int64(2**40)


def _min_plus_abs(f: np.ndarray, axis: int) -> np.ndarray:
    """g[i] = min_k f[k] + |i - k| along ``axis`` (two running minima)."""
    f = np.moveaxis(f, axis, 0)
    index = np.arange(f.shape[0], dtype=np.int64).reshape(-1, *([1] * (f.ndim - 1)))
    forward = np.minimum.accumulate(f - index, axis=0) + index
    backward = np.minimum.accumulate((f + index)[::-1], axis=0)[::-1] - index
    return np.moveaxis(np.minimum(forward, backward), 0, axis)


def _greatest(border: np.ndarray, on_border: np.ndarray) -> np.ndarray:
    f = np.where(on_border, border, _FAR)
    return _min_plus_abs(_min_plus_abs(f, 0), 1)


def extremes(boundary: np.ndarray) -> Optional[Tuple[np.ndarray, np.ndarray]]:
    """(least, greatest) corner heights for this border, or None when it cannot be filled.

    ``boundary``: (n+1) x (n+1) int array whose border rows and columns hold
    the fixed heights (the interior is ignored).
    """
    h = np.asarray(boundary, dtype=np.int64)
    on_border = np.zeros(h.shape, dtype=bool)
    on_border[0, :] = on_border[-1, :] = on_border[:, 0] = on_border[:, -1] = True
    greatest = _greatest(h, on_border)
    least = -_greatest(-h, on_border)
    if not (np.array_equal(greatest[on_border], h[on_border]) and np.array_equal(least[on_border], h[on_border])):
        return None
    if np.any(least > greatest):
        return None
    return least, greatest
