"""Analysis of samples from any plugin: densities, frozen regions and boundaries, heights, distances.

Works on arrays and on what plugins declare (``tile_classes``, ``classify``,
``tile_centres``, ``scale``, ``arctic_curve``); it never looks at a lattice's name.
"""
from .boundary import frozen_boundary, frozen_mask, near_edge
from .curves import conic_points, curve_distance
from .densities import DensityGrid, density_grid, local_densities
from .heights import height_statistics, variance_at

__all__ = ["DensityGrid", "conic_points", "curve_distance", "density_grid", "frozen_boundary", "frozen_mask",
           "height_statistics", "local_densities", "near_edge", "variance_at"]
