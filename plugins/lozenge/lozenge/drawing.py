"""Drawing lozenge tilings: three tones that read as cube faces lit from one side."""
from __future__ import annotations

from typing import Any, Optional, Sequence

import numpy as np

from frostline._limits import check_memory
from frostline.toolkit import palette
from frostline.toolkit.drawing import RASTER_TILES, add_key, check_picture_memory, frame, hex_to_rgb, show_raster

from .tiles import DOWN_PARTNER, LOZENGE_CORNERS, SQRT3_2, lozenge_polygons, plane_points

FACE_TONES = palette.LOZENGE_FACES  # cube tops pale, the two visible sides in two darker tones
RASTER_PIXELS = 2400  # longer side of the image that stands for a large tiling
ROW_BLOCK = 256  # image rows computed at a time: bounds the float work arrays
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
        # the image's longer side is RASTER_PIXELS: its square bounds the cells
        check_picture_memory(ax, f"a picture of {len(tiles)} lozenges", raster_cells=RASTER_PIXELS ** 2,
                             raster_work=raster_bytes(RASTER_PIXELS, RASTER_PIXELS, len(tiles)))
        image, extent = raster_lozenges(tiles, RASTER_PIXELS, tones=tones)
        return show_raster(ax, image, extent, title)
    check_picture_memory(ax, f"a picture of {len(tiles)} lozenges", tiles=len(tiles))
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


def raster_bytes(width: int, height: int, lozenges: int) -> int:
    """Peak memory (bytes) of :func:`raster_lozenges`: the float32 image, one block of rows of float
    work arrays, and the sorted triangle keys.

    Fitted to measured peaks of resident memory (tests/test_picture_memory.py).
    """
    return 16 * width * height + ROW_BLOCK * 100 * width + 150 * lozenges + 10**6


def raster_lozenges(tiles: np.ndarray, pixels: int = RASTER_PIXELS, *, tones: Sequence[str] = FACE_TONES,
                    oversample: int = 2) -> tuple:
    """An RGBA image of the tiling (float32, longer side ``pixels``) and its extent (x0, x1, y0, y1), plane units.

    Each pixel is split into ``oversample``^2 points; a point lies in the unit
    triangle found from its lattice coordinates (up when the fractional parts
    sum to less than 1), whose lozenge gives the colour, looked up among the
    tiles' sorted triangle keys (memory in proportion to the tiles, whatever
    their bounding box). A pixel is the coverage-weighted mean of its points,
    so lozenges smaller than a pixel blend into the shading of the surface and
    edge pixels keep the tile's tone; outside the region it is transparent.
    """
    tiles = np.asarray(tiles, dtype=np.int64).reshape(-1, 3)
    if len(tiles) == 0:
        raise ValueError("there are no lozenges to draw")
    if isinstance(pixels, bool) or not isinstance(pixels, (int, np.integer)) or not 1 <= pixels <= 20000:
        raise ValueError(f"pixels (the image's longer side) must be an int from 1 to 20000, got {pixels!r}")
    if isinstance(oversample, bool) or not isinstance(oversample, (int, np.integer)) or not 1 <= oversample <= 8:
        raise ValueError(f"oversample must be an int from 1 to 8, got {oversample!r}")
    # exact extent: every corner of every lozenge, one offset at a time
    x0 = y0 = np.inf
    x1 = y1 = -np.inf
    for t in range(3):
        sel = tiles[tiles[:, 2] == t, :2]
        for dx, dy in LOZENGE_CORNERS[t]:
            corner = plane_points(sel + np.array([dx, dy]))
            if len(corner):
                x0, x1 = min(x0, corner[:, 0].min()), max(x1, corner[:, 0].max())
                y0, y1 = min(y0, corner[:, 1].min()), max(y1, corner[:, 1].max())
    pad = 0.5
    x0, x1, y0, y1 = x0 - pad, x1 + pad, y0 - pad, y1 + pad
    aspect = (y1 - y0) / (x1 - x0)
    if aspect >= 1.0:
        height, width = pixels, max(1, int(round(pixels / aspect)))
    else:
        width, height = pixels, max(1, int(round(pixels * aspect)))
    check_memory(raster_bytes(width, height, len(tiles)), f"a {width}x{height} picture of {len(tiles)} lozenges")
    # triangle key: (x, y, s) -> lozenge type, sorted for searchsorted
    partner = tiles[:, :2] + DOWN_PARTNER[tiles[:, 2]]
    cells = np.concatenate([tiles[:, :2], partner])
    lo = cells.min(axis=0)
    span = int(cells[:, 1].max() - lo[1] + 2)

    def key(p: np.ndarray, q: np.ndarray, s: np.ndarray) -> np.ndarray:
        return ((p - lo[0]) * span + (q - lo[1])) * 2 + s

    keys = np.concatenate([key(tiles[:, 0], tiles[:, 1], np.zeros(len(tiles), np.int64)),
                           key(partner[:, 0], partner[:, 1], np.ones(len(tiles), np.int64))])
    kinds = np.concatenate([tiles[:, 2], tiles[:, 2]])
    order = np.argsort(keys)
    keys, kinds = keys[order], kinds[order]
    colours = np.array([hex_to_rgb(c) for c in tones], dtype=np.float32)
    image = np.zeros((height, width, 4), dtype=np.float32)
    step_x, step_y = (x1 - x0) / width, (y1 - y0) / height
    offsets = (np.arange(oversample) + 0.5) / oversample
    for row_start in range(0, height, ROW_BLOCK):
        rows = np.arange(row_start, min(height, row_start + ROW_BLOCK))
        rgb = np.zeros((len(rows), width, 3), dtype=np.float32)
        cover = np.zeros((len(rows), width), dtype=np.float32)
        for oy in offsets:
            y = (y1 - (rows + oy) * step_y)[:, None]
            for ox in offsets:
                x = (x0 + (np.arange(width) + ox) * step_x)[None, :]
                j = y / SQRT3_2
                i = x - 0.5 * j
                fi, fj = np.floor(i), np.floor(j)
                s = ((i - fi) + (j - fj) >= 1.0).astype(np.int64)
                k = key(fi.astype(np.int64), fj.astype(np.int64), s)
                at = np.clip(np.searchsorted(keys, k), 0, len(keys) - 1)
                inside = keys[at] == k
                rgb += np.where(inside[..., None], colours[kinds[at]], 0.0)
                cover += inside
        image[rows, :, :3] = np.where(cover[..., None] > 0, rgb / np.maximum(cover, 1)[..., None], 1.0)
        image[rows, :, 3] = cover / oversample ** 2
    return image, (float(x0), float(x1), float(y0), float(y1))
