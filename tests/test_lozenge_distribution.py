"""Exact samples of plane partitions against exhaustive enumeration (chi-square).

Every test uses fixed seeds and the p-value floor P_FLOOR = 1e-4, so a correct
sampler fails each test with probability 1e-4; the outcome is reproducible.
"""
from collections import Counter

import numpy as np
import pytest

import frostline as fl
from reference.plane_partitions import plane_partitions
from reference.statistics import P_FLOOR, pooled_chi_square


def exact_law(a, b, c, q):
    weights = {p: q ** sum(p) for p in plane_partitions(a, b, c)}
    total = sum(weights.values())
    return {p: w / total for p, w in weights.items()}


def draw(region, n, seed, method="auto"):
    children = np.random.SeedSequence(seed).spawn(n)
    return Counter(tuple(int(v) for v in region.sample(s, method=method).heights.ravel()) for s in children)


@pytest.mark.parametrize("q", [1.0, 0.6, 1.7])
@pytest.mark.parametrize("box, n", [((2, 2, 2), 4000), ((3, 3, 3), 20000)])
def test_exact_samples_match_enumeration(box, n, q):
    # 20 and 980 plane partitions (MacMahon; OEIS A008793), weights q^volume
    law = exact_law(*box, q)
    observed = draw(fl.lozenge.hexagon(*box, q=q), n, seed=20261202)
    assert pooled_chi_square(observed, law, n) > P_FLOOR


@pytest.mark.parametrize("q", [1.0, 0.6])
def test_generic_engine_distribution(q):
    law = exact_law(2, 3, 2, q)
    n = 4000
    observed = draw(fl.lozenge.hexagon(2, 3, 2, q=q), n, seed=7, method="generic")
    assert pooled_chi_square(observed, law, n) > P_FLOOR


def test_chi_square_detects_a_wrong_law():
    # The test can fail: samples of q = 0.6 are rejected against the uniform law.
    law = exact_law(2, 2, 2, 1.0)
    observed = draw(fl.lozenge.hexagon(2, 2, 2, q=0.6), 4000, seed=3)
    assert pooled_chi_square(observed, law, 4000) < P_FLOOR


@pytest.mark.parametrize("q", [1.0, 0.6])
def test_forward_chains_reach_the_exact_law(q):
    # 4000 independent chains, 300 sweeps each from the least state: the states
    # are independent, and their law is within far less than 1e-6 of the
    # stationary one (the 2x2x2 chain forgets its start in a few sweeps).
    law = exact_law(2, 2, 2, q)
    R = fl.lozenge.hexagon(2, 2, 2, q=q)
    observed = Counter()
    for s in np.random.SeedSequence(11).spawn(4000):
        chain = R.chain(seed=s)
        chain.run(300)
        observed[tuple(int(v) for v in chain.heights.ravel())] += 1
    assert pooled_chi_square(observed, law, 4000) > P_FLOOR
