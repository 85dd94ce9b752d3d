"""Exact placement probabilities of tiles from the inverse Kasteleyn matrix.

For a bipartite planar dimer model with Kasteleyn matrix K (rows black
vertices, columns white), the probability that the edge b-w is in a random
perfect matching is |K(b, w) K^{-1}(w, b)| (Kenyon, "Local statistics of
lattice dimers", Ann. IHP 1997). Plugins provide K: the plain 0/1 adjacency
for lozenges, weights 1 on horizontal and i on vertical dominoes (times the
edge weights).

Floating-point inverses of these matrices are badly conditioned
(docs/references.md section 3): the inverse is refined by one Newton step and the
probabilities around every vertex must sum to 1 within ``tolerance``;
otherwise ValueError is raised rather than wrong numbers returned.
"""
from __future__ import annotations

from typing import Any, Dict, Tuple

import numpy as np

from .._limits import check_memory
from ..progress import report
from .certified import CertifiedLog, certified_log_abs_det


def placement_probabilities(region: Any, tolerance: float = 1e-6) -> Tuple[np.ndarray, np.ndarray]:
    """Every possible tile position of ``region`` (in the layout of ``Sample.tiles``) and its probability.

    A region whose plugin knows a better route offers ``placement_probabilities(tolerance)``
    (the Aztec diamond: a recursion in probabilities, any order); otherwise the
    inverse Kasteleyn matrix. Raises ValueError for regions whose plugin has no
    Kasteleyn matrix (or whose weights are not edge weights), or when floating
    point cannot reach ``tolerance``.
    """
    special = getattr(region, "placement_probabilities", None)
    if callable(special):
        return special(tolerance)
    return kasteleyn_placement_probabilities(region, tolerance)


def kasteleyn_placement_probabilities(region: Any, tolerance: float = 1e-6) -> Tuple[np.ndarray, np.ndarray]:
    """:func:`placement_probabilities` from the inverse Kasteleyn matrix, refined and checked (Kenyon 1997)."""
    system, _, p = kasteleyn_inverse(region, tolerance)
    return system["tiles"], p


def kasteleyn_inverse(region: Any, tolerance: float = 1e-6) -> Tuple[dict, np.ndarray, np.ndarray]:
    """(dimer system, inverse Kasteleyn matrix, placement probabilities), the inverse refined by one Newton
    step and checked: the probabilities of the tiles at every vertex sum to 1 within ``tolerance``."""
    system = region.dimer_system()
    k = system["matrix"]
    n = k.shape[0]
    check_memory(48 * n * n + 10**6, f"the inverse of a {n}x{n} Kasteleyn matrix")
    if k.shape[0] != k.shape[1]:
        raise ValueError("the Kasteleyn matrix must be square (equal numbers of the two colours)")
    stage = f"the {n}x{n} inverse Kasteleyn matrix, steps done"  # LAPACK gives no finer progress
    report(stage, 0, 3)
    inverse = np.linalg.inv(k)
    report(stage, 1, 3)
    inverse = inverse + inverse @ (np.eye(n) - k @ inverse)  # one Newton step
    report(stage, 2, 3)
    rows, cols = system["rows"], system["cols"]
    p = np.abs(k[rows, cols] * inverse[cols, rows])
    worst = max(_worst_sum(rows, p, n), _worst_sum(cols, p, n))
    if not np.isfinite(worst) or worst > tolerance:
        raise ValueError(
            f"floating point cannot give these probabilities: around some vertex they sum to 1 only within {worst:.2g} "
            f"(tolerance {tolerance:g}); the {n}x{n} Kasteleyn matrix is too badly conditioned. Use a smaller region "
            "(or, for q ** volume weights, q nearer 1) or estimate from exact samples; Aztec diamonds have an exact "
            "recursion at any order")
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
