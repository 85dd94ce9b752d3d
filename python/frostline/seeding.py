"""Seeds: ``int | numpy.random.SeedSequence | None`` normalised with numpy's own SeedSequence.

The compiled engine draws every random decision from a counter-based hash of
(key, stream, time step, site). The 128-bit key comes from the SeedSequence,
so ensemble member ``i`` (child ``i`` of a seed's SeedSequence) has an
independent key, and the same seed gives the same sample on any machine.
"""
from __future__ import annotations

import numbers
from dataclasses import dataclass
from typing import Optional, Tuple, Union

import numpy as np

SeedLike = Union[int, np.random.SeedSequence, None]


@dataclass(frozen=True)
class SeedRecord:
    """What reproduces a run: the SeedSequence's entropy and spawn key."""

    entropy: int
    spawn_key: Tuple[int, ...]

    def sequence(self) -> np.random.SeedSequence:
        """The SeedSequence this record describes."""
        return np.random.SeedSequence(self.entropy, spawn_key=self.spawn_key)


def normalise_seed(seed: SeedLike) -> np.random.SeedSequence:
    """Return a SeedSequence for ``seed``.

    Raises
    ------
    TypeError
        For anything but a non-negative int, a SeedSequence or None.
    ValueError
        For a negative int.
    """
    if seed is None:
        return np.random.SeedSequence()
    if isinstance(seed, np.random.SeedSequence):
        return seed
    if isinstance(seed, bool) or not isinstance(seed, numbers.Integral):
        raise TypeError(
            f"seed must be a non-negative int, a numpy.random.SeedSequence or None, got {type(seed).__name__}"
        )
    if seed < 0:
        raise ValueError(f"seed must be non-negative, got {seed}")
    return np.random.SeedSequence(int(seed))


def engine_key(sequence: np.random.SeedSequence) -> Tuple[int, int]:
    """The engine's 128-bit key (two 64-bit words) drawn from ``sequence``."""
    words = sequence.generate_state(2, dtype=np.uint64)
    return int(words[0]), int(words[1])


def seed_record(sequence: np.random.SeedSequence) -> SeedRecord:
    """The record stored in every result so the run can be repeated."""
    entropy: Optional[int] = sequence.entropy  # type: ignore[assignment]
    return SeedRecord(entropy=int(entropy) if entropy is not None else 0, spawn_key=tuple(sequence.spawn_key))
