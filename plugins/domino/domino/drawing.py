"""Drawing domino tilings: four classes in four tones of our own."""
from __future__ import annotations

from typing import Any, Optional, Sequence

import numpy as np

from frostline.toolkit import palette
from frostline.toolkit.drawing import frame

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
                  title: Optional[str] = None) -> Any:
    """Draw dominoes coloured by class (0 north, 1 south, 2 east, 3 west); returns the Axes."""
    import matplotlib.pyplot as plt
    from matplotlib.collections import PolyCollection

    if ax is None:
        _, ax = plt.subplots(figsize=(6, 6))
    rects = domino_rectangles(tiles)
    colours = list(np.array(tones, dtype=object)[np.asarray(classes, dtype=int)]) if len(rects) else []
    large = len(rects) > 1500
    if edge_width is None:
        edge_width = 0.2 if large else 0.6
    edges: Any = edge_colour or (colours if large else palette.DOMINO_INK)
    ax.add_collection(PolyCollection(list(rects), facecolors=colours, edgecolors=edges, linewidths=edge_width))
    return frame(ax, rects, title)
