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
