"""Domino tilings of a region of the square grid (a boolean mask of cells).

Heights (``Sample.heights``) are Thurston's heights on the (R + 1) x (C + 1)
grid of cell corners (see :mod:`.geometry`); corners outside the region hold 0
and ``region.corner_mask`` marks those inside. Tiles (``Sample.tiles``) are an
int array of shape (k, 2, 2): each domino as its two cells [(r1, c1), (r2, c2)],
the top or left cell first, rows sorted.

Tile classes: ``north`` and ``south`` are horizontal dominoes, ``east`` and
``west`` vertical ones, told apart by the colour of their first cell relative
to ``class_offset``: north = horizontal with r1 + c1 + offset even, south =
odd; west = vertical with r1 + c1 + offset even, east = odd. For the Aztec
diamond of order n the offset is n - 1, which names each class after the
corner where it freezes (north at the top, and so on).
"""
from __future__ import annotations

import numbers
from typing import Any, Dict, Optional, Tuple

import numpy as np

from frostline import _core
from frostline._limits import check_memory, memory_limit
from frostline.exact.budget import DEFAULT_BUDGET_SECONDS, DEFAULT_MAX_DIGITS
from frostline.height_walk import refuse_holes, walk_boundary
from frostline.methods import ChainKernel, ExactMethod, RunOptions
from frostline.model import HeightModel
from frostline.region import Region, Sample
from frostline.variational import VariationalRegion

from .edge_probabilities import aztec_placement_probabilities
from .geometry import SquareGeometry
from .weights import Weights, check_weights, flip_thresholds

TILE_CLASSES = ("north", "south", "east", "west")


def as_mask(mask: Any) -> np.ndarray:
    m = np.asarray(mask)
    if m.ndim != 2:
        raise ValueError(f"a mask is a 2-D boolean array (True = cell in the region), got shape {m.shape}")
    if m.dtype != bool:
        if np.issubdtype(m.dtype, np.integer) and np.isin(m, (0, 1)).all():
            m = m.astype(bool)
        else:
            raise TypeError(f"a mask must be boolean (or 0/1 integers), got dtype {m.dtype}")
    if not m.any():
        raise ValueError("the mask is empty: mark at least two cells True")
    return m


#: memory of the sampling engine (generic model, Thurston's extremes, kernel layout) per corner of the
#: grid, checked before it is built; measured peak about 400 bytes (tests/test_memory_estimates.py).
ENGINE_BYTES_PER_CORNER = 450


def region_bytes(rows: int, columns: int, cells: int, weighted: bool) -> int:
    """Memory for building a region on a rows x columns mask with ``cells`` cells, checked before it is built.

    Corner arrays (geometry, boundary walk) cost about 16 bytes per corner of
    the grid and the cell-indexed ones about 16 per cell of the region; weights
    about 32 per cell of the grid (two float64 arrays and their validated
    copies). Measured peaks lie within 1.25x below this (tests/test_memory_estimates.py).
    """
    return 18 * (rows + 1) * (columns + 1) + 18 * cells + (34 * rows * columns if weighted else 0)



class DominoRegion(VariationalRegion, Region):
    """Domino tilings of a mask of cells, optionally with a weight per domino position."""

    lattice = "domino"
    tile_classes = TILE_CLASSES

    def __init__(self, mask: Any, horizontal: Any = None, vertical: Any = None, *, class_offset: int = 0,
                 description: Optional[Dict[str, Any]] = None, known_tileable: bool = False) -> None:
        self.mask = as_mask(mask)
        R, C = self.mask.shape
        weighted = horizontal is not None or vertical is not None
        check_memory(region_bytes(R, C, int(np.count_nonzero(self.mask)), weighted), f"a {R}x{C} mask")
        self.weights: Optional[Weights] = check_weights(horizontal, vertical, (R, C))
        if isinstance(class_offset, bool) or not isinstance(class_offset, numbers.Integral):
            raise TypeError("class_offset must be an int")
        self.class_offset: int = int(class_offset) % 2
        self._description: Dict[str, Any] = description or {"shape": "mask"}
        cells = int(np.count_nonzero(self.mask))
        black = int(np.count_nonzero(self.mask[0::2, 0::2]) + np.count_nonzero(self.mask[1::2, 1::2]))
        white = cells - black
        if cells % 2:
            raise ValueError(f"the region cannot be tiled: it has {cells} cells, an odd number")
        if black != white:
            raise ValueError(f"the region cannot be tiled: it has {black} black and {white} white cells "
                             "(cell (r, c) is black when r + c is even), and every domino covers one of each")
        self.geometry: SquareGeometry = SquareGeometry(self.mask)
        self._engine_parts: Optional[Dict[str, Any]] = None
        self._build(known_tileable)
        if not known_tileable:
            self._engine()  # Thurston decides tileability now, naming the place on failure

    def _build(self, known_simply_connected: bool = False) -> None:
        """Boundary heights and node numbering; holes refused (named shapes have none)."""
        g = self.geometry
        R, C = g.shape
        width = C + 1
        tails, heads = g.outer_edges()
        points = np.unique(np.concatenate([tails, heads]))
        order = points[np.lexsort((points % width, -(points // width)))]  # bottom row first
        if not known_simply_connected:
            self._refuse_holes()
        boundary, _ = walk_boundary(tails, heads, 1, order, g.residue, g.corner_name)
        interior = np.flatnonzero(g.corner_interior.ravel())
        boundary_points = np.array(sorted(boundary), dtype=np.int64)
        node = np.full((R + 1) * width, -1, dtype=np.int64)
        node[interior] = np.arange(len(interior))
        node[boundary_points] = len(interior) + np.arange(len(boundary_points))
        self._node = node
        self._interior = interior
        self._boundary_points = boundary_points
        self._boundary_heights = np.array([boundary[v] for v in boundary_points.tolist()], dtype=np.int64)
        self.corner_mask = g.corner_in.copy()

    def _refuse_holes(self) -> None:
        R, C = self.mask.shape
        pad = np.zeros((R + 2, C + 2), bool)
        pad[1:-1, 1:-1] = self.mask
        ids = np.arange((R + 2) * (C + 2)).reshape(R + 2, C + 2)
        links_a = np.concatenate([ids[:, :-1].ravel(), ids[:-1, :].ravel()])
        links_b = np.concatenate([ids[:, 1:].ravel(), ids[1:, :].ravel()])
        border = np.concatenate([ids[0], ids[-1], ids[:, 0], ids[:, -1]])
        width = C + 2
        refuse_holes(~pad.ravel(), links_a, links_b, border,
                     lambda k: f"cell ({k // width - 1}, {k % width - 1})")

    def _engine(self) -> Dict[str, Any]:
        """The generic model, its extremes, the kernel layout and the rule (built on first use).

        Named shapes known to be tileable defer this, so that exact samples by
        domino shuffling of very large Aztec diamonds never pay for Thurston's
        algorithm on millions of corners.
        """
        if self._engine_parts is not None:
            return self._engine_parts
        g = self.geometry
        R, C = g.shape
        width = C + 1
        check_memory(ENGINE_BYTES_PER_CORNER * (R + 1) * (C + 1), f"the sampling engine of a {R}x{C} mask")
        families = (g.horizontal, g.vertical)
        node, interior, boundary_points = self._node, self._interior, self._boundary_points
        inner_t = np.concatenate([f.tail[f.inner] for f in families])
        inner_h = np.concatenate([f.head[f.inner] for f in families])
        a, b = node[inner_t], node[inner_h]
        constraints = np.concatenate([np.stack([a, b, np.ones_like(a)], 1), np.stack([b, a, np.full_like(a, 3)], 1)])
        rc = np.stack(np.divmod(interior, width), axis=1)
        names = np.concatenate([interior, boundary_points])
        model = HeightModel(len(interior), self._boundary_heights, constraints, g.residues(interior), 4,
                            (rc[:, 0] + rc[:, 1]) % 2, node_label=lambda k: g.corner_name(names[k]))
        least, greatest = model.extremes()
        runs = []
        for r in range(1, R):
            cols = np.flatnonzero(g.corner_interior[r])
            if cols.size:
                breaks = np.flatnonzero(np.diff(cols) > 1)
                starts = np.concatenate([[0], breaks + 1])
                ends = np.concatenate([breaks, [cols.size - 1]])
                runs += [(r, cols[s], cols[e]) for s, e in zip(starts, ends)]
        self._engine_parts = {
            "model": model,
            "least": self._grid(least),
            "greatest": self._grid(greatest),
            "layout": _core.domino.CornerLayout(R, C, np.array(runs, dtype=np.int32).reshape(-1, 3)),
            "rule": {"thresholds": flip_thresholds(self.weights, rc)} if self.weights is not None else None,
        }
        return self._engine_parts

    # ----- conversions -------------------------------------------------------------
    def _grid(self, node_heights: np.ndarray) -> np.ndarray:
        R, C = self.geometry.shape
        flat = np.zeros((R + 1) * (C + 1), dtype=np.int32)
        inside = self._node >= 0
        flat[inside] = np.asarray(node_heights)[self._node[inside]]
        return flat.reshape(R + 1, C + 1)

    def _nodes(self, grid: np.ndarray) -> np.ndarray:
        flat = np.asarray(grid).ravel()
        out = np.empty(len(self._interior) + len(self._boundary_points), dtype=np.int64)
        inside = self._node >= 0
        out[self._node[inside]] = flat[inside]
        return out

    def tiles_from_heights(self, heights: np.ndarray) -> np.ndarray:
        """Dominoes (k, 2, 2) of the tiling with these corner heights (crossed edges fall by 3).

        Raises ValueError when ``heights`` has the wrong shape or is not the
        height function of a tiling (its dominoes must cover every cell once).
        """
        h = np.asarray(heights)
        R, C = self.geometry.shape
        if h.shape != (R + 1, C + 1) or not np.issubdtype(h.dtype, np.integer):
            raise ValueError(f"corner heights of this region are an integer array of shape {(R + 1, C + 1)}, got "
                             f"{h.dtype} of shape {h.shape}")
        if h.size and (h.min() < -2**30 or h.max() > 2**30):
            raise ValueError("these heights are not the height function of a tiling of this region (values "
                             "beyond 2^30 in size)")
        heights32 = h.astype(np.int32)                       # checked range: differences cannot overflow
        pad = self.geometry._pad
        row_odd = (np.arange(R + 1) % 2).astype(bool)[:, None]
        column_odd = (np.arange(C + 1) % 2).astype(bool)[None, :]
        # horizontal edges (r, c)-(r, c+1), rightwards when r + c is odd: h falls by 3 across a vertical domino
        rise = heights32[:, 1:] - heights32[:, :-1]
        fall = np.where(row_odd != column_odd[:, :-1], rise, -rise) == -3
        r_v, c_v = np.nonzero(fall & pad[:-1, 1:-1] & pad[1:, 1:-1])
        # vertical edges (r, c)-(r+1, c), downwards when r + c is even: likewise across a horizontal domino
        rise = heights32[1:, :] - heights32[:-1, :]
        fall = np.where(row_odd[:-1] == column_odd, rise, -rise) == -3
        r_h, c_h = np.nonzero(fall & pad[1:-1, :-1] & pad[1:-1, 1:])
        first = np.concatenate([(r_v - 1) * C + c_v, r_h * C + c_h - 1])      # top or left cell
        second = np.concatenate([r_v * C + c_v, r_h * C + c_h])
        covered = np.bincount(np.concatenate([first, second]), minlength=R * C)
        if covered.size != R * C or not np.array_equal(covered, self.mask.ravel().astype(np.int64)):
            raise ValueError("these heights are not the height function of a tiling of this region (the dominoes "
                             "they give do not cover every cell exactly once)")
        # sorted by first cell (each cell is the first cell of at most one domino): a scatter, no sort
        slot = np.full(R * C, -1, dtype=np.int64)
        slot[first] = np.arange(first.size)
        order = slot[slot >= 0]
        first, second = first[order], second[order]
        out = np.empty((first.size, 2, 2), dtype=np.int64)
        out[:, 0, 0], out[:, 0, 1] = np.divmod(first, C)
        out[:, 1, 0], out[:, 1, 1] = np.divmod(second, C)
        return out

    def heights_from_tiles(self, tiles: np.ndarray) -> np.ndarray:
        """Corner heights of the tiling given as dominoes (k, 2, 2).

        Raises ValueError unless the dominoes are adjacent cell pairs covering
        every cell of the region exactly once.
        """
        t = np.asarray(tiles, dtype=np.int64)
        if t.ndim != 3 or t.shape[1:] != (2, 2):
            raise ValueError(f"dominoes must be an array of shape (k, 2, 2), got {t.shape}")
        t = t.copy()
        swap = (t[:, 0, 0] > t[:, 1, 0]) | ((t[:, 0, 0] == t[:, 1, 0]) & (t[:, 0, 1] > t[:, 1, 1]))
        t[swap] = t[swap][:, ::-1]
        d = t[:, 1] - t[:, 0]
        if not np.all(((d[:, 0] == 0) & (d[:, 1] == 1)) | ((d[:, 0] == 1) & (d[:, 1] == 0))):
            raise ValueError("every domino must cover two cells that share a side")
        R, C = self.geometry.shape
        cells = t.reshape(-1, 2)
        if cells.min() < 0 or np.any(cells[:, 0] >= R) or np.any(cells[:, 1] >= C):
            raise ValueError("a domino lies outside the mask")
        count = np.bincount(cells[:, 0] * C + cells[:, 1], minlength=R * C)
        if not np.array_equal(count, self.mask.ravel().astype(np.int64)):
            raise ValueError("the dominoes do not cover every cell of the region exactly once")
        return self._heights_of_tiling(t)

    def _heights_of_tiling(self, tiles: np.ndarray) -> np.ndarray:
        """Corner heights of dominoes already known to tile the region, each first cell top or left.

        A valid tiling has one height function: walk down the columns from the
        boundary, whose heights are known. Every interior corner's upper
        neighbour is a boundary or an interior corner of the row above.
        """
        R, C = self.geometry.shape
        crossed_v = np.zeros((R, C + 1), bool)
        horizontal = tiles[:, 0, 0] == tiles[:, 1, 0]
        crossed_v[tiles[horizontal, 1, 0], tiles[horizontal, 1, 1]] = True     # edge left of the right cell
        return self._scan_columns(self.geometry.step_down(crossed_v), np.int32)

    def _scan_columns(self, step: np.ndarray, dtype: Any) -> np.ndarray:
        """Corner heights from the boundary down the columns, given h(r + 1, c) - h(r, c) on every vertical edge.

        Integer steps run in C++ (the same loop, about 30x faster on large
        regions); float steps (expected heights) in numpy, one row at a time.
        """
        R, C = self.geometry.shape
        heights = np.zeros((R + 1) * (C + 1), dtype=dtype)
        heights[self._boundary_points] = self._boundary_heights
        heights = heights.reshape(R + 1, C + 1)
        interior = self.geometry.corner_interior
        if np.dtype(dtype) == np.int32:  # |h| <= |boundary| + 3 (R + 1): far inside int32 for any region built
            out = _core.domino.scan_columns(heights, interior.view(np.uint8), np.ascontiguousarray(step[:R], np.int8))
            return np.asarray(out)
        for r in range(1, R):
            cols = interior[r]
            heights[r, cols] = heights[r - 1, cols] + step[r - 1, cols]
        return heights

    def expected_heights(self, tiles: np.ndarray, probabilities: np.ndarray) -> np.ndarray:
        """Expected corner heights (float, layout of ``Sample.heights``; NaN outside) from placement probabilities.

        The column scan of :meth:`heights_from_tiles` with expected steps: a
        vertical edge changes the height by +-1, or -+3 when a horizontal
        domino crosses it, so by +-(1 - 4 p) on average.
        """
        R, C = self.geometry.shape
        t = np.asarray(tiles, dtype=np.int64).reshape(-1, 2, 2)
        horizontal = t[:, 0, 0] == t[:, 1, 0]
        right = np.maximum(t[horizontal, 0, 1], t[horizontal, 1, 1])   # the edge left of the right cell
        crossed = np.zeros((R, C + 1))
        crossed[t[horizontal, 0, 0], right] = np.asarray(probabilities, dtype=float)[horizontal]
        heights = self._scan_columns(self.geometry.expected_step_down(crossed), float)
        return np.where(self.corner_mask, heights, np.nan)

    def placement_probabilities(self, tolerance: float = 1e-6,
                                budget: Optional[float] = DEFAULT_BUDGET_SECONDS) -> Tuple[np.ndarray, np.ndarray]:
        """Every domino position and its probability (``fl.exact.placement_probabilities`` calls this).

        Aztec diamonds of any order: the urban-renewal recursion in probabilities
        (:mod:`.edge_probabilities`; float64 loses about n * 1e-16; the
        probabilities around every cell must sum to 1 within ``tolerance``);
        other regions: the inverse Kasteleyn matrix, each probability certified
        within ``tolerance`` (``budget`` seconds caps that route). ValueError
        otherwise.
        """
        from frostline.exact.local_statistics import check_vertex_sums, kasteleyn_placement_probabilities

        if not self.is_aztec_diamond:
            return kasteleyn_placement_probabilities(self, tolerance, budget)
        n = int(self._description["order"])
        horizontal, vertical = self.weights if self.weights is not None else (None, None)
        tiles, p = aztec_placement_probabilities(n, horizontal, vertical,
                                                 constant_ratio=_constant_ratio(self.mask, horizontal, vertical))
        R, C = self.geometry.shape
        cells = tiles.reshape(-1, 2)
        rank = np.cumsum(self.mask.ravel()) - 1  # cells of the region, numbered
        check_vertex_sums(rank[cells[:, 0] * C + cells[:, 1]], np.repeat(p, 2), int(self.mask.sum()), tolerance,
                          f"the edge probabilities of the order-{n} Aztec diamond")
        return tiles, p

    def height_field(self, heights: np.ndarray) -> np.ndarray:
        """Thurston's height / 4 on the corners (NaN outside the region): it changes by 1 around a vertex."""
        h = np.asarray(self.check_heights(heights), dtype=float) / 4.0
        return np.where(self.corner_mask, h, np.nan)

    def classify(self, tiles: np.ndarray) -> np.ndarray:
        """Class of each domino: 0 north, 1 south, 2 east, 3 west (see the module docstring)."""
        t = np.asarray(tiles).reshape(-1, 2, 2)
        horizontal = t[:, 0, 0] == t[:, 1, 0]
        even = (t[:, 0, 0] + t[:, 0, 1] + self.class_offset) % 2 == 0
        return np.where(horizontal, np.where(even, 0, 1), np.where(even, 3, 2)).astype(np.int8)

    # ----- kernels -----------------------------------------------------------------
    @property
    def is_aztec_diamond(self) -> bool:
        return self._description.get("shape") == "aztec diamond"

    def exact_methods(self) -> Dict[str, ExactMethod]:
        """``"cftp"``: the corner-grid kernel; ``"generic"``: the reference engine (same sample);
        ``"shuffling"`` (Aztec diamonds): domino shuffling, with its own random stream."""
        table = {"cftp": ExactMethod("cftp", "corner grid", self._corner_sample), "generic": self.generic_method()}
        if self.is_aztec_diamond:
            table["shuffling"] = ExactMethod("shuffling", "shuffling", self._shuffle)
        return table

    def unavailable_methods(self) -> Dict[str, str]:
        if self.is_aztec_diamond:
            return {}
        return {"shuffling": "domino shuffling samples Aztec diamonds only; use method='cftp' for this region"}

    def auto_method(self) -> str:
        """Shuffling for Aztec diamonds (O(n^3), no coupling time), coupling from the past otherwise."""
        return "shuffling" if self.is_aztec_diamond else "cftp"

    def chain_kernels(self) -> Dict[str, ChainKernel]:
        corner = ChainKernel("corner grid", self._corner_chain)
        return {"cftp": corner, "generic": self.generic_chain_kernel()}

    def _corner_sample(self, key, options: RunOptions):
        e = self._engine()
        heights, report = _core.domino.corner_sample(
            e["layout"], e["least"].ravel(), e["greatest"].ravel(), e["rule"], key[0], key[1],
            options.check_order, options.max_start_time, options.progress, options.threads)
        return np.asarray(heights, dtype=np.int32).reshape(e["least"].shape), report

    def _corner_chain(self, key, heights: np.ndarray):
        e = self._engine()
        shape = e["least"].shape
        compiled = _core.domino.corner_chain(e["layout"], np.ascontiguousarray(heights, np.int32).ravel(),
                                             e["rule"], key[0], key[1])
        return compiled, lambda h: np.asarray(h, dtype=np.int32).reshape(shape)

    def _shuffle(self, key, options: RunOptions):
        import time

        n = self._description["order"]
        horizontal, vertical = self.weights if self.weights is not None else (None, None)
        started = time.perf_counter()
        tiles = _core.domino.aztec_shuffle(n, horizontal, vertical, key[0], key[1], options.progress,
                                           memory_limit=float(memory_limit()), threads=options.threads)
        seconds = time.perf_counter() - started
        tiles = np.asarray(tiles, dtype=np.int64)  # sorted by first cell: the layout of tiles_from_heights
        # The compiled shuffle checks its own domino count, and every golden and
        # distribution test compares its tiles with these heights, so the
        # cover check of heights_from_tiles (a third of the time at n = 1000) is skipped.
        heights = self._heights_of_tiling(tiles.reshape(-1, 2, 2))
        # orders grown, and the 2 x 2 faces filled on the way (k^2 at order k)
        report = {"orders": n, "faces_filled": n * (n + 1) * (2 * n + 1) // 6, "seconds": seconds}
        return heights, report, {"tiles": tiles}

    def extreme_heights(self) -> Tuple[np.ndarray, np.ndarray]:
        e = self._engine()
        return e["least"], e["greatest"]

    def nodes_from_heights(self, heights: np.ndarray) -> np.ndarray:
        return self._nodes(heights)

    def heights_from_model(self, node_heights: np.ndarray) -> np.ndarray:
        return self._grid(node_heights)

    def configuration_weight(self, heights: np.ndarray):
        """Product of the dominoes' weights (exact Fractions of the float weights; 1 when uniform)."""
        from fractions import Fraction

        if self.weights is None:
            return 1
        horizontal, vertical = self.weights
        w = Fraction(1)
        for (r1, c1), (r2, _) in self.tiles_from_heights(heights).tolist():
            w *= Fraction(float(horizontal[r1, c1] if r1 == r2 else vertical[r1, c1]))
        return w

    def dimer_system(self) -> dict:
        """Kasteleyn matrix with weight 1 on horizontal and i on vertical dominoes, times the edge weights
        (Kenyon 1997); rows black cells, columns white cells (row-major)."""
        R, C = self.mask.shape
        r, c = np.nonzero(self.mask)
        black = (r + c) % 2 == 0
        index = -np.ones((R, C), dtype=np.int64)
        index[r[black], c[black]] = np.arange(black.sum())
        index[r[~black], c[~black]] = np.arange((~black).sum())
        horizontal, vertical = self.weights if self.weights is not None else (np.ones((R, C - 1)), np.ones((R - 1, C)))
        rows, cols, tiles, values = [], [], [], []
        for dr, dc in ((0, 1), (0, -1), (1, 0), (-1, 0)):
            rb, cb = r[black], c[black]
            rw, cw = rb + dr, cb + dc
            ok = (rw >= 0) & (rw < R) & (cw >= 0) & (cw < C)
            ok[ok] = self.mask[rw[ok], cw[ok]]
            rb, cb, rw, cw = rb[ok], cb[ok], rw[ok], cw[ok]
            top, left = np.minimum(rb, rw), np.minimum(cb, cw)
            if dr:
                values.append(1j * vertical[top, cb])
            else:
                values.append(horizontal[rb, left].astype(complex))
            rows.append(index[rb, cb])
            cols.append(index[rw, cw])
            first = np.where((rb < rw) | (cb < cw), 0, 1)
            cells = np.stack([np.stack([rb, cb], 1), np.stack([rw, cw], 1)], 1)
            tiles.append(np.where(first[:, None, None] == 0, cells, cells[:, ::-1]))
        rows_, cols_ = np.concatenate(rows), np.concatenate(cols)
        matrix = np.zeros((int(black.sum()), int((~black).sum())), dtype=complex)
        matrix[rows_, cols_] = np.concatenate(values)
        return {"matrix": matrix, "rows": rows_, "cols": cols_, "tiles": np.concatenate(tiles).astype(np.int64)}

    @property
    def plane_origin(self) -> Tuple[float, float]:
        """Cell (r, c) has its centre at (c + 1/2 - x0, y0 - r - 1/2): the centred frame for the Aztec diamond."""
        if self.is_aztec_diamond:
            n = self._description["order"]
            return (float(n), float(n))
        return (0.0, 0.0)

    def kasteleyn_real(self) -> np.ndarray:
        from .counts import kasteleyn_matrix

        h, v = self.weights if self.weights is not None else (None, None)
        return np.asarray(kasteleyn_matrix(self.mask, h, v), dtype=float)

    def tile_outlines(self, tiles: np.ndarray) -> np.ndarray:
        """Domino rectangles (k, 4, 2) in the frame of :meth:`tile_centres`."""
        from .drawing import domino_rectangles

        x0, y0 = self.plane_origin
        return domino_rectangles(tiles) + np.array([-x0, y0])

    def tile_centres(self, tiles: np.ndarray) -> np.ndarray:
        t = np.asarray(tiles, dtype=float).reshape(-1, 2, 2).mean(axis=1)
        x0, y0 = self.plane_origin
        return np.stack([t[:, 1] + 0.5 - x0, y0 - t[:, 0] - 0.5], axis=1)

    @property
    def scale(self) -> float:
        """The order n for Aztec diamonds; otherwise half the larger side of the mask."""
        if self.is_aztec_diamond:
            return float(self._description["order"])
        return max(self.mask.shape) / 2.0

    def arctic_curve(self, m: int = 720) -> np.ndarray:
        """Aztec diamond, uniform or with vertical weight a: the circle / ellipse, centred frame."""
        if not self.is_aztec_diamond:
            raise ValueError(f"no published arctic curve is built in for {self!r}")
        d = self._description
        if self.weights is not None and "vertical_weight" not in d:
            raise ValueError("no closed-form arctic curve is built in for these weights (two-periodic curves are "
                             "algebraic of degree 8 and not reproduced here)")
        from .arctic import aztec_curve

        return aztec_curve(d["order"], d.get("vertical_weight", 1.0), m)

    def limit_setup(self, resolution: int = 1):
        """The variational problem on the region's own cells (uniform weights; see :mod:`.limit`)."""
        if resolution != 1:
            raise ValueError("domino regions are solved on their own cells (resolution 1): a mask refined m times "
                             "has other boundary heights, hence another limit shape")
        from .limit import limit_setup

        return limit_setup(self)

    def heat_bath_rule(self):
        """(generic model, 1, rule): uniform, or the two-point rule of the edge weights."""
        return self._engine()["model"], 1.0, self._engine()["rule"]

    @property
    def model(self) -> HeightModel:
        """The generic height model of the region (built on first use)."""
        return self._engine()["model"]

    @property
    def n_dominoes(self) -> int:
        return int(self.mask.sum()) // 2

    def describe(self) -> Dict[str, Any]:
        d = {"lattice": self.lattice, **self._description, "weighted": self.weights is not None}
        return d

    def record_arrays(self) -> Dict[str, np.ndarray]:
        out = {"mask": self.mask}
        if self.weights is not None:
            out["horizontal"], out["vertical"] = self.weights
        return out

    def count(self, *, budget: Optional[float] = DEFAULT_BUDGET_SECONDS,
              max_digits: Optional[int] = DEFAULT_MAX_DIGITS) -> int:
        """Number of domino tilings (exact): closed forms for Aztec diamonds and rectangles, else abs(det K).

        Refuses (ValueError, with the estimate) a computation estimated above
        ``budget`` seconds (default 60) or a count above ``max_digits`` decimal
        digits (default a million); None lifts either cap. Ctrl-C stops a run.
        """
        from .counts import count_region

        return count_region(self, budget=budget, max_digits=max_digits)

    def partition_function(self) -> Any:
        from .counts import weighted_partition_function

        return self.count() if self.weights is None else weighted_partition_function(self)

    def draw(self, sample: Sample, ax: Any = None, colouring: Optional[str] = None, **style: Any) -> Any:
        """Draw the tiling; ``colouring`` "classes" (north, south, east, west) or "faces" (each class split
        by face parity, eight tones: the gas phase of two-periodic weights shows). Default: "faces" for
        two-periodic weights, else "classes"."""
        from frostline.toolkit import palette

        from .drawing import draw_dominoes
        from .weights import face_parity

        if colouring is None:
            colouring = "faces" if "two_periodic_weights" in self._description else "classes"
        if colouring not in ("classes", "faces"):
            raise ValueError(f"colouring must be 'classes' or 'faces', got {colouring!r}")
        classes = self.classify(sample.tiles)
        if colouring == "faces":
            classes = classes + 4 * face_parity(sample.tiles)
            style.setdefault("tones", palette.DOMINO_CLASSES_BY_FACE)
            style.setdefault("key", [f"{name}, {kind} face" for kind in ("even", "odd") for name in self.tile_classes])
        style.setdefault("key", self.tile_classes)       # north, south, east, west beside the picture
        return draw_dominoes(sample.tiles, classes, ax=ax, **style)

    def __repr__(self) -> str:
        shape = {k: v for k, v in self._description.items()}
        return f"DominoRegion({shape}, dominoes={self.n_dominoes}, weighted={self.weights is not None})"



def _constant_ratio(mask: np.ndarray, horizontal: Optional[np.ndarray], vertical: Optional[np.ndarray]) -> Optional[float]:
    """w_T w_B / D when every horizontal domino inside the mask has one weight and every vertical one another
    (then urban renewal keeps that ratio at every face of every order); None otherwise."""
    if horizontal is None and vertical is None:
        return 0.5
    h_in = horizontal[mask[:, :-1] & mask[:, 1:]] if horizontal is not None else np.ones(1)
    v_in = vertical[mask[:-1, :] & mask[1:, :]] if vertical is not None else np.ones(1)
    if h_in.size == 0 or v_in.size == 0 or np.ptp(h_in) != 0 or np.ptp(v_in) != 0:
        return None
    h, v = float(h_in[0]), float(v_in[0])
    return h * h / (h * h + v * v)
