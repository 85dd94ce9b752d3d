"""Drawing domino tilings: four classes in four tones of our own."""
from __future__ import annotations

from typing import Any, Optional, Sequence

import numpy as np

from frostline._limits import check_memory
from frostline.toolkit import palette
from frostline.toolkit.drawing import RASTER_TILES, add_key, check_picture_memory, frame, hex_to_rgb, show_raster

CLASS_TONES = palette.DOMINO_CLASSES  # north, south, east, west: warm horizontal, cool vertical


def domino_rectangles(tiles: np.ndarray) -> np.ndarray:
    """Corners (k, 4, 2) of each domino in plane coordinates (x = column, y = -row)."""
    t = np.asarray(tiles, dtype=float).reshape(-1, 2, 2)
    top = np.minimum(t[:, 0, 0], t[:, 1, 0])
    bottom = np.maximum(t[:, 0, 0], t[:, 1, 0]) + 1
    left = np.minimum(t[:, 0, 1], t[:, 1, 1])
    right = np.maximum(t[:, 0, 1], t[:, 1, 1]) + 1
    return np.stack([np.stack([left, -top], 1), np.stack([right, -top], 1),
                     np.stack([right, -bottom], 1), np.stack([left, -bottom], 1)], 1)


def draw_dominoes(tiles: np.ndarray, classes: np.ndarray, ax: Any = None, *, tones: Sequence[str] = CLASS_TONES,
                  edge_colour: Optional[str] = None, edge_width: Optional[float] = None,
                  title: Optional[str] = None, key: Optional[Sequence[str]] = None) -> Any:
    """Draw dominoes coloured by class (0 north, 1 south, 2 east, 3 west); returns the Axes.

    More than ``RASTER_TILES`` dominoes are drawn as one image, a pixel per cell (:func:`raster_dominoes`).
    ``key``: class names for a key beside the picture (none when None).
    """
    import matplotlib.pyplot as plt
    from matplotlib.collections import PolyCollection

    if ax is None:
        _, ax = plt.subplots(figsize=(6, 6))
    if key is not None:
        add_key(ax, [(name, tone, None) for name, tone in zip(key, tones)])
    tiles = np.asarray(tiles).reshape(-1, 2, 2)
    if len(tiles) > RASTER_TILES:
        rows, cols = (np.ptp(tiles[:, :, k]) + 1 for k in (0, 1))
        check_picture_memory(ax, f"a picture of {len(tiles)} dominoes", raster_cells=int(rows) * int(cols),
                             raster_work=raster_bytes(int(rows), int(cols), len(tiles)))
        image, extent = raster_dominoes(tiles, classes, tones=tones)
        return show_raster(ax, image, extent, title)
    check_picture_memory(ax, f"a picture of {len(tiles)} dominoes", tiles=len(tiles))
    rects = domino_rectangles(tiles)
    colours = list(np.array(tones, dtype=object)[np.asarray(classes, dtype=int)]) if len(rects) else []
    large = len(rects) > 1500
    if edge_width is None:
        edge_width = 0.2 if large else 0.6
    edges: Any = edge_colour or (colours if large else palette.DOMINO_INK)
    ax.add_collection(PolyCollection(list(rects), facecolors=colours, edgecolors=edges, linewidths=edge_width))
    return frame(ax, rects, title)


def raster_bytes(rows: int, cols: int, dominoes: int) -> int:
    """Peak memory (bytes) of :func:`raster_dominoes`: the float32 RGBA image and the per-domino index arrays.

    Fitted to measured peaks of resident memory (tests/test_picture_memory.py).
    """
    return 16 * rows * cols + 32 * dominoes + 10**6


def raster_dominoes(tiles: np.ndarray, classes: np.ndarray, *, tones: Sequence[str] = CLASS_TONES) -> tuple:
    """A float32 RGBA image with one pixel per cell (row 0 at the top; transparent outside) and its plane extent."""
    t = np.asarray(tiles, dtype=np.int64).reshape(-1, 2, 2)
    if len(t) == 0:
        raise ValueError("there are no dominoes to draw")
    r0, c0 = int(t[:, :, 0].min()), int(t[:, :, 1].min())
    rows, cols = int(t[:, :, 0].max()) - r0 + 1, int(t[:, :, 1].max()) - c0 + 1
    check_memory(raster_bytes(rows, cols, len(t)), f"a {rows}x{cols} picture of {len(t)} dominoes")
    image = np.zeros((rows, cols, 4), dtype=np.float32)
    rgba = np.array([(*hex_to_rgb(c), 1.0) for c in tones], dtype=np.float32)
    colour = rgba[np.asarray(classes, dtype=np.int64)]
    for k in (0, 1):
        image[t[:, k, 0] - r0, t[:, k, 1] - c0] = colour
    return image, (float(c0), float(c0 + cols), float(-(r0 + rows)), float(-r0))
