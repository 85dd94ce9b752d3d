"""What every lozenge region declares about its tiles: a mixin for Region subclasses."""
from __future__ import annotations

import numpy as np

from .drawing import TYPE_NAMES, draw_lozenges
from .tiles import TILE_CLASSES, lozenge_centres, lozenge_polygons


class LozengeTiles:
    """What every lozenge region declares about its tiles (a mixin for Region subclasses)."""

    lattice = "lozenge"
    tile_classes = TILE_CLASSES
    #: what each class is, for picture titles (``fl.plot.save_densities(labels=...)``)
    tile_class_labels = dict(zip(TILE_CLASSES, TYPE_NAMES))

    def tile_centres(self, tiles: np.ndarray) -> np.ndarray:
        return lozenge_centres(tiles)

    def tile_outlines(self, tiles: np.ndarray) -> np.ndarray:
        return lozenge_polygons(tiles)

    def classify(self, tiles: np.ndarray) -> np.ndarray:
        return np.asarray(tiles)[:, 2].astype(np.int8)

    def draw(self, sample, ax=None, **style):
        """Draw the tiling (three tones, cube tops palest)."""
        return draw_lozenges(sample.tiles, ax=ax, **style)
