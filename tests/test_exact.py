"""The exact toolkit: enumeration for any plugin, counts by several methods, local statistics, ensembles."""
import math
from collections import Counter
from fractions import Fraction

import numpy as np
import pytest

import frostline as fl
from reference.asm import asms, vertex_counts
from reference.domino_tilings import domino_tilings, weight
from reference.plane_partitions import plane_partitions


def test_enumeration_of_plane_partitions_from_the_generic_model():
    # 980 plane partitions in the 3x3x3 box (OEIS A008793), weights q^volume
    R = fl.lozenge.hexagon(3, 3, 3, q=Fraction(1, 2))
    configurations, p = fl.exact.distribution(R)
    found = {tuple(h.ravel().tolist()): pr for h, pr in zip(configurations, p)}
    expected = {pp: Fraction(1, 2) ** sum(pp) for pp in plane_partitions(3, 3, 3)}
    total = sum(expected.values())
    assert found == {k: v / total for k, v in expected.items()}


def test_enumeration_of_weighted_dominoes():
    R = fl.domino.aztec_diamond(3, two_periodic_weights=(1.0, 0.5))
    configurations, p = fl.exact.distribution(R)
    law = {frozenset(tuple(map(tuple, d)) for d in R.tiles_from_heights(h).tolist()): pr
           for h, pr in zip(configurations, p)}
    reference = {t: weight(t, *R.weights) for t in domino_tilings(R.mask)}
    total = sum(reference.values())
    assert len(law) == 64 and all(float(law[t]) == pytest.approx(w / total, rel=1e-12) for t, w in reference.items())


def test_enumeration_of_square_ice():
    R = fl.square_ice.domain_wall(4, 1.0, 2.0, 2.5)
    configurations, p = fl.exact.distribution(R)
    law = {tuple(map(tuple, fl.square_ice.conversions.matrix_from_heights(h).tolist())): pr
           for h, pr in zip(configurations, p)}
    w = {tuple(map(tuple, m.tolist())): 1.0 ** na * 2.0 ** nb * 2.5 ** nc
         for m in asms(4) for na, nb, nc in [vertex_counts(m)]}
    total = sum(w.values())
    assert len(law) == 42 and all(float(law[k]) == pytest.approx(v / total, rel=1e-12) for k, v in w.items())


def test_enumeration_refuses_big_regions():
    with pytest.raises(fl.exact.EnumerationTooLarge, match="more than 1000"):
        fl.exact.enumerate(fl.lozenge.hexagon(4, 4, 4), cap=1000)


def test_twenty_cube_count_three_ways():
    # M(20,20,20) ~ 1.59e136 (docs/references.md section 1): MacMahon's formula, the Kasteleyn
    # determinant of the 1200 x 1200 triangle adjacency, and the q-analogue at q = 1
    # (the sum of the volume polynomial's coefficients).
    m = fl.lozenge.hexagon(20, 20, 20).count()
    assert fl.lozenge.hexagon_region(20, 20, 20).count() == m
    assert sum(fl.exact.formulas.volume_polynomial(20, 20, 20)) == m
    assert str(m).startswith("15903582500804731054") and len(str(m)) == 137


@pytest.mark.parametrize("n", [1, 2, 3, 4, 5, 6])
def test_aztec_counts_every_way(n):
    # OEIS A006125: closed form, Kasteleyn determinant, urban renewal, enumeration (small n)
    R = fl.domino.aztec_diamond(n)
    count = 2 ** (n * (n + 1) // 2)
    det = abs(fl.exact.integer_determinant(fl.domino.kasteleyn_matrix(R.mask)))
    from frostline.domino.urban_renewal import aztec_partition_function

    assert R.count() == det == aztec_partition_function(n) == count
    if n <= 3:
        assert len(fl.exact.enumerate(R)) == count


# ----- local statistics -----------------------------------------------------------------

def covering_sums(tiles, p, cells_of):
    sums = Counter()
    for tile, pr in zip(tiles.tolist(), p.tolist()):
        for cell in cells_of(tile):
            sums[cell] += pr
    return np.array(list(sums.values()))


def test_lozenge_probabilities_cover_each_triangle_once_and_count_types():
    a, b, c = 6, 5, 4
    tiles, p = fl.exact.placement_probabilities(fl.lozenge.hexagon(a, b, c))
    partner = {0: (0, 0), 1: (0, -1), 2: (-1, 0)}
    sums = covering_sums(tiles, p, lambda t: [(t[0], t[1], 0), (t[0] + partner[t[2]][0], t[1] + partner[t[2]][1], 1)])
    assert np.allclose(sums, 1.0, atol=1e-9)
    # expected numbers of each type: ab, bc, ca (common practice: every tiling has exactly these)
    totals = [p[tiles[:, 2] == t].sum() for t in range(3)]
    assert np.allclose(totals, [a * b, b * c, c * a], atol=1e-8)


def test_centre_densities_regular_hexagon_and_aztec():
    # Each lozenge type has density 1/3 at the centre of a regular hexagon (symmetry);
    # each domino class 1/4 at the centre of the Aztec diamond (Cohn, Elkies, Propp 1996).
    for name, (centres, p) in fl.exact.class_densities(fl.lozenge.hexagon(24, 24, 24)).items():
        near = np.hypot(centres[:, 0] - 12, centres[:, 1] - 12 * math.sqrt(3)) < 1.6
        assert p[near].mean() == pytest.approx(1 / 3, abs=0.01), name
    for name, (centres, p) in fl.exact.class_densities(fl.domino.aztec_diamond(30)).items():
        near = np.hypot(centres[:, 0], centres[:, 1]) < 1.6
        assert p[near].mean() == pytest.approx(1 / 4, abs=0.01), name


def cep_north(x, y):
    """Cohn-Elkies-Propp (Duke Math. J. 85, 1996), as stated in docs/references.md section 3 (formula from memory)."""
    return 0.5 + math.atan((2 * y - 1) / math.sqrt(1 - 2 * x * x - 2 * y * y)) / math.pi


def test_aztec_densities_against_cohn_elkies_propp():
    n = 44
    centres, p = fl.exact.class_densities(fl.domino.aztec_diamond(n))["north"]
    for x, y in [(0.25, 0.25), (-0.3, 0.2), (0.0, -0.3)]:
        near = np.hypot(centres[:, 0] / n - x, centres[:, 1] / n - y) < 2.5 / n
        # averaged over a few cells; finite-n values oscillate by O(1/n) (docs/references.md section 3)
        assert p[near].mean() == pytest.approx(cep_north(x, y), abs=0.015)


def test_aztec_reflection_symmetry():
    # P_N(x, y) = P_S(-x, -y) (docs/references.md section 3)
    d = fl.exact.class_densities(fl.domino.aztec_diamond(10))
    north = {tuple(np.round(c, 6)): v for c, v in zip(*d["north"])}
    south = {tuple(np.round(-c, 6)): v for c, v in zip(*d["south"])}
    assert north.keys() == south.keys()
    assert all(abs(north[k] - south[k]) < 1e-9 for k in north)


@pytest.mark.parametrize("make", [lambda: fl.lozenge.hexagon(12, 12, 12), lambda: fl.domino.aztec_diamond(12)])
def test_sample_frequencies_match_exact_probabilities(make):
    # 2000 exact samples; at each tile position with 0.01 < p < 0.99 the standardised
    # difference z = (f - p) / sqrt(p (1 - p) / N) must stay below 5.5. Each position
    # fails with probability ~4e-8 under the normal approximation, so the whole test
    # (a few thousand positions) has a false-alarm rate below 2e-4.
    R = make()
    tiles, p = fl.exact.placement_probabilities(R)
    index = {tuple(np.asarray(t).ravel().tolist()): k for k, t in enumerate(tiles)}
    counts = np.zeros(len(p))
    N = 2000
    for S in R.samples(N, seed=2026):
        for t in S.tiles:
            counts[index[tuple(np.asarray(t).ravel().tolist())]] += 1
    f = counts / N
    keep = (p > 0.01) & (p < 0.99)
    z = (f[keep] - p[keep]) / np.sqrt(p[keep] * (1 - p[keep]) / N)
    assert np.abs(z).max() < 5.5


def test_local_statistics_refuse_rather_than_mislead():
    with pytest.raises(ValueError, match="floating point cannot"):
        fl.exact.placement_probabilities(fl.domino.rectangle(6, 8), tolerance=1e-30)
    # q ** volume is an edge weighting (tests/test_q_edge_weights.py): answered, and each up triangle sums to 1
    tiles, p = fl.exact.placement_probabilities(fl.lozenge.hexagon(3, 3, 3, q=0.5))
    assert p.sum() == pytest.approx(27)
    with pytest.raises(ValueError, match="no Kasteleyn matrix"):
        fl.exact.placement_probabilities(fl.square_ice.domain_wall(4))


def test_weighted_domino_probabilities_match_enumeration():
    R = fl.domino.aztec_diamond(3, vertical_weight=2.0)
    tiles, p = fl.exact.placement_probabilities(R)
    reference = {t: weight(t, *R.weights) for t in domino_tilings(R.mask)}
    total = sum(reference.values())
    for tile, pr in zip(tiles.tolist(), p.tolist()):
        key = (tuple(tile[0]), tuple(tile[1]))
        assert pr == pytest.approx(sum(w for t, w in reference.items() if key in t) / total, abs=1e-10)


# ----- ensembles ----------------------------------------------------------------------------

@pytest.mark.parametrize("make", [lambda: fl.lozenge.hexagon(10, 10, 10, q=0.9), lambda: fl.domino.aztec_diamond(20),
                                  lambda: fl.square_ice.domain_wall(12)])
def test_ensembles_do_not_depend_on_thread_count(make):
    R = make()
    one = R.samples(6, seed=9, threads=1)
    three = R.samples(6, seed=9, threads=3)
    children = np.random.SeedSequence(9).spawn(6)
    for a, b, child in zip(one, three, children):
        assert np.array_equal(a.heights, b.heights)
        assert np.array_equal(a.heights, R.sample(child).heights)
        assert a.info.seed.spawn_key == tuple(child.spawn_key)


def test_ensemble_arguments():
    R = fl.lozenge.hexagon(2, 2, 2)
    assert R.samples(0, seed=1) == []
    with pytest.raises(ValueError):
        R.samples(3, seed=1, threads=0)
    with pytest.raises(TypeError):
        R.samples(2.5, seed=1)


def test_log_partition_functions():
    # Float logs against the exact values: MacMahon (OEIS A008793) and (1 + a^2)^(n(n+1)/2)
    assert fl.exact.log_partition_function(fl.lozenge.hexagon(12, 10, 8)) == pytest.approx(
        math.log(fl.lozenge.hexagon(12, 10, 8).count()), rel=1e-10)
    n, a = 20, 1.5
    assert fl.exact.log_partition_function(fl.domino.aztec_diamond(n, vertical_weight=a)) == pytest.approx(
        n * (n + 1) / 2 * math.log(1 + a * a), rel=1e-10)
    # domino entropy per cell tends to G/pi = 0.2915609 (docs/references.md section 1); 40 x 40 is close
    assert fl.exact.log_partition_function(fl.domino.rectangle(40, 40)) / 1600 == pytest.approx(0.2915609, abs=0.01)


def test_ensemble_from_a_seed_sequence_is_repeatable():
    # Spawning mutates a SeedSequence; passing the same one twice must still give the same ensemble.
    R = fl.lozenge.hexagon(4, 4, 4)
    ss = np.random.SeedSequence(123)
    first = [s.heights for s in R.samples(4, seed=ss, threads=1)]
    second = [s.heights for s in R.samples(4, seed=ss, threads=1)]
    assert all(np.array_equal(a, b) for a, b in zip(first, second))
    assert all(np.array_equal(a, R.sample(c).heights) for a, c in zip(first, np.random.SeedSequence(123).spawn(4)))
