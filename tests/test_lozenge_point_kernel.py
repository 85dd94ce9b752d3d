"""The lattice-point vector kernel of general lozenge regions (plugins/lozenge/point_rows.inl), method
"points" (the default kernel where a region has no cube-column form).

It must give the generic engine's sample bit for bit (same classes, site ids
and bits) on every instruction-set level and thread count, and its samples
must follow the exact uniform law on irregular regions (chi-square against
enumeration, fixed seeds, p-value floor P_FLOOR = 1e-4: a correct sampler
fails each test with probability 1e-4).
"""
from __future__ import annotations

from collections import Counter

import numpy as np
import pytest

import frostline as fl
from reference.statistics import P_FLOOR, pooled_chi_square

REGIONS = {
    "hexagon 5 4 3 by path": lambda: fl.lozenge.from_boundary("5e 4ne 3nw 5w 4sw 3se"),
    "trapezoid 6 4": lambda: fl.lozenge.trapezoid(6, 4),
    "trapezoid 7 3": lambda: fl.lozenge.trapezoid(7, 3, notches=[0, 3, 5]),
    "trapezoid 5 3": lambda: fl.lozenge.trapezoid(5, 3),
    "hexagon minus a pair": lambda: fl.lozenge.hexagon_minus(3, 3, 3, removed=[(-3, 2, 1), (-3, 3, 0)]),
    "hexagon 2 3 2": lambda: fl.lozenge.hexagon_region(2, 3, 2),
}


def _region(name):
    try:
        return REGIONS[name]()
    except ValueError as exc:  # a removal that is not tileable would make the case meaningless
        pytest.fail(f"{name}: {exc}")


@pytest.mark.parametrize("name", sorted(REGIONS))
def test_kernel_matches_the_generic_engine_on_every_level(monkeypatch, name):
    region = _region(name)
    assert region.exact_methods()["points"].kernel == "lattice points"
    for seed in (0, 5, 11):
        reference = region.sample(seed=seed, method="points-generic").heights
        for level in fl.simd_levels():
            monkeypatch.setenv("FROSTLINE_SIMD", level)
            np.testing.assert_array_equal(region.sample(seed=seed, method="points").heights, reference)
        np.testing.assert_array_equal(region.sample(seed=seed, method="points", threads=2).heights, reference)


def test_large_region_threads_and_generic_agree():
    region = fl.lozenge.hexagon_region(14, 11, 9)
    reference = region.sample(seed=3, method="points-generic").heights
    for threads in (1, 2, 3):
        np.testing.assert_array_equal(region.sample(seed=3, method="points", threads=threads).heights, reference)


@pytest.mark.parametrize("name", ["trapezoid 6 4", "trapezoid 7 3", "trapezoid 5 3", "hexagon minus a pair",
                                  "hexagon 2 3 2"])
def test_kernel_samples_follow_the_uniform_law(name):
    region = _region(name)
    tilings = fl.exact.enumerate(region)
    law = {tuple(int(v) for v in h.ravel()): 1.0 / len(tilings) for h in tilings}
    n = 3000
    observed = Counter(tuple(int(v) for v in s.heights.ravel())
                       for s in region.samples(n, seed=20261203, method="points"))
    assert set(observed) <= set(law)
    assert pooled_chi_square(observed, law, n) > P_FLOOR


def test_weighted_regions_have_no_lattice_point_kernel():
    region = fl.lozenge.trapezoid(6, 4, q=0.8)
    assert "points" not in region.exact_methods()
    assert region.exact_methods()["points-generic"].kernel == "generic"
    with pytest.raises(ValueError, match="uniform weights only"):
        region.sample(seed=1, method="points")


def test_overlapping_runs_are_refused():
    from frostline import _core

    flat = np.zeros(64, dtype=np.int32)
    for runs in ([[2, 2, 4], [2, 3, 5]], [[3, 2, 3], [2, 2, 3]]):
        with pytest.raises(ValueError, match="disjoint"):
            _core.lozenge.point_sample(8, 8, 0, np.array(runs, dtype=np.int32), flat, flat, 1, 2)
