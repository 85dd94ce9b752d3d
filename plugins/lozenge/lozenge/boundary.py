"""Boundary paths on the triangular lattice, in a compact text notation of our own.

A path is a sequence of unit steps in six directions, named like compass
points on the plane picture (lattice point (i, j) sits at i*(1, 0) + j*(1/2, sqrt(3)/2)):

    e  = (1, 0)    ne = (0, 1)    nw = (-1, 1)
    w  = (-1, 0)   sw = (0, -1)   se = (1, -1)

Each direction may carry a repeat count, and parentheses repeat a group:
``"4e 3ne 5nw 4w 3sw 5se"`` is the 4, 3, 5 hexagon; ``"2(3e 2ne) 6nw 10w 4sw 6se"``
repeats a staircase. Spaces and commas separate items; case does not matter.
The path must return to its start without visiting any lattice point twice;
it may run either way round. The region is everything it encloses.
"""
from __future__ import annotations

import re
from typing import Dict, List, Sequence, Tuple

import numpy as np

from frostline._limits import check_memory

from .geometry import BYTES_PER_TRIANGLE, GRID_BYTES_PER_POINT, MARGIN

DIRECTIONS = {"e": (1, 0), "ne": (0, 1), "nw": (-1, 1), "w": (-1, 0), "sw": (0, -1), "se": (1, -1)}
_TOKEN = re.compile(r"\s*(?:(\d+)|([A-Za-z]+)|(\()|(\))|(,))")


def parse_path(text: str) -> List[Tuple[int, int]]:
    """The unit steps of a path written in the notation above.

    Raises
    ------
    TypeError
        If ``text`` is not a str.
    ValueError
        For an unknown direction, a stray symbol or unbalanced parentheses (the message shows where).
    """
    if not isinstance(text, str):
        raise TypeError(f"a boundary path is a str such as '3e 3ne 3nw 3w 3sw 3se', got {type(text).__name__}")
    if path_length(text) > MAX_STEPS:
        raise ValueError(f"the boundary path has {path_length(text):.3g} unit steps, more than {MAX_STEPS:g}: "
                         "its region would not fit in memory")
    tokens = []
    pos = 0
    stripped = text.rstrip()
    while pos < len(stripped):
        m = _TOKEN.match(stripped, pos)
        if not m:
            raise ValueError(f"unexpected symbol {stripped[pos]!r} at position {pos} of the boundary path {text!r}; "
                             f"use counts, the directions {', '.join(DIRECTIONS)} and parentheses")
        pos = m.end()
        if m.group(5):
            continue
        last = m.lastindex or 0  # a match that is not a skipped blank has a last group
        tokens.append((m.start(last), m.group(last)))

    def sequence(k: int, depth: int) -> Tuple[List[Tuple[int, int]], int]:
        steps: List[Tuple[int, int]] = []
        while k < len(tokens):
            at, tok = tokens[k]
            if tok == ")":
                if depth == 0:
                    raise ValueError(f"unmatched ')' at position {at} of the boundary path {text!r}")
                return steps, k + 1
            count = 1
            if tok.isdigit():
                count = int(tok)
                k += 1
                if k == len(tokens):
                    raise ValueError(f"the count {tok} at position {at} of {text!r} is not followed by a direction")
                at, tok = tokens[k]
            if tok == "(":
                if depth >= MAX_NESTING:
                    raise ValueError(f"the boundary path nests groups more than {MAX_NESTING} deep (at position {at}); "
                                     "write the repetition with counts instead")
                inner, k = sequence(k + 1, depth + 1)
                steps += inner * count
                continue
            word = tok.lower()
            if word not in DIRECTIONS:
                raise ValueError(f"unknown direction {tok!r} at position {at} of the boundary path {text!r}; "
                                 f"directions are {', '.join(DIRECTIONS)}")
            steps += [DIRECTIONS[word]] * count
            k += 1
        if depth:
            raise ValueError(f"a '(' in the boundary path {text!r} is never closed")
        return steps, k

    steps, _ = sequence(0, 0)
    return steps


MAX_STEPS = 10**7  # a boundary of 10^7 unit steps already encloses far more than fits in memory
MAX_NESTING = 100  # groups inside groups; deeper paths are refused, not recursed into


def path_length(text: str) -> int:
    """Number of unit steps a path in the notation expands to, computed without expanding it."""
    total, stack, pending = 0, [], 1
    for m in _TOKEN.finditer(text):
        number, word, opening, closing = m.group(1), m.group(2), m.group(3), m.group(4)
        if number:
            pending = int(number)
        elif word:
            total += pending
            pending = 1
        elif opening:
            stack.append((total, pending))
            total, pending = 0, 1
        elif closing and stack:
            outer, times = stack.pop()
            total = outer + times * total
    return total


def format_path(steps: Sequence[Tuple[int, int]]) -> str:
    """The notation for a list of unit steps, runs merged (``[(1,0)]*3 -> '3e'``)."""
    names: Dict[Tuple[int, ...], str] = {tuple(v): k for k, v in DIRECTIONS.items()}
    out = []
    k = 0
    while k < len(steps):
        m = k
        while m < len(steps) and tuple(steps[m]) == tuple(steps[k]):
            m += 1
        out.append(f"{m - k}{names[tuple(steps[k])]}" if m - k > 1 else names[tuple(steps[k])])
        k = m
    return " ".join(out)


def path_points(steps: Sequence[Tuple[int, int]], start: Tuple[int, int] = (0, 0)) -> np.ndarray:
    """Lattice points visited, start first; checks the path is closed and simple."""
    if len(steps) == 0:
        raise ValueError("the boundary path is empty")
    pts = np.cumsum(np.concatenate([np.array([start], dtype=np.int64), np.asarray(steps, dtype=np.int64)]), axis=0)
    if tuple(pts[-1]) != tuple(pts[0]):
        raise ValueError(f"the boundary path is open: it starts at {tuple(int(v) for v in pts[0])} and ends at "
                         f"{tuple(int(v) for v in pts[-1])}; a boundary must return to its start")
    visited = pts[:-1]
    _, first, counts = np.unique(visited, axis=0, return_index=True, return_counts=True)
    if np.any(counts > 1):
        point = visited[first[np.flatnonzero(counts > 1)].min()]
        k0, k1 = np.flatnonzero(np.all(visited == point, axis=1))[:2]
        raise ValueError(f"the boundary path visits the lattice point {tuple(int(v) for v in point)} twice (after "
                         f"steps {int(k0)} and {int(k1)}); a boundary must be a simple closed curve")
    return pts


def enclosed_triangles(steps: Sequence[Tuple[int, int]], start: Tuple[int, int] = (0, 0)) -> np.ndarray:
    """Unit triangles (x, y, s) inside a simple closed path, by an even-odd scan of each row.

    Row y (between lattice rows y and y + 1) is cut by the lines j = y + 1/3
    (through the centroids (x + 1/3, y + 1/3) of up triangles) and j = y + 2/3
    (through those of down triangles). Working in thirds keeps every crossing
    an integer that never equals a centroid, so the test is exact.
    """
    pts = path_points(steps, start)
    # shoelace area in lattice parallelograms; each holds two unit triangles
    x, y = pts[:, 0].astype(float), pts[:, 1].astype(float)
    triangles = abs(float(np.dot(x[:-1], y[1:]) - np.dot(x[1:], y[:-1])))
    check_memory(int(BYTES_PER_TRIANGLE * triangles), f"a region of about {triangles:.3g} triangles")
    # the region's arrays live on the bounding box of its points (geometry.TriangleGrid): check that too, first
    span = pts.max(axis=0) - pts.min(axis=0) + 2 * MARGIN + 2
    check_memory(int(GRID_BYTES_PER_POINT * float(span[0]) * float(span[1])),
                 f"the {int(span[0])}x{int(span[1])} grid around this boundary path (its bounding box)")
    a, b = pts[:-1], pts[1:]
    moving = a[:, 1] != b[:, 1]
    a, b = a[moving], b[moving]
    di = b[:, 0] - a[:, 0]
    rising = b[:, 1] > a[:, 1]
    row = np.minimum(a[:, 1], b[:, 1])
    # crossings (in thirds of a unit) of the lines row + 1/3 and row + 2/3
    first = np.where(rising, 3 * a[:, 0] + di, 3 * a[:, 0] + 2 * di)
    second = np.where(rising, 3 * a[:, 0] + 2 * di, 3 * a[:, 0] + di)
    out = []
    for s, crossing, offset in ((0, first, 1), (1, second, 2)):
        order = np.lexsort((crossing, row))
        rows, cuts = row[order], crossing[order]
        # crossings pair up within each row, sorted: (c0, c1), (c2, c3), ... (all rows at once, no row loop)
        if len(rows) % 2 or np.any(rows[0::2] != rows[1::2]):
            raise AssertionError("odd number of crossings on a row of a closed path")
        lo, hi, y = cuts[0::2], cuts[1::2], rows[0::2]
        # centroids 3x + offset strictly between lo and hi
        x0 = -((offset - lo) // 3)  # ceil((lo - offset) / 3)
        x1 = (hi - offset) // 3
        counts = np.maximum(x1 - x0 + 1, 0)
        starts = np.repeat(x0 - (np.cumsum(counts) - counts), counts)
        xs = starts + np.arange(int(counts.sum()))
        out.append(np.stack([xs, np.repeat(y, counts), np.full_like(xs, s)], axis=1))
    if sum(len(part) for part in out) == 0:
        raise ValueError("the boundary path encloses no triangle")
    return np.concatenate(out)
