"""Named lozenge regions, all built through the general route (boundary path or triangles)."""
from __future__ import annotations

import numbers
from typing import Iterable, Optional, Sequence, Tuple

import numpy as np

from .boundary import DIRECTIONS, enclosed_triangles, parse_path
from .general import LozengeRegion, _as_triangles
from .parameters import QLike, side_length


def from_boundary(path: str, q: QLike = 1.0, start: Tuple[int, int] = (0, 0)) -> LozengeRegion:
    """The region enclosed by a boundary path in frostline's notation (see :mod:`.boundary`).

    Examples
    --------
    >>> import frostline as fl
    >>> fl.lozenge.from_boundary("2e 2ne 2nw 2w 2sw 2se").count()   # the 2, 2, 2 hexagon
    20
    """
    steps = parse_path(path)
    return LozengeRegion(enclosed_triangles(steps, start), q, description={"shape": "boundary", "path": path})


def hexagon_region(a: int, b: int, c: int, q: QLike = 1.0) -> LozengeRegion:
    """The a, b, c hexagon through the general route (heights on lattice points, step 3).

    Same tilings and weights as :func:`hexagon`, whose fast kernel works on the
    plane partition instead; use this one to compare with other general regions.
    """
    a, b, c = side_length(a, "a"), side_length(b, "b"), side_length(c, "c")
    if a * b + b * c + c * a == 0:
        raise ValueError(f"the {a}, {b}, {c} hexagon has no area; hexagon() handles such degenerate boxes")
    path = f"{a}e {b}ne {c}nw {a}w {b}sw {c}se"
    return LozengeRegion(enclosed_triangles(parse_path(path)), q,
                         description={"shape": "hexagon", "sides": [a, b, c]})


def polygon(lengths: Sequence[int], directions: Optional[Sequence[str]] = None, q: QLike = 1.0) -> LozengeRegion:
    """A lattice polygon given by its side lengths and their directions.

    ``directions`` are names from e, ne, nw, w, sw, se, one per side; by
    default the six directions in counter-clockwise order (a hexagon). The sides
    must close up, and the polygon may be non-convex (turns of +-60 or 120 degrees).

    Examples
    --------
    >>> import frostline as fl
    >>> fl.lozenge.polygon([3, 3, 3, 3, 3, 3]).count()     # the 3, 3, 3 hexagon
    980
    >>> # a non-convex octagon: one turn goes clockwise
    >>> fl.lozenge.polygon([1, 1, 1, 2, 2, 1, 3, 3], ["e", "ne", "nw", "ne", "nw", "w", "sw", "se"]).count()
    16
    """
    lengths = [side_length(v, f"length {k}") for k, v in enumerate(lengths)]
    if directions is None:
        if len(lengths) != 6:
            raise ValueError("give directions for a polygon with other than six sides")
        directions = list(DIRECTIONS)
    directions = list(directions)
    if len(directions) != len(lengths):
        raise ValueError(f"need one direction per side: {len(lengths)} lengths, {len(directions)} directions")
    path = " ".join(f"{n}{d}" for n, d in zip(lengths, directions))
    return LozengeRegion(enclosed_triangles(parse_path(path)), q,
                         description={"shape": "polygon", "lengths": lengths, "directions": directions})


def hexagon_minus(a: int, b: int, c: int, removed: Iterable, q: QLike = 1.0) -> LozengeRegion:
    """The a, b, c hexagon with some unit triangles removed (rows (x, y, s)).

    Removing equally many up and down triangles keeps the region balanced;
    removals that cut a hole or leave an untileable region raise ValueError
    saying why.
    """
    a, b, c = side_length(a, "a"), side_length(b, "b"), side_length(c, "c")
    full = enclosed_triangles(parse_path(f"{a}e {b}ne {c}nw {a}w {b}sw {c}se"))
    removed = list(removed) if not isinstance(removed, np.ndarray) else removed
    gone = _as_triangles(removed) if len(removed) else np.zeros((0, 3), np.int64)  # nothing removed: the hexagon
    keys = {tuple(r) for r in full.tolist()}
    outside = [tuple(r) for r in gone.tolist() if tuple(r) not in keys]
    if outside:
        raise ValueError(f"triangle {outside[0]} is not in the {a}, {b}, {c} hexagon")
    drop = {tuple(r) for r in gone.tolist()}
    kept = np.array([r for r in full.tolist() if tuple(r) not in drop], dtype=np.int64)
    return LozengeRegion(kept, q, description={"shape": "hexagon minus triangles", "sides": [a, b, c],
                                                "removed": gone.tolist()})


def trapezoid(bottom: int, height: int, notches: Optional[Sequence[int]] = None, q: QLike = 1.0) -> LozengeRegion:
    """A trapezoid widening upwards with ``height`` notches cut into its top row.

    The outline is ``bottom`` e, ``height`` ne, ``bottom + height`` w,
    ``height`` se. Its top row holds ``bottom + height`` down triangles
    D(-height + k, height - 1), k = 0 .. bottom + height - 1, one more down
    than up triangle per row; removing the ``height`` of them at positions
    ``notches`` balances the region. The notch positions act as boundary data
    of the tiling. Default: spread evenly.
    """
    n = side_length(bottom, "bottom")
    h = side_length(height, "height")
    if n + h == 0 or h == 0:
        raise ValueError("a trapezoid needs a positive height and width")
    if notches is None:
        notches = [int((k + 0.5) * (n + h) / h) for k in range(h)]
    notches = list(notches)
    if not all(isinstance(k, numbers.Integral) for k in notches):
        raise TypeError("notch positions must be ints")
    if len(set(notches)) != h or min(notches) < 0 or max(notches) >= n + h:
        raise ValueError(f"need {h} distinct notch positions in 0..{n + h - 1}, got {notches}")
    full = enclosed_triangles(parse_path(f"{n}e {h}ne {n + h}w {h}se"))
    drop = {(-h + k, h - 1, 1) for k in notches}
    kept = np.array([r for r in full.tolist() if tuple(r) not in drop], dtype=np.int64)
    return LozengeRegion(kept, q, description={"shape": "trapezoid", "bottom": n, "height": h, "notches": notches})
