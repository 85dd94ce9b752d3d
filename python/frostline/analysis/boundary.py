"""Frozen regions and their boundary, from a density grid (any plugin).

A bin is frozen when a single tile class fills at least ``1 - tolerance`` of
it; bins outside the region count as frozen, so the boundary traced is the
one between the liquid region and everything frozen around it. The boundary is
the level set max-fraction = 1 - tolerance/2, traced by marching squares and
joined into polylines.
"""
from __future__ import annotations

from typing import Callable, List, Tuple

import numpy as np

from ..toolkit.contours import join_segments
from .densities import DensityGrid


def _max_fraction(grid: DensityGrid) -> np.ndarray:
    f = np.nanmax(np.where(np.isnan(grid.fractions), -np.inf, grid.fractions), axis=0)
    return np.where(grid.counts > 0, f, 1.0)  # outside the region: frozen


def frozen_mask(grid: DensityGrid, tolerance: float = 0.1) -> np.ndarray:
    """Boolean (nx, ny): True where one class fills at least 1 - tolerance of the bin (or no tile lies there)."""
    return _max_fraction(grid) >= 1.0 - tolerance


def frozen_boundary(grid: DensityGrid, tolerance: float = 0.1, scale: float = 1.0,
                    keep: float = 0.1) -> List[np.ndarray]:
    """Polylines (each an (m, 2) array, plane coordinates divided by ``scale``) of the frozen boundary.

    Pieces shorter than ``keep`` times the longest one (islands of noise) are dropped.
    """
    field = _max_fraction(grid)
    level = 1.0 - tolerance / 2
    lines = join_segments(_marching_squares(grid.x, grid.y, field, level))
    if not lines:
        return []
    length = [float(np.hypot(*np.diff(line, axis=0).T).sum()) for line in lines]
    longest = max(length)
    return [line / scale for line, ell in zip(lines, length) if ell >= keep * longest]


def _marching_squares(x: np.ndarray, y: np.ndarray, f: np.ndarray, level: float) -> List[Tuple[tuple, tuple]]:
    segments = []
    nx, ny = f.shape

    def cross(p, q, fp, fq):
        t = (level - fp) / (fq - fp)
        return (p[0] + t * (q[0] - p[0]), p[1] + t * (q[1] - p[1]))

    for i in range(nx - 1):
        for j in range(ny - 1):
            corners = [(x[i], y[j]), (x[i + 1], y[j]), (x[i + 1], y[j + 1]), (x[i], y[j + 1])]
            values = [f[i, j], f[i + 1, j], f[i + 1, j + 1], f[i, j + 1]]
            points = []
            for k in range(4):
                a, b = values[k], values[(k + 1) % 4]
                if (a < level) != (b < level):
                    points.append(cross(corners[k], corners[(k + 1) % 4], a, b))
            if len(points) == 2:
                segments.append((points[0], points[1]))
            elif len(points) == 4:  # saddle: pair neighbouring crossings
                segments += [(points[0], points[1]), (points[2], points[3])]
    return segments


def _dilate(mask: np.ndarray, radius: float, dx: float, dy: float, outside: bool) -> np.ndarray:
    """Bins within ``radius`` (plane units) of a True bin; bins beyond the array count as ``outside``."""
    rx, ry = int(np.ceil(radius / dx)), int(np.ceil(radius / dy))
    padded = np.pad(mask, ((rx, rx), (ry, ry)), constant_values=outside)
    nx, ny = mask.shape
    out = np.zeros_like(mask)
    for i in range(-rx, rx + 1):
        for j in range(-ry, ry + 1):
            if (i * dx) ** 2 + (j * dy) ** 2 <= radius ** 2 + 1e-12:
                out |= padded[rx + i: rx + i + nx, ry + j: ry + j + ny]
    return out


def near_edge(grid: DensityGrid, distance: float, scale: float = 1.0) -> Callable[[np.ndarray], np.ndarray]:
    """A mask function for :func:`curve_distance`: points (divided by ``scale``) within
    ``distance`` (scaled units) of the region's edge.

    The region is the set of bins holding tiles, closed over gaps of one
    lattice unit (bins can be finer than the spacing of tile centres); the edge
    is everything else, including the ring just beyond the grid, so that sides
    of the region lying on the grid's bounding box (a hexagon's top and bottom,
    every side of a square) count as edge too. Distances are measured between
    bin centres, to within one bin.
    """
    dx = float(grid.x[1] - grid.x[0]) if len(grid.x) > 1 else 1.0
    dy = float(grid.y[1] - grid.y[0]) if len(grid.y) > 1 else 1.0
    tiles = np.pad(grid.counts > 0, 1, constant_values=False)
    region = ~_dilate(~_dilate(tiles, 1.0, dx, dy, False), 1.0, dx, dy, True)  # closing by one lattice unit
    near = _dilate(~region, distance * scale, dx, dy, True)
    nx, ny = near.shape
    x0, y0 = grid.x[0] - dx, grid.y[0] - dy  # centre of padded bin (0, 0)

    def mask(points: np.ndarray) -> np.ndarray:
        p = np.asarray(points, float) * scale
        i = np.rint((p[:, 0] - x0) / dx).astype(np.int64)
        j = np.rint((p[:, 1] - y0) / dy).astype(np.int64)
        inside = (i >= 0) & (j >= 0) & (i < nx) & (j < ny)
        out = np.ones(len(p), bool)
        out[inside] = near[i[inside], j[inside]]
        return out

    return mask
