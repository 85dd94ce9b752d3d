"""Regions of unit triangles on the triangular lattice: vertices, edges, pieces, boundary.

Everything lives on one padded grid: triangle U(x, y) or D(x, y) and lattice
point (i, j) are stored at index (x - ox, y - oy) / (i - ox, j - oy), with a
margin of two cells so that every neighbour of the region is inside the grid.

Edges are named after the up triangle they bound and the lozenge that would
cross them: edge (x, y, t) separates U(x, y) from its partner D(x, y),
D(x, y-1), D(x-1, y) for t = 0, 1, 2, so "edge (x, y, t) is crossed" means
"lozenge (x, y, t) is present". Its direction (for the height rule) is
t = 0: (x+1, y) -> (x, y+1); t = 1: (x, y) -> (x+1, y); t = 2: (x, y+1) -> (x, y):
the directions (-1, 1), (1, 0), (0, -1), counter-clockwise around U(x, y).
Along a directed edge the height rises by 1 when uncrossed and falls by 2 when crossed.
"""
from __future__ import annotations

from dataclasses import dataclass
from typing import List, Tuple

import numpy as np

from frostline._limits import check_memory
from frostline.height_walk import refuse_holes

MARGIN = 2
#: peak memory of building a region, per triangle (masks, boundary walk, the generic model and Thurston's
#: extremes): measured 500-506 bytes on hexagons of 144 000 to 960 000 triangles (tests/test_memory_estimates.py)
BYTES_PER_TRIANGLE = 560
#: memory per point of the bounding-box grid (masks, node ids, heights, extremes, kernel layout)
GRID_BYTES_PER_POINT = 160
#: partner down triangle of U(x, y) across edge type t: D(x + dx, y + dy)
PARTNER = ((0, 0), (0, -1), (-1, 0))
#: edge endpoints relative to (x, y): (from, to)
EDGE_ENDS = (((1, 0), (0, 1)), ((0, 0), (1, 0)), ((0, 1), (0, 0)))


def shifted(a: np.ndarray, dx: int, dy: int) -> np.ndarray:
    """out[p, q] = a[p + dx, q + dy] (False / 0 outside the grid)."""
    out = np.zeros_like(a)
    nx, ny = a.shape
    xs = slice(max(0, -dx), min(nx, nx - dx))
    ys = slice(max(0, -dy), min(ny, ny - dy))
    xt = slice(max(0, dx), min(nx, nx + dx))
    yt = slice(max(0, dy), min(ny, ny + dy))
    out[xs, ys] = a[xt, yt]
    return out


@dataclass
class TriangleGrid:
    """The padded masks of a region's up and down triangles."""

    up: np.ndarray      # bool (NX, NY): U(ox + p, oy + q)
    down: np.ndarray    # bool (NX, NY): D(ox + p, oy + q)
    origin: Tuple[int, int]

    @classmethod
    def from_triangles(cls, triangles: np.ndarray) -> TriangleGrid:
        t = np.asarray(triangles, dtype=np.int64).reshape(-1, 3)
        lo = t[:, :2].min(axis=0) - MARGIN
        hi = t[:, :2].max(axis=0) + MARGIN + 1
        shape = tuple(int(v) for v in (hi - lo + 1))
        # every array of the region lives on this bounding-box grid: check it before any is made
        check_memory(GRID_BYTES_PER_POINT * shape[0] * shape[1],
                     f"the {shape[0]}x{shape[1]} grid around these triangles (their bounding box)")
        up = np.zeros(shape, bool)
        down = np.zeros(shape, bool)
        p, q = t[:, 0] - lo[0], t[:, 1] - lo[1]
        up[p[t[:, 2] == 0], q[t[:, 2] == 0]] = True
        down[p[t[:, 2] == 1], q[t[:, 2] == 1]] = True
        return cls(up, down, (int(lo[0]), int(lo[1])))

    def triangles(self) -> np.ndarray:
        """(k, 3) rows (x, y, s), sorted."""
        rows = []
        for s, mask in ((0, self.up), (1, self.down)):
            p, q = np.nonzero(mask)
            rows.append(np.stack([p + self.origin[0], q + self.origin[1], np.full_like(p, s)], axis=1))
        out = np.concatenate(rows)
        return out[np.lexsort((out[:, 2], out[:, 1], out[:, 0]))]

    # ----- vertices --------------------------------------------------------
    def incident(self) -> List[np.ndarray]:
        """The six triangles around each lattice point: U(i,j), U(i-1,j), U(i,j-1), D(i-1,j), D(i,j-1), D(i-1,j-1)."""
        u, d = self.up, self.down
        return [u, shifted(u, -1, 0), shifted(u, 0, -1), shifted(d, -1, 0), shifted(d, 0, -1), shifted(d, -1, -1)]

    def vertex_masks(self) -> Tuple[np.ndarray, np.ndarray]:
        """(in region, interior): a point is interior when all six triangles around it are in the region."""
        around = self.incident()
        return np.logical_or.reduce(around), np.logical_and.reduce(around)

    # ----- edges --------------------------------------------------------------
    def edge_masks(self) -> Tuple[List[np.ndarray], List[np.ndarray]]:
        """Per type t: (interior edges: both sides in the region, boundary edges: one side)."""
        inner, outer = [], []
        for dx, dy in PARTNER:
            partner = shifted(self.down, dx, dy)
            inner.append(self.up & partner)
            outer.append(self.up ^ partner)
        return inner, outer

    def edge_ends(self, t: int, mask: np.ndarray) -> Tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray]:
        """Grid indices (from_p, from_q, to_p, to_q) of the edges of type t selected by mask."""
        p, q = np.nonzero(mask)
        (fx, fy), (tx, ty) = EDGE_ENDS[t]
        return p + fx, q + fy, p + tx, q + ty

    # ----- flat ids for the shared height-walk helpers ------------------------
    def point_id(self, p: np.ndarray, q: np.ndarray) -> np.ndarray:
        return np.asarray(p) * self.up.shape[1] + np.asarray(q)

    def point_name(self, point: int) -> str:
        p, q = divmod(int(point), self.up.shape[1])
        return f"the lattice point ({p + self.origin[0]}, {q + self.origin[1]})"

    def point_residue(self, point: int) -> int:
        p, q = divmod(int(point), self.up.shape[1])
        return (p + self.origin[0] - q - self.origin[1]) % 3

    def boundary_order(self) -> np.ndarray:
        """Point ids, lowest plane point first (smallest j, then smallest i + j/2)."""
        p, q = np.meshgrid(np.arange(self.up.shape[0]), np.arange(self.up.shape[1]), indexing="ij")
        order = np.lexsort(((2 * p + q).ravel(), q.ravel()))
        return self.point_id(p.ravel()[order], q.ravel()[order])

    def refuse_holes(self) -> None:
        """Raise ValueError when triangles outside the region are enclosed by it (see frostline.height_walk)."""
        nx, ny = self.up.shape
        inner_all = [np.ones_like(self.up) for _ in PARTNER]
        a, b = [], []
        for t, (dx, dy) in enumerate(PARTNER):
            p, q = np.nonzero(inner_all[t])
            ok = (p + dx >= 0) & (p + dx < nx) & (q + dy >= 0) & (q + dy < ny)
            a.append(p[ok] * ny + q[ok])
            b.append(nx * ny + (p[ok] + dx) * ny + (q[ok] + dy))
        outside = ~np.concatenate([self.up.ravel(), self.down.ravel()])
        edge = np.zeros((nx, ny), bool)
        edge[0, :] = edge[-1, :] = edge[:, 0] = edge[:, -1] = True
        border = np.concatenate([np.flatnonzero(edge.ravel()), nx * ny + np.flatnonzero(edge.ravel())])
        ox, oy = self.origin

        def name(k: int) -> str:
            s, rest = divmod(k, nx * ny)
            p, q = divmod(rest, ny)
            return f"the {'down' if s else 'up'} triangle ({p + ox}, {q + oy})"

        refuse_holes(outside, np.concatenate(a), np.concatenate(b), border, name)
