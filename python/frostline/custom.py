"""Height models defined at run time from Python, with no compiler.

Give sites, boundary values, constraints (numpy arrays), residues and step,
colour classes, and a rule (uniform, q^height, or a two-point rule dict); wrap
the :class:`~frostline.HeightModel` in :class:`ModelRegion` and it has the API
of the built-in lattices: exact ``sample`` by monotone coupling from the past,
``samples``, ``chain``, ``count`` and ``partition_function`` by enumeration.

Example: Dyck paths of length 2n (h_0 = h_2n = 0, h >= 0, steps of +-1),
counted by the Catalan numbers (OEIS A000108)::

    import frostline as fl
    R = fl.custom.ModelRegion(fl.custom.dyck_path_model(5))
    R.count()          # 42
    R.sample(seed=0).heights   # h_1 .. h_9
"""
from __future__ import annotations

from fractions import Fraction
from typing import Any, Dict, Optional

import numpy as np

from . import _core
from .model import HeightModel, check_rule
from .region import Region, Sample


class ModelRegion(Region):
    """A region given directly by a generic height model.

    ``Sample.heights`` holds the site heights (length ``model.n_sites``);
    ``Sample.tiles`` lists them as rows (site, height). The weight of a
    configuration is q ** (sum of (h - least) / step), or the two-point rule
    ``rule`` (see :meth:`HeightModel.sample`).
    """

    lattice = "model"
    tile_classes = ("site",)

    def __init__(self, model: HeightModel, q: float = 1.0, rule: Optional[dict] = None, name: str = "model") -> None:
        if not isinstance(model, HeightModel):
            raise TypeError(f"need a frostline.HeightModel, got {type(model).__name__}")
        if model.n_sites == 0:
            raise ValueError("the model has no sites (an empty lattice): nothing to sample")
        q = float(q)
        if not np.isfinite(q) or q <= 0:
            raise ValueError(f"q must be finite and positive, got {q}")
        if rule is not None and q != 1.0:
            raise ValueError("give either q or a two-point rule, not both")
        check_rule(rule, model.n_sites, model.n_nodes)
        self.model, self.q, self.rule, self.name = model, q, rule, str(name)
        self.least, self.greatest = (h[: model.n_sites] for h in model.extremes())  # validity, with clear errors

    def nodes_from_heights(self, heights: np.ndarray) -> np.ndarray:
        h = np.asarray(heights)
        if h.shape != (self.model.n_sites,):
            raise ValueError(f"heights must have one entry per site ({self.model.n_sites})")
        return np.concatenate([h, self.model.boundary_values]).astype(np.int64)

    def heights_from_model(self, node_heights: np.ndarray) -> np.ndarray:
        return np.asarray(node_heights[: self.model.n_sites], dtype=np.int32)

    def exactness_check(self) -> None:
        """A two-point rule may not be monotone: check it before claiming exactness."""
        if self.rule is None:
            return
        from .toolkit.checker import check_monotone

        report = check_monotone(self.model, q=self.q, rule=self.rule)  # Region caches the outcome
        if not report.monotone:
            raise ValueError(f"this rule is not monotone ({report.detail}); coupling from the past "
                             "would not be exact. Use chain() and frostline.equilibrium_diagnostics")

    def tiles_from_heights(self, heights: np.ndarray) -> np.ndarray:
        h = np.asarray(heights)
        return np.stack([np.arange(h.size), h.ravel()], axis=1).astype(np.int64)

    def classify(self, tiles: np.ndarray) -> np.ndarray:
        return np.zeros(len(tiles), dtype=np.int8)

    def tile_centres(self, tiles: np.ndarray) -> np.ndarray:
        return np.asarray(tiles, dtype=float)

    def heat_bath_rule(self):
        return self.model, self.q, self.rule

    def configurations(self, cap: int = 10**6) -> np.ndarray:
        """Every configuration (rows of site heights), by depth-first search (independent of the moves).

        Raises EnumerationTooLarge above ``cap`` configurations; the memory the
        cap could take is checked first, and Ctrl-C stops the search.
        """
        from ._limits import check_memory
        from ._validate import count as check_count

        cap = check_count(cap, "cap")
        check_memory(4 * max(self.model.n_sites, 1) * cap + 10**6,
                     f"up to {cap} configurations of {self.model.n_sites} sites (lower cap=)")
        try:
            return _core.engine.all_configurations(self.model._compiled, int(cap))
        except ValueError as exc:
            from .exact import EnumerationTooLarge

            raise EnumerationTooLarge(str(exc)) from None

    def count(self) -> int:
        """Number of configurations, by enumeration (raises EnumerationTooLarge above 10^6)."""
        return int(len(self.configurations()))

    def configuration_weight(self, heights: np.ndarray) -> Any:
        if self.rule is not None:
            raise ValueError("the weight of a configuration under a two-point rule is not known to frostline")
        steps = int((np.asarray(heights, dtype=np.int64) - self.least).sum()) // self.model.step
        return Fraction(self.q) ** steps

    def partition_function(self) -> Any:
        """Sum over configurations of q ** (steps above the least state), exactly, by enumeration."""
        if self.q == 1.0 and self.rule is None:
            return self.count()
        return sum((self.configuration_weight(h) for h in self.configurations()), Fraction(0))

    def describe(self) -> Dict[str, Any]:
        return {"lattice": self.lattice, "name": self.name, "sites": self.model.n_sites, "q": self.q}

    def draw(self, sample: Sample, ax: Any = None, **style: Any) -> Any:
        """Heights against site index."""
        import matplotlib.pyplot as plt

        if ax is None:
            _, ax = plt.subplots(figsize=(6, 3))
        ax.plot(np.arange(len(sample.heights)), sample.heights, marker="o", **style)
        ax.set_xlabel("site")
        ax.set_ylabel("height")
        return ax


def dyck_path_model(n: int) -> HeightModel:
    """Dyck paths of length 2n as a height model: sites h_1 .. h_{2n-1}, |h_{i+1} - h_i| = 1, h >= 0.

    Boundary nodes: h_0 = h_2n = 0 and two floor nodes (0 for even sites, 1
    for odd ones, so each bound respects the residues i mod 2). Step 2.
    """
    if isinstance(n, bool) or not isinstance(n, (int, np.integer)) or n < 1:
        raise ValueError(f"n must be a positive int, got {n!r}")
    sites = 2 * n - 1
    start, end, floor_even, floor_odd = sites, sites + 1, sites + 2, sites + 3
    path = [start] + list(range(sites)) + [end]
    rows = []
    for u, v in zip(path, path[1:]):
        rows += [(u, v, 1), (v, u, 1)]
    for i in range(sites):  # h_i >= floor: h[floor] - h[i] <= 0
        rows.append((i, floor_even if (i + 1) % 2 == 0 else floor_odd, 0))
    residues = np.array([(i + 1) % 2 for i in range(sites)])
    return HeightModel(sites, np.array([0, 0, 0, 1]), np.array(rows), residues, 2, residues)
