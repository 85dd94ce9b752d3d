"""Partition functions of square ice: the ASM product, a row-transfer sum, Izergin-Korepin."""
from __future__ import annotations

import math
from fractions import Fraction
from typing import Dict, Iterator, Sequence, Tuple, Union

import numpy as np

from .conversions import TYPE_ARROWS

Number = Union[int, Fraction]


def asm_count(n: int) -> int:
    """Alternating sign matrices of order n: prod_{k<n} (3k+1)! / (n+k)! (Zeilberger 1996; OEIS A005130)."""
    num = math.prod(math.factorial(3 * k + 1) for k in range(n))
    den = math.prod(math.factorial(n + k) for k in range(n))
    value, rest = divmod(num, den)
    assert rest == 0
    return value


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


def row_transfer(boundary: np.ndarray, weights: Sequence[Number] = (1, 1, 1)) -> Number:
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


def izergin_korepin(n: int, a: float, b: float, c: float, digits: int = 0):
    """Domain-wall partition function by the Izergin-Korepin determinant (Korepin 1982; Izergin 1987).

    With a = s sin(l + e), b = s sin(l - e), c = s sin 2e (Delta = cos 2e; e and l
    complex when |Delta| > 1, REFERENCES.md section 1):
    Z_n = s^(n^2) (ab/s^2)^(n^2) / (prod_{k<n} k!)^2 det[d^(i+j) phi / dl^(i+j)],
    phi(l) = sin 2e / (sin(l + e) sin(l - e)). Computed with mpmath at
    3n + 40 digits (the determinant loses about 3n). Returns an mpmath mpf.
    Raises ValueError at |Delta| = 1 (use :func:`row_transfer`).
    """
    import mpmath

    with mpmath.workdps(max(digits, 3 * n + 40)):
        a, b, c = mpmath.mpf(a), mpmath.mpf(b), mpmath.mpf(c)
        delta = (a * a + b * b - c * c) / (2 * a * b)
        if abs(abs(delta) - 1) < mpmath.mpf(10) ** (-20):
            raise ValueError("Izergin-Korepin's parametrisation fails at |Delta| = 1; use the row transfer")
        eta = mpmath.acos(mpmath.mpc(delta)) / 2
        s = c / mpmath.sin(2 * eta)
        lam = mpmath.asin(a / s) - eta
        if abs(s * mpmath.sin(lam - eta) - b) > abs(b) * mpmath.mpf(10) ** (-10):
            lam = mpmath.pi - mpmath.asin(a / s) - eta
        sa, sb = mpmath.sin(lam + eta), mpmath.sin(lam - eta)

        def phi(x):
            return mpmath.sin(2 * eta) / (mpmath.sin(x + eta) * mpmath.sin(x - eta))

        coefficients = mpmath.taylor(phi, lam, 2 * n - 2)
        derivative = [coefficients[k] * mpmath.factorial(k) for k in range(2 * n - 1)]
        m = mpmath.matrix(n, n)
        for i in range(n):
            for j in range(n):
                m[i, j] = derivative[i + j]
        norm = math.prod(math.factorial(k) for k in range(n)) ** 2
        z = s ** (n * n) * (sa * sb) ** (n * n) / norm * mpmath.det(m)
        return +mpmath.re(z)
