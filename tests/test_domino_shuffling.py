"""Domino shuffling for the (weighted) Aztec diamond, and urban renewal.

Samples are checked against full enumeration (tests/reference/aztec.py, written
independently of frostline) by pooled chi-square tests with fixed seeds and
the p-value floor P_FLOOR = 1e-4: a correct sampler fails each such test with
probability 1e-4, and the outcome is reproducible.
"""
import math
from collections import Counter
from fractions import Fraction

import numpy as np
import pytest
from scipy import stats

import frostline as fl
from frostline import _core
from frostline.domino.urban_renewal import aztec_partition_function
from reference.aztec import (aztec_law, aztec_mask, aztec_partition_function as enumerated_partition_function,
                             is_tiling_of, tilings, two_periodic_weights)
from reference.statistics import P_FLOOR, pooled_chi_square

shuffle = _core.domino.aztec_shuffle


def keys(seed):
    return tuple(int(w) for w in np.random.SeedSequence(seed).generate_state(2, np.uint64))


def draw(n, horizontal, vertical, count, seed):
    """Counter of sampled tilings, each as a tuple of ((r1, c1), (r2, c2))."""
    observed = Counter()
    for i in range(count):
        key0, key1 = keys([seed, i])
        tiles = shuffle(n, horizontal, vertical, key0, key1)
        observed[tuple((tuple(a), tuple(b)) for a, b in tiles.tolist())] += 1
    return observed


def random_weights(n, seed, low=0.2, high=3.0):
    rng = np.random.default_rng(seed)
    return rng.uniform(low, high, (2 * n, 2 * n - 1)), rng.uniform(low, high, (2 * n - 1, 2 * n))


def biased(n, a):
    """Every vertical domino weighted a, horizontal ones 1."""
    return None, np.full((2 * n - 1, 2 * n), a)


WEIGHTS = {
    "uniform": lambda n: (None, None),
    "biased": lambda n: biased(n, 2.0),
    # a = 1, b = 0.5 as stated in docs/references.md section 2 (Chhita, Johansson 2016; coordinate form from memory)
    "two_periodic": lambda n: two_periodic_weights(n, 1.0, 0.5),
    "random": lambda n: random_weights(n, seed=100 + n),
}


# --- the reference itself ---------------------------------------------------

@pytest.mark.parametrize("n", [1, 2, 3, 4])
def test_reference_counts_aztec_tilings(n):
    # 2^(n(n+1)/2) tilings (Elkies, Kuperberg, Larsen, Propp 1992; OEIS A006125)
    assert sum(1 for _ in tilings(aztec_mask(n))) == 2 ** (n * (n + 1) // 2)


@pytest.mark.parametrize("side, count", [(2, 2), (4, 36), (6, 6728)])
def test_reference_counts_squares(side, count):
    # 2n x 2n squares: 2, 36, 6728 (Kasteleyn 1961; Temperley, Fisher 1961; OEIS A004003)
    assert sum(1 for _ in tilings(np.ones((side, side), dtype=bool))) == count


# --- exact law against enumeration -----------------------------------------

@pytest.mark.parametrize("name", sorted(WEIGHTS))
@pytest.mark.parametrize("n, count", [(1, 2000), (2, 8000), (3, 20000)])
def test_samples_match_enumeration(n, count, name):
    # Exact law: weight of a tiling / Z, enumerated (2, 8, 64 tilings; OEIS A006125)
    horizontal, vertical = WEIGHTS[name](n)
    law = aztec_law(n, horizontal, vertical)
    observed = draw(n, horizontal, vertical, count, seed=[20260, n])
    assert pooled_chi_square(observed, law, count) > P_FLOOR


@pytest.mark.slow
@pytest.mark.parametrize("name", ["two_periodic", "random"])
def test_samples_match_enumeration_order_4(name):
    # 1024 tilings (OEIS A006125): four rounds of urban renewal before the first step
    horizontal, vertical = WEIGHTS[name](4)
    law = aztec_law(4, horizontal, vertical)
    observed = draw(4, horizontal, vertical, 40000, seed=404)
    assert pooled_chi_square(observed, law, 40000) > P_FLOOR


def test_chi_square_detects_a_wrong_law():
    # The tests above can fail: biased samples are rejected against the uniform law,
    # and samples under one set of random weights against another set's law.
    observed = draw(3, *biased(3, 2.0), 20000, seed=5)
    assert pooled_chi_square(observed, aztec_law(3), 20000) < P_FLOOR
    observed = draw(3, *random_weights(3, seed=1), 20000, seed=6)
    assert pooled_chi_square(observed, aztec_law(3, *random_weights(3, seed=2)), 20000) < P_FLOOR


@pytest.mark.parametrize("a", [1.0, 2.0, 0.4])
def test_mean_number_of_vertical_dominoes(a):
    # Z = (1 + a^2)^(n(n+1)/2) (Elkies, Kuperberg, Larsen, Propp 1992), so
    # E[#vertical] = a d(ln Z)/da = n(n+1) a^2 / (1 + a^2) [derived]; t-test at order 20.
    n, count = 20, 400
    counts = []
    for i in range(count):
        tiles = shuffle(n, *biased(n, a), *keys([77, i]))
        counts.append(int(np.sum(tiles[:, 0, 1] == tiles[:, 1, 1])))
    expected = n * (n + 1) * a * a / (1 + a * a)
    assert stats.ttest_1samp(counts, expected).pvalue > P_FLOOR


# --- partition function ----------------------------------------------------

@pytest.mark.parametrize("name", sorted(WEIGHTS))
@pytest.mark.parametrize("n", [1, 2, 3, 4])
def test_partition_function_matches_enumeration(n, name):
    # Urban renewal (Propp 2003) against the sum over all enumerated tilings, exactly
    horizontal, vertical = WEIGHTS[name](n)
    z = aztec_partition_function(n, horizontal, vertical)
    assert isinstance(z, Fraction)
    assert z == enumerated_partition_function(n, horizontal, vertical)
    assert math.isclose(aztec_partition_function(n, horizontal, vertical, exact=False), math.log(z),
                        rel_tol=1e-12, abs_tol=1e-12)


@pytest.mark.parametrize("n", range(0, 13))
def test_partition_function_uniform(n):
    # 2^(n(n+1)/2) (Elkies, Kuperberg, Larsen, Propp 1992; OEIS A006125)
    assert aztec_partition_function(n) == 2 ** (n * (n + 1) // 2)


@pytest.mark.parametrize("a", [2.0, 0.3, 1.75])
@pytest.mark.parametrize("n", [1, 5, 9])
def test_partition_function_biased(n, a):
    # Vertical dominoes weighted a: (1 + a^2)^(n(n+1)/2) (docs/references.md section 1, checked there for n <= 5);
    # 0.3 is taken at its exact binary value on both sides.
    a_exact = Fraction(a)
    assert aztec_partition_function(n, *biased(n, a)) == (1 + a_exact ** 2) ** (n * (n + 1) // 2)
    # The same law with the roles swapped: horizontal weight a
    horizontal = np.full((2 * n, 2 * n - 1), a)
    assert aztec_partition_function(n, horizontal, None) == (1 + a_exact ** 2) ** (n * (n + 1) // 2)


@pytest.mark.parametrize("n, a, tolerance", [(300, 1.0, 1e-12), (300, 2.0, 1e-12), (150, 0.01, 1e-9)])
def test_log_partition_function_large_orders(n, a, tolerance):
    # ln Z = n(n+1)/2 ln(1 + a^2) (OEIS A006125 and its weighted form), in floating point;
    # with a = 0.01 each ln D is near 1e-4, so rounding in D costs relative accuracy.
    expected = n * (n + 1) / 2 * math.log1p(a * a)
    assert math.isclose(aztec_partition_function(n, *biased(n, a), exact=False), expected, rel_tol=tolerance)


def test_log_partition_function_agrees_with_exact():
    # Two routes through urban renewal: exact rationals and rescaled floats
    horizontal, vertical = random_weights(10, seed=9, low=0.05, high=20.0)
    z = aztec_partition_function(10, horizontal, vertical)
    assert math.isclose(aztec_partition_function(10, horizontal, vertical, exact=False), math.log(z), rel_tol=1e-12)


def test_partition_function_scaling():
    # Multiplying every weight by s multiplies Z by s^(n(n+1)) (each tiling has n(n+1) dominoes);
    # s = 2 and 1/4 scale floats exactly.
    n = 4
    horizontal, vertical = random_weights(n, seed=4)
    z = aztec_partition_function(n, horizontal, vertical)
    for s in (Fraction(2), Fraction(1, 4)):
        assert aztec_partition_function(n, horizontal * float(s), vertical * float(s)) == z * s ** (n * (n + 1))


# --- tilings are valid, sorted, reproducible --------------------------------

@pytest.mark.parametrize("name", sorted(WEIGHTS))
@pytest.mark.parametrize("n", [1, 2, 3, 4, 5, 7, 10, 16, 25, 37, 50])
def test_output_is_a_tiling_of_the_diamond(n, name):
    # n(n+1) dominoes cover the diamond exactly (Elkies, Kuperberg, Larsen, Propp 1992)
    horizontal, vertical = WEIGHTS[name](n)
    mask = aztec_mask(n)
    for seed in range(6):
        tiles = shuffle(n, horizontal, vertical, *keys([n, seed]))
        assert tiles.dtype == np.int64 and tiles.shape == (n * (n + 1), 2, 2)
        assert is_tiling_of(tiles, mask)
        rows = [tuple(t) for t in tiles.reshape(-1, 4).tolist()]
        assert rows == sorted(rows)


def test_order_zero_is_empty():
    assert shuffle(0, key0=1, key1=2).shape == (0, 2, 2)
    assert aztec_partition_function(0) == 1


@pytest.mark.parametrize("name", sorted(WEIGHTS))
def test_same_key_same_tiling(name):
    horizontal, vertical = WEIGHTS[name](30)
    first = shuffle(30, horizontal, vertical, *keys(8))
    assert np.array_equal(first, shuffle(30, horizontal, vertical, *keys(8)))
    # and the key matters: 2^465 tilings, so a repeat means the key was ignored
    assert not np.array_equal(first, shuffle(30, horizontal, vertical, *keys(9)))


@pytest.mark.parametrize("value", [1.0, 3.7, 1e-3])
def test_constant_weights_give_the_uniform_tiling(value):
    # Equal weights give probability exactly 1/2 at every order, drawn from the same bits
    n = 40
    weighted = shuffle(n, np.full((2 * n, 2 * n - 1), value), np.full((2 * n - 1, 2 * n), value), *keys(3))
    assert np.array_equal(weighted, shuffle(n, None, None, *keys(3)))


def test_omitted_orientation_has_weight_one():
    n = 12
    horizontal, _ = random_weights(n, seed=12)
    assert np.array_equal(shuffle(n, horizontal, None, *keys(1)),
                          shuffle(n, horizontal, np.ones((2 * n - 1, 2 * n)), *keys(1)))


def test_segments_do_not_change_the_tiling():
    # Weight tables kept for all orders at once, or recomputed segment by segment
    n = 45
    horizontal, vertical = random_weights(n, seed=45)
    whole = shuffle(n, horizontal, vertical, *keys(2))
    for length in (1, 2, 7, 44, 45, 1000):
        assert np.array_equal(whole, shuffle(n, horizontal, vertical, *keys(2), segment_orders=length))


@pytest.mark.parametrize("name", sorted(WEIGHTS))
def test_threads_do_not_change_the_tiling(name):
    # rows of faces are shared among threads from order 64 on; bits depend on the face alone
    n = 150
    horizontal, vertical = WEIGHTS[name](n)
    one = shuffle(n, horizontal, vertical, *keys(6))
    for threads in (2, 3):
        assert np.array_equal(one, shuffle(n, horizontal, vertical, *keys(6), threads=threads))


def test_the_sample_keeps_the_shuffled_dominoes():
    # the dominoes the shuffle made are the sample's tiles: the layout tiles_from_heights gives
    region = fl.domino.aztec_diamond(40)
    sample = region.sample(seed=3, threads=2)
    assert "tiles" in sample._cache
    np.testing.assert_array_equal(sample.tiles, region.tiles_from_heights(sample.heights))
    np.testing.assert_array_equal(sample.heights, region.sample(seed=3).heights)


def test_positions_outside_the_diamond_are_ignored():
    n = 6
    horizontal, vertical = random_weights(n, seed=6)
    mask = aztec_mask(n)
    h_outside = ~(mask[:, :-1] & mask[:, 1:])
    v_outside = ~(mask[:-1, :] & mask[1:, :])
    h2, v2 = horizontal.copy(), vertical.copy()
    h2[h_outside] = np.nan
    v2[v_outside] = -1.0
    assert np.array_equal(shuffle(n, horizontal, vertical, *keys(4)), shuffle(n, h2, v2, *keys(4)))
    assert aztec_partition_function(n, h2, v2) == aztec_partition_function(n, horizontal, vertical)


def test_progress_hook_is_called_and_can_stop_the_run():
    calls = []
    shuffle(300, key0=1, key1=2, progress=lambda order, updates, seconds: calls.append((order, updates)))
    assert calls and calls == sorted(calls) and calls[-1][0] == 300

    def stop(order, updates, seconds):
        raise RuntimeError("stop requested")

    with pytest.raises(RuntimeError, match="stop requested"):
        shuffle(300, key0=1, key1=2, progress=stop)


# --- bad input ---------------------------------------------------------------

def test_bad_order():
    with pytest.raises(ValueError, match=">= 0"):
        shuffle(-1, key0=1, key1=2)
    with pytest.raises(ValueError, match=">= 0"):
        aztec_partition_function(-2)
    with pytest.raises(TypeError, match="int"):
        aztec_partition_function(2.5)


@pytest.mark.parametrize("horizontal, vertical, words", [
    (np.ones((5, 5)), None, r"horizontal must have shape \(2n, 2n - 1\) = \(6, 5\)"),
    (None, np.ones((6, 5)), r"vertical must have shape \(2n - 1, 2n\) = \(5, 6\)"),
    (np.ones(30), None, "horizontal must have shape"),
])
def test_bad_shapes(horizontal, vertical, words):
    with pytest.raises(ValueError, match=words):
        shuffle(3, horizontal, vertical, key0=1, key1=2)
    with pytest.raises(ValueError, match="must have shape"):
        aztec_partition_function(3, horizontal, vertical)


@pytest.mark.parametrize("bad", [0.0, -1.0, np.nan, np.inf])
@pytest.mark.parametrize("which", ["horizontal", "vertical"])
def test_bad_weight_values(which, bad):
    n = 3
    horizontal, vertical = random_weights(n, seed=0)
    table = horizontal if which == "horizontal" else vertical
    table[2, 2] = bad  # inside the diamond in both tables
    with pytest.raises(ValueError, match=rf"{which}\[2, 2\] = .* positive finite"):
        shuffle(n, horizontal, vertical, key0=1, key1=2)
    with pytest.raises(ValueError, match=rf"{which}\[2, 2\] = .* positive finite"):
        aztec_partition_function(n, horizontal, vertical)


@pytest.mark.parametrize("value", ["abc", np.ones((6, 5), dtype=complex)])
def test_weights_of_wrong_type(value):
    with pytest.raises(TypeError, match="real numbers"):
        shuffle(3, value, None, key0=1, key1=2)


def test_memory_estimate_refuses_huge_weighted_orders():
    # A read-only broadcast view: refused before any copy is made
    n = 3000
    horizontal = np.broadcast_to(1.0, (2 * n, 2 * n - 1))
    with pytest.raises(ValueError, match=r"needs about .* GiB .* limit of 2.00 GiB"):
        shuffle(n, horizontal, None, key0=1, key1=2)
    with pytest.raises(ValueError, match=r"needs about .* GiB"):
        shuffle(10 ** 6, key0=1, key1=2)


def test_shuffling_obeys_the_memory_limit_of_the_environment(monkeypatch):
    """One memory policy: FROSTLINE_MEMORY_LIMIT governs shuffling too (passed down into C++)."""
    region = fl.domino.aztec_diamond(300)
    region.sample(seed=1, method="shuffling")  # fits the default limit
    monkeypatch.setenv("FROSTLINE_MEMORY_LIMIT", "1e6")
    with pytest.raises(ValueError, match="FROSTLINE_MEMORY_LIMIT"):
        region.sample(seed=1, method="shuffling")
