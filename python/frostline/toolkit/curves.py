"""Curve geometry: points on conics (the published arctic curves are mostly ellipses)."""
from __future__ import annotations

import numpy as np


def conic_points(a: float, b: float, c: float, d: float, e: float, f: float, m: int = 720) -> np.ndarray:
    """m points on the ellipse a x^2 + b xy + c y^2 + d x + e y + f = 0 (counter-clockwise, closed)."""
    centre = np.linalg.solve(np.array([[2 * a, b], [b, 2 * c]]), np.array([-d, -e]))
    value = a * centre[0] ** 2 + b * centre[0] * centre[1] + c * centre[1] ** 2 + d * centre[0] + e * centre[1] + f
    theta = np.linspace(0, 2 * np.pi, m, endpoint=False)
    u = np.stack([np.cos(theta), np.sin(theta)], axis=1)
    quad = a * u[:, 0] ** 2 + b * u[:, 0] * u[:, 1] + c * u[:, 1] ** 2
    if value >= 0 or np.any(quad <= 0):
        raise ValueError("the conic is not a real ellipse")
    r = np.sqrt(-value / quad)
    return centre + r[:, None] * u
