"""Drawing lozenge tilings: three tones that read as cube faces lit from one side."""
from __future__ import annotations

from typing import Any, Optional, Sequence

import numpy as np

from frostline.toolkit import palette
from frostline.toolkit.drawing import RASTER_TILES, add_key, frame, hex_to_rgb, show_raster

from .tiles import DOWN_PARTNER, SQRT3_2, lozenge_polygons

FACE_TONES = palette.LOZENGE_FACES  # cube tops pale, the two visible sides in two darker tones
#: what each lozenge type is in the stack-of-cubes picture (tiles.tiles_of_plane_partition)
TYPE_NAMES = ("type 0: cube tops", "type 1: faces along +X", "type 2: faces along -Y")


def draw_lozenges(tiles: np.ndarray, ax: Any = None, *, tones: Sequence[str] = FACE_TONES,
                  edge_colour: Optional[str] = None, edge_width: Optional[float] = None,
                  title: Optional[str] = None, key: bool = False) -> Any:
    """Draw lozenges (rows (x, y, t)) on matplotlib Axes; returns the Axes.

    ``key`` adds a key naming the three types (cube tops and the two visible sides).

    Edges are drawn for small tilings and left out for large ones, where they
    would turn the picture grey; pass ``edge_colour``/``edge_width`` to choose.
    Tilings of more than ``RASTER_TILES`` lozenges are drawn as one image
    (:func:`raster_lozenges`), in seconds at any size.
    """
    import matplotlib.pyplot as plt
    from matplotlib.collections import PolyCollection

    if ax is None:
        _, ax = plt.subplots(figsize=(6, 6))
    tiles = np.asarray(tiles).reshape(-1, 3)
    if key:
        add_key(ax, [(name, tone, None) for name, tone in zip(TYPE_NAMES, tones)])
    if len(tiles) > RASTER_TILES:
        image, extent = raster_lozenges(tiles, tones=tones)
        return show_raster(ax, image, extent, title)
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


def raster_lozenges(tiles: np.ndarray, pixels: int = 2400, *, tones: Sequence[str] = FACE_TONES,
                    oversample: int = 2) -> tuple:
    """An RGBA image of the tiling, ``pixels`` wide, and its extent (x0, x1, y0, y1) in plane coordinates.

    Each pixel is split into ``oversample``^2 points; a point lies in the unit
    triangle found from its lattice coordinates (up when the fractional parts
    sum to less than 1), whose lozenge gives the colour; the pixel is their
    mean, so lozenges smaller than a pixel blend into the shading of the
    surface instead of aliasing. Outside the region: transparent.
    """
    tiles = np.asarray(tiles, dtype=np.int64).reshape(-1, 3)
    if len(tiles) == 0:
        raise ValueError("there are no lozenges to draw")
    polygons = lozenge_polygons(tiles[:: max(1, len(tiles) // 20000)])
    corners = np.concatenate([lozenge_polygons(tiles[np.argsort(tiles[:, 0])[[0, -1]]]).reshape(-1, 2),
                              lozenge_polygons(tiles[np.argsort(tiles[:, 1])[[0, -1]]]).reshape(-1, 2),
                              polygons.reshape(-1, 2)])
    x0, y0 = corners.min(axis=0) - 1.0
    x1, y1 = corners.max(axis=0) + 1.0
    width = pixels
    height = max(1, int(round(pixels * (y1 - y0) / (x1 - x0))))
    # which lozenge type covers each unit triangle: up[x, y] and down[x, y] on a padded grid
    lo = tiles[:, :2].min(axis=0) - 2
    hi = tiles[:, :2].max(axis=0) + 2
    shape = tuple(int(v) for v in (hi - lo + 1))
    up = np.full(shape, -1, dtype=np.int8)
    down = np.full(shape, -1, dtype=np.int8)
    up[tiles[:, 0] - lo[0], tiles[:, 1] - lo[1]] = tiles[:, 2]
    partner = tiles[:, :2] + DOWN_PARTNER[tiles[:, 2]]
    down[partner[:, 0] - lo[0], partner[:, 1] - lo[1]] = tiles[:, 2]
    palette_rgba = np.array([(*hex_to_rgb(c), 1.0) for c in tones] + [(1.0, 1.0, 1.0, 0.0)])
    image = np.zeros((height, width, 4))
    step_x, step_y = (x1 - x0) / width, (y1 - y0) / height
    offsets = (np.arange(oversample) + 0.5) / oversample
    for row_start in range(0, height, 256):
        rows = np.arange(row_start, min(height, row_start + 256))
        acc = np.zeros((len(rows), width, 4))
        for oy in offsets:
            Y = (y1 - (rows + oy) * step_y)[:, None]
            for ox in offsets:
                X = (x0 + (np.arange(width) + ox) * step_x)[None, :]
                j = Y / SQRT3_2
                i = X - 0.5 * j
                fi, fj = np.floor(i), np.floor(j)
                is_up = (i - fi) + (j - fj) < 1.0
                p = np.clip(fi.astype(np.int64) - lo[0], 0, shape[0] - 1)
                q = np.clip(fj.astype(np.int64) - lo[1], 0, shape[1] - 1)
                kind = np.where(is_up, up[p, q], down[p, q]).astype(np.int64)
                acc += palette_rgba[np.where(kind < 0, len(tones), kind)]
        image[rows - 0] = acc / oversample ** 2
    return image, (x0, x1, y0, y1)
