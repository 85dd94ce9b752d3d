"""What a plugin hands to the generic limit-shape solver: :class:`LimitSetup`."""
from __future__ import annotations

from dataclasses import dataclass
from typing import Callable, Dict, Tuple

import numpy as np

from .problem import CellProblem

#: {tile class: (tile centres (k, 2), probabilities (k,), tiles in the layout of Sample.tiles)}
TileDensities = Dict[str, Tuple[np.ndarray, np.ndarray, np.ndarray]]


@dataclass
class LimitSetup:
    """A region lowered to a :class:`CellProblem`, with the plugin's conversions back.

    ``plane``: (N, 2) node positions in the region's plane frame (the frame of
    ``arctic_curve``, unscaled); ``mesh``: (T, 3) node triangles covering the
    region, for drawing contours; ``to_heights``: float node heights -> the
    layout and units of ``Sample.heights``; ``tile_densities``: the (C, k)
    edge probabilities -> {class: (tile centres, probabilities, tiles)} at
    every tile position, centres and probabilities as
    :func:`frostline.exact.class_densities` gives them;
    ``value_scale``: log Z of the region is the functional's maximum times
    this (1 / m^2 when the problem is the region refined m times).
    """

    problem: CellProblem
    plane: np.ndarray
    mesh: np.ndarray
    scale: float
    to_heights: Callable[[np.ndarray], np.ndarray]
    tile_densities: Callable[[np.ndarray], TileDensities]
    value_scale: float = 1.0
