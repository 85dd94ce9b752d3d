"""Exact expected plane partition of a box hexagon (uniform or q ** volume): E[h(r, s)] for every column.

The column height is not a sum of tile probabilities along a path, so it
needs the law of a count of tiles (docs/references.md, "Mean plane
partition of a box"). In the coordinates of
:func:`frostline.lozenge.tiles.tiles_of_plane_partition`, column (k, l) of
height h has its cube top at the type-0 lozenge (k - h, l + h). The tops of
the columns (k + t, l - t) lie on the same line x + y = k + l, at positions
s = h(k + t, l - t) - t, and since heights do not increase with t, exactly
M = min(a - 1 - k, l) of them (those with t > 0) come before column (k, l)'s
own top. (In these coordinates h does not increase with k and does not
decrease with l, so h(k + t, l - t) does not increase with t, and the
positions s fall strictly as t grows.) So

    h(k, l) > z  <=>  N_z <= M,  N_z = number of type-0 lozenges on the line with x >= k - z,

and E[h(k, l)] = sum_{z < c} P(N_z <= M). Type-0 lozenges form a determinantal
process (Kenyon, "Local statistics of lattice dimers", 1997: P(e_1 ... e_m)
= prod K(e_i) det K^-1(w_i, b_j)), so the count in a set S has generating
function E[x^N] = det(I + (x - 1) L_S), L_uv = K(b_u, w_u) K^-1(w_u, b_v), the
product of (1 - lambda + lambda x) over the eigenvalues lambda of L_S.
"""
from __future__ import annotations

from typing import Any, Optional

import numpy as np

from frostline.exact.budget import DEFAULT_BUDGET_SECONDS, check_budget_argument, check_seconds
from frostline.exact.local_statistics import kasteleyn_inverse
from frostline.progress import report

# Cost model, fitted on a 2-core AMD EPYC (Zen 4): eigenvalues of every prefix of a line of r cube tops
# (about r^4 / 4 units), the per-prefix Python work (r^2), and the dense inverse of the N x N Kasteleyn
# matrix (N^3). Measured: 2x2x200 9.5 s, 3x3x100 1.6 s, 20^3 1.1 s, 30^3 5.4 s.
_EIGEN_SECONDS = 8e-9
_PREFIX_SECONDS = 1e-5
_INVERSE_SECONDS = 1.5e-10


def mean_heights_seconds(a: int, b: int, c: int) -> float:
    """Estimated seconds of :func:`box_mean_heights` on the a x b x c box (the cost model above)."""
    lengths = [min(d + 1, a, b, a + b - 1 - d) + c for d in range(a + b - 1)]  # cube tops on each line x + y = d
    n = a * b + b * c + c * a
    return (_EIGEN_SECONDS * sum(r ** 4 / 4 for r in lengths) + _PREFIX_SECONDS * sum(r * r for r in lengths)
            + _INVERSE_SECONDS * float(n) ** 3 + 1e-3)


def count_laws(kernel: np.ndarray, tolerance: float) -> list:
    """laws[j][m] = P(m of the first j points): the Poisson-binomial of the eigenvalues of kernel[:j, :j].

    Checked where floating point can fail: imaginary parts, negative
    probabilities, and the order of nested sets (a larger set holds at most m
    points less often, P(N_{j+1} <= m) <= P(N_j <= m)); ValueError beyond ``tolerance``.
    """
    laws = [np.ones(1)]
    for j in range(1, len(kernel) + 1):
        law = np.ones(1, dtype=complex)
        for lam in np.linalg.eigvals(kernel[:j, :j]):
            law = np.convolve(law, [1.0 - lam, lam])
        real = law.real
        cdf, previous = np.cumsum(real), np.cumsum(laws[-1])
        nested = np.max(cdf[:len(previous)] - previous, initial=0.0)
        if np.max(np.abs(law.imag), initial=0.0) > tolerance or real.min() < -tolerance or nested > tolerance:
            raise ValueError(f"floating point cannot give the law of a count of {j} cube tops within {tolerance:g} "
                             "(the inverse Kasteleyn matrix is too ill-conditioned); use a smaller box or q nearer 1")
        laws.append(np.clip(real, 0.0, 1.0))
    return laws


def mean_volume(a: int, b: int, c: int, q: float) -> float:
    """E[volume] = q d/dq log of MacMahon's q-analogue prod_{i,j,k} (1 - q^(s-1)) / (1 - q^(s-2)), s = i + j + k.

    Each factor contributes f(s - 2) - f(s - 1) with f(m) = m q^m / (1 - q^m); abc / 2 at q = 1.
    """
    if q == 1.0 or min(a, b, c) == 0:
        return a * b * c / 2.0
    ways = np.convolve(np.convolve(np.ones(a), np.ones(b)), np.ones(c))   # ways[s - 3] triples with sum s
    s = np.arange(3, 3 + len(ways), dtype=float)
    log_q = float(np.log(q))

    def f(m: np.ndarray) -> np.ndarray:
        return m * np.exp(m * log_q) / -np.expm1(m * log_q)

    return float(np.sum(ways * (f(s - 2) - f(s - 1))))


def box_mean_heights(region: Any, tolerance: float = 1e-6, budget: Optional[float] = DEFAULT_BUDGET_SECONDS
                     ) -> np.ndarray:
    """E[h] (float, shape (a, b), the layout of ``Sample.heights``) of the box ``region`` (see the module docstring).

    Floating point, checked: the vertex sums of the inverse Kasteleyn matrix,
    the count laws (:func:`count_laws`) and the total, which must match
    MacMahon's mean volume (:func:`mean_volume`) within ``tolerance`` per
    column; ValueError otherwise. Single columns are typically within a few
    times ``tolerance``. Refuses (ValueError, with the estimate) a run
    estimated above ``budget`` seconds (None: no cap).
    """
    a, b, c = region.a, region.b, region.c
    if a == 0 or b == 0:
        return np.zeros((a, b))
    budget = check_budget_argument(budget)
    check_seconds(mean_heights_seconds(a, b, c), budget, f"the mean plane partition of the {a}x{b}x{c} box",
                  f"{a + b - 1} lines of up to {min(a, b) + c} cube tops")
    system, inverse, _ = kasteleyn_inverse(region, tolerance)
    k_matrix, tiles, rows, cols = system["matrix"], system["tiles"], system["rows"], system["cols"]
    tops = np.flatnonzero(tiles[:, 2] == 0)
    diagonal = tiles[tops, 0] + tiles[tops, 1]
    mean = np.zeros((a, b))
    total, done = len(tops), 0
    for d in np.unique(diagonal):
        report("mean plane partition, cube tops done", done, total)
        on = tops[diagonal == d]
        done += len(on)
        on = on[np.argsort(-tiles[on, 0], kind="stable")]     # largest x first: the prefixes are {x >= k - z}
        r, w = rows[on], cols[on]
        kernel = k_matrix[r, w][:, None] * inverse[w][:, r]
        below = [np.cumsum(law) for law in count_laws(kernel, tolerance)]
        xs = tiles[on, 0]
        for k in range(max(0, d - b + 1), min(a, d + 1)):
            l = d - k
            m = min(a - 1 - k, l)
            prefix = np.count_nonzero(xs[None, :] >= (k - np.arange(c))[:, None], axis=1)
            mean[k, l] = sum(float(below[j][m]) if m < len(below[j]) else 1.0 for j in prefix)
    expected = mean_volume(a, b, c, region.q)
    if not abs(mean.sum() - expected) <= tolerance * a * b:
        raise ValueError(f"the mean plane partition sums to {mean.sum():.9g} cubes, MacMahon's formula gives "
                         f"{expected:.9g}: floating point is not accurate enough here (tolerance {tolerance:g} per "
                         "column); use a smaller box or q nearer 1")
    return mean[:, ::-1]   # Sample.heights[r, s] is column (k, l) = (r, b - 1 - s)
