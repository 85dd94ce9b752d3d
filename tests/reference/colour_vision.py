"""Colour differences in normal and simulated colour-deficient vision (for the palette test).

- sRGB <-> linear RGB <-> XYZ (D65) <-> CIELAB: the sRGB standard (IEC 61966-2-1)
  and CIE 1976 L*a*b* (common practice).
- Dichromat simulation: Machado, Oliveira, Fernandes, "A physiologically-based
  model for simulation of color vision deficiency", IEEE TVCG 15 (2009),
  severity 1.0 matrices applied in linear RGB (matrix values from memory).
- Difference: CIE76 Delta E, the Euclidean distance in L*a*b*.
"""
from __future__ import annotations

import itertools
from typing import Dict, Sequence

import numpy as np

SIMULATIONS: Dict[str, np.ndarray] = {
    "normal": np.eye(3),
    "protanopia": np.array([[0.152286, 1.052583, -0.204868],
                            [0.114503, 0.786281, 0.099216],
                            [-0.003882, -0.048116, 1.051998]]),
    "deuteranopia": np.array([[0.367322, 0.860646, -0.227968],
                              [0.280085, 0.672501, 0.047413],
                              [-0.011820, 0.042940, 0.968881]]),
    "tritanopia": np.array([[1.255528, -0.076749, -0.178779],
                            [-0.078411, 0.930809, 0.147602],
                            [0.004733, 0.691367, 0.303900]]),
}

_XYZ = np.array([[0.4124564, 0.3575761, 0.1804375],
                 [0.2126729, 0.7151522, 0.0721750],
                 [0.0193339, 0.1191920, 0.9503041]])
_WHITE = np.array([0.95047, 1.0, 1.08883])


def hex_to_srgb(colour: str) -> np.ndarray:
    colour = colour.lstrip("#")
    return np.array([int(colour[i:i + 2], 16) / 255.0 for i in (0, 2, 4)])


def linear(srgb: np.ndarray) -> np.ndarray:
    return np.where(srgb <= 0.04045, srgb / 12.92, ((srgb + 0.055) / 1.055) ** 2.4)


def lab(colour: str, vision: str = "normal") -> np.ndarray:
    rgb = np.clip(SIMULATIONS[vision] @ linear(hex_to_srgb(colour)), 0.0, 1.0)
    t = (_XYZ @ rgb) / _WHITE
    f = np.where(t > (6 / 29) ** 3, np.cbrt(t), t / (3 * (6 / 29) ** 2) + 4 / 29)
    return np.array([116 * f[1] - 16, 500 * (f[0] - f[1]), 200 * (f[1] - f[2])])


def smallest_difference(colours: Sequence[str]) -> float:
    """The smallest CIE76 Delta E between two colours of the list, over every vision simulation."""
    worst = float("inf")
    for vision in SIMULATIONS:
        points = [lab(c, vision) for c in colours]
        for p, q in itertools.combinations(points, 2):
            worst = min(worst, float(np.linalg.norm(p - q)))
    return worst
