"""Domino tilings: counts, exact distributions of CFTP against enumeration, heights, classes, bad input."""
from collections import Counter

import numpy as np
import pytest
import sympy
from hypothesis import given, settings, strategies as st

import frostline as fl
from reference.domino_tilings import domino_tilings, weight
from reference.statistics import P_FLOOR, pooled_chi_square

# OEIS A006125 (Elkies, Kuperberg, Larsen, Propp 1992): 2^(n(n+1)/2)
A006125 = [1, 2, 8, 64, 1024, 32768, 2097152, 268435456, 68719476736, 35184372088832, 36028797018963968]
# OEIS A004003: domino tilings of the 2n x 2n square
A004003 = [1, 2, 36, 6728, 12988816, 258584046368, 53060477521960000]

IRREGULAR = """
.##..
####.
.####
..##.
"""


def tile_set(tiles):
    return frozenset(tuple(map(tuple, d)) for d in np.asarray(tiles).tolist())


@pytest.mark.parametrize("n", range(1, 11))
def test_aztec_counts(n):
    R = fl.domino.aztec_diamond(n)
    assert R.count() == A006125[n]
    if n <= 6:  # and by the Kasteleyn determinant, independently of the closed form
        assert abs(fl.exact.integer_determinant(fl.domino.kasteleyn_matrix(R.mask))) == A006125[n]


@pytest.mark.parametrize("n", range(1, 7))
def test_square_counts(n):
    assert fl.domino.rectangle(2 * n, 2 * n).count() == A004003[n]


@pytest.mark.parametrize("m, n", [(2, 3), (3, 4), (5, 6), (7, 8), (1, 10), (9, 4)])
def test_rectangle_counts_product_formula_vs_determinant(m, n):
    # Kasteleyn (1961), Temperley-Fisher (1961): the product against an exact determinant
    R = fl.domino.rectangle(m, n)
    det = abs(fl.exact.integer_determinant(fl.domino.kasteleyn_matrix(R.mask)))
    assert R.count() == det == sum(1 for _ in domino_tilings(R.mask)) if m * n <= 24 else R.count() == det


def kasteleyn_product(m, n):
    """The Kasteleyn / Temperley-Fisher (1961) product in real arithmetic (mpmath), rounded: the reference."""
    import mpmath

    with mpmath.workdps(int(0.13 * m * n) + 40):
        value = mpmath.mpf(1)
        for j in range(1, (m + 1) // 2 + 1):
            for k in range(1, (n + 1) // 2 + 1):
                value *= 4 * mpmath.cos(mpmath.pi * j / (m + 1)) ** 2 + 4 * mpmath.cos(mpmath.pi * k / (n + 1)) ** 2
        return int(mpmath.nint(value))


@pytest.mark.parametrize("m, n", [(m, n) for m in range(1, 13) for n in range(1, 13) if m * n % 2 == 0]
                         + [(2, 301), (31, 40), (64, 64), (3, 1000), (120, 7)])
def test_rectangle_resultant_equals_the_real_product(m, n):
    # the resultant form (frostline.domino.rectangle_resultant) against the product it rewrites
    from frostline.domino.counts import rectangle_count

    assert rectangle_count(m, n) == rectangle_count(n, m) == kasteleyn_product(m, n)


def test_rectangle_counts_of_thin_strips_are_fibonacci_and_a_recurrence():
    from frostline.domino.counts import rectangle_count

    # 2 x n: Fibonacci numbers F(n+1) (common practice; OEIS A000045)
    fib = [1, 1]
    for _ in range(400):
        fib.append(fib[-1] + fib[-2])
    assert [rectangle_count(2, n) for n in range(1, 400)] == fib[1:400]
    # 3 x 2n: a(n) = 4 a(n-1) - a(n-2), 1, 3, 11, 41, 153 (OEIS A001835)
    a = [1, 3]
    for _ in range(200):
        a.append(4 * a[-1] - a[-2])
    assert [rectangle_count(3, 2 * n) for n in range(0, 200)] == a[:200]
    assert rectangle_count(3, 7) == 0 and rectangle_count(0, 5) == 1


def sympy_kasteleyn_det(mask):
    # Built here independently: black cells x white cells, -1 on vertical pairs in odd columns.
    cells = [tuple(p) for p in np.argwhere(mask).tolist()]
    black = [p for p in cells if sum(p) % 2 == 0]
    white = {p: k for k, p in enumerate(q for q in cells if sum(q) % 2 == 1)}
    m = sympy.zeros(len(black), len(white))
    for i, (r, c) in enumerate(black):
        for dr, dc in ((0, 1), (0, -1), (1, 0), (-1, 0)):
            if (r + dr, c + dc) in white:
                m[i, white[(r + dr, c + dc)]] = -1 if dr and c % 2 == 1 else 1
    return abs(m.det(method="bareiss"))


@pytest.mark.parametrize("picture", [IRREGULAR, "####\n##..\n####\n##..\n", "..##\n.###\n####\n###.\n##..\n",
                                     "#####.\n######\n.#####\n..##..\n"])
def test_irregular_counts(picture):
    R = fl.domino.from_picture(picture)
    assert R.count() == sum(1 for _ in domino_tilings(R.mask)) == sympy_kasteleyn_det(R.mask)


def exact_law(mask, weights=None):
    tilings = list(domino_tilings(mask))
    if weights is None:
        return {t: 1 / len(tilings) for t in tilings}
    w = {t: weight(t, *weights) for t in tilings}
    total = sum(w.values())
    return {t: v / total for t, v in w.items()}


def draw(region, n, seed, method):
    seeds = np.random.SeedSequence(seed).spawn(n)
    return Counter(tile_set(region.sample(s, method=method).tiles) for s in seeds)


@pytest.mark.parametrize("method", ["cftp", "generic"])
@pytest.mark.parametrize("make, n", [
    (lambda: fl.domino.aztec_diamond(2), 2000),
    (lambda: fl.domino.aztec_diamond(3), 3000),
    (lambda: fl.domino.from_picture(IRREGULAR), 2000),
])
def test_cftp_is_uniform(make, n, method):
    R = make()
    assert pooled_chi_square(draw(R, n, 2026, method), exact_law(R.mask), n) > P_FLOOR


@pytest.mark.parametrize("weights", [
    {"vertical_weight": 2.0},
    {"two_periodic_weights": (1.0, 0.5)},
])
def test_weighted_cftp_matches_enumeration(weights):
    R = fl.domino.aztec_diamond(3, **weights)
    n = 4000
    assert pooled_chi_square(draw(R, n, 5, "cftp"), exact_law(R.mask, R.weights), n) > P_FLOOR


def test_random_weights_on_an_irregular_region():
    mask = fl.domino.from_picture(IRREGULAR).mask
    rng = np.random.default_rng(3)
    h = rng.uniform(0.2, 3.0, (mask.shape[0], mask.shape[1] - 1))
    v = rng.uniform(0.2, 3.0, (mask.shape[0] - 1, mask.shape[1]))
    R = fl.domino.from_mask(mask, horizontal=h, vertical=v)
    n = 4000
    assert pooled_chi_square(draw(R, n, 9, "cftp"), exact_law(mask, (h, v)), n) > P_FLOOR
    law = exact_law(mask, (h, v))
    total = sum(weight(t, h, v) for t in law)
    assert float(R.partition_function()) == pytest.approx(total, rel=1e-12)


def test_biased_partition_function_closed_form():
    # (1 + a^2)^(n(n+1)/2) with every vertical domino weighted a (docs/references.md section 1, checked n <= 5)
    from fractions import Fraction

    for n in (1, 2, 3, 4):
        region = fl.domino.rectangle(2, 3, vertical=np.full((1, 3), 2.0))
        assert region.partition_function() == sum(
            weight(t, *region.weights) for t in domino_tilings(region.mask))
        z = fl.domino.aztec_diamond(n, vertical_weight=2.0).partition_function()
        assert Fraction(z) == Fraction(5) ** (n * (n + 1) // 2)


@given(st.integers(1, 12), st.integers(0, 2**40))
@settings(max_examples=30)
def test_fast_kernel_equals_generic_bit_for_bit(n, seed):
    # (two-periodic weights far from 1 mix slowly under local moves: keep b/a moderate here)
    for kwargs in ({}, {"vertical_weight": 1.7}, {"two_periodic_weights": (1.0, 0.7)}):
        R = fl.domino.aztec_diamond(n, **kwargs)
        fast = R.sample(seed=seed, method="cftp")
        slow = R.sample(seed=seed, method="generic")
        assert np.array_equal(fast.heights, slow.heights)
        assert fast.info.site_updates == slow.info.site_updates


@given(st.lists(st.lists(st.booleans(), min_size=5, max_size=5), min_size=4, max_size=4), st.integers(0, 2**32))
@settings(max_examples=80)
def test_random_masks_sample_or_raise_the_documented_error(rows, seed):
    mask = np.array(rows)
    try:
        R = fl.domino.from_mask(mask)
    except ValueError as exc:
        if not mask.any():
            assert "is empty" in str(exc)
            return
        documented = ("cannot be tiled", "has a hole", "cannot carry a height function", "no configuration")
        assert any(w in str(exc) for w in documented), str(exc)
        assert "has a hole" in str(exc) or sum(1 for _ in domino_tilings(mask)) == 0
        return
    assert R.count() == sum(1 for _ in domino_tilings(mask)) > 0
    S = R.sample(seed=seed)
    cells = sorted(tuple(c) for d in S.tiles.tolist() for c in d)
    assert cells == sorted(map(tuple, np.argwhere(mask).tolist()))
    assert np.array_equal(R.heights_from_tiles(S.tiles), S.heights)
    assert np.array_equal(R.tiles_from_heights(S.heights), S.tiles)


def test_classes_freeze_where_named():
    # In a large uniform Aztec diamond each class fills the corner it is named after
    # (Jockusch, Propp, Shor 1998: frozen corners outside the arctic circle).
    for n in (24, 25):
        R = fl.domino.aztec_diamond(n)
        S = R.sample(seed=1)
        cls = R.classify(S.tiles)
        centres = S.tiles.mean(axis=1)  # (row, col) of each domino's centre
        x, y = centres[:, 1] + 0.5 - n, n - centres[:, 0] - 0.5
        corner = {0: (0, n), 1: (0, -n), 2: (n, 0), 3: (-n, 0)}
        for k, (cx, cy) in corner.items():
            near = np.hypot(x - cx, y - cy) < n / 4
            assert near.any() and np.all(cls[near] == k)


def test_heights_follow_thurston_rule():
    R = fl.domino.aztec_diamond(5)
    S = R.sample(seed=3)
    h = S.heights
    # around every black cell, counter-clockwise: three +1 and one -3
    for r, c in np.argwhere(R.mask):
        if (r + c) % 2 == 0:
            ring = [h[r + 1, c], h[r + 1, c + 1], h[r, c + 1], h[r, c], h[r + 1, c]]
            steps = sorted(np.diff(ring).tolist())
            assert steps == [-3, 1, 1, 1]


# ----- bad input ---------------------------------------------------------------------

@pytest.mark.parametrize("mask, error, words", [
    (np.ones((3, 3), bool), ValueError, "9 cells, an odd number"),
    (np.array([[1, 0], [0, 1]], bool), ValueError, "2 black and 0 white"),
    (np.zeros((3, 3), bool), ValueError, "empty"),
    (np.ones(4, bool), ValueError, "2-D"),
    (np.full((2, 2), 0.5), TypeError, "boolean"),
])
def test_bad_masks(mask, error, words):
    with pytest.raises(error, match=words):
        fl.domino.from_mask(mask)


def test_hole_is_refused():
    ring = np.ones((4, 4), bool)
    ring[1:3, 1:3] = False
    with pytest.raises(ValueError, match="has a hole"):
        fl.domino.from_mask(ring)


@pytest.mark.parametrize("kwargs, error, words", [
    ({"vertical": np.full((3, 4), np.nan)}, ValueError, "finite and positive"),
    ({"vertical": np.zeros((3, 4))}, ValueError, "finite and positive"),
    ({"vertical": np.ones((4, 4))}, ValueError, r"shape \(3, 4\)"),
    ({"horizontal": np.ones((4, 3), dtype=object)}, TypeError, "numeric"),
    ({"horizontal": -np.ones((4, 3))}, ValueError, "positive"),
])
def test_bad_weights(kwargs, error, words):
    with pytest.raises(error, match=words):
        fl.domino.rectangle(4, 4, **kwargs)


@pytest.mark.parametrize("call, error", [
    (lambda: fl.domino.aztec_diamond(0), ValueError), (lambda: fl.domino.aztec_diamond(2.0), TypeError),
    (lambda: fl.domino.aztec_diamond(2, vertical_weight=-1), ValueError),
    (lambda: fl.domino.aztec_diamond(2, vertical_weight=float("nan")), ValueError),
    (lambda: fl.domino.aztec_diamond(2, vertical_weight=2, two_periodic_weights=(1, 2)), ValueError),
    (lambda: fl.domino.from_picture("##\n#?"), ValueError), (lambda: fl.domino.from_picture(""), ValueError),
    (lambda: fl.domino.rectangle(3, 3).sample(seed=0, method="shuffling"), ValueError),
    (lambda: fl.domino.rectangle(2, 2).sample(seed=0, method="fast"), ValueError),
])
def test_bad_arguments(call, error):
    with pytest.raises(error):
        call()


def test_shuffling_and_cftp_agree_on_order_30():
    # Mean count of each domino class in the central 10x10 window, over 150 exact
    # samples from each sampler: the difference of means, in units of its
    # standard error, must stay within 4.5 (a false alarm about once in 10^5 per class
    # under the normal approximation; the samples are independent by construction).
    n, k = 30, 150
    R = fl.domino.aztec_diamond(n)
    window = (slice(n - 5, n + 5), slice(n - 5, n + 5))

    def class_counts(method, seed):
        out = []
        for s in np.random.SeedSequence(seed).spawn(k):
            S = R.sample(s, method=method)
            inside = np.all((S.tiles[:, :, 0] >= window[0].start) & (S.tiles[:, :, 0] < window[0].stop)
                            & (S.tiles[:, :, 1] >= window[1].start) & (S.tiles[:, :, 1] < window[1].stop), axis=1)
            out.append(np.bincount(R.classify(S.tiles[inside]), minlength=4))
        return np.array(out, dtype=float)

    a, b = class_counts("shuffling", 1), class_counts("cftp", 2)
    z = (a.mean(0) - b.mean(0)) / np.sqrt(a.var(0, ddof=1) / k + b.var(0, ddof=1) / k)
    assert np.all(np.abs(z) < 4.5), z
