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
from typing import Mapping, Optional, Sequence, Tuple

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


def _fields(samples: Sequence) -> np.ndarray:
    stack = np.stack([np.asarray(s.height_field(), dtype=float) for s in samples])
    if len(stack) < 3:
        raise ValueError("height fluctuations need at least three samples")
    return stack


def _column(stack: np.ndarray, point: Sequence[int]) -> np.ndarray:
    """The heights at one point of the field, across the samples."""
    return stack[(slice(None),) + tuple(int(v) for v in point)]


def _two_point(stack: np.ndarray, centre: Tuple[int, ...], offsets: Sequence[Sequence[Tuple[int, ...]]]) -> np.ndarray:
    here = _column(stack, centre)
    out = []
    for pair in offsets:
        values = [np.var(_column(stack, p) - here, ddof=1) for p in pair]
        out.append(float(np.mean(values)))
    return np.array(out)


def _slope(distances: np.ndarray, variances: np.ndarray) -> float:
    # 1 << d << n: leave out the lattice scale (d = 1) and the largest distance, which feels the edge
    use = (distances >= 2) & (distances <= distances.max(initial=0) / 2)
    if np.count_nonzero(use) < 2:
        return float("nan")
    x = np.log(distances[use])
    return float(np.polyfit(x, variances[use], 1)[0])


def height_fluctuations(samples: Sequence, centre: Optional[Tuple[int, ...]] = None,
                        direction: Tuple[int, ...] = (0, 1), bootstrap: int = 200,
                        seed: int = 0) -> Fluctuations:
    """Pointwise variance at ``centre`` and two-point variances along ``direction``.

    ``centre`` (array indices of the height field) defaults to the middle of
    the array; distances are 1, 2, 4, 8, ... array steps while both
    ``centre +- d * direction`` stay inside the region. Bootstrap: ``bootstrap``
    resamplings of the samples with a fixed ``seed``.
    """
    stack = _fields(samples)
    shape = stack.shape[1:]
    centre = tuple(int(v) // 2 for v in shape) if centre is None else tuple(int(v) for v in centre)
    if len(centre) != len(shape) or any(not 0 <= c < n for c, n in zip(centre, shape)):
        raise ValueError(f"centre {centre} is not an index of the {shape} height field")
    if np.isnan(_column(stack, centre)[0]):
        raise ValueError(f"centre {centre} lies outside the region")
    step = np.asarray(direction, dtype=int)
    distances, offsets = [], []
    d = 1
    while True:
        pair = [tuple(np.asarray(centre) + sign * d * step) for sign in (1, -1)]
        if not all(all(0 <= c < n for c, n in zip(p, shape)) and not np.isnan(_column(stack, p)[0]) for p in pair):
            break
        distances.append(d)
        offsets.append(pair)
        d *= 2
    distances_a = np.array(distances, dtype=float)
    pointwise = float(np.var(_column(stack, centre), ddof=1))
    two_point = _two_point(stack, centre, offsets)
    rng = np.random.default_rng(seed)
    boot_point, boot_two, boot_slope = [], [], []
    for _ in range(bootstrap):
        pick = stack[rng.integers(0, len(stack), size=len(stack))]
        boot_point.append(np.var(_column(pick, centre), ddof=1))
        values = _two_point(pick, centre, offsets)
        boot_two.append(values)
        boot_slope.append(_slope(distances_a, values))
    two_error = np.std(np.array(boot_two), axis=0, ddof=1) if offsets else np.zeros(0)
    return Fluctuations(centre=centre, samples=len(stack), pointwise_variance=pointwise,
                        pointwise_error=float(np.std(boot_point, ddof=1)), distances=distances_a,
                        two_point_variance=two_point, two_point_error=two_error,
                        slope=_slope(distances_a, two_point), slope_error=float(np.nanstd(boot_slope, ddof=1)))


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
