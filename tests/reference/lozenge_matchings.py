"""Brute-force lozenge tilings of a set of unit triangles, written independently of frostline.

A lozenge tiling is a perfect matching of up triangles with adjacent down
triangles. With the conventions of docs/design.md section 3, the up triangle
U(x, y) shares an edge with D(x, y) (lozenge type 0), D(x, y-1) (type 1) and
D(x-1, y) (type 2) and with no other down triangle.
"""
from __future__ import annotations

from typing import FrozenSet, Iterable, Iterator, List, Tuple

Tile = Tuple[int, int, int]
OFFSETS = {0: (0, 0), 1: (0, -1), 2: (-1, 0)}


def tilings(triangles: Iterable[Tuple[int, int, int]]) -> Iterator[FrozenSet[Tile]]:
    """Yield every tiling as a frozenset of lozenges (x, y, t)."""
    tri = set(map(tuple, triangles))
    ups = sorted((x, y) for x, y, s in tri if s == 0)
    downs = {(x, y) for x, y, s in tri if s == 1}
    if len(ups) != len(downs):
        return
    chosen: List[Tile] = []
    used = set()

    def extend(k: int) -> Iterator[FrozenSet[Tile]]:
        if k == len(ups):
            yield frozenset(chosen)
            return
        x, y = ups[k]
        for t, (dx, dy) in OFFSETS.items():
            d = (x + dx, y + dy)
            if d in downs and d not in used:
                used.add(d)
                chosen.append((x, y, t))
                yield from extend(k + 1)
                chosen.pop()
                used.discard(d)

    yield from extend(0)


