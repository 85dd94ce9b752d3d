"""The Lobachevsky function and the entropy of one cell of a dimer model.

L(x) = -integral_0^x log|2 sin t| dt, so L(x) = Cl_2(2x) / 2 with Clausen's
function Cl_2. Cohn, Kenyon and Propp (J. Amer. Math. Soc. 14, 2001) write the
entropy per tile of a translation-invariant dimer measure as
(1/pi) sum_k L(pi p_k) over the probabilities p_k of the edges at one vertex
(three for lozenges, four for dominoes); docs/limit_shapes.md.

Cl_2 on [0, pi] from its Bernoulli series (Abramowitz and Stegun 27.8.2):
Cl_2(t) = t - t log t + sum_{n>=1} |B_2n| t^(2n+1) / (2n (2n+1)!), converging
for t < 2 pi (ratio (t / 2 pi)^2 <= 1/4 here), and Cl_2(2 pi - t) = -Cl_2(t).
"""
from __future__ import annotations

import math
from fractions import Fraction

import numpy as np


def _bernoulli_coefficients(terms: int) -> np.ndarray:
    """|B_2n| / (2n (2n+1)!) for n = 1..terms, from the exact Bernoulli numbers."""
    # Bernoulli numbers by the Akiyama-Tanigawa recurrence, exactly in fractions
    m = 2 * terms + 1
    a = [Fraction(0)] * (m + 1)
    b = []
    for k in range(m + 1):
        a[k] = Fraction(1, k + 1)
        for j in range(k, 0, -1):
            a[j - 1] = j * (a[j - 1] - a[j])
        b.append(a[0])
    return np.array([float(abs(b[2 * n]) / (2 * n * math.factorial(2 * n + 1))) for n in range(1, terms + 1)])


_COEFFICIENTS = _bernoulli_coefficients(24)


def clausen2(theta: np.ndarray) -> np.ndarray:
    """Clausen's function Cl_2 for theta in [0, 2 pi] (float array; about 1e-16 absolute)."""
    t = np.asarray(theta, dtype=float)
    flip = t > np.pi
    u = np.where(flip, 2.0 * np.pi - t, t)
    u2 = u * u
    series = np.zeros_like(u)
    for c in _COEFFICIENTS[::-1]:
        series = series * u2 + c
    with np.errstate(divide="ignore", invalid="ignore"):
        value = u - u * np.log(u) + u * u2 * series
    value = np.where(u > 0, value, 0.0)
    return np.where(flip, -value, value)


def cell_entropy_terms(p: np.ndarray) -> np.ndarray:
    """L(pi p) / pi for probabilities p in [0, 1]: one term of the entropy per tile."""
    return clausen2(2.0 * np.pi * np.asarray(p, dtype=float)) / (2.0 * np.pi)


def entropy_parts(p: np.ndarray, q: np.ndarray, low: float, high: float) -> tuple:
    """(value, slope, curvature) of L(pi p) / pi, with q = 1 - p computed apart, extended below the floors.

    slope is d/dp = -log(2 sin(pi p)), curvature is -d^2/dp^2 = pi cot(pi p).
    Below p = ``low`` (and above p = 1 - ``high``) the function continues as
    its second-order Taylor polynomial, so the maximiser may overshoot the
    boundary of the polytope by a rounding-sized amount instead of stalling
    there; with ``high`` = k * ``low`` for cells of k edges the cell's sum stays
    concave (the sum of 1 / curvature over a cell stays negative).
    L(pi - x) = -L(x), so the upper end is the lower end mirrored in q.
    """
    lower = p <= q
    x = np.where(lower, p, q)
    floor = np.where(lower, low, high)
    xf = np.maximum(x, floor)
    value = cell_entropy_terms(xf)
    slope = -np.log(2.0 * np.sin(np.pi * xf))
    curvature = np.pi / np.tan(np.pi * xf)
    below = x < floor
    d = x - floor
    value = np.where(below, value + slope * d - 0.5 * curvature * d * d, value)
    slope = np.where(below, slope - curvature * d, slope)
    # mirror for the upper end: value -> -value, slope unchanged, curvature -> -curvature
    sign = np.where(lower, 1.0, -1.0)
    return sign * value, slope, sign * curvature
