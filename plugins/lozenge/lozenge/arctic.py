"""The arctic curve of the uniform a, b, c hexagon: the ellipse inscribed in it.

Cohn, Larsen, Propp, "The shape of a typical boxed plane partition", New York
J. Math. 4 (1998). The explicit equation in frostline's plane coordinates
(corners V0 = (0, 0), V1 = (a, 0), V2 = (a + b/2, sqrt(3) b / 2), ...) is the
one in docs/references.md section 2 (derived there from the theorem and checked):

  3(b+c)^2 X^2 + 2 sqrt3 (c-b)(2a+b+c) XY + (4a^2+4ab+4ac+b^2-2bc+c^2) Y^2
  - 6ac(b+c) X - 2 sqrt3 ac(2a+3b+c) Y + 3 a^2 c^2 = 0.
"""
from __future__ import annotations

import math

import numpy as np

from frostline.toolkit.curves import conic_points


def hexagon_ellipse(a: int, b: int, c: int, m: int = 720) -> np.ndarray:
    """m points of the inscribed ellipse, plane coordinates (closed curve, counter-clockwise)."""
    if min(a, b, c) <= 0:
        raise ValueError("a degenerate hexagon has no liquid region and no arctic curve")
    s3 = math.sqrt(3.0)
    return conic_points(3 * (b + c) ** 2, 2 * s3 * (c - b) * (2 * a + b + c),
                        4 * a * a + 4 * a * b + 4 * a * c + b * b - 2 * b * c + c * c,
                        -6 * a * c * (b + c), -2 * s3 * a * c * (2 * a + 3 * b + c), 3 * a * a * c * c, m)
