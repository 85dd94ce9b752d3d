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

from typing import Any, List

try:
    from . import _core  # noqa: F401 - the compiled engine; everything below needs it
except ImportError as _error:  # pragma: no cover - depends on the installation
    raise ImportError(
        "frostline's compiled engine (frostline._core) could not be imported, so frostline is not usable. "
        "It is built when frostline is installed: reinstall with 'pip install --force-reinstall frostline', or "
        "from a source checkout 'pip install .' (a C++17 compiler is needed). Running Python inside the "
        f"source tree without installing does not work. The import failed with: {_error}"
    ) from _error

from . import custom
from ._version import __version__
from .chain import Chain
from .diagnostics import ChainDiagnostics, equilibrium_diagnostics
from .ensemble import Ensemble, ensemble
from .errors import FrostlineWarning, RegionTooLargeError
from .io import load, save
from .lattice_spec import Argument, LatticeSpec, Shape
from .methods import ChainKernel, ExactMethod, RunOptions
from .model import HeightModel
from .region import Region
from .registry import lattice, lattices
from .sample import Sample, SampleInfo
from .seeding import SeedRecord
from .toolkit.checker import ModelReport, MonotonicityReport, check_model, check_monotone

__all__ = [
    "Argument",
    "Chain",
    "ChainKernel",
    "ChainDiagnostics",
    "Ensemble",
    "FrostlineWarning",
    "ExactMethod",
    "HeightModel",
    "LatticeSpec",
    "ModelReport",
    "MonotonicityReport",
    "Region",
    "RegionTooLargeError",
    "RunOptions",
    "Sample",
    "SampleInfo",
    "SeedRecord",
    "Shape",
    "__version__",
    "check_model",
    "check_monotone",
    "custom",
    "ensemble",
    "equilibrium_diagnostics",
    "get_cmake_dir",
    "get_include",
    "lattice",
    "lattices",
    "load",
    "save",
    "simd_level",
    "simd_levels",
]


def simd_levels() -> List[str]:
    """Instruction-set levels of the vector kernels this processor and build can run, slowest first.

    Some of ``"scalar"``, ``"avx2"``, ``"avx512"``. Every level gives the identical
    sample for a seed; only the speed differs. The environment variable
    ``FROSTLINE_SIMD`` forces one of them (read at every call; an unavailable
    level raises ValueError).
    """
    from . import _core

    return list(_core.engine.simd_levels())


def simd_level() -> str:
    """The level the vector kernels use now: ``FROSTLINE_SIMD`` when set, else the fastest available."""
    from . import _core

    return str(_core.engine.simd_choice())


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


def __dir__() -> List[str]:
    return sorted(set(__all__) | {"analysis", "exact", "plot"} | set(lattices()))


def __getattr__(name: str) -> Any:
    if name in ("plot", "exact", "analysis"):
        import importlib

        return importlib.import_module(f".{name}", __name__)
    if name in lattices():
        return lattice(name)
    raise AttributeError(f"module 'frostline' has no attribute {name!r}")
