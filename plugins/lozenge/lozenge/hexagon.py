"""The a x b x c hexagon: plane partitions in a box, uniform or weighted q^volume."""
from __future__ import annotations

from fractions import Fraction
from typing import Any, Dict, Optional, Tuple

import numpy as np

from frostline import _core
from frostline._limits import check_memory
from frostline.exact.budget import DEFAULT_BUDGET_SECONDS, DEFAULT_MAX_DIGITS
from frostline.methods import ChainKernel, ExactMethod, RunOptions
from frostline.model import HeightModel
from frostline.region import Region
from frostline.variational import VariationalRegion

from . import counts
from .parameters import QLike, side_length, weight
from .tile_mixin import LozengeTiles
from .tiles import hexagon_corners, tiles_of_plane_partition


def box_tile_bytes(a: int, b: int, c: int) -> int:
    """Peak memory (bytes) of the tiles of an a x b x c box's tiling: the (k, 3) int64 rows, their sorted
    copy and the per-column work arrays (fitted to measured peaks; tests/test_memory_estimates.py)."""
    return 90 * (a * b + b * c + c * a) + 110 * (a + 1) * (b + 2) + 10**6


class HexagonRegion(LozengeTiles, VariationalRegion, Region):
    """Lozenge tilings of the a, b, c hexagon = plane partitions in an a x b x c box.

    Heights (``Sample.heights``) are the plane partition: an int32 array of
    shape (a, b), values in [0, c], non-increasing along both axes; its sum is
    the volume (number of cubes). Tiles are (x, y, t) rows as in
    :mod:`frostline.lozenge.tiles`: ab of type 0, bc of type 1, ca of type 2.
    The weight of a configuration is q ** volume (q = 1: uniform).
    """

    def __init__(self, a: int, b: int, c: int, q: QLike = 1.0) -> None:
        self.a, self.b, self.c = side_length(a, "a"), side_length(b, "b"), side_length(c, "c")
        self.q, self._q_exact = weight(q)
        # two padded chains and the result (int32), the q table; a sample's tiles are checked when they are
        # made (box_tile_bytes), so counts and heights of long thin boxes stay cheap
        estimate = 12 * (self.a + 2) * (self.b + 2) + (8 * (self.c + 3) if self.q != 1.0 else 0)
        check_memory(estimate, f"the {self.a}x{self.b}x{self.c} hexagon ({self.a * self.b} cells)")
        self._model: HeightModel | None = None

    def __repr__(self) -> str:
        return f"HexagonRegion(a={self.a}, b={self.b}, c={self.c}, q={self.q!r})"

    def describe(self) -> Dict[str, Any]:
        return {"lattice": self.lattice, "shape": "box", "sides": [self.a, self.b, self.c], "q": self.q}

    @property
    def corners(self) -> np.ndarray:
        """The six corners in lattice coordinates (counter-clockwise from (0, 0))."""
        return hexagon_corners(self.a, self.b, self.c)

    # ----- lowering to the generic engine ---------------------------------
    def lower(self) -> HeightModel:
        """The generic height model: one site per cell, step 1, weight q per cube.

        Site r * b + s is cell (r, s); boundary node 0 holds c (above and to the
        left of the box), node 1 holds 0 (below and to the right). Colour class
        (r + s) % 2, as in the fast kernel, so both draw identical random bits.
        """
        if self._model is None:
            a, b, c = self.a, self.b, self.c
            n = a * b
            # constraint rows (3 x int64 and int32 copies), CSR lists, extremes and chains
            check_memory(300 * (n + 2) + 10**6, f"the generic model of the {a}x{b}x{c} hexagon")
            top, floor = n, n + 1
            site = np.arange(n, dtype=np.int64).reshape(a, b)
            pairs = np.zeros((0, 2), np.int64)
            if n:
                pairs = np.concatenate([
                    # h[r+1, s] <= h[r, s] and h[r, s+1] <= h[r, s]: rows (above, below)
                    np.stack([site[:-1, :].ravel(), site[1:, :].ravel()], axis=1),
                    np.stack([site[:, :-1].ravel(), site[:, 1:].ravel()], axis=1),
                    # h[0, s] <= c and h[r, 0] <= c
                    np.stack([np.full(b, top), site[0, :]], axis=1),
                    np.stack([np.full(a, top), site[:, 0]], axis=1),
                    # 0 <= h[a-1, s] and 0 <= h[r, b-1]
                    np.stack([site[-1, :], np.full(b, floor)], axis=1),
                    np.stack([site[:, -1], np.full(a, floor)], axis=1),
                ])
            constraints = np.concatenate([pairs, np.zeros((len(pairs), 1), np.int64)], axis=1)
            r, s = np.divmod(np.arange(n), max(b, 1))
            self._model = HeightModel(n, np.array([c, 0]), constraints, np.zeros(n), 1, (r + s) % 2)
        return self._model

    def heights_from_model(self, node_heights: np.ndarray) -> np.ndarray:
        return self._cells(node_heights)

    def configuration_weight(self, heights: np.ndarray) -> Fraction:
        """q ** volume, exactly (q at its exact value)."""
        return self._q_exact ** int(np.asarray(heights).sum())

    def _general(self):
        """The same hexagon as a general region (same q ** volume measure), for its Kasteleyn matrix."""
        from .shapes import hexagon_region

        return hexagon_region(self.a, self.b, self.c, q=self.q)

    def dimer_system(self) -> dict:
        """Kasteleyn matrix of the hexagon's triangles, q ** volume as edge weights (see LozengeRegion)."""
        return self._general().dimer_system()

    def kasteleyn_real(self) -> np.ndarray:
        return self._general().kasteleyn_real()

    def exact_mean_heights(self, tolerance: float = 1e-6, budget: Optional[float] = 60.0) -> np.ndarray:
        """The expected plane partition (float (a, b), the layout of ``heights``; uniform or q ** volume), from
        the law of a count of cube tops along a line (:mod:`frostline.lozenge.box_mean_heights`): checked
        floating point, refused above ``budget`` seconds by its estimate (None: no cap)."""
        from .box_mean_heights import box_mean_heights

        return box_mean_heights(self, tolerance, budget)

    def height_field(self, heights: np.ndarray) -> np.ndarray:
        """The number-of-cubes height on the lattice points of the hexagon (the layout of
        ``hexagon_region(a, b, c)``), from the plane partition: a different object from ``heights``."""
        general = self._general()
        tiles = self.tiles_from_heights(heights)
        return general.height_field(general.heights_from_tiles(tiles))

    def kasteleyn_log_offset(self) -> float:
        """log abs(det K) - log Z = (ab(b - a) / 4) log q; see LozengeRegion.volume_offset."""
        return 0.0 if self.q == 1.0 else self.a * self.b * (self.b - self.a) / 4.0 * float(np.log(self.q))

    @property
    def scale(self) -> float:
        """(a + b + c) / 3: n for the regular n x n x n hexagon."""
        return (self.a + self.b + self.c) / 3.0

    def arctic_curve(self, m: int = 720) -> np.ndarray:
        """The inscribed ellipse (Cohn, Larsen, Propp 1998); uniform weights only."""
        if self.q != 1.0:
            raise ValueError("the inscribed ellipse is the arctic curve of the uniform hexagon; no closed form is "
                             "built in for q ** volume weights")
        from .arctic import hexagon_ellipse

        return hexagon_ellipse(self.a, self.b, self.c, m)

    def limit_setup(self, resolution: int = 1):
        """The variational problem of the same hexagon as a general region, with heights as column heights.

        ``L.heights`` is then the predicted plane partition (float, shape (a, b)).
        The lattice-point solution counts m(x, y) cubes on the line of cubes
        (x + t, y - 1 - t, t) seen at lattice point (x, y). The cubes of a
        stack on that line fill an initial run of the ones inside the box, and
        cube (k, l, z) is the j-th of them, j = min(z, k, b - 1 - l), so it is
        present when m(k - z, l + 1 + z) > j: the column at floor cell (k, l)
        holds sum_z clip(m(k - z, l + 1 + z) - j, 0, 1) cubes (exact for a
        tiling, a soft count for the limit shape), stored at [k, b - 1 - l]
        (:func:`.tiles.tiles_of_plane_partition`).
        """
        general = self._general()
        setup = general.limit_setup(resolution)
        least = general.heights_from_model(general.model.extremes()[0]).astype(float)
        i0, j0 = general.origin
        a, b, c = self.a, self.b, self.c
        check_memory(24 * a * b * c + 10**6, f"the column heights of the {a}x{b}x{c} box")
        k, l, z = np.meshgrid(np.arange(a), np.arange(b), np.arange(c), indexing="ij")
        rows, cols = k - z - i0, l + 1 + z - j0
        rank = np.minimum(np.minimum(z, k), b - 1 - l)
        base = setup.to_heights

        def to_heights(h: np.ndarray) -> np.ndarray:
            m = (base(h) - least) / 3.0
            present = np.clip(m[rows, cols] - rank, 0.0, 1.0)
            return present.sum(axis=2)[:, ::-1]

        setup.to_heights = to_heights
        setup.scale = self.scale
        return setup

    def heat_bath_rule(self):
        """(generic model, q, None): the q^volume heat bath on plane partitions."""
        return self.lower(), self.q, None

    def _cells(self, node_heights: np.ndarray) -> np.ndarray:
        return np.asarray(node_heights[: self.a * self.b], dtype=np.int32).reshape(self.a, self.b)

    def extreme_heights(self) -> Tuple[np.ndarray, np.ndarray]:
        """The empty and the full box (no generic model needed)."""
        return (np.zeros((self.a, self.b), np.int32), np.full((self.a, self.b), self.c, np.int32))

    def check_heights(self, heights: Any) -> np.ndarray:
        """``heights`` if it is a plane partition in this box (shape (a, b), values in [0, c], non-increasing)."""
        pp = np.asarray(heights)
        if pp.shape != (self.a, self.b):
            raise ValueError(f"a plane partition of this box has shape {(self.a, self.b)}, got {pp.shape}")
        if not np.issubdtype(pp.dtype, np.integer):
            raise TypeError(f"a plane partition must hold integers, got dtype {pp.dtype}")
        if not is_plane_partition(pp, self.c):
            raise ValueError(f"the heights are not a plane partition in the {self.a}x{self.b}x{self.c} box: values "
                             "must lie in [0, c] and not increase along rows or columns")
        return pp.astype(np.int32)

    def nodes_from_heights(self, heights: np.ndarray) -> np.ndarray:
        return np.concatenate([np.asarray(heights, dtype=np.int64).ravel(), [self.c, 0]])

    # ----- kernels -----------------------------------------------------------
    def exact_methods(self) -> Dict[str, ExactMethod]:
        """``"cftp"`` and ``"box"``: the plane-partition kernel; ``"generic"``: the reference engine."""
        box = ExactMethod("cftp", "box", self._box_sample)
        return {"cftp": box, "box": box, "generic": self.generic_method()}

    def chain_kernels(self) -> Dict[str, ChainKernel]:
        box = ChainKernel("box", self._box_chain)
        return {"cftp": box, "box": box, "generic": self.generic_chain_kernel()}

    def _box_sample(self, key, options: RunOptions):
        cells, report = _core.lozenge.box_sample(self.a, self.b, self.c, self.q, key[0], key[1],
                                                 options.check_order, options.max_start_time, options.progress,
                                                 options.threads)
        return np.asarray(cells, dtype=np.int32), report

    def _box_chain(self, key, heights: np.ndarray):
        a, b = self.a, self.b
        compiled = _core.lozenge.box_chain(a, b, self.c, self.q, key[0], key[1],
                                           np.ascontiguousarray(heights, dtype=np.int32).ravel())
        c = self.c
        return compiled, lambda h: _core.lozenge.box_cells(a, b, c, np.asarray(h))

    def tiles_from_heights(self, heights: np.ndarray) -> np.ndarray:
        """Lozenges (k, 3) of the tiling whose plane partition is ``heights`` (checked: ValueError otherwise)."""
        heights = self.check_heights(heights)
        tiles = self.a * self.b + self.b * self.c + self.c * self.a
        check_memory(box_tile_bytes(self.a, self.b, self.c), f"the {tiles} lozenges of the {self.a}x{self.b}x{self.c} "
                     "hexagon")
        return tiles_of_plane_partition(heights, self.c)

    def count(self, *, max_digits: Optional[int] = DEFAULT_MAX_DIGITS) -> int:
        """Number of plane partitions in the box, by MacMahon's formula (OEIS A008793).

        Refuses (ValueError) a count of more than ``max_digits`` decimal digits
        (default a million; None: no cap); ``log_count()`` gives its logarithm.
        """
        return counts.macmahon(self.a, self.b, self.c, max_digits=max_digits)

    def log_count(self) -> float:
        """Natural logarithm of the number of plane partitions in the box (floating point, any size)."""
        return counts.log_macmahon(self.a, self.b, self.c)

    def partition_function(self) -> Any:
        """Sum of q^volume over plane partitions in the box (MacMahon's q-analogue).

        An int when q = 1; a ``fractions.Fraction`` (q at its exact binary value)
        when the exact value is of moderate size; otherwise a float, or an
        ``mpmath.mpf`` when a float would overflow.
        """
        if self.q == 1.0:
            return self.count()
        return counts.q_partition_function(self.a, self.b, self.c, self._q_exact)

    def volume_polynomial(self, *, budget: Optional[float] = DEFAULT_BUDGET_SECONDS) -> list:
        """Coefficients [n_0, n_1, ..., n_abc]: n_v plane partitions of volume v.

        Refuses (ValueError, with the estimate) what would take more than
        ``budget`` seconds (default 60; None: no cap).
        """
        return counts.volume_polynomial(self.a, self.b, self.c, budget=budget)


def is_plane_partition(pp: np.ndarray, c: int) -> bool:
    """True when ``pp`` has values in [0, c] and is non-increasing along both axes."""
    pp = np.asarray(pp)
    if pp.size == 0:
        return True
    return bool(pp.min() >= 0 and pp.max() <= c and np.all(np.diff(pp, axis=0) <= 0)
                and np.all(np.diff(pp, axis=1) <= 0))


def hexagon(a: int, b: int, c: int, q: QLike = 1.0) -> HexagonRegion:
    """The a, b, c hexagon (plane partitions in an a x b x c box), weight q ** volume.

    Parameters
    ----------
    a, b, c : int
        Non-negative side lengths (0 gives a degenerate hexagon with one tiling).
    q : float or Fraction
        Weight per cube; 1 is the uniform measure.

    Examples
    --------
    >>> import frostline as fl
    >>> R = fl.lozenge.hexagon(3, 3, 3)
    >>> R.count()
    980
    >>> S = R.sample(seed=1)
    >>> S.heights.shape, int((S.tiles[:, 2] == 0).sum())
    ((3, 3), 9)
    """
    return HexagonRegion(a, b, c, q)
