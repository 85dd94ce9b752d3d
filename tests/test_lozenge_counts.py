"""Counts of plane partitions in a box against published values and enumeration."""
from fractions import Fraction

import pytest
import sympy

import frostline as fl
from reference.plane_partitions import plane_partitions, volume_counts

# OEIS A008793: plane partitions in an n x n x n box (MacMahon 1916), n = 0..8.
A008793 = [1, 2, 20, 980, 232848, 267227532, 1478619421136, 39405996318420160,
           5055160684040254910720]


@pytest.mark.parametrize("n", range(9))
def test_cube_counts_match_oeis(n):
    assert fl.lozenge.hexagon(n, n, n).count() == A008793[n]


def test_large_count_leading_digits():
    # docs/references.md section 1: M(20,20,20) ~ 1.5903582500804731054e136 (137 digits).
    m = fl.lozenge.hexagon(20, 20, 20).count()
    assert len(str(m)) == 137
    assert str(m).startswith("15903582500804731054")


@pytest.mark.parametrize("box", [(1, 1, 5), (2, 3, 1), (2, 2, 3), (3, 2, 2), (1, 4, 3), (2, 3, 3), (0, 3, 2)])
def test_counts_match_brute_force(box):
    assert fl.lozenge.hexagon(*box).count() == sum(1 for _ in plane_partitions(*box))


def test_counts_match_product_formula_in_sympy():
    # MacMahon's triple product, evaluated independently with sympy rationals.
    for a, b, c in [(4, 5, 6), (7, 3, 2), (6, 6, 6)]:
        prod = sympy.Integer(1)
        for i in range(1, a + 1):
            for j in range(1, b + 1):
                for k in range(1, c + 1):
                    prod *= sympy.Rational(i + j + k - 1, i + j + k - 2)
        assert fl.lozenge.hexagon(a, b, c).count() == int(prod)


def test_volume_polynomial_2x2x2_published():
    # docs/references.md section 1 [checked]: coefficients of q^0..q^8 for the 2x2x2 box.
    assert fl.lozenge.hexagon(2, 2, 2).volume_polynomial() == [1, 1, 3, 3, 4, 3, 3, 1, 1]


@pytest.mark.parametrize("box", [(2, 2, 2), (2, 3, 2), (3, 3, 3), (1, 3, 4), (3, 2, 4)])
def test_volume_polynomial_matches_enumeration(box):
    assert fl.lozenge.hexagon(*box).volume_polynomial() == volume_counts(*box)


@pytest.mark.parametrize("q", [Fraction(3, 5), Fraction(7, 4), 0.6])
def test_q_partition_function_is_exact(q):
    poly = volume_counts(3, 3, 2)
    expected = sum(n * Fraction(q) ** v for v, n in enumerate(poly))
    assert fl.lozenge.hexagon(3, 3, 2, q=q).partition_function() == expected


def test_uniform_partition_function_is_the_count():
    assert fl.lozenge.hexagon(3, 3, 3).partition_function() == 980
