"""Argument checks shared by the plugins (clear TypeError / ValueError messages)."""
from __future__ import annotations

import numbers
from typing import Any


def integer(value: Any, name: str, minimum: int = 0, maximum: int = 2**30, hint: str = "") -> int:
    """``value`` as an int in [minimum, maximum]; bools and non-integers are TypeErrors."""
    if isinstance(value, bool) or not isinstance(value, numbers.Integral):
        raise TypeError(f"{name} must be an int, got {value!r} of type {type(value).__name__}")
    value = int(value)
    if value < minimum:
        bound = "non-negative" if minimum == 0 else f"at least {minimum}"
        raise ValueError(f"{name} must be {bound}, got {value}{hint}")
    if value > maximum:
        raise ValueError(f"{name} = {value} is beyond {maximum}: more than fits in memory or the 32-bit height range")
    return int(value)


def count(value: Any, name: str) -> int:
    """A non-negative int below 2^62 (sweeps, sample counts, time limits)."""
    if isinstance(value, bool) or not isinstance(value, numbers.Integral):
        raise TypeError(f"{name} must be an int, got {type(value).__name__}")
    value = int(value)
    if value < 0:
        raise ValueError(f"{name} must be non-negative, got {value}")
    if value >= 2**62:
        raise ValueError(f"{name} = {value} is beyond 2^62")
    return int(value)
