"""The lattice-independent face of a region: :class:`Region`.

A plugin subclasses :class:`Region` and supplies what only it knows: its
kernels (the tables of :mod:`frostline.methods`), the generic lowering
(``heat_bath_rule``, ``heights_from_model``, ``nodes_from_heights``), heights
and tiles conventions, counts and drawing. Method selection, seeds, start
states, reports and ensembles live here once. Nothing here looks at a lattice
name.
"""
from __future__ import annotations

import abc
import threading
from typing import Any, Callable, Dict, List, Optional, Tuple, Union

import numpy as np

from ._validate import count as _check_count
from .chain import Chain
from .methods import ChainKernel, EngineKey, ExactMethod, RunOptions, engine_report, resolve
from .model import HeightModel, ProgressHook
from .sample import Sample, SampleInfo
from .seeding import SeedLike, child_sequence, engine_key, normalise_seed, seed_record

StartLike = Union[str, np.ndarray]

__all__ = ["Region", "Sample", "SampleInfo", "StartLike"]


class Region(abc.ABC):
    """A finite region of some lattice with its weights.

    Subclasses (one per plugin shape family) implement the abstract methods
    and may extend the tables returned by :meth:`exact_methods` and
    :meth:`chain_kernels` with fast kernels.
    """

    #: registry name of the plugin (one lowercase word)
    lattice: str = ""

    # ----- what a plugin provides -------------------------------------------------
    @abc.abstractmethod
    def heat_bath_rule(self) -> Tuple[HeightModel, float, Optional[dict]]:
        """(generic HeightModel, q, rule) that the exact samplers run; see :func:`frostline.check_monotone`."""

    @abc.abstractmethod
    def heights_from_model(self, node_heights: np.ndarray) -> np.ndarray:
        """Heights in this lattice's convention from the generic model's node heights."""

    @abc.abstractmethod
    def nodes_from_heights(self, heights: np.ndarray) -> np.ndarray:
        """The generic model's node heights (int64, one per node) from heights in this lattice's convention."""

    @abc.abstractmethod
    def tiles_from_heights(self, heights: np.ndarray) -> np.ndarray:
        """Tiles of the configuration with these heights."""

    @abc.abstractmethod
    def count(self) -> int:
        """Exact number of configurations (a Python int)."""

    @abc.abstractmethod
    def draw(self, sample: Sample, ax: Any = None, **style: Any) -> Any:
        """Draw a sample with matplotlib."""

    def exact_methods(self) -> Dict[str, ExactMethod]:
        """The exact samplers, by the name ``sample(method=...)`` takes.

        The default is coupling from the past on the generic model, under the
        names ``"cftp"`` and ``"generic"``; plugins put fast kernels first.
        """
        generic = self.generic_method()
        return {"cftp": generic, "generic": generic}

    def chain_kernels(self) -> Dict[str, ChainKernel]:
        """The forward-chain implementations, by the name ``chain(method=...)`` takes."""
        generic = self.generic_chain_kernel()
        return {"cftp": generic, "generic": generic}

    def unavailable_methods(self) -> Dict[str, str]:
        """Methods of the lattice that this region cannot run, with the reason (for clear errors)."""
        return {}

    def auto_method(self) -> str:
        """The method "auto" stands for: a fixed rule of the region (the first entry by default)."""
        return next(iter(self.exact_methods()))

    def exactness_check(self) -> None:
        """Raise ValueError when coupling from the past would not be exact here (default: always exact)."""
        return None

    def describe(self) -> Dict[str, Any]:
        """Plain-data (JSON-ready) description of the region and its weights."""
        return {"lattice": self.lattice}

    def summary(self) -> str:
        """The region in words, from :meth:`describe` (for captions and the command line).

        For example ``"lozenge box: sides 3 x 4 x 5, q = 0.9"``.
        """
        described = dict(self.describe())
        lattice = str(described.pop("lattice", self.lattice)).replace("_", " ")
        shape = described.pop("shape", None)
        described.pop("weighted", None)
        parts = []
        for key, value in described.items():
            name = key.replace("_", " ")
            if isinstance(value, (list, tuple)):
                joiner = " x " if key == "sides" else ", "  # box sides read as dimensions
                text = joiner.join(f"{v:g}" if isinstance(v, float) else str(v) for v in value)
                parts.append(f"{name} {text}")
            elif isinstance(value, float):
                parts.append(f"{name} = {value:g}")
            else:
                parts.append(f"{name} {value}")
        head = f"{lattice} {shape}" if shape else lattice
        return f"{head}: {', '.join(parts)}" if parts else head

    def record_arrays(self) -> Dict[str, np.ndarray]:
        """Arrays that, with :meth:`describe`, rebuild the region (saved in sample files)."""
        return {}

    def configuration_weight(self, heights: np.ndarray) -> Any:
        """The (unnormalised, exact where possible) weight of the configuration with these heights."""
        return 1

    def dimer_system(self) -> Dict[str, Any]:
        """Kasteleyn matrix and tile positions for exact local statistics (dimer models only)."""
        raise ValueError(f"{self.lattice} regions have no Kasteleyn matrix; exact local statistics need a dimer model")

    def kasteleyn_real(self) -> np.ndarray:
        """A real Kasteleyn matrix whose absolute determinant is the weighted tiling count (dimer models only)."""
        raise ValueError(f"{self.lattice} regions have no Kasteleyn matrix; exact local statistics need a dimer model")

    def tile_centres(self, tiles: np.ndarray) -> np.ndarray:
        """Plane coordinates (k, 2) of the centres of tiles."""
        raise NotImplementedError(f"{type(self).__name__} does not place tiles in the plane")

    def tile_outlines(self, tiles: np.ndarray) -> np.ndarray:
        """Corners (k, m, 2) of each tile in plane coordinates (the frame of :meth:`tile_centres`)."""
        raise NotImplementedError(f"{type(self).__name__} does not draw tile outlines")

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

    def limit_shape(self, resolution: Optional[int] = None, *, progress: Any = None) -> Any:
        """The limit shape predicted by the variational principle; see :mod:`frostline.variational`.

        Plugins whose lattice has a built-in surface tension provide it (through
        :class:`frostline.variational.VariationalRegion`); the default raises ValueError.
        """
        raise ValueError(f"no variational principle (surface tension) is built in for {self.lattice} regions; "
                         "limit shapes are available for lozenge and uniform domino regions")

    # ----- the generic lowering, shared by every plugin ---------------------------
    def generic_method(self) -> ExactMethod:
        """Coupling from the past on the generic model: the reference every kernel is tested against."""
        def run(key: EngineKey, options: RunOptions) -> Tuple[np.ndarray, Dict[str, Any]]:
            model, q, rule = self.heat_bath_rule()
            nodes, report = model.sample(q, key, check_order=options.check_order,
                                         max_start_time=options.max_start_time, progress=options.progress, rule=rule)
            return self.heights_from_model(nodes), report

        return ExactMethod("cftp", "generic", run)

    def generic_chain_kernel(self) -> ChainKernel:
        """Forward chains on the generic model."""
        def make(key: EngineKey, heights: np.ndarray) -> Tuple[Any, Callable[[np.ndarray], np.ndarray]]:
            model, q, rule = self.heat_bath_rule()
            return model.chain(q, key, self.nodes_from_heights(heights), rule=rule), self.heights_from_model

        return ChainKernel("generic", make)

    def extreme_heights(self) -> Tuple[np.ndarray, np.ndarray]:
        """The least and greatest configurations (Thurston's algorithm), in this lattice's convention."""
        least, greatest = self.heat_bath_rule()[0].extremes()
        return self.heights_from_model(least), self.heights_from_model(greatest)

    def check_heights(self, heights: Any) -> np.ndarray:
        """``heights`` as an array of this region's layout, or ValueError/TypeError if it is not a configuration.

        A configuration keeps the boundary, satisfies every difference
        constraint and the residue rule of the generic model. The array returned
        is rebuilt from the model's nodes, so entries the layout keeps outside
        the region (masked corners) hold their documented value (0), whatever
        was given there.
        """
        h = np.asarray(heights)
        if not np.issubdtype(h.dtype, np.integer):
            raise TypeError(f"heights must hold integers, got dtype {h.dtype}")
        least = self.extreme_heights()[0]
        if h.shape != least.shape:
            raise ValueError(f"heights of this region have shape {least.shape}, got {h.shape}")
        model = self.heat_bath_rule()[0]
        nodes = np.asarray(self.nodes_from_heights(h), dtype=np.int64)
        n = model.n_sites
        c = model.constraints.astype(np.int64)
        if not np.array_equal(nodes[n:], model.boundary_values):
            raise ValueError("these heights change the region's fixed boundary")
        bad = nodes[c[:, 1]] - nodes[c[:, 0]] > c[:, 2]
        if bad.any():
            first = c[np.argmax(bad)]
            where = model._relabel(f"node {first[0]} and node {first[1]}")
            raise ValueError(f"{int(bad.sum())} neighbour differences break the height rule, the first between "
                             f"{where} (see the lattice's height conventions)")
        off = (nodes[:n] - model.residues) % model.step if model.step > 1 else np.zeros(0)
        if off.any():
            where = model._relabel(f"site {int(np.argmax(off != 0))}")
            raise ValueError(f"the height at {where} breaks the residue rule (heights modulo {model.step})")
        return np.asarray(self.heights_from_model(nodes))

    def __getstate__(self) -> Dict[str, Any]:
        state = dict(self.__dict__)
        state.pop("_exactness_lock", None)  # a lock does not pickle; a new one is made on demand
        return state

    def __setstate__(self, state: Dict[str, Any]) -> None:
        self.__dict__.update(state)

    def _check_exactness_once(self) -> None:
        """Run :meth:`exactness_check` once per region, whichever thread asks first; others wait for it.

        ``samples(threads=k)`` would otherwise run a costly check k times at once.
        """
        lock = self.__dict__.setdefault("_exactness_lock", threading.Lock())  # setdefault is atomic
        with lock:
            if "_exactness_outcome" not in self.__dict__:
                try:
                    self.exactness_check()
                    self.__dict__["_exactness_outcome"] = None
                except ValueError as exc:
                    self.__dict__["_exactness_outcome"] = str(exc)
        outcome = self.__dict__["_exactness_outcome"]
        if outcome is not None:
            raise ValueError(outcome)

    # ----- the shared API ------------------------------------------------------
    def sample(self, seed: SeedLike = None, *, method: str = "auto", check_order: bool = False,
               max_start_time: int = 2**40, progress: ProgressHook = None, threads: int = 1) -> Sample:
        """One exact sample.

        Parameters
        ----------
        seed : int, numpy.random.SeedSequence or None
            The same seed gives the identical sample on any machine; None draws
            fresh entropy, recorded in ``info.seed``.
        method : str
            ``"auto"`` (the region's default exact method, a fixed rule),
            ``"cftp"`` (coupling from the past with the fastest kernel),
            ``"generic"`` (the reference engine; the same sample as every
            coupling-from-the-past kernel) or another of
            ``exact_methods()`` (for example ``"shuffling"``; its own stream).
        check_order : bool
            Debug path: verify after every sweep that the top chain stays above
            the bottom one (slower).
        max_start_time : int
            Raise RuntimeError rather than go back further than this many sweeps.
        progress : callable(start_time, site_updates, seconds), optional
            Called about every 10^8 site updates and at each doubling.
        threads : int
            Threads that share each sweep (each takes a block of rows of a
            colour class). The sample is the same for every thread count. The
            vector kernels of uniform boxes, general lozenge regions, domino
            regions and square ice use them, and so does domino shuffling (rows
            of faces); other kernels run on the calling thread. Worth it for large
            regions only (a colour class must take well over a microsecond).
        """
        sequence = normalise_seed(seed)
        record = seed_record(sequence)  # before the run: a bad seed fails fast
        max_start_time = _check_count(max_start_time, "max_start_time")
        if max_start_time < 1:
            raise ValueError("max_start_time must be at least 1 sweep")
        threads = _check_count(threads, "threads")
        if not 1 <= threads <= 1024:
            raise ValueError(f"threads must be between 1 and 1024, got {threads}")
        if progress is not None and not callable(progress):
            raise TypeError(f"progress must be None or a callable(start_time, site_updates, seconds), "
                            f"got {type(progress).__name__}")
        name, chosen = resolve(self.exact_methods(), method, self.auto_method(), "exact methods",
                               self.unavailable_methods())
        if chosen.family == "cftp":
            self._check_exactness_once()
        options = RunOptions(bool(check_order), max_start_time, progress, threads)
        heights, report, *views = chosen.run(engine_key(sequence), options)
        seconds, figures = engine_report(report)
        info = SampleInfo(method=chosen.family, kernel=chosen.kernel, seconds=seconds, seed=record, report=figures)
        return Sample(region=self, heights=heights, info=info, _cache=dict(views[0]) if views else {})

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
        resolve(self.exact_methods(), method, self.auto_method(), "exact methods",
                self.unavailable_methods())  # fail before spawning
        # the list of samples is the big allocation: estimate it before anything runs
        from ._limits import check_memory

        cells = int(np.asarray(self.extreme_heights()[0]).size)
        check_memory(k * (8 * cells + 2048), f"a list of {k} samples of {cells} heights each")
        # children are made one at a time, as they are submitted, identical to
        # SeedSequence.spawn(k) on a copy rebuilt from the record (spawning mutates a
        # SeedSequence, and the same seed must give the same ensemble every time)
        root = seed_record(normalise_seed(seed)).sequence()

        def child(i: int) -> np.random.SeedSequence:
            return child_sequence(root, i)

        stop = threading.Event()

        def hook(*_: Any) -> None:
            if stop.is_set():  # raised inside the engine's poll: the sample is abandoned
                raise KeyboardInterrupt

        def one(child: np.random.SeedSequence) -> Sample:
            return self.sample(child, method=method, max_start_time=max_start_time, progress=hook)

        workers = min(threads, max(k, 1))
        pool = ThreadPoolExecutor(max_workers=workers)
        futures: list = []
        try:
            # a bounded number of members in flight: futures are submitted as others finish
            submitted = 0
            pending: set = set()
            while submitted < k or pending:
                while submitted < k and len(pending) < 4 * workers:
                    future = pool.submit(one, child(submitted))
                    futures.append(future)
                    pending.add(future)
                    submitted += 1
                done, pending = wait(pending, timeout=0.2, return_when="FIRST_COMPLETED")
                for future in done:
                    future.result()  # a member that failed stops the ensemble now
            return [f.result() for f in futures]
        except BaseException:
            stop.set()
            for f in futures:
                f.cancel()
            raise
        finally:
            pool.shutdown(wait=True)

    def chain(self, seed: SeedLike = None, start: StartLike = "min", *, method: str = "auto") -> Chain:
        """A forward heat-bath chain from ``"min"``, ``"max"`` or a given height array.

        ``method`` picks a chain kernel (``chain_kernels()``; "auto" is the
        fastest, every kernel gives the same trajectory for a seed).
        """
        sequence = normalise_seed(seed)
        kernels = self.chain_kernels()
        _, kernel = resolve(kernels, method, next(iter(kernels)), "chain kernels")
        heights = self._start_heights(start)
        compiled, to_heights = kernel.make(engine_key(sequence), heights)
        return Chain(self, compiled, sequence, to_heights, kernel.kernel)

    def _start_heights(self, start: StartLike) -> np.ndarray:
        if isinstance(start, str):
            if start not in ("min", "max"):
                raise ValueError(f"start must be 'min', 'max' or a height array, got {start!r}")
            least, greatest = self.extreme_heights()
            return least if start == "min" else greatest
        try:
            return self.check_heights(start)
        except ValueError as exc:
            raise ValueError(f"start is not a configuration of this region: {exc}") from None

    def height_field(self, heights: np.ndarray) -> np.ndarray:
        """Heights in the dimer normalisation (float, NaN at entries outside the region).

        The normalisation in which the Gaussian free field limit has variance
        (1 / pi^2) log(distance) for differences: the height changes by 1 around a
        vertex of the dimer graph (docs/references.md, section 4). Plugins whose
        lattice has one override this; the default raises ValueError.
        """
        raise ValueError(f"the {self.lattice} lattice declares no height field in the dimer normalisation")

    def partition_function(self) -> Any:
        """Weighted sum over configurations; the unweighted count by default."""
        return self.count()
