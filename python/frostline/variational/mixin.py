"""The face a plugin's region class gets for limit shapes: :class:`VariationalRegion`."""
from __future__ import annotations

from typing import Any, Optional

import numpy as np

from .setup import LimitSetup


class VariationalRegion:
    """Mixin (before ``Region`` in the bases) for regions that lower themselves with ``limit_setup``."""

    def limit_setup(self, resolution: int = 1) -> LimitSetup:  # pragma: no cover - every user overrides it
        raise NotImplementedError

    def limit_shape(self, resolution: Optional[int] = None, *, progress: Any = None, tolerance: float = 1e-12,
                    max_iterations: int = 600) -> Any:
        """The limit shape predicted by the variational principle (a :class:`frostline.variational.LimitShape`).

        The maximiser of the entropy functional (Cohn, Kenyon, Propp 2001; the
        lozenge entropy through the Lobachevsky function, q ** volume as a
        linear term) with this region's boundary heights, on the region's own
        cells, refined ``resolution`` times in each direction where the plugin
        allows it (lozenges; ``None`` = 1). See docs/limit_shapes.md.
        ``progress(iteration, decrement, value)`` is called after every Newton
        step; the solver stops when half the Newton decrement is below
        ``tolerance * |F|`` and warns (FrostlineWarning) if ``max_iterations``
        steps did not get there. Raises ValueError for weights with no
        built-in surface tension.
        """
        from .result import limit_shape_of

        if resolution is None:
            resolution = 1
        if isinstance(resolution, bool) or not isinstance(resolution, (int, np.integer)) or resolution < 1:
            raise ValueError(f"resolution must be a positive int (refinement factor), got {resolution!r}")
        if not (isinstance(max_iterations, (int, np.integer)) and not isinstance(max_iterations, bool)
                and max_iterations >= 1):
            raise ValueError(f"max_iterations must be a positive int, got {max_iterations!r}")
        if not (isinstance(tolerance, (int, float)) and 0 < tolerance < 1):
            raise ValueError(f"tolerance must be a number in (0, 1), got {tolerance!r}")
        return limit_shape_of(self.limit_setup(int(resolution)), progress=progress, tolerance=float(tolerance),
                              max_iterations=int(max_iterations))
