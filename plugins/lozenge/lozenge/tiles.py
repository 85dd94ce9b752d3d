"""Lozenges on the triangular lattice: geometry and plane partitions -> tiles.

Conventions (docs/design.md section 3). Lattice point (i, j) is the plane point
i * (1, 0) + j * (1/2, sqrt(3)/2). The up triangle (x, y, 0) has corners
(x, y), (x+1, y), (x, y+1); the down triangle (x, y, 1) has corners
(x+1, y), (x, y+1), (x+1, y+1). A lozenge (x, y, t) is the up triangle
(x, y) joined to the down triangle (x, y) when t = 0, (x, y-1) when t = 1,
(x-1, y) when t = 2. In the stack-of-cubes picture type 0 lozenges are the
tops of the cubes, types 1 and 2 their two visible sides.
"""
from __future__ import annotations

import numpy as np

SQRT3_2 = np.sqrt(3.0) / 2.0

#: corners (lattice coordinates relative to (x, y)) of each lozenge type, in perimeter order
LOZENGE_CORNERS = np.array(
    [
        [(0, 0), (1, 0), (1, 1), (0, 1)],    # type 0: U(x, y) + D(x, y)
        [(0, 0), (1, -1), (1, 0), (0, 1)],   # type 1: U(x, y) + D(x, y-1)
        [(0, 0), (1, 0), (0, 1), (-1, 1)],   # type 2: U(x, y) + D(x-1, y)
    ],
    dtype=np.int64,
)

#: down triangle joined to U(x, y) by a lozenge of each type: D(x + dx, y + dy)
DOWN_PARTNER = np.array([(0, 0), (0, -1), (-1, 0)], dtype=np.int64)

TILE_CLASSES = ("type 0", "type 1", "type 2")


def plane_points(points: np.ndarray) -> np.ndarray:
    """Map lattice coordinates (..., 2) to plane coordinates (..., 2)."""
    p = np.asarray(points, dtype=float)
    out = np.empty_like(p)
    out[..., 0] = p[..., 0] + 0.5 * p[..., 1]
    out[..., 1] = SQRT3_2 * p[..., 1]
    return out


def lozenge_polygons(tiles: np.ndarray) -> np.ndarray:
    """Corners of each lozenge in plane coordinates, shape (k, 4, 2), in perimeter order."""
    tiles = np.asarray(tiles, dtype=np.int64).reshape(-1, 3)
    corners = tiles[:, None, :2] + LOZENGE_CORNERS[tiles[:, 2]]
    return plane_points(corners)


def tiles_of_plane_partition(pp: np.ndarray, c: int) -> np.ndarray:
    """Every lozenge of the hexagon tiling given by a plane partition in an a x b x c box.

    Stack of cubes: cell (r, s) of ``pp`` is floor cell (k, l) = (r, b-1-s) of
    the box [0, a] x [0, b] x [0, c], and a unit cube at (k, l, z) is drawn by
    the projection (X, Y, Z) -> lattice point (X - Z, Y + Z). Then the cube
    tops are lozenges (k - z, l + z, 0), the faces normal to +X are
    (k - z - 1, l + z + 1, 1) and the faces normal to -Y are (k - z, l + z + 1, 2).
    The tiling covers the hexagon with corners (0,0), (a,0), (a,b), (a-c,b+c),
    (-c,b+c), (-c,c). Rows are sorted lexicographically.
    """
    pp = np.asarray(pp, dtype=np.int64)
    a, b = pp.shape
    height = pp[:, ::-1]  # height[k, l] = pp[k, b-1-l]
    # walls: c behind (k = -1) and to the back (l = b); floor level 0 in front
    ext = np.zeros((a + 2, b + 2), dtype=np.int64)  # ext[k + 1, l + 1]
    ext[1 : a + 1, 1 : b + 1] = height
    ext[0, :] = c
    ext[:, b + 1] = c

    k, l = np.meshgrid(np.arange(a), np.arange(b), indexing="ij")
    tops = np.stack([k - height, l + height, np.zeros_like(k)], axis=-1).reshape(-1, 3)

    # +X faces at X = k (k = 0..a), Y = l: z from h(k, l) up to h(k - 1, l)
    kx, lx = np.meshgrid(np.arange(a + 1), np.arange(b), indexing="ij")
    lower = ext[kx + 1, lx + 1]
    upper = ext[kx, lx + 1]
    side1 = _faces(kx, lx, lower, upper, lambda kk, ll, z: (kk - z - 1, ll + z + 1, 1))

    # -Y faces at Y = l + 1 (l = -1..b-1), X = k: z from h(k, l) up to h(k, l + 1)
    ky, ly = np.meshgrid(np.arange(a), np.arange(-1, b), indexing="ij")
    lower = ext[ky + 1, ly + 1]
    upper = ext[ky + 1, ly + 2]
    side2 = _faces(ky, ly, lower, upper, lambda kk, ll, z: (kk - z, ll + z + 1, 2))

    tiles = np.concatenate([tops, side1, side2]).astype(np.int64)
    order = np.lexsort((tiles[:, 2], tiles[:, 1], tiles[:, 0]))
    return tiles[order]


def _faces(k, l, lower, upper, make) -> np.ndarray:
    """One lozenge per unit height z in [lower, upper) at each (k, l)."""
    k, l, lower, upper = (np.ravel(v) for v in (k, l, lower, upper))
    counts = np.maximum(upper - lower, 0)
    kk = np.repeat(k, counts)
    ll = np.repeat(l, counts)
    starts = np.repeat(lower, counts)
    offsets = np.arange(counts.sum()) - np.repeat(np.cumsum(counts) - counts, counts)
    z = starts + offsets
    x, y, t = make(kk, ll, z)
    return np.stack([x, y, np.full_like(x, t)], axis=-1).reshape(-1, 3)


def hexagon_corners(a: int, b: int, c: int) -> np.ndarray:
    """Corners of the a, b, c hexagon in lattice coordinates, counter-clockwise from (0, 0)."""
    return np.array([(0, 0), (a, 0), (a, b), (a - c, b + c), (-c, b + c), (-c, c)], dtype=np.int64)


def lozenge_centres(tiles: np.ndarray) -> np.ndarray:
    """Plane coordinates (k, 2) of lozenge centres."""
    return lozenge_polygons(tiles).mean(axis=1)


def lozenge_dimer_system(triangles: np.ndarray) -> dict:
    """The 0/1 Kasteleyn (adjacency) matrix of a region of triangles and the tile of each entry.

    Rows: up triangles, columns: down triangles (each sorted by (y, x)); for
    lozenges every face of the dual graph is a hexagon, so no signs are needed
    (Kasteleyn 1967).
    """
    tri = np.asarray(triangles)
    up = tri[tri[:, 2] == 0]
    down = tri[tri[:, 2] == 1]
    up = up[np.lexsort((up[:, 0], up[:, 1]))]
    down = down[np.lexsort((down[:, 0], down[:, 1]))]
    column = {(int(x), int(y)): k for k, (x, y, _) in enumerate(down)}
    rows, cols, tiles = [], [], []
    for r, (x, y, _) in enumerate(up):
        for t, (dx, dy) in enumerate(DOWN_PARTNER):
            k = column.get((int(x + dx), int(y + dy)))
            if k is not None:
                rows.append(r)
                cols.append(k)
                tiles.append((int(x), int(y), t))
    matrix = np.zeros((len(up), len(down)))
    matrix[rows, cols] = 1.0
    return {"matrix": matrix, "rows": np.array(rows, dtype=np.int64), "cols": np.array(cols, dtype=np.int64),
            "tiles": np.array(tiles, dtype=np.int64).reshape(-1, 3)}
