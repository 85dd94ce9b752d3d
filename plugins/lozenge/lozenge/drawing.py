"""Drawing lozenge tilings: three tones that read as cube faces lit from one side."""
from __future__ import annotations

from typing import Any, Optional, Sequence

import numpy as np

from frostline.toolkit import palette
from frostline.toolkit.drawing import frame

from .tiles import lozenge_polygons

FACE_TONES = palette.LOZENGE_FACES  # cube tops pale, the two visible sides in two darker tones


def draw_lozenges(tiles: np.ndarray, ax: Any = None, *, tones: Sequence[str] = FACE_TONES,
                  edge_colour: Optional[str] = None, edge_width: Optional[float] = None,
                  title: Optional[str] = None) -> Any:
    """Draw lozenges (rows (x, y, t)) on matplotlib Axes; returns the Axes.

    Edges are drawn for small tilings and left out for large ones, where they
    would turn the picture grey; pass ``edge_colour``/``edge_width`` to choose.
    """
    import matplotlib.pyplot as plt
    from matplotlib.collections import PolyCollection

    if ax is None:
        _, ax = plt.subplots(figsize=(6, 6))
    tiles = np.asarray(tiles).reshape(-1, 3)
    polygons = lozenge_polygons(tiles)
    colours = list(np.array(tones, dtype=object)[tiles[:, 2]]) if len(tiles) else []
    large = len(tiles) > 1000
    if edge_width is None:
        edge_width = 0.25 if large else 0.6
    if edge_colour is None:
        # Large tilings: edges in each face's own tone close the hairline gaps
        # between neighbours without greying the picture.
        edges: Any = colours if large else palette.LOZENGE_INK
    else:
        edges = edge_colour
    ax.add_collection(PolyCollection(list(polygons), facecolors=colours, edgecolors=edges, linewidths=edge_width))
    return frame(ax, polygons, title)
