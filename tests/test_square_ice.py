"""Square ice: counts, exact distributions, conversions, the monotonicity checker, weights."""
import math
from collections import Counter

import numpy as np
import pytest
from hypothesis import given, settings, strategies as st

import frostline as fl
from frostline.square_ice import conversions as cv
from reference.asm import asms, vertex_counts
from reference.statistics import P_FLOOR, pooled_chi_square

# OEIS A005130 (Zeilberger 1996; Kuperberg 1996): 1, 2, 7, 42, 429, 7436, 218348, 10850216
A005130 = [1, 1, 2, 7, 42, 429, 7436, 218348, 10850216]


@pytest.mark.parametrize("n", range(1, 9))
def test_asm_counts(n):
    assert fl.square_ice.domain_wall(n).count() == A005130[n]
    if n <= 7:  # the row transfer counts the same configurations independently of the product
        assert fl.square_ice.row_transfer(cv.domain_wall_boundary(n)) == A005130[n]
    if n <= 5:
        assert sum(1 for _ in asms(n)) == A005130[n]


@pytest.mark.parametrize("n", range(1, 8))
def test_two_enumeration(n):
    # Mills, Robbins, Rumsey 1983: sum over ASMs of 2^(#-1) = 2^(n(n-1)/2); with c = sqrt 2,
    # Z(1, 1, sqrt 2) = 2^(n/2) * that sum (each ASM has n + 2 #(-1) c vertices).
    z = float(fl.square_ice.domain_wall(n, 1, 1, math.sqrt(2)).partition_function())
    assert z == pytest.approx(2 ** (n / 2) * 2 ** (n * (n - 1) // 2), rel=1e-12)


def enumerated_z(n, a, b, c):
    return sum(a ** na * b ** nb * c ** nc for na, nb, nc in map(vertex_counts, asms(n)))


@pytest.mark.parametrize("weights", [(1.0, 1.0, math.sqrt(2)), (0.5, 1.3, 0.9), (3.0, 1.0, 1.0), (1.0, 1.0, 3.0),
                                     (2.0, 0.7, 1.1)])
@pytest.mark.parametrize("n", [1, 2, 3, 4, 5])
def test_izergin_korepin_and_row_transfer_against_enumeration(n, weights):
    # Izergin-Korepin (Korepin 1982, Izergin 1987), real and complex parametrisations (docs/references.md section 1)
    expected = enumerated_z(n, *weights)
    assert float(fl.square_ice.izergin_korepin(n, *weights)) == pytest.approx(expected, rel=1e-20 ** 0.5)
    assert float(fl.square_ice.row_transfer(cv.domain_wall_boundary(n), weights)) == pytest.approx(expected, rel=1e-12)


def test_izergin_korepin_published_check_values():
    # docs/references.md section 1: lambda = 1.3, eta = 0.35, a = sin(l + e), b = sin(l - e), c = sin 2e
    lam, eta = 1.3, 0.35
    a, b, c = math.sin(lam + eta), math.sin(lam - eta), math.sin(2 * eta)
    published = [0.644217687238, 0.68701183295, 0.994770418525, 1.85533654235, 4.36983609675]
    for n, value in enumerate(published, start=1):
        assert float(fl.square_ice.izergin_korepin(n, a, b, c)) == pytest.approx(value, rel=1e-10)


def test_izergin_korepin_free_fermion_is_one():
    # a = b = 1/sqrt 2, c = 1: Z_n = 1 (docs/references.md section 1)
    for n in (6, 12, 20):
        assert float(fl.square_ice.izergin_korepin(n, 2 ** -0.5, 2 ** -0.5, 1.0)) == pytest.approx(1.0, rel=1e-12)


def matrix_key(S):
    return tuple(map(tuple, S.matrix.tolist()))


def draw(region, n, seed, method="auto"):
    return Counter(matrix_key(region.sample(s, method=method)) for s in np.random.SeedSequence(seed).spawn(n))


@pytest.mark.parametrize("order, n", [(4, 3000), (5, 8000)])
def test_uniform_samples_match_enumeration(order, n):
    law = {tuple(map(tuple, m.tolist())): 1 / A005130[order] for m in asms(order)}
    assert pooled_chi_square(draw(fl.square_ice.domain_wall(order), n, 1), law, n) > P_FLOOR


@pytest.mark.parametrize("weights", [(1.0, 1.0, math.sqrt(2)), (1.0, 2.0, 2.5), (1.0, 2.0, math.sqrt(5))])
@pytest.mark.parametrize("order", [3, 4])
def test_weighted_samples_match_enumeration(order, weights):
    a, b, c = weights
    w = {tuple(map(tuple, m.tolist())): a ** na * b ** nb * c ** nc
         for m in asms(order) for na, nb, nc in [vertex_counts(m)]}
    total = sum(w.values())
    law = {k: v / total for k, v in w.items()}
    n = 4000
    assert pooled_chi_square(draw(fl.square_ice.domain_wall(order, *weights), n, 7), law, n) > P_FLOOR


@given(st.integers(1, 10), st.sampled_from([(1, 1, 1), (1, 1, 2 ** 0.5), (1, 2, 2.5), (0.5, 0.5, 1.0)]),
       st.integers(0, 2**40))
@settings(max_examples=40)
def test_fast_kernel_equals_generic_bit_for_bit(n, weights, seed):
    R = fl.square_ice.domain_wall(n, *weights)
    fast, slow = R.sample(seed=seed, method="cftp"), R.sample(seed=seed, method="generic")
    assert np.array_equal(fast.heights, slow.heights)
    assert fast.info.site_updates == slow.info.site_updates


@given(st.integers(1, 9), st.integers(0, 2**40))
@settings(max_examples=40)
def test_conversions_round_trip(n, seed):
    S = fl.square_ice.domain_wall(n).sample(seed=seed)
    assert cv.is_alternating_sign_matrix(S.matrix)
    assert np.array_equal(cv.heights_from_matrix(S.matrix), S.heights)
    horizontal, vertical = S.arrows
    assert np.array_equal(cv.heights_from_arrows(horizontal, vertical), S.heights)
    types = cv.vertex_types_from_arrows(horizontal, vertical)
    assert np.array_equal(types, S.vertex_types)
    back = cv.arrows_from_vertex_types(types)
    assert np.array_equal(back[0], horizontal) and np.array_equal(back[1], vertical)
    # c1 at +1 entries, c2 at -1 entries; a/b at zeros as in docs/references.md section 1
    assert np.array_equal(S.vertex_types == 4, S.matrix == 1) and np.array_equal(S.vertex_types == 5, S.matrix == -1)
    na, nb, nc = vertex_counts(S.matrix)
    assert (np.isin(S.vertex_types, (0, 1)).sum(), np.isin(S.vertex_types, (2, 3)).sum()) == (na, nb)


def test_domain_wall_arrows():
    # horizontal arrows point in, vertical ones out (docs/design.md convention drawn in the docs)
    horizontal, vertical = fl.square_ice.domain_wall(5).sample(seed=0).arrows
    assert np.all(horizontal[:, 0] == 1) and np.all(horizontal[:, -1] == -1)
    assert np.all(vertical[0, :] == 1) and np.all(vertical[-1, :] == -1)


# ----- monotonicity -------------------------------------------------------------------

@pytest.mark.parametrize("make", [
    lambda: fl.lozenge.hexagon(3, 3, 3), lambda: fl.lozenge.hexagon(3, 3, 3, q=0.7),
    lambda: fl.lozenge.hexagon_region(3, 2, 3, q=1.3), lambda: fl.domino.aztec_diamond(3, vertical_weight=2.5),
    lambda: fl.domino.aztec_diamond(4, two_periodic_weights=(1.0, 0.4)),
    lambda: fl.square_ice.domain_wall(5), lambda: fl.square_ice.domain_wall(5, 1, 1, 2 ** 0.5),
    lambda: fl.square_ice.domain_wall(5, 1, 2, 2.5), lambda: fl.square_ice.domain_wall(5, 2, 1, 2.0),
])
def test_checker_accepts_monotone_rules(make):
    assert fl.check_monotone(make()).monotone


@pytest.mark.parametrize("weights", [(1, 2, 1.9), (2, 1, 1.9), (1, 1, 0.9), (3, 1, 1)])
def test_checker_refutes_six_vertex_rules_with_c_below_max_a_b(weights):
    # docs/references.md section 5 predicts monotone exactly when c >= max(a, b); the checker agrees
    R = fl.square_ice.domain_wall(5, *weights)
    report = fl.check_monotone(R)
    assert not report.monotone and "lowers the drawn height" in report.detail
    with pytest.raises(ValueError, match="non-monotone"):
        R.sample(seed=0)


def test_checker_rejects_a_rule_built_to_be_non_monotone():
    # A context rule on a path whose chance of going up falls when the context node rises.
    from reference.models import path_with_context_rule

    model, rule = path_with_context_rule([2**63 + 2**62, 2**62])
    assert not fl.check_monotone(model, rule=rule).monotone
    model, rule = path_with_context_rule([2**62, 2**63])  # rising with the context: monotone
    assert fl.check_monotone(model, rule=rule).monotone


def test_non_monotone_weights_still_run_chains_with_diagnostics():
    R = fl.square_ice.domain_wall(8, 1, 2, 1.9)
    d = fl.equilibrium_diagnostics(R, 400, seed=3, every=4)
    assert d.gap[0] > d.gap[-1] >= 0 and d.autocorrelation_time >= 0.5 * 4
    chain = R.chain(seed=1)
    chain.run(50)
    assert cv.is_alternating_sign_matrix(cv.matrix_from_heights(chain.heights))


# ----- other boundaries and bad input -----------------------------------------------------

def fillings(boundary):
    """Brute force: interior heights with neighbours differing by exactly 1."""
    h = np.array(boundary, dtype=int)
    n = h.shape[0] - 1
    cells = [(i, j) for i in range(1, n) for j in range(1, n)]

    def extend(k):
        if k == len(cells):
            yield 1
            return
        i, j = cells[k]
        for v in (h[i - 1, j] - 1, h[i - 1, j] + 1):
            if abs(v - h[i, j - 1]) == 1:
                h[i, j] = v
                if (i + 1 < n or abs(v - h[n, j]) == 1) and (j + 1 < n or abs(v - h[i, n]) == 1):
                    yield from extend(k + 1)

    return sum(extend(0))


def test_general_boundary_counts_and_samples():
    big = fl.square_ice.domain_wall(7).sample(seed=5).heights
    boundary = big[1:6, 2:7].copy()  # the border of a 4 x 4 window of a domain-wall configuration
    R = fl.square_ice.from_boundary(boundary)
    assert R.count() == fillings(boundary) > 0
    S = R.sample(seed=2)
    assert np.array_equal(S.heights[0], boundary[0]) and np.array_equal(S.heights[:, -1], boundary[:, -1])
    assert np.all(np.abs(np.diff(S.heights, axis=0)) == 1) and np.all(np.abs(np.diff(S.heights, axis=1)) == 1)


@pytest.mark.parametrize("boundary, words", [
    (np.array([[0, 1, 3], [1, 0, 1], [2, 1, 0]]), "differ by exactly 1"),
    (np.zeros((1, 1), int), "n >= 1"),
    (np.zeros((3, 4), int), "n >= 1"),
])
def test_invalid_boundaries(boundary, words):
    with pytest.raises(ValueError, match=words):
        fl.square_ice.from_boundary(boundary)


def test_boundary_without_filling_names_the_corner():
    # a valid border (steps of 1 all round) that no interior can fill (found by brute force)
    h = np.array([[0, 1, 2, 3], [1, 0, 0, 4], [0, 0, 0, 5], [1, 2, 3, 4]])
    with pytest.raises(ValueError, match="corner"):
        fl.square_ice.from_boundary(h)


@pytest.mark.parametrize("call, error", [
    (lambda: fl.square_ice.domain_wall(0), ValueError), (lambda: fl.square_ice.domain_wall(3.0), TypeError),
    (lambda: fl.square_ice.domain_wall(3, a=-1), ValueError), (lambda: fl.square_ice.domain_wall(3, c=math.nan), ValueError),
    (lambda: fl.square_ice.domain_wall(3, b=math.inf), ValueError), (lambda: fl.square_ice.domain_wall(3, a="1"), TypeError),
    (lambda: fl.square_ice.domain_wall(10**6), ValueError),
    (lambda: fl.square_ice.domain_wall(3).sample(seed=0, method="shuffling"), ValueError),
])
def test_bad_input(call, error):
    with pytest.raises(error):
        call()


def test_closed_form_extremes_match_thurston():
    """The L1-transform extremes (square_ice/extremes.py) equal the engine's Thurston extremes on many borders.

    Borders come from the rims of sampled configurations (always fillable) and from random walks around the
    ring (often not fillable, where the closed form must say so). Fixed seeds.
    """
    from frostline.model import HeightModel
    from frostline.square_ice.extremes import extremes

    rng = np.random.default_rng(12)
    borders = []
    for n in (1, 2, 3, 5, 8, 13):
        borders.append(fl.square_ice.domain_wall(n).boundary)
        heights = fl.square_ice.domain_wall(n + 2).sample(seed=int(rng.integers(100))).heights
        borders.append(heights[1:-1, 1:-1] - heights[1, 1] + 2 * (heights[1, 1] % 2))
    for n in (2, 3, 4, 6):  # random rings: steps of +-1 that close up
        for _ in range(30):
            length = 4 * n
            steps = rng.permutation([1] * (length // 2) + [-1] * (length // 2))
            ring = np.concatenate([[0], np.cumsum(steps)[:-1]])
            h = np.zeros((n + 1, n + 1), dtype=np.int64)
            cells = ([(0, j) for j in range(n + 1)] + [(i, n) for i in range(1, n + 1)]
                     + [(n, j) for j in range(n - 1, -1, -1)] + [(i, 0) for i in range(n - 1, 0, -1)])
            for (i, j), value in zip(cells, ring):
                h[i, j] = value
            borders.append(h)
    fillable = unfillable = 0
    for border in borders:
        n = border.shape[0] - 1
        known = extremes(border)
        try:
            region = fl.square_ice.from_boundary(border)
        except ValueError:
            assert known is None
            unfillable += 1
            continue
        assert known is not None
        fillable += 1
        # the engine's extremes of the same model, by Thurston's algorithm
        model = region._model
        fresh = HeightModel(model.n_sites, model.boundary_values, model.constraints, model.residues, model.step,
                            model.colour_classes)
        least, greatest = fresh.extremes()
        np.testing.assert_array_equal(region._grid(least), known[0])
        np.testing.assert_array_equal(region._grid(greatest), known[1])
    assert fillable > 20 and unfillable > 5
