"""Brute-force enumeration of plane partitions in a box, written independently of frostline.

A plane partition in an a x b x c box is an a x b array of integers in [0, c]
that does not increase along rows or down columns (common practice; see
Stanley, "Enumerative Combinatorics" vol. 2, section 7.20).
"""
from __future__ import annotations

from collections import Counter
from typing import Iterator, List, Tuple


def plane_partitions(a: int, b: int, c: int) -> Iterator[Tuple[int, ...]]:
    """Yield every plane partition in the box as a flat row-major tuple."""
    cells: List[int] = [0] * (a * b)

    def fill(k: int) -> Iterator[Tuple[int, ...]]:
        if k == a * b:
            yield tuple(cells)
            return
        r, s = divmod(k, b)
        bound = c
        if r > 0:
            bound = min(bound, cells[k - b])
        if s > 0:
            bound = min(bound, cells[k - 1])
        for v in range(bound + 1):
            cells[k] = v
            yield from fill(k + 1)

    yield from fill(0)


def volume_counts(a: int, b: int, c: int) -> List[int]:
    """n_v = number of plane partitions of volume v, v = 0..abc."""
    counter = Counter(sum(p) for p in plane_partitions(a, b, c))
    return [counter.get(v, 0) for v in range(a * b * c + 1)]
