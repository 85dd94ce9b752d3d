"""Every configuration of a tiny height model, by walking its distributive lattice.

Starts at the least height function (Thurston) and explores single-site moves
of one step up or down that keep every constraint; the configurations of a
height model form a distributive lattice connected by such moves, so this
reaches all of them. Written only against the generic model, so it works for
every lattice plugin.
"""
from __future__ import annotations

from typing import List

import numpy as np

from ..model import HeightModel


class EnumerationTooLarge(ValueError):
    """Raised when a region has more configurations than the enumeration cap."""


def enumerate_heights(model: HeightModel, cap: int = 200_000) -> np.ndarray:
    """All height functions of ``model``, as an int32 array (count, n_nodes), sorted.

    Raises
    ------
    EnumerationTooLarge
        When more than ``cap`` configurations exist (the message says so).
    """
    least, greatest = model.extremes()
    n = model.n_sites
    step = model.step
    cons = np.asarray(model.constraints, dtype=np.int64).reshape(-1, 3)
    # per site: upper bounds h[v] <= h[u] + c (rows with to == v) and lower bounds
    # h[v] >= h[w] - c (rows with from == v)
    up_site, up_node, up_off = cons[:, 1], cons[:, 0], cons[:, 2]
    lo_site, lo_node, lo_off = cons[:, 0], cons[:, 1], cons[:, 2]
    up_mask = up_site < n
    lo_mask = lo_site < n

    def bounds(h: np.ndarray):
        hi = np.full(n, np.iinfo(np.int64).max)
        lo = np.full(n, np.iinfo(np.int64).min)
        np.minimum.at(hi, up_site[up_mask], h[up_node[up_mask]] + up_off[up_mask])
        np.maximum.at(lo, lo_site[lo_mask], h[lo_node[lo_mask]] - lo_off[lo_mask])
        return lo, hi

    start = np.asarray(least, dtype=np.int64)
    seen = {start[:n].tobytes()}
    frontier: List[np.ndarray] = [start]
    found: List[np.ndarray] = [start]
    while frontier:
        h = frontier.pop()
        lo, hi = bounds(h)
        for v in range(n):
            for new in (h[v] + step, h[v] - step):
                if lo[v] <= new <= hi[v]:
                    g = h.copy()
                    g[v] = new
                    key = g[:n].tobytes()
                    if key not in seen:
                        seen.add(key)
                        if len(seen) > cap:
                            raise EnumerationTooLarge(
                                f"the region has more than {cap} configurations; exact enumeration is for tiny "
                                "regions (raise cap= if you really mean it)"
                            )
                        frontier.append(g)
                        found.append(g)
    out = np.array(found, dtype=np.int32)
    order = np.lexsort(out[:, :n].T[::-1]) if n else np.arange(len(out))
    return out[order]


def enumerate_configurations(region, cap: int = 200_000) -> List[np.ndarray]:
    """Every configuration of a tiny region of any plugin, as height arrays in the region's convention.

    Built only from the generic height model (the distributive lattice walked
    by local moves from the least element). Raises EnumerationTooLarge above ``cap``.
    """
    model, _, _ = region.heat_bath_rule()
    return [region.heights_from_model(h) for h in enumerate_heights(model, cap)]


def distribution(region, cap: int = 200_000):
    """(configurations, exact probabilities as Fractions) under the region's weights."""
    from fractions import Fraction

    configurations = enumerate_configurations(region, cap)
    weights = [Fraction(region.configuration_weight(h)) for h in configurations]
    total = sum(weights, Fraction(0))
    return configurations, [w / total for w in weights]
