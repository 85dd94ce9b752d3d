"""Arctic curves of domain-wall square ice, in the plane frame of vertex (i, j) at (j + 1/2, n - i - 1/2).

In the unit square (x from the left, y from the bottom, u = x - 1/2, v = y - 1/2):

- Free fermion c^2 = a^2 + b^2: the ellipse (u + v)^2 / (a^2/c^2) + (u - v)^2 / (b^2/c^2) = 1,
  a the weight of the type filling the NW and SE corners (docs/references.md section 2,
  derived by the tangent method; it coincides with the biased Aztec ellipse).
- Uniform (Delta = 1/2, alternating sign matrices): four arcs of four ellipses,
  conjectured by Colomo and Pronko ("The limit shape of large alternating sign
  matrices", 2010) and proved by Aggarwal (Invent. Math. 220, 2020). The NW arc
  4x^2 + 4xy + 4y^2 - 8x - 4y + 1 = 0, x = (2r-1)^2 / (2(r^2-r+1)),
  y = (4r-r^2-1) / (2(r^2-r+1)), r in [1/2, 1], is as derived in docs/references.md by
  the tangent method, not quoted from the papers: the tests compare it with samples.
  The other arcs follow by the square's rotations (uniform ASMs are symmetric under them).
"""
from __future__ import annotations

import numpy as np

from frostline.toolkit.curves import conic_points


def free_fermion_curve(n: int, a: float, b: float, c: float, m: int = 720) -> np.ndarray:
    alpha, beta = c * c / (a * a), c * c / (b * b)
    uv = conic_points(alpha + beta, 2 * (alpha - beta), alpha + beta, 0.0, 0.0, -1.0, m)
    return n * (uv + 0.5)


def asm_curve(n: int, m: int = 720) -> np.ndarray:
    r = np.linspace(0.5, 1.0, max(2, m // 4))
    denominator = 2 * (r * r - r + 1)
    nw = np.stack([(2 * r - 1) ** 2 / denominator, (4 * r - r * r - 1) / denominator], axis=1) - 0.5
    arcs = [nw]
    for _ in range(3):  # clockwise quarter turns about the centre: NE, SE, SW
        last = arcs[-1]
        arcs.append(np.stack([last[:, 1], -last[:, 0]], axis=1))
    return n * (np.concatenate(arcs) + 0.5)
