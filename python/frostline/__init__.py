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

from . import custom
from ._version import __version__
from .checker import ModelReport, MonotonicityReport, check_model, check_monotone
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
    "ModelReport",
    "MonotonicityReport",
    "Region",
    "RegionTooLargeError",
    "Sample",
    "SampleInfo",
    "SeedRecord",
    "__version__",
    "check_model",
    "check_monotone",
    "custom",
    "equilibrium_diagnostics",
    "get_cmake_dir",
    "get_include",
    "lattice",
    "lattices",
    "load",
    "save",
]


def get_include() -> str:
    """Folder of the engine's C++ headers (``#include "frostline/..."``), for outside compiled plugins."""
    from pathlib import Path

    from . import _core  # the compiled module sits where the wheel put the headers

    return str(Path(_core.__file__).parent / "include")


def get_cmake_dir() -> str:
    """Folder holding ``frostlineConfig.cmake`` (pass it as ``-Dfrostline_DIR=...``)."""
    from pathlib import Path

    from . import _core

    return str(Path(_core.__file__).parent / "share" / "cmake" / "frostline")


def __getattr__(name: str) -> Any:
    if name in ("plot", "exact", "analysis"):
        import importlib

        return importlib.import_module(f".{name}", __name__)
    if name in lattices():
        return lattice(name)
    raise AttributeError(f"module 'frostline' has no attribute {name!r}")
