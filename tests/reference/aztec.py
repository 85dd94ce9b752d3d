"""Brute-force domino tilings of small masks, written independently of frostline.

Conventions (frostline docs/design.md section 3): cell (r, c) of a boolean mask,
row 0 at the top; a domino is the pair of cells ((r1, c1), (r2, c2)) with the
first cell the top or left one. The Aztec diamond of order n is the 2n x 2n
mask of cells whose centres (c - n + 1/2, n - r - 1/2) satisfy |x| + |y| <= n
(Elkies, Kuperberg, Larsen, Propp, J. Algebraic Combin. 1, 1992).

Weights: ``horizontal[r, c]`` weighs the domino on (r, c), (r, c + 1);
``vertical[r, c]`` the domino on (r, c), (r + 1, c). A tiling weighs the
product of its dominoes' weights.
"""
from __future__ import annotations

from fractions import Fraction
from typing import Dict, Iterator, List, Optional, Tuple

import numpy as np

Domino = Tuple[Tuple[int, int], Tuple[int, int]]
Tiling = Tuple[Domino, ...]


def aztec_mask(n: int) -> np.ndarray:
    """The 2n x 2n boolean mask of the Aztec diamond of order n."""
    r = np.arange(2 * n)[:, None]
    c = np.arange(2 * n)[None, :]
    # |x| + |y| <= n with x = c - n + 1/2, y = n - r - 1/2, doubled to stay in integers.
    return np.abs(2 * c - 2 * n + 1) + np.abs(2 * n - 2 * r - 1) <= 2 * n


def tilings(mask: np.ndarray) -> Iterator[Tiling]:
    """Every domino tiling of the mask, each as a sorted tuple of dominoes.

    Backtracking: the first free cell in row-major order is covered either
    with its right neighbour or with the cell below it.
    """
    rows, cols = mask.shape
    free = [[bool(mask[r, c]) for c in range(cols)] for r in range(rows)]
    placed: List[Domino] = []

    def first_free(start: int) -> int:
        for k in range(start, rows * cols):
            if free[k // cols][k % cols]:
                return k
        return rows * cols

    def cover(start: int) -> Iterator[Tiling]:
        k = first_free(start)
        if k == rows * cols:
            yield tuple(sorted(placed))
            return
        r, c = divmod(k, cols)
        free[r][c] = False
        for r2, c2 in ((r, c + 1), (r + 1, c)):
            if r2 < rows and c2 < cols and free[r2][c2]:
                free[r2][c2] = False
                placed.append(((r, c), (r2, c2)))
                yield from cover(k + 1)
                placed.pop()
                free[r2][c2] = True
        free[r][c] = True

    yield from cover(0)


def tiling_weight(tiling: Tiling, horizontal: Optional[np.ndarray], vertical: Optional[np.ndarray],
                  exact: bool = False):
    """Product of the dominoes' weights (None: weight 1); exact: as a Fraction of the floats."""
    one = Fraction(1) if exact else 1.0
    w = one
    for (r1, c1), (r2, c2) in tiling:
        table = horizontal if r1 == r2 else vertical
        if table is not None:
            x = float(table[r1, c1])
            w *= Fraction(x) if exact else x
    return w


def aztec_law(n: int, horizontal: Optional[np.ndarray] = None,
              vertical: Optional[np.ndarray] = None) -> Dict[Tiling, float]:
    """Exact probabilities of every tiling of the order-n diamond under the weights."""
    weights = {t: tiling_weight(t, horizontal, vertical, exact=True) for t in tilings(aztec_mask(n))}
    total = sum(weights.values())
    return {t: float(w / total) for t, w in weights.items()}


def aztec_partition_function(n: int, horizontal: Optional[np.ndarray] = None,
                             vertical: Optional[np.ndarray] = None) -> Fraction:
    """Sum over all tilings of the product of weights, exactly (weights at their binary value)."""
    return sum((tiling_weight(t, horizontal, vertical, exact=True) for t in tilings(aztec_mask(n))),
               Fraction(0))


def two_periodic_weights(n: int, a: float, b: float) -> Tuple[np.ndarray, np.ndarray]:
    """Two-periodic weights as stated in frostline's docs/references.md section 2.

    Corner (r, c) is the top-left corner of cell (r, c). The middle segment of
    a domino (the edge between its two cells) has two end corners, exactly one
    with r + c even; the domino gets weight a if that corner's row is even, b
    if odd.
    """
    horizontal = np.empty((2 * n, 2 * n - 1))
    vertical = np.empty((2 * n - 1, 2 * n))
    for r in range(2 * n):
        for c in range(2 * n - 1):
            # middle segment from corner (r, c + 1) down to (r + 1, c + 1)
            row = r if (r + c + 1) % 2 == 0 else r + 1
            horizontal[r, c] = a if row % 2 == 0 else b
    for r in range(2 * n - 1):
        for c in range(2 * n):
            # middle segment from corner (r + 1, c) right to (r + 1, c + 1)
            row = r + 1
            vertical[r, c] = a if row % 2 == 0 else b
    return horizontal, vertical


def is_tiling_of(dominoes: np.ndarray, mask: np.ndarray) -> bool:
    """True when the (k, 2, 2) array covers every cell of the mask exactly once."""
    cover = np.zeros(mask.shape, dtype=int)
    for (r1, c1), (r2, c2) in dominoes.tolist():
        if (r2 - r1, c2 - c1) not in ((0, 1), (1, 0)):
            return False
        if not (0 <= r1 < mask.shape[0] and 0 <= c1 < mask.shape[1]
                and 0 <= r2 < mask.shape[0] and 0 <= c2 < mask.shape[1]):
            return False
        cover[r1, c1] += 1
        cover[r2, c2] += 1
    return bool(np.array_equal(cover, mask.astype(int)))
