"""Height fluctuations of exact samples against the Gaussian free field, for any lattice.

Works on :meth:`frostline.Sample.height_field` (the dimer normalisation:
the height changes by 1 around a vertex of the dimer graph). There the
fluctuations converge to a Gaussian free field (Kenyon, "Dominos and the
Gaussian free field", Ann. Probab. 29, 2001; "Height fluctuations in the
honeycomb dimer model", Comm. Math. Phys. 281, 2008):

- the variance at a point grows like (1 / (2 pi^2)) log n with the size n;
- the variance of a difference grows like (1 / pi^2) log(dist(x, y)) for
  1 << dist(x, y) << n.

Both converge slowly (docs/references.md, section 4: over n = 8..64 the
exact pointwise slope is 0.0626 against 0.0507), so :func:`variance_growth`
fits the asymptote with 1/n corrections. Error bars are bootstrap standard
errors over the samples (fixed seed).
"""
from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any, Mapping, Optional, Tuple

import numpy as np

POINTWISE_SLOPE = 1.0 / (2.0 * math.pi ** 2)   # per unit of log n
TWO_POINT_SLOPE = 1.0 / math.pi ** 2           # per unit of log |x - y|


@dataclass(frozen=True)
class Fluctuations:
    """Pointwise and two-point height variances of an ensemble, with bootstrap standard errors."""

    centre: Tuple[int, ...]
    samples: int
    pointwise_variance: float
    pointwise_error: float
    distances: np.ndarray           # in array steps along ``direction``
    two_point_variance: np.ndarray  # Var(h(centre + d) - h(centre)), both sides averaged
    two_point_error: np.ndarray
    slope: float                    # fitted d Var / d log d over 2 <= d <= (largest distance) / 2
    slope_error: float
    predicted_slope: float = TWO_POINT_SLOPE


def _columns(samples: Any, points: Any) -> Tuple[Tuple[int, ...], np.ndarray]:
    """(field shape, heights (k, m) at the m points ``points(field)`` chooses from the first sample's field).

    The samples are read one at a time and only the m heights of each are
    kept, so an ensemble's store is streamed whatever the region's size.
    """
    from .densities import each_sample

    rows, chosen, shape = [], None, ()
    for sample in each_sample(samples):
        field = np.asarray(sample.height_field(), dtype=float)
        if chosen is None:
            shape, chosen = field.shape, points(field)
            index = tuple(np.array(axis) for axis in zip(*chosen)) if chosen else None
        elif field.shape != shape:
            raise ValueError(f"the samples' height fields differ in shape ({field.shape} vs {shape}): "
                             "use samples of one region")
        rows.append(field[index] if index is not None else np.zeros(0))
    if len(rows) < 3:
        raise ValueError("height fluctuations need at least three samples")
    return shape, np.array(rows)


def _slope(distances: np.ndarray, variances: np.ndarray) -> float:
    # 1 << d << n: leave out the lattice scale (d = 1) and the largest distance, which feels the edge
    use = (distances >= 2) & (distances <= distances.max(initial=0) / 2)
    if np.count_nonzero(use) < 2:
        return float("nan")
    x = np.log(distances[use])
    return float(np.polyfit(x, variances[use], 1)[0])


def height_fluctuations(samples: Any, centre: Optional[Tuple[int, ...]] = None,
                        direction: Tuple[int, ...] = (0, 1), bootstrap: int = 200,
                        seed: int = 0) -> Fluctuations:
    """Pointwise variance at ``centre`` and two-point variances along ``direction``.

    ``centre`` (array indices of the height field) defaults to the middle of
    the array; distances are 1, 2, 4, 8, ... array steps while both
    ``centre +- d * direction`` stay inside the region. Bootstrap: ``bootstrap``
    resamplings of the samples with a fixed ``seed``. ``samples``: a list, an
    ensemble (its store streamed: only the heights at those points are kept)
    or any iterable of samples of one region.
    """
    step = np.asarray(direction, dtype=int)
    plan: dict = {}

    def points(field: np.ndarray) -> list:
        shape = field.shape
        c = tuple(int(v) // 2 for v in shape) if centre is None else tuple(int(v) for v in centre)
        if len(c) != len(shape) or any(not 0 <= x < n for x, n in zip(c, shape)):
            raise ValueError(f"centre {c} is not an index of the {shape} height field")
        if np.isnan(field[c]):
            raise ValueError(f"centre {c} lies outside the region")
        distances, pairs = [], []
        d = 1
        while True:
            pair = [tuple(int(v) for v in np.asarray(c) + sign * d * step) for sign in (1, -1)]
            if not all(all(0 <= x < n for x, n in zip(q, shape)) and not np.isnan(field[q]) for q in pair):
                break
            distances.append(d)
            pairs.append(pair)
            d *= 2
        plan.update(centre=c, distances=distances)
        return [c] + [q for pair in pairs for q in pair]

    _, values = _columns(samples, points)
    c = plan["centre"]
    distances_a = np.array(plan["distances"], dtype=float)

    def two_point(v: np.ndarray) -> np.ndarray:
        here = v[:, 0]
        return np.array([np.mean([np.var(v[:, 1 + 2 * j + side] - here, ddof=1) for side in (0, 1)])
                         for j in range(len(distances_a))])

    pointwise = float(np.var(values[:, 0], ddof=1))
    two = two_point(values)
    rng = np.random.default_rng(seed)
    boot_point, boot_two, boot_slope = [], [], []
    for _ in range(bootstrap):
        pick = values[rng.integers(0, len(values), size=len(values))]
        boot_point.append(np.var(pick[:, 0], ddof=1))
        resampled = two_point(pick)
        boot_two.append(resampled)
        boot_slope.append(_slope(distances_a, resampled))
    two_error = np.std(np.array(boot_two), axis=0, ddof=1) if len(distances_a) else np.zeros(0)
    return Fluctuations(centre=c, samples=len(values), pointwise_variance=pointwise,
                        pointwise_error=float(np.std(boot_point, ddof=1)), distances=distances_a,
                        two_point_variance=two, two_point_error=two_error,
                        slope=_slope(distances_a, two), slope_error=float(np.nanstd(boot_slope, ddof=1)))


def variance_growth(variances: Mapping[int, float], corrections: int = 2) -> Tuple[float, np.ndarray]:
    """(slope b, all coefficients) of Var(n) = a + b log n + c1 / n + ... + c_k / n^k, least squares.

    ``variances`` maps sizes n to the variance at the centre (measured or
    exact); ``corrections`` is k. Compare b with :data:`POINTWISE_SLOPE`.
    """
    sizes = np.array(sorted(variances), dtype=float)
    if len(sizes) < 2 + corrections:
        raise ValueError(f"need at least {2 + corrections} sizes for {corrections} corrections")
    values = np.array([variances[int(n)] for n in sizes], dtype=float)
    columns = [np.ones_like(sizes), np.log(sizes)] + [sizes ** -(j + 1) for j in range(corrections)]
    coefficients = np.linalg.lstsq(np.stack(columns, axis=1), values, rcond=None)[0]
    return float(coefficients[1]), coefficients
