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
"""
from __future__ import annotations

from typing import Any, Dict

import numpy as np

from frostline import HeightModel, Region
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

    def _run_exact(self, key, method, check_order, max_start_time, progress):
        if method not in ("auto", "kernel", "generic"):
            raise ValueError(f"method must be 'auto', 'kernel' or 'generic', got {method!r}")
        if method == "generic":
            h, report = self.model.sample(self.q, key, check_order=check_order, max_start_time=max_start_time,
                                          progress=progress)
            return self.heights_from_model(h), report, "generic"
        h, report = _kernel.sample(self.rows, self.columns, self.max_height, self.q, key[0], key[1],
                                   self._least.ravel(), self._greatest.ravel(), progress)
        return np.asarray(h, np.int32).reshape(self.rows + 2, self.columns + 2)[1:-1, 1:-1].copy(), report, "rsos kernel"

    def _make_chain(self, key, start, method):
        if isinstance(start, str):
            if start not in ("min", "max"):
                raise ValueError("start must be 'min', 'max' or a height array")
            start = np.zeros((self.rows, self.columns)) if start == "min" else self._greatest[1:-1, 1:-1]
        nodes = np.concatenate([np.asarray(start).ravel(), [0, self.max_height]])
        return self.model.chain(self.q, key, nodes), self.heights_from_model

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
