"""Frozen boundaries of several lattices against their theory curves, at several sizes.

Each case is (label, region maker n -> Region). For each size: one exact
sample, its class-density map (Gaussian window of ``smoothing`` lattice units),
the empirical frozen boundary, the published curve, and their distance in
scaled units (the region's ``scale``), leaving out points within ``exclude``
scaled units of the region's edge: there the frozen boundary touches the sides,
and thin frozen strips that a finite sample cannot resolve would dominate the
distance (common practice). Where the plugin has a surface tension
(``Region.limit_shape``), the frozen boundary predicted by the variational
principle is added, with its distances to the published curve and to the
sample; a case with no published curve is compared with the prediction only.
Nothing here knows a lattice by name.
"""
from __future__ import annotations

import time
from dataclasses import dataclass
from typing import Any, Callable, List, Optional, Sequence, Tuple

import numpy as np

from ..toolkit import palette
from .boundary import frozen_boundary, near_edge
from .curves import curve_distance
from .densities import DensityGrid, density_grid


@dataclass
class ComparisonRow:
    label: str
    size: int
    distance: float          # largest distance between the curves, scaled units
    seconds: float           # sampling time
    grid: DensityGrid
    boundary: List[np.ndarray]  # scaled
    theory: Optional[np.ndarray]           # scaled; None where no published curve is built in
    scale: float
    predicted: Optional[List[np.ndarray]] = None   # scaled; None where the lattice has no surface tension
    predicted_vs_theory: float = float("nan")      # largest distance, scaled units
    sample_vs_predicted: float = float("nan")


def compare(cases: Sequence[Tuple[str, Callable[[int], Any]]], sizes: Sequence[int], seed: int = 0,
            smoothing: float = 2.0, tolerance: float = 0.1, exclude: float = 0.05,
            progress: Optional[Callable[[str], None]] = None) -> List[ComparisonRow]:
    """Run every case at every size (one exact sample each); see the module docstring."""
    rows = []
    for label, make in cases:
        for n in sizes:
            if progress:
                progress(f"{label}, size {n}")
            region = make(n)
            started = time.perf_counter()
            sample = region.sample(seed=seed)
            seconds = time.perf_counter() - started
            grid = density_grid(sample, bin_size=0.5, smoothing=smoothing)
            boundary = frozen_boundary(grid, tolerance, scale=region.scale)
            theory = _published(region)
            predicted = _predicted(region)
            # a small sample may show no frozen region at this resolution: no distance then (NaN)
            edge = near_edge(grid, exclude, scale=region.scale) if exclude > 0 else None
            row = ComparisonRow(label, n, _distance(boundary, theory, edge), seconds, grid, boundary, theory,
                                region.scale, predicted)
            if predicted:
                row.predicted_vs_theory = _distance(predicted, theory, edge)
                row.sample_vs_predicted = _distance(boundary, predicted, edge)
            rows.append(row)
    return rows


def _published(region: Any) -> Optional[np.ndarray]:
    try:
        return region.arctic_curve() / region.scale
    except ValueError:
        return None


def _predicted(region: Any) -> Optional[List[np.ndarray]]:
    try:
        return region.limit_shape().frozen_boundary
    except ValueError:        # no surface tension for this lattice or these weights
        return None


def _distance(curves: Optional[List[np.ndarray]], other: Any, edge: Any) -> float:
    if not curves or other is None:
        return float("nan")
    try:
        return curve_distance(curves, other, exclude=edge)
    except ValueError:  # nothing left away from the edge at this size
        return float("nan")


def table(rows: Sequence[ComparisonRow]) -> str:
    """The distances as CSV text: lattice, size, distance (scaled), seconds (quoted where a label needs it)."""
    import csv
    import io

    out = io.StringIO()
    writer = csv.writer(out, lineterminator="\n")
    writer.writerow(["lattice", "size", "distance", "seconds", "predicted_vs_theory", "sample_vs_predicted"])
    for r in rows:
        writer.writerow([r.label, r.size, f"{r.distance:.4f}", f"{r.seconds:.3f}", f"{r.predicted_vs_theory:.4f}",
                         f"{r.sample_vs_predicted:.4f}"])
    return out.getvalue()


def figure(rows: Sequence[ComparisonRow], sizes: Sequence[int]):
    """A matplotlib figure: one row per lattice, one column per size."""
    import matplotlib.pyplot as plt

    labels = list(dict.fromkeys(r.label for r in rows))
    fig, axes = plt.subplots(len(labels), len(sizes), figsize=(3.2 * len(sizes), 3.3 * len(labels)), squeeze=False)
    for r in rows:
        ax = axes[labels.index(r.label)][list(sizes).index(r.size)]
        g = r.grid
        filled = np.where(np.isnan(g.fractions), -np.inf, g.fractions).max(axis=0)
        field = np.where(g.counts > 0, filled, np.nan)
        extent = (g.x[0] / r.scale, g.x[-1] / r.scale, g.y[0] / r.scale, g.y[-1] / r.scale)
        ax.imshow(np.ma.masked_invalid(field).T, origin="lower", extent=extent, cmap="bone", vmin=0.25, vmax=1.0)
        for line in r.boundary:
            ax.plot(line[:, 0], line[:, 1], color=palette.MEASURED, lw=0.9)
        if r.theory is not None:
            closed = np.vstack([r.theory, r.theory[:1]])
            ax.plot(closed[:, 0], closed[:, 1], color=palette.THEORY, lw=0.9, ls="--")
        for line in r.predicted or []:
            ax.plot(line[:, 0], line[:, 1], color=palette.PREDICTED, lw=0.9, ls=":")
        ax.set_title(f"{r.label}, n = {r.size}\ndistance {r.distance:.3f}", fontsize=8)
        ax.set_aspect("equal")
        ax.set_axis_off()
    fig.suptitle("largest class density (light = frozen); red: empirical frozen boundary; violet dashed: published "
                 "curve; yellow dotted: variational prediction", fontsize=8)
    return fig
