"""Square ice: heights <-> alternating sign matrix <-> arrows <-> the six vertex types.

Heights live on the (n+1) x (n+1) corners of the n x n matrix cells; neighbours
differ by exactly 1. Domain-wall boundary: h(i, 0) = i, h(0, j) = j,
h(n, j) = n - j, h(i, n) = n - i, and h(i, j) = i + j - 2 * sum_{i'<i, j'<j} A[i', j'].

Arrows sit on the edges of the six-vertex lattice (cell centre to cell centre):
``horizontal[i, j]`` (shape (n, n+1)) is the arrow crossing the cell side
between corners (i, j) and (i+1, j): +1 points right (h rises downwards along
that side), -1 left. ``vertical[i, j]`` (shape (n+1, n)) crosses the side
between corners (i, j) and (i, j+1): +1 points up (h rises to the right), -1
down. With the domain wall, horizontal arrows point inwards and vertical ones outwards.

Vertex types of cell (i, j), from its left, right, top and bottom arrows::

    a1:  ->  ->   up    up        a2:  <-  <-   down  down
    b1:  ->  ->   down  down      b2:  <-  <-   up    up
    c1:  ->  <-   up    down      c2:  <-  ->   down  up

c1 vertices are the +1 entries of the matrix and c2 the -1 entries; a and b
are the zeros (a when the row sum from the left equals the column sum from the
top). Codes 0..5 follow the order a1, a2, b1, b2, c1, c2.
"""
from __future__ import annotations

import numpy as np

VERTEX_TYPES = ("a1", "a2", "b1", "b2", "c1", "c2")
#: (left, right, top, bottom) arrows of each type, in the order of VERTEX_TYPES
TYPE_ARROWS = np.array([(1, 1, 1, 1), (-1, -1, -1, -1), (1, 1, -1, -1), (-1, -1, 1, 1),
                        (1, -1, 1, -1), (-1, 1, -1, 1)], dtype=np.int8)


def domain_wall_boundary(n: int) -> np.ndarray:
    """The (n+1) x (n+1) height array of the domain wall with zeros inside."""
    h = np.zeros((n + 1, n + 1), dtype=np.int32)
    k = np.arange(n + 1)
    h[:, 0] = k
    h[0, :] = k
    h[n, :] = n - k
    h[:, n] = n - k
    return h


def matrix_from_heights(heights: np.ndarray) -> np.ndarray:
    """A[i, j] = (h(i, j+1) + h(i+1, j) - h(i, j) - h(i+1, j+1)) / 2, as int8."""
    h = np.asarray(heights, dtype=np.int64)
    return ((h[:-1, 1:] + h[1:, :-1] - h[:-1, :-1] - h[1:, 1:]) // 2).astype(np.int8)


def heights_from_matrix(matrix: np.ndarray) -> np.ndarray:
    """Domain-wall heights of an alternating sign matrix: h(i, j) = i + j - 2 * (corner sum)."""
    a = np.asarray(matrix, dtype=np.int64)
    n = a.shape[0]
    corner_sums = np.zeros((n + 1, n + 1), dtype=np.int64)
    corner_sums[1:, 1:] = a.cumsum(0).cumsum(1)
    i, j = np.meshgrid(np.arange(n + 1), np.arange(n + 1), indexing="ij")
    return (i + j - 2 * corner_sums).astype(np.int32)


def is_alternating_sign_matrix(matrix: np.ndarray) -> bool:
    """Entries in {-1, 0, 1}, every row and column sums to 1 and its partial sums lie in {0, 1}."""
    a = np.asarray(matrix)
    if a.ndim != 2 or a.shape[0] != a.shape[1] or not np.isin(a, (-1, 0, 1)).all():
        return False
    rows, cols = a.cumsum(1), a.cumsum(0)
    return bool(np.isin(rows, (0, 1)).all() and np.isin(cols, (0, 1)).all()
                and np.all(rows[:, -1] == 1) and np.all(cols[-1, :] == 1))


def arrows_from_heights(heights: np.ndarray):
    """(horizontal (n, n+1), vertical (n+1, n)) arrows as int8 +-1."""
    h = np.asarray(heights, dtype=np.int64)
    return (h[1:, :] - h[:-1, :]).astype(np.int8), (h[:, 1:] - h[:, :-1]).astype(np.int8)


def heights_from_arrows(horizontal: np.ndarray, vertical: np.ndarray, corner: int = 0) -> np.ndarray:
    """Heights from arrows, with h(0, 0) = corner. Raises ValueError if the arrows are not consistent."""
    hz, vt = np.asarray(horizontal, dtype=np.int64), np.asarray(vertical, dtype=np.int64)
    n = hz.shape[0]
    if hz.shape != (n, n + 1) or vt.shape != (n + 1, n):
        raise ValueError(f"need horizontal arrows of shape (n, n+1) and vertical ones of shape (n+1, n), "
                         f"got {hz.shape} and {vt.shape}")
    h = np.zeros((n + 1, n + 1), dtype=np.int64)
    h[0, 0] = corner
    h[0, 1:] = corner + np.cumsum(vt[0])
    h[1:, :] = h[0, :] + np.cumsum(hz, axis=0)
    if not np.array_equal(h[:, 1:] - h[:, :-1], vt):
        raise ValueError("the arrows do not come from a height function (the ice rule fails somewhere)")
    return h.astype(np.int32)


def vertex_types_from_arrows(horizontal: np.ndarray, vertical: np.ndarray) -> np.ndarray:
    """The (n, n) int8 array of vertex type codes (see VERTEX_TYPES)."""
    hz, vt = np.asarray(horizontal), np.asarray(vertical)
    around = np.stack([hz[:, :-1], hz[:, 1:], vt[:-1, :], vt[1:, :]], axis=-1)  # left, right, top, bottom
    match = np.all(around[:, :, None, :] == TYPE_ARROWS[None, None, :, :], axis=-1)
    if not np.all(match.any(axis=-1)):
        raise ValueError("some vertex breaks the ice rule (two arrows in, two out)")
    return np.argmax(match, axis=-1).astype(np.int8)


def arrows_from_vertex_types(types: np.ndarray):
    """Arrows from vertex types; raises ValueError where neighbouring vertices disagree."""
    t = np.asarray(types, dtype=np.int64)
    if t.min() < 0 or t.max() > 5:
        raise ValueError("vertex type codes are 0..5")
    arrows = TYPE_ARROWS[t]
    hz = np.zeros((t.shape[0], t.shape[1] + 1), dtype=np.int8)
    vt = np.zeros((t.shape[0] + 1, t.shape[1]), dtype=np.int8)
    hz[:, :-1], vt[:-1, :] = arrows[..., 0], arrows[..., 2]
    hz[:, -1], vt[-1, :] = arrows[:, -1, 1], arrows[-1, :, 3]
    if not (np.array_equal(hz[:, 1:], arrows[..., 1]) and np.array_equal(vt[1:, :], arrows[..., 3])):
        raise ValueError("neighbouring vertex types disagree about the arrow between them")
    return hz, vt


def vertex_types_from_heights(heights: np.ndarray) -> np.ndarray:
    return vertex_types_from_arrows(*arrows_from_heights(heights))
