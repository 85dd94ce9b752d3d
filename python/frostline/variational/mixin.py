"""The face a plugin's region class gets for limit shapes: :class:`VariationalRegion`."""
from __future__ import annotations

from typing import Any, Optional

import numpy as np

from .setup import LimitSetup


class VariationalRegion:
    """Mixin (before ``Region`` in the bases) for regions that lower themselves with ``limit_setup``."""

    def limit_setup(self, resolution: int = 1) -> LimitSetup:  # pragma: no cover - every user overrides it
        raise NotImplementedError

    def limit_shape(self, resolution: Optional[int] = None, *, progress: Any = None) -> Any:
        """The limit shape predicted by the variational principle (a :class:`frostline.variational.LimitShape`).

        The maximiser of the entropy functional (Cohn, Kenyon, Propp 2001; the
        lozenge entropy through the Lobachevsky function, q ** volume as a
        linear term) with this region's boundary heights, on the region's own
        cells, refined ``resolution`` times in each direction where the plugin
        allows it (lozenges; ``None`` = 1). See docs/limit_shapes.md.
        ``progress(iteration, decrement, value)`` is called after every Newton
        step. Raises ValueError for weights with no built-in surface tension.
        """
        from .result import limit_shape_of

        if resolution is None:
            resolution = 1
        if isinstance(resolution, bool) or not isinstance(resolution, (int, np.integer)) or resolution < 1:
            raise ValueError(f"resolution must be a positive int (refinement factor), got {resolution!r}")
        return limit_shape_of(self.limit_setup(int(resolution)), progress=progress)
