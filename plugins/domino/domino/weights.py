"""Edge weights of domino positions, and the helpers for common weightings.

``horizontal[r, c]`` weighs the domino on cells (r, c), (r, c+1): shape (R, C-1).
``vertical[r, c]`` weighs the domino on cells (r, c), (r+1, c): shape (R-1, C).
A tiling's weight is the product of its dominoes' weights.
"""
from __future__ import annotations

import numbers
from typing import Optional, Tuple

import numpy as np

Weights = Tuple[np.ndarray, np.ndarray]


def check_weights(horizontal, vertical, shape: Tuple[int, int]) -> Optional[Weights]:
    """Validated float64 copies, or None when both are None (uniform)."""
    if horizontal is None and vertical is None:
        return None
    R, C = shape
    out = []
    for name, value, want in (("horizontal", horizontal, (R, C - 1)), ("vertical", vertical, (R - 1, C))):
        if value is None:
            value = np.ones(want)
        a = np.asarray(value)
        if a.dtype == object or not (np.issubdtype(a.dtype, np.number) or a.dtype == bool):
            raise TypeError(f"{name} weights must be a numeric array, got dtype {a.dtype}")
        a = a.astype(np.float64)
        if a.shape != want:
            raise ValueError(f"{name} weights must have shape {want} for a {R}x{C} mask "
                             f"({name} domino positions), got {a.shape}")
        if not np.all(np.isfinite(a)) or np.any(a <= 0):
            raise ValueError(f"{name} weights must be finite and positive (no NaN, infinity or zero)")
        out.append(a)
    filled = [w for w in out if w.size]  # no concatenated copy: the memory estimate counts two arrays
    if filled:
        span = max(w.max() for w in filled) / min(w.min() for w in filled)
        if span > 1e100:
            raise ValueError(f"the weights span {span:.3g} (more than 1e100), beyond what double "
                             "precision handles in the local rule; rescale them or merge the extreme ones")
    return out[0], out[1]


def biased(shape: Tuple[int, int], a: float) -> Weights:
    """Every vertical domino weighs ``a``, every horizontal one 1."""
    a = _positive(a, "a")
    R, C = shape
    return np.ones((R, C - 1)), np.full((R - 1, C), a)


def two_periodic(shape: Tuple[int, int], a: float, b: float) -> Weights:
    """Two-periodic weights (docs/references.md section 2, stated in mask coordinates).

    Each domino position borders exactly one cell corner (r, c) with r + c
    even (the corners at the ends of the edge the domino covers); the position
    weighs ``a`` when that corner's row r is even and ``b`` when it is odd. A
    horizontal domino at (r, c) covers the edge from corner (r, c+1) to (r+1, c+1);
    a vertical one at (r, c) the edge from (r+1, c) to (r+1, c+1).
    """
    a, b = _positive(a, "a"), _positive(b, "b")
    R, C = shape
    r, c = np.meshgrid(np.arange(R), np.arange(C - 1), indexing="ij")
    even_row = np.where((r + c + 1) % 2 == 0, r, r + 1)
    horizontal = np.where(even_row % 2 == 0, a, b)
    r, c = np.meshgrid(np.arange(R - 1), np.arange(C), indexing="ij")
    vertical = np.where((r + 1) % 2 == 0, a, b) * np.ones_like(c, dtype=float)
    return horizontal.astype(float), vertical.astype(float)


def face_parity(tiles: np.ndarray) -> np.ndarray:
    """0 or 1 per domino: the row parity of the corner with even r + c at an end of the edge it covers.

    This is the face of :func:`two_periodic`: 0 where those weights give ``a``, 1 where they give ``b``.
    """
    t = np.asarray(tiles, dtype=np.int64).reshape(-1, 2, 2)
    r, c = t[:, :, 0].min(axis=1), t[:, :, 1].min(axis=1)
    horizontal = t[:, 0, 0] == t[:, 1, 0]
    corner_row = np.where(horizontal, np.where((r + c + 1) % 2 == 0, r, r + 1), r + 1)
    return (corner_row % 2).astype(np.int8)


def _positive(x, name: str) -> float:
    if isinstance(x, bool) or not isinstance(x, numbers.Real):
        raise TypeError(f"{name} must be a real number, got {type(x).__name__}")
    x = float(x)
    if not np.isfinite(x) or x <= 0:
        raise ValueError(f"{name} must be finite and positive, got {x}")
    return x


def flip_thresholds(weights: Weights, sites_rc: np.ndarray) -> np.ndarray:
    """Per free corner, the chance (as a uint64 threshold over 2^64) of the higher height.

    At corner (r, c) the two local configurations are the horizontal pair
    (dominoes at horizontal[r-1, c-1], horizontal[r, c-1]) and the vertical pair
    (vertical[r-1, c-1], vertical[r-1, c]). With Thurston's orientation the
    horizontal pair is the higher height when r + c is even, the vertical pair
    when r + c is odd. Probabilities are ratios of products of weights in
    float64 (relative error about 1e-16), turned into integer thresholds.
    """
    horizontal, vertical = weights
    r, c = sites_rc[:, 0], sites_rc[:, 1]
    # ratio of the lower pair's weight to the higher pair's, as a product of ratios: no overflow
    # for weights within the 1e100 span check_weights allows (products could reach 1e200 each)
    h1, h2 = horizontal[r - 1, c - 1], horizontal[r, c - 1]
    v1, v2 = vertical[r - 1, c - 1], vertical[r - 1, c]
    even = (r + c) % 2 == 0
    ratio = np.where(even, (v1 / h1) * (v2 / h2), (h1 / v1) * (h2 / v2))
    return probability_thresholds(1.0 / (1.0 + ratio))


def probability_thresholds(p: np.ndarray) -> np.ndarray:
    """Integer thresholds over 2^64 for probabilities p, kept within [1, 2^64 - 1].

    A threshold of 0 or 2^64 would forbid one of the two moves at a site, so the
    chain could no longer reach every configuration and coupling from the past
    would never coalesce; clamping changes each probability by at most 2^-64.
    """
    p = np.asarray(p, dtype=float)
    if np.any(np.isnan(p)):
        raise ValueError("a local probability is not a number; check the weights")
    scaled = np.ldexp(np.clip(p, 0.0, 1.0), 64)
    out = np.empty(len(p), dtype=np.uint64)
    full = scaled >= 2.0**64
    out[full] = np.uint64(2**64 - 1)
    out[~full] = np.maximum(scaled[~full], 1.0).astype(np.uint64)
    return out
