"""Closed-form counts of plane partitions in a box (lozenge tilings of a hexagon)."""
from __future__ import annotations

import math
from fractions import Fraction
from typing import List, Union

import numpy as np


def macmahon(a: int, b: int, c: int) -> int:
    """Number of plane partitions in an a x b x c box.

    MacMahon (1916): prod_{i<=a, j<=b, k<=c} (i+j+k-1)/(i+j+k-2). The product
    over k telescopes to prod_{i<=a, j<=b} (i+j+c-1)/(i+j-1); grouping equal
    i + j and summing prime exponents (from a sieve) keeps even
    (1000, 1000, 1000) to a few seconds. OEIS A008793 for a = b = c.
    """
    if a == 0 or b == 0 or c == 0:
        return 1
    top = a + b + c
    smallest = list(range(top + 1))  # smallest prime factor, by a sieve
    for p in range(2, int(top**0.5) + 1):
        if smallest[p] == p:
            for m in range(p * p, top + 1, p):
                if smallest[m] == m:
                    smallest[m] = p
    exponent = [0] * (top + 1)

    def add(n: int, times: int) -> None:
        while n > 1:
            p = smallest[n]
            n //= p
            exponent[p] += times

    for s, m in enumerate(_diagonal_multiplicity(a, b)):
        if m:
            add(s + c - 1, m)
            add(s - 1, -m)
    if any(e < 0 for e in exponent):
        raise AssertionError("MacMahon's product must be an integer")
    return _product([pow(p, e) for p, e in enumerate(exponent) if e])


def _product(values: List[int]) -> int:
    """Product by a balanced tree (fast for big integers)."""
    if not values:
        return 1
    while len(values) > 1:
        values = [values[i] * values[i + 1] if i + 1 < len(values) else values[i] for i in range(0, len(values), 2)]
    return values[0]


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
    return float(sum(m * (math.log(s + c - 1) - math.log(s - 1))
                     for s, m in enumerate(_diagonal_multiplicity(a, b)) if m))
