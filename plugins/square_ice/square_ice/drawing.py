"""Pictures of square ice: vertex types, the alternating sign matrix, the height function."""
from __future__ import annotations

from typing import Any, Sequence

import numpy as np

from frostline.toolkit import palette
from frostline.toolkit.drawing import add_key

from . import conversions as cv

TYPE_TONES = palette.ICE_VERTEX_TYPES  # a1, a2, b1, b2, c1, c2 (frostline.toolkit.palette)


TYPE_NAMES = ("a1", "a2", "b1", "b2", "c1", "c2")


def draw_ice(heights: np.ndarray, kind: str = "vertices", ax: Any = None, tones: Sequence[str] = TYPE_TONES,
             title: Any = None, key: bool = True) -> Any:
    """Draw ``kind`` = "vertices" (types coloured), "matrix" (+1 filled, -1 open marks) or "heights".

    Vertex (i, j) sits at (j + 1/2, n - i - 1/2): the matrix as printed, row 0 on top.
    The height view shows (h - parity) / 2: neighbouring heights differ by 1,
    so h alternates in parity like a checkerboard, which would hide the shape.
    ``key`` adds a key naming the colours (vertex types, matrix entries).
    """
    import matplotlib.pyplot as plt
    from matplotlib.colors import ListedColormap

    if kind not in ("vertices", "matrix", "heights"):
        raise ValueError(f"kind must be 'vertices', 'matrix' or 'heights', got {kind!r}")
    if ax is None:
        _, ax = plt.subplots(figsize=(6, 6))
    h = np.asarray(heights)
    n = h.shape[0] - 1
    if kind == "vertices":
        types = cv.vertex_types_from_heights(h)
        ax.imshow(types, cmap=ListedColormap(list(tones)), vmin=-0.5, vmax=5.5, extent=(0, n, 0, n),
                  interpolation="nearest")
        if key:
            add_key(ax, [(name, tone, None) for name, tone in zip(TYPE_NAMES, tones)], title="vertex type")
    elif kind == "heights":
        rows, cols = np.indices(h.shape)
        parity = (rows + cols + int(h[0, 0])) % 2
        image = ax.imshow((h - parity) / 2.0, cmap="cividis", extent=(-0.5, n + 0.5, -0.5, n + 0.5),
                          interpolation="nearest")
        plt.colorbar(image, ax=ax, shrink=0.8, label="(height - parity) / 2")
    else:
        m = cv.matrix_from_heights(h)
        i, j = np.nonzero(m == 1)
        ax.scatter(j + 0.5, n - i - 0.5, s=max(4, 2400 / n ** 1.2), c=tones[4], marker="o", linewidths=0)
        i, j = np.nonzero(m == -1)
        ax.scatter(j + 0.5, n - i - 0.5, s=max(4, 2400 / n ** 1.2), facecolors="none", edgecolors=tones[4],
                   marker="o", linewidths=1.0)
        ax.set_xlim(0, n)
        ax.set_ylim(0, n)
        if key:
            add_key(ax, [("+1 (filled)", tones[4], None), ("-1 (open)", None, tones[4])], title="matrix entry")
    ax.set_aspect("equal")
    ax.set_xticks([])
    ax.set_yticks([])
    if title:
        ax.set_title(title)
    return ax
