"""Domino tilings of the square grid (built-in plugin ``domino``).

Regions
-------
aztec_diamond(n, ...)     the Aztec diamond; uniform, biased or two-periodic weights
rectangle(rows, columns)  a rectangle
from_mask(mask)           any region as a boolean array (row 0 at the top)
from_picture(text)        any region drawn with '#' and '.'

Conventions (heights on cell corners, tiles as cell pairs, the four classes):
:mod:`frostline.domino.region` and :mod:`frostline.domino.geometry`.
"""
from .counts import aztec_count, kasteleyn_matrix, rectangle_count
from .declaration import LATTICE
from .records import region_from_record
from .region import TILE_CLASSES, DominoRegion
from .shapes import aztec_diamond, aztec_mask, from_mask, from_picture, rectangle
from .weights import biased, two_periodic

__all__ = [
    "DominoRegion",
    "LATTICE",
    "TILE_CLASSES",
    "aztec_count",
    "aztec_diamond",
    "aztec_mask",
    "biased",
    "from_mask",
    "from_picture",
    "kasteleyn_matrix",
    "rectangle",
    "rectangle_count",
    "region_from_record",
    "two_periodic",
]
