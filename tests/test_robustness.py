"""Hard cases found in review: precision near q = 1, invalid chain starts, overflow, threads, seeds."""
import math
import threading
from collections import Counter

import numpy as np
import pytest

import frostline as fl
from frostline import _core
from reference.plane_partitions import plane_partitions
from reference.statistics import P_FLOOR, pooled_chi_square


@pytest.mark.parametrize("q", [1 - 1e-13, 1 - 3.3e-16, 1 + 1e-13])
def test_q_next_to_one_is_the_uniform_law(q):
    # The q-rule is built from tail sums, so q = 1 - 1e-13 draws (to ~1e-12) uniformly.
    bits = np.random.default_rng(4).integers(0, 2**64, size=60000, dtype=np.uint64)
    x = _core.engine.heat_bath_draws(0, 5, 1, q, 0, 5, bits)
    counts = dict(zip(*np.unique(x, return_counts=True)))
    law = {v: 1 / 6 for v in range(6)}
    assert pooled_chi_square({int(k): int(v) for k, v in counts.items()}, law, len(x)) > P_FLOOR


def test_samples_next_to_q_one_are_uniform():
    law = {p: 1 / 20 for p in plane_partitions(2, 2, 2)}
    R = fl.lozenge.hexagon(2, 2, 2, q=1 - 3.3e-16)
    seeds = np.random.SeedSequence(8).spawn(4000)
    observed = Counter(tuple(int(v) for v in R.sample(s).heights.ravel()) for s in seeds)
    assert pooled_chi_square(observed, law, 4000) > P_FLOOR


def path_model():
    # three free sites between two boundary nodes fixed at 0, |steps| <= 1
    rows = []
    chain = [3, 0, 1, 2, 4]
    for u, v in zip(chain, chain[1:]):
        rows += [(u, v, 1), (v, u, 1)]
    return fl.HeightModel(3, np.array([0, 0]), np.array(rows), np.zeros(3), 1, np.array([0, 1, 0]))


@pytest.mark.parametrize("start, words", [
    ([3, 10**8, -10**8, 0, 0], "break the constraint"),
    ([0, 1, 0, 5, 0], "must keep its fixed height"),
    ([0, 0, 0], "one height per node"),
])
@pytest.mark.parametrize("q", [1.0, 0.5])
def test_invalid_chain_start_is_refused(start, words, q):
    with pytest.raises(ValueError, match=words):
        path_model().chain(q, (1, 2), np.array(start))


def test_huge_bounds_and_values_are_refused():
    with pytest.raises(ValueError, match="2\\^30"):
        fl.HeightModel(1, np.array([0]), np.array([(1, 0, 2**31 - 6), (0, 1, 5)]), np.zeros(1), 1, np.array([0]))
    with pytest.raises(ValueError, match="32-bit range"):
        fl.HeightModel(1, np.array([2**32 + 5]), np.array([(1, 0, 0), (0, 1, 0)]), np.zeros(1), 1, np.array([0]))


def test_a_chain_with_no_sites_still_polls():
    calls = []
    chain = fl.lozenge.hexagon(0, 5, 5).chain(seed=1)
    chain.run(3 * 10**8, progress=lambda *a: calls.append(a))
    assert len(calls) >= 2  # the engine checked for Ctrl-C while sweeping nothing


def test_one_chain_runs_in_one_thread_at_a_time():
    import time

    chain = fl.lozenge.hexagon(30, 30, 30).chain(seed=1)
    entered = threading.Event()

    def work():
        entered.set()
        chain.run(400000)  # about a second: long enough to be caught running

    worker = threading.Thread(target=work)
    worker.start()
    entered.wait()
    time.sleep(0.1)
    try:
        with pytest.raises(RuntimeError, match="already running"):
            chain.run(1)
    finally:
        worker.join()
    assert chain.time == 400000


@pytest.mark.parametrize("sequence", [np.random.SeedSequence([1, 2, 3]),
                                      np.random.SeedSequence(7, pool_size=8),
                                      np.random.SeedSequence(5).spawn(4)[3]])
def test_seed_records_reproduce_any_seed_sequence(sequence):
    R = fl.lozenge.hexagon(4, 4, 4)
    S = R.sample(seed=sequence)
    again = R.sample(seed=S.info.seed.sequence())
    assert np.array_equal(S.heights, again.heights)


def test_macmahon_is_fast_and_agrees_with_its_logarithm():
    from frostline.lozenge.counts import log_macmahon

    m = fl.lozenge.hexagon(600, 500, 400).count()
    assert abs(math.log(m) - log_macmahon(600, 500, 400)) < 1e-6 * log_macmahon(600, 500, 400)


def test_q_partition_function_of_a_large_box_matches_the_product():
    # MacMahon's q-analogue, prod (1 - q^(i+j+c-1)) / (1 - q^(i+j-1)), summed in logs here
    a = b = c = 30
    q = 0.99
    log_z = math.fsum(math.log1p(-q ** (i + j + c - 1)) - math.log1p(-q ** (i + j - 1))
                      for i in range(1, a + 1) for j in range(1, b + 1))
    z = fl.lozenge.hexagon(a, b, c, q=q).partition_function()
    assert math.log(float(z)) == pytest.approx(log_z, rel=1e-12)


def test_overflowing_q_is_a_value_error():
    with pytest.raises(ValueError, match="finite positive"):
        fl.lozenge.hexagon(2, 2, 2, q=10**400)


@pytest.mark.parametrize("value", [0, 2**63])
def test_bad_max_start_time(value):
    with pytest.raises(ValueError, match="max_start_time"):
        fl.lozenge.hexagon(2, 2, 2).sample(seed=0, max_start_time=value)


def test_cli_checks_outputs_before_sampling(monkeypatch, capsys, tmp_path):
    from frostline.cli import main
    from frostline.lozenge import HexagonRegion

    def refuse(*args, **kwargs):
        raise AssertionError("the sample should not have started")

    monkeypatch.setattr(HexagonRegion, "sample", refuse)
    assert main(["sample", "hexagon", "3", "3", "3", "--picture", "x.bmp"]) == 2
    assert main(["sample", "hexagon", "3", "3", "3", "--picture", str(tmp_path / "no" / "x.png")]) == 2
    assert main(["sample", "hexagon", "3", "3", "3", "--output", "x.zip"]) == 2
    err = capsys.readouterr().err
    assert "format" in err and "does not exist" in err and ".npz" in err


def test_extreme_domino_weights_are_refused_not_misused():
    with pytest.raises(ValueError, match="span"):
        fl.domino.rectangle(2, 4, horizontal=np.full((2, 3), 1e200))


def test_local_probabilities_never_forbid_a_move():
    from frostline.domino.weights import probability_thresholds

    t = probability_thresholds(np.array([0.0, 1.0, 1e-30, 0.5]))
    assert t[0] == 1 and t[1] == 2**64 - 1 and t[2] >= 1 and t[3] == 2**63
    table = fl.square_ice.weight_table(1.0, 1.0, 1e20 ** 0.5)
    assert table.min() >= 1 and table.max() <= 2**64 - 1


def test_pinched_and_enclosed_holes_are_named_as_holes():
    # tileable regions around an unbalanced hole (found by the second review) are refused as holes
    for mask in ([[1, 1, 1], [1, 0, 1], [1, 1, 1]], [[1, 1, 1, 0], [1, 0, 1, 1], [1, 1, 0, 0]]):
        with pytest.raises(ValueError, match="has a hole"):
            fl.domino.from_mask(np.array(mask, bool))


def test_izergin_korepin_in_the_ill_conditioned_regime():
    # Delta near -1 at n = 12 and a large n: compared with the exact row transfer and a closed form
    from frostline.square_ice.conversions import domain_wall_boundary

    z = fl.square_ice.izergin_korepin(10, 1, 2, 3.0000001)
    exact = float(fl.square_ice.row_transfer(domain_wall_boundary(10), (1, 2, 3.0000001)))
    assert float(z) == pytest.approx(exact, rel=1e-9)
    # free fermion a = b = 1/sqrt 2, c = 1: Z_n = 1 for every n (docs/references.md section 1)
    assert float(fl.square_ice.izergin_korepin(40, 2 ** -0.5, 2 ** -0.5, 1.0)) == pytest.approx(1.0, rel=1e-12)


def test_absurd_boundary_paths_are_refused_before_expanding():
    with pytest.raises(ValueError, match="unit steps"):
        fl.lozenge.from_boundary("1000(1000(1000e))")


def test_non_monotone_run_time_rule_refuses_exact_sampling():
    from reference.models import path_with_context_rule

    model, rule = path_with_context_rule([2**63 + 2**62, 2**62])  # the chance falls as the context rises
    with pytest.raises(ValueError, match="not monotone"):
        fl.custom.ModelRegion(model, rule=rule).sample(seed=0)


def test_weighted_aztec_partition_function_scales():
    # past order 16 the value comes from urban renewal in floating point: compare with the exact one at 17
    from frostline.domino.urban_renewal import aztec_partition_function

    R = fl.domino.aztec_diamond(17, two_periodic_weights=(1.0, 0.3))
    exact = aztec_partition_function(17, *R.weights)
    assert float(R.partition_function()) == pytest.approx(float(exact), rel=1e-9)
    assert math.isfinite(float(fl.domino.aztec_diamond(60, two_periodic_weights=(1.0, 0.3)).partition_function()))
