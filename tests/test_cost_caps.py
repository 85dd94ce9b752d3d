"""Exact counts estimate their cost first and refuse, with the estimate, what would not finish.

Each reproducer used to run for minutes or hours (or exhaust memory) with no
refusal; now it answers or refuses in well under a few seconds. The faster
closed forms are checked against the textbook products they replace.
"""
from __future__ import annotations

import math
import time
from fractions import Fraction

import numpy as np
import pytest

import frostline as fl
from frostline.domino.counts import rectangle_count
from frostline.errors import RegionTooLargeError
from frostline.lozenge.counts import log_macmahon, macmahon
from frostline.square_ice.counts import asm_count


def _quick(thunk, seconds: float = 5.0):
    start = time.perf_counter()
    try:
        return thunk()
    finally:
        assert time.perf_counter() - start < seconds


def test_huge_box_count_is_refused_with_its_size():
    with pytest.raises(ValueError, match="decimal digits.*max_digits"):
        _quick(lambda: fl.lozenge.hexagon(10**4, 10**4, 10**4).count())
    region = fl.lozenge.hexagon(10**4, 10**4, 10**4)
    assert region.log_count() == pytest.approx(log_macmahon(10**4, 10**4, 10**4))


def test_thin_tall_box_is_instant():
    # (1, 1, c): c + 1 plane partitions; the old sieve up to a + b + c took 51 s and 4.6 GB
    assert _quick(lambda: fl.lozenge.hexagon(1, 1, 10**8).count(), 1.0) == 10**8 + 1
    assert _quick(lambda: macmahon(2, 1, 10**9), 1.0) == (10**9 + 1) * (10**9 + 2) // 2


@pytest.mark.parametrize("box", [(1, 1, 1), (2, 3, 4), (5, 5, 5), (3, 7, 2), (6, 4, 9), (8, 8, 1)])
def test_macmahon_matches_the_triple_product(box):
    # MacMahon (1916): prod over the box of (i + j + k - 1) / (i + j + k - 2), exactly
    a, b, c = box
    value = Fraction(1)
    for i in range(1, a + 1):
        for j in range(1, b + 1):
            for k in range(1, c + 1):
                value *= Fraction(i + j + k - 1, i + j + k - 2)
    assert value.denominator == 1 and macmahon(a, b, c) == value.numerator


def test_macmahon_oeis():
    # OEIS A008793: plane partitions in an n x n x n box
    assert [macmahon(n, n, n) for n in range(1, 7)] == [2, 20, 980, 232848, 267227532, 1478619421136]


@pytest.mark.parametrize("n", [1, 2, 3, 10, 25, 60])
def test_asm_count_matches_the_factorial_product(n):
    # Zeilberger (1996): A(n) = prod_{k<n} (3k+1)! / (n+k)!
    num = math.prod(math.factorial(3 * k + 1) for k in range(n))
    den = math.prod(math.factorial(n + k) for k in range(n))
    assert asm_count(n) * den == num


def test_asm_oeis_and_digit_cap():
    # OEIS A005130
    assert [asm_count(n) for n in range(1, 11)] == [1, 2, 7, 42, 429, 7436, 218348, 10850216, 911835460,
                                                    129534272700]
    with pytest.raises(ValueError, match="max_digits"):
        fl.square_ice.domain_wall(400).count(max_digits=1000)
    value = _quick(lambda: fl.square_ice.domain_wall(300).count(), 10.0)
    assert math.log(value) == pytest.approx(sum(math.lgamma(3 * k + 2) - math.lgamma(300 + k + 1)
                                                for k in range(300)), rel=1e-12)


def test_volume_polynomial_refused_by_budget():
    with pytest.raises(ValueError, match="budget=60"):
        _quick(lambda: fl.lozenge.hexagon(100, 100, 100).volume_polynomial())
    assert sum(fl.lozenge.hexagon(3, 3, 3).volume_polynomial(budget=None)) == 980
    for bad, kind in ((0, ValueError), (-1.0, ValueError), (float("nan"), ValueError), ("60", TypeError),
                      (True, TypeError)):
        with pytest.raises(kind):
            fl.lozenge.hexagon(2, 2, 2).volume_polynomial(budget=bad)


def test_general_lozenge_count_refused_before_the_matrix_is_built():
    region = fl.lozenge.from_boundary("60e 60ne 60nw 60w 60sw 60se")
    with pytest.raises(ValueError, match="estimate.*budget=None"):
        _quick(region.count, 2.0)
    # a region of moderate size still counts, and agrees with MacMahon
    assert fl.lozenge.hexagon_region(6, 5, 4).count() == macmahon(6, 5, 4)


def test_domino_counts_use_closed_forms_or_refuse():
    with pytest.raises(ValueError, match="estimate"):
        _quick(lambda: fl.domino.rectangle(2500, 2500).count())  # a resultant estimated at minutes
    # the from_mask square of 400 x 400 once hung in a real-arithmetic product: now a resultant
    assert _quick(lambda: fl.domino.from_mask(np.ones((400, 400), bool)).count(), 5.0) == rectangle_count(400, 400)
    # a full mask is the rectangle, an Aztec-shaped mask the diamond: closed forms, not determinants
    assert _quick(lambda: fl.domino.from_mask(np.ones((100, 100), bool)).count(), 3.0) == rectangle_count(100, 100)
    assert fl.domino.from_mask(fl.domino.aztec_mask(40)).count() == 2 ** (40 * 41 // 2)
    notched = np.ones((100, 100), bool)
    notched[0, :2] = False
    notched[-1, -2:] = False
    with pytest.raises(ValueError, match="budget=None"):
        _quick(lambda: fl.domino.from_mask(notched).count(), 2.0)
    small = np.ones((6, 6), bool)
    small[0, :2] = False
    small[-1, -2:] = False
    # cross-check the determinant path on a small notched square against enumeration
    assert fl.domino.from_mask(small).count(budget=None) == len(fl.exact.enumerate(fl.domino.from_mask(small)))


def test_command_line_count_caps_and_no_limits(capsys):
    from frostline.cli import main

    assert main(["count", "rectangle", "2500", "2500"]) == 2
    assert "--no-limits" in capsys.readouterr().err
    assert main(["count", "rectangle", "30", "30", "--no-limits"]) == 0
    assert capsys.readouterr().out.strip() == str(rectangle_count(30, 30))
    assert main(["count", "hexagon", "3", "3", "3", "--no-limits"]) == 0
    assert capsys.readouterr().out.strip() == "980"


def test_budget_must_be_a_number():
    notched = np.ones((6, 6), bool)
    notched[0, :2] = False
    notched[-1, -2:] = False
    with pytest.raises(TypeError, match="budget"):
        fl.domino.from_mask(notched).count(budget="x")


def test_long_exact_determinants_report_progress():
    from frostline.progress import exact_progress

    seen = []
    with exact_progress(lambda stage, done, total: seen.append((stage, done, total))):
        fl.lozenge.hexagon_region(5, 4, 3).count()
    assert seen and seen[0][1] == 0 and all(total >= 1 for _, _, total in seen)
    assert [done for _, done, _ in seen] == list(range(len(seen)))
    # outside the block nothing is reported
    reported = len(seen)
    fl.lozenge.hexagon_region(2, 2, 2).count()
    assert len(seen) == reported


def test_a_long_thin_box_counts_under_a_low_memory_limit(monkeypatch):
    # the box is two short chains; only a sample's 2e8 tiles would need gigabytes, and they are checked then
    monkeypatch.setenv("FROSTLINE_MEMORY_LIMIT", str(4e9))
    region = fl.lozenge.hexagon(1, 1, 10**8)
    assert region.count() == 10**8 + 1
    with pytest.raises(RegionTooLargeError, match="lozenges of the 1x1x100000000 hexagon"):
        region.tiles_from_heights(np.zeros((1, 1), np.int32))


def test_rectangle_counts_stay_a_function_and_check_their_input():
    # the resultant lives in its own module, which must not shadow the public function
    assert fl.domino.rectangle(4, 4).count() == 36 == fl.domino.rectangle_count(4, 4) == fl.domino.rectangle_count(4, 4)
    with pytest.raises(ValueError, match="non-negative"):
        fl.domino.rectangle_count(-2, 4)
    with pytest.raises(TypeError, match="must be an int"):
        fl.domino.rectangle_count(2.5, 4)
    # thin strips cost about the square of m n: 4 x 2e6 (36 s measured) is refused under a 10 s budget
    with pytest.raises(ValueError, match="budget"):
        _quick(lambda: rectangle_count(4, 2 * 10**6, budget=10), 2.0)
