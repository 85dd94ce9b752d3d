"""Drawing primitives shared by the lattices' pictures (matplotlib is imported by the caller)."""
from __future__ import annotations

from typing import Any, Optional


def frame(ax: Any, polygons: Any, title: Optional[str] = None) -> Any:
    """Fit the Axes to polygons (k, corners, 2) with a small margin, equal aspect, no axes; returns ax."""
    import numpy as np

    pts = np.asarray(polygons, dtype=float).reshape(-1, 2)
    if len(pts):
        lo, hi = pts.min(axis=0), pts.max(axis=0)
        pad = 0.02 * max(hi - lo)
        ax.set_xlim(lo[0] - pad, hi[0] + pad)
        ax.set_ylim(lo[1] - pad, hi[1] + pad)
    ax.set_aspect("equal")
    ax.set_axis_off()
    if title:
        ax.set_title(title)
    return ax


#: tilings with more tiles than this are drawn as one raster image instead of one polygon per tile
RASTER_TILES = 150_000


def output_pixels(ax: Any) -> int:
    """Pixels of the figure holding ``ax`` at its own dpi (:func:`frostline.plot.save` sets it to the file's)."""
    fig = ax.figure
    width, height = fig.get_size_inches()
    return int(width * fig.dpi) * int(height * fig.dpi)


#: vector formats: matplotlib writes every polygon out as text or PDF operators, no pixel canvas
VECTOR_FORMATS = (".svg", ".pdf")


def is_vector_output(ax: Any) -> bool:
    """Whether the figure holding ``ax`` is to be written as .svg or .pdf (set by :func:`frostline.plot.save`)."""
    return getattr(ax.figure, "frostline_format", ".png") in VECTOR_FORMATS


def picture_bytes(pixels: int, tiles: int = 0, raster_cells: int = 0, raster_work: int = 0,
                  vector: bool = False) -> int:
    """Peak memory (bytes) of drawing and writing a picture of ``pixels`` output pixels.

    Polygons (``raster_cells`` 0): for .png, matplotlib's canvas and the PNG
    encoder (about 10 bytes a pixel) and about 700 bytes a tile; for .svg and
    .pdf (``vector``) no canvas, about 1150 bytes a tile. A raster image of
    ``raster_cells`` float32 RGBA cells: the larger of its own construction
    (``raster_work``) and the image (16 bytes a cell) while matplotlib
    resamples it (about 20 bytes a cell and 32 an output pixel). Constants
    fitted to measured peaks of resident memory (matplotlib 3.11;
    tests/test_picture_memory.py holds them to within 1.5 times).
    """
    if raster_cells:
        return max(raster_work, 36 * raster_cells + 32 * pixels) + 10**7
    if vector:
        return 1150 * tiles + 10**7
    return 10 * pixels + 700 * tiles + 10**7


def check_picture_memory(ax: Any, what: str, tiles: int = 0, raster_cells: int = 0, raster_work: int = 0) -> None:
    """Refuse (RegionTooLargeError) a picture on ``ax`` whose :func:`picture_bytes` exceed the memory limit;
    the pixels and the format come from the figure (see :func:`output_pixels`, :func:`is_vector_output`)."""
    from .._limits import check_memory

    check_memory(picture_bytes(output_pixels(ax), tiles=tiles, raster_cells=raster_cells, raster_work=raster_work,
                               vector=is_vector_output(ax)), what)


def hex_to_rgb(colour: str) -> tuple:
    """'#rrggbb' -> (r, g, b) floats in [0, 1]."""
    c = colour.lstrip("#")
    return tuple(int(c[k:k + 2], 16) / 255.0 for k in (0, 2, 4))


def show_raster(ax: Any, image: Any, extent: Any, title: Optional[str] = None) -> Any:
    """Draw an RGBA image (rows from the top) over ``extent`` (x0, x1, y0, y1); frame the Axes; returns ax."""
    import numpy as np

    ax.imshow(image, extent=extent, origin="upper", interpolation="antialiased")
    x0, x1, y0, y1 = extent
    corners = np.array([[x0, y0], [x1, y1]], dtype=float)
    return frame(ax, corners[None], title)


def add_key(ax: Any, entries: Any, title: Optional[str] = None) -> Any:
    """A key beside the Axes: ``entries`` are (label, face colour or None, edge colour or None) rows."""
    from matplotlib.patches import Patch

    handles = [Patch(facecolor=face if face is not None else "none", edgecolor=edge if edge is not None else face,
                     label=label) for label, face, edge in entries]
    return ax.legend(handles=handles, loc="upper left", bbox_to_anchor=(1.01, 1.0), fontsize=7, frameon=False,
                     title=title, title_fontsize=7)
