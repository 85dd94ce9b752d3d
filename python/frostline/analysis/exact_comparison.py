"""Samples against exact placement probabilities, position by position.

For every possible tile position the frequency in ``k`` independent exact
samples is compared with the exact probability p from the inverse Kasteleyn
matrix: z = (f - p) / sqrt(p (1 - p) / k). The summary is aware of multiple
testing: the smallest two-sided p-value over all m positions, times m
(Bonferroni; valid whatever the dependence between positions, which is
strong here since the tiles at a vertex sum to one), so a correct sampler
gives ``bonferroni_p`` below a floor alpha with probability at most alpha.
Works for any plugin whose regions have ``dimer_system()``.
"""
from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any, Sequence

import numpy as np


@dataclass(frozen=True)
class ExactComparison:
    """Tile frequencies of samples next to exact probabilities (see the module docstring)."""

    tiles: np.ndarray          # every possible tile position, in the layout of Sample.tiles
    probabilities: np.ndarray  # exact probability of each position
    frequencies: np.ndarray    # fraction of the samples holding it
    z: np.ndarray              # standardised differences (0 where p is 0 or 1)
    samples: int
    max_abs_z: float
    bonferroni_p: float        # min(1, m * smallest two-sided p-value)
    mean_square_z: float       # about 1 for a correct sampler

    def __str__(self) -> str:
        return (f"{self.samples} samples, {len(self.tiles)} tile positions: max |z| = {self.max_abs_z:.3g}, "
                f"Bonferroni p = {self.bonferroni_p:.3g}, mean z^2 = {self.mean_square_z:.3g}")


def _keys(tiles: np.ndarray) -> list:
    t = np.asarray(tiles)
    return [tuple(row) for row in t.reshape(len(t), -1).tolist()]


def compare_with_exact(samples: Sequence[Any], tolerance: float = 1e-6) -> ExactComparison:
    """z-scores of the samples' tile frequencies against exact placement probabilities.

    ``samples``: exact samples of one region (a list of :class:`frostline.Sample`,
    an ensemble, or any iterable: they are read one at a time, so an
    ensemble's store is streamed). Raises ValueError for no samples, samples
    of different regions, or a region without exact placement probabilities.
    """
    from ..exact import placement_probabilities
    from .densities import each_sample

    region = None
    k = 0
    for sample in each_sample(samples):
        if region is None:
            region = sample.region
            tiles, p = placement_probabilities(region, tolerance)
            index = {key: i for i, key in enumerate(_keys(tiles))}
            counts = np.zeros(len(tiles))
        elif sample.region is not region:
            raise ValueError("all samples must be of one region object (draw them with region.samples(k))")
        k += 1
        rows = [index.get(key, -1) for key in _keys(sample.tiles)]
        if min(rows, default=0) < 0:
            raise ValueError("a sample holds a tile position the region's Kasteleyn matrix does not have")
        counts[rows] += 1
    f = counts / k
    spread = np.sqrt(np.clip(p * (1 - p), 0, None) / k)
    with np.errstate(divide="ignore", invalid="ignore"):
        z = np.where(spread > 0, (f - p) / np.where(spread > 0, spread, 1), 0.0)
    worst = float(np.max(np.abs(z))) if z.size else 0.0
    tested = int(np.count_nonzero(spread > 0))
    smallest_p = math.erfc(worst / math.sqrt(2))  # two-sided normal tail
    return ExactComparison(tiles=tiles, probabilities=p, frequencies=f, z=z, samples=k, max_abs_z=worst,
                           bonferroni_p=min(1.0, max(tested, 1) * smallest_p),
                           mean_square_z=float(np.mean(z[spread > 0] ** 2)) if tested else 0.0)
