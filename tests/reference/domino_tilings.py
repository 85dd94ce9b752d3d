"""Brute-force domino tilings of a mask, written independently of frostline.

A tiling pairs every cell with a neighbour sharing a side (common practice).
Tilings are frozensets of dominoes ((r1, c1), (r2, c2)) with the first cell
above or left of the second.
"""
from __future__ import annotations

from typing import FrozenSet, Iterator, Tuple

import numpy as np

Domino = Tuple[Tuple[int, int], Tuple[int, int]]


def domino_tilings(mask: np.ndarray) -> Iterator[FrozenSet[Domino]]:
    cells = sorted(map(tuple, np.argwhere(np.asarray(mask)).tolist()))
    free = set(cells)
    chosen = []

    def extend() -> Iterator[FrozenSet[Domino]]:
        if not free:
            yield frozenset(chosen)
            return
        r, c = min(free)  # the first free cell in row-major order can only pair right or down
        for other in ((r, c + 1), (r + 1, c)):
            if other in free:
                free.discard((r, c))
                free.discard(other)
                chosen.append(((r, c), other))
                yield from extend()
                chosen.pop()
                free.add((r, c))
                free.add(other)

    yield from extend()


def weight(tiling: FrozenSet[Domino], horizontal: np.ndarray, vertical: np.ndarray) -> float:
    w = 1.0
    for (r1, c1), (r2, c2) in tiling:
        w *= horizontal[r1, c1] if r1 == r2 else vertical[r1, c1]
    return w
