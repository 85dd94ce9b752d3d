"""Lozenge tilings of the triangular lattice (plane partitions, stacks of cubes).

Built-in plugin ``lozenge``. Regions: :func:`hexagon`. Conventions for
heights and tiles are in :mod:`frostline.lozenge.tiles` and DESIGN.md.
"""
from .counts import macmahon, volume_polynomial
from .hexagon import HexagonRegion, hexagon, is_plane_partition
from .tiles import TILE_CLASSES, lozenge_polygons, plane_points, tiles_of_plane_partition

__all__ = [
    "HexagonRegion",
    "TILE_CLASSES",
    "hexagon",
    "is_plane_partition",
    "lozenge_polygons",
    "macmahon",
    "plane_points",
    "tiles_of_plane_partition",
    "volume_polynomial",
]
