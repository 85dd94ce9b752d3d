"""Exact placement probabilities of tiles from the inverse Kasteleyn matrix.

For a bipartite planar dimer model with Kasteleyn matrix K (rows black
vertices, columns white), the probability that the edge b-w is in a random
perfect matching is |K(b, w) K^{-1}(w, b)| (Kenyon, "Local statistics of
lattice dimers", Ann. IHP 1997). Plugins provide K: the plain 0/1 adjacency
for lozenges, weights 1 on horizontal and i on vertical dominoes (times the
edge weights).

Floating-point inverses of these matrices are badly conditioned
(docs/references.md section 3), so every probability carries a rigorous error
bound (:mod:`.certified_inverse`): float64 with an exactly computed residual
where that suffices, ball arithmetic otherwise; each returned probability is
within ``tolerance`` of the exact one for the matrix as stored, or ValueError
is raised rather than wrong numbers returned.
"""
from __future__ import annotations

import math
from typing import Any, Dict, Optional, Tuple

import numpy as np

from .._limits import check_memory
from ..progress import report
from .budget import DEFAULT_BUDGET_SECONDS, check_budget_argument
from .certified import CertifiedLog, certified_log_abs_det
from .certified_inverse import ball_probabilities, float_entries

_U = 2.0**-53
_MIN_TOLERANCE = 1e-15   # above the float64 rounding of a probability near 1 and of its certified radius


def placement_probabilities(region: Any, tolerance: float = 1e-6,
                            budget: Optional[float] = DEFAULT_BUDGET_SECONDS) -> Tuple[np.ndarray, np.ndarray]:
    """Every possible tile position of ``region`` (in the layout of ``Sample.tiles``) and its probability.

    A region whose plugin knows a better route offers
    ``placement_probabilities(tolerance, budget)`` (the Aztec diamond: a
    recursion in probabilities, any order); otherwise the inverse Kasteleyn
    matrix, each probability certified within ``tolerance`` (absolute; see the
    module docstring). Raises ValueError for regions whose plugin has no
    Kasteleyn matrix (or whose weights are not edge weights), when no route
    reaches ``tolerance``, or when the certified route is estimated above
    ``budget`` seconds (None: no cap; Ctrl-C stops it).
    """
    budget = check_budget_argument(budget)
    check_tolerance(tolerance)
    special = getattr(region, "placement_probabilities", None)
    if callable(special):
        return special(tolerance, budget=budget)
    return kasteleyn_placement_probabilities(region, tolerance, budget)


def kasteleyn_placement_probabilities(region: Any, tolerance: float = 1e-6,
                                      budget: Optional[float] = DEFAULT_BUDGET_SECONDS
                                      ) -> Tuple[np.ndarray, np.ndarray]:
    """:func:`placement_probabilities` from the inverse Kasteleyn matrix, certified (Kenyon 1997)."""
    system, _, p = kasteleyn_inverse(region, tolerance, budget)
    return system["tiles"], p


def certified_probabilities(system: dict, inverse: np.ndarray, tolerance: float,
                            budget: Optional[float]) -> Tuple[np.ndarray, str]:
    """|K(b, w) K^{-1}(w, b)| for every edge, each within ``tolerance`` of the exact value, and the route
    used: the float64 bound on ``inverse`` if it suffices, else ball arithmetic (:mod:`.certified_inverse`)."""
    check_tolerance(tolerance)
    k, rows, cols = system["matrix"], system["rows"], system["cols"]
    weights = k[rows, cols]
    got = float_entries(k, inverse, rows, cols)
    if got is not None:
        values, error = got
        p = np.abs(weights * values)
        bound = np.abs(weights) * error * (1.0 + 4 * _U) + 4 * _U * p
        if float(bound.max(initial=0.0)) <= tolerance:
            return p, "float64 with an exact residual"
    condition = float(np.abs(k).sum(axis=1).max() * np.abs(inverse).sum(axis=1).max())
    p, _ = ball_probabilities(k, rows, cols, tolerance, budget, condition=condition)
    return p, "ball arithmetic"


def check_tolerance(tolerance: float) -> None:
    """TypeError/ValueError unless ``tolerance`` is a number that float64 probabilities can meet."""
    if isinstance(tolerance, bool) or not isinstance(tolerance, (int, float)):
        raise TypeError(f"tolerance must be a number (an absolute error on each probability), "
                        f"got {type(tolerance).__name__}")
    if not (tolerance >= _MIN_TOLERANCE and math.isfinite(tolerance)):
        raise ValueError(f"floating point cannot give probabilities within tolerance={tolerance!r}: they are "
                         f"returned as float64 (spacing 1.1e-16 near 1); ask for a tolerance of at least "
                         f"{_MIN_TOLERANCE:g}. Aztec diamonds have an exact recursion in rationals "
                         "(frostline.domino.edge_probabilities.aztec_placement_probabilities(n, exact=True))")


def kasteleyn_inverse(region: Any, tolerance: float = 1e-6, budget: Optional[float] = DEFAULT_BUDGET_SECONDS
                      ) -> Tuple[dict, np.ndarray, np.ndarray]:
    """(dimer system, float inverse Kasteleyn matrix refined by one Newton step, placement probabilities
    certified within ``tolerance``: see :func:`certified_probabilities`)."""
    system = region.dimer_system()
    k = system["matrix"]
    n = k.shape[0]
    check_memory(128 * n * n + 10**6, f"the certified inverse of a {n}x{n} Kasteleyn matrix")
    if k.shape[0] != k.shape[1]:
        raise ValueError("the Kasteleyn matrix must be square (equal numbers of the two colours)")
    stage = f"the {n}x{n} inverse Kasteleyn matrix, steps done"  # LAPACK gives no finer progress
    report(stage, 0, 3)
    try:
        inverse = np.linalg.inv(k)
    except np.linalg.LinAlgError:
        raise ValueError(f"the {n}x{n} Kasteleyn matrix is singular: the region has no tiling "
                         "(or its weights cancel)") from None
    report(stage, 1, 3)
    inverse = inverse + inverse @ (np.eye(n) - k @ inverse)  # one Newton step
    report(stage, 2, 3)
    p, _ = certified_probabilities(system, inverse, tolerance, budget)
    report(stage, 3, 3)
    return system, inverse, p


def check_vertex_sums(index: np.ndarray, p: np.ndarray, n: int, tolerance: float, what: str) -> None:
    """Raise ValueError unless the probabilities of the tiles at each of n vertices sum to 1 within tolerance."""
    worst = _worst_sum(index, p, n)
    if not np.isfinite(worst) or worst > tolerance:
        raise ValueError(f"{what}: around some vertex the probabilities sum to 1 only within {worst:.2g} "
                         f"(tolerance {tolerance:g})")


def _worst_sum(index: np.ndarray, p: np.ndarray, n: int) -> float:
    sums = np.bincount(index, weights=p, minlength=n)
    return float(np.max(np.abs(sums - 1.0))) if n else 0.0


def mean_heights(region: Any, tolerance: float = 1e-6) -> np.ndarray:
    """The exact expected height at every point, in the layout of ``Sample.heights`` (float; NaN outside).

    From the placement probabilities, summed along paths from the boundary
    (the expected change along an edge is linear in the chance that a tile
    crosses it). For plugins whose regions offer ``expected_heights``
    (general lozenge regions, domino regions), or their own ``exact_mean_heights``
    (box hexagons: the mean plane partition, docs/references.md); ValueError otherwise.
    """
    if hasattr(region, "exact_mean_heights"):  # heights that are not sums along paths (box plane partitions)
        return region.exact_mean_heights(tolerance)
    if not hasattr(region, "expected_heights"):
        raise ValueError(f"{type(region).__name__} has no exact mean heights (no expected_heights)")
    tiles, p = placement_probabilities(region, tolerance)
    return region.expected_heights(tiles, p)


def class_densities(region: Any, tolerance: float = 1e-6) -> Dict[str, Tuple[np.ndarray, np.ndarray]]:
    """For each tile class: (tile centres in plane coordinates, probabilities)."""
    tiles, p = placement_probabilities(region, tolerance)
    classes = region.classify(tiles)
    centres = region.tile_centres(tiles)
    return {name: (centres[classes == k], p[classes == k]) for k, name in enumerate(region.tile_classes)}


def log_partition_function(region: Any, tolerance: float = 1e-9) -> float:
    """Natural log of the weighted number of tilings of a dimer region, within ``tolerance``.

    From a real Kasteleyn matrix (``region.kasteleyn_real()``: the plain
    adjacency for lozenges, the odd-column signing for dominoes, times edge
    weights). When the plugin's edge weights equal its measure up to a constant
    factor (q ** volume on lozenges), ``region.kasteleyn_log_offset()`` gives
    log of that factor and is subtracted. The value carries a checked error bound below ``tolerance``
    (absolute, in natural-log units) or ValueError is raised; see
    :func:`log_partition_function_bound` for the bound and the route taken.
    """
    return log_partition_function_bound(region, tolerance).value


def log_partition_function_bound(region: Any, tolerance: float = 1e-9) -> CertifiedLog:
    """``log Z`` of a dimer region with its error bound and method (:mod:`frostline.exact.certified`)."""
    k = region.kasteleyn_real()
    certified = certified_log_abs_det(k, tolerance)
    # a plugin whose Kasteleyn weights equal its measure only up to a constant factor says so here
    offset = getattr(region, "kasteleyn_log_offset", None)
    if offset is None:
        return certified
    return CertifiedLog(certified.value - float(offset()), certified.error, certified.method)
