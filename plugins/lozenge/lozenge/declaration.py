"""The lozenge lattice's declaration: what the rest of frostline may know of it."""
from __future__ import annotations

import math
from pathlib import Path
from typing import Optional

from frostline.lattice_spec import Argument, LatticeSpec, Shape

from .counts import macmahon, q_partition_function, volume_polynomial
from .hexagon import hexagon
from .records import region_from_record
from .shapes import from_boundary, trapezoid
from .tiles import TILE_CLASSES

_Q = Argument("q", "weight per unit cube (q ** volume); 1 is uniform (default)", type=float, default=1.0,
              flag="--q")


def _path(path: Optional[str] = None, file: Optional[Path] = None, q: float = 1.0):
    text = path if file is None else Path(file).read_text()
    return from_boundary(" ".join(str(text).split()), q=q)


def _demo(size: int, q: Optional[float]):
    q = q if q is not None else math.exp(-2.0 / max(size, 1))

    def volume(sample) -> tuple:
        return "volume (cubes)", f"{int(sample.heights.sum())} of {size ** 3} (uniform limit shape: half the box)"

    def weighted_volume(sample) -> tuple:
        return "volume (cubes)", f"{int(sample.heights.sum())} of {size ** 3}"

    return [("hexagon-uniform", hexagon(size, size, size), f"uniform, {size}x{size}x{size}", volume),
            ("hexagon-weighted", hexagon(size, size, size, q=q), f"weighted, {size}x{size}x{size}, q = {q:.4g}",
             weighted_volume)]


def _hexagon(sides, q: float = 1.0):
    if len(sides) != 3:
        raise ValueError(f"a hexagon needs three side lengths A B C (plane partitions in an A x B x C box), "
                         f"got {len(sides)}: {' '.join(str(v) for v in sides)}")
    return hexagon(sides[0], sides[1], sides[2], q=q)


LATTICE = LatticeSpec(
    name="lozenge",
    summary="lozenge tilings of the triangular lattice (plane partitions, stacks of cubes)",
    shapes=(
        Shape("hexagon", "the A, B, C hexagon (plane partitions in a box)",
              _hexagon,
              (Argument("sides", "three side lengths A B C: plane partitions in an A x B x C box", nargs="+",
                        metavar="SIDE"), _Q),
              "Lozenge tilings of the A, B, C hexagon = plane partitions in an A x B x C box.", methods=("box",)),
        Shape("path", "the region inside a boundary path", _path,
              (Argument("path", "the boundary path, quoted", type=str, nargs="?", exclusive="source"),
               Argument("file", "read the boundary path from this text file", type=Path, flag="--file",
                        exclusive="source"), _Q),
              "Lozenge tilings of the region inside a boundary path, e.g. \"4e 3ne 5nw 4w 3sw 5se\" "
              "(steps e, ne, nw, w, sw, se; counts; groups).", required=("source",),
              methods=("columns", "points", "points-generic")),
        Shape("trapezoid", "a trapezoid with notches in its top row",
              lambda bottom, height, notches=None, q=1.0: trapezoid(bottom, height, notches, q=q),
              (Argument("bottom", "length of the bottom side"),
               Argument("height", "number of rows (and of notches)"),
               Argument("notches", "positions 0 .. BOTTOM+HEIGHT-1 of the removed top triangles (default: spread "
                        "evenly)", nargs="+", flag="--notches"), _Q),
              "A trapezoid widening upwards (BOTTOM e, HEIGHT ne, BOTTOM+HEIGHT w, HEIGHT se) with HEIGHT down "
              "triangles removed from its top row.", methods=("columns", "points", "points-generic")),
    ),
    closed_forms={"macmahon": macmahon, "q_macmahon": q_partition_function, "volume_polynomial": volume_polynomial},
    tile_classes=TILE_CLASSES,
    theory_curves=("uniform a, b, c hexagon: the inscribed ellipse (Cohn, Larsen, Propp 1998)",),
    weight_keys=("q",),
    region_from_record=region_from_record,
    comparison=("lozenge hexagon", lambda n: hexagon(n, n, n)),
    demo=_demo,
)
