"""Height functions over an ensemble: mean, variance, variance at chosen points (any plugin)."""
from __future__ import annotations

from typing import Sequence, Tuple

import numpy as np


def height_statistics(samples: Sequence) -> Tuple[np.ndarray, np.ndarray]:
    """(mean, variance) of the height arrays of the samples, entry by entry (ddof = 1)."""
    stack = np.stack([np.asarray(s.heights, dtype=float) for s in samples])
    if len(stack) < 2:
        raise ValueError("need at least two samples for a variance")
    return stack.mean(axis=0), stack.var(axis=0, ddof=1)


def variance_at(samples: Sequence, points: Sequence[Tuple[int, ...]]) -> np.ndarray:
    """Variance of the height at each index tuple in ``points`` (array indices of ``Sample.heights``)."""
    _, var = height_statistics(samples)
    return np.array([var[tuple(p)] for p in points])
