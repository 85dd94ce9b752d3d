"""The table of a region's samplers: exact methods and chain kernels.

A plugin describes what it can run; :class:`frostline.Region` does the rest
(argument checks, "auto", seeds, reports). Each entry is one way to run:

- :class:`ExactMethod`: ``run(key, options) -> (heights, report)`` draws one
  exact sample with the 128-bit engine key; ``family`` is what
  ``SampleInfo.method`` says ("cftp", "shuffling"), ``kernel`` which code ran.
- :class:`ChainKernel`: ``make(key, heights) -> (compiled chain, to_heights)``
  starts a forward chain from heights in the lattice's convention.

Method names a user passes are the keys of the tables; ``"auto"`` resolves by
a fixed rule of the region (its ``auto_method``), never by measured speed or
by the processor, so a seed keeps its sample.
"""
from __future__ import annotations

from dataclasses import dataclass
from typing import Any, Callable, Dict, Mapping, Optional, Tuple

import numpy as np

from .model import ProgressHook

EngineKey = Tuple[int, int]


@dataclass(frozen=True)
class RunOptions:
    """What every exact run is told (see :meth:`frostline.Region.sample`)."""

    check_order: bool = False
    max_start_time: int = 2**40
    progress: ProgressHook = None
    threads: int = 1  # threads sharing each colour class; kernels without threads ignore it (same sample)


@dataclass(frozen=True)
class ExactMethod:
    """One exact sampler of a region.

    ``run(key, options)`` returns (heights, report), or (heights, report,
    views) where ``views`` pre-fills the sample's cache with views the method
    made anyway (``{"tiles": ...}``, exactly what ``tiles_from_heights`` would give).
    """

    family: str
    kernel: str
    run: Callable[..., Tuple[Any, ...]]


@dataclass(frozen=True)
class ChainKernel:
    """One forward-chain implementation of a region."""

    kernel: str
    make: Callable[[EngineKey, np.ndarray], Tuple[Any, Callable[[np.ndarray], np.ndarray]]]


def resolve(table: Mapping[str, Any], method: Any, auto: str, what: str,
            unavailable: Optional[Mapping[str, str]] = None) -> Tuple[str, Any]:
    """(name, entry) of ``method`` in ``table``; ``"auto"`` means ``auto``.

    ``unavailable`` maps methods the lattice has but this region cannot run to the reason.
    """
    if not isinstance(method, str):
        raise TypeError(f"method must be a str, got {type(method).__name__}")
    name = auto if method == "auto" else method
    if name not in table and unavailable and name in unavailable:
        raise ValueError(unavailable[name])
    if name not in table:
        choices = ", ".join(["auto", *table])
        raise ValueError(f"method must be one of this region's {what} ({choices}), got {method!r}")
    return name, table[name]


def engine_report(report: Mapping[str, Any]) -> Tuple[float, Dict[str, Any]]:
    """(seconds, the rest) of a compiled run's report dict."""
    rest = dict(report)
    seconds = float(rest.pop("seconds", 0.0))
    return seconds, rest
