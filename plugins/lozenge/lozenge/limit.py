"""Lozenge regions lowered to the variational problem of :mod:`frostline.variational`.

Cells are the region's unit triangles. Around the up triangle U(x, y) the
height rule (see :mod:`.general`) runs (x, y) -> (x+1, y) -> (x, y+1): the
edges crossed by lozenges of type 1, 0, 2; around the down triangle D(x, y)
it runs (x, y+1) -> (x+1, y+1) -> (x+1, y): the edges of type 1 of U(x, y+1),
type 2 of U(x+1, y) and type 0 of U(x, y). Step 3; each lozenge covers two
triangles, so the cell weight is 1/2. q ** volume is q ** (sum of heights / 3),
a linear term log(q) / 3 per lattice point.
"""
from __future__ import annotations

import math
from typing import Any, Dict, Tuple

import numpy as np

from frostline._limits import check_memory
from frostline.variational import CellProblem, LimitSetup

from .geometry import BYTES_PER_TRIANGLE, PARTNER
from .tiles import TILE_CLASSES, lozenge_centres, plane_points

#: corners of U(x, y) and D(x, y) relative to (x, y), in the order of the height rule
UP_CORNERS = ((0, 0), (1, 0), (0, 1))
DOWN_CORNERS = ((0, 1), (1, 1), (1, 0))
#: edge index, in the up triangle's and in the partner down triangle's order, of the edge a type-t lozenge crosses
UP_EDGE = (1, 0, 2)
DOWN_EDGE = (2, 0, 1)


def limit_setup(region: Any) -> LimitSetup:
    """The :class:`LimitSetup` of a :class:`~frostline.lozenge.LozengeRegion`."""
    g = region.grid
    node = region._node
    ox, oy = g.origin
    least, greatest = region.model.extremes()
    cells, kinds, where = [], [], []
    for kind, (mask, corners) in enumerate(((g.up, UP_CORNERS), (g.down, DOWN_CORNERS))):
        p, q = np.nonzero(mask)
        cells.append(np.stack([node[p + dx, q + dy] for dx, dy in corners], axis=1))
        kinds.append(np.full(len(p), kind))
        where.append(np.stack([p, q], axis=1))
    cell_nodes = np.concatenate(cells)
    if np.any(cell_nodes < 0):
        raise AssertionError("a triangle corner is not a node of the region")
    linear = None
    if region.q != 1.0:
        linear = np.full(len(least), math.log(region.q) / 3.0)
    problem = CellProblem(cell_nodes, 3, 0.5, least, greatest, linear)
    # node positions in the plane frame
    grid_points = np.argwhere(node >= 0)
    plane = np.empty((len(least), 2))
    plane[node[grid_points[:, 0], grid_points[:, 1]]] = plane_points(grid_points + np.array([ox, oy]))
    n_up = len(kinds[0])
    up_index = np.full(g.up.shape, -1, dtype=np.int64)
    up_index[where[0][:, 0], where[0][:, 1]] = np.arange(n_up)
    down_index = np.full(g.down.shape, -1, dtype=np.int64)
    down_index[where[1][:, 0], where[1][:, 1]] = n_up + np.arange(len(kinds[1]))

    def tile_densities(p: np.ndarray) -> Dict[str, Tuple[np.ndarray, np.ndarray, np.ndarray]]:
        out = {}
        for t, (dx, dy) in enumerate(PARTNER):
            up = where[0]
            partner = down_index[up[:, 0] + dx, up[:, 1] + dy]
            ok = partner >= 0
            ups = np.flatnonzero(ok)
            prob = 0.5 * (p[ups, UP_EDGE[t]] + p[partner[ok], DOWN_EDGE[t]])
            tiles = np.stack([up[ok, 0] + ox, up[ok, 1] + oy, np.full(ok.sum(), t)], axis=1)
            out[TILE_CLASSES[t]] = (lozenge_centres(tiles), np.clip(prob, 0.0, 1.0), tiles)
        return out

    def to_heights(h: np.ndarray) -> np.ndarray:
        full = np.full(g.up.shape, np.nan)
        mask = node >= 0
        full[mask] = h[node[mask]]
        return np.where(region.vertex_mask, full[region._crop], np.nan)

    return LimitSetup(problem, plane, cell_nodes, region.scale, to_heights, tile_densities)


def refined_triangles(triangles: np.ndarray, m: int) -> Tuple[np.ndarray, np.ndarray]:
    """The region scaled m times as unit triangles (x, y, s), and the row of ``triangles`` each lies in.

    U(x, y) becomes U(mx + i, my + j) for i + j <= m - 1 and D(mx + i, my + j)
    for i + j <= m - 2; D(x, y) becomes U(mx + i, my + j) for i, j < m with
    i + j >= m and D(mx + i, my + j) for i, j < m with i + j >= m - 1.
    """
    grid_i, grid_j = np.meshgrid(np.arange(m), np.arange(m), indexing="ij")
    i, j = grid_i.ravel(), grid_j.ravel()
    pieces = {0: [(0, i + j <= m - 1), (1, i + j <= m - 2)], 1: [(0, i + j >= m), (1, i + j >= m - 1)]}
    rows, parents = [], []
    tri = np.asarray(triangles, dtype=np.int64)
    for s in (0, 1):
        sel = np.flatnonzero(tri[:, 2] == s)
        for kind, keep in pieces[s]:
            di, dj = i[keep], j[keep]
            x = (m * tri[sel, 0])[:, None] + di[None]
            y = (m * tri[sel, 1])[:, None] + dj[None]
            rows.append(np.stack([x.ravel(), y.ravel(), np.full(x.size, kind)], axis=1))
            parents.append(np.repeat(sel, len(di)))
    return np.concatenate(rows), np.concatenate(parents)


def refined_setup(region: Any, m: int) -> LimitSetup:
    """The setup of ``region`` solved on its triangles refined m times (q ** (1/m) per refined cube).

    Scaling a lozenge region by m scales its boundary heights by m exactly
    (boundary edges are never crossed), and q = exp(-gamma / n) at size n is
    exp(-gamma / (m n)) at size m n, so the refined problem is the same
    continuum problem on a finer mesh: heights come back divided by m, log Z
    by m^2, tile densities as the mean over the refined cells in each cell.
    """
    # the refined triangles, then a region of them: check before either is made
    check_memory((BYTES_PER_TRIANGLE + 64) * len(region.triangles) * m * m + 10**6,
                 f"the {len(region.triangles)} triangles of this region refined {m} x {m} times")
    coarse = limit_setup(region)
    triangles, parent = refined_triangles(region.triangles, m)
    fine_region = type(region)(triangles, q=region.q ** (1.0 / m), description={"shape": "refined"})
    fine = limit_setup(fine_region)
    g, fg = region.grid, fine_region.grid
    # the coarse cell of every fine cell, in the order limit_setup lists cells (up triangles, then down)
    cell_of = {}
    g_up, g_down = np.argwhere(g.up), np.argwhere(g.down)
    for k, (p, q) in enumerate(np.concatenate([g_up, g_down])):
        s = 0 if k < len(g_up) else 1
        cell_of[(int(p + g.origin[0]), int(q + g.origin[1]), s)] = k
    row_cell = np.array([cell_of[(int(x), int(y), int(s))] for x, y, s in region.triangles])
    fine_key = {(int(x), int(y), int(s)): int(row_cell[par]) for (x, y, s), par in zip(triangles, parent)}
    f_up, f_down = np.argwhere(fg.up), np.argwhere(fg.down)
    fine_parent = np.array(
        [fine_key[(int(p + fg.origin[0]), int(q + fg.origin[1]), 0)] for p, q in f_up]
        + [fine_key[(int(p + fg.origin[0]), int(q + fg.origin[1]), 1)] for p, q in f_down], dtype=np.int64)
    n_up_fine = len(f_up)
    n_cells = len(coarse.problem.cells)
    n_up = len(g_up)
    counts = np.bincount(fine_parent, minlength=n_cells).astype(float)

    def tile_densities(p: np.ndarray) -> Dict[str, Tuple[np.ndarray, np.ndarray, np.ndarray]]:
        coarse_p = np.zeros((n_cells, 3))
        for t in range(3):
            fine_t = np.concatenate([p[:n_up_fine, UP_EDGE[t]], p[n_up_fine:, DOWN_EDGE[t]]])
            mean = np.bincount(fine_parent, weights=fine_t, minlength=n_cells) / counts
            coarse_p[:n_up, UP_EDGE[t]] = mean[:n_up]
            coarse_p[n_up:, DOWN_EDGE[t]] = mean[n_up:]
        return coarse.tile_densities(coarse_p)

    i0, j0 = region.origin
    f0, g0 = fine_region.origin
    pi, pj = np.nonzero(region.vertex_mask)
    fine_rows, fine_cols = m * (pi + i0) - f0, m * (pj + j0) - g0

    def to_heights(h: np.ndarray) -> np.ndarray:
        fine_heights = fine.to_heights(h)
        out = np.full(region.vertex_mask.shape, np.nan)
        out[pi, pj] = fine_heights[fine_rows, fine_cols] / m
        # the two boundary walks may start from different base heights: align on the fixed points
        least = coarse.to_heights(coarse.problem.least)
        fixed = coarse.to_heights(coarse.problem.fixed.astype(float)) == 1.0
        shift = np.nanmedian((least - out)[fixed]) if fixed.any() else 0.0
        return out + shift

    return LimitSetup(fine.problem, fine.plane / m, fine.mesh, region.scale, to_heights, tile_densities,
                      value_scale=1.0 / m ** 2)
