"""Lozenge tilings of any region of unit triangles (simply connected pieces).

Heights live on lattice points with step 3: along an edge in the directions
(1, 0), (-1, 1), (0, -1) (counter-clockwise around an up triangle) the height
rises by 1 where no lozenge crosses the edge and falls by 2 where one does.
Boundary edges are never crossed, so the boundary heights are fixed by walking
the boundary; interior points are the free sites of the generic model
(Thurston's height function, step 3, residue (i - j) mod 3, three colour
classes (i - j) mod 3). Raising a height by 3 adds one cube to the stack, so
the weight q ** volume is q ** (sum of heights / 3) up to a constant.

Relation to the box hexagon: for the a, b, c hexagon, the height at lattice
point (x, y) is its least value plus 3 m, where m counts the cubes centred
there in the projection: the cubes (x + z, y - 1 - z, z) of the stack.
"""
from __future__ import annotations

import numbers
from typing import Any, Dict, Iterable, Optional, Tuple

import numpy as np

from frostline import _core
from frostline._limits import check_memory
from frostline.exact.budget import DEFAULT_BUDGET_SECONDS
from frostline.height_walk import integrate, integrate_expected, walk_boundary
from frostline.methods import ExactMethod, RunOptions
from frostline.model import HeightModel
from frostline.region import Region
from frostline.variational import VariationalRegion

from .columns import ColumnForm, column_form, grid_from_model, heights_from_columns, lower_columns
from .geometry import BYTES_PER_TRIANGLE, EDGE_ENDS, PARTNER, TriangleGrid
from .parameters import QLike, weight
from .tile_mixin import LozengeTiles
from .tiles import lozenge_dimer_system


class LozengeRegion(LozengeTiles, VariationalRegion, Region):
    """Lozenge tilings of a region of unit triangles, weight q ** volume.

    ``Sample.heights`` is an int32 array over the bounding box of the region's
    lattice points: entry [i - i0, j - j0] is the height at point (i, j), where
    (i0, j0) = ``region.origin``; ``region.vertex_mask`` marks the points in the
    region (entries outside it are 0). ``Sample.tiles`` holds (x, y, t) rows.
    """

    def __init__(self, triangles: np.ndarray, q: QLike = 1.0, *, description: Optional[Dict[str, Any]] = None):
        self.q, self._q_exact = weight(q)
        tri = _as_triangles(triangles)
        check_memory(BYTES_PER_TRIANGLE * len(tri) + 10**6, f"a region of {len(tri)} triangles")
        self.triangles = tri
        self._description = description or {"shape": "triangles"}
        n_up = int((tri[:, 2] == 0).sum())
        n_down = len(tri) - n_up
        if n_up != n_down:
            raise ValueError(
                f"the region cannot be tiled: it has {n_up} up and {n_down} down triangles, and every lozenge "
                "covers one of each"
            )
        self.grid = TriangleGrid.from_triangles(tri)
        self._build()

    # ----- construction --------------------------------------------------------
    def _build(self) -> None:
        g = self.grid
        nx, ny = g.up.shape
        in_region, interior = g.vertex_masks()
        inner, outer = g.edge_masks()
        boundary_ends = [g.edge_ends(t, outer[t]) for t in range(3)]
        tails = np.concatenate([g.point_id(fp, fq) for fp, fq, _, _ in boundary_ends])
        heads = np.concatenate([g.point_id(tp, tq) for _, _, tp, tq in boundary_ends])
        g.refuse_holes()
        boundary, _ = walk_boundary(tails, heads, 1, g.boundary_order(), g.point_residue, g.point_name)
        # node numbering: free sites first (row-major on the grid), then boundary points
        node = np.full(g.up.shape, -1, dtype=np.int64)
        sites = np.argwhere(interior)
        node[interior] = np.arange(len(sites))
        boundary_points = np.array(sorted(boundary), dtype=np.int64)
        node.ravel()[boundary_points] = len(sites) + np.arange(len(boundary_points))
        if np.any(in_region & (node < 0)):
            raise AssertionError("a region point is neither interior nor on the boundary")
        rows = []
        for t in range(3):
            fp, fq, tp, tq = g.edge_ends(t, inner[t])
            a, b = node[fp, fq], node[tp, tq]
            rows.append(np.stack([a, b, np.ones_like(a)], axis=1))       # h[to] - h[from] <= 1
            rows.append(np.stack([b, a, np.full_like(a, 2)], axis=1))    # h[from] - h[to] <= 2
        constraints = np.concatenate(rows)
        ox, oy = g.origin
        colour = (sites[:, 0] + ox - sites[:, 1] - oy) % 3
        names = np.concatenate([g.point_id(sites[:, 0], sites[:, 1]), boundary_points])
        self._model = HeightModel(len(sites), np.array([boundary[v] for v in boundary_points.tolist()]),
                                  constraints, colour, 3, colour, node_label=lambda k: g.point_name(names[k]))
        self._node = node
        self._boundary_points = boundary_points
        self._inner = inner
        # crop to the bounding box of the region's points
        pts = np.argwhere(in_region)
        self._crop = (slice(pts[:, 0].min(), pts[:, 0].max() + 1), slice(pts[:, 1].min(), pts[:, 1].max() + 1))
        self.origin = (int(pts[:, 0].min() + ox), int(pts[:, 1].min() + oy))
        self.vertex_mask = in_region[self._crop].copy()
        self._point_parts: Optional[tuple] = None
        self._column_parts: Optional[tuple] = None
        self._model.extremes()  # decides tileability now, with the error naming the place

    # ----- kernels -----------------------------------------------------------------
    def exact_methods(self) -> Dict[str, ExactMethod]:
        """``"cftp"`` and ``"columns"``: the cube-column kernel (any q), where the region has a column form
        (docs/column_form.md), else the lattice-point kernel; ``"generic"``: the reference engine on the same
        chain (the same sample); ``"points"``: the lattice-point vector kernel (uniform weights only) and
        ``"points-generic"`` its reference (the same sample as ``"points"``, a different one from ``"cftp"``)."""
        lattice = self.generic_method()
        methods: Dict[str, ExactMethod] = {}
        form = self.column_form()[0]
        if form is not None:
            methods["cftp"] = methods["columns"] = ExactMethod("cftp", "cube columns", self._column_sample)
            methods["generic"] = ExactMethod("cftp", "generic", self._column_generic)
        if self.q == 1.0:
            methods["points"] = ExactMethod("cftp", "lattice points", self._point_sample)
        methods.setdefault("cftp", methods.get("points", lattice))
        methods.setdefault("generic", lattice)
        methods["points-generic"] = lattice
        return {name: methods[name] for name in ("cftp", "columns", "generic", "points", "points-generic")
                if name in methods}

    def unavailable_methods(self) -> Dict[str, str]:
        out: Dict[str, str] = {}
        reason = self.column_form()[1]
        if reason:
            out["columns"] = f"this region has no cube-column form: {reason}"
        if self.q != 1.0:
            out["points"] = "the lattice-point kernel runs uniform weights only (q = 1); use 'cftp' or 'points-generic'"
        return out

    def column_form(self) -> Tuple[Optional[ColumnForm], str]:
        """(the region's :class:`~.columns.ColumnForm`, "") or (None, why it has none); built once.

        A region has a column form when its tilings are the stacks of cubes over one grid of
        columns (docs/column_form.md); then ``"cftp"`` runs the cube-column kernel."""
        if self._column_parts is None:
            self._column_parts = column_form(self)
        return self._column_parts

    def _form(self) -> ColumnForm:
        form, reason = self.column_form()
        if form is None:
            raise ValueError(f"this region has no cube-column form: {reason}")
        return form

    def _column_sample(self, key, options: RunOptions):
        form = self._form()
        rows, columns = form.free.shape
        grid, report = _core.lozenge.column_sample(rows, columns, form.runs, form.least.ravel(),
                                                   form.greatest.ravel(), self.q, key[0], key[1],
                                                   options.check_order, options.max_start_time, options.progress,
                                                   options.threads)
        grid = np.asarray(grid, dtype=np.int32).reshape(rows, columns)
        return heights_from_columns(self, form, grid), report

    def _column_generic(self, key, options: RunOptions):
        form = self._form()
        model = lower_columns(form)
        nodes, report = model.sample(self.q, key, check_order=options.check_order,
                                     max_start_time=options.max_start_time, progress=options.progress)
        return heights_from_columns(self, form, grid_from_model(form, nodes)), report

    def _point_layout(self):
        """(rows, columns, shift, runs, least grid, greatest grid) of the vector kernel, built once."""
        if self._point_parts is None:
            interior = self._node >= 0
            interior &= self._node < self._model.n_sites
            runs = []
            for row in range(interior.shape[0]):
                cols = np.flatnonzero(interior[row])
                if cols.size:
                    breaks = np.flatnonzero(np.diff(cols) > 1)
                    starts = np.concatenate([[0], breaks + 1])
                    ends = np.concatenate([breaks, [cols.size - 1]])
                    runs += [(row, cols[a], cols[b]) for a, b in zip(starts, ends)]
            least, greatest = self._model.extremes()
            ox, oy = self.grid.origin
            self._point_parts = (interior.shape[0], interior.shape[1], (ox - oy) % 3,
                                 np.array(runs, dtype=np.int32).reshape(-1, 3),
                                 self._grid_heights(least), self._grid_heights(greatest))
        return self._point_parts

    def _point_sample(self, key, options: RunOptions):
        rows, columns, shift, runs, least, greatest = self._point_layout()
        grid, report = _core.lozenge.point_sample(rows, columns, shift, runs, least.ravel(), greatest.ravel(),
                                                  key[0], key[1], options.check_order, options.max_start_time,
                                                  options.progress, options.threads)
        heights = np.asarray(grid, dtype=np.int32).reshape(rows, columns)
        return np.where(self.vertex_mask, heights[self._crop], 0).astype(np.int32), report

    # ----- conversions -----------------------------------------------------------
    def _grid_heights(self, node_heights: np.ndarray) -> np.ndarray:
        h = np.zeros(self.grid.up.shape, dtype=np.int32)
        mask = self._node >= 0
        h[mask] = np.asarray(node_heights)[self._node[mask]]
        return h

    def _heights_from_nodes(self, node_heights: np.ndarray) -> np.ndarray:
        return np.where(self.vertex_mask, self._grid_heights(node_heights)[self._crop], 0).astype(np.int32)

    def _nodes_from_heights(self, heights: np.ndarray) -> np.ndarray:
        h = np.asarray(heights)
        if h.shape != self.vertex_mask.shape:
            raise ValueError(f"heights must have shape {self.vertex_mask.shape} (the region's points), got {h.shape}")
        full = np.zeros(self.grid.up.shape, dtype=np.int64)
        full[self._crop] = h
        out = np.empty(self._model.n_nodes, dtype=np.int64)
        mask = self._node >= 0
        out[self._node[mask]] = full[mask]
        return out

    def tiles_from_heights(self, heights: np.ndarray) -> np.ndarray:
        """Lozenges (k, 3) of the tiling with these heights: edge (x, y, t) is crossed where the height falls by 2.

        Raises ValueError when ``heights`` is not a height function of this region.
        """
        heights = self.check_heights(heights)
        full = np.zeros(self.grid.up.shape, dtype=np.int64)
        full[self._crop] = heights
        ox, oy = self.grid.origin
        rows = []
        for t in range(3):
            p, q = np.nonzero(self._inner[t])
            (fx, fy), (tx, ty) = EDGE_ENDS[t]
            crossed = full[p + tx, q + ty] - full[p + fx, q + fy] == -2
            rows.append(np.stack([p[crossed] + ox, q[crossed] + oy, np.full(crossed.sum(), t)], axis=1))
        tiles = np.concatenate(rows).astype(np.int64)
        return tiles[np.lexsort((tiles[:, 2], tiles[:, 1], tiles[:, 0]))]

    def heights_from_tiles(self, tiles: np.ndarray) -> np.ndarray:
        """Heights of the tiling given by ``tiles`` (rows (x, y, t)).

        Raises ValueError unless the tiles cover every triangle of the region exactly once.
        """
        tiles = np.asarray(tiles, dtype=np.int64).reshape(-1, 3)
        if len(tiles) and (tiles[:, 2].min() < 0 or tiles[:, 2].max() > 2):
            raise ValueError("a lozenge type must be 0, 1 or 2")
        covered = np.concatenate([
            np.stack([tiles[:, 0], tiles[:, 1], np.zeros(len(tiles), np.int64)], axis=1),
            np.stack([tiles[:, 0] + np.array(PARTNER)[tiles[:, 2], 0],
                      tiles[:, 1] + np.array(PARTNER)[tiles[:, 2], 1], np.ones(len(tiles), np.int64)], axis=1),
        ])
        covered = covered[np.lexsort((covered[:, 2], covered[:, 1], covered[:, 0]))]
        if not np.array_equal(covered, self.triangles):
            raise ValueError("the lozenges do not cover every triangle of the region exactly once")
        ox, oy = self.grid.origin
        crossed = [np.zeros(self.grid.up.shape, bool) for _ in range(3)]
        for t in range(3):
            sel = tiles[tiles[:, 2] == t]
            crossed[t][sel[:, 0] - ox, sel[:, 1] - oy] = True
        # integrate from the boundary along interior edges
        g = self.grid
        values = self._grid_heights(self._model.extremes()[0]).astype(np.int64).ravel()
        known = np.zeros(values.shape, bool)
        known[self._boundary_points] = True
        ends = [g.edge_ends(t, self._inner[t]) for t in range(3)]
        deltas = [np.where(crossed[t][self._inner[t]], -2, 1) for t in range(3)]
        h = integrate(values, known, np.concatenate([g.point_id(fp, fq) for fp, fq, _, _ in ends]),
                      np.concatenate([g.point_id(tp, tq) for _, _, tp, tq in ends]),
                      np.concatenate(deltas)).reshape(g.up.shape)
        return np.where(self.vertex_mask, h[self._crop], 0).astype(np.int32)

    def expected_heights(self, tiles: np.ndarray, probabilities: np.ndarray) -> np.ndarray:
        """Expected heights (float, layout of ``Sample.heights``) from placement probabilities.

        Along an interior edge the height rises by 1, or falls by 2 when the
        lozenge across it is present, so its expected change is 1 - 3 p; the
        boundary heights are fixed. NaN outside the region.
        """
        ox, oy = self.grid.origin
        p = [np.zeros(self.grid.up.shape) for _ in range(3)]
        tiles = np.asarray(tiles, dtype=np.int64).reshape(-1, 3)
        for t in range(3):
            sel = tiles[:, 2] == t
            p[t][tiles[sel, 0] - ox, tiles[sel, 1] - oy] = np.asarray(probabilities, dtype=float)[sel]
        g = self.grid
        values = self._grid_heights(self._model.extremes()[0]).astype(float).ravel()
        known = np.zeros(values.shape, bool)
        known[self._boundary_points] = True
        ends = [g.edge_ends(t, self._inner[t]) for t in range(3)]
        h = integrate_expected(values, known, np.concatenate([g.point_id(fp, fq) for fp, fq, _, _ in ends]),
                               np.concatenate([g.point_id(tp, tq) for _, _, tp, tq in ends]),
                               np.concatenate([1.0 - 3.0 * p[t][self._inner[t]] for t in range(3)]))
        return np.where(self.vertex_mask, h.reshape(g.up.shape)[self._crop], np.nan)

    def heights_from_model(self, node_heights: np.ndarray) -> np.ndarray:
        return self._heights_from_nodes(node_heights)

    def nodes_from_heights(self, heights: np.ndarray) -> np.ndarray:
        return self._nodes_from_heights(heights)

    def configuration_weight(self, heights: np.ndarray):
        """q ** (cubes above the least height function), exactly."""
        least = self._heights_from_nodes(self._model.extremes()[0])
        cubes = int((np.asarray(heights, dtype=np.int64) - least)[self.vertex_mask].sum()) // 3
        return self._q_exact ** cubes

    def dimer_system(self) -> dict:
        """Kasteleyn matrix of the triangles: adjacency, with q ** volume written as edge weights.

        q ** volume is an edge weighting (docs/references.md, "q ** volume as
        edge weights"): the lozenge of type 0 at (x, y) gets weight
        q ** ((y - x) / 2), the others 1. A cube added turns the type-0
        lozenge of a hexagon into the one on its opposite side, which raises
        the sum of (y - x) / 2 by exactly one, so over every tiling that sum is
        the volume plus a constant of the region (:meth:`volume_offset`). The
        matrix therefore weighs each tiling by q ** volume times q ** offset:
        the same probabilities, and log Z shifted by offset * log q.
        """
        system = lozenge_dimer_system(self.triangles)
        if self.q != 1.0:
            system["matrix"][system["rows"], system["cols"]] = self.q ** volume_exponents(system["tiles"])
        return system

    def kasteleyn_real(self) -> np.ndarray:
        """The real Kasteleyn matrix (rows up, columns down triangles), with the q ** volume edge weights."""
        if self.q != 1.0:
            return self.dimer_system()["matrix"]
        return self.adjacency_matrix().astype(float)

    def height_field(self, heights: np.ndarray) -> np.ndarray:
        """The number-of-cubes height on the region's lattice points: heights / 3 (NaN outside the region).

        Lattice-point heights step 3 per cube (+1 along an uncrossed edge, -2
        across a lozenge), so heights / 3 is the dimer normalisation.
        """
        h = np.asarray(self.check_heights(heights), dtype=float) / 3.0
        return np.where(self.vertex_mask, h, np.nan)

    def volume_offset(self) -> float:
        """The constant C with sum over type-0 lozenges of (y - x) / 2 = volume + C on every tiling.

        The volume counts cubes above the least height function, so C is that
        sum on the least tiling. On the a x b x c box it is ab(b - a) / 4 (in
        the coordinates of ``hexagon_region``; docs/references.md).
        """
        least = self._heights_from_nodes(self._model.extremes()[0])
        return float(volume_exponents(self.tiles_from_heights(least)).sum())

    def kasteleyn_log_offset(self) -> float:
        """log abs(det K) - log Z: the offset times log q (0 for q = 1); see :meth:`dimer_system`."""
        return 0.0 if self.q == 1.0 else self.volume_offset() * float(np.log(self.q))

    @property
    def scale(self) -> float:
        return float(np.sqrt(len(self.triangles) / 2.0 / 3.0))  # n for the regular hexagon (3 n^2 lozenges)

    def arctic_curve(self, m: int = 720) -> np.ndarray:
        """The inscribed ellipse for a uniform hexagon given through the general route; else ValueError."""
        if self._description.get("shape") == "hexagon" and self.q == 1.0:
            from .arctic import hexagon_ellipse

            a, b, c = self._description["sides"]
            return hexagon_ellipse(a, b, c, m=m)
        raise ValueError(f"no published arctic curve is built in for {self!r}")

    def limit_setup(self, resolution: int = 1):
        """The variational problem on the region's triangles, refined ``resolution`` times (see :mod:`.limit`)."""
        from .limit import limit_setup, refined_setup

        return limit_setup(self) if resolution == 1 else refined_setup(self, resolution)

    def heat_bath_rule(self):
        """(generic model, q, None): the q^volume heat bath on lattice-point heights."""
        return self._model, self.q, None

    @property
    def model(self) -> HeightModel:
        """The generic height model this region lowers to."""
        return self._model

    @property
    def n_lozenges(self) -> int:
        return len(self.triangles) // 2

    def describe(self) -> Dict[str, Any]:
        return {"lattice": self.lattice, **self._description, "q": self.q}

    def record_arrays(self) -> Dict[str, np.ndarray]:
        return {"triangles": self.triangles}

    def count(self, *, budget: Optional[float] = DEFAULT_BUDGET_SECONDS) -> int:
        """Number of lozenge tilings: the determinant of the up-down triangle adjacency matrix.

        For lozenges every face of the dual (honeycomb) graph is a hexagon, so
        the plain 0/1 bipartite adjacency matrix is a Kasteleyn matrix (Kasteleyn
        1967; Kenyon, "Lectures on dimers", 2009) and abs(det) counts the tilings of
        a simply connected region; pieces multiply. Exact integers.
        Refuses (ValueError, with the estimate) a determinant estimated to take
        more than ``budget`` seconds (default 60; None: no cap; Ctrl-C stops it).
        """
        from frostline.exact import integer_determinant
        from frostline.exact.budget import check_budget_argument, check_seconds, determinant_seconds

        budget = check_budget_argument(budget)
        if budget is not None:  # estimate from the triangles, before the dense matrix is built
            up = self.triangles[self.triangles[:, 2] == 0]
            down_rows = np.bincount(self.triangles[self.triangles[:, 2] == 1, 1] - self.triangles[:, 1].min())
            # an up triangle's partners: two in its own row of down triangles, one in the row beside it at
            # about the same place, so a row of the matrix reaches about one row of down triangles
            band = int(down_rows.max()) + 2 if down_rows.size else 1
            bits = len(up) * 0.5 * np.log2(3.0) + 2  # Hadamard: rows of at most three ones
            check_seconds(determinant_seconds(len(up), band, bits), budget,
                          f"counting the tilings of this region of {2 * len(up)} triangles by an exact determinant",
                          f"{len(up)} rows, about {int(bits / 31) + 1} primes, rows reaching about {band} columns")
        return abs(integer_determinant(self.adjacency_matrix()))

    def adjacency_matrix(self) -> np.ndarray:
        """Bipartite adjacency: rows = up triangles, columns = down triangles (both row-major by (y, x))."""
        up = self.triangles[self.triangles[:, 2] == 0]
        down = self.triangles[self.triangles[:, 2] == 1]
        up = up[np.lexsort((up[:, 0], up[:, 1]))]
        down = down[np.lexsort((down[:, 0], down[:, 1]))]
        index = {(int(x), int(y)): k for k, (x, y, _) in enumerate(down)}
        check_memory(8 * len(up) ** 2, f"the {len(up)}x{len(up)} adjacency matrix")
        a = np.zeros((len(up), len(down)), dtype=np.int64)
        for r, (x, y, _) in enumerate(up):
            for dx, dy in PARTNER:
                k = index.get((int(x + dx), int(y + dy)))
                if k is not None:
                    a[r, k] = 1
        return a

    def partition_function(self) -> Any:
        """Sum of q ** volume over tilings (volume: cubes above the least tiling).

        The count when q = 1; otherwise exact (a ``fractions.Fraction``, q at its
        exact binary value) by enumeration for small regions (at most 200,000
        tilings), and beyond that a float (an ``mpmath.mpf`` past the float
        range) from the Kasteleyn determinant with the q ** volume edge
        weights, whose logarithm carries a checked bound of 1e-9
        (:func:`frostline.exact.log_partition_function`).
        """
        if self.q == 1.0:
            return self.count()
        from fractions import Fraction

        from frostline.exact import EnumerationTooLarge, enumerate_heights, log_partition_function

        try:
            states = enumerate_heights(self._model)
        except EnumerationTooLarge:
            log_z = log_partition_function(self)
            if log_z < 700:
                return float(np.exp(log_z))
            import mpmath

            return mpmath.exp(log_z)
        n = self._model.n_sites
        least = self._model.extremes()[0][:n].astype(np.int64)
        volumes = (states[:, :n].astype(np.int64) - least).sum(axis=1) // 3
        q = self._q_exact
        return sum((q ** int(v) for v in volumes), Fraction(0))

    def __repr__(self) -> str:
        return f"LozengeRegion({self._description}, lozenges={self.n_lozenges}, q={self.q!r})"


def volume_exponents(tiles: np.ndarray) -> np.ndarray:
    """(y - x) / 2 for each lozenge (x, y, 0) of type 0, 0 for the other types (float)."""
    t = np.asarray(tiles, dtype=np.int64).reshape(-1, 3)
    return np.where(t[:, 2] == 0, (t[:, 1] - t[:, 0]) / 2.0, 0.0)


def _as_triangles(triangles: Iterable) -> np.ndarray:
    try:
        t = np.asarray(list(triangles) if not isinstance(triangles, np.ndarray) else triangles)
    except TypeError as exc:
        raise TypeError("triangles must be an iterable of (x, y, s) rows") from exc
    if t.size == 0:
        raise ValueError("the region is empty: give at least one up and one down triangle")
    if t.ndim != 2 or t.shape[1] != 3:
        raise ValueError(f"triangles must be rows (x, y, s), got an array of shape {t.shape}")
    if not np.issubdtype(t.dtype, np.integer):
        if np.issubdtype(t.dtype, np.number) and np.all(t == np.round(t)):
            t = t.astype(np.int64)
        else:
            raise TypeError(f"triangle coordinates must be integers, got dtype {t.dtype}")
    if not np.isin(t[:, 2], (0, 1)).all():
        raise ValueError("the orientation s of a triangle (x, y, s) must be 0 (up) or 1 (down)")
    if np.abs(t[:, :2]).max() > 2**28:
        raise ValueError("triangle coordinates are beyond 2^28")
    t = np.unique(t.astype(np.int64), axis=0)
    return t


def from_triangles(triangles: Iterable, q: QLike = 1.0) -> LozengeRegion:
    """A region from its unit triangles: rows (x, y, s), s = 0 up, 1 down (docs/design.md conventions).

    The up triangle (x, y, 0) has corners (x, y), (x+1, y), (x, y+1); the down
    triangle (x, y, 1) has corners (x+1, y), (x, y+1), (x+1, y+1). Repeated
    rows count once. Raises ValueError when the region cannot be tiled, with
    the reason (unequal numbers of up and down triangles, a hole, the place
    where the height constraints conflict).

    Examples
    --------
    >>> import frostline as fl
    >>> R = fl.lozenge.from_triangles([(0, 0, 0), (0, 0, 1)])
    >>> R.count()
    1
    """
    return LozengeRegion(_as_triangles(triangles), q, description={"shape": "triangles"})


def from_masks(up: np.ndarray, down: np.ndarray, origin: Tuple[int, int] = (0, 0), q: QLike = 1.0) -> LozengeRegion:
    """A region from two boolean arrays: ``up[a, b]`` marks U(x0 + a, y0 + b), ``down[a, b]`` marks D(x0 + a, y0 + b).

    ``origin`` is (x0, y0). Both arrays must have the same 2-D shape.
    """
    up, down = np.asarray(up), np.asarray(down)
    if up.shape != down.shape or up.ndim != 2:
        raise ValueError(f"up and down masks must be 2-D arrays of one shape, got {up.shape} and {down.shape}")
    if up.dtype != bool or down.dtype != bool:
        raise TypeError("up and down masks must be boolean arrays")
    if not all(isinstance(v, numbers.Integral) for v in origin) or len(origin) != 2:
        raise TypeError("origin must be a pair of ints (x0, y0)")
    rows = [np.concatenate([np.argwhere(m) + np.array(origin), np.full((m.sum(), 1), s)], axis=1)
            for s, m in ((0, up), (1, down))]
    return LozengeRegion(_as_triangles(np.concatenate(rows)), q, description={"shape": "masks"})
