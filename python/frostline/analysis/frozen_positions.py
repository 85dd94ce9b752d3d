"""Where the frozen region ends along a line, sample by sample: the statistics of the frozen boundary.

For a line that starts inside a frozen region and crosses the frozen
boundary away from its points of tangency with the region's sides, the
position of the last frozen tile fluctuates on the scale n^(1/3), and the
fluctuation, centred and scaled, tends to the Tracy-Widom GUE law
(Johansson, "The arctic circle boundary and the Airy process", Ann. Probab.
33, 2005, for the Aztec diamond; the same Airy edge appears for lozenge
regions). Here: for each sample, the tiles whose centres lie within
``width`` of the line are ordered along it; the frozen class is the class
of the first of them; the position is the distance along the line of the last
tile of that class before the first tile of another class. Works for any
plugin (``tile_centres``, ``classify``) and names no lattice.

Centring and scale: Johansson's constants are not built in. The mean is
compared with a predicted crossing point (for example where the line meets
``region.limit_shape().frozen_boundary`` or a published ``arctic_curve``),
and the standardised positions with F2 (:func:`tracy_widom_cdf`) by their
Kolmogorov distance after matching mean and deviation (a shape check, not a
test of the constants).
"""
from __future__ import annotations

import math
from dataclasses import dataclass
from functools import lru_cache
from typing import Optional, Sequence, Tuple

import numpy as np

from .densities import Samples, _as_list
from .tracy_widom import tracy_widom_cdf, tracy_widom_moments


@dataclass(frozen=True)
class FrozenPositions:
    """Positions (plane units along the line, from its start) of the last frozen tile in each sample."""

    positions: np.ndarray
    frozen_class: str
    scale: float                   # the region's scale n

    @property
    def mean(self) -> float:
        return float(self.positions.mean())

    @property
    def deviation(self) -> float:
        return float(self.positions.std(ddof=1)) if len(self.positions) > 1 else float("nan")

    @property
    def scaled_deviation(self) -> float:
        """deviation / n^(1/3): tends to a constant where the Airy scaling holds."""
        return self.deviation / self.scale ** (1.0 / 3.0)

    def tracy_widom_distance(self) -> float:
        """Kolmogorov distance between the positions, matched in mean and deviation, and F2.

        The sign is chosen so that the far tail of F2 points into the liquid
        region (the frozen region ends later than its typical point less often
        than earlier, or the reverse; both orientations are tried and the
        smaller distance kept).
        """
        mean, variance = tracy_widom_moments()
        z = (self.positions - self.mean) / self.deviation
        best = math.inf
        for sign in (1.0, -1.0):
            s = np.sort(sign * z * math.sqrt(variance) + mean)
            grid, table = _f2_table()
            cdf = np.interp(s, grid, table)
            k = np.arange(1, len(s) + 1) / len(s)
            best = min(best, float(max(np.max(np.abs(k - cdf)), np.max(np.abs(k - 1.0 / len(s) - cdf)))))
        return best


@lru_cache(maxsize=1)
def _f2_table() -> Tuple[np.ndarray, np.ndarray]:
    """F2 on [-9, 8] at spacing 0.05 (interpolated linearly: error below 1e-4)."""
    grid = np.linspace(-9.0, 8.0, 341)
    return grid, np.array([tracy_widom_cdf(v) for v in grid])


def frozen_positions(samples: Samples, start: Sequence[float], direction: Sequence[float],
                     width: float = 0.5, frozen_class: Optional[str] = None) -> FrozenPositions:
    """The position of the last frozen tile along the line ``start + t * direction`` (t >= 0) in each sample.

    ``start`` and ``direction`` are in plane coordinates (the frame of
    ``region.tile_centres``); ``width``: half-width of the strip of tiles
    read (plane units). ``frozen_class``: the class that is frozen at the
    start (default: the class of the first tile on the line in each sample).
    Raises ValueError when no tile lies on the line.
    """
    samples = _as_list(samples)
    p0 = np.asarray(start, dtype=float)
    d = np.asarray(direction, dtype=float)
    if p0.shape != (2,) or d.shape != (2,) or not np.hypot(*d) > 0:
        raise ValueError("start and direction must be two numbers each, with a non-zero direction")
    if not width > 0:
        raise ValueError("width must be positive")
    d = d / np.hypot(*d)
    normal = np.array([-d[1], d[0]])
    region = samples[0].region
    names = region.tile_classes
    if frozen_class is not None and frozen_class not in names:
        raise ValueError(f"frozen_class must be one of {', '.join(names)}, got {frozen_class!r}")
    positions = []
    chosen = frozen_class
    for sample in samples:
        centres = region.tile_centres(sample.tiles)
        classes = np.asarray(region.classify(sample.tiles))
        rel = centres - p0
        along, across = rel @ d, rel @ normal
        on = (np.abs(across) <= width) & (along >= 0)
        if not on.any():
            raise ValueError("no tile centre lies within width of the line; move the line or widen the strip")
        order = np.argsort(along[on])
        t, k = along[on][order], classes[on][order]
        target = names.index(chosen) if chosen is not None else int(k[0])
        chosen = names[target]
        other = np.flatnonzero(k != target)
        last = other[0] - 1 if len(other) else len(k) - 1
        positions.append(t[last] if last >= 0 else 0.0)
    return FrozenPositions(np.array(positions), str(chosen), float(region.scale))


def crossing(curves: Sequence[np.ndarray], start: Sequence[float], direction: Sequence[float]) -> Tuple[float, bool]:
    """(t, found): the first t >= 0 where ``start + t * direction/|direction|`` meets one of the polylines."""
    p0 = np.asarray(start, dtype=float)
    d = np.asarray(direction, dtype=float)
    d = d / np.hypot(*d)
    best = math.inf
    for line in curves:
        a, b = np.asarray(line[:-1], float), np.asarray(line[1:], float)
        e = b - a
        denominator = d[0] * e[:, 1] - d[1] * e[:, 0]
        ok = np.abs(denominator) > 1e-15
        w = a - p0
        t = np.where(ok, (w[:, 0] * e[:, 1] - w[:, 1] * e[:, 0]) / np.where(ok, denominator, 1.0), np.inf)
        s = np.where(ok, (w[:, 0] * d[1] - w[:, 1] * d[0]) / np.where(ok, denominator, 1.0), -1.0)
        hit = ok & (t >= 0) & (s >= 0) & (s <= 1)
        if hit.any():
            best = min(best, float(t[hit].min()))
    return (best, True) if math.isfinite(best) else (float("nan"), False)
