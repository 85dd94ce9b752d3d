"""Exact counts of domino tilings: closed forms and Kasteleyn determinants."""
from __future__ import annotations

import math
from fractions import Fraction
from typing import Any, Optional

import numpy as np

from frostline._validate import integer
from frostline.exact import integer_determinant
from frostline.exact.certified import certified_log_abs_det

from .geometry import aztec_mask


def aztec_count(n: int) -> int:
    """2^(n(n+1)/2) tilings of the Aztec diamond of order n (Elkies, Kuperberg, Larsen, Propp 1992; OEIS A006125)."""
    n = integer(n, "the order n", 0, 2**24)
    return 2 ** (n * (n + 1) // 2)


def rectangle_count(m: int, n: int, *, budget: Optional[float] = None, max_digits: Optional[int] = None) -> int:
    """Domino tilings of an m x n rectangle, exactly, from the Kasteleyn / Temperley-Fisher product (1961)
    written as a resultant of two integer polynomials (:mod:`frostline.domino.rectangle_resultant`).

    Refuses (ValueError, with the estimate) more than ``max_digits`` digits or
    an estimated time above ``budget`` seconds (None: no cap).
    """
    from frostline.exact.budget import check_budget_argument, check_digits, check_seconds

    from .rectangle_resultant import rectangle_count as exact_count
    from .rectangle_resultant import resultant_seconds

    m, n = integer(m, "the rows m", 0, 2**31), integer(n, "the columns n", 0, 2**31)
    budget = check_budget_argument(budget)
    if m * n % 2:
        return 0
    if m == 0 or n == 0:
        return 1
    check_digits(0.1266 * m * n, max_digits, f"the count of the {m}x{n} rectangle")  # G/pi nats per cell
    check_seconds(resultant_seconds(m, n), budget, f"the count of the {m}x{n} rectangle",
                  f"a resultant of degrees {(min(m, n) + 1) // 2} and {(max(m, n) + 1) // 2}")
    return exact_count(m, n)


def kasteleyn_matrix(mask: np.ndarray, horizontal=None, vertical=None) -> np.ndarray:
    """Real Kasteleyn matrix: rows black cells, columns white cells (each row-major).

    Weight -1 on vertical dominoes in odd columns, +1 elsewhere (docs/references.md
    section 3), times the domino weights when given (then a float array).
    """
    R, C = mask.shape
    r, c = np.nonzero(mask)
    black = (r + c) % 2 == 0
    index = -np.ones((R, C), dtype=np.int64)
    index[r[black], c[black]] = np.arange(black.sum())
    index[r[~black], c[~black]] = np.arange((~black).sum())
    dtype = np.int64 if horizontal is None else np.float64
    k = np.zeros((int(black.sum()), int((~black).sum())), dtype=dtype)
    for dr, dc in ((0, 1), (0, -1), (1, 0), (-1, 0)):
        rb, cb = r[black], c[black]
        rw, cw = rb + dr, cb + dc
        ok = (rw >= 0) & (rw < R) & (cw >= 0) & (cw < C)
        ok[ok] = mask[rw[ok], cw[ok]]
        value = np.ones(ok.sum())
        top_r, left_c = np.minimum(rb[ok], rw[ok]), np.minimum(cb[ok], cw[ok])
        if dr != 0:
            value = np.where(cb[ok] % 2 == 1, -1.0, 1.0)
            if vertical is not None:
                value = value * vertical[top_r, cb[ok]]
        elif horizontal is not None:
            value = value * horizontal[rb[ok], left_c]
        k[index[rb[ok], cb[ok]], index[rw[ok], cw[ok]]] = value
    return k


def count_region(region, budget: Optional[float] = None, max_digits: Optional[int] = None) -> int:
    """Exact count: closed forms for Aztec diamonds and rectangles, else abs(det K) with exact integers.

    ``budget`` (seconds) and ``max_digits`` cap the cost (see frostline.exact.budget; None: no cap).
    """
    from frostline.exact.budget import check_budget_argument, check_digits

    budget = check_budget_argument(budget)
    shape = region._description.get("shape")
    if shape == "aztec diamond":
        order = region._description["order"]
        check_digits(order * (order + 1) / 2 * math.log10(2), max_digits, f"the count of the Aztec diamond {order}")
        return aztec_count(order)
    mask = region.mask
    if shape == "rectangle" or mask.all():  # a full mask is a rectangle: the closed form
        return rectangle_count(*mask.shape, budget=budget, max_digits=max_digits)
    rows, columns = mask.shape
    if rows == columns and rows % 2 == 0 and np.array_equal(mask, aztec_mask(rows // 2)):
        check_digits(rows // 2 * (rows // 2 + 1) / 2 * math.log10(2), max_digits, "the count of this Aztec diamond")
        return aztec_count(rows // 2)
    if budget is not None:  # estimate from the mask, before the matrix is built
        from frostline.exact.budget import check_seconds, determinant_seconds

        black = int(np.count_nonzero(mask[0::2, 0::2]) + np.count_nonzero(mask[1::2, 1::2]))
        # a black cell's white neighbours lie in the rows above and below at the same place: a matrix
        # row reaches about one row of cells (two rows of white cells)
        band = int(mask.sum(axis=1).max()) + 2
        check_seconds(determinant_seconds(black, band, black + 2.0), budget,
                      f"counting the tilings of this {rows}x{columns} mask by an exact determinant",
                      f"{black} rows, about {black // 31 + 1} primes, rows reaching about {band} columns")
    return abs(integer_determinant(kasteleyn_matrix(mask)))



def weighted_partition_function(region) -> Any:
    """Sum over tilings of the product of domino weights.

    Exact (``fractions.Fraction``, weights at their exact binary values) for
    Aztec diamonds by urban renewal and for other regions by an integer
    determinant after scaling the weights to integers, when that stays small;
    otherwise a float, or an ``mpmath.mpf`` when a float would overflow.
    """
    horizontal, vertical = region.weights
    if region.is_aztec_diamond:
        from .urban_renewal import aztec_partition_function

        n = region._description["order"]
        d = region._description
        if "vertical_weight" in d:  # (1 + a^2)^(n(n+1)/2), exact (docs/references.md section 1)
            return (1 + Fraction(d["vertical_weight"]) ** 2) ** (n * (n + 1) // 2)
        if n <= 16:  # exact rationals grow fast with n: beyond, the logarithm in floating point
            return aztec_partition_function(n, horizontal, vertical)
        log_z = aztec_partition_function(n, horizontal, vertical, exact=False)
        if log_z < 700:
            return math.exp(log_z)
        import mpmath

        return mpmath.exp(mpmath.mpf(log_z))
    k = kasteleyn_matrix(region.mask, horizontal, vertical)
    exact = _scaled_integer_det(k)
    if exact is not None:
        return exact
    log = certified_log_abs_det(k, tolerance=1e-10).value  # with a checked error bound, or ValueError
    if log < 700:
        return float(abs(math.exp(log)))
    import mpmath

    return mpmath.exp(mpmath.mpf(log))


def _scaled_integer_det(k: np.ndarray, max_rows: int = 150):
    """abs(det k) exactly when the float entries scale to modest integers; else None."""
    if k.shape[0] > max_rows:
        return None
    nonzero = k[k != 0]
    if nonzero.size == 0:
        return Fraction(0)
    fractions = [Fraction(float(v)) for v in np.unique(np.abs(nonzero))]
    scale = max(f.denominator for f in fractions)
    if max(abs(f.numerator) * (scale // f.denominator) for f in fractions) >= 2**62:
        return None
    scaled = np.zeros(k.shape, dtype=np.int64)
    rows, cols = np.nonzero(k)
    for r_, c_ in zip(rows.tolist(), cols.tolist()):
        f = Fraction(float(k[r_, c_]))
        scaled[r_, c_] = f.numerator * (scale // f.denominator)
    return Fraction(abs(integer_determinant(scaled)), scale ** k.shape[0])
