"""Tiles of hexagon tilings: the region is covered exactly, with ab, bc, ca lozenges per type."""
from collections import Counter

import numpy as np
from hypothesis import given, strategies as st

import frostline as fl
from frostline.lozenge import tiles_of_plane_partition


def triangles_of_hexagon(a, b, c):
    """Unit triangles inside the a, b, c hexagon, found by testing centroids (independent check)."""
    corners = np.array([(0, 0), (a, 0), (a, b), (a - c, b + c), (-c, b + c), (-c, c)], float)

    def inside(p):
        # counter-clockwise convex polygon: p left of every edge (lattice coordinates are affine, so fine)
        for k in range(6):
            e = corners[(k + 1) % 6] - corners[k]
            d = p - corners[k]
            if e[0] * d[1] - e[1] * d[0] < -1e-9:
                return False
        return True

    found = set()
    if a * b + b * c + c * a == 0:  # zero area: the centroid test below would accept everything
        return found
    for x in range(-c - 1, a + 2):
        for y in range(-1, b + c + 2):
            if inside(np.array([x + 1 / 3, y + 1 / 3])):
                found.add((x, y, 0))
            if inside(np.array([x + 2 / 3, y + 2 / 3])):
                found.add((x, y, 1))
    return found


def triangles_of_tiles(tiles):
    partner = {0: (0, 0), 1: (0, -1), 2: (-1, 0)}
    out = []
    for x, y, t in tiles:
        dx, dy = partner[int(t)]
        out += [(int(x), int(y), 0), (int(x + dx), int(y + dy), 1)]
    return out


def check_tiling(tiles, a, b, c):
    covered = triangles_of_tiles(tiles)
    assert len(covered) == len(set(covered)), "a triangle is covered twice"
    assert set(covered) == triangles_of_hexagon(a, b, c)
    kinds = Counter(int(t) for t in tiles[:, 2])
    # fact of the trade (common practice): ab, bc and ca lozenges of types 0, 1, 2
    assert (kinds[0], kinds[1], kinds[2]) == (a * b, b * c, c * a)


def test_3x3x3_has_nine_of_each():
    S = fl.lozenge.hexagon(3, 3, 3).sample(seed=2)
    assert len(S.tiles) == 27
    check_tiling(S.tiles, 3, 3, 3)


@given(st.integers(0, 5), st.integers(0, 5), st.integers(0, 5), st.integers(0, 2**32))
def test_samples_tile_the_hexagon(a, b, c, seed):
    S = fl.lozenge.hexagon(a, b, c).sample(seed=seed)
    assert S.heights.shape == (a, b)
    assert fl.lozenge.is_plane_partition(S.heights, c)
    check_tiling(S.tiles, a, b, c)


@given(st.data())
def test_extremal_plane_partitions_tile(data):
    a, b, c = (data.draw(st.integers(1, 4)) for _ in range(3))
    for fill in (0, c):
        check_tiling(tiles_of_plane_partition(np.full((a, b), fill), c), a, b, c)


def test_zero_side_has_one_tiling():
    R = fl.lozenge.hexagon(0, 4, 3)
    assert R.count() == 1
    S = R.sample(seed=0)
    assert S.heights.shape == (0, 4) and S.info.start_time == 0
    check_tiling(S.tiles, 0, 4, 3)
