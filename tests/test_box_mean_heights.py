"""Exact mean plane partition of a box hexagon, uniform and q ** volume (frostline.lozenge.box_mean_heights)."""
from __future__ import annotations

import itertools
import math

import numpy as np
import pytest

import frostline as fl


def plane_partitions(a, b, c):
    """Every a x b array with entries in 0..c, non-increasing along rows and columns (brute force)."""
    for flat in itertools.product(range(c + 1), repeat=a * b):
        h = np.array(flat).reshape(a, b)
        if (np.diff(h, axis=0) <= 0).all() and (np.diff(h, axis=1) <= 0).all():
            yield h


@pytest.mark.parametrize("a, b, c, q", [(2, 2, 2, 1.0), (3, 3, 3, 1.0), (2, 3, 4, 1.0), (2, 2, 2, 0.6),
                                        (2, 3, 2, 0.6), (2, 2, 2, 1.7), (2, 3, 2, 1.7), (4, 1, 3, 0.5)])
def test_mean_plane_partition_equals_enumeration(a, b, c, q):
    # the definition: the q ** volume weighted mean over every plane partition in the box
    hs = np.array(list(plane_partitions(a, b, c)), dtype=float)
    w = q ** hs.reshape(len(hs), -1).sum(axis=1)
    exact = (hs * w[:, None, None]).sum(axis=0) / w.sum()
    assert np.allclose(fl.exact.mean_heights(fl.lozenge.hexagon(a, b, c, q=q)), exact, atol=1e-12)


def test_complementing_the_box_maps_q_to_one_over_q():
    # h -> c - h rotated half a turn is a bijection of the box that maps volume V to abc - V (common practice)
    a, b, c, q = 5, 4, 6, 0.8
    forward = fl.exact.mean_heights(fl.lozenge.hexagon(a, b, c, q=q))
    backward = fl.exact.mean_heights(fl.lozenge.hexagon(a, b, c, q=1 / q))
    assert np.allclose(forward, c - backward[::-1, ::-1], atol=1e-10)
    assert not np.allclose(forward, backward, atol=1e-3)  # the test can tell q from 1/q


def log_macmahon_q(a, b, c, q):
    """log of MacMahon's q-analogue: prod_{i,j,k} (1 - q^(i+j+k-1)) / (1 - q^(i+j+k-2)) (MacMahon 1916)."""
    return sum(math.log((1 - q ** (i + j + k - 1)) / (1 - q ** (i + j + k - 2)))
               for i in range(1, a + 1) for j in range(1, b + 1) for k in range(1, c + 1))


@pytest.mark.parametrize("q", [0.9, 1.15])
def test_mean_volume_is_the_derivative_of_macmahons_q_analogue(q):
    # E_q[volume] = q d/dq log Z(q), Z the q-analogue of MacMahon's formula; a central difference in log q
    a, b, c = 9, 8, 7
    eps = 1e-5
    volume = (log_macmahon_q(a, b, c, q * math.exp(eps)) - log_macmahon_q(a, b, c, q * math.exp(-eps))) / (2 * eps)
    mean = fl.exact.mean_heights(fl.lozenge.hexagon(a, b, c, q=q))
    assert mean.sum() == pytest.approx(volume, rel=1e-7)
    assert (np.diff(mean, axis=0) <= 1e-12).all() and (np.diff(mean, axis=1) <= 1e-12).all()


def test_uniform_box_mean_volume_is_half_the_box():
    mean = fl.exact.mean_heights(fl.lozenge.hexagon(12, 12, 12))
    assert mean.sum() == pytest.approx(12 ** 3 / 2, rel=1e-12)   # complementation symmetry
    assert np.allclose(mean, 12 - mean[::-1, ::-1], atol=1e-9)


def test_exact_means_agree_with_samples():
    # 300 exact samples of the 6 x 5 x 4 box at q = 0.9: every column's mean within 5 standard errors
    # (false alarm per column below 6e-7 for a normal mean, so below 2e-5 over the 30 columns)
    region = fl.lozenge.hexagon(6, 5, 4, q=0.9)
    stack = np.array([s.heights for s in region.samples(300, seed=11)], dtype=float)
    error = stack.std(axis=0, ddof=1) / np.sqrt(len(stack))
    exact = fl.exact.mean_heights(region)
    assert (np.abs(stack.mean(axis=0) - exact) <= 5 * error + 1e-9).all()


def test_long_runs_are_refused_with_their_estimate_and_closed_forms_hold():
    from frostline.lozenge.box_mean_heights import mean_volume

    with pytest.raises(ValueError, match="budget=None"):
        fl.exact.mean_heights(fl.lozenge.hexagon(3, 3, 1000))
    # the closed-form mean volume against a numerical derivative of the product (MacMahon 1916)
    a, b, c, q, eps = 4, 5, 3, 0.7, 1e-6
    derivative = (log_macmahon_q(a, b, c, q * math.exp(eps)) - log_macmahon_q(a, b, c, q * math.exp(-eps))) / (2 * eps)
    assert mean_volume(a, b, c, q) == pytest.approx(derivative, rel=1e-8)
    assert mean_volume(a, b, c, 1.0) == a * b * c / 2


def test_count_laws_refuse_a_kernel_that_is_not_a_point_process():
    from frostline.lozenge.box_mean_heights import count_laws

    good = np.diag([0.3, 0.6])
    assert np.allclose(count_laws(good, 1e-9)[2], [0.7 * 0.4, 0.3 * 0.4 + 0.7 * 0.6, 0.18])
    with pytest.raises(ValueError, match="floating point cannot"):
        count_laws(np.diag([0.3, 1.4]), 1e-9)   # a "probability" above 1 makes a negative one
