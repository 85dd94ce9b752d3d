"""Forward heat-bath Markov chains on a region (:meth:`Region.chain`)."""
from __future__ import annotations

from typing import Any, Callable

import numpy as np

from ._validate import count as _check_count
from .model import ProgressHook
from .seeding import seed_record


class Chain:
    """A forward heat-bath Markov chain on a region, for studying the dynamics.

    Each sweep updates every site once (colour class by colour class) with the
    same counter-based random numbers as the exact sampler uses, keyed by the
    chain's seed and the sweep's time index. ``run`` may be interrupted with
    Ctrl-C; the state stays consistent and ``time`` counts the sweeps done.

    ``region`` is the :class:`frostline.Region` the chain runs on (typed Any
    here so that this module does not import the one that imports it).
    """

    def __init__(self, region: Any, compiled: Any, sequence: np.random.SeedSequence,
                 to_heights: Callable[[np.ndarray], np.ndarray], kernel: str) -> None:
        self.region = region
        self.kernel = kernel
        self._compiled = compiled
        self._to_heights = to_heights
        self.seed = seed_record(sequence)

    @property
    def time(self) -> int:
        """Sweeps run so far."""
        return int(self._compiled.time)

    @property
    def heights(self) -> np.ndarray:
        """The current state in the lattice's height convention (a copy)."""
        return self._to_heights(self._compiled.heights)

    def run(self, sweeps: int, progress: ProgressHook = None) -> Chain:
        """Run ``sweeps`` sweeps (GIL released); returns self."""
        sweeps = _check_count(sweeps, "sweeps")
        self._compiled.run(sweeps, progress)
        return self

    def trace(self, observable: Callable[[np.ndarray], float], sweeps: int, every: int = 1) -> np.ndarray:
        """Run ``sweeps`` sweeps, recording ``observable(heights)`` every ``every`` sweeps.

        Returns a float array of length ``sweeps // every``.
        """
        sweeps = _check_count(sweeps, "sweeps")
        every = _check_count(every, "every")
        if every == 0:
            raise ValueError("every must be at least 1")
        values = np.empty(sweeps // every)
        for k in range(values.size):
            self.run(every)
            values[k] = observable(self.heights)
        return values
