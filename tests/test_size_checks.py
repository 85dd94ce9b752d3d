"""Requests proportional to their input are estimated and refused before anything is allocated.

Each case used to allocate gigabytes (or spawn a hundred million seed
children) before any check; now it is refused at once with the estimate.
"""
from __future__ import annotations

import time

import numpy as np
import pytest

import frostline as fl
from frostline.errors import RegionTooLargeError


def _refused_fast(thunk, match: str = "memory", seconds: float = 2.0):
    start = time.perf_counter()
    with pytest.raises(RegionTooLargeError, match=match):
        thunk()
    assert time.perf_counter() - start < seconds


def test_huge_aztec_diamond_is_refused_before_its_mask():
    _refused_fast(lambda: fl.domino.aztec_diamond(16384))  # two 8 GiB grids were built first


def test_rectangle_respects_the_limit(monkeypatch):
    monkeypatch.setenv("FROSTLINE_MEMORY_LIMIT", "2e7")
    _refused_fast(lambda: fl.domino.rectangle(1000, 1000))
    _refused_fast(lambda: fl.domino.aztec_diamond(1000))
    assert fl.domino.aztec_diamond(50).count() == 2 ** (50 * 51 // 2)


def test_far_apart_triangles_are_refused_by_their_bounding_box():
    far = [(0, 0, 0), (0, 0, 1), (2**27, 2**27, 0), (2**27, 2**27, 1)]
    _refused_fast(lambda: fl.lozenge.from_triangles(far), match="bounding box")


def test_a_long_thin_boundary_path_is_refused_by_its_bounding_box():
    # 800 000 unit steps enclosing a thin staircase: few triangles, a 200 000 x 200 000 bounding box;
    # refused from the path's points, before the row scan (which took about a minute on this path)
    with pytest.raises(RegionTooLargeError, match="bounding box"):
        fl.lozenge.from_boundary("200000(1e 1ne) 1nw 200000(1w 1sw) 1se")


def test_huge_ensembles_are_refused_before_spawning():
    region = fl.lozenge.hexagon(4, 4, 4)
    _refused_fast(lambda: region.samples(10**8, seed=1))


def test_ensembles_spawn_the_same_children_as_seedsequence():
    region = fl.lozenge.hexagon(3, 4, 3)
    members = region.samples(9, seed=77, threads=2)
    for sample, child in zip(members, np.random.SeedSequence(77).spawn(9)):
        np.testing.assert_array_equal(sample.heights, region.sample(child).heights)


def test_tiny_density_bins_are_refused():
    sample = fl.lozenge.hexagon(6, 6, 6).sample(seed=1)
    _refused_fast(lambda: fl.analysis.density_grid([sample], bin_size=1e-4))


def test_a_text_picture_is_sized_by_its_bounding_box():
    # 100 000 short lines and one long one: 2e5 characters of text, a 1e10-cell bounding box
    text = "##\n" * 100_000 + "#" * 100_000
    with pytest.raises(RegionTooLargeError, match="100001x100000 picture"):
        fl.domino.from_picture(text)
    with pytest.raises(ValueError, match="unexpected symbol '\\?' in row 1, column 2"):
        fl.domino.from_picture("##\n..?#\n")
