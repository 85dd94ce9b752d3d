"""Pictures of samples. matplotlib is imported only when a function here runs.

Each plugin draws its own tiles (``Sample.plot``); this module adds files and
figures around that, for any lattice.
"""
from __future__ import annotations

import math
import os
from typing import Any, Optional

import numpy as np

from .._limits import check_memory
from ..toolkit import palette
from ..toolkit.drawing import VECTOR_FORMATS, picture_bytes

FORMATS = (".png", ".svg", ".pdf")

__all__ = ["FORMATS", "save", "save_densities"]


def _pyplot():
    try:
        import matplotlib.pyplot as plt  # picks a non-interactive backend without a display
    except ImportError as exc:  # pragma: no cover - depends on the environment
        raise ImportError("pictures need matplotlib: pip install 'frostline[plot]'") from exc
    return plt


def _check_format(path: str | os.PathLike[str]) -> str:
    ext = os.path.splitext(str(path))[1].lower()
    if ext not in FORMATS:
        raise ValueError(f"picture format {ext or '(none)'!r} is not supported; use one of {', '.join(FORMATS)}")
    return ext


def _check_size(size: float, dpi: int) -> int:
    """Validate a figure side (inches) and dpi; returns the picture's pixels."""
    if isinstance(size, bool) or not isinstance(size, (int, float, np.integer, np.floating)) \
            or not math.isfinite(size) or not 0 < size <= 1000:
        raise ValueError(f"size (the figure's side in inches) must be a number in (0, 1000], got {size!r}")
    if isinstance(dpi, bool) or not isinstance(dpi, (int, np.integer)) or not 1 <= dpi <= 10000:
        raise ValueError(f"dpi must be an int from 1 to 10000, got {dpi!r}")
    return int(size * dpi) ** 2


def save(sample: Any, path: str | os.PathLike[str], *, size: float = 6.0, dpi: int = 200, title: Optional[str] = None,
         **style: Any) -> str:
    """Draw ``sample`` and write it to ``path`` (format from the extension: .png, .svg or .pdf).

    ``size`` is the figure's side in inches and ``dpi`` its pixels per inch
    (for .png); returns the path written. The memory of the picture is
    estimated before anything is drawn (``FROSTLINE_MEMORY_LIMIT``).
    """
    ext = _check_format(path)
    pixels = _check_size(size, dpi)
    check_memory(picture_bytes(pixels, vector=ext in VECTOR_FORMATS), f"a {size:g}-inch picture at {dpi} dpi")
    plt = _pyplot()
    fig, ax = plt.subplots(figsize=(size, size), dpi=dpi)  # the file's dpi, so plugins estimate its pixels
    fig.frostline_format = ext  # and its format (vector formats keep every polygon)
    try:
        sample.plot(ax=ax, **style)
        if title:
            ax.set_title(title)
        fig.savefig(path, dpi=dpi, bbox_inches="tight")
    finally:
        plt.close(fig)
    return str(path)


def _tile_icon(ax: Any, corners: np.ndarray) -> None:
    """The shape of the panel's tile class, drawn small in the panel's top-left corner."""
    from matplotlib.patches import Polygon

    icon = ax.inset_axes([0.0, 0.86, 0.14, 0.14])
    icon.add_patch(Polygon(corners - corners.mean(axis=0), closed=True, facecolor=palette.SERIES[2],
                           edgecolor=palette.SERIES[0], linewidth=0.6))
    icon.set_xlim(-1.2, 1.2)
    icon.set_ylim(-1.2, 1.2)
    icon.set_aspect("equal")
    icon.set_axis_off()


def save_densities(densities: dict, path: str | os.PathLike[str], *, title: Optional[str] = None, dpi: int = 200,
                   curves: Optional[list] = None, outlines: Optional[dict] = None,
                   labels: Optional[dict] = None) -> str:
    """One panel per tile class: tile centres coloured by their probability (0 to 1).

    ``densities`` maps class name to (centres (k, 2), probabilities (k,)), as
    :func:`frostline.exact.class_densities` and ``Region.limit_shape().densities``
    return; ``curves`` (polylines in the same plane coordinates, e.g. a
    predicted frozen boundary times the region's scale) are drawn on every panel.
    ``outlines`` ({class: (k, m, 2) tile corners, in the order of the
    densities}) draws every tile position filled, so the map follows the
    lattice and probabilities near 1 stay visible; without it, dots.
    ``labels`` ({class: panel title}, e.g. a region's ``tile_class_labels``)
    names the panels in words; classes without one keep their name.
    """
    _check_format(path)
    _check_size(3.8, dpi)
    k = len(densities)
    check_memory(picture_bytes(int(3.6 * k * dpi) * int(3.8 * dpi), tiles=sum(len(p) for _, p in densities.values())),
                 f"a picture of {k} density panels at {dpi} dpi")
    plt = _pyplot()
    fig, axes = plt.subplots(1, k, figsize=(3.6 * k, 3.8), squeeze=False)
    image = None
    for ax, (name, (centres, p)) in zip(axes[0], densities.items()):
        if outlines is not None:
            from matplotlib.collections import PolyCollection

            cells = PolyCollection(list(outlines[name]), array=np.asarray(p), cmap="magma", linewidths=0)
            cells.set_clim(0, 1)
            image = ax.add_collection(cells)
            corners = np.asarray(outlines[name]).reshape(-1, 2)
            if len(corners):
                ax.set_xlim(corners[:, 0].min() - 0.5, corners[:, 0].max() + 0.5)
                ax.set_ylim(corners[:, 1].min() - 0.5, corners[:, 1].max() + 0.5)
                _tile_icon(ax, np.asarray(outlines[name])[0])
        else:
            size = max(2.0, 3000.0 / max(len(p), 1))
            image = ax.scatter(centres[:, 0], centres[:, 1], c=p, s=size, cmap="magma", vmin=0, vmax=1,
                               linewidths=0)
        for line in curves or []:
            ax.plot(line[:, 0], line[:, 1], color=palette.PREDICTED, lw=0.8)
        ax.set_title((labels or {}).get(name, name), fontsize=9)
        ax.set_aspect("equal")
        ax.set_axis_off()
    if image is not None:
        fig.colorbar(image, ax=list(axes[0]), shrink=0.8, label="probability")
    if title:
        fig.suptitle(title, fontsize=9)
    try:
        fig.savefig(path, dpi=dpi, bbox_inches="tight")
    finally:
        plt.close(fig)
    return str(path)
