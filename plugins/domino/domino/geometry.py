"""The square grid: cells, corners, edges and Thurston's height orientation.

Cell (r, c) of a mask has row 0 at the top and is black when r + c is even.
Corner (r, c) is the top-left corner of cell (r, c); corners form an
(R + 1) x (C + 1) grid with id r * (C + 1) + c.

Edges are oriented with a black cell on their left (in the plane picture with
x = c to the right and y = -r up): the horizontal edge (r, c) - (r, c+1) runs
rightwards when r + c is odd, the vertical edge (r, c) - (r+1, c) runs
downwards when r + c is even. Along an oriented edge the height rises by 1
when no domino crosses it and falls by 3 when one does, so heights are
congruent to RESIDUE[r % 2][c % 2] modulo 4.

A crossed horizontal edge (r, c) - (r, c+1) lies inside the vertical domino on
cells (r-1, c), (r, c); a crossed vertical edge (r, c) - (r+1, c) inside the
horizontal domino on cells (r, c-1), (r, c).
"""
from __future__ import annotations

from dataclasses import dataclass
from typing import Tuple

import numpy as np

RESIDUE = np.array([[0, 3], [1, 2]])


@dataclass
class Edges:
    """One family of edges (horizontal or vertical) as flat arrays."""

    tail: np.ndarray      # corner ids
    head: np.ndarray
    inner: np.ndarray     # both cells in the region
    outer: np.ndarray     # exactly one cell in the region
    cells: Tuple[np.ndarray, np.ndarray]   # (first, second) cell ids on the two sides (-1 outside the grid)
    position: Tuple[np.ndarray, np.ndarray]  # (r, c) of the edge's first corner


class SquareGeometry:
    """Corners and oriented edges of a mask of cells."""

    def __init__(self, mask: np.ndarray) -> None:
        self.mask = mask
        R, C = mask.shape
        self.shape = (R, C)
        pad = np.zeros((R + 2, C + 2), bool)
        pad[1:-1, 1:-1] = mask
        around = [pad[:-1, :-1], pad[:-1, 1:], pad[1:, :-1], pad[1:, 1:]]
        self.corner_in = np.logical_or.reduce(around)          # (R+1, C+1)
        self.corner_interior = np.logical_and.reduce(around)
        width = C + 1
        cell_id = np.full((R + 2, C + 2), -1, dtype=np.int64)
        cell_id[1:-1, 1:-1] = np.arange(R * C).reshape(R, C)

        # horizontal edges (r, c)-(r, c+1): r in 0..R, c in 0..C-1; cells above (r-1, c) and below (r, c)
        r, c = np.meshgrid(np.arange(R + 1), np.arange(C), indexing="ij")
        above, below = pad[:-1, 1:-1], pad[1:, 1:-1]
        rightwards = (r + c) % 2 == 1
        left_end, right_end = r * width + c, r * width + c + 1
        self.horizontal = Edges(
            tail=np.where(rightwards, left_end, right_end).ravel(),
            head=np.where(rightwards, right_end, left_end).ravel(),
            inner=(above & below).ravel(), outer=(above ^ below).ravel(),
            cells=(cell_id[:-1, 1:-1].ravel(), cell_id[1:, 1:-1].ravel()),
            position=(r.ravel(), c.ravel()),
        )
        # vertical edges (r, c)-(r+1, c): r in 0..R-1, c in 0..C; cells left (r, c-1) and right (r, c)
        r, c = np.meshgrid(np.arange(R), np.arange(C + 1), indexing="ij")
        left, right = pad[1:-1, :-1], pad[1:-1, 1:]
        downwards = (r + c) % 2 == 0
        top_end, bottom_end = r * width + c, (r + 1) * width + c
        self.vertical = Edges(
            tail=np.where(downwards, top_end, bottom_end).ravel(),
            head=np.where(downwards, bottom_end, top_end).ravel(),
            inner=(left & right).ravel(), outer=(left ^ right).ravel(),
            cells=(cell_id[1:-1, :-1].ravel(), cell_id[1:-1, 1:].ravel()),
            position=(r.ravel(), c.ravel()),
        )

    def corner_name(self, corner: int) -> str:
        r, c = divmod(int(corner), self.shape[1] + 1)
        return f"corner ({r}, {c})"

    def residues(self, corners: np.ndarray) -> np.ndarray:
        """Residue modulo 4 of each corner id (vectorised :meth:`residue`)."""
        r, c = np.divmod(np.asarray(corners, dtype=np.int64), self.shape[1] + 1)
        return RESIDUE[r % 2, c % 2]

    def residue(self, corner: int) -> int:
        r, c = divmod(int(corner), self.shape[1] + 1)
        return int(RESIDUE[r % 2, c % 2])
