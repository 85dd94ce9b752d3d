"""Limit shapes from the variational principle, for any lattice that lowers to cells (docs/limit_shapes.md).

Importing this package does not import scipy: the solver (``.solver``) and the
result (``.result``) load it when a limit shape is computed.
"""
from .mixin import VariationalRegion
from .problem import CellProblem
from .setup import LimitSetup

__all__ = ["CellProblem", "LimitSetup", "VariationalRegion"]
