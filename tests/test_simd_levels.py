"""Every instruction-set level of the vector kernels gives the identical sample.

The box kernel is compiled once per level (scalar, AVX2, AVX-512 where the
build and processor have them) and chosen at run time; FROSTLINE_SIMD forces
one. Integer arithmetic only, so the samples must agree bit for bit with each
other and with the generic engine (the reference path), for every shape of box
(odd and even sides exercise the pads of the split-row layout).
"""
from __future__ import annotations

import numpy as np
import pytest

import frostline as fl

LEVELS = fl.simd_levels()
BOXES = [(1, 1, 1), (1, 5, 3), (5, 1, 2), (2, 2, 2), (3, 4, 5), (4, 3, 2), (7, 6, 5), (6, 7, 4), (9, 2, 9),
         (16, 17, 8), (31, 33, 12)]


def _sample(monkeypatch, level: str, region, method: str, seed: int) -> np.ndarray:
    monkeypatch.setenv("FROSTLINE_SIMD", level)
    return region.sample(seed=seed, method=method).heights


def test_levels_listed_and_scalar_always_there():
    assert LEVELS[0] == "scalar"
    assert set(LEVELS) <= {"scalar", "avx2", "avx512"}
    assert fl.simd_level() in LEVELS


@pytest.mark.parametrize("box", BOXES)
def test_every_level_matches_the_generic_engine(monkeypatch, box):
    region = fl.lozenge.hexagon(*box)
    for seed in (0, 3):
        reference = _sample(monkeypatch, "scalar", region, "generic", seed)
        for level in LEVELS:
            np.testing.assert_array_equal(_sample(monkeypatch, level, region, "box", seed), reference,
                                          err_msg=f"level {level}, box {box}, seed {seed}")


@pytest.mark.parametrize("level", LEVELS)
def test_forward_chains_agree_across_levels(monkeypatch, level):
    region = fl.lozenge.hexagon(9, 8, 7)
    monkeypatch.setenv("FROSTLINE_SIMD", level)
    box = region.chain(seed=2, start="max", method="box").run(25).heights
    generic = region.chain(seed=2, start="max", method="generic").run(25).heights
    np.testing.assert_array_equal(box, generic)


@pytest.mark.parametrize("box", [(6, 7, 5, 0.85), (3, 530, 4, 1.3), (40, 30, 20, 0.97)])
def test_weighted_box_is_unchanged_by_the_level(monkeypatch, box):
    # the q^volume vector draws (frostline/vector/geometric_draws.inl): blocks of 256 cells (rows of 530
    # cells hold three), q < 1 and q > 1 (negated heights), and threads sharing the rows
    *sides, q = box
    region = fl.lozenge.hexagon(*sides, q=q)
    reference = _sample(monkeypatch, "scalar", region, "generic", 4)
    for level in LEVELS:
        np.testing.assert_array_equal(_sample(monkeypatch, level, region, "box", 4), reference)
    np.testing.assert_array_equal(region.sample(seed=4, method="box", threads=2).heights, reference)


def test_unknown_or_unavailable_level_is_refused(monkeypatch):
    region = fl.lozenge.hexagon(3, 3, 3)
    monkeypatch.setenv("FROSTLINE_SIMD", "sse9")
    with pytest.raises(ValueError, match="FROSTLINE_SIMD must be"):
        region.sample(seed=0)
    missing = [level for level in ("avx2", "avx512") if level not in LEVELS]
    for level in missing:
        monkeypatch.setenv("FROSTLINE_SIMD", level)
        with pytest.raises(ValueError, match="not available"):
            region.sample(seed=0)


def _irregular_domino_mask() -> np.ndarray:
    """A staircase with a side arm; every row has an even run of cells, so it is tileable."""
    mask = np.zeros((11, 14), dtype=bool)
    for r in range(11):
        start = r // 2
        mask[r, start:start + 6 + 2 * (r % 3)] = True
    mask[4:6, 10:14] = True
    return mask


DOMINO_REGIONS = {
    "aztec 1": lambda: fl.domino.aztec_diamond(1),
    "aztec 6": lambda: fl.domino.aztec_diamond(6),
    "aztec 13": lambda: fl.domino.aztec_diamond(13),
    "rectangle 2x2": lambda: fl.domino.rectangle(2, 2),
    "rectangle 5x8": lambda: fl.domino.rectangle(5, 8),
    "rectangle 9x4": lambda: fl.domino.rectangle(9, 4),
    "notched diamond": lambda: fl.domino.from_mask(_irregular_domino_mask()),
}


@pytest.mark.parametrize("name", sorted(DOMINO_REGIONS))
def test_domino_levels_match_the_generic_engine(monkeypatch, name):
    region = DOMINO_REGIONS[name]()
    for seed in (1, 8):
        reference = _sample(monkeypatch, "scalar", region, "generic", seed)
        for level in LEVELS:
            np.testing.assert_array_equal(_sample(monkeypatch, level, region, "cftp", seed), reference,
                                          err_msg=f"level {level}, {name}, seed {seed}")


@pytest.mark.parametrize("n", [1, 2, 3, 4, 7, 12, 25])
def test_square_ice_levels_match_the_generic_engine(monkeypatch, n):
    region = fl.square_ice.domain_wall(n)
    for seed in (2, 9):
        reference = _sample(monkeypatch, "scalar", region, "generic", seed)
        for level in LEVELS:
            np.testing.assert_array_equal(_sample(monkeypatch, level, region, "cftp", seed), reference,
                                          err_msg=f"level {level}, n = {n}, seed {seed}")


def test_square_ice_other_boundary_across_levels(monkeypatch):
    # a boundary other than domain walls: the heights of a sampled 10 x 10 configuration's rim
    inner = fl.square_ice.domain_wall(10).sample(seed=3).heights
    region = fl.square_ice.from_boundary(inner)
    reference = _sample(monkeypatch, "scalar", region, "generic", 5)
    for level in LEVELS:
        np.testing.assert_array_equal(_sample(monkeypatch, level, region, "cftp", 5), reference)


THREADED = {
    "hexagon 40x37x20": lambda: fl.lozenge.hexagon(40, 37, 20),
    "aztec 30": lambda: fl.domino.aztec_diamond(30),
    "staircase domino": lambda: fl.domino.from_mask(_irregular_domino_mask()),
    "domain wall 41": lambda: fl.square_ice.domain_wall(41),
}


@pytest.mark.parametrize("name", sorted(THREADED))
def test_threads_inside_one_sample_give_the_same_sample(name):
    region = THREADED[name]()
    one = region.sample(seed=6, threads=1).heights
    for threads in (2, 3, 7):
        np.testing.assert_array_equal(region.sample(seed=6, threads=threads).heights, one,
                                      err_msg=f"{name}, {threads} threads")


def test_threads_on_a_kernel_without_them_change_nothing():
    region = fl.lozenge.hexagon(6, 5, 4, q=0.7)
    np.testing.assert_array_equal(region.sample(seed=1, threads=3).heights, region.sample(seed=1).heights)


@pytest.mark.parametrize("bad", [0, -1, 5000])
def test_bad_thread_counts_are_refused(bad):
    with pytest.raises(ValueError, match="threads"):
        fl.lozenge.hexagon(3, 3, 3).sample(seed=0, threads=bad)
    with pytest.raises(TypeError):
        fl.lozenge.hexagon(3, 3, 3).sample(seed=0, threads=1.5)
