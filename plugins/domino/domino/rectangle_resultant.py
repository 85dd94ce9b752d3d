"""Exact domino counts of m x n rectangles as a resultant of two integer polynomials.

The Kasteleyn / Temperley-Fisher product (1961)

    T(m, n) = prod_{j <= ceil(m/2)} prod_{k <= ceil(n/2)} (x_j + y_k),
    x_j = 4 cos^2(pi j/(m+1)),  y_k = 4 cos^2(pi k/(n+1)),

is a product over the roots of two integer polynomials, so it is a resultant
and needs no real arithmetic (docs/references.md, "Domino tilings of an m×n
rectangle"). The Chebyshev polynomial of the second kind factors as
U_n(z) = prod_{k=1}^{n} (2z - 2 cos(pi k/(n+1))); pairing k with n+1-k, the
polynomial F_n(t) = U_n(sqrt(t)/2) / sqrt(t)^(n mod 2) is monic with integer
coefficients and roots 4 cos^2(pi k/(n+1)), k <= floor(n/2), and
G_n(t) = F_n(t) t^(n mod 2) adds the root 0 of k = (n+1)/2 for odd n. Then

    T(m, n) = |prod_{G_m(a) = 0} G_n(-a)| = |Res(G_m(t), G_n(-t))|,

since G_m is monic. From U_{n+2} = (4z^2 - 2) U_n - U_{n-2}: F_{n+2} = (t - 2) F_n - F_{n-2}
(F_0 = 1, F_2 = t - 1; F_1 = 1, F_3 = t - 2), so G_n(-t) is reduced modulo
G_m by powers of a 2x2 matrix, in O(log n) products of polynomials of degree
below ceil(m/2). The resultant is python-flint's exact integer one; its cost
grows with the size of the count (about the square of its digits for thin
strips), which :func:`resultant_seconds` estimates.
"""
from __future__ import annotations

from typing import Any, Optional

# Measured on a 2-core AMD EPYC (Zen 4) with python-flint 0.9 (benchmarks/rectangle_counts.py):
# 400x400 0.31-0.35 s, 1000x1000 8.3-9.1 s, 2000x2000 122 s, 100x2000 0.14 s, 20x20000 0.26 s;
# thin strips grow like the square of m n: 4x1e6 9.2 s, 4x1.96e6 36 s, 10x2e5 2.8 s (a review's runs).
_SECONDS = 7e-11
_SQUARE_SECONDS = 1e-12


def resultant_seconds(m: int, n: int) -> float:
    """Estimated seconds of :func:`rectangle_count`: the larger of a fit for squares and near-squares
    (m <= n after swapping) and one quadratic in m n for thin strips (the measurements above)."""
    m, n = sorted((m, n))
    return max(_SECONDS * float(m) ** 2.26 * float(n) ** 1.49, _SQUARE_SECONDS * (float(m) * n) ** 2) + 1e-3


def _half_chebyshev(n: int, modulus: Optional[Any], negate: bool) -> Any:
    """G_n(t) (or G_n(-t) when ``negate``), reduced modulo ``modulus`` when one is given (fmpz_poly)."""
    from flint import fmpz_poly

    def reduce(p: Any) -> Any:
        return p % modulus if modulus is not None else p

    t = fmpz_poly([0, -1] if negate else [0, 1])
    parity = n % 2
    low = fmpz_poly([1])                               # F_0 or F_1
    high = t - 1 if parity == 0 else t - 2             # F_2 or F_3
    steps = (n - parity) // 2                          # F_n = F_{parity + 2 steps}
    if steps == 0:
        value = low
    else:
        # (F_{p+2j+2}, F_{p+2j}) = M^j (F_{p+2}, F_p) with M = [[t - 2, -1], [1, 0]]
        m = [reduce(t - 2), fmpz_poly([-1]), fmpz_poly([1]), fmpz_poly([0])]
        r = [fmpz_poly([1]), fmpz_poly([0]), fmpz_poly([0]), fmpz_poly([1])]
        e = steps - 1
        while e:
            if e & 1:
                r = _product(r, m, reduce)
            m = _product(m, m, reduce)
            e >>= 1
        value = reduce(r[0] * high + r[1] * low)
    return reduce(value * t ** parity)


def _product(x: list, y: list, reduce: Any) -> list:
    """Product of 2x2 matrices of polynomials, stored row-major as [a, b, c, d]."""
    a, b, c, d = x
    e, f, g, h = y
    return [reduce(a * e + b * g), reduce(a * f + b * h), reduce(c * e + d * g), reduce(c * f + d * h)]


def rectangle_count(m: int, n: int) -> int:
    """Domino tilings of the m x n rectangle, exactly: |Res(G_min(t), G_max(-t))| (module docstring)."""
    if m * n % 2:
        return 0
    if m == 0 or n == 0:
        return 1
    m, n = sorted((m, n))
    modulus = _half_chebyshev(m, None, False)          # monic, degree ceil(m/2)
    return abs(int(modulus.resultant(_half_chebyshev(n, modulus, True))))
