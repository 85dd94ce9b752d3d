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
