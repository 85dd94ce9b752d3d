"""frostline: exact sampling of random tilings and height-function models.

A C++ engine of local-move Markov chains and monotone coupling from the past,
with lattices as plugins. Quick start::

    import frostline as fl
    R = fl.lozenge.hexagon(40, 40, 40)
    S = R.sample(seed=0)          # exact, by coupling from the past
    S.heights                     # the plane partition (40 x 40)
    S.tiles                       # every lozenge: (x, y, type)
    fl.plot.save(S, "hexagon.png")

Lattice modules (``fl.lozenge`` ...) and ``fl.plot`` load on first use, so
``import frostline`` needs neither matplotlib nor every plugin.
"""
from __future__ import annotations

from typing import Any

from ._version import __version__
from .checker import MonotonicityReport, check_monotone
from .diagnostics import ChainDiagnostics, equilibrium_diagnostics
from .errors import FrostlineWarning, RegionTooLargeError
from .io import load, save
from .model import HeightModel
from .region import Chain, Region, Sample, SampleInfo
from .registry import lattice, lattices
from .seeding import SeedRecord

__all__ = [
    "Chain",
    "ChainDiagnostics",
    "FrostlineWarning",
    "HeightModel",
    "MonotonicityReport",
    "Region",
    "RegionTooLargeError",
    "Sample",
    "SampleInfo",
    "SeedRecord",
    "__version__",
    "check_monotone",
    "equilibrium_diagnostics",
    "lattice",
    "lattices",
    "load",
    "save",
]


def __getattr__(name: str) -> Any:
    if name in ("plot", "exact", "analysis"):
        import importlib

        return importlib.import_module(f".{name}", __name__)
    if name in lattices():
        return lattice(name)
    raise AttributeError(f"module 'frostline' has no attribute {name!r}")
