"""Limit shapes from the variational principle, for any lattice that lowers to cells (docs/limit_shapes.md)."""
from .problem import CellProblem
from .setup import LimitSetup
from .solver import SolverReport, solve

__all__ = ["CellProblem", "LimitSetup", "SolverReport", "solve"]
