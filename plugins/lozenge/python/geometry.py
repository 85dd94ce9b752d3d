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

from collections import deque
from dataclasses import dataclass
from typing import Dict, List, Tuple

import numpy as np

MARGIN = 2
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
    def from_triangles(cls, triangles: np.ndarray) -> "TriangleGrid":
        t = np.asarray(triangles, dtype=np.int64).reshape(-1, 3)
        lo = t[:, :2].min(axis=0) - MARGIN
        hi = t[:, :2].max(axis=0) + MARGIN + 1
        shape = tuple(int(v) for v in (hi - lo + 1))
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

    # ----- pieces and the boundary -------------------------------------------
    def pieces(self) -> Tuple[np.ndarray, int]:
        """Label each triangle with its edge-connected piece: (labels of up, labels of down), count.

        Returns an int array of shape (2, NX, NY) (-1 outside) and the number of pieces.
        """
        labels = np.full((2,) + self.up.shape, -1, dtype=np.int64)
        count = 0
        for s, mask in ((0, self.up), (1, self.down)):
            for p, q in zip(*np.nonzero(mask)):
                if labels[s, p, q] >= 0:
                    continue
                labels[s, p, q] = count
                queue = deque([(s, p, q)])
                while queue:
                    cs, cp, cq = queue.popleft()
                    for ns, np_, nq in _neighbours(cs, cp, cq):
                        m = self.up if ns == 0 else self.down
                        if 0 <= np_ < m.shape[0] and 0 <= nq < m.shape[1] and m[np_, nq] and labels[ns, np_, nq] < 0:
                            labels[ns, np_, nq] = count
                            queue.append((ns, np_, nq))
                count += 1
        return labels, count


def _neighbours(s: int, p: int, q: int):
    """Triangles sharing an edge with U(p, q) (s = 0) or D(p, q) (s = 1)."""
    if s == 0:
        return [(1, p + dx, q + dy) for dx, dy in PARTNER]
    return [(0, p - dx, q - dy) for dx, dy in PARTNER]


def walk_boundary(grid: TriangleGrid) -> Tuple[Dict[Tuple[int, int], int], List[List[Tuple[int, int]]]]:
    """Heights on the boundary points, and the boundary's connected components.

    Boundary edges are never crossed, so the height rises by 1 along each of
    them in its direction. Each component starts at its lowest point (in the
    plane) with height (i - j) mod 3, the residue every height keeps.

    Raises ValueError naming the point where two walks disagree (the piece has
    unequal numbers of up and down triangles, or its boundary is not one curve).
    """
    _, outer = grid.edge_masks()
    adjacency: Dict[Tuple[int, int], List[Tuple[Tuple[int, int], int]]] = {}
    for t in range(3):
        fp, fq, tp, tq = grid.edge_ends(t, outer[t])
        for a, b, c, d in zip(fp.tolist(), fq.tolist(), tp.tolist(), tq.tolist()):
            adjacency.setdefault((a, b), []).append(((c, d), 1))
            adjacency.setdefault((c, d), []).append(((a, b), -1))
    ox, oy = grid.origin
    heights: Dict[Tuple[int, int], int] = {}
    components: List[List[Tuple[int, int]]] = []
    # lowest plane point first: smallest j, then smallest i + j/2
    for start in sorted(adjacency, key=lambda v: (v[1], 2 * v[0] + v[1])):
        if start in heights:
            continue
        i0, j0 = start[0] + ox, start[1] + oy
        heights[start] = (i0 - j0) % 3
        members = [start]
        queue = deque([start])
        while queue:
            v = queue.popleft()
            for w, delta in adjacency[v]:
                value = heights[v] + delta
                if w not in heights:
                    heights[w] = value
                    members.append(w)
                    queue.append(w)
                elif heights[w] != value:
                    raise ValueError(
                        f"the boundary cannot carry a height function: walking it reaches the lattice point "
                        f"({w[0] + ox}, {w[1] + oy}) with heights {heights[w]} and {value}; a piece of the region "
                        "has unequal numbers of up and down triangles, so it cannot be tiled"
                    )
        components.append(members)
    return heights, components
