"""Domino regions lowered to the variational problem of :mod:`frostline.variational`.

Cells are the region's unit squares; corner (r, c) is the top-left corner of
cell (r, c), and the plane has x = c to the right, y = -r up. Thurston's
orientation (see :mod:`.geometry`) puts the black cell on the left of every
edge, so the height rule runs counter-clockwise around a black cell
(bottom-left, bottom-right, top-right, top-left) and clockwise around a
white one (bottom-left, top-left, top-right, bottom-right). Step 4; each
domino covers two cells, so the cell weight is 1/2. The four probabilities of
a cell are those of its partner lying across each edge; Cohn, Kenyon and
Propp's entropy is the sum of L(pi p) / pi over them (docs/limit_shapes.md).
"""
from __future__ import annotations

from typing import Any, Dict, Tuple

import numpy as np

from frostline.variational import CellProblem, LimitSetup

#: corner offsets (dr, dc) of a cell in the order of the height rule
BLACK_CORNERS = ((1, 0), (1, 1), (0, 1), (0, 0))     # counter-clockwise: bottom, right, top, left edges
WHITE_CORNERS = ((1, 0), (0, 0), (0, 1), (1, 1))     # clockwise: left, top, right, bottom edges
#: edge index of the bottom, right, top and left edge in each colour's order
BLACK_EDGE = {"bottom": 0, "right": 1, "top": 2, "left": 3}
WHITE_EDGE = {"left": 0, "top": 1, "right": 2, "bottom": 3}


def limit_setup(region: Any) -> LimitSetup:
    """The :class:`LimitSetup` of a :class:`~frostline.domino.DominoRegion` (uniform weights)."""
    if region.weights is not None:
        raise ValueError("the limit shape is built in for uniform domino weights only: weighted dominoes have "
                         "another surface tension (not implemented); use uniform weights or compare with samples")
    mask = region.mask
    R, C = mask.shape
    width = C + 1
    node = region._node
    model = region._engine()["model"]
    least, greatest = model.extremes()
    r, c = np.nonzero(mask)
    black = (r + c) % 2 == 0
    corners = np.where(black[:, None, None], np.array(BLACK_CORNERS)[None], np.array(WHITE_CORNERS)[None])
    ids = (r[:, None] + corners[:, :, 0]) * width + (c[:, None] + corners[:, :, 1])
    cells = node[ids]
    if np.any(cells < 0):
        raise AssertionError("a cell corner is not a node of the region")
    problem = CellProblem(cells, 4, 0.5, least, greatest)
    x0, y0 = region.plane_origin
    corner_ids = np.flatnonzero(node >= 0)
    plane = np.empty((len(least), 2))
    cr, cc = np.divmod(corner_ids, width)
    plane[node[corner_ids]] = np.stack([cc - x0, y0 - cr], axis=1)
    # two triangles per cell for contours
    mesh = np.concatenate([cells[:, [0, 1, 2]], cells[:, [0, 2, 3]]])
    cell_index = np.full(mask.shape, -1, dtype=np.int64)
    cell_index[r, c] = np.arange(len(r))

    def edge_of(index: np.ndarray, side: str) -> np.ndarray:
        return np.where(black[index], BLACK_EDGE[side], WHITE_EDGE[side])

    def tile_densities(p: np.ndarray) -> Dict[str, Tuple[np.ndarray, np.ndarray, np.ndarray]]:
        tiles, probs = [], []
        for (dr, dc), first_side, second_side in (((0, 1), "right", "left"), ((1, 0), "bottom", "top")):
            pairs = mask[: R - dr, : C - dc] & mask[dr:, dc:]
            pr, pc = np.nonzero(pairs)
            a, b = cell_index[pr, pc], cell_index[pr + dr, pc + dc]
            probs.append(0.5 * (p[a, edge_of(a, first_side)] + p[b, edge_of(b, second_side)]))
            tiles.append(np.stack([np.stack([pr, pc], 1), np.stack([pr + dr, pc + dc], 1)], axis=1))
        t = np.concatenate(tiles)
        prob = np.clip(np.concatenate(probs), 0.0, 1.0)
        classes = region.classify(t)
        centres = region.tile_centres(t)
        return {name: (centres[classes == k], prob[classes == k], t[classes == k])
                for k, name in enumerate(region.tile_classes)}

    def to_heights(h: np.ndarray) -> np.ndarray:
        flat = np.full((R + 1) * width, np.nan)
        flat[corner_ids] = h[node[corner_ids]]
        return flat.reshape(R + 1, width)

    return LimitSetup(problem, plane, mesh, region.scale, to_heights, tile_densities)
