"""Square ice (the six-vertex model) on an n x n grid of vertices, any valid fixed boundary.

Heights (``Sample.heights``) are the (n+1) x (n+1) corner heights; neighbours
differ by exactly 1; the border is fixed (domain wall by default, see
:mod:`.conversions`). Weights: each vertex of type a1/a2 weighs a, b1/b2 weighs
b, c1/c2 weighs c; Delta = (a^2 + b^2 - c^2) / (2ab).

The local move raises or lowers one corner by 2 (when its four neighbours are
equal). Its heat-bath law reads the four diagonal corners: raising a diagonal
corner multiplies P(up)/P(down) by (c/a)^2 or (c/b)^2, so the rule is monotone
exactly when c >= max(a, b) (docs/references.md section 5). frostline does not take
that on trust: ``sample()`` runs the engine's monotonicity checker on the
rule first and refuses exact sampling where it fails. ``chain()`` always works.

``Sample.tiles`` lists every vertex as a row (i, j, type code); the plane
position of vertex (i, j) is (j + 1/2, n - i - 1/2). ``Sample.matrix``,
``Sample.vertex_types`` and ``Sample.arrows`` give the other views.
"""
from __future__ import annotations

import numbers
import re
from fractions import Fraction
from typing import Any, Callable, Dict, Optional, Tuple

import numpy as np

from frostline import _core
from frostline._limits import check_memory
from frostline._validate import integer
from frostline.exact.budget import DEFAULT_MAX_DIGITS
from frostline.methods import ChainKernel, ExactMethod, RunOptions
from frostline.model import HeightModel
from frostline.region import Region, Sample
from frostline.toolkit.checker import check_monotone

from . import conversions as cv
from .counts import asm_count, izergin_korepin, row_transfer
from .extremes import extremes as closed_form_extremes

#: the cells around a corner, in context order NW, NE, SW, SE, and which weight their zero type has
CELL_WEIGHT = ("a", "b", "b", "a")


def _weight(value: Any, name: str) -> float:
    if isinstance(value, bool) or not isinstance(value, (numbers.Real, Fraction)):
        raise TypeError(f"weight {name} must be a real number, got {type(value).__name__}")
    try:
        v = float(value)
    except OverflowError:
        raise ValueError(f"weight {name} must be finite and positive") from None
    if not np.isfinite(v) or v <= 0:
        raise ValueError(f"weight {name} must be finite and positive, got {value!r}")
    if not 1e-30 < v < 1e30:
        raise ValueError(f"weight {name} = {v:g} is extreme; only ratios of a, b, c matter, so rescale them")
    return v


def weight_table(a: float, b: float, c: float) -> np.ndarray:
    """Thresholds (over 2^64) of the higher height for each pattern of the diagonal corners.

    Bit k of the pattern (k = NW, NE, SW, SE) is set when that diagonal corner
    lies above the middle value m; the cell between the corner and that
    diagonal is a c vertex when the corner takes the same side, else an a or
    b vertex (a for the NW and SE cells, b for NE and SW). Exact rational
    arithmetic on the weights' binary values, then the floor.
    """
    w = {"a": Fraction(a), "b": Fraction(b)}
    cf = Fraction(c)
    table = np.empty(16, dtype=np.uint64)
    for pattern in range(16):
        ratio = Fraction(1)
        for k in range(4):
            zero = w[CELL_WEIGHT[k]]
            ratio *= cf / zero if pattern >> k & 1 else zero / cf
        p = ratio / (1 + ratio)
        # kept within [1, 2^64 - 1]: a forbidden move would stop the chains from ever meeting
        table[pattern] = max(1, min(p.numerator * 2**64 // p.denominator, 2**64 - 1))
    return table


class SquareIceRegion(Region):
    """Six-vertex configurations with a fixed boundary on the n x n vertex grid."""

    lattice = "square_ice"
    tile_classes = cv.VERTEX_TYPES

    def __init__(self, boundary: np.ndarray, a: float = 1.0, b: float = 1.0, c: float = 1.0, *,
                 description: Optional[Dict[str, Any]] = None) -> None:
        h = np.asarray(boundary)
        if h.ndim != 2 or h.shape[0] != h.shape[1] or h.shape[0] < 2:
            raise ValueError(f"a boundary is an (n+1) x (n+1) height array with n >= 1, got shape {h.shape}")
        if not np.issubdtype(h.dtype, np.integer):
            raise TypeError(f"boundary heights must be integers, got dtype {h.dtype}")
        self.n = h.shape[0] - 1
        # measured peak about 550 bytes per corner (model, extremes, grids): tests/test_memory_estimates.py
        check_memory(640 * (self.n + 1) ** 2, f"square ice of size {self.n}")
        self.a, self.b, self.c = _weight(a, "a"), _weight(b, "b"), _weight(c, "c")
        self._description = description or {"shape": "boundary"}
        self.boundary = self._check_boundary(h.astype(np.int64))
        self._build()

    @property
    def delta(self) -> float:
        """Delta = (a^2 + b^2 - c^2) / (2ab)."""
        return (self.a ** 2 + self.b ** 2 - self.c ** 2) / (2 * self.a * self.b)

    @property
    def uniform(self) -> bool:
        return self.a == self.b == self.c

    def _check_boundary(self, h: np.ndarray) -> np.ndarray:
        n = self.n
        ring = np.concatenate([h[0, :], h[1:, n], h[n, -2::-1], h[-2:0:-1, 0]])
        steps = np.diff(np.concatenate([ring, ring[:1]]))
        if not np.all(np.abs(steps) == 1):
            k = int(np.flatnonzero(np.abs(steps) != 1)[0])
            raise ValueError(f"invalid boundary: neighbouring border heights must differ by exactly 1 "
                             f"(step {k} around the border, going clockwise from corner (0, 0), changes by {steps[k]})")
        out = np.zeros_like(h)
        out[0, :], out[n, :], out[:, 0], out[:, n] = h[0, :], h[n, :], h[:, 0], h[:, n]
        return out

    def _build(self) -> None:
        n = self.n
        w = n + 1
        i, j = np.meshgrid(np.arange(w), np.arange(w), indexing="ij")
        interior = ((i > 0) & (i < n) & (j > 0) & (j < n)).ravel()
        ids = np.flatnonzero(interior)
        border = np.flatnonzero(~interior)
        node = np.empty(w * w, dtype=np.int64)
        node[ids] = np.arange(len(ids))
        node[border] = len(ids) + np.arange(len(border))
        flat = np.arange(w * w).reshape(w, w)
        pairs = np.concatenate([np.stack([flat[:, :-1].ravel(), flat[:, 1:].ravel()], 1),
                                np.stack([flat[:-1, :].ravel(), flat[1:, :].ravel()], 1)])
        pairs = pairs[interior[pairs[:, 0]] | interior[pairs[:, 1]]]
        u, v = node[pairs[:, 0]], node[pairs[:, 1]]
        constraints = np.concatenate([np.stack([u, v, np.ones_like(u)], 1), np.stack([v, u, np.ones_like(u)], 1)])
        ii, jj = ids // w, ids % w
        parity = int(self.boundary[0, 0]) % 2
        residues = (ii + jj + parity) % 2
        # the weighted rule reads diagonal corners: four classes; uniform weights need two
        colour = (ii + jj) % 2 if self.uniform else 2 * (ii % 2) + (jj % 2)
        corner_name = lambda k: f"corner ({int(np.concatenate([ids, border])[k]) // w}, {int(np.concatenate([ids, border])[k]) % w})"  # noqa: E731
        self._model = HeightModel(len(ids), self.boundary.ravel()[border], constraints, residues, 2, colour,
                                  node_label=corner_name)
        known = closed_form_extremes(self.boundary)
        if known is not None:  # the L1 distance transforms: O(n^2), no search
            nodes = [np.empty(w * w, dtype=np.int64) for _ in range(2)]
            for target, grid in zip(nodes, known):
                target[node] = grid.ravel()
            self._model.set_extremes(*nodes)
        least, greatest = self._model.extremes()  # no filling of this boundary: ValueError naming the corner
        self._node = node
        self._least = self._grid(least)
        self._greatest = self._grid(greatest)
        self._table = np.zeros(0, dtype=np.uint64) if self.uniform else weight_table(self.a, self.b, self.c)
        if self.uniform:
            self._rule = None
        else:  # the diagonal corners of each free corner, as generic node ids, in the table's order
            diagonal = np.stack([ids - w - 1, ids - w + 1, ids + w - 1, ids + w + 1], axis=1)
            self._rule = {"context_start": np.arange(0, 4 * len(ids) + 1, 4, dtype=np.int64),
                          "context_nodes": node[diagonal].ravel(), "context_offset": np.zeros(len(ids), np.int64),
                          "context_table": self._table}
        self._monotone = None

    def _grid(self, node_heights: np.ndarray) -> np.ndarray:
        return np.asarray(node_heights)[self._node].reshape(self.n + 1, self.n + 1).astype(np.int32)

    def heights_from_model(self, node_heights: np.ndarray) -> np.ndarray:
        return self._grid(node_heights)

    def height_field(self, heights: np.ndarray) -> np.ndarray:
        """Corner heights / 2 (float): they change by 1/2 along every edge of the corner grid.

        The normalisation of the free-fermion point Delta = 0, where square ice
        is a dimer model; the Gaussian free field amplitude of the dimer
        normalisation (docs/references.md, section 4) is not claimed for other
        Delta (uniform alternating sign matrices have Delta = 1/2).
        """
        return np.asarray(self.check_heights(heights), dtype=float) / 2.0

    def configuration_weight(self, heights: np.ndarray):
        """Product of vertex weights (exact Fractions of a, b, c)."""
        types = cv.vertex_types_from_heights(heights)
        counts = np.bincount(types.ravel(), minlength=6)
        a, b, c = Fraction(self.a), Fraction(self.b), Fraction(self.c)
        return a ** int(counts[0] + counts[1]) * b ** int(counts[2] + counts[3]) * c ** int(counts[4] + counts[5])

    def tile_centres(self, tiles: np.ndarray) -> np.ndarray:
        t = np.asarray(tiles, dtype=float)
        return np.stack([t[:, 1] + 0.5, self.n - t[:, 0] - 0.5], axis=1)

    @property
    def scale(self) -> float:
        return float(self.n)

    def arctic_curve(self, m: int = 720) -> np.ndarray:
        """Domain wall only: the free-fermion ellipse (c^2 = a^2 + b^2) or the uniform ASM curve (a = b = c)."""
        if not self.is_domain_wall:
            raise ValueError("arctic curves are built in for the domain-wall boundary only")
        from .arctic import asm_curve, free_fermion_curve

        if abs(self.c ** 2 - self.a ** 2 - self.b ** 2) <= 1e-12 * self.c ** 2:
            return free_fermion_curve(self.n, self.a, self.b, self.c, m)
        if self.uniform:
            return asm_curve(self.n, m)
        raise ValueError(f"no closed-form arctic curve is built in for Delta = {self.delta:.4g} (the general "
                         "|Delta| < 1 curves are parametric and not reproduced here)")

    # ----- exactness ---------------------------------------------------------------------
    def heat_bath_rule(self):
        """(generic model, 1, rule): uniform, or the context rule of the vertex weights."""
        return self._model, 1.0, self._rule

    def monotonicity(self):
        """The engine's monotonicity check of this region's rule (cached)."""
        if self._monotone is None:
            self._monotone = check_monotone(self, window=1)
        return self._monotone

    def exactness_check(self) -> None:
        """Coupling from the past is exact only for a monotone heat bath (c >= max(a, b))."""
        report = self.monotonicity()
        if not report.monotone:
            # the checker speaks of engine nodes: name the corners instead, and leave out its neighbour table
            where = self._model._relabel(re.sub(r" with neighbours \{[^}]*\}", "", report.detail))
            raise ValueError(
                f"exact sampling needs a monotone heat bath, and the weights (a, b, c) = ({self.a:g}, {self.b:g}, "
                f"{self.c:g}) give a non-monotone one: {where}. Coupling from the past would not be exact here; "
                "use chain() and its diagnostics, or choose c >= max(a, b)")

    def exact_methods(self) -> Dict[str, ExactMethod]:
        """``"cftp"``: the corner-grid kernel; ``"generic"``: the reference engine (same sample)."""
        return {"cftp": ExactMethod("cftp", "corner grid", self._ice_sample), "generic": self.generic_method()}

    def chain_kernels(self) -> Dict[str, ChainKernel]:
        return {"cftp": ChainKernel("corner grid", self._ice_chain), "generic": self.generic_chain_kernel()}

    def _ice_sample(self, key, options: RunOptions):
        heights, report = _core.square_ice.ice_sample(self.n, self._table, self._least.ravel(),
                                                      self._greatest.ravel(), key[0], key[1], options.check_order,
                                                      options.max_start_time, options.progress, options.threads)
        return np.asarray(heights, dtype=np.int32).reshape(self._least.shape), report

    def _ice_chain(self, key, heights: np.ndarray):
        shape = self._least.shape
        compiled = _core.square_ice.ice_chain(self.n, self._table, np.ascontiguousarray(heights, np.int32).ravel(),
                                              key[0], key[1])
        return compiled, lambda h: np.asarray(h, dtype=np.int32).reshape(shape)

    def extreme_heights(self) -> Tuple[np.ndarray, np.ndarray]:
        return self._least, self._greatest

    def nodes_from_heights(self, heights: np.ndarray) -> np.ndarray:
        nodes = np.empty(self._model.n_nodes, dtype=np.int64)
        nodes[self._node] = np.asarray(heights).ravel()
        return nodes

    # ----- views -------------------------------------------------------------------------
    def tiles_from_heights(self, heights: np.ndarray) -> np.ndarray:
        """Every vertex as a row (i, j, type code), row-major (``heights`` checked: ValueError otherwise)."""
        types = cv.vertex_types_from_heights(self.check_heights(heights))
        i, j = np.meshgrid(np.arange(self.n), np.arange(self.n), indexing="ij")
        return np.stack([i.ravel(), j.ravel(), types.ravel()], axis=1).astype(np.int64)

    def classify(self, tiles: np.ndarray) -> np.ndarray:
        return np.asarray(tiles)[:, 2].astype(np.int8)

    def sample_views(self) -> Dict[str, Callable[[np.ndarray], Any]]:
        """Extra views of a sample's heights: ``matrix``, ``vertex_types``, ``arrows``."""
        return {"matrix": cv.matrix_from_heights, "vertex_types": cv.vertex_types_from_heights,
                "arrows": cv.arrows_from_heights}

    @property
    def model(self) -> HeightModel:
        return self._model

    def describe(self) -> Dict[str, Any]:
        return {"lattice": self.lattice, **self._description, "n": self.n, "a": self.a, "b": self.b, "c": self.c}

    def record_arrays(self) -> Dict[str, np.ndarray]:
        return {"boundary": self.boundary}

    @property
    def is_domain_wall(self) -> bool:
        return bool(np.array_equal(self.boundary, cv.domain_wall_boundary(self.n)))

    def count(self, *, max_digits: Optional[int] = DEFAULT_MAX_DIGITS) -> int:
        """Number of configurations: the ASM number for the domain wall, else a row-transfer count.

        Refuses (ValueError) an ASM number of more than ``max_digits`` decimal
        digits (default a million; None: no cap).
        """
        if self.is_domain_wall:
            return asm_count(self.n, max_digits=max_digits)
        if self.n > 14:
            raise ValueError("counting configurations of a general boundary uses a row transfer, practical to n = 14")
        return int(row_transfer(self.boundary))

    def partition_function(self, exact: Optional[bool] = None) -> Any:
        """Sum over configurations of the product of vertex weights.

        Exact (int or Fraction, weights at their binary values) by a row
        transfer when n <= 10 or ``exact=True`` (practical to n = 12);
        otherwise, for the domain wall, the Izergin-Korepin determinant in
        mpmath (an ``mpmath.mpf``). Uniform weights w give w^(n^2) times the count.
        """
        if self.uniform:
            return Fraction(self.a) ** (self.n ** 2) * self.count()
        if exact or (exact is None and self.n <= 10):
            return row_transfer(self.boundary, (self.a, self.b, self.c))
        if not self.is_domain_wall:
            raise ValueError("for a general boundary the partition function needs the row transfer (exact=True)")
        return izergin_korepin(self.n, self.a, self.b, self.c)

    def draw(self, sample: Sample, ax: Any = None, kind: str = "vertices", **style: Any) -> Any:
        from .drawing import draw_ice

        return draw_ice(sample.heights, kind=kind, ax=ax, **style)

    def __repr__(self) -> str:
        return f"SquareIceRegion(n={self.n}, a={self.a:g}, b={self.b:g}, c={self.c:g}, {self._description})"


def _size(n: Any) -> int:
    return integer(n, "n", 1, 2**14)


def domain_wall(n: int, a: float = 1.0, b: float = 1.0, c: float = 1.0) -> SquareIceRegion:
    """Square ice with domain-wall boundary on n x n vertices (uniform: the alternating sign matrices).

    Examples
    --------
    >>> import frostline as fl
    >>> fl.square_ice.domain_wall(4).count()
    42
    >>> S = fl.square_ice.domain_wall(5).sample(seed=1)
    >>> int(S.matrix.sum())
    5
    """
    n = _size(n)
    return SquareIceRegion(cv.domain_wall_boundary(n), a, b, c, description={"shape": "domain wall"})


def from_boundary(heights: np.ndarray, a: float = 1.0, b: float = 1.0, c: float = 1.0) -> SquareIceRegion:
    """Square ice with the border of ``heights`` ((n+1) x (n+1); the inside is ignored) held fixed.

    Raises ValueError when border neighbours do not differ by exactly 1 or no
    filling exists (naming the corner where the constraints conflict).
    """
    return SquareIceRegion(np.asarray(heights), a, b, c, description={"shape": "boundary"})
