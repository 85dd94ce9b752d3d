"""Placement probabilities of Aztec diamonds by the urban-renewal recursion (domino/edge_probabilities.py).

Checked against three things outside the recursion: exhaustive enumeration of
every tiling (exact Fractions, orders 1-4; the reference enumerator of
tests/reference/aztec.py), the inverse Kasteleyn matrix (Kenyon 1997) where
float64 still reaches it, and exact samples by domino shuffling (means of
heights within 5 standard errors: a false alarm rate below 1e-5 per point
by the normal approximation, with fixed seeds).
"""
from __future__ import annotations

from fractions import Fraction

import numpy as np
import pytest

import frostline as fl
from frostline.domino.edge_probabilities import aztec_placement_probabilities, edge_probabilities
from frostline.exact.local_statistics import kasteleyn_placement_probabilities
from reference.aztec import aztec_mask, tiling_weight, tilings, two_periodic_weights

WEIGHTS = {
    "uniform": lambda n: (None, None),
    "vertical weight 2": lambda n: (np.ones((2 * n, 2 * n - 1)), np.full((2 * n - 1, 2 * n), 2.0)),
    "two-periodic 1, 0.5": lambda n: two_periodic_weights(n, 1.0, 0.5),
    "random": lambda n: (np.random.default_rng(n).uniform(0.5, 2.0, (2 * n, 2 * n - 1)),
                         np.random.default_rng(n + 1).uniform(0.5, 2.0, (2 * n - 1, 2 * n))),
}


@pytest.mark.parametrize("name", sorted(WEIGHTS))
@pytest.mark.parametrize("n", [1, 2, 3, 4])
def test_exact_recursion_equals_enumeration(n, name):
    horizontal, vertical = WEIGHTS[name](n)
    tiles, p = aztec_placement_probabilities(n, horizontal, vertical, exact=True)
    weights = {t: tiling_weight(t, horizontal, vertical, exact=True) for t in tilings(aztec_mask(n))}
    total = sum(weights.values())
    expected = {}
    for tiling, weight in weights.items():
        for domino in tiling:
            key = tuple(int(v) for v in np.ravel(domino))
            expected[key] = expected.get(key, Fraction(0)) + weight / total
    got = {tuple(int(v) for v in np.ravel(t)): Fraction(x) for t, x in zip(tiles.tolist(), p)}
    positions = {k for k, v in got.items() if v != 0} | set(expected)
    assert all(got.get(k, 0) == expected.get(k, 0) for k in positions)


@pytest.mark.parametrize("name", sorted(WEIGHTS))
@pytest.mark.parametrize("n", [10, 30])
def test_float_recursion_equals_the_inverse_kasteleyn_matrix(n, name):
    horizontal, vertical = WEIGHTS[name](n)
    region = fl.domino.aztec_diamond(n) if horizontal is None else fl.domino.from_mask(
        aztec_mask(n), horizontal=horizontal, vertical=vertical)
    reference_tiles, reference = kasteleyn_placement_probabilities(region, tolerance=1e-9)
    tiles, p = aztec_placement_probabilities(n, horizontal, vertical)
    got = {tuple(np.ravel(t)): x for t, x in zip(tiles.tolist(), p)}
    assert len(got) == len(reference)
    worst = max(abs(got[tuple(np.ravel(t))] - x) for t, x in zip(reference_tiles.tolist(), reference))
    assert worst < 1e-12


def test_every_order_is_answered_and_stays_accurate():
    # order 300 was refused by the Kasteleyn route (condition numbers past 1e16 from order 50 on);
    # float64 against an 80-bit run of the same recursion: the float error stays near 1e-15
    region = fl.domino.aztec_diamond(300)
    tiles, p = fl.exact.placement_probabilities(region)
    assert len(p) == 4 * 300 * 300 and p.min() >= 0 and p.max() <= 1
    assert p.sum() == pytest.approx(300 * 301, rel=1e-12)  # n(n + 1) dominoes in every tiling
    wide = edge_probabilities(300, lambda k: np.full((k, k), np.longdouble(0.5), dtype=np.longdouble))
    narrow = edge_probabilities(300, lambda k: np.full((k, k), 0.5))
    assert max(float(np.max(np.abs(a - b))) for a, b in zip(wide, narrow)) < 1e-13


def test_mean_heights_past_order_50_match_shuffled_samples():
    n, k = 60, 300
    region = fl.domino.aztec_diamond(n)
    exact = fl.exact.mean_heights(region)
    heights = np.stack([s.heights for s in region.samples(k, seed=20261204)]).astype(float)
    mean, error = heights.mean(axis=0), heights.std(axis=0, ddof=1) / np.sqrt(k)
    moving = error > 0  # corners whose height varied among the samples (the rest carry no error estimate)
    assert moving.sum() > 2000
    assert np.all(np.abs(mean - exact)[moving] < 5 * error[moving])


def test_the_check_rejects_wrong_probabilities(monkeypatch):
    # the test can fail: probabilities that break the sum around a cell are refused
    import frostline.domino.region as module

    def broken(*args, **kwargs):
        tiles, p = aztec_placement_probabilities(*args, **kwargs)
        return tiles, p * 1.01

    monkeypatch.setattr(module, "aztec_placement_probabilities", broken)
    with pytest.raises(ValueError, match="sum to 1"):
        fl.exact.placement_probabilities(fl.domino.aztec_diamond(20))



def test_widely_spread_weights_stay_finite():
    # weights 1e-50 .. 1e50: the float recursion (log weights) against the exact one at order 5, and a
    # 1e-8 .. 1e8 spread answered at order 60 with every cell's probabilities summing to 1
    rng = np.random.default_rng(0)
    n = 5
    h = 10.0 ** rng.choice([-50, 0, 50], (2 * n, 2 * n - 1))
    v = 10.0 ** rng.choice([-50, 0, 50], (2 * n - 1, 2 * n))
    exact = aztec_placement_probabilities(n, h, v, exact=True)[1]
    np.testing.assert_allclose(aztec_placement_probabilities(n, h, v)[1], exact.astype(float), atol=1e-12)
    n = 60
    h = 10.0 ** rng.choice([-8, 0, 8], (2 * n, 2 * n - 1))
    v = 10.0 ** rng.choice([-8, 0, 8], (2 * n - 1, 2 * n))
    tiles, p = fl.domino.aztec_diamond(n, horizontal=h, vertical=v).placement_probabilities(tolerance=1e-9)
    assert p.min() >= 0 and p.max() <= 1


def test_long_density_computations_report_progress():
    from frostline.progress import exact_progress

    calls = []
    with exact_progress(lambda stage, done, total: calls.append((stage, done, total))):
        fl.exact.placement_probabilities(fl.domino.aztec_diamond(12))
        fl.exact.placement_probabilities(fl.lozenge.hexagon_region(3, 3, 3))
    aztec = [c for c in calls if c[0].startswith("Aztec diamond edge")]
    assert [done for _, done, _ in aztec] == list(range(1, 12)) and {t for *_, t in aztec} == {12}
    assert [done for stage, done, _ in calls if "inverse Kasteleyn" in stage] == [0, 1, 2, 3]
