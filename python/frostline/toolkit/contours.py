"""Level lines: marching triangles on a node mesh, and joining segments into polylines."""
from __future__ import annotations

from typing import Dict, List, Optional, Tuple

import numpy as np


def join_segments(segments: List[Tuple[tuple, tuple]]) -> List[np.ndarray]:
    """Polylines (longest first) from segments that share end points (matched to 1e-9)."""
    def key(p):
        return (round(p[0], 9), round(p[1], 9))

    ends: Dict[tuple, List[int]] = {}
    for k, (a, b) in enumerate(segments):
        ends.setdefault(key(a), []).append(k)
        ends.setdefault(key(b), []).append(k)
    used = [False] * len(segments)
    lines = []
    for start in range(len(segments)):
        if used[start]:
            continue
        used[start] = True
        line = [segments[start][0], segments[start][1]]
        for forward in (True, False):
            while True:
                tip = line[-1] if forward else line[0]
                nxt = next((k for k in ends.get(key(tip), []) if not used[k]), None)
                if nxt is None:
                    break
                used[nxt] = True
                a, b = segments[nxt]
                other = b if key(a) == key(tip) else a
                if forward:
                    line.append(other)
                else:
                    line.insert(0, other)
        lines.append(np.array(line))
    return sorted(lines, key=len, reverse=True)


def marching_triangles(points: np.ndarray, triangles: np.ndarray, values: np.ndarray,
                       level: float, carry: Optional[np.ndarray] = None) -> List[np.ndarray]:
    """The level line {values = level} of the piecewise-linear function on a triangle mesh, as polylines.

    ``points`` (N, 2), ``triangles`` (T, 3) node ids, ``values`` (N,). Each
    triangle whose corners straddle the level contributes one segment between
    the two crossings on its edges (linear interpolation). ``carry`` (N, d):
    more nodal fields, interpolated at the crossings the same way and returned
    as extra columns after x, y.
    """
    if carry is not None:
        points = np.concatenate([np.asarray(points, dtype=float), np.asarray(carry, dtype=float)], axis=1)
    pts = np.asarray(points, dtype=float)
    tri = np.asarray(triangles, dtype=np.int64)
    v = np.asarray(values, dtype=float)[tri] - level
    above = v > 0
    mixed = above.any(axis=1) & ~above.all(axis=1)
    segments: List[Tuple[tuple, tuple]] = []
    for t, vals in zip(tri[mixed], v[mixed]):
        crossings = []
        for a, b in ((0, 1), (1, 2), (2, 0)):
            if (vals[a] > 0) != (vals[b] > 0):
                if t[a] > t[b]:     # from the lower node id, so both triangles of an edge agree bit for bit
                    a, b = b, a
                s = vals[a] / (vals[a] - vals[b])
                p = pts[t[a]] + s * (pts[t[b]] - pts[t[a]])
                crossings.append(tuple(float(v) for v in p))
        if len(crossings) == 2:
            segments.append((crossings[0], crossings[1]))
    return join_segments(segments)


def mesh_boundary_segments(points: np.ndarray, triangles: np.ndarray) -> np.ndarray:
    """(S, 2, 2) end points of the edges that belong to one triangle only: the outline of the mesh."""
    tri = np.asarray(triangles, dtype=np.int64)
    edges = np.sort(np.concatenate([tri[:, [0, 1]], tri[:, [1, 2]], tri[:, [2, 0]]]), axis=1)
    unique, counts = np.unique(edges, axis=0, return_counts=True)
    outline = unique[counts == 1]
    pts = np.asarray(points, dtype=float)
    return np.stack([pts[outline[:, 0]], pts[outline[:, 1]]], axis=1)


def distance_to_segments(query: np.ndarray, segments: np.ndarray, chunk: int = 2048) -> np.ndarray:
    """Euclidean distance from each query point (M, 2) to the nearest of the segments (S, 2, 2)."""
    q = np.asarray(query, dtype=float).reshape(-1, 2)
    a, b = segments[:, 0], segments[:, 1]
    ab = b - a
    length2 = np.maximum((ab * ab).sum(axis=1), 1e-300)
    out = np.empty(len(q))
    for start in range(0, len(q), chunk):
        part = q[start:start + chunk]
        ap = part[:, None, :] - a[None]
        t = np.clip((ap * ab[None]).sum(-1) / length2[None], 0.0, 1.0)
        nearest = a[None] + t[..., None] * ab[None]
        out[start:start + chunk] = np.sqrt(((part[:, None, :] - nearest) ** 2).sum(-1)).min(axis=1)
    return out
