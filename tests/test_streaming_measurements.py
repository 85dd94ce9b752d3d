"""The measurements read their samples one at a time: lists, generators and ensemble stores alike."""
from __future__ import annotations

import gc
import weakref

import numpy as np
import pytest

import frostline as fl
from frostline.analysis import compare_with_exact, frozen_positions, height_fluctuations, local_densities

REGION = fl.domino.aztec_diamond(8)


def _members(k):
    return [REGION.sample(seed=s) for s in range(k)]


def _one_at_a_time(samples, alive_limit=2):
    """Yield samples, failing if a measurement keeps more than ``alive_limit`` of them alive."""
    refs = []
    for sample in samples:
        gc.collect()
        alive = sum(r() is not None for r in refs)
        assert alive < alive_limit, f"{alive} earlier samples are still held"
        fresh = REGION.sample(seed=sample)
        refs.append(weakref.ref(fresh))
        yield fresh
        del fresh


def _fluctuation_figures(f):
    return np.r_[f.pointwise_variance, f.pointwise_error, f.two_point_variance, f.two_point_error, f.slope]


MEASUREMENTS = {
    "compare_with_exact": lambda s: compare_with_exact(s).z,
    "height_fluctuations": lambda s: _fluctuation_figures(height_fluctuations(s, bootstrap=20)),
    "local_densities": lambda s: np.array(list(local_densities(s, centre=(0.0, 0.0), radius=3.0).values())),
    "frozen_positions": lambda s: frozen_positions(s, start=(0.5, 8.0), direction=(0.0, -1.0)).positions,
}


@pytest.mark.parametrize("name", sorted(MEASUREMENTS))
def test_a_stream_gives_the_list_result_and_holds_no_samples(name):
    measure = MEASUREMENTS[name]
    expected = measure(_members(12))
    streamed = measure(_one_at_a_time(range(12)))
    assert np.array_equal(expected, streamed, equal_nan=True)


@pytest.mark.parametrize("name", sorted(MEASUREMENTS))
def test_an_ensemble_store_is_measured_like_its_members(name, tmp_path):
    pytest.importorskip("zarr")
    ensemble = fl.ensemble(REGION, 10, seed=3, store=tmp_path / "store", workers=1)
    members = [ensemble[i] for i in range(10)]
    assert np.array_equal(MEASUREMENTS[name](ensemble), MEASUREMENTS[name](members), equal_nan=True)


def test_no_samples_is_a_clear_error():
    for measure in MEASUREMENTS.values():
        with pytest.raises(ValueError, match="at least"):
            measure(iter([]))
