"""Cost caps for exact counts: refuse, with the estimate, what would not finish in reasonable time.

Exact counts of large regions are integers with millions of digits or
determinants of matrices with tens of thousands of rows. Every count estimates
its cost first, cheaply, and raises ValueError naming the estimate and how to
go ahead anyway (``budget=None`` or ``max_digits=None``); the long loops run
in Python, so Ctrl-C stops them.

Seconds are estimates for one core of a 2020s desktop processor (calibrated on
the determinants and products of this package; common practice for such caps:
order of magnitude, not a promise).
"""
from __future__ import annotations

from typing import Optional

DEFAULT_BUDGET_SECONDS = 60.0
DEFAULT_MAX_DIGITS = 10**6

# Calibration of integer_determinant: per prime, each of the n pivots costs a
# fixed overhead plus the fill of a band of width w (measured here: a 1200-row
# lozenge matrix, 62 primes, about 1.5 s; the 5000-row Kasteleyn matrix of the
# 100 x 100 square, 162 primes and band 100, 92 s).
_PIVOT_SECONDS = 2e-5
_BAND_CELL_SECONDS = 1e-8
# Python big-integer additions of the volume polynomial, per coefficient and factor.
_COEFFICIENT_SECONDS = 3e-8


def check_digits(digits: float, max_digits: Optional[int], what: str) -> None:
    """Raise ValueError when ``what`` has more than ``max_digits`` decimal digits (None: no cap)."""
    if max_digits is not None and digits > max_digits:
        raise ValueError(
            f"{what} has about {digits:.3g} decimal digits, above max_digits={max_digits}; pass max_digits=None "
            "to compute it anyway (time and memory grow with the digits), or use "
            "frostline.exact.log_partition_function for its logarithm"
        )


def check_seconds(seconds: float, budget: Optional[float], what: str, detail: str) -> None:
    """Raise ValueError when the estimated ``seconds`` exceed ``budget`` (None: no cap)."""
    if budget is not None and seconds > budget:
        raise ValueError(
            f"{what} would take about {seconds:.3g} s by its estimate ({detail}), above budget={budget:g} s; "
            "pass budget=None to run it anyway (Ctrl-C stops it), or a larger budget in seconds"
        )


def check_budget_argument(budget: Optional[float]) -> Optional[float]:
    """``budget`` as a float of seconds, or None; TypeError/ValueError for anything else."""
    if budget is None:
        return None
    if isinstance(budget, bool) or not isinstance(budget, (int, float)):
        raise TypeError(f"budget must be a number of seconds or None, got {type(budget).__name__}")
    if not budget > 0:  # NaN fails too
        raise ValueError(f"budget must be a positive number of seconds or None, got {budget!r}")
    return float(budget)


def determinant_seconds(rows: int, bandwidth: int, bound_bits: float) -> float:
    """Estimated seconds of :func:`frostline.exact.integer_determinant` on such a matrix."""
    primes = bound_bits / 31.0 + 1.0
    return primes * rows * (_PIVOT_SECONDS + _BAND_CELL_SECONDS * float(bandwidth) ** 2)


def product_seconds(terms: int, bits: float) -> float:
    """Estimated seconds of a product of ``terms`` multiprecision factors of ``bits`` bits (mpmath, Karatsuba)."""
    return terms * (2e-6 + 1e-9 * max(bits / 64.0, 1.0) ** 1.585)


def polynomial_seconds(factors: int, degree: int) -> float:
    """Estimated seconds to multiply out ``factors`` factors into a polynomial of ``degree`` (big integers)."""
    return 2.0 * factors * (degree + 1) * _COEFFICIENT_SECONDS
