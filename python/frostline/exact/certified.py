"""Logarithms of determinants that carry a checked error bound.

Kasteleyn matrices of lattice regions are often very badly conditioned (an
Aztec diamond of order 30 with a notch reaches a condition number of 2e16), so a
plain floating-point determinant can be wrong in the third digit with no sign
of it. :func:`certified_log_abs_det` returns ``log abs(det A)`` together with a
bound on its error, and raises rather than return a value that misses the
requested tolerance. Three routes, cheapest first:

1. float64 LU when the matrix is well conditioned: first-order perturbation
   theory bounds the relative error of det by about ``n * u * cond_1(A)``
   (u = 2^-53, backward error of LU with partial pivoting; Higham, "Accuracy
   and Stability of Numerical Algorithms", 2002, sections 9.3 and 14.6). The
   condition number is computed from the inverse and multiplied by a safety
   factor of 10, since it is itself computed in floating point;
2. exact integers when the entries are integers after scaling each row by a
   power of two (uniform and dyadic weights such as 2 or 0.5): modular
   elimination (:func:`frostline.exact.integer_determinant`), so the only error
   is the final rounding of the logarithm;
3. interval (ball) arithmetic with python-flint's ``arb_mat``, raising the
   working precision until the enclosure of det is tight enough; the enclosure
   is rigorous.
"""
from __future__ import annotations

import math
from dataclasses import dataclass
from fractions import Fraction
from typing import Optional, Sequence

import numpy as np

from .._limits import check_memory
from .determinant import integer_determinant

_UNIT_ROUNDOFF = 2.0**-53
_SAFETY = 10.0
#: exact modular elimination up to this many bits of Hadamard's bound (about 32 primes per 1000 bits)
_EXACT_BITS = 8_000
#: the largest matrix the interval route accepts (its cost grows like n^3 at multiprecision)
_INTERVAL_ROWS = 2500


@dataclass(frozen=True)
class CertifiedLog:
    """``log abs(det)`` with an absolute error bound and the route that produced it."""

    value: float
    error: float
    method: str


ROUTES = ("float", "exact", "interval")


def certified_log_abs_det(matrix: np.ndarray, tolerance: float = 1e-9, max_bits: int = 2048,
                          routes: Sequence[str] = ROUTES) -> CertifiedLog:
    """Natural log of abs(det A) with an absolute error below ``tolerance`` (see the module docstring).

    ``routes`` limits the routes tried, in their fixed order (for tests and
    for callers that want, say, only rigorous enclosures: ``("interval",)``).

    Raises
    ------
    ValueError
        When det A = 0 (no tiling), or when no route reaches ``tolerance``
        within ``max_bits`` of working precision (the message names the best
        bound reached).
    """
    a = np.asarray(matrix, dtype=np.float64)
    if a.ndim != 2 or a.shape[0] != a.shape[1]:
        raise ValueError(f"need a square matrix, got shape {a.shape}")
    if not np.all(np.isfinite(a)):
        raise ValueError("the matrix holds infinite or NaN entries")
    n = a.shape[0]
    if n == 0:
        return CertifiedLog(0.0, 0.0, "empty")
    unknown = set(routes) - set(ROUTES)
    if unknown or not routes:
        raise ValueError(f"routes must be a non-empty selection of {ROUTES}, got {tuple(routes)}")
    check_memory(40 * n * n + 10**6, f"the {n}x{n} determinant")
    float_result = _float_route(a) if "float" in routes else None
    if float_result is not None and float_result.error <= tolerance:
        return float_result
    exact = _exact_route(a) if "exact" in routes else None
    if exact is not None:
        return exact
    if "interval" not in routes:
        best = f"{float_result.error:.2g}" if float_result is not None else "nothing"
        raise ValueError(f"log |det| cannot be certified to {tolerance:g} by the routes {tuple(routes)} "
                         f"(floating point reaches {best}); allow the 'interval' route")
    return _interval_route(a, tolerance, max_bits, float_result)


def _float_route(a: np.ndarray) -> Optional[CertifiedLog]:
    n = a.shape[0]
    sign, log = np.linalg.slogdet(a)
    if sign == 0 or not np.isfinite(log):
        return None
    try:
        inverse = np.linalg.inv(a)
    except np.linalg.LinAlgError:
        return None
    cond = float(np.abs(a).sum(axis=0).max() * np.abs(inverse).sum(axis=0).max())
    relative = _SAFETY * n * _UNIT_ROUNDOFF * cond
    if not np.isfinite(relative) or relative >= 0.5:
        return None
    error = -math.log1p(-relative) + 4 * _UNIT_ROUNDOFF * abs(log)  # |log(1 + d)| for |d| <= relative
    return CertifiedLog(float(log), float(error), "float64 LU (condition-number bound)")


def _exact_route(a: np.ndarray) -> Optional[CertifiedLog]:
    """Exact integers after scaling each row by a power of two, when the entries are dyadic and small."""
    n = a.shape[0]
    scaled = np.zeros(a.shape, dtype=np.int64)
    shift_total = 0
    bits = 0.0
    for r in range(n):
        row = a[r]
        nz = np.nonzero(row)[0]
        if nz.size == 0:
            raise ValueError("the Kasteleyn determinant is 0 (a vertex with no edge): the region has no tiling")
        fractions = [Fraction(float(v)) for v in row[nz]]
        denominator = max(f.denominator for f in fractions)  # powers of two for floats
        numerators = [f.numerator * (denominator // f.denominator) for f in fractions]
        if max(abs(v) for v in numerators) >= 2**62:
            return None
        scaled[r, nz] = numerators
        shift_total += denominator.bit_length() - 1
        bits += 0.5 * math.log2(sum(v * v for v in numerators))
        if bits > _EXACT_BITS:
            return None
    det = integer_determinant(scaled)
    if det == 0:
        raise ValueError("the Kasteleyn determinant is 0: the region has no tiling")
    log_det, log_scale = math.log(abs(det)), shift_total * math.log(2.0)
    # the only errors: rounding of the two logarithms and of their difference
    return CertifiedLog(log_det - log_scale, 4 * _UNIT_ROUNDOFF * (abs(log_det) + abs(log_scale) + 1.0),
                        "exact integers")


def _interval_route(a: np.ndarray, tolerance: float, max_bits: int,
                    float_result: Optional[CertifiedLog]) -> CertifiedLog:
    n = a.shape[0]
    best = float_result.error if float_result is not None else math.inf
    if n > _INTERVAL_ROWS:
        raise ValueError(f"log |det| of this {n}x{n} matrix cannot be certified to {tolerance:g}: floating point "
                         f"reaches only {best:.2g}, its entries are not small dyadic numbers (no exact route), and "
                         f"interval arithmetic is limited to {_INTERVAL_ROWS} rows here")
    try:
        import flint
    except ImportError:  # pragma: no cover - python-flint is a dependency
        raise ValueError("certifying this determinant needs python-flint (pip install python-flint)") from None
    entries = a.tolist()
    bits = 128
    old = flint.ctx.prec
    try:
        while bits <= max_bits:
            flint.ctx.prec = bits
            det = flint.arb_mat(entries).det()
            if not det.contains(0):
                low, high = abs(det).lower(), abs(det).upper()
                lo, hi = float(low.log()), float(high.log())
                if hi - lo <= tolerance:
                    return CertifiedLog(0.5 * (lo + hi), 0.5 * (hi - lo) + 4 * _UNIT_ROUNDOFF * abs(hi),
                                        f"interval arithmetic ({bits} bits)")
                best = min(best, 0.5 * (hi - lo))
            bits *= 2
    finally:
        flint.ctx.prec = old
    raise ValueError(f"log |det| could not be certified to {tolerance:g} within {max_bits} bits of precision "
                     f"(best bound {best:.2g}); the determinant may be 0")
