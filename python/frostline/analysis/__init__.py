"""Analysis of samples from any plugin: densities, frozen regions and boundaries, heights, distances.

Works on arrays and on what plugins declare (``tile_classes``, ``classify``,
``tile_centres``, ``scale``, ``arctic_curve``); it never looks at a lattice's name.
"""
from .boundary import frozen_boundary, frozen_mask, near_edge
from .curves import conic_points, curve_distance
from .densities import DensityGrid, density_grid, local_densities, tile_counts
from .exact_comparison import ExactComparison, compare_with_exact
from .fluctuations import POINTWISE_SLOPE, TWO_POINT_SLOPE, Fluctuations, height_fluctuations, variance_growth
from .frozen_positions import FrozenPositions, crossing, frozen_positions
from .heights import height_statistics, variance_at
from .tracy_widom import tracy_widom_cdf, tracy_widom_moments

__all__ = ["POINTWISE_SLOPE", "TWO_POINT_SLOPE", "DensityGrid", "ExactComparison", "Fluctuations",
           "FrozenPositions", "compare_with_exact", "conic_points", "crossing", "curve_distance", "density_grid", "frozen_boundary", "frozen_mask", "frozen_positions",
           "height_fluctuations", "height_statistics", "local_densities", "near_edge", "tile_counts", "tracy_widom_cdf",
           "tracy_widom_moments", "variance_at", "variance_growth"]
