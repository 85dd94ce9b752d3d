"""The limit shape of a region: :class:`LimitShape`, and how it is made from a :class:`LimitSetup`."""
from __future__ import annotations

import warnings
from dataclasses import dataclass
from typing import Dict, List, Optional, Tuple

import numpy as np

from ..errors import FrostlineWarning
from ..toolkit.contours import marching_triangles
from .setup import LimitSetup
from .solver import SolverProgress, SolverReport, functional, solve

#: the frozen boundary is extrapolated from the level line where 1 - (largest tile probability) = FROZEN_LEVEL
FROZEN_LEVEL = 0.2


@dataclass
class LimitShape:
    """The variational principle's prediction for one region (docs/limit_shapes.md).

    Attributes
    ----------
    heights : ndarray
        The predicted mean height at every point, float, in the layout and
        units of ``Sample.heights`` (NaN outside the region).
    frozen_boundary : list of ndarray
        The predicted frozen/liquid boundary as polylines in scaled
        coordinates (the frame of ``region.arctic_curve() / region.scale``).
    densities : dict
        {tile class: (tile centres in plane coordinates, predicted
        probability)} at every possible tile position, as
        :func:`frostline.exact.class_densities` lists them.
    tiles : dict
        {tile class: the tile positions of ``densities``, in the layout of
        ``Sample.tiles``}.
    log_partition_function : float
        The maximum of the discretised functional (entropy plus weight term,
        natural-log units) at the region's own size.
    report : SolverReport
        The solver's convergence report.
    scale : float
        The region's scale.
    """

    heights: np.ndarray
    frozen_boundary: List[np.ndarray]
    densities: Dict[str, Tuple[np.ndarray, np.ndarray]]
    tiles: Dict[str, np.ndarray]
    log_partition_function: float
    report: SolverReport
    scale: float
    liquid: np.ndarray            # (N,) 1 - the largest probability, averaged around each node
    plane: np.ndarray             # (N, 2) node positions (unscaled plane frame)
    mesh: np.ndarray              # (T, 3) node triangles

    def frozen_boundary_at(self, level: float, extrapolate: bool = True) -> List[np.ndarray]:
        """The frozen boundary (scaled coordinates) from the level line ``1 - max p = level``.

        Next to a smooth frozen boundary the liquid measure l = 1 - max p grows
        like the square root of the distance (the densities of a translation-
        invariant Gibbs measure near the edge of the slope polygon), so l^2 is
        close to linear there. With ``extrapolate`` each point of the level
        line l^2 = level^2 moves one Newton step to l^2 = 0 along the gradient
        of l^2; without, the level line itself is returned.
        """
        if not 0.0 < level < 0.5:
            raise ValueError(f"level must lie in (0, 0.5), got {level!r}")
        u = self.liquid ** 2
        if not extrapolate:
            return [line / self.scale for line in marching_triangles(self.plane, self.mesh, self.liquid, level)]
        gradient = _nodal_gradient(self.plane, self.mesh, u)
        out = []
        for line in marching_triangles(self.plane, self.mesh, u, level ** 2, carry=gradient):
            xy, g = line[:, :2], line[:, 2:]
            norm2 = np.maximum((g * g).sum(axis=1, keepdims=True), 1e-300)
            out.append((xy - (level ** 2) * g / norm2) / self.scale)
        return out

    def __repr__(self) -> str:
        return (f"LimitShape(log Z ~ {self.log_partition_function:.6g}, {len(self.frozen_boundary)} frozen-boundary "
                f"line(s); {self.report})")


def limit_shape_of(setup: LimitSetup, *, progress: Optional[SolverProgress] = None,
                   tolerance: float = 1e-12, max_iterations: int = 600) -> LimitShape:
    """Solve the setup's variational problem and convert the maximiser back (see :class:`LimitShape`).

    Warns (FrostlineWarning) when the solver stops before converging: the
    result is then the best point reached, not the maximiser.
    """
    problem = setup.problem
    h, report = solve(problem, tolerance=tolerance, max_iterations=max_iterations, progress=progress)
    if not report.converged:
        warnings.warn(f"the limit shape did not converge: {report}; raise max_iterations or check the region",
                      FrostlineWarning, stacklevel=3)
    p, _ = problem.densities(h)
    p = np.clip(p, 0.0, 1.0)
    liquid = _node_liquidity(problem.cells, 1.0 - p.max(axis=1), problem.n_nodes)
    per_class = setup.tile_densities(p)
    densities = {name: (centres, probabilities) for name, (centres, probabilities, _) in per_class.items()}
    tiles = {name: positions for name, (_, _, positions) in per_class.items()}
    shape = LimitShape(setup.to_heights(h), [], densities, tiles, functional(problem, h) * setup.value_scale,
                       report, setup.scale, liquid, setup.plane, setup.mesh)
    shape.frozen_boundary = shape.frozen_boundary_at(FROZEN_LEVEL)
    return shape


def _nodal_gradient(points: np.ndarray, triangles: np.ndarray, values: np.ndarray) -> np.ndarray:
    """Area-weighted mean, over the triangles around each node, of the gradient of the P1 interpolant."""
    a, b, c = (points[triangles[:, k]] for k in range(3))
    va, vb, vc = (values[triangles[:, k]] for k in range(3))
    e1, e2 = b - a, c - a
    det = e1[:, 0] * e2[:, 1] - e1[:, 1] * e2[:, 0]
    d1, d2 = vb - va, vc - va
    safe = np.where(det == 0, 1.0, det)
    gx = (d1 * e2[:, 1] - d2 * e1[:, 1]) / safe
    gy = (d2 * e1[:, 0] - d1 * e2[:, 0]) / safe
    area = 0.5 * np.abs(det)
    n = len(points)
    out = np.zeros((n, 2))
    weight = np.zeros(n)
    for k in range(3):
        np.add.at(out[:, 0], triangles[:, k], area * gx)
        np.add.at(out[:, 1], triangles[:, k], area * gy)
        np.add.at(weight, triangles[:, k], area)
    return out / np.maximum(weight, 1e-300)[:, None]


def _node_liquidity(cells: np.ndarray, per_cell: np.ndarray, n: int) -> np.ndarray:
    """Average of a per-cell value over the cells around each node."""
    k = cells.shape[1]
    total = np.bincount(cells.ravel(), weights=np.repeat(per_cell, k), minlength=n)
    count = np.bincount(cells.ravel(), minlength=n)
    return total / np.maximum(count, 1)


