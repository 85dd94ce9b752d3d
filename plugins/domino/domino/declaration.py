"""The domino lattice's declaration: what the rest of frostline may know of it."""
from __future__ import annotations

from pathlib import Path
from typing import Optional, Sequence

from frostline.lattice_spec import Argument, LatticeSpec, Shape

from .counts import aztec_count, rectangle_count
from .records import region_from_record
from .region import TILE_CLASSES
from .shapes import aztec_diamond, from_picture, rectangle


def _aztec(order: int, vertical_weight: Optional[float] = None, two_periodic: Optional[Sequence[float]] = None):
    return aztec_diamond(order, vertical_weight=vertical_weight,
                         two_periodic_weights=tuple(two_periodic) if two_periodic else None)


def _deprecated_picture(file: Path):
    import warnings

    from frostline.errors import FrostlineWarning

    warnings.warn("the shape 'picture' is now called 'mask'; 'picture' goes in the next release",
                  FrostlineWarning, stacklevel=2)
    return from_picture(Path(file).read_text())


COLOURING = Argument("colouring", "picture tones: 'classes' (north, south, east, west) or 'faces' (each class "
                     "split by face parity; the default with --two-periodic, where it shows the gas phase)",
                     type=str, flag="--colouring", choices=("classes", "faces"), style="colouring")


LATTICE = LatticeSpec(
    name="domino",
    summary="domino tilings of the square grid (Aztec diamonds, rectangles, any region)",
    shapes=(
        Shape("aztec", "domino tilings of the Aztec diamond of order N", _aztec,
              (Argument("order", "the order N"),
               Argument("vertical_weight", "weight of every vertical domino", type=float, flag="--vertical-weight",
                        exclusive="weights"),
               Argument("two_periodic", "two-periodic weights A and B (gas phase in the middle when A != B)",
                        type=float, nargs=2, metavar=("A", "B"), flag="--two-periodic", exclusive="weights"),
               COLOURING),
              "Domino tilings of the Aztec diamond of order N (2N(N+1) cells).", methods=("shuffling",)),
        Shape("rectangle", "domino tilings of a ROWS x COLUMNS rectangle", rectangle,
              (Argument("rows", "number of rows"), Argument("columns", "number of columns"), COLOURING)),
        Shape("mask", "domino tilings of a region drawn in a text file",
              lambda file: from_picture(Path(file).read_text()),
              (Argument("file", "the text file with the drawing", type=Path),),
              "Domino tilings of a region drawn as text: '#' a cell, '.' none, one line per row."),
        # the old name, kept for one release: it read like the --picture option
        Shape("picture", "deprecated name of the shape 'mask' (kept for one release)", _deprecated_picture,
              (Argument("file", "the text file with the drawing", type=Path),),
              "Deprecated: use 'mask'. Domino tilings of a region drawn as text."),
    ),
    closed_forms={"aztec_count": aztec_count, "rectangle_count": rectangle_count},
    tile_classes=TILE_CLASSES,
    theory_curves=("uniform Aztec diamond: the arctic circle (Jockusch, Propp, Shor 1998)",
                   "Aztec diamond, vertical weight a: the biased ellipse (Cohn, Elkies, Propp 1996)"),
    streams={"domino_shuffling": 3},
    weight_keys=("vertical_weight", "two_periodic_weights", "weighted"),
    region_from_record=region_from_record,
    comparison=("domino Aztec diamond", lambda n: aztec_diamond(n)),
)
