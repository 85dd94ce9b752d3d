"""Cube columns: a lozenge tiling as a grid of column heights (docs/column_form.md).

A lozenge tiling of a simply connected region is a piece of a stepped surface,
the boundary of an order ideal I of Z^3 (Thurston 1990). With the projection
of :mod:`.tiles` (cube (X, Y, Z) drawn at lattice point (X - Z, Y + Z)) the
cubes over lattice point (x, y) are (x + z, y - 1 - z, z); the ideal holds
those with z <= T(x, y), where

    T(x, y) = (H(x, y) - (x - y)) / 3

and H is the lattice-point height of :mod:`.general`. Read by columns, I holds
(k, l, z) for z < h(k, l), with h not increasing in k and not decreasing in l.
The top of column (k, l) is the type 0 lozenge (k - h, l + h): a crossed type 0
edge of U(x, y) is the top of column (x + z, y - z) at height z = T(x + 1, y) + 1.

This holds for every tiling exactly when the region's boundary heights extend
to a height function of the whole plane (then the outside is shared by all
tilings and Thurston's least and greatest tilings are the least and greatest
ideals). `column_form` checks that condition (a Thurston problem on the
bounding box with the region's boundary pinned), and then the tilings are in
bijection with the column grids between the least and greatest grids that do
not increase along rows or columns: the plane-partition box with a floor and a
cap per cell. Grid cell (r, s) is column (k0 + r, l0 - s), so heights do not
increase along r or s (the box kernel's convention), stored minus `shift`
(the least free floor is 0). Cells whose floor equals their cap never move;
they hold a value that never binds a free neighbour (the greatest cap below
and to the right of them, or 0).
"""
from __future__ import annotations

from dataclasses import dataclass
from typing import Optional, Tuple

import numpy as np

from frostline._limits import check_memory
from frostline.errors import RegionTooLargeError
from frostline.model import HeightModel

#: grid memory of the column form per cell (four int32 grids, masks and the kernel's split copies)
BYTES_PER_COLUMN = 64
#: peak memory of the extension check per point of the region's padded grid
EXTENSION_BYTES_PER_POINT = 600
#: regions whose bounding grid has more points than this many times their triangles skip the column form
SPARSE_GRID_FACTOR = 8


@dataclass
class ColumnForm:
    """The cube-column grid of a region (see the module docstring)."""

    least: np.ndarray       # int32 (rows, columns): Thurston's least tiling, minus shift
    greatest: np.ndarray    # int32 (rows, columns)
    free: np.ndarray        # bool (rows, columns): floor < cap
    runs: np.ndarray        # int32 (k, 3): (row, first column, last column) of free cells, row-major
    k0: int
    l0: int
    shift: int
    fixed_tops: np.ndarray  # bool, on the region's triangle grid: type 0 lozenges of every tiling outside free columns
    boundary: np.ndarray    # int64, on the region's grid: the boundary heights at boundary points, 0 elsewhere

    @property
    def n_sites(self) -> int:
        return int(self.free.sum())


def column_form(region) -> Tuple[Optional[ColumnForm], str]:
    """(form, "") for a region whose tilings are cube-column grids, else (None, the reason).

    A form that would not fit in memory is no form: the other kernels may still run."""
    try:
        return _column_form(region)
    except RegionTooLargeError as exc:
        return None, f"its column form does not fit in memory ({exc})"


def _column_form(region) -> Tuple[Optional[ColumnForm], str]:
    g = region.grid
    if g.up.size > SPARSE_GRID_FACTOR * max(len(region.triangles), 1) + 10**5:
        return None, (f"its bounding grid ({g.up.shape[0]}x{g.up.shape[1]} points) is more than "
                      f"{SPARSE_GRID_FACTOR} times its {len(region.triangles)} triangles (pieces far apart?), so the "
                      "check that its tilings are stacks of cubes would cost more than it saves")
    least_nodes, greatest_nodes = region.model.extremes()
    least = region._grid_heights(least_nodes).astype(np.int64)
    greatest = region._grid_heights(greatest_nodes).astype(np.int64)
    if not _boundary_extends(region, least):
        return None, ("its boundary heights do not extend to the whole plane (two parts of the boundary come "
                      "closer in the plane than their heights allow), so its tilings are not all stepped surfaces "
                      "over one grid of cube columns")
    k_lo, l_lo, z_lo, _ = tops(region, least)
    k_hi, l_hi, z_hi, _ = tops(region, greatest)
    order_lo, order_hi = np.lexsort((l_lo, k_lo)), np.lexsort((l_hi, k_hi))
    k_lo, l_lo, z_lo = k_lo[order_lo], l_lo[order_lo], z_lo[order_lo]
    k_hi, l_hi, z_hi = k_hi[order_hi], l_hi[order_hi], z_hi[order_hi]
    if not (np.array_equal(k_lo, k_hi) and np.array_equal(l_lo, l_hi)):
        return None, "the least and greatest tilings put cube tops on different columns"
    key = k_lo * (1 << 32) + l_lo
    if len(key) > 1 and np.any(np.diff(key) == 0):
        return None, "a cube column has two tops inside the region"
    if np.any(z_lo > z_hi):
        return None, "the least tiling lies above the greatest on some column"
    moving = z_lo < z_hi
    if not moving.any():
        return None, "the region has one tiling"
    k, l, floor, cap = k_lo[moving], l_lo[moving], z_lo[moving], z_hi[moving]
    k0, l0, shift = int(k.min()) - 1, int(l.max()) + 1, int(floor.min())
    rows, columns = int(k.max()) - k0 + 2, l0 - int(l.min()) + 2
    check_memory(BYTES_PER_COLUMN * rows * columns, f"the {rows}x{columns} grid of cube columns")
    r, s = k - k0, l0 - l
    free = np.zeros((rows, columns), bool)
    free[r, s] = True
    cap_grid = np.zeros((rows, columns), np.int64)
    cap_grid[r, s] = cap - shift
    # a fixed cell holds the greatest cap below and to the right of it (0 if none): never binding
    fill = np.maximum.accumulate(np.maximum.accumulate(cap_grid[::-1, ::-1], axis=0), axis=1)[::-1, ::-1]
    low, high = fill.copy(), fill.copy()
    low[r, s], high[r, s] = floor - shift, cap - shift
    for grid in (low, high):
        if np.any(np.diff(grid, axis=0) > 0) or np.any(np.diff(grid, axis=1) > 0):
            return None, "the extreme column grids are not monotone (an unexpected boundary)"
    fixed_tops = np.zeros(g.up.shape, bool)
    _, _, _, (p, q) = tops(region, least)
    fixed = np.ones(len(p), bool)
    fixed[order_lo[moving]] = False
    fixed_tops[p[fixed], q[fixed]] = True
    boundary = np.zeros(g.up.shape, np.int64)
    boundary.ravel()[region._boundary_points] = least.ravel()[region._boundary_points]
    form = ColumnForm(low.astype(np.int32), high.astype(np.int32), free, _runs(free), k0, l0, shift, fixed_tops,
                      boundary)
    for nodes, grid in ((least_nodes, form.least), (greatest_nodes, form.greatest)):
        if not np.array_equal(heights_from_columns(region, form, grid), region.heights_from_model(nodes)):
            return None, "the column grid does not give back the extreme tilings (an unexpected boundary)"
    return form, ""


def tops(region, full: np.ndarray):
    """Type 0 lozenges of the tiling with lattice heights ``full`` (the region's padded grid) as cube tops:
    (k, l, z, (p, q)): column (k, l), height z, lozenge at grid index (p, q)."""
    g = region.grid
    ox, oy = g.origin
    inner0 = region._inner[0]
    nx, ny = inner0.shape
    crossed = np.zeros_like(inner0)
    crossed[:-1, :-1] = inner0[:-1, :-1] & (full[:-1, 1:] - full[1:, :-1] == -2)
    p, q = np.nonzero(crossed)
    x, y = p + ox, q + oy
    rise = full[p + 1, q] - (x + 1 - y)
    if np.any(rise % 3):
        raise AssertionError("lattice heights off their residue class")
    z = rise // 3 + 1
    return x + z, y - z, z, (p, q)


def heights_from_columns(region, form: ColumnForm, grid: np.ndarray) -> np.ndarray:
    """``Sample.heights`` of the tiling whose column grid is ``grid`` (the form's layout)."""
    g = region.grid
    ox, oy = g.origin
    r, s = np.nonzero(form.free)
    z = grid[r, s].astype(np.int64) + form.shift
    crossed = form.fixed_tops.copy()
    crossed[form.k0 + r - z - ox, form.l0 - s + z - oy] = True
    full = form.boundary.copy()
    interior = (region._node >= 0) & (region._node < region.model.n_sites)
    inner0 = region._inner[0]
    # along the direction (-1, 1) the height rises by 1, or falls by 2 across a type 0 lozenge:
    # point (p, q) follows (p + 1, q - 1) across the edge of U(p, q - 1)
    for col in range(1, full.shape[1]):
        step = inner0[:-1, col - 1] & interior[:-1, col]
        full[:-1, col][step] = (full[1:, col - 1] + 1 - 3 * crossed[:-1, col - 1])[step]
    return np.where(region.vertex_mask, full[region._crop], 0).astype(np.int32)


def columns_from_heights(region, form: ColumnForm, heights: np.ndarray) -> np.ndarray:
    """The column grid of the tiling with ``Sample.heights`` ``heights`` (checked by the caller)."""
    full = np.zeros(region.grid.up.shape, np.int64)
    full[region._crop] = heights
    k, l, z, _ = tops(region, full)
    grid = form.least.copy()
    r, s = k - form.k0, form.l0 - l
    inside = (r >= 0) & (r < grid.shape[0]) & (s >= 0) & (s < grid.shape[1])
    take = inside.copy()
    take[inside] = form.free[r[inside], s[inside]]
    grid[r[take], s[take]] = z[take] - form.shift
    return grid


def lower_columns(form: ColumnForm) -> HeightModel:
    """The generic model of the column chain: the reference the column kernel must match bit for bit.

    Sites are the free cells in row-major order, colour class (r + s) % 2; the
    fixed cells beside them are boundary nodes, and one more boundary node at 0
    carries each site's floor and cap (h[site] - 0 <= cap, 0 - h[site] <= -floor).
    """
    rows, columns = form.free.shape
    check_memory(400 * form.n_sites + 10**6, f"the generic model of {form.n_sites} cube columns")
    r, s = np.nonzero(form.free)
    n = len(r)
    node = np.full((rows, columns), -1, np.int64)
    node[r, s] = np.arange(n)
    near = np.zeros_like(form.free)
    for dr, ds in ((-1, 0), (1, 0), (0, -1), (0, 1)):
        near[r + dr, s + ds] = True
    near &= ~form.free
    fr, fs = np.nonzero(near)
    node[fr, fs] = n + np.arange(len(fr))
    zero = n + len(fr)
    site = np.arange(n)
    rows_out = []
    for dr, ds in ((-1, 0), (0, -1)):      # h[site] <= h[above] and h[site] <= h[left]
        other = node[r + dr, s + ds]
        rows_out.append(np.stack([other, site, np.zeros(n, np.int64)], axis=1))
    for dr, ds in ((1, 0), (0, 1)):        # h[below], h[right] <= h[site], where that cell is fixed
        fixed = ~form.free[r + dr, s + ds]
        rows_out.append(np.stack([site[fixed], node[r + dr, s + ds][fixed], np.zeros(int(fixed.sum()), np.int64)],
                                 axis=1))
    rows_out.append(np.stack([site, np.full(n, zero), -form.least[r, s].astype(np.int64)], axis=1))
    rows_out.append(np.stack([np.full(n, zero), site, form.greatest[r, s].astype(np.int64)], axis=1))
    boundary = np.concatenate([form.least[fr, fs], [0]])
    model = HeightModel(n, boundary, np.concatenate(rows_out), np.zeros(n), 1, (r + s) % 2)
    model.set_extremes(np.concatenate([form.least[r, s], boundary]), np.concatenate([form.greatest[r, s], boundary]))
    return model


def grid_from_model(form: ColumnForm, node_heights: np.ndarray) -> np.ndarray:
    """The column grid from the generic model's node heights."""
    grid = form.least.copy()
    r, s = np.nonzero(form.free)
    grid[r, s] = np.asarray(node_heights)[: len(r)]
    return grid


def _runs(free: np.ndarray) -> np.ndarray:
    """Maximal runs of free cells in each row, row-major."""
    padded = np.zeros((free.shape[0], free.shape[1] + 2), np.int8)
    padded[:, 1:-1] = free
    edges = np.diff(padded, axis=1)
    start_r, start_c = np.nonzero(edges == 1)
    end_r, end_c = np.nonzero(edges == -1)
    return np.stack([start_r, start_c, end_c - 1], axis=1).astype(np.int32).reshape(-1, 3)


def _boundary_extends(region, least: np.ndarray) -> bool:
    """Whether the boundary heights extend to a height function on the region's whole padded grid.

    The region's boundary points are pinned and every other point of the grid
    is free under the lozenge edge rules; Thurston's algorithm finds a solution
    exactly when one exists. Plane geodesics between boundary points use at
    most two step directions and can be kept within one point of the region's
    bounding box, which the grid's margin covers, so the grid decides the plane.
    """
    g = region.grid
    nx, ny = g.up.shape
    # the model's arrays, its arc lists and Dijkstra's heap of up to one entry per arc: measured 220-520
    # bytes per grid point (a hexagon; a zig-zag strip, mostly outside its bounding box; tests/test_memory_estimates.py)
    check_memory(EXTENSION_BYTES_PER_POINT * nx * ny + 10**6, f"the {nx}x{ny} extension check of the column form")
    pinned = np.zeros(nx * ny, bool)
    pinned[region._boundary_points] = True
    node = np.empty(nx * ny, np.int64)
    n_free = int((~pinned).sum())
    node[~pinned] = np.arange(n_free)
    node[pinned] = n_free + np.arange(int(pinned.sum()))
    node = node.reshape(nx, ny)
    rows = []
    for dx, dy in ((1, 0), (-1, 1), (0, -1)):  # the edge directions: h[v + d] - h[v] is 1 or -2
        a = node[max(0, -dx): nx - max(0, dx), max(0, -dy): ny - max(0, dy)].ravel()
        b = node[max(0, dx): nx - max(0, -dx), max(0, dy): ny - max(0, -dy)].ravel()
        rows.append(np.stack([a, b, np.ones_like(a)], axis=1))
        rows.append(np.stack([b, a, np.full_like(a, 2)], axis=1))
    p, q = np.divmod(np.flatnonzero(~pinned), ny)
    ox, oy = g.origin
    residues = (p + ox - q - oy) % 3
    values = least.ravel()[pinned]
    try:
        HeightModel(n_free, values, np.concatenate(rows), residues, 3, residues).extremes()
    except ValueError:
        return False
    return True
