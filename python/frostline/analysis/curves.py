"""Curves: points on conics, and the distance between an empirical boundary and a theory curve."""
from __future__ import annotations

from typing import Callable, Optional, Sequence, Union

import numpy as np

from ..toolkit.curves import conic_points

__all__ = ["conic_points", "curve_distance"]


def _densify(curve: np.ndarray, spacing: float) -> np.ndarray:
    pts = [curve[:1]]
    for p, q in zip(curve[:-1], curve[1:]):
        k = max(1, int(np.ceil(np.hypot(*(q - p)) / spacing)))
        t = np.linspace(0, 1, k + 1)[1:, None]
        pts.append(p + t * (q - p))
    return np.concatenate(pts)


def curve_distance(empirical: Union[np.ndarray, Sequence[np.ndarray]], theory: Union[np.ndarray, Sequence[np.ndarray]],
                   spacing: float = 0.002, exclude: Optional[Callable[[np.ndarray], np.ndarray]] = None) -> float:
    """Largest distance from either curve to the other (symmetric Hausdorff distance).

    ``empirical`` and ``theory`` are each a polyline or a list of them (never
    joined to each other); both curves are densified to
    ``spacing`` (in the curves' units, e.g. scaled by the region size).
    ``exclude(points) -> bool mask`` drops points of either curve as starting
    points of the comparison (e.g. those next to the region's edge, where the
    liquid region touches the boundary and a finite sample cannot show the
    tangency); distances are still measured to the whole other curve, so
    leaving points out can only lower the distance.
    """
    lines = [empirical] if isinstance(empirical, np.ndarray) else list(empirical)
    if not lines:
        raise ValueError("the empirical boundary is empty")
    a = np.concatenate([_densify(np.asarray(line, float), spacing) for line in lines])
    others = [theory] if isinstance(theory, np.ndarray) else list(theory)
    if not others:
        raise ValueError("the theory curve is empty")
    b = np.concatenate([_densify(np.asarray(line, float), spacing) for line in others])
    a_from, b_from = a, b
    if exclude is not None:
        a_from, b_from = a[~exclude(a)], b[~exclude(b)]
        if len(a_from) == 0 or len(b_from) == 0:
            raise ValueError("every point was excluded from the comparison")

    def directed(p: np.ndarray, q: np.ndarray) -> float:
        worst = 0.0
        for chunk in np.array_split(p, max(1, len(p) // 2000)):
            d = np.sqrt(((chunk[:, None, :] - q[None, :, :]) ** 2).sum(-1)).min(axis=1)
            worst = max(worst, float(d.max()))
        return worst

    return max(directed(a_from, b), directed(b_from, a))
