"""Square ice and the six-vertex model (built-in plugin ``square_ice``).

Regions
-------
domain_wall(n, a, b, c)          domain-wall boundary (alternating sign matrices when uniform)
from_boundary(heights, a, b, c)  any valid fixed boundary

Conventions (heights, matrix, arrows, the vertex types a1 .. c2): :mod:`frostline.square_ice.conversions`.
"""
from . import conversions
from .conversions import VERTEX_TYPES
from .counts import asm_count, izergin_korepin, row_transfer
from .declaration import LATTICE
from .records import region_from_record
from .region import SquareIceRegion, domain_wall, from_boundary, weight_table

__all__ = ["LATTICE", "SquareIceRegion", "VERTEX_TYPES", "asm_count", "conversions", "domain_wall", "from_boundary",
           "izergin_korepin", "region_from_record", "row_transfer", "weight_table"]
