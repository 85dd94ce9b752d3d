"""Partition functions of square ice: the ASM product, a row-transfer sum, Izergin-Korepin."""
from __future__ import annotations

import math
from fractions import Fraction
from typing import Any, Dict, Iterator, Optional, Sequence, Tuple, Union

import numpy as np

from .conversions import TYPE_ARROWS

Number = Union[int, Fraction]


def asm_count(n: int, max_digits: Optional[int] = None) -> int:
    """Alternating sign matrices of order n: prod_{k<n} (3k+1)! / (n+k)! (Zeilberger 1996; OEIS A005130).

    Computed from prime exponents (Legendre's formula for the exponent of p in
    m!), so no factorial is ever formed: order 2000 (about 450,000 digits)
    takes about a second. ``max_digits`` refuses (ValueError) a larger count.
    """
    from frostline.exact.budget import check_digits

    if n <= 1:
        return 1
    check_digits(log_asm_count(n) / math.log(10), max_digits, f"the number of alternating sign matrices of order {n}")
    top = 3 * n - 2
    sieve = np.ones(top + 1, dtype=bool)
    sieve[:2] = False
    for p in range(2, math.isqrt(top) + 1):
        if sieve[p]:
            sieve[p * p::p] = False
    k = np.arange(n, dtype=np.int64)
    numerator, denominator = 3 * k + 1, n + k
    powers = []
    for p in np.flatnonzero(sieve).tolist():
        exponent, q = 0, p
        while q <= top:  # Legendre: v_p(m!) = sum_i floor(m / p^i)
            exponent += int((numerator // q).sum() - (denominator // q).sum())
            q *= p
        if exponent < 0:
            raise AssertionError("the ASM product must be an integer")
        if exponent:
            powers.append(pow(p, exponent))
    while len(powers) > 1:  # balanced product tree: fast for big integers
        powers = [powers[i] * powers[i + 1] if i + 1 < len(powers) else powers[i] for i in range(0, len(powers), 2)]
    return powers[0] if powers else 1


def log_asm_count(n: int) -> float:
    """Natural logarithm of the number of alternating sign matrices of order n (floating point)."""
    return float(sum(math.lgamma(3 * k + 2) - math.lgamma(n + k + 1) for k in range(n)))


def _rows(left: int, right: int, above: Sequence[int]) -> Iterator[Tuple[int, ...]]:
    """Rows h[0..n] with h[0] = left, h[n] = right, steps +-1, each entry +-1 from the row above."""
    n = len(above) - 1
    row = [left]

    def extend(j: int) -> Iterator[Tuple[int, ...]]:
        if j == n:
            if row[-1] == right:
                yield tuple(row)
            return
        for d in (1, -1):
            v = row[-1] + d
            if abs(v - above[j + 1]) == 1 and abs(v - right) <= n - j - 1:
                row.append(v)
                yield from extend(j + 1)
                row.pop()

    if abs(left - above[0]) == 1:
        yield from extend(0)


def _cell_types(top: Sequence[int], bottom: Sequence[int]) -> np.ndarray:
    t, b = np.asarray(top), np.asarray(bottom)
    arrows = np.stack([b[:-1] - t[:-1], b[1:] - t[1:], t[1:] - t[:-1], b[1:] - b[:-1]], axis=-1)
    return np.argmax(np.all(arrows[:, None, :] == TYPE_ARROWS[None, :, :], axis=-1), axis=-1)


def row_transfer(boundary: np.ndarray, weights: Sequence[Any] = (1, 1, 1)) -> Any:
    """Sum over configurations with the given boundary of prod over vertices of a, b or c.

    Exact (int or Fraction) row by row: the state is a row of corner heights,
    so the work grows like 2^n; practical to n of about 12. ``weights`` are
    (a, b, c), taken at their exact values (floats at their binary value).
    """
    h = np.asarray(boundary)
    n = h.shape[0] - 1
    a, b, c = (Fraction(w) for w in weights)
    per_type = [a, a, b, b, c, c]
    unit = all(w == 1 for w in (a, b, c))
    states: Dict[Tuple[int, ...], Number] = {tuple(int(v) for v in h[0]): 1}
    for i in range(1, n + 1):
        nxt: Dict[Tuple[int, ...], Number] = {}
        for top, weight in states.items():
            for row in _rows(int(h[i, 0]), int(h[i, n]), top):
                if i == n and row != tuple(int(v) for v in h[n]):
                    continue
                w = weight
                if not unit:
                    for t in _cell_types(top, row):
                        w = w * per_type[t]
                nxt[row] = nxt.get(row, 0) + w
        states = nxt
    total = sum(states.values(), 0)
    return int(total) if unit else total


def _cot_derivative_polynomials(order: int):
    """Integer coefficients of P_k with d^k/dx^k cot x = P_k(cot x), k = 0..order (P_{k+1} = -(1 + t^2) P_k')."""
    polys = [[0, 1]]
    for _ in range(order):
        p = polys[-1]
        dp = [k * p[k] for k in range(1, len(p))]
        nxt = [0] * (len(dp) + 2)
        for k, v in enumerate(dp):
            nxt[k] -= v
            nxt[k + 2] -= v
        polys.append(nxt)
    return polys


def izergin_korepin(n: int, a: float, b: float, c: float, digits: int = 0):
    """Domain-wall partition function by the Izergin-Korepin determinant (Korepin 1982; Izergin 1987).

    With a = s sin(l + e), b = s sin(l - e), c = s sin 2e (Delta = cos 2e; e and l
    complex when abs(Delta) > 1, docs/references.md section 1):
    Z_n = s^(n^2) (sin(l+e) sin(l-e))^(n^2) / (prod_{k<n} k!)^2 det[phi^(i+j)(l)],
    phi(l) = sin 2e / (sin(l + e) sin(l - e)) = cot(l - e) - cot(l + e), whose
    derivatives are exact polynomials in the two cotangents. The determinant
    cancels many digits (more near Delta = -1 and for large n), so the value is
    computed at increasing precision until two precisions agree to 1e-15;
    an mpmath mpf is returned. Raises ValueError at abs(Delta) = 1 (use
    :func:`row_transfer`) or if no precision up to 20000 digits settles.
    """
    import mpmath

    polys = _cot_derivative_polynomials(2 * n - 2)
    dps = max(digits, 3 * n + 40)
    previous = None
    while dps <= 20000:
        value = _ik_at(n, a, b, c, dps, polys)
        if previous is not None and value != 0 and abs(value - previous) <= abs(value) * mpmath.mpf(10) ** -15:
            if value <= 0:
                raise ValueError("the Izergin-Korepin value is not positive; use the row transfer")
            return value
        previous = value
        dps *= 2
    raise ValueError(f"the Izergin-Korepin determinant did not settle by 20000 digits at n = {n}; "
                     "use the row transfer for small n")


def _ik_at(n, a, b, c, dps, polys):
    import mpmath

    with mpmath.workdps(dps):
        a, b, c = mpmath.mpf(a), mpmath.mpf(b), mpmath.mpf(c)
        delta = (a * a + b * b - c * c) / (2 * a * b)
        if abs(abs(delta) - 1) < mpmath.mpf(10) ** (-20):
            raise ValueError("Izergin-Korepin's parametrisation fails at |Delta| = 1; use the row transfer")
        eta = mpmath.acos(mpmath.mpc(delta)) / 2
        s = c / mpmath.sin(2 * eta)
        lam = None
        for candidate in (mpmath.asin(a / s) - eta, mpmath.pi - mpmath.asin(a / s) - eta):
            if abs(s * mpmath.sin(candidate - eta) - b) <= abs(b) * mpmath.mpf(10) ** (-10):
                lam = candidate
                break
        if lam is None:
            raise ValueError("no parametrisation of these weights was found")
        t_minus, t_plus = mpmath.cot(lam - eta), mpmath.cot(lam + eta)
        derivative = [mpmath.polyval(p[::-1], t_minus) - mpmath.polyval(p[::-1], t_plus) for p in polys]
        m = mpmath.matrix(n, n)
        for i in range(n):
            for j in range(n):
                m[i, j] = derivative[i + j]
        norm = math.prod(math.factorial(k) for k in range(n)) ** 2
        z = (s * mpmath.sin(lam + eta) * mpmath.sin(lam - eta)) ** (n * n) / norm * mpmath.det(m)
        return +mpmath.re(z)
