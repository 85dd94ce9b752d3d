"""Lozenge tilings of the triangular lattice (plane partitions, stacks of cubes).

Built-in plugin ``lozenge``.

Regions
-------
hexagon(a, b, c, q)            plane partitions in a box; fast kernel
from_triangles(rows, q)        any region of unit triangles (x, y, s)
from_masks(up, down, origin)   the same from two boolean arrays
from_boundary(path, q)         the region inside a boundary path ("4e 3ne 5nw 4w 3sw 5se")
hexagon_region(a, b, c, q)     the hexagon through the general route
polygon(lengths, directions)   a lattice polygon by its sides
hexagon_minus(a, b, c, removed) a hexagon with triangles removed
trapezoid(bottom, height, notches) a trapezoid with notches in its top row

Conventions for heights and tiles: :mod:`frostline.lozenge.tiles`,
:mod:`frostline.lozenge.general` and docs/design.md section 3.
"""
from .boundary import DIRECTIONS, format_path, parse_path
from .counts import macmahon, volume_polynomial
from .declaration import LATTICE
from .general import LozengeRegion, from_masks, from_triangles
from .hexagon import HexagonRegion, hexagon, is_plane_partition
from .records import region_from_record
from .shapes import from_boundary, hexagon_minus, hexagon_region, polygon, trapezoid
from .tiles import TILE_CLASSES, lozenge_polygons, plane_points, tiles_of_plane_partition

__all__ = [
    "DIRECTIONS",
    "HexagonRegion",
    "LATTICE",
    "LozengeRegion",
    "TILE_CLASSES",
    "format_path",
    "from_boundary",
    "from_masks",
    "from_triangles",
    "hexagon",
    "hexagon_minus",
    "hexagon_region",
    "is_plane_partition",
    "lozenge_polygons",
    "macmahon",
    "parse_path",
    "plane_points",
    "region_from_record",
    "polygon",
    "tiles_of_plane_partition",
    "trapezoid",
    "volume_polynomial",
]
