"""Boundary heights and height integration on any lattice, from edge lists.

Plugins describe their lattice points by integer ids and their edges by
arrays (tail, head); along an edge the height changes by a known amount.
These helpers never look at a lattice: they walk graphs.
"""
from __future__ import annotations

from collections import deque
from typing import Any, Callable, Dict, List, Tuple

import numpy as np


def walk_boundary(tails: np.ndarray, heads: np.ndarray, rise: int, order: Any,
                  start_value: Callable[[int], int], name: Callable[[int], str]) -> Tuple[Dict[int, int], Dict[int, int]]:
    """Heights on boundary points, where every boundary edge rises by ``rise`` from tail to head.

    Each connected component of the boundary graph starts at its first point
    in ``order`` with ``start_value(point)``. Returns (height of each boundary
    point, component of each boundary point).

    Raises ValueError naming the point where two walks disagree.
    """
    adjacency: Dict[int, List[Tuple[int, int]]] = {}
    for a, b in zip(np.asarray(tails).tolist(), np.asarray(heads).tolist()):
        adjacency.setdefault(a, []).append((b, rise))
        adjacency.setdefault(b, []).append((a, -rise))
    heights: Dict[int, int] = {}
    component: Dict[int, int] = {}
    count = 0
    for start in order:
        if start not in adjacency or start in heights:
            continue
        heights[start] = start_value(start)
        component[start] = count
        queue = deque([start])
        while queue:
            v = queue.popleft()
            for w, delta in adjacency[v]:
                value = heights[v] + delta
                if w not in heights:
                    heights[w] = value
                    component[w] = count
                    queue.append(w)
                elif heights[w] != value:
                    raise ValueError(
                        f"the boundary cannot carry a height function: walking it reaches {name(w)} with heights "
                        f"{heights[w]} and {value}; a piece of the region is unbalanced (its two kinds of cells or "
                        "triangles differ in number), so it cannot be tiled"
                    )
        count += 1
    return heights, component


def refuse_holes(outside: np.ndarray, links_a: np.ndarray, links_b: np.ndarray, border: np.ndarray,
                 name: Callable[[int], str]) -> None:
    """Raise ValueError if some part of the complement is enclosed by the region (a hole).

    Items are the cells (or triangles) of a padded grid; ``outside`` marks
    those not in the region, ``links`` join neighbouring items (sharing a
    side), ``border`` lists the items on the padded grid's edge. A piece of
    the complement that reaches no border item is a hole, even when it touches
    the outside at a single corner: heights around it need not close up, so
    frostline refuses such regions rather than sample a wrong law.
    """
    outside = np.asarray(outside, dtype=bool)
    a, b = np.asarray(links_a), np.asarray(links_b)
    keep = outside[a] & outside[b]
    labels = pieces(len(outside), a[keep], b[keep])
    reaching = np.unique(labels[np.asarray(border)[outside[np.asarray(border)]]])
    enclosed = np.flatnonzero(outside & ~np.isin(labels, reaching))
    if enclosed.size:
        raise ValueError(
            f"the region has a hole: {name(int(enclosed[0]))} is not in the region but enclosed by it (perhaps "
            "touching the outside only at a corner); frostline samples regions whose pieces are simply connected: "
            "fill the hole, or split the region along a cut"
        )


def integrate(values: np.ndarray, known: np.ndarray, tails: np.ndarray, heads: np.ndarray,
              deltas: np.ndarray) -> np.ndarray:
    """Fill unknown heights from known ones along edges with h[head] - h[tail] = delta.

    ``values`` and ``known`` are flat arrays over points (known values are
    kept). Raises ValueError if two paths give a point different heights (the
    tiling data is inconsistent). Runs in the compiled engine (breadth first).
    """
    from . import _core

    return _core.engine.integrate_heights(np.asarray(values, dtype=np.int64), np.asarray(known, dtype=np.uint8),
                                          np.asarray(tails, dtype=np.int64), np.asarray(heads, dtype=np.int64),
                                          np.asarray(deltas, dtype=np.int64))


def integrate_expected(values: np.ndarray, known: np.ndarray, tails: np.ndarray, heads: np.ndarray,
                       deltas: np.ndarray) -> np.ndarray:
    """Fill unknown (float) values from known ones along edges with v[head] - v[tail] = delta.

    For expected heights: the deltas are expected height changes, so every
    path gives the same value up to rounding; a breadth-first spanning tree
    from the known points is walked once (no consistency check). Points no
    edge reaches keep their given values.
    """
    values = np.asarray(values, dtype=float).copy()
    done = np.asarray(known, dtype=bool).copy()
    a = np.concatenate([np.asarray(tails), np.asarray(heads)]).astype(np.int64)
    b = np.concatenate([np.asarray(heads), np.asarray(tails)]).astype(np.int64)
    d = np.concatenate([np.asarray(deltas, dtype=float), -np.asarray(deltas, dtype=float)])
    order = np.argsort(a, kind="stable")
    a, b, d = a[order], b[order], d[order]
    start = np.searchsorted(a, np.arange(len(values) + 1))
    queue = deque(np.flatnonzero(done).tolist())
    while queue:
        v = queue.popleft()
        for e in range(start[v], start[v + 1]):
            w = b[e]
            if not done[w]:
                values[w] = values[v] + d[e]
                done[w] = True
                queue.append(w)
    return values


def pieces(n_items: int, links_a: np.ndarray, links_b: np.ndarray) -> np.ndarray:
    """Connected components (labels 0..k-1) of items joined by links (union-find in the engine)."""
    from . import _core

    return _core.engine.connected_components(int(n_items), np.asarray(links_a, dtype=np.int64),
                                             np.asarray(links_b, dtype=np.int64))
