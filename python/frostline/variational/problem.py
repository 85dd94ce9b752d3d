"""The discrete variational problem that every lattice plugin lowers to.

A plugin describes its region as cells (unit triangles for lozenges, unit
squares for dominoes), each a polygon of k height nodes listed in the order of
its height rule: along the edge from node j to node j+1 the height rises by 1
when no tile crosses it and falls by ``step - 1`` when one does, and exactly
one edge of each cell is crossed. So the chance that the tile covering the
cell crosses edge j is affine in the heights,

    p_j = (1 - (h[j+1] - h[j])) / step,      sum_j p_j = 1,

and the entropy per cell is ``cell_weight * sum_j L(pi p_j) / pi``
(docs/limit_shapes.md). The discrete functional

    F(h) = cell_weight * sum_cells sum_j L(pi p_j) / pi + linear . (h - least) + constant

is concave in h; its maximiser over fractional height functions with the
boundary fixed is the predicted mean height function and its maximum the
continuum estimate of log Z. Nothing here knows a lattice.
"""
from __future__ import annotations

from dataclasses import dataclass
from typing import Optional

import numpy as np


@dataclass
class CellProblem:
    """Cells, height rule and extreme height functions of one region (see the module docstring)."""

    cells: np.ndarray              # (C, k) int64 node ids, in the order of the height rule
    step: int                      # a crossed edge changes the height by 1 - step
    cell_weight: float             # entropy weight of one cell (1/2: every tile covers two cells)
    least: np.ndarray              # (N,) the least height function (Thurston), float
    greatest: np.ndarray           # (N,) the greatest height function
    linear: Optional[np.ndarray] = None   # (N,) weight per unit height (log q / 3 for q ** volume), or None

    def __post_init__(self) -> None:
        self.cells = np.ascontiguousarray(self.cells, dtype=np.int64)
        self.least = np.asarray(self.least, dtype=float)
        self.greatest = np.asarray(self.greatest, dtype=float)
        if self.cells.ndim != 2 or self.cells.shape[1] < 3:
            raise ValueError("cells must be a (C, k) array of node ids with k >= 3")
        if self.least.shape != self.greatest.shape or np.any(self.least > self.greatest):
            raise ValueError("least and greatest must be height functions with least <= greatest")

    @property
    def n_nodes(self) -> int:
        return len(self.least)

    @property
    def fixed(self) -> np.ndarray:
        """Nodes whose height is the same in every configuration (the boundary and forced parts)."""
        return self.least == self.greatest

    def edges(self) -> tuple:
        """(tail, head) node ids of every cell edge, shape (C, k) each."""
        return self.cells, np.roll(self.cells, -1, axis=1)

    def densities(self, h: np.ndarray) -> tuple:
        """(p, 1 - p) per cell edge for node heights h, each computed directly (no cancellation)."""
        tail, head = self.edges()
        rise = h[head] - h[tail]
        return (1.0 - rise) / self.step, (self.step - 1.0 + rise) / self.step
