"""A plain numpy heat-bath chain for any region, as a user would write it: the baseline of the tables.

It reads the region's generic height model (the same sites, constraints and
colour classes the engine runs; uniform weights only) and updates one colour
class at a time with numpy's vector operations and its own random generator.
It is a speed reference, not a sampler of frostline: its random numbers differ.
"""
from __future__ import annotations

import time
from typing import Tuple

import numpy as np


def numpy_chain_rate(region, seconds: float = 2.0, seed: int = 0) -> float:
    """Site updates per second of the numpy chain on ``region``, measured for about ``seconds``."""
    model, _q, _rule = region.heat_bath_rule()
    n = model.n_sites
    rng = np.random.default_rng(seed)
    heights = np.asarray(model.extremes()[0], dtype=np.int64).copy()  # the least configuration, all nodes
    u, v, c = (model.constraints[:, k].astype(np.int64) for k in range(3))
    step = model.step
    residues = model.residues.astype(np.int64)
    classes = [np.flatnonzero(model.colour_classes == k) for k in np.unique(model.colour_classes)]
    # rows that bound a site from above (v is the site) and from below (u is the site)
    above = [(np.flatnonzero(np.isin(v, members) & (v < n))) for members in classes]
    below = [(np.flatnonzero(np.isin(u, members) & (u < n))) for members in classes]
    done, start = 0, time.perf_counter()
    big = np.int64(2**40)
    while time.perf_counter() - start < seconds:
        for members, up_rows, down_rows in zip(classes, above, below):
            hi = np.full(n, big)
            lo = np.full(n, -big)
            np.minimum.at(hi, v[up_rows], heights[u[up_rows]] + c[up_rows])
            np.maximum.at(lo, u[down_rows], heights[v[down_rows]] - c[down_rows])
            lo_m, hi_m, res = lo[members], hi[members], residues[members]
            lo_m = lo_m + (res - lo_m) % step          # round into the residue class
            hi_m = hi_m - (hi_m - res) % step
            heights[members] = lo_m + step * rng.integers(0, (hi_m - lo_m) // step + 1)
            done += members.size
    return done / (time.perf_counter() - start)


def timed(thunk) -> Tuple[float, object]:
    """(seconds, value) of one call."""
    start = time.perf_counter()
    value = thunk()
    return time.perf_counter() - start, value
