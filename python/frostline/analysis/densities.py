"""Local densities of each tile class, from one sample or an ensemble (any plugin)."""
from __future__ import annotations

from dataclasses import dataclass
from typing import Any, Callable, Dict, Iterator, Sequence, Tuple, Union

import numpy as np

from .._limits import check_memory

Samples = Union[Any, Sequence[Any]]  # one frostline.Sample or several


def _as_list(samples: Samples) -> list:
    if hasattr(samples, "tiles"):
        return [samples]
    out = list(samples)
    if not out:
        raise ValueError("need at least one sample")
    return out


def each_sample(samples: Samples) -> Iterator[Any]:
    """The samples one at a time, holding none of them: one Sample, a list, an ensemble (members read from
    its store as they are needed) or any iterable. Raises ValueError when there is none."""
    if hasattr(samples, "tiles"):
        yield samples
        return
    empty = True
    for sample in samples:
        empty = False
        yield sample
    if empty:
        raise ValueError("need at least one sample")


def _centres_and_classes(sample) -> Tuple[np.ndarray, np.ndarray]:
    region = sample.region
    return region.tile_centres(sample.tiles), np.asarray(region.classify(sample.tiles), dtype=np.int64)


def local_densities(samples: Samples, centre: Tuple[float, float], radius: float) -> Dict[str, Tuple[float, float]]:
    """Fraction of tiles of each class among those centred within ``radius`` of ``centre`` (plane coordinates).

    Returns ``{class name: (mean over samples, standard error of that mean)}``.
    The samples are read one at a time (an ensemble's store is streamed).
    """
    names: Tuple[str, ...] = ()
    per_sample = []
    for s in each_sample(samples):
        names = names or tuple(s.region.tile_classes)
        centres, classes = _centres_and_classes(s)
        near = np.hypot(centres[:, 0] - centre[0], centres[:, 1] - centre[1]) <= radius
        if not near.any():
            raise ValueError(f"no tile centre lies within {radius} of {centre}")
        per_sample.append(np.bincount(classes[near], minlength=len(names)) / near.sum())
    f = np.array(per_sample)
    se = f.std(axis=0, ddof=1) / np.sqrt(len(f)) if len(f) > 1 else np.full(f.shape[1], np.nan)
    return {name: (float(f[:, k].mean()), float(se[k])) for k, name in enumerate(names)}


@dataclass(frozen=True)
class DensityGrid:
    """Class fractions on a square grid of bins covering the region (plane coordinates).

    ``fractions[k, i, j]`` is the fraction of tiles of class k among the tiles
    centred in bin (i, j) (x index i, y index j), pooled over the samples;
    ``counts[i, j]`` the number of tiles there (0 outside the region).
    """

    x: np.ndarray          # bin centres along x
    y: np.ndarray          # bin centres along y
    fractions: np.ndarray  # (classes, nx, ny); NaN where no tile
    counts: np.ndarray     # (nx, ny)
    classes: Tuple[str, ...]


def _smooth(a: np.ndarray, sigma_bins: float) -> np.ndarray:
    """Separable Gaussian smoothing along the last two axes (zero outside the grid)."""
    if sigma_bins <= 0:
        return a
    half = int(np.ceil(3 * sigma_bins))
    t = np.arange(-half, half + 1)
    kernel = np.exp(-0.5 * (t / sigma_bins) ** 2)
    kernel /= kernel.sum()
    # "full" then crop: "same" would return the kernel's length when it is the longer one
    def smooth(v: np.ndarray) -> np.ndarray:
        return np.convolve(v, kernel, mode="full")[half:half + len(v)]

    out = np.apply_along_axis(smooth, -1, a)
    return np.apply_along_axis(smooth, -2, out)


def density_grid(samples: Samples, bin_size: float, smoothing: float = 0.0) -> DensityGrid:
    """Pool tile centres of the samples into square bins of side ``bin_size`` (plane units).

    ``smoothing`` (plane units) is the width of a Gaussian window applied to
    the counts before taking fractions: with one sample, a window of a few
    lattice spacings is needed to tell liquid from frozen. Bins whose smoothed
    tile count is below a quarter of the typical one count as outside the region.
    """
    samples = _as_list(samples)
    if not bin_size > 0:
        raise ValueError("bin_size must be positive")
    if smoothing < 0:
        raise ValueError("smoothing must be non-negative")
    data = [_centres_and_classes(s) for s in samples]
    allc = np.concatenate([c for c, _ in data])
    lo, hi = allc.min(axis=0) - 1e-9, allc.max(axis=0) + 1e-9
    nx = max(1, int(np.ceil((hi[0] - lo[0]) / bin_size)))
    ny = max(1, int(np.ceil((hi[1] - lo[1]) / bin_size)))
    names = samples[0].region.tile_classes
    # the tally, its smoothing and the fractions: about four float arrays of classes x bins
    check_memory(4 * 8 * len(names) * nx * ny, f"a {nx}x{ny} density grid (bin_size {bin_size:g})")
    tally = np.zeros((len(names), nx, ny))
    for centres, classes in data:
        i = np.clip(((centres[:, 0] - lo[0]) / bin_size).astype(int), 0, nx - 1)
        j = np.clip(((centres[:, 1] - lo[1]) / bin_size).astype(int), 0, ny - 1)
        np.add.at(tally, (classes, i, j), 1.0)
    if smoothing > 0:
        tally = _smooth(tally, smoothing / bin_size)
    counts = tally.sum(axis=0)
    inside = counts > 0.25 * np.median(counts[counts > 0]) if np.any(counts > 0) else counts > 0
    with np.errstate(invalid="ignore", divide="ignore"):
        fractions = np.where(inside, tally / np.where(counts > 0, counts, 1), np.nan)
    counts = np.where(inside, counts, 0.0)
    x = lo[0] + (np.arange(nx) + 0.5) * bin_size
    y = lo[1] + (np.arange(ny) + 0.5) * bin_size
    return DensityGrid(x, y, fractions, counts, tuple(names))


def tile_counts(region: Any, bin_size: float) -> Callable[[Any], np.ndarray]:
    """A reducer for :func:`frostline.ensemble`: per sample, the tiles of each class counted on a fixed grid.

    The grid covers the region's tile centres (taken from its least
    configuration) with square bins of side ``bin_size`` (plane units); the
    reducer returns int64 counts of shape (classes, nx, ny), so an ensemble sums
    them exactly. Class fractions: counts / counts.sum(axis=0).
    """
    if not bin_size > 0:
        raise ValueError("bin_size must be positive")
    least = region.extreme_heights()[0]
    centres = region.tile_centres(region.tiles_from_heights(least))
    lo = centres.min(axis=0) - 1e-9
    hi = centres.max(axis=0) + 1e-9
    nx = max(1, int(np.ceil((hi[0] - lo[0]) / bin_size)))
    ny = max(1, int(np.ceil((hi[1] - lo[1]) / bin_size)))
    classes = len(region.tile_classes)
    check_memory(8 * classes * nx * ny, f"a {nx}x{ny} grid of tile counts (bin_size {bin_size:g})")

    def count(sample: Any) -> np.ndarray:
        c = sample.region.tile_centres(sample.tiles)
        k = np.asarray(sample.region.classify(sample.tiles), dtype=np.int64)
        i = np.clip(((c[:, 0] - lo[0]) / bin_size).astype(np.int64), 0, nx - 1)
        j = np.clip(((c[:, 1] - lo[1]) / bin_size).astype(np.int64), 0, ny - 1)
        out = np.zeros((classes, nx, ny), dtype=np.int64)
        np.add.at(out, (k, i, j), 1)
        return out

    return count
