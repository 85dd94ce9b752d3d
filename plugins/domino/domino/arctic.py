"""Arctic curves of the Aztec diamond, in the centred plane frame (cell centres (c - n + 1/2, n - r - 1/2)).

- Uniform: the circle x^2 + y^2 = n^2 / 2 (Jockusch, Propp, Shor, "Random domino
  tilings and the arctic circle theorem", 1998).
- Every vertical domino weighted a: the ellipse x^2 / A + y^2 / B = n^2 with
  A = 1 / (1 + a^2), B = a^2 / (1 + a^2), y the axis through the corners whose
  frozen regions hold horizontal dominoes (docs/references.md section 2: form from
  memory of Cohn, Elkies, Propp 1996, orientation checked with exact probabilities).
"""
from __future__ import annotations

import numpy as np


def aztec_curve(n: int, vertical_weight: float = 1.0, m: int = 720) -> np.ndarray:
    a2 = float(vertical_weight) ** 2
    half_x, half_y = n * np.sqrt(1.0 / (1.0 + a2)), n * np.sqrt(a2 / (1.0 + a2))
    theta = np.linspace(0, 2 * np.pi, m, endpoint=False)
    return np.stack([half_x * np.cos(theta), half_y * np.sin(theta)], axis=1)
