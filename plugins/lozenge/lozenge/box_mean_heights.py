"""Exact expected plane partition of a box hexagon (uniform or q ** volume): E[h(r, s)] for every column.

The column height is not a sum of tile probabilities along a path, so it
needs the law of a count of tiles (docs/references.md, "Mean plane
partition of a box"). In the coordinates of
:func:`frostline.lozenge.tiles.tiles_of_plane_partition`, column (k, l) of
height h has its cube top at the type-0 lozenge (k - h, l + h). The tops of
the columns (k + t, l - t) lie on the same line x + y = k + l, at positions
s = h(k + t, l - t) - t, and since heights do not increase with t, exactly
M = min(a - 1 - k, l) of them (those with t > 0) come before column (k, l)'s
own top. So

    h(k, l) > z  <=>  N_z <= M,  N_z = number of type-0 lozenges on the line with x >= k - z,

and E[h(k, l)] = sum_{z < c} P(N_z <= M). Type-0 lozenges form a determinantal
process (Kenyon, "Local statistics of lattice dimers", 1997: P(e_1 ... e_m)
= prod K(e_i) det K^-1(w_i, b_j)), so the count in a set S has generating
function E[x^N] = det(I + (x - 1) L_S), L_uv = K(b_u, w_u) K^-1(w_u, b_v), the
product of (1 - lambda + lambda x) over the eigenvalues lambda of L_S.
"""
from __future__ import annotations

from typing import Any

import numpy as np

from frostline.exact.local_statistics import kasteleyn_inverse
from frostline.progress import report


def count_laws(kernel: np.ndarray, tolerance: float) -> list:
    """laws[j][m] = P(m of the first j points): the Poisson-binomial of the eigenvalues of kernel[:j, :j]."""
    laws = [np.ones(1)]
    for j in range(1, len(kernel) + 1):
        law = np.ones(1, dtype=complex)
        for lam in np.linalg.eigvals(kernel[:j, :j]):
            law = np.convolve(law, [1.0 - lam, lam])
        real = law.real
        if np.max(np.abs(law.imag), initial=0.0) > tolerance or real.min() < -tolerance \
                or abs(real.sum() - 1.0) > tolerance:
            raise ValueError(f"floating point cannot give the law of a count of {j} tiles within {tolerance:g}; "
                             "use a smaller box")
        laws.append(np.clip(real, 0.0, 1.0))
    return laws


def box_mean_heights(region: Any, tolerance: float = 1e-6) -> np.ndarray:
    """E[h] (float, shape (a, b), the layout of ``Sample.heights``) of the box ``region``, exactly up to
    floating point (checked against ``tolerance``; see the module docstring)."""
    a, b, c = region.a, region.b, region.c
    if a == 0 or b == 0:
        return np.zeros((a, b))
    system, inverse, _ = kasteleyn_inverse(region, tolerance)
    k_matrix, tiles, rows, cols = system["matrix"], system["tiles"], system["rows"], system["cols"]
    tops = np.flatnonzero(tiles[:, 2] == 0)
    diagonal = tiles[tops, 0] + tiles[tops, 1]
    mean = np.zeros((a, b))
    lines = np.unique(diagonal)
    for done, d in enumerate(lines):
        report("mean plane partition, lines done", done, len(lines))
        on = tops[diagonal == d]
        on = on[np.argsort(-tiles[on, 0], kind="stable")]     # largest x first: the prefixes are {x >= k - z}
        r, w = rows[on], cols[on]
        kernel = k_matrix[r, w][:, None] * inverse[w][:, r]
        laws = count_laws(kernel, tolerance)
        below = [np.cumsum(law) for law in laws]
        xs = tiles[on, 0]
        for k in range(max(0, d - b + 1), min(a, d + 1)):
            l = d - k
            m = min(a - 1 - k, l)
            prefix = np.count_nonzero(xs[None, :] >= (k - np.arange(c))[:, None], axis=1)
            mean[k, l] = sum(float(below[j][m]) if m < len(below[j]) else 1.0 for j in prefix)
    return mean[:, ::-1]   # Sample.heights[r, s] is column (k, l) = (r, b - 1 - s)
