"""Height fields, fluctuations against the Gaussian free field, Tracy-Widom F2, samples against exact values.

Sources: the exact Var N table of docs/references.md section 4 (N: paths below
the centre of the n x n x n hexagon, computed by enumeration and an exact
kernel); Kenyon, "Height fluctuations in the honeycomb dimer model", Comm.
Math. Phys. 281 (2008) for the slopes 1/(2 pi^2) and 1/pi^2; Tracy and Widom,
"Level-spacing distributions and the Airy kernel", Comm. Math. Phys. 159
(1994) for the F2 mean -1.7711 and variance 0.8132 (values from memory).
Statistical checks use fixed seeds and 4 standard errors (two-sided false
alarm rate about 6e-5 for a normal estimate).
"""
from __future__ import annotations

import math

import numpy as np
import pytest

import frostline as fl
from frostline.analysis import POINTWISE_SLOPE, TWO_POINT_SLOPE

EXACT_VAR_N = {4: 0.156463, 8: 0.209736, 16: 0.257359, 32: 0.300309, 48: 0.323882, 64: 0.340099,
               96: 0.362404, 128: 0.377916}


def test_box_height_field_is_the_path_count_at_the_centre():
    # N = #{k : pp[k-1, k-1] >= k} and the centre height of the field differ by a constant on every tiling
    region = fl.lozenge.hexagon(3, 3, 3)
    tilings = fl.exact.enumerate(region)
    centre = np.array([region.height_field(h)[3, 3] for h in tilings])
    n_paths = np.array([sum(1 for k in range(1, 4) if h[k - 1, k - 1] >= k) for h in tilings])
    assert np.ptp(centre - n_paths) == 0
    assert np.var(n_paths) == pytest.approx(0.25408, abs=1e-5)  # Var N at n = 3 (docs/references.md)


def test_height_fields_of_every_lattice():
    aztec = fl.domino.aztec_diamond(4).sample(seed=2)
    np.testing.assert_array_equal(np.isnan(aztec.height_field()), ~aztec.region.corner_mask)
    assert np.nanmax(np.abs(np.diff(aztec.height_field(), axis=1))) <= 0.75  # +-1/4 or -+3/4 along an edge
    ice = fl.square_ice.domain_wall(5).sample(seed=2)
    assert set(np.abs(np.diff(ice.height_field(), axis=0)).ravel()) == {0.5}
    general = fl.lozenge.trapezoid(6, 4).sample(seed=2)
    np.testing.assert_array_equal(np.isnan(general.height_field()), ~general.region.vertex_mask)


@pytest.mark.parametrize("n, k", [(8, 3000), (16, 1500)])
def test_centre_variance_matches_the_exact_table(n, k):
    samples = fl.lozenge.hexagon(n, n, n).samples(k, seed=20261203)
    f = fl.analysis.height_fluctuations(samples, bootstrap=100)
    assert f.centre == (n, n)
    assert abs(f.pointwise_variance - EXACT_VAR_N[n]) < 4 * f.pointwise_error


def test_pointwise_slope_from_the_exact_table():
    # fitted with two 1/n corrections over n = 8..128: within 2% of 1/(2 pi^2) (0.0517 against 0.0507)
    slope, _ = fl.analysis.variance_growth({n: v for n, v in EXACT_VAR_N.items() if n >= 8}, corrections=2)
    assert slope == pytest.approx(POINTWISE_SLOPE, abs=0.002)
    with pytest.raises(ValueError):
        fl.analysis.variance_growth({8: 0.2, 16: 0.25}, corrections=2)


def test_two_point_slope_near_the_gaussian_free_field():
    samples = fl.lozenge.hexagon(24, 24, 24).samples(600, seed=7)
    f = fl.analysis.height_fluctuations(samples, bootstrap=100)
    assert list(f.distances) == [1, 2, 4, 8, 16]
    assert np.all(np.diff(f.two_point_variance[:4]) > 0)
    assert abs(f.slope - TWO_POINT_SLOPE) < 4 * f.slope_error


def test_fluctuations_refuse_bad_input():
    samples = fl.lozenge.hexagon(3, 3, 3).samples(5, seed=1)
    with pytest.raises(ValueError, match="three samples"):
        fl.analysis.height_fluctuations(samples[:2])
    with pytest.raises(ValueError, match="outside"):
        fl.analysis.height_fluctuations(samples, centre=(0, 0))
    with pytest.raises(ValueError, match="not an index"):
        fl.analysis.height_fluctuations(samples, centre=(50, 0))


def test_tracy_widom_moments():
    mean, variance = fl.analysis.tracy_widom_moments()
    assert mean == pytest.approx(-1.7711, abs=1e-4)
    assert variance == pytest.approx(0.8132, abs=1e-4)
    # quadrature converged: doubling the nodes changes F2 by less than 1e-10
    for s in (-3.0, -1.0, 1.0):
        assert fl.analysis.tracy_widom_cdf(s) == pytest.approx(fl.analysis.tracy_widom_cdf(s, nodes=80), abs=1e-10)
    assert fl.analysis.tracy_widom_cdf(-20) == 0.0 and fl.analysis.tracy_widom_cdf(20) == 1.0


def test_compare_with_exact_accepts_exact_samples_and_catches_a_wrong_law():
    region = fl.domino.aztec_diamond(6)
    report = fl.analysis.compare_with_exact(region.samples(800, seed=3))
    assert report.bonferroni_p > 1e-4 and 0.5 < report.mean_square_z < 1.5
    assert "Bonferroni" in str(report)
    # samples of the biased diamond against the uniform diamond's probabilities: rejected
    biased = fl.domino.aztec_diamond(6, vertical_weight=2.0).samples(800, seed=3)
    moved = [fl.Sample(region=region, heights=s.heights, info=s.info) for s in biased]
    assert fl.analysis.compare_with_exact(moved).bonferroni_p < 1e-4
    with pytest.raises(ValueError):
        fl.analysis.compare_with_exact([])


def test_compare_with_exact_on_a_weighted_lozenge_region():
    region = fl.lozenge.trapezoid(6, 4, q=0.7)
    report = fl.analysis.compare_with_exact(region.samples(1500, seed=9))
    assert report.bonferroni_p > 1e-4
    assert math.isclose(float(report.probabilities.sum()), region.n_lozenges, rel_tol=1e-9)


@pytest.mark.parametrize("make", [lambda: fl.lozenge.trapezoid(6, 4), lambda: fl.lozenge.trapezoid(6, 4, q=0.7),
                                  lambda: fl.domino.aztec_diamond(4),
                                  lambda: fl.domino.aztec_diamond(3, vertical_weight=2.0)])
def test_mean_heights_match_enumeration(make):
    region = make()
    mean = fl.exact.mean_heights(region)
    configurations, probabilities = fl.exact.distribution(region)
    exact = sum(float(p) * np.asarray(h, dtype=float) for h, p in zip(configurations, probabilities))
    inside = ~np.isnan(mean)
    assert inside.any()
    np.testing.assert_allclose(mean[inside], exact[inside], atol=1e-10)


def test_mean_heights_against_samples_of_a_larger_region():
    region = fl.domino.aztec_diamond(12)
    mean = fl.exact.mean_heights(region)
    stack = np.stack([s.heights for s in region.samples(400, seed=5)]).astype(float)
    r, c = 12, 12
    error = stack[:, r, c].std(ddof=1) / np.sqrt(len(stack))
    assert abs(stack[:, r, c].mean() - mean[r, c]) < 4 * error
    # boxes answer in their own layout, the plane partition (tests/test_box_mean_heights.py)
    box = fl.exact.mean_heights(fl.lozenge.hexagon(3, 3, 3))
    assert box.shape == (3, 3) and box.sum() == pytest.approx(13.5)   # half the box, by complementation
