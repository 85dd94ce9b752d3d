"""Logarithms of determinants with checked error bounds, on matrices built to be ill-conditioned.

References are exact determinants computed by python-flint (FLINT's fmpz_mat and
fmpq_mat, a general-purpose library), independent of frostline's own modular
elimination.
"""
from __future__ import annotations

import math
from fractions import Fraction

import flint
import mpmath
import numpy as np
import pytest

import frostline as fl
from frostline.exact import certified_log_abs_det, log_partition_function, log_partition_function_bound


def flint_log_abs_det_integer(matrix: np.ndarray) -> float:
    det = flint.fmpz_mat(np.rint(matrix).astype(np.int64).tolist()).det()
    return math.log(abs(int(det)))


def notched_aztec_mask() -> np.ndarray:
    m = fl.domino.aztec_mask(30)
    m[25:35, 46:] = False  # condition number about 2e16: float64 loses the third digit here
    return m


def test_ill_conditioned_uniform_region_is_exact():
    region = fl.domino.from_mask(notched_aztec_mask())
    k = region.kasteleyn_real()
    assert np.linalg.cond(k) > 1e15  # the case really is ill-conditioned
    naive = np.linalg.slogdet(k)[1]
    truth = flint_log_abs_det_integer(k)
    # what a plain float determinant gets wrong: 7.7e-3 or 2.6e-4 here, depending on the BLAS build
    assert abs(naive - truth) > 1e-6
    bound = log_partition_function_bound(region)
    assert abs(bound.value - truth) <= max(bound.error, 1e-12) and bound.error < 1e-9
    assert abs(log_partition_function(region) - math.log(region.count())) < 1e-9


def test_ill_conditioned_weighted_region_with_two_pieces():
    """Vertical weight 2 on the left half, plus a separate 10 x 12 block: log Z against exact integers."""
    aztec = notched_aztec_mask()
    mask = np.zeros((60, 80), bool)
    mask[:, :60] = aztec
    mask[20:30, 66:78] = True
    vertical = np.ones((59, 80))
    vertical[:, :30] = 2.0
    region = fl.domino.from_mask(mask, vertical=vertical)
    truth = flint_log_abs_det_integer(region.kasteleyn_real())  # weights 1 and 2: an integer matrix
    z = region.partition_function()
    log_z = float(mpmath.log(z))  # z is a float, or an mpmath number past the float range
    assert abs(log_z - truth) < 1e-8
    assert abs(log_partition_function(region) - truth) < 1e-9


def hilbert(n: int) -> np.ndarray:
    return 1.0 / (np.arange(n)[:, None] + np.arange(n)[None, :] + 1.0)  # condition about 1e16 at n = 12


def flint_log_abs_det_rational(matrix: np.ndarray) -> float:
    exact = flint.fmpq_mat([[flint.fmpq(Fraction(float(v)).numerator, Fraction(float(v)).denominator)
                             for v in row] for row in matrix.tolist()]).det()
    return math.log(abs(Fraction(int(exact.p), int(exact.q))))


@pytest.mark.parametrize("routes", [("exact",), ("interval",), ("float", "exact", "interval")])
def test_every_route_meets_its_bound(routes):
    a = hilbert(12)
    truth = flint_log_abs_det_rational(a)
    result = certified_log_abs_det(a, tolerance=1e-9, routes=routes)
    assert abs(result.value - truth) <= result.error <= 1e-9


def test_float_alone_refuses_what_it_cannot_certify():
    with pytest.raises(ValueError, match="cannot be certified"):
        certified_log_abs_det(hilbert(12), routes=("float",))


def test_well_conditioned_matrices_take_the_float_route():
    region = fl.domino.aztec_diamond(8)
    result = log_partition_function_bound(region)
    assert result.method.startswith("float64")
    assert abs(result.value - math.log(2) * 36) <= result.error  # 2^(n(n+1)/2), OEIS A006125


def test_singular_and_bad_input():
    with pytest.raises(ValueError, match="no tiling|certified"):
        certified_log_abs_det(np.array([[1.0, 2.0], [2.0, 4.0]]))
    with pytest.raises(ValueError, match="square"):
        certified_log_abs_det(np.ones((2, 3)))
    with pytest.raises(ValueError, match="routes"):
        certified_log_abs_det(np.eye(2), routes=("magic",))
