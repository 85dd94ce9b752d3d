"""The cube-column kernel of general lozenge regions (lozenge/columns.py, plugins/lozenge/column_rows.inl).

First the bijection it rests on (docs/column_form.md): on every region here,
each tiling maps to a column grid that maps back to it, distinct tilings to
distinct grids, and the column grids between the least and greatest grids
(enumerated by the engine from the column model alone) are exactly as many as
the tilings; with the round trip that makes the map a bijection. Then the
kernel: the generic engine's sample bit for bit on every instruction-set level
and thread count, the box kernel's sample on hexagons, and the exact law
(chi-square against enumeration of the lattice-point model, uniform and
q ** volume, fixed seeds, p-value floor P_FLOOR = 1e-4: a correct sampler
fails each test with probability 1e-4).
"""
from __future__ import annotations

from collections import Counter

import numpy as np
import pytest

import frostline as fl
from frostline import _core
from frostline.lozenge.columns import columns_from_heights, heights_from_columns, lower_columns
from reference.statistics import P_FLOOR, pooled_chi_square

REGIONS = {
    "hexagon 4 3 2 by path": lambda q: fl.lozenge.from_boundary("4e 3ne 2nw 4w 3sw 2se", q=q),
    "hexagon 3 2 4 by path": lambda q: fl.lozenge.from_boundary("3e 2ne 4nw 3w 2sw 4se", q=q),
    "trapezoid 6 4": lambda q: fl.lozenge.trapezoid(6, 4, q=q),
    "trapezoid 7 3 notched": lambda q: fl.lozenge.trapezoid(7, 3, notches=[0, 3, 5], q=q),
    "trapezoid 5 3": lambda q: fl.lozenge.trapezoid(5, 3, q=q),
    "hexagon minus a pair": lambda q: fl.lozenge.hexagon_minus(3, 3, 3, removed=[(-3, 2, 1), (-3, 3, 0)], q=q),
    "hexagon 2 3 2": lambda q: fl.lozenge.hexagon_region(2, 3, 2, q=q),
}

# A snake-shaped region (found by a seeded random search) whose boundary heights do not extend to the
# plane: its two ends come closer than their heights allow, so it has no column form (126 tilings).
NO_COLUMNS = [
    [-1, 0, 1], [-1, 1, 0], [-1, 1, 1], [-1, 2, 0], [-1, 2, 1], [-1, 4, 1], [-1, 5, 1], [-1, 6, 0], [0, -1, 1],
    [0, 0, 0], [0, 0, 1], [0, 1, 0], [0, 1, 1], [0, 2, 0], [0, 4, 0], [0, 4, 1], [0, 5, 0], [0, 5, 1], [1, -1, 0],
    [1, -1, 1], [1, 0, 0], [1, 0, 1], [1, 1, 0], [1, 1, 1], [1, 2, 0], [1, 2, 1], [1, 3, 0], [1, 3, 1], [1, 4, 0],
    [1, 4, 1], [1, 5, 0], [1, 5, 1], [2, -1, 0], [2, -1, 1], [2, 0, 0], [2, 0, 1], [2, 1, 0], [2, 1, 1], [2, 2, 0],
    [2, 2, 1], [2, 3, 0], [2, 3, 1], [2, 4, 0], [2, 4, 1], [2, 5, 0], [3, 0, 0], [3, 0, 1], [3, 1, 0], [3, 1, 1],
    [3, 2, 0], [3, 2, 1], [3, 3, 0], [3, 3, 1], [4, 2, 0],
]


def _neighbours(tri):
    x, y, s = tri
    if s == 0:
        return [(x, y, 1), (x, y - 1, 1), (x - 1, y, 1)]
    return [(x, y, 0), (x, y + 1, 0), (x + 1, y, 0)]


def random_regions(count: int, seed: int):
    """Seeded random simply connected regions: blobs of triangles grown at random, the tileable ones kept."""
    rng = np.random.default_rng(seed)
    out = []
    while len(out) < count:
        chosen = {(0, 0, 0)}
        size = 2 * int(rng.integers(8, 22))
        while len(chosen) < size:
            frontier = sorted({nb for t in chosen for nb in _neighbours(t)} - chosen)
            chosen.add(frontier[int(rng.integers(len(frontier)))])
        try:
            region = fl.lozenge.LozengeRegion(np.array(sorted(chosen), dtype=np.int64))
        except ValueError:  # not tileable, or it encloses a hole
            continue
        if region.column_form()[0] is not None:
            out.append(region)
    return out


def check_bijection(region) -> None:
    form, reason = region.column_form()
    assert form is not None, reason
    tilings = fl.exact.enumerate(region)
    grids = set()
    for heights in tilings:
        grid = columns_from_heights(region, form, heights)
        np.testing.assert_array_equal(heights_from_columns(region, form, grid), heights)
        grids.add(grid.tobytes())
    assert len(grids) == len(tilings)
    # the engine enumerates the column model alone: as many grids as tilings, each a tiling
    configurations = _core.engine.all_configurations(lower_columns(form)._compiled, 10**6)
    assert len(configurations) == len(tilings) == region.count()
    r, s = np.nonzero(form.free)
    for row in configurations[:200]:
        grid = form.least.copy()
        grid[r, s] = row
        region.check_heights(heights_from_columns(region, form, grid))


@pytest.mark.parametrize("name", sorted(REGIONS))
def test_column_grids_are_the_tilings(name):
    check_bijection(REGIONS[name](1.0))


def test_column_grids_are_the_tilings_of_random_regions():
    regions = random_regions(40, seed=20261204)
    for region in regions:
        check_bijection(region)


def test_a_region_without_column_form_keeps_the_lattice_point_kernel():
    region = fl.lozenge.LozengeRegion(np.array(NO_COLUMNS))
    form, reason = region.column_form()
    assert form is None and "do not extend" in reason
    assert region.exact_methods()["cftp"].kernel == "lattice points"
    with pytest.raises(ValueError, match="no cube-column form"):
        region.sample(seed=1, method="columns")
    tilings = fl.exact.enumerate(region)
    assert len(tilings) == region.count() == 126
    law = {tuple(int(v) for v in h.ravel()): 1.0 / len(tilings) for h in tilings}
    n = 3000
    observed = Counter(tuple(int(v) for v in s.heights.ravel()) for s in region.samples(n, seed=5))
    assert pooled_chi_square(observed, law, n) > P_FLOOR


@pytest.mark.parametrize("q", [1.0, 0.7])
@pytest.mark.parametrize("name", sorted(REGIONS))
def test_kernel_matches_the_generic_engine_on_every_level(monkeypatch, name, q):
    region = REGIONS[name](q)
    assert region.exact_methods()["cftp"].kernel == "cube columns"
    for seed in (0, 5):
        reference = region.sample(seed=seed, method="generic").heights
        for level in fl.simd_levels():
            monkeypatch.setenv("FROSTLINE_SIMD", level)
            np.testing.assert_array_equal(region.sample(seed=seed).heights, reference)
        np.testing.assert_array_equal(region.sample(seed=seed, threads=2).heights, reference)


@pytest.mark.parametrize("q", [1.0, 0.8])
def test_large_region_threads_and_generic_agree(q):
    region = fl.lozenge.hexagon_minus(12, 10, 9, removed=[(-9, 8, 1), (-9, 9, 0)], q=q)
    reference = region.sample(seed=3, method="generic").heights
    for threads in (1, 2, 3):
        np.testing.assert_array_equal(region.sample(seed=3, threads=threads).heights, reference)


@pytest.mark.parametrize("q", [1.0, 0.9, 1.2])
def test_hexagon_region_gives_the_box_kernels_tiling(q):
    # the same chain on the same cells in the same order: the box kernel, written independently
    for a, b, c, seed in ((4, 3, 5, 1), (9, 7, 8, 2)):
        general = fl.lozenge.hexagon_region(a, b, c, q=q).sample(seed=seed)
        box = fl.lozenge.hexagon(a, b, c, q=q).sample(seed=seed)
        np.testing.assert_array_equal(general.tiles, box.tiles)


LAW_REGIONS = ["hexagon 3 2 4 by path", "trapezoid 6 4", "trapezoid 7 3 notched", "trapezoid 5 3",
               "hexagon minus a pair"]


@pytest.mark.parametrize("q", [1.0, 0.6, 1.45])
@pytest.mark.parametrize("name", LAW_REGIONS)
def test_kernel_samples_follow_the_exact_law(name, q):
    region = REGIONS[name](q)
    configurations, probabilities = fl.exact.distribution(region)  # enumeration of the lattice-point model
    law = {tuple(int(v) for v in h.ravel()): float(p) for h, p in zip(configurations, probabilities)}
    n = 3000
    observed = Counter(tuple(int(v) for v in s.heights.ravel())
                       for s in region.samples(n, seed=20261204, method="columns"))
    assert set(observed) <= set(law)
    assert pooled_chi_square(observed, law, n) > P_FLOOR


def test_wrong_weight_is_detected():
    # the test can fail: q = 0.6 samples are rejected against the uniform law
    region = REGIONS["trapezoid 6 4"](0.6)
    uniform = REGIONS["trapezoid 6 4"](1.0)
    configurations, probabilities = fl.exact.distribution(uniform)
    law = {tuple(int(v) for v in h.ravel()): float(p) for h, p in zip(configurations, probabilities)}
    observed = Counter(tuple(int(v) for v in s.heights.ravel()) for s in region.samples(3000, seed=2))
    assert pooled_chi_square(observed, law, 3000) < P_FLOOR


def test_sparse_regions_skip_the_column_form_and_keep_the_other_kernels(monkeypatch):
    # two small hexagons far apart: the extension check would span their whole bounding grid
    t = fl.lozenge.hexagon_region(2, 2, 2).triangles
    region = fl.lozenge.LozengeRegion(np.concatenate([t, t + [600, 600, 0]]))
    form, reason = region.column_form()
    assert form is None and "bounding grid" in reason
    assert region.exact_methods()["cftp"].kernel == "lattice points"
    monkeypatch.setenv("FROSTLINE_MEMORY_LIMIT", str(10**8))
    crowded = fl.lozenge.LozengeRegion(np.concatenate([t, t + [60, 60, 0]]))
    assert crowded.sample(seed=1, method="points").heights.shape == crowded.vertex_mask.shape


def test_bad_layouts_are_refused():
    flat = np.zeros(36, dtype=np.int32)
    high = np.ones(36, dtype=np.int32)
    with pytest.raises(ValueError, match="disjoint"):
        _core.lozenge.column_sample(6, 6, np.array([[2, 1, 3], [2, 2, 4]], dtype=np.int32), flat, high, 1.0, 1, 2)
    with pytest.raises(ValueError, match="strictly inside"):
        _core.lozenge.column_sample(6, 6, np.array([[0, 1, 3]], dtype=np.int32), flat, high, 1.0, 1, 2)
    with pytest.raises(ValueError, match="above the greatest"):
        _core.lozenge.column_sample(6, 6, np.array([[2, 1, 3]], dtype=np.int32), high, flat, 1.0, 1, 2)
    with pytest.raises(ValueError, match="never move"):  # a cell no sweep visits must be fixed
        _core.lozenge.column_sample(6, 6, np.array([[2, 1, 3]], dtype=np.int32), flat, high, 1.0, 1, 2)
    with pytest.raises(ValueError, match="one height per grid entry"):
        _core.lozenge.column_sample(6, 6, np.array([[2, 1, 3]], dtype=np.int32), flat[:5], high, 1.0, 1, 2)
