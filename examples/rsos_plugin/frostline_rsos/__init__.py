"""Restricted solid-on-solid (RSOS) surfaces: an outside frostline plugin (lattice name ``rsos``).

Heights on the cells of a rows x columns grid, 0 <= h <= max_height,
neighbouring cells differ by at most 1 and the frame around the grid is held
at 0. Weight q ** (sum of heights). Exact samples by monotone coupling from
the past, through this package's own compiled kernel (built against the
headers frostline ships) or frostline's generic engine; both give the same
sample for the same seed.

    import frostline as fl
    R = fl.lattice("rsos").surface(4, 5, max_height=2)
    R.count(); R.sample(seed=0).heights

From the command line, with no change to frostline::

    frostline lattices
    frostline sample rsos 4 5 2 --seed 1
    frostline count rsos 3 3 2
"""
from __future__ import annotations

from typing import Any, Dict

import numpy as np

from frostline import Argument, ExactMethod, HeightModel, LatticeSpec, Region, RunOptions, Shape
from frostline._limits import check_memory

from . import _kernel

TILE_CLASSES = ("cell",)


class SurfaceRegion(Region):
    """RSOS surfaces on a rows x columns grid; ``Sample.heights`` is the (rows, columns) height array."""

    lattice = "rsos"
    tile_classes = TILE_CLASSES

    def __init__(self, rows: int, columns: int, max_height: int, q: float = 1.0) -> None:
        for name, v, low in (("rows", rows, 1), ("columns", columns, 1), ("max_height", max_height, 0)):
            if isinstance(v, bool) or not isinstance(v, (int, np.integer)):
                raise TypeError(f"{name} must be an int, got {type(v).__name__}")
            if v < low:
                raise ValueError(f"{name} must be at least {low}, got {v}")
        q = float(q)
        if not np.isfinite(q) or q <= 0:
            raise ValueError(f"q must be finite and positive, got {q}")
        check_memory(400 * (rows + 2) * (columns + 2), f"a {rows}x{columns} surface")
        self.rows, self.columns, self.max_height, self.q = int(rows), int(columns), int(max_height), q
        self.model = self._lower()
        self._least = np.zeros((rows + 2, columns + 2), np.int32)
        greatest = np.zeros((rows + 2, columns + 2), np.int32)
        greatest[1:-1, 1:-1] = self.model.extremes()[1][: rows * columns].reshape(rows, columns)
        self._greatest = greatest

    def _lower(self) -> HeightModel:
        """Sites r * columns + c; boundary nodes: the zero frame (one node), the ceiling max_height."""
        R, C = self.rows, self.columns
        site = np.arange(R * C).reshape(R, C)
        frame, ceiling = R * C, R * C + 1
        pairs = [np.stack([site[:, :-1].ravel(), site[:, 1:].ravel()], 1),
                 np.stack([site[:-1, :].ravel(), site[1:, :].ravel()], 1)]
        border = np.unique(np.concatenate([site[0], site[-1], site[:, 0], site[:, -1]]))
        pairs.append(np.stack([border, np.full(border.size, frame)], 1))
        pairs = np.concatenate(pairs)
        rows = [np.stack([pairs[:, 0], pairs[:, 1], np.ones(len(pairs), int)], 1),
                np.stack([pairs[:, 1], pairs[:, 0], np.ones(len(pairs), int)], 1),
                np.stack([np.full(R * C, ceiling), site.ravel(), np.zeros(R * C, int)], 1),  # h <= max_height
                np.stack([site.ravel(), np.full(R * C, frame), np.zeros(R * C, int)], 1)]   # h >= 0
        r, c = np.divmod(np.arange(R * C), C)
        return HeightModel(R * C, np.array([0, self.max_height]), np.concatenate(rows), np.zeros(R * C), 1, (r + c) % 2)

    # ----- kernels: this package's compiled kernel beside frostline's generic engine -----
    def exact_methods(self) -> Dict[str, ExactMethod]:
        kernel = ExactMethod("cftp", "rsos kernel", self._kernel_sample)
        return {"cftp": kernel, "kernel": kernel, "generic": self.generic_method()}

    def _kernel_sample(self, key, options: RunOptions):
        h, report = _kernel.sample(self.rows, self.columns, self.max_height, self.q, key[0], key[1],
                                   self._least.ravel(), self._greatest.ravel(), options.progress,
                                   options.max_start_time, options.check_order)
        return np.asarray(h, np.int32).reshape(self.rows + 2, self.columns + 2)[1:-1, 1:-1].copy(), report

    def nodes_from_heights(self, heights: np.ndarray) -> np.ndarray:
        return np.concatenate([np.asarray(heights, np.int64).ravel(), [0, self.max_height]])

    def heights_from_model(self, node_heights: np.ndarray) -> np.ndarray:
        return np.asarray(node_heights[: self.rows * self.columns], np.int32).reshape(self.rows, self.columns)

    def heat_bath_rule(self):
        return self.model, self.q, None

    def tiles_from_heights(self, heights: np.ndarray) -> np.ndarray:
        r, c = np.meshgrid(np.arange(self.rows), np.arange(self.columns), indexing="ij")
        return np.stack([r.ravel(), c.ravel(), np.asarray(heights).ravel()], 1).astype(np.int64)

    def classify(self, tiles: np.ndarray) -> np.ndarray:
        return np.zeros(len(tiles), np.int8)

    def count(self) -> int:
        """Number of surfaces, by frostline's enumeration of the generic model (small grids)."""
        from frostline.custom import ModelRegion

        return ModelRegion(self.model).count()

    def describe(self) -> Dict[str, Any]:
        return {"lattice": self.lattice, "rows": self.rows, "columns": self.columns, "max_height": self.max_height,
                "q": self.q}

    def draw(self, sample, ax=None, **style):
        import matplotlib.pyplot as plt

        if ax is None:
            _, ax = plt.subplots()
        ax.imshow(sample.heights, cmap=style.get("cmap", "Greens"), vmin=0, vmax=self.max_height)
        ax.set_axis_off()
        return ax


def surface(rows: int, columns: int, max_height: int, q: float = 1.0) -> SurfaceRegion:
    """RSOS surfaces on a rows x columns grid with heights 0..max_height, weight q ** volume."""
    return SurfaceRegion(rows, columns, max_height, q)


def region_from_record(record: dict, arrays: dict) -> SurfaceRegion:
    return SurfaceRegion(record["rows"], record["columns"], record["max_height"], record.get("q", 1.0))


LATTICE = LatticeSpec(
    name="rsos",
    summary="restricted solid-on-solid surfaces (an outside plugin)",
    shapes=(Shape("rsos", "RSOS surfaces on a ROWS x COLUMNS grid with heights 0..MAX_HEIGHT", surface,
                  (Argument("rows", "number of rows"), Argument("columns", "number of columns"),
                   Argument("max_height", "the largest height"),
                   Argument("q", "weight per unit of height (q ** volume); 1 is uniform", type=float, default=1.0,
                            flag="--q"))),),
    tile_classes=TILE_CLASSES,
    weight_keys=("q",),
    region_from_record=region_from_record,
)
