"""Named domino regions and the ways to give a region."""
from __future__ import annotations

from typing import Any, Optional

import numpy as np

from frostline._limits import check_memory
from frostline._validate import integer

from .geometry import aztec_mask
from .region import DominoRegion, region_bytes
from .weights import biased, two_periodic

FILLED = "#xX@"
EMPTY = ".- _"


def _order(n: Any, name: str) -> int:
    return integer(n, name, 1, 2**14)


def aztec_diamond(n: int, *, horizontal: Any = None, vertical: Any = None, vertical_weight: Optional[float] = None,
                  two_periodic_weights: Optional[tuple] = None) -> DominoRegion:
    """The Aztec diamond of order n (2n(n+1) cells, 2^(n(n+1)/2) tilings when unweighted).

    Weights (optional, one way at a time): ``horizontal`` / ``vertical``
    arrays (see :mod:`.weights`); ``vertical_weight=a`` gives every vertical
    domino weight a; ``two_periodic_weights=(a, b)`` the two-periodic weights.
    Domino classes are named after the corners where they freeze (north at the top).

    Examples
    --------
    >>> import frostline as fl
    >>> fl.domino.aztec_diamond(3).count()
    64
    """
    n = _order(n, "the order n")
    weighted = any(x is not None for x in (horizontal, vertical, vertical_weight, two_periodic_weights))
    check_memory(region_bytes(2 * n, 2 * n, 2 * n * (n + 1), weighted), f"the Aztec diamond of order {n}")  # before any array
    given = sum(x is not None for x in (vertical_weight, two_periodic_weights)) + (horizontal is not None or vertical is not None)
    if given > 1:
        raise ValueError("give weights one way: arrays, vertical_weight or two_periodic_weights")
    shape = (2 * n, 2 * n)
    description = {"shape": "aztec diamond", "order": n}
    if vertical_weight is not None:
        horizontal, vertical = biased(shape, vertical_weight)
        description["vertical_weight"] = float(vertical_weight)
    elif two_periodic_weights is not None:
        if len(two_periodic_weights) != 2:
            raise ValueError("two_periodic_weights is a pair (a, b)")
        horizontal, vertical = two_periodic(shape, *two_periodic_weights)
        description["two_periodic_weights"] = [float(v) for v in two_periodic_weights]
    return DominoRegion(aztec_mask(n), horizontal, vertical, class_offset=(n - 1) % 2, description=description,
                        known_tileable=True)


def rectangle(rows: int, columns: int, *, horizontal: Any = None, vertical: Any = None) -> DominoRegion:
    """The rows x columns rectangle (counted by the Kasteleyn / Temperley-Fisher product)."""
    rows, columns = _order(rows, "rows"), _order(columns, "columns")
    check_memory(region_bytes(rows, columns, rows * columns, horizontal is not None or vertical is not None),
                 f"the {rows}x{columns} rectangle")
    if rows * columns % 2:
        raise ValueError(f"a {rows}x{columns} rectangle has an odd number of cells and cannot be tiled")
    return DominoRegion(np.ones((rows, columns), bool), horizontal, vertical,
                        description={"shape": "rectangle", "rows": rows, "columns": columns}, known_tileable=True)


def from_mask(mask: Any, *, horizontal: Any = None, vertical: Any = None) -> DominoRegion:
    """Any region given as a 2-D boolean array: ``mask[r, c]`` True = cell (r, c) in the region, row 0 at the top."""
    return DominoRegion(mask, horizontal, vertical, description={"shape": "mask"})


def from_picture(picture: str, **weights: Any) -> DominoRegion:
    """A region drawn as text: one line per row, ``#`` (or ``x``) a cell, ``.`` (or space) no cell.

    Lines may differ in length (missing cells are empty); blank lines at the
    start and end are ignored.

    Examples
    --------
    >>> import frostline as fl
    >>> fl.domino.from_picture('''
    ... .##.
    ... ####
    ... ####
    ... .##.
    ... ''').count()
    8
    """
    if not isinstance(picture, str):
        raise TypeError(f"a picture is a str of '#' and '.' lines, got {type(picture).__name__}")
    lines = picture.split("\n")
    while lines and not lines[0].strip():
        lines.pop(0)
    while lines and not lines[-1].strip():
        lines.pop()
    if not lines:
        raise ValueError("the picture is empty: draw cells with '#'")
    width = max(len(line) for line in lines)
    # the bounding box, not the text, sets the size: one long line among many short ones is a big region
    check_memory(region_bytes(len(lines), width, len(lines) * width,
                              any(w is not None for w in weights.values())),
                 f"the {len(lines)}x{width} picture")
    mask = np.zeros((len(lines), width), bool)
    filled_codes, empty_codes = (np.array([ord(ch) for ch in symbols], np.uint32) for symbols in (FILLED, EMPTY))
    for r, line in enumerate(lines):
        codes = np.frombuffer(line.encode("utf-32-le"), dtype="<u4")   # one code point per character
        filled = np.isin(codes, filled_codes)
        bad = ~filled & ~np.isin(codes, empty_codes)
        if bad.any():
            c = int(np.argmax(bad))
            raise ValueError(f"unexpected symbol {line[c]!r} in row {r}, column {c} of the picture; "
                             f"use '#' for a cell and '.' for none")
        mask[r, :len(line)] = filled
    return DominoRegion(mask, weights.get("horizontal"), weights.get("vertical"), description={"shape": "picture"})
