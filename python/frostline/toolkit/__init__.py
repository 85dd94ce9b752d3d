"""The mathematics toolkit lattices may use: curve geometry and drawing primitives.

It sits above the engine's Python face and below the lattices (see
docs/design.md section 2); determinants and enumeration live in
:mod:`frostline.exact`, the other part of this layer.
"""
from .curves import conic_points
from .drawing import frame

__all__ = ["conic_points", "frame"]
