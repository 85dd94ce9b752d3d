"""Lattice-independent pieces of the public API: Region, Sample, SampleInfo, Chain.

A plugin subclasses :class:`Region` and supplies the lattice-specific parts
(lowering to the generic model, heights and tiles conventions, counts,
drawing). Everything here works on arrays and never looks at a lattice name.
"""
from __future__ import annotations

import abc
from dataclasses import asdict, dataclass, field
from typing import Any, Callable, Dict, List, Optional, Tuple, Union

import numpy as np

from ._version import __version__
from .model import ProgressHook
from .seeding import SeedLike, SeedRecord, engine_key, normalise_seed, seed_record


@dataclass(frozen=True)
class SampleInfo:
    """Diagnostics of one exact sample.

    Attributes
    ----------
    method : str
        ``"cftp"`` (monotone coupling from the past) or another exact method.
    kernel : str
        Which implementation ran (``"generic"`` or a plugin's fast kernel).
    start_time : int
        T, in sweeps: the run from time -T to 0 coalesced (0: one configuration).
    coalescence_time : int
        Sweeps after -T at which the top and bottom chains met.
    site_updates : int
        Heat-bath updates done, both chains and every epoch counted.
    epochs : int
        Doubling epochs run.
    seconds : float
        Wall-clock time of the compiled run.
    seed : SeedRecord
        Entropy and spawn key of the SeedSequence (repeats the run).
    version : str
        frostline version (same seed and version give the same sample).
    """

    method: str
    kernel: str
    start_time: int
    coalescence_time: int
    site_updates: int
    epochs: int
    seconds: float
    seed: SeedRecord
    version: str = __version__

    def as_dict(self) -> Dict[str, Any]:
        """Plain-data form (for printing and metadata records)."""
        d = {k: v for k, v in asdict(self).items() if k != "seed"}
        d["seed"] = self.seed.as_dict()
        return d


@dataclass(frozen=True, eq=False)
class Sample:
    """One configuration of a region.

    ``heights`` follows the lattice's convention (documented by the plugin);
    ``tiles`` is computed from the heights on first use.
    """

    region: "Region"
    heights: np.ndarray
    info: SampleInfo
    _cache: Dict[str, Any] = field(default_factory=dict, repr=False)

    @property
    def tiles(self) -> np.ndarray:
        """Every tile of the configuration, in the plugin's documented layout."""
        if "tiles" not in self._cache:
            self._cache["tiles"] = self.region.tiles_from_heights(self.heights)
        return self._cache["tiles"]

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


class Chain:
    """A forward heat-bath Markov chain on a region, for studying the dynamics.

    Each sweep updates every site once (colour class by colour class) with the
    same counter-based random numbers as the exact sampler uses, keyed by the
    chain's seed and the sweep's time index. ``run`` may be interrupted with
    Ctrl-C; the state stays consistent and ``time`` counts the sweeps done.
    """

    def __init__(self, region: "Region", compiled: Any, sequence: np.random.SeedSequence,
                 to_heights: Callable[[np.ndarray], np.ndarray]) -> None:
        self.region = region
        self._compiled = compiled
        self._to_heights = to_heights
        self.seed = seed_record(sequence)

    @property
    def time(self) -> int:
        """Sweeps run so far."""
        return int(self._compiled.time)

    @property
    def heights(self) -> np.ndarray:
        """The current state in the lattice's height convention (a copy)."""
        return self._to_heights(self._compiled.heights)

    def run(self, sweeps: int, progress: ProgressHook = None) -> "Chain":
        """Run ``sweeps`` sweeps (GIL released); returns self."""
        sweeps = _check_count(sweeps, "sweeps")
        self._compiled.run(sweeps, progress)
        return self

    def trace(self, observable: Callable[[np.ndarray], float], sweeps: int, every: int = 1) -> np.ndarray:
        """Run ``sweeps`` sweeps, recording ``observable(heights)`` every ``every`` sweeps.

        Returns a float array of length ``sweeps // every``.
        """
        sweeps = _check_count(sweeps, "sweeps")
        every = _check_count(every, "every")
        if every == 0:
            raise ValueError("every must be at least 1")
        values = np.empty(sweeps // every)
        for k in range(values.size):
            self.run(every)
            values[k] = observable(self.heights)
        return values


def _check_count(value: Any, name: str) -> int:
    if isinstance(value, bool) or not isinstance(value, (int, np.integer)):
        raise TypeError(f"{name} must be an int, got {type(value).__name__}")
    if value < 0:
        raise ValueError(f"{name} must be non-negative, got {value}")
    if value >= 2**62:
        raise ValueError(f"{name} = {value} is beyond 2^62")
    return int(value)


StartLike = Union[str, np.ndarray]


class Region(abc.ABC):
    """A finite region of some lattice with its weights.

    Subclasses (one per plugin shape family) implement the abstract methods.
    """

    #: registry name of the plugin (one lowercase word)
    lattice: str = ""

    # ----- what a plugin provides -------------------------------------------------
    @abc.abstractmethod
    def _run_exact(self, key: Tuple[int, int], method: str, check_order: bool, max_start_time: int,
                   progress: ProgressHook) -> Tuple[np.ndarray, dict, str]:
        """Run an exact sampler; returns (heights, engine report, kernel name)."""

    @abc.abstractmethod
    def _make_chain(self, key: Tuple[int, int], start: StartLike, method: str) -> Tuple[Any, Callable]:
        """A compiled forward chain and the map from its state to heights."""

    @abc.abstractmethod
    def tiles_from_heights(self, heights: np.ndarray) -> np.ndarray:
        """Tiles of the configuration with these heights."""

    @abc.abstractmethod
    def count(self) -> int:
        """Exact number of configurations (a Python int)."""

    @abc.abstractmethod
    def draw(self, sample: Sample, ax: Any = None, **style: Any) -> Any:
        """Draw a sample with matplotlib."""

    def describe(self) -> Dict[str, Any]:
        """Plain-data (JSON-ready) description of the region and its weights."""
        return {"lattice": self.lattice}

    def heat_bath_rule(self) -> Tuple[Any, float, Optional[dict]]:
        """(generic HeightModel, q, rule) that the exact samplers run; see :func:`frostline.check_monotone`."""
        raise NotImplementedError(f"{type(self).__name__} does not expose its heat-bath rule")

    def record_arrays(self) -> Dict[str, np.ndarray]:
        """Arrays that, with :meth:`describe`, rebuild the region (saved in sample files)."""
        return {}

    def heights_from_model(self, node_heights: np.ndarray) -> np.ndarray:
        """Heights in this lattice's convention from the generic model's node heights."""
        raise NotImplementedError(f"{type(self).__name__} does not map generic heights")

    def configuration_weight(self, heights: np.ndarray) -> Any:
        """The (unnormalised, exact where possible) weight of the configuration with these heights."""
        return 1

    def dimer_system(self) -> Dict[str, Any]:
        """Kasteleyn matrix and tile positions for exact local statistics (dimer models only)."""
        raise ValueError(f"{self.lattice} regions have no Kasteleyn matrix; exact local statistics need a dimer model")

    def kasteleyn_real(self) -> np.ndarray:
        """A real Kasteleyn matrix whose |determinant| is the weighted tiling count (dimer models only)."""
        raise ValueError(f"{self.lattice} regions have no Kasteleyn matrix; exact local statistics need a dimer model")

    def tile_centres(self, tiles: np.ndarray) -> np.ndarray:
        """Plane coordinates (k, 2) of the centres of tiles."""
        raise NotImplementedError(f"{type(self).__name__} does not place tiles in the plane")

    @property
    def scale(self) -> float:
        """The region's linear size (lattice units), for scaled coordinates."""
        return 1.0

    def arctic_curve(self, m: int = 720) -> np.ndarray:
        """The published limit of the frozen boundary, as (m, 2) points in plane coordinates.

        Raises ValueError for regions where no published curve is known.
        """
        raise ValueError(f"no published arctic curve is known for {self!r}")

    def sample_views(self) -> Dict[str, Callable[[np.ndarray], Any]]:
        """Named views of a sample computed from its heights (``Sample.<name>``); none by default."""
        return {}

    # ----- the shared API ------------------------------------------------------
    def sample(self, seed: SeedLike = None, *, method: str = "auto", check_order: bool = False,
               max_start_time: int = 2**40, progress: ProgressHook = None) -> Sample:
        """One exact sample by monotone coupling from the past.

        Parameters
        ----------
        seed : int, numpy.random.SeedSequence or None
            The same seed gives the identical sample on any machine; None draws
            fresh entropy, recorded in ``info.seed``.
        method : str
            ``"auto"`` (fastest exact kernel), ``"generic"`` (the reference
            engine) or a plugin's kernel name; all give the same sample.
        check_order : bool
            Debug path: verify after every sweep that the top chain stays above
            the bottom one (slower).
        max_start_time : int
            Raise RuntimeError rather than go back further than this many sweeps.
        progress : callable(start_time, site_updates, seconds), optional
            Called about every 10^8 site updates and at each doubling.
        """
        sequence = normalise_seed(seed)
        record = seed_record(sequence)  # before the run: a bad seed fails fast
        if not isinstance(method, str):
            raise TypeError(f"method must be a str, got {type(method).__name__}")
        max_start_time = _check_count(max_start_time, "max_start_time")
        if max_start_time < 1:
            raise ValueError("max_start_time must be at least 1 sweep")
        heights, report, kernel = self._run_exact(engine_key(sequence), method, bool(check_order),
                                                  max_start_time, progress)
        info = SampleInfo(method="cftp", kernel=kernel, seed=record, **report)
        return Sample(region=self, heights=heights, info=info)

    def samples(self, k: int, seed: SeedLike = None, *, threads: Optional[int] = None, method: str = "auto",
                max_start_time: int = 2**40) -> List[Sample]:
        """``k`` independent exact samples; member i is drawn from child i of the seed's SeedSequence.

        Runs on ``threads`` threads (default: the machine's cores) with the GIL
        released inside each sample, so it scales with cores; the result is the
        same list for any thread count. Ctrl-C stops every worker at its next
        engine check and raises KeyboardInterrupt; no partial list is returned.
        """
        import os
        import threading
        from concurrent.futures import ThreadPoolExecutor, wait

        k = _check_count(k, "k")
        if threads is None:
            threads = os.cpu_count() or 1
        threads = _check_count(threads, "threads")
        if threads < 1:
            raise ValueError("threads must be at least 1")
        # spawn from a copy rebuilt from the record: spawning mutates a SeedSequence, and the
        # same seed must give the same ensemble every time it is passed
        children = seed_record(normalise_seed(seed)).sequence().spawn(k)
        stop = threading.Event()

        def hook(*_: Any) -> None:
            if stop.is_set():  # raised inside the engine's poll: the sample is abandoned
                raise KeyboardInterrupt

        def one(child):
            return self.sample(child, method=method, max_start_time=max_start_time, progress=hook)

        pool = ThreadPoolExecutor(max_workers=min(threads, max(k, 1)))
        try:
            futures = [pool.submit(one, c) for c in children]
            pending = set(futures)
            while pending:
                _, pending = wait(pending, timeout=0.2)
            return [f.result() for f in futures]
        except BaseException:
            stop.set()
            for f in futures:
                f.cancel()
            raise
        finally:
            pool.shutdown(wait=True)

    def chain(self, seed: SeedLike = None, start: StartLike = "min", *, method: str = "auto") -> Chain:
        """A forward heat-bath chain from ``"min"``, ``"max"`` or a given height array."""
        sequence = normalise_seed(seed)
        compiled, to_heights = self._make_chain(engine_key(sequence), start, method)
        return Chain(self, compiled, sequence, to_heights)

    def partition_function(self) -> Any:
        """Weighted sum over configurations; the unweighted count by default."""
        return self.count()

