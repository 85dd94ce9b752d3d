"""Closed-form counts of plane partitions in a box (lozenge tilings of a hexagon)."""
from __future__ import annotations

import math
from fractions import Fraction
from typing import List, Union

import numpy as np


def _superfactorial(n: int) -> int:
    """prod_{k=0}^{n-1} k!  (so that MacMahon's formula is a ratio of these)."""
    out, fact = 1, 1
    for k in range(1, n):
        fact *= k
        out *= fact
    return out


def macmahon(a: int, b: int, c: int) -> int:
    """Number of plane partitions in an a x b x c box.

    MacMahon (1916): prod_{i<=a, j<=b, k<=c} (i+j+k-1)/(i+j+k-2), computed as
    H(a) H(b) H(c) H(a+b+c) / (H(a+b) H(b+c) H(c+a)) with H(n) = prod_{k<n} k!.
    OEIS A008793 for a = b = c.
    """
    sf = _superfactorial
    num = sf(a) * sf(b) * sf(c) * sf(a + b + c)
    den = sf(a + b) * sf(b + c) * sf(c + a)
    value, rest = divmod(num, den)
    assert rest == 0, "MacMahon's ratio must be an integer"
    return value


def _diagonal_multiplicity(a: int, b: int) -> List[int]:
    """mult[s] = number of (i, j) with 1 <= i <= a, 1 <= j <= b and i + j = s."""
    mult = [0] * (a + b + 1)
    for s in range(2, a + b + 1):
        mult[s] = min(s - 1, a, b, a + b - s + 1)
    return mult


def volume_polynomial(a: int, b: int, c: int, max_degree: int = 2_000_000) -> List[int]:
    """Coefficients of sum over plane partitions in the box of q^volume, degree 0..abc.

    MacMahon's q-analogue: prod_{i<=a, j<=b} (1 - q^(i+j+c-1)) / (1 - q^(i+j-1)).
    Raises ValueError when abc exceeds ``max_degree`` (the list would be huge).
    """
    degree = a * b * c
    if degree > max_degree:
        raise ValueError(f"the volume polynomial of a {a}x{b}x{c} box has degree {degree}, above {max_degree}")
    poly = np.zeros(degree + 1, dtype=object)
    poly[0] = 1
    mult = _diagonal_multiplicity(a, b)
    for s, m in enumerate(mult):
        for _ in range(m):
            top, bottom = s + c - 1, s - 1
            # multiply by (1 - q^top): exact while the true product stays polynomial
            if top <= degree:
                poly[top:] = poly[top:] - poly[: degree + 1 - top]
            # divide by (1 - q^bottom): running sums along residue classes
            for start in range(bottom, degree + 1, bottom):
                stop = min(start + bottom, degree + 1)
                poly[start:stop] = poly[start:stop] + poly[start - bottom : stop - bottom]
    return [int(x) for x in poly]


def q_partition_function(a: int, b: int, c: int, q: Union[Fraction, float], exact_bits: int = 1_000_000):
    """Sum over plane partitions in the box of q^volume.

    Exact (``fractions.Fraction``) when the result has at most about ``exact_bits``
    bits; otherwise a float, or an ``mpmath.mpf`` when a float would overflow.
    ``q`` is taken at its exact binary value when given as a float.
    """
    qf = Fraction(q)
    mult = _diagonal_multiplicity(a, b)
    size = max(abs(qf.numerator), qf.denominator).bit_length() * a * b * c
    if size <= exact_bits:
        out = Fraction(1)
        for s, m in enumerate(mult):
            if m:
                out *= ((1 - qf ** (s + c - 1)) / (1 - qf ** (s - 1))) ** m
        return out
    import mpmath

    with mpmath.workdps(30):
        x = mpmath.mpf(qf.numerator) / qf.denominator
        log_z = mpmath.mpf(0)
        for s, m in enumerate(mult):
            if m:
                log_z += m * (mpmath.log(abs(1 - x ** (s + c - 1))) - mpmath.log(abs(1 - x ** (s - 1))))
        value = mpmath.exp(log_z)
        return float(value) if log_z < 700 else value


def log_macmahon(a: int, b: int, c: int) -> float:
    """Natural log of MacMahon's count, in floating point (for large boxes)."""
    lg = math.lgamma
    # log H(n) = sum_{k<n} log k! = sum_{k<n} lgamma(k + 1)
    def log_h(n: int) -> float:
        return float(sum(lg(k + 1) for k in range(n)))

    return log_h(a) + log_h(b) + log_h(c) + log_h(a + b + c) - log_h(a + b) - log_h(b + c) - log_h(c + a)
