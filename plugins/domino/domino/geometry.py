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
from functools import cached_property
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
    """Corners and oriented edges of a mask of cells.

    The full edge families (:attr:`horizontal`, :attr:`vertical`: several
    int64 arrays over the whole grid) are built on first use only, so named
    shapes that never need them (domino shuffling of a large Aztec diamond)
    do not pay for them.
    """

    def __init__(self, mask: np.ndarray) -> None:
        self.mask = mask
        R, C = mask.shape
        self.shape = (R, C)
        pad = np.zeros((R + 2, C + 2), bool)
        pad[1:-1, 1:-1] = mask
        self._pad = pad
        around = [pad[:-1, :-1], pad[:-1, 1:], pad[1:, :-1], pad[1:, 1:]]
        self.corner_in = np.logical_or.reduce(around)          # (R+1, C+1)
        self.corner_interior = np.logical_and.reduce(around)

    @cached_property
    def _cell_id(self) -> np.ndarray:
        R, C = self.shape
        cell_id = np.full((R + 2, C + 2), -1, dtype=np.int64)
        cell_id[1:-1, 1:-1] = np.arange(R * C).reshape(R, C)
        return cell_id

    @cached_property
    def horizontal(self) -> Edges:
        """Horizontal edges (r, c)-(r, c+1): r in 0..R, c in 0..C-1; cells above (r-1, c) and below (r, c)."""
        R, C = self.shape
        width = C + 1
        pad, cell_id = self._pad, self._cell_id
        r, c = np.meshgrid(np.arange(R + 1), np.arange(C), indexing="ij")
        above, below = pad[:-1, 1:-1], pad[1:, 1:-1]
        rightwards = (r + c) % 2 == 1
        left_end, right_end = r * width + c, r * width + c + 1
        return Edges(
            tail=np.where(rightwards, left_end, right_end).ravel(),
            head=np.where(rightwards, right_end, left_end).ravel(),
            inner=(above & below).ravel(), outer=(above ^ below).ravel(),
            cells=(cell_id[:-1, 1:-1].ravel(), cell_id[1:, 1:-1].ravel()),
            position=(r.ravel(), c.ravel()),
        )

    @cached_property
    def vertical(self) -> Edges:
        """Vertical edges (r, c)-(r+1, c): r in 0..R-1, c in 0..C; cells left (r, c-1) and right (r, c)."""
        R, C = self.shape
        width = C + 1
        pad, cell_id = self._pad, self._cell_id
        r, c = np.meshgrid(np.arange(R), np.arange(C + 1), indexing="ij")
        left, right = pad[1:-1, :-1], pad[1:-1, 1:]
        downwards = (r + c) % 2 == 0
        top_end, bottom_end = r * width + c, (r + 1) * width + c
        return Edges(
            tail=np.where(downwards, top_end, bottom_end).ravel(),
            head=np.where(downwards, bottom_end, top_end).ravel(),
            inner=(left & right).ravel(), outer=(left ^ right).ravel(),
            cells=(cell_id[1:-1, :-1].ravel(), cell_id[1:-1, 1:].ravel()),
            position=(r.ravel(), c.ravel()),
        )

    def outer_edges(self) -> Tuple[np.ndarray, np.ndarray]:
        """(tails, heads) of the boundary edges (exactly one side in the region), horizontal ones first.

        The same edges, orientation and order as the ``outer`` rows of the two
        families, found without building them (the boundary is short).
        """
        R, C = self.shape
        width = C + 1
        pad = self._pad
        r, c = np.nonzero(pad[:-1, 1:-1] ^ pad[1:, 1:-1])          # horizontal (r, c)-(r, c+1)
        rightwards = (r + c) % 2 == 1
        h_tail = np.where(rightwards, r * width + c, r * width + c + 1)
        h_head = np.where(rightwards, r * width + c + 1, r * width + c)
        r, c = np.nonzero(pad[1:-1, :-1] ^ pad[1:-1, 1:])          # vertical (r, c)-(r+1, c)
        downwards = (r + c) % 2 == 0
        v_tail = np.where(downwards, r * width + c, (r + 1) * width + c)
        v_head = np.where(downwards, (r + 1) * width + c, r * width + c)
        return (np.concatenate([h_tail, v_tail]).astype(np.int64), np.concatenate([h_head, v_head]).astype(np.int64))

    def expected_step_down(self, crossed_probability: np.ndarray) -> np.ndarray:
        """E[h(r + 1, c) - h(r, c)] along every vertical edge, given the chance that a domino crosses it."""
        R, C = self.shape
        rise = 1.0 - 4.0 * np.asarray(crossed_probability, dtype=float)
        row_odd = (np.arange(R) % 2).astype(bool)[:, None]
        column_odd = (np.arange(C + 1) % 2).astype(bool)[None, :]
        return np.where(row_odd == column_odd, rise, -rise)

    def step_down(self, crossed_vertical: np.ndarray) -> np.ndarray:
        """h(r + 1, c) - h(r, c) along every vertical edge, shape (R, C + 1).

        +1 or -3 along the edge's orientation (downwards when r + c is even),
        -3 when a horizontal domino crosses it (``crossed_vertical`` True).
        """
        R, C = self.shape
        rise = 1 - 4 * np.asarray(crossed_vertical, dtype=np.int8)        # int8 arrays: this runs on millions
        row_odd = (np.arange(R) % 2).astype(bool)[:, None]
        column_odd = (np.arange(C + 1) % 2).astype(bool)[None, :]
        return np.where(row_odd == column_odd, rise, -rise)

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


def aztec_mask(n: int) -> np.ndarray:
    """The 2n x 2n mask of cells whose centres (c - n + 1/2, n - r - 1/2) satisfy abs(x) + abs(y) <= n."""
    r = np.arange(2 * n)  # rows and columns share the range: broadcast instead of two full grids
    return np.abs(r - n + 0.5)[None, :] + np.abs(n - r - 0.5)[:, None] <= n
