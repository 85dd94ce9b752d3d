"""General lozenge regions: counts, exact distributions, property tests, tileability errors."""
from collections import Counter

import numpy as np
import pytest
import sympy
from hypothesis import HealthCheck, given, settings, strategies as st

import frostline as fl
from frostline.lozenge import tiles_of_plane_partition
from reference.lozenge_matchings import OFFSETS, tilings
from reference.plane_partitions import plane_partitions
from reference.statistics import P_FLOOR, pooled_chi_square

OCTAGON = ([1, 1, 1, 2, 2, 1, 3, 3], ["e", "ne", "nw", "ne", "nw", "w", "sw", "se"])

SMALL_REGIONS = {
    "hexagon minus a corner lozenge": lambda: fl.lozenge.hexagon_minus(3, 2, 3, removed=[(0, 0, 0), (0, 0, 1)]),
    "trapezoid": lambda: fl.lozenge.trapezoid(4, 3),
    "trapezoid with chosen notches": lambda: fl.lozenge.trapezoid(3, 3, notches=[0, 2, 5]),
    "non-convex octagon": lambda: fl.lozenge.polygon(*OCTAGON),
    "staircase path": lambda: fl.lozenge.from_boundary("2(e ne) 3nw 2w 2sw 3se"),
}


def tile_set(tiles):
    return frozenset(map(tuple, np.asarray(tiles).tolist()))


@pytest.mark.parametrize("name", sorted(SMALL_REGIONS))
def test_counts_match_brute_force_enumeration(name):
    R = SMALL_REGIONS[name]()
    assert R.count() == sum(1 for _ in tilings(R.triangles.tolist())) > 0


def adjacency_det_in_sympy(triangles):
    # Built here, independently: rows up triangles, columns down triangles, 1 when they share an edge.
    ups = sorted((x, y) for x, y, s in triangles if s == 0)
    downs = sorted((x, y) for x, y, s in triangles if s == 1)
    col = {d: k for k, d in enumerate(downs)}
    m = sympy.zeros(len(ups), len(downs))
    for r, (x, y) in enumerate(ups):
        for dx, dy in OFFSETS.values():
            if (x + dx, y + dy) in col:
                m[r, col[(x + dx, y + dy)]] = 1
    return abs(m.det(method="bareiss"))


@pytest.mark.parametrize("region", [
    lambda: fl.lozenge.polygon([2, 2, 1, 3, 3, 2, 5, 4], ["e", "ne", "nw", "ne", "nw", "w", "sw", "se"]),
    lambda: fl.lozenge.trapezoid(5, 4, notches=[0, 3, 4, 8]),
    lambda: fl.lozenge.hexagon_minus(4, 3, 4, removed=[(3, 0, 0), (3, 0, 1), (2, 0, 0), (2, 0, 1)]),
])
def test_counts_match_exact_determinant_from_sympy(region):
    # Kasteleyn (1967): for lozenges the plain 0/1 adjacency determinant counts tilings.
    R = region()
    assert R.count() == adjacency_det_in_sympy(R.triangles.tolist())


@pytest.mark.parametrize("sides", [(1, 1, 1), (2, 3, 4), (3, 3, 3), (5, 2, 4), (0, 3, 2)])
def test_general_route_counts_hexagons_like_macmahon(sides):
    # MacMahon's formula (OEIS A008793 on the diagonal) through the box route.
    if 0 in sides:
        assert fl.lozenge.hexagon(*sides).count() == 1
        return
    assert fl.lozenge.hexagon_region(*sides).count() == fl.lozenge.hexagon(*sides).count()


def test_large_count_is_fast_and_exact():
    # 1,200 lozenges: the 20 x 20 x 20 hexagon's 137-digit count (docs/references.md section 1).
    R = fl.lozenge.hexagon_region(20, 20, 20)
    assert R.count() == fl.lozenge.hexagon(20, 20, 20).count()


@pytest.mark.parametrize("q", [1.0, 0.6])
def test_general_route_samples_match_the_box_law(q):
    # The law of plane partitions in the 2x2x3 box, weight q^volume, carried to tilings.
    weights = {tile_set(tiles_of_plane_partition(np.array(p).reshape(2, 2), 3)): q ** sum(p)
               for p in plane_partitions(2, 2, 3)}
    total = sum(weights.values())
    law = {k: w / total for k, w in weights.items()}
    R = fl.lozenge.hexagon_region(2, 2, 3, q=q)
    n = 4000
    seeds = np.random.SeedSequence(31).spawn(n)
    observed = Counter(tile_set(R.sample(s).tiles) for s in seeds)
    assert pooled_chi_square(observed, law, n) > P_FLOOR


def test_weighted_partition_function_agrees_with_the_box():
    from fractions import Fraction

    q = Fraction(3, 5)
    assert fl.lozenge.hexagon_region(2, 3, 2, q=q).partition_function() == \
        fl.lozenge.hexagon(2, 3, 2, q=q).partition_function()


@pytest.mark.parametrize("name", ["non-convex octagon", "trapezoid", "staircase path"])
def test_exact_samples_are_uniform_on_irregular_regions(name):
    R = SMALL_REGIONS[name]()
    support = list(tilings(R.triangles.tolist()))
    law = {t: 1 / len(support) for t in support}
    n = max(3000, 20 * len(support))
    seeds = np.random.SeedSequence(77).spawn(n)
    observed = Counter(tile_set(R.sample(s).tiles) for s in seeds)
    assert pooled_chi_square(observed, law, n) > P_FLOOR


# ----- property tests ------------------------------------------------------------

def check_sample(R, seed):
    S = R.sample(seed=seed)
    covered = []
    for x, y, t in S.tiles.tolist():
        dx, dy = OFFSETS[t]
        covered += [(x, y, 0), (x + dx, y + dy, 1)]
    assert sorted(covered) == sorted(map(tuple, R.triangles.tolist()))
    assert np.array_equal(R.heights_from_tiles(S.tiles), S.heights)
    assert np.array_equal(R.tiles_from_heights(S.heights), S.tiles)


DOCUMENTED = ("cannot be tiled", "has a hole", "cannot carry a height function", "boundary is inconsistent",
              "no configuration exists")


@st.composite
def lozenge_patches(draw):
    """A random connected set of lozenges taken from a random plane partition's tiling."""
    a, b, c = (draw(st.integers(1, 4)) for _ in range(3))
    raw = np.array(draw(st.lists(st.integers(0, c), min_size=a * b, max_size=a * b))).reshape(a, b)
    pp = np.minimum.accumulate(np.minimum.accumulate(np.sort(raw, axis=None)[::-1].reshape(a, b), 0), 1)
    tiles = tiles_of_plane_partition(pp, c).tolist()
    rotate = draw(st.integers(0, 2))  # look at the stack from another side: reorder the tile list
    tiles = tiles[rotate:] + tiles[:rotate]
    k = draw(st.integers(1, len(tiles)))
    chosen = tiles[:k]
    tri = []
    for x, y, t in chosen:
        dx, dy = OFFSETS[t]
        tri += [(x, y, 0), (x + dx, y + dy, 1)]
    return tri


@settings(suppress_health_check=[HealthCheck.too_slow], max_examples=60)
@given(lozenge_patches(), st.integers(0, 2**32))
def test_patches_of_tilings_sample_to_valid_tilings(triangles, seed):
    # A union of lozenges is tileable; the only documented refusal is a hole.
    try:
        R = fl.lozenge.from_triangles(triangles)
    except ValueError as exc:
        assert "has a hole" in str(exc)
        return
    check_sample(R, seed)


@settings(max_examples=120)
@given(st.sets(st.tuples(st.integers(0, 3), st.integers(0, 2), st.integers(0, 1)), min_size=1, max_size=16),
       st.integers(0, 2**32))
def test_random_unions_of_triangles_sample_or_raise_the_documented_error(triangles, seed):
    try:
        R = fl.lozenge.from_triangles(sorted(triangles))
    except ValueError as exc:
        assert any(words in str(exc) for words in DOCUMENTED), str(exc)
        assert sum(1 for _ in tilings(triangles)) == 0 or "has a hole" in str(exc)
        return
    assert R.count() == sum(1 for _ in tilings(triangles)) > 0
    check_sample(R, seed)


# ----- bad input ----------------------------------------------------------------------

@pytest.mark.parametrize("path, words", [
    ("3e 3ne 3nw 3w 3sw", "open"),
    ("2e 2ne 2w 3sw", "open"),
    ("3e 3nw 3se 3w", "twice"),
    ("2e 2ne 2nw 2w 2sw 2se 2e", "open"),
    ("2e 2nx 2nw", "unknown direction 'nx'"),
    ("2e 2ne ) 2nw", "unmatched"),
    ("2(e ne", "never closed"),
    ("3", "not followed by a direction"),
    ("2e; 2ne", "unexpected symbol"),
    ("", "empty"),
])
def test_bad_boundary_paths(path, words):
    with pytest.raises(ValueError, match=words):
        fl.lozenge.from_boundary(path)


def test_huge_region_is_refused_before_allocating():
    with pytest.raises(fl.RegionTooLargeError, match="GiB"):
        fl.lozenge.from_boundary("50000e 50000ne 50000nw 50000w 50000sw 50000se")


def test_boundary_path_of_wrong_type():
    with pytest.raises(TypeError, match="boundary path is a str"):
        fl.lozenge.from_boundary(["e", "ne"])


def test_unbalanced_region_names_the_counts():
    with pytest.raises(ValueError, match="3 up and 2 down triangles"):
        fl.lozenge.from_triangles([(0, 0, 0), (1, 0, 0), (2, 0, 0), (0, 0, 1), (1, 0, 1)])


def test_region_with_a_hole_is_refused():
    # the 3,3,3 hexagon without the two triangles around its centre line
    with pytest.raises(ValueError, match="has a hole"):
        fl.lozenge.hexagon_minus(3, 3, 3, removed=[(0, 2, 0), (0, 1, 1)])


def test_conflict_is_named_by_lattice_point():
    with pytest.raises(ValueError, match=r"lattice point \(1, 1\) and the lattice point \(2, 1\)"):
        fl.lozenge.from_triangles([(0, 1, 1), (1, 0, 0), (1, 0, 1), (1, 1, 0), (1, 1, 1), (2, 0, 0)])


@pytest.mark.parametrize("up, down, error, words", [
    (np.zeros((2, 2), bool), np.zeros((2, 2), bool), ValueError, "empty"),
    (np.ones((2, 2), bool), np.ones((3, 2), bool), ValueError, "one shape"),
    (np.ones((2, 2), int), np.ones((2, 2), int), TypeError, "boolean"),
])
def test_bad_masks(up, down, error, words):
    with pytest.raises(error, match=words):
        fl.lozenge.from_masks(up, down)


def test_masks_and_triangles_agree():
    rows = fl.lozenge.hexagon_region(2, 3, 2).triangles
    lo = rows[:, :2].min(axis=0)
    shape = tuple(rows[:, :2].max(axis=0) - lo + 1)
    up, down = np.zeros(shape, bool), np.zeros(shape, bool)
    for x, y, s in rows.tolist():
        (up if s == 0 else down)[x - lo[0], y - lo[1]] = True
    R = fl.lozenge.from_masks(up, down, origin=tuple(int(v) for v in lo))
    assert np.array_equal(R.triangles, rows)
    assert R.count() == fl.lozenge.hexagon(2, 3, 2).count()


@pytest.mark.parametrize("rows, error", [([(0, 0, 2)], ValueError), ([(0.5, 0, 0)], TypeError),
                                         ([(0, 0)], ValueError), ("abc", ValueError)])
def test_bad_triangle_rows(rows, error):
    with pytest.raises(error):
        fl.lozenge.from_triangles(rows)
