"""Checks of the lozenge shapes' parameters: side lengths and the weight q per cube."""
from __future__ import annotations

import numbers
from fractions import Fraction
from typing import Any, Tuple, Union

import numpy as np

from frostline._validate import integer

QLike = Union[float, int, Fraction]


def side_length(value: Any, name: str) -> int:
    return integer(value, f"side {name}", 0, 2**30, " (a side of 0 is a valid degenerate hexagon)")


def weight(q: Any) -> Tuple[float, Fraction]:
    if isinstance(q, bool) or not isinstance(q, (numbers.Real, Fraction)):
        raise TypeError(f"q must be a real number, got {q!r} of type {type(q).__name__}")
    try:
        value = float(q)
    except OverflowError:
        raise ValueError("q must be a finite positive number, got one too large for a float") from None
    if not np.isfinite(value) or value <= 0.0:
        raise ValueError(f"q must be a finite positive number, got {q!r}")
    return value, Fraction(q) if isinstance(q, (Fraction, numbers.Integral)) else Fraction(value)
