"""What an exact sampler returns: a :class:`Sample` and its :class:`SampleInfo`."""
from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any, Dict, Mapping

import numpy as np

from ._version import __version__
from .seeding import SeedRecord


@dataclass(frozen=True)
class SampleInfo:
    """Diagnostics of one exact sample.

    Attributes
    ----------
    method : str
        The exact method that ran: ``"cftp"`` (monotone coupling from the past)
        or another exact method of the region, such as ``"shuffling"``.
    kernel : str
        Which implementation ran (``"generic"`` or a plugin's fast kernel).
    seconds : float
        Wall-clock time of the compiled run.
    seed : SeedRecord
        Entropy and spawn key of the SeedSequence (repeats the run).
    report : Mapping[str, int or float]
        The method's own figures. For ``"cftp"``: ``start_time`` (T, in sweeps:
        the run from -T to 0 coalesced), ``coalescence_time`` (sweeps after -T
        at the first check that found the chains met; checks come every
        max(4, T / 256) sweeps), ``site_updates`` (heat-bath updates, both
        chains, every epoch) and ``epochs`` (doublings). Shuffling methods report
        their own (domino shuffling: ``orders``, ``faces_filled``). Each entry is
        also readable as an attribute (``info.start_time``).
    version : str
        frostline version (same seed and version give the same sample).
    """

    method: str
    kernel: str
    seconds: float
    seed: SeedRecord
    report: Mapping[str, Any] = field(default_factory=dict)
    version: str = __version__

    def __post_init__(self) -> None:
        object.__setattr__(self, "report", dict(self.report))  # a copy: the caller's dict cannot change it

    def __hash__(self) -> int:
        return hash((self.method, self.kernel, self.seconds, self.seed, tuple(sorted(self.report.items())),
                     self.version))

    def __getattr__(self, name: str) -> Any:
        # report entries read as attributes; only reached when no field matches
        report = self.__dict__.get("report", {})
        if name in report:
            return report[name]
        raise AttributeError(f"{self.__dict__.get('method', '?')} samples report no {name!r} "
                             f"(this run reports: {', '.join(report) or 'nothing'})")

    def as_dict(self) -> Dict[str, Any]:
        """Plain-data form (for printing and metadata records)."""
        return {"method": self.method, "kernel": self.kernel, "seconds": self.seconds,
                "report": dict(self.report), "seed": self.seed.as_dict(), "version": self.version}

    @classmethod
    def from_dict(cls, d: Mapping[str, Any]) -> SampleInfo:
        """Inverse of :meth:`as_dict`."""
        return cls(method=str(d["method"]), kernel=str(d["kernel"]), seconds=float(d["seconds"]),
                   seed=SeedRecord.from_dict(d["seed"]), report=dict(d.get("report", {})),
                   version=str(d.get("version", __version__)))


@dataclass(frozen=True, eq=False)
class Sample:
    """One configuration of a region.

    ``heights`` follows the lattice's convention (documented by the plugin);
    ``tiles`` is computed from the heights on first use.
    """

    region: Any  # the frostline.Region it came from (not imported: region.py imports this module)
    heights: np.ndarray
    info: SampleInfo
    _cache: Dict[str, Any] = field(default_factory=dict, repr=False)

    @property
    def tiles(self) -> np.ndarray:
        """Every tile of the configuration, in the plugin's documented layout."""
        if "tiles" not in self._cache:
            self._cache["tiles"] = self.region.tiles_from_heights(self.heights)
        return self._cache["tiles"]

    def height_field(self) -> np.ndarray:
        """Heights in the dimer normalisation, one convention for every lattice (float; NaN outside).

        The plugin's :meth:`frostline.Region.height_field` says which points
        and which normalisation (for lozenges the number-of-cubes height on
        lattice points, for dominoes Thurston's height / 4 on corners).
        """
        if "height_field" not in self._cache:
            self._cache["height_field"] = self.region.height_field(self.heights)
        return self._cache["height_field"]

    def plot(self, ax: Any = None, **style: Any) -> Any:
        """Draw the configuration with matplotlib; returns the Axes."""
        return self.region.draw(self, ax=ax, **style)

    def __getattr__(self, name: str) -> Any:
        # extra views a plugin declares (e.g. ``matrix`` for square ice), computed once from the heights
        if name.startswith("_"):
            raise AttributeError(name)
        views = self.region.sample_views()
        if name not in views:
            raise AttributeError(f"a {self.region.lattice} sample has no attribute {name!r}")
        if name not in self._cache:
            self._cache[name] = views[name](self.heights)
        return self._cache[name]
