"""Seeds: ``int | numpy.random.SeedSequence | None`` normalised with numpy's own SeedSequence.

The compiled engine draws every random decision from a counter-based hash of
(key, stream, time step, site). The 128-bit key comes from the SeedSequence,
so ensemble member ``i`` (child ``i`` of a seed's SeedSequence) has an
independent key, and the same seed gives the same sample on any machine.
"""
from __future__ import annotations

import numbers
from dataclasses import dataclass
from typing import Tuple, Union

import numpy as np

SeedLike = Union[int, np.random.SeedSequence, None]


@dataclass(frozen=True)
class SeedRecord:
    """What reproduces a run: the SeedSequence's entropy, spawn key and pool size."""

    entropy: Union[int, Tuple[int, ...]]
    spawn_key: Tuple[int, ...]
    pool_size: int = 4

    def sequence(self) -> np.random.SeedSequence:
        """The SeedSequence this record describes."""
        entropy = list(self.entropy) if isinstance(self.entropy, tuple) else self.entropy
        return np.random.SeedSequence(entropy, spawn_key=self.spawn_key, pool_size=self.pool_size)

    def as_dict(self) -> dict:
        """JSON-ready form."""
        entropy = list(self.entropy) if isinstance(self.entropy, tuple) else self.entropy
        return {"entropy": entropy, "spawn_key": list(self.spawn_key), "pool_size": self.pool_size}

    @classmethod
    def from_dict(cls, d: dict) -> SeedRecord:
        entropy = d["entropy"]
        entropy = tuple(int(v) for v in entropy) if isinstance(entropy, list) else int(entropy)
        return cls(entropy, tuple(int(v) for v in d["spawn_key"]), int(d.get("pool_size", 4)))


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
    entropy = sequence.entropy
    if entropy is None:
        raise ValueError("a SeedSequence without entropy cannot be recorded")
    if isinstance(entropy, (int, np.integer)):
        value: Union[int, Tuple[int, ...]] = int(entropy)
    else:
        value = tuple(int(v) for v in np.asarray(entropy).ravel())
    return SeedRecord(entropy=value, spawn_key=tuple(int(v) for v in sequence.spawn_key),
                      pool_size=int(sequence.pool_size))


def child_sequence(root: np.random.SeedSequence, i: int) -> np.random.SeedSequence:
    """Child ``i`` of ``root``: the same as ``root.spawn(k)[i]`` on a fresh copy of ``root``, made alone.

    Ensembles use it so that member i never depends on how many members are
    made, where, or in what order.
    """
    return np.random.SeedSequence(root.entropy, spawn_key=(*root.spawn_key, int(i)), pool_size=root.pool_size)
