"""Closed-form counts of plane partitions in a box (lozenge tilings of a hexagon)."""
from __future__ import annotations

import math
from fractions import Fraction
from typing import Dict, List, Optional, Union

import numpy as np


def macmahon(a: int, b: int, c: int, max_digits: Optional[int] = None) -> int:
    """Number of plane partitions in an a x b x c box.

    MacMahon (1916): prod_{i<=a, j<=b, k<=c} (i+j+k-1)/(i+j+k-2). The product
    over k telescopes to prod_{i<=a, j<=b} (i+j+c-1)/(i+j-1); grouping equal
    i + j leaves 2(a + b) integers to factor, each by trial division with the
    primes up to sqrt(a + b + c) (what remains is prime), and the count is the
    product of prime powers (a balanced tree). (1000, 1000, 1000) takes well
    under a second and (1, 1, 10^8) microseconds. OEIS A008793 for a = b = c.
    ``max_digits``: refuse (ValueError) a count with more decimal digits.
    """
    if a == 0 or b == 0 or c == 0:
        return 1
    from frostline.exact.budget import check_digits

    check_digits(log_macmahon(a, b, c) / math.log(10), max_digits, f"the count of the {a}x{b}x{c} box")
    primes = _primes_up_to(math.isqrt(a + b + c) + 1)
    exponent: Dict[int, int] = {}

    def add(n: int, times: int) -> None:
        for p in primes:
            if p * p > n:
                break
            while n % p == 0:
                n //= p
                exponent[p] = exponent.get(p, 0) + times
        if n > 1:
            exponent[n] = exponent.get(n, 0) + times

    for s, m in enumerate(_diagonal_multiplicity(a, b)):
        if m:
            add(s + c - 1, m)
            add(s - 1, -m)
    if any(e < 0 for e in exponent.values()):
        raise AssertionError("MacMahon's product must be an integer")
    return _product([pow(p, e) for p, e in sorted(exponent.items()) if e])


def _primes_up_to(limit: int) -> List[int]:
    """The primes <= limit (a sieve of Eratosthenes)."""
    if limit < 2:
        return []
    sieve = bytearray([1]) * (limit + 1)
    sieve[0:2] = b"\0\0"
    for p in range(2, math.isqrt(limit) + 1):
        if sieve[p]:
            sieve[p * p::p] = bytearray(len(range(p * p, limit + 1, p)))
    return [p for p in range(limit + 1) if sieve[p]]


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


def volume_polynomial(a: int, b: int, c: int, max_degree: int = 2_000_000,
                      budget: Optional[float] = None) -> List[int]:
    """Coefficients of sum over plane partitions in the box of q^volume, degree 0..abc.

    MacMahon's q-analogue: prod_{i<=a, j<=b} (1 - q^(i+j+c-1)) / (1 - q^(i+j-1)).
    Raises ValueError when abc exceeds ``max_degree`` (the list would be huge)
    or the estimated time exceeds ``budget`` seconds (None: no cap).
    """
    from frostline.exact.budget import check_budget_argument, check_seconds, polynomial_seconds

    degree = a * b * c
    if degree > max_degree:
        raise ValueError(f"the volume polynomial of a {a}x{b}x{c} box has degree {degree}, above {max_degree}")
    check_seconds(polynomial_seconds(a * b, degree), check_budget_argument(budget),
                  f"the volume polynomial of the {a}x{b}x{c} box", f"{a * b} factors of degree up to {degree}")
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
