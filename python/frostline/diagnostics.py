"""How far is a forward chain from equilibrium? Works on any region of any lattice.

Two chains start from the least and the greatest state and use the same random
numbers (same seed, same sweep times). For a monotone rule they stay ordered
and meet exactly when coupling from the past from that time would coalesce; for
any rule, the shrinking gap between them shows how much of the start is still
remembered. The integrated autocorrelation time of an observable of one chain
(Sokal's automatic window, "Monte Carlo methods in statistical mechanics", 1997)
says how many sweeps make one effectively independent sample.
"""
from __future__ import annotations

from dataclasses import dataclass
from typing import Any, Callable, Optional

import numpy as np

from .seeding import SeedLike, normalise_seed


@dataclass(frozen=True)
class ChainDiagnostics:
    """Traces recorded every ``every`` sweeps (times in sweeps)."""

    times: np.ndarray          # sweeps done at each record
    gap: np.ndarray            # mean |h_top - h_bottom| over sites
    observable: np.ndarray     # the observable on the chain started at the greatest state
    met_at: Optional[int]      # first recorded time with zero gap (None if never)
    autocorrelation_time: float  # integrated, in sweeps, over the second half of the run


def integrated_autocorrelation_time(x: np.ndarray, window_factor: float = 5.0) -> float:
    """tau_int = 1/2 + sum_{t>=1} rho(t), summed up to the first window M >= window_factor * tau(M)."""
    x = np.asarray(x, dtype=float)
    x = x - x.mean()
    if x.size < 4 or np.allclose(x, 0):
        return 0.5
    f = np.fft.rfft(x, n=2 * x.size)
    acf = np.fft.irfft(f * np.conj(f))[: x.size]
    rho = acf / acf[0]
    tau = 0.5
    for m in range(1, x.size):
        tau += rho[m]
        if m >= window_factor * tau:
            break
    return float(max(tau, 0.5))


def equilibrium_diagnostics(region: Any, sweeps: int, *, seed: SeedLike = None, every: int = 1,
                            observable: Optional[Callable[[np.ndarray], float]] = None) -> ChainDiagnostics:
    """Run coupled chains from the least and greatest states for ``sweeps`` sweeps.

    ``observable(heights)`` defaults to the mean height. The autocorrelation
    time is measured on the second half of the top chain's trace and reported
    in sweeps.
    """
    if every < 1 or sweeps < every:
        raise ValueError("need sweeps >= every >= 1")
    sequence = normalise_seed(seed)
    top = region.chain(seed=sequence, start="max")
    bottom = region.chain(seed=sequence, start="min")
    observe = observable or (lambda h: float(np.mean(h)))
    records = sweeps // every
    times = np.arange(1, records + 1) * every
    gap = np.empty(records)
    values = np.empty(records)
    for k in range(records):
        top.run(every)
        bottom.run(every)
        ht, hb = top.heights, bottom.heights
        gap[k] = float(np.mean(np.abs(ht.astype(np.int64) - hb)))
        values[k] = observe(ht)
    met = np.flatnonzero(gap == 0)
    half = values[records // 2:]
    tau = integrated_autocorrelation_time(half) * every
    return ChainDiagnostics(times, gap, values, int(times[met[0]]) if met.size else None, tau)
