"""Newton's method for the discrete variational problem (:mod:`.problem`).

The functional is concave and its Hessian is a weighted graph Laplacian on
the cell edges (weight cell_weight * pi cot(pi p) / step^2), so each Newton
step is one sparse symmetric solve (scipy's SuperLU). The entropy's slope is
infinite where a probability reaches 0 or 1, which keeps iterates inside the
polytope of fractional height functions; steps are cut to stay strictly
inside (fraction to the boundary) and backtracked until the functional rises.

Start: a point inside the polytope relative to its forced parts. Nodes where
the least and greatest height functions agree are fixed. Along a cell edge
that is tight at the least function between two free nodes the least
function rises, so h = least + eps * (H - least) leaves every such edge
slack by at least eps while keeping the others (slack >= 1) slack; the mirror
image from the greatest function does the same, and the start is their mean
(docs/limit_shapes.md, "Solver").
"""
from __future__ import annotations

import time
from dataclasses import dataclass, field
from typing import Callable, List, Optional

import numpy as np
from scipy import sparse
from scipy.sparse.linalg import spsolve

from .._limits import check_memory
from .lobachevsky import entropy_parts
from .problem import CellProblem

#: Below this probability the entropy continues as its Taylor polynomial (lobachevsky.entropy_parts).
#: Heights of order 10^3 carry about 1e-13 of rounding, so smaller probabilities are noise; in frozen
#: parts the maximiser's probabilities decay exponentially, and there the extension holds them at the
#: floor (overshooting it by about 1e-10 at most) instead of letting Newton's method stall on them.
FLOOR = 1e-11

#: peak memory of a solve per free height (sparse factors included): measured 2.8-3.0 kB at 10^4-4*10^4
#: unknowns, growing slowly with the size (fill of the factorisation)
BYTES_PER_UNKNOWN = 4000

#: a progress hook receives (iteration, Newton decrement, functional value)
SolverProgress = Callable[[int, float, float], None]


@dataclass
class SolverReport:
    """How the solve went: iterations, the last Newton decrement (an upper estimate of F* - F) and timing."""

    iterations: int
    decrement: float
    converged: bool
    seconds: float
    unknowns: int
    history: List[float] = field(default_factory=list)

    def __str__(self) -> str:
        state = "converged" if self.converged else "NOT converged"
        return (f"{state} after {self.iterations} Newton steps ({self.unknowns} unknowns, {self.seconds:.2f} s); "
                f"last decrement {self.decrement:.2e}")


def starting_heights(problem: CellProblem) -> np.ndarray:
    """A start strictly inside the polytope except on forced edges (see the module docstring)."""
    lo, hi = problem.least, problem.greatest
    free = ~problem.fixed
    if not free.any():
        return lo.copy()
    spread = float(max(hi[free].max() - lo[free].min(), 1.0))
    eps = 0.5 / (spread + 2.0)
    up = lo + eps * (lo[free].max() + 1.0 - lo)
    down = hi - eps * (hi - hi[free].min() + 1.0)
    inside = np.where(free, 0.5 * (up + down), lo)
    return _towards_harmonic(problem, inside)


def _towards_harmonic(problem: CellProblem, inside: np.ndarray) -> np.ndarray:
    """Move ``inside`` (a strictly feasible start) 90% of the feasible way to the harmonic extension of the
    fixed heights: in the liquid part that is already close to the maximiser, so Newton starts there."""
    free = ~problem.fixed
    index = np.full(problem.n_nodes, -1, dtype=np.int64)
    index[free] = np.arange(int(free.sum()))
    tail, head = problem.edges()
    t, h = tail.ravel(), head.ravel()
    n = int(free.sum())
    laplacian = _laplacian(index[t], index[h], np.ones(len(t)), n)
    # fixed neighbours move to the right-hand side
    rhs = np.bincount(index[t[free[t] & ~free[h]]], weights=inside[h[free[t] & ~free[h]]], minlength=n)
    rhs += np.bincount(index[h[free[h] & ~free[t]]], weights=inside[t[free[h] & ~free[t]]], minlength=n)
    harmonic = inside.copy()
    harmonic[free] = spsolve(laplacian, rhs, permc_spec="MMD_AT_PLUS_A")
    move = harmonic - inside
    p, q = problem.densities(inside)
    active = free[tail] | free[head]
    dp = -(move[head] - move[tail])[active] / problem.step
    return inside + min(1.0, 0.9 * _room(p[active], q[active], dp, 0.0, 0.0)) * move


def functional(problem: CellProblem, h: np.ndarray) -> float:
    """F(h): the scaled entropy plus the linear (weight) term, in natural-log units."""
    p, q = problem.densities(h)
    k = problem.cells.shape[1]
    value = problem.cell_weight * float(entropy_parts(p, q, FLOOR, k * FLOOR)[0].sum())
    if problem.linear is not None:
        value += float(problem.linear @ (h - problem.least))
    return value


def solve(problem: CellProblem, *, tolerance: float = 1e-12, max_iterations: int = 600,
          progress: Optional[SolverProgress] = None) -> tuple:
    """Maximise F; returns (node heights, report).

    Stops when half the Newton decrement (the predicted gain, in natural-log
    units) falls below ``tolerance * max(1, |F|)``, or when five steps in a row
    gain less than 100 times that (what is left is rounding in the frozen parts, where
    the probabilities sit at the floor).
    """
    started = time.perf_counter()
    free = ~problem.fixed
    n_free = int(free.sum())
    check_memory(BYTES_PER_UNKNOWN * n_free + 10**7, f"the Newton solver of {n_free} unknown heights")
    h = starting_heights(problem)
    index = np.full(problem.n_nodes, -1, dtype=np.int64)
    index[free] = np.arange(n_free)
    tail, head = problem.edges()
    active = free[tail] | free[head]              # edges with a free end; the others are constant
    t_act, h_act = tail[active], head[active]
    it, ih = index[t_act], index[h_act]
    w = problem.cell_weight / problem.step
    history: List[float] = []
    report = SolverReport(0, 0.0 if n_free == 0 else float("inf"), n_free == 0, 0.0, n_free, history)
    value = functional(problem, h)
    for iteration in range(1, max_iterations + 1):
        if n_free == 0:
            break
        p, q = problem.densities(h)
        k = problem.cells.shape[1]
        pa, qa = p[active], q[active]
        _, slope, curvature = entropy_parts(pa, qa, FLOOR, k * FLOOR)
        slope = w * slope                              # dF/dh[tail] per edge; -slope for the head
        grad = np.bincount(it[it >= 0], weights=slope[it >= 0], minlength=n_free)
        grad -= np.bincount(ih[ih >= 0], weights=slope[ih >= 0], minlength=n_free)
        if problem.linear is not None:
            grad += problem.linear[free]
        curvature = _concave_cells(problem.cells.shape, active, curvature)
        omega = (w / problem.step) * curvature
        matrix = _laplacian(it, ih, omega, n_free)
        direction = spsolve(matrix, grad, permc_spec="MMD_AT_PLUS_A")
        decrement = float(grad @ direction)
        report.iterations, report.decrement = iteration, decrement
        history.append(value)
        if progress is not None:
            progress(iteration, decrement, value)
        if not np.isfinite(decrement) or decrement < -1e-9 * max(1.0, abs(value)):
            raise ValueError(f"the Newton system of the limit shape failed (decrement {decrement:.3g}) at step "
                             f"{iteration}; the region may be too degenerate for the solver")
        goal = tolerance * max(1.0, abs(value))
        if decrement / 2.0 < goal or (len(history) > 5 and history[-1] - history[-6] < 100 * goal):
            report.converged = True
            break
        full = np.zeros(problem.n_nodes)
        full[free] = direction
        step = _largest_step(problem, full, pa, qa, active)
        while True:
            trial = h + step * full
            trial_value = functional(problem, trial)
            if trial_value >= value + 0.25 * step * decrement or step < 1e-12:
                break
            step *= 0.5
        if trial_value < value and step < 1e-12:
            report.converged = decrement / 2.0 < 1e3 * goal
            break
        h, value = trial, trial_value
    report.seconds = time.perf_counter() - started
    return h, report


def _concave_cells(shape: tuple, active: np.ndarray, curvature: np.ndarray) -> np.ndarray:
    """Curvatures with each cell's quadratic form made positive on {sum of edge changes = 0}.

    A cell's form sum_j c_j v_j^2 (c_j = -d^2/dp^2 of its terms) is positive on
    sum v = 0 when at most one c_j is negative and sum 1 / c_j < 0; the true
    entropy satisfies this, but below the floors the Taylor extension replaces
    1/p by a constant and can break it where one probability is near 1. The
    negative curvature is then raised to -(1 - 1e-6) / sum of 1/c over the
    positive ones, which keeps the Newton matrix positive definite (a
    modified Newton step: still an ascent direction for the exact gradient).
    """
    full = np.zeros(shape)
    full[active] = curvature
    positive = np.where(full > 0, 1.0 / np.where(full > 0, full, 1.0), 0.0).sum(axis=1, keepdims=True)
    least = -(1.0 - 1e-6) / np.maximum(positive, 1e-300)
    full = np.where(full < 0, np.maximum(full, least), full)
    return full[active]


def _laplacian(it: np.ndarray, ih: np.ndarray, omega: np.ndarray, n: int) -> sparse.csc_matrix:
    """sum over edges of omega (e_tail - e_head)(e_tail - e_head)^T on the free nodes (-Hessian)."""
    rows, cols, vals = [], [], []
    for a, b, sign in ((it, it, 1.0), (ih, ih, 1.0), (it, ih, -1.0), (ih, it, -1.0)):
        keep = (a >= 0) & (b >= 0)
        rows.append(a[keep])
        cols.append(b[keep])
        vals.append(sign * omega[keep])
    return sparse.csc_matrix((np.concatenate(vals), (np.concatenate(rows), np.concatenate(cols))), shape=(n, n))


def _largest_step(problem: CellProblem, direction: np.ndarray, p: np.ndarray, q: np.ndarray,
                  active: np.ndarray) -> float:
    """The step t <= 1 that moves every active edge at most 99% of the way to p = 0 or p = 1."""
    tail, head = problem.edges()
    dp = -(direction[head[active]] - direction[tail[active]]) / problem.step
    return min(1.0, 0.99 * _room(p, q, dp, FLOOR, problem.cells.shape[1] * FLOOR))


def _room(p: np.ndarray, q: np.ndarray, dp: np.ndarray, low: float, high: float) -> float:
    """The largest t with p + t dp >= low / 2 and q - t dp >= high / 2, ignoring edges already at their floor
    (held there by the entropy's extension, not by the step length)."""
    with np.errstate(divide="ignore", invalid="ignore"):
        to_zero = np.where((dp < 0) & (p > low), (p - 0.5 * low) / -dp, np.inf)
        to_one = np.where((dp > 0) & (q > high), (q - 0.5 * high) / dp, np.inf)
    return float(min(to_zero.min(initial=np.inf), to_one.min(initial=np.inf)))
