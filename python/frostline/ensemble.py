"""Ensembles of exact samples: local threads or processes, or a Dask cluster; stored in zarr, resumable.

Member i is the exact sample from child i of the seed's SeedSequence
(:func:`frostline.seeding.child_sequence`), so it equals
``region.samples(size, seed=seed)[i]`` whatever ran it, where, and in what
order. Statistics are streamed as exact integer sums of the heights and their
squares (int64), so any order of arrival gives bit-identical means and
variances, and the members need not be kept.

A store (a path or a zarr store; zarr and, for clusters, dask.distributed
are the optional extra ``frostline[cluster]``) is a zarr group: ``heights``
of shape (size, ...), one member per chunk, ``info`` with one row per member
(seconds, then the method's integer report figures, named in the attribute
``report_fields``), and ``done``, written after the member's other chunks as
its commit mark (members are written in small batches: a kill loses at most
one batch of work, and only uncommitted members); chunks carry a crc32c checksum. Attributes hold the region's
description, the seed record and frostline's version, written once by the
coordinating process. Re-running the same call on an existing store computes
only the members not marked done, and refuses a store made for another
region, seed, size or version.
"""
from __future__ import annotations

import os
import sys
import time
from concurrent.futures import FIRST_COMPLETED, Future, ProcessPoolExecutor, ThreadPoolExecutor, wait
from dataclasses import dataclass
from typing import Any, Callable, Dict, List, Mapping, Optional, Tuple, cast

import numpy as np

from ._validate import count as _check_count
from ._version import __version__
from .sample import Sample, SampleInfo
from .seeding import SeedLike, child_sequence, normalise_seed, seed_record

FORMAT = "frostline-ensemble-2"  # 2: seconds and report figures in one "info" row per member
_REPORT_FIELDS = ("seconds",)  # always stored; the method's numeric report figures are added on first use


def _payload(region: Any) -> Tuple[str, Dict[str, Any], Dict[str, np.ndarray]]:
    """What rebuilds the region in another process: (lattice, description, arrays)."""
    return region.lattice, region.describe(), {k: np.asarray(v) for k, v in region.record_arrays().items()}


def _rebuild(payload: Tuple[str, Dict[str, Any], Dict[str, np.ndarray]]) -> Any:
    from .registry import spec

    lattice, description, arrays = payload
    declared = spec(lattice)
    if declared.region_from_record is None:
        raise ValueError(f"the lattice {lattice!r} cannot rebuild its regions in another process; use "
                         "backend='threads'")
    return declared.region_from_record(description, arrays)


_REGIONS: Dict[str, Any] = {}  # per worker process: the rebuilt region, by the digest of its payload


def _payload_key(payload: Tuple[str, Dict[str, Any], Dict[str, np.ndarray]]) -> str:
    """A digest of everything that defines the region: lattice, description and every array (values too)."""
    import hashlib
    import json

    lattice, description, arrays = payload
    digest = hashlib.sha256(json.dumps([lattice, description], sort_keys=True, default=str).encode())
    for name in sorted(arrays):
        a = np.ascontiguousarray(arrays[name])
        digest.update(f"{name}:{a.dtype.str}:{a.shape}".encode())
        digest.update(a.tobytes())
    return digest.hexdigest()


def _remote_member(payload: Tuple[str, Dict[str, Any], Dict[str, np.ndarray]], root: Dict[str, Any], i: int,
                   method: str) -> Tuple[int, np.ndarray, Dict[str, Any]]:
    """Member i, computed in a worker process (or on a cluster worker): (i, heights, info)."""
    from .seeding import SeedRecord

    key = _payload_key(payload)
    region = _REGIONS.get(key)
    if region is None:
        _REGIONS.clear()  # one region at a time per worker: the cache never grows
        region = _REGIONS[key] = _rebuild(payload)
    sample = region.sample(child_sequence(SeedRecord.from_dict(root).sequence(), i), method=method)
    return i, np.asarray(sample.heights), sample.info.as_dict()


@dataclass
class _Sums:
    """Exact integer sums of the heights and their squares, and the number of members."""

    total: np.ndarray
    squares: np.ndarray
    members: int = 0

    def add(self, heights: np.ndarray) -> None:
        h = np.asarray(heights, dtype=np.int64)
        self.total += h
        self.squares += h * h
        self.members += 1


class _Reductions:
    """Exact sums of integer arrays that user functions compute from each member (order-independent)."""

    def __init__(self, region: Any, reducers: Optional[Mapping[str, Callable[[Sample], Any]]]) -> None:
        self.region = region
        self.reducers = dict(reducers or {})
        for name, f in self.reducers.items():
            if not isinstance(name, str) or not callable(f):
                raise TypeError("reducers must map names (str) to functions sample -> integer array")
        self.sums: Dict[str, np.ndarray] = {}

    def add(self, heights: np.ndarray) -> None:
        if not self.reducers:
            return
        # reducers read heights and tiles; the member's diagnostics are not passed (info is None)
        sample = Sample(region=self.region, heights=np.asarray(heights), info=cast(SampleInfo, None))
        for name, f in self.reducers.items():
            value = np.asarray(f(sample))
            if not np.issubdtype(value.dtype, np.integer) and value.dtype != bool:
                raise ValueError(f"reducer {name!r} returned {value.dtype} values; reducers must return integer "
                                 "arrays (counts), so that sums are exact in any order of arrival")
            value = value.astype(np.int64)
            if name not in self.sums:
                self.sums[name] = np.zeros(value.shape, dtype=np.int64)
            if value.shape != self.sums[name].shape:
                raise ValueError(f"reducer {name!r} returned shape {value.shape}, earlier {self.sums[name].shape}")
            self.sums[name] += value


class Ensemble:
    """The members and streamed statistics of one ensemble (see :func:`ensemble`)."""

    def __init__(self, region: Any, size: int, root: np.random.SeedSequence, method: str,
                 group: Any, sums: _Sums, infos: Dict[int, Dict[str, Any]],
                 reductions: Optional[_Reductions] = None) -> None:
        self.region = region
        self.size = size
        self.method = method
        self.seed = seed_record(root)
        self._root = root
        self._group = group
        self._sums = sums
        self._infos = infos
        self._reductions = reductions

    def __len__(self) -> int:
        return self.size

    def __getitem__(self, i: int) -> Sample:
        """Member i: read from the store when there is one, else drawn again (the same sample)."""
        i = _check_count(i, "member index")
        if not 0 <= i < self.size:
            raise IndexError(f"member {i} of an ensemble of {self.size}")
        stored = self._stored(i)
        if stored is not None:
            return stored
        return self.region.sample(child_sequence(self._root, i), method=self.method)

    def _stored(self, i: int) -> Optional[Sample]:
        """Member i from the store, or None when it is not there or a chunk fails its checksum."""
        try:
            if self._group is None or not bool(self._group["done"][i]):
                return None
            info: Dict[str, Any] = {"method": str(self._group.attrs["method_family"]),
                                    "kernel": str(self._group.attrs["kernel"]),
                                    "seed": seed_record(child_sequence(self._root, i)).as_dict(), "version": __version__}
            row = np.asarray(self._group["info"][i]) if "info" in self._group else np.zeros(1)
            info["seconds"] = float(row[0])
            info["report"] = {k: int(v) for k, v in zip(self._group.attrs.get("report_fields", []), row[1:])}
            return Sample(region=self.region, heights=np.asarray(self._group["heights"][i]),
                          info=SampleInfo.from_dict(info))
        except Exception:   # a chunk failing its checksum: draw the member again (the same sample)
            return None

    @property
    def mean_heights(self) -> np.ndarray:
        """Mean height at every point over the members (float; from exact integer sums)."""
        if self._sums.members == 0:
            raise ValueError("the ensemble has no members")
        return self._sums.total / self._sums.members

    @property
    def var_heights(self) -> np.ndarray:
        """Unbiased variance of the height at every point (ddof = 1; from exact integer sums)."""
        k = self._sums.members
        if k < 2:
            raise ValueError("a variance needs at least two members")
        return (self._sums.squares - self._sums.total.astype(float) ** 2 / k) / (k - 1)

    @property
    def reduced(self) -> Dict[str, np.ndarray]:
        """{reducer name: the exact int64 sum of its values over the members} (see ``reducers``)."""
        return {} if self._reductions is None else {k: v.copy() for k, v in self._reductions.sums.items()}

    def tile_densities(self, bin_size: float = 1.0) -> np.ndarray:
        """Density of each tile class on a grid of square bins: float (classes, nx, ny), the fraction of
        the tiles in each bin that belong to each class, over all members (NaN in empty bins).

        From the ``tile_counts`` reducer when the ensemble ran with it (its bin
        size is used and ``bin_size`` ignored); otherwise counted now from the
        members, read from the store or drawn again (the same samples), with
        :func:`frostline.analysis.tile_counts` at ``bin_size`` (plane units).
        """
        counts = self.reduced.get("tile_counts")
        if counts is None and self.size == 0:
            raise ValueError("the ensemble has no members, so no tile densities")
        if counts is None:
            from .analysis import tile_counts

            count = tile_counts(self.region, bin_size)
            counts = count(self[0])
            for i in range(1, self.size):
                counts = counts + count(self[i])
        total = counts.sum(axis=0)
        with np.errstate(invalid="ignore", divide="ignore"):
            return np.where(total > 0, counts / np.where(total > 0, total, 1), np.nan)

    @property
    def sums(self) -> Tuple[np.ndarray, np.ndarray, int]:
        """(sum of heights, sum of squared heights, members): exact int64 arrays, mergeable in any order."""
        return self._sums.total.copy(), self._sums.squares.copy(), self._sums.members


def _open_store(store: Any, region: Any, size: int, root: np.random.SeedSequence, method: str,
                shape: Tuple[int, ...]) -> Any:
    try:
        import zarr
    except ImportError as exc:  # pragma: no cover - depends on the install
        raise ImportError("ensemble stores need zarr: pip install 'frostline[cluster]'") from exc
    identity = {"format": FORMAT, "frostline_version": __version__, "region": region.describe(), "size": size,
                "seed": seed_record(root).as_dict(), "method": method, "shape": list(shape)}
    group = zarr.open_group(store, mode="a")
    if "format" in group.attrs:
        found = {k: group.attrs.get(k) for k in identity}
        different = [k for k in identity if _plain(found[k]) != _plain(identity[k])]
        if different:
            raise ValueError(f"the store at {store} holds another ensemble (different: {', '.join(different)}); "
                             "use a new store, or the same region, seed, size, method and frostline version")
        return group
    # no identity record: a new store, or one whose first run died before writing it; start it afresh
    group.create_array("heights", shape=(size, *shape), chunks=(1, *shape), dtype="int32", fill_value=0,
                       compressors=_codecs(), overwrite=True)
    group.create_array("done", shape=(size,), chunks=(1,), dtype="uint8", fill_value=0, compressors=_codecs(),
                       overwrite=True)
    group.attrs.update(identity)
    return group


def _codecs() -> list:
    """Compression, then a crc32c checksum of every chunk (corruption is detected on read)."""
    from zarr.codecs import Crc32cCodec, ZstdCodec

    return [ZstdCodec(level=3), Crc32cCodec()]


def _plain(value: Any) -> Any:
    """JSON-comparable form (tuples as lists) of an attribute."""
    import json

    return json.loads(json.dumps(value))


def _done_members(group: Any, size: int) -> np.ndarray:
    """Which members the store marks done; a mark that fails its checksum counts as not done."""
    try:  # one read of every mark; if any chunk fails its checksum, read them one by one
        return np.asarray(group["done"][:], dtype=bool)
    except Exception:
        pass
    done = np.zeros(size, dtype=bool)
    for i in range(size):
        try:
            done[i] = bool(group["done"][i])
        except Exception:  # a corrupted chunk: recompute that member
            done[i] = False
    return done


def ensemble(region: Any, size: int, seed: SeedLike = None, *, store: Any = None, workers: Optional[int] = None,
             backend: str = "threads", client: Any = None, method: str = "auto",
             progress: Optional[Callable[[int, int, float], None]] = None,
             reducers: Optional[Mapping[str, Callable[[Sample], Any]]] = None) -> Ensemble:
    """``size`` exact samples of ``region``, member i from child i of the seed (see the module docstring).

    Parameters
    ----------
    store : path or zarr store, optional
        Where members are written (resumable); None keeps only the statistics.
    workers, backend : int, "threads" or "processes"
        Local execution (default: all cores, threads).
    client : dask.distributed.Client, optional
        Run members on a cluster instead (the region is rebuilt on the workers).
    progress : callable(done, size, seconds), optional
        Called as members finish.
    reducers : {name: callable(sample) -> integer array}, optional
        Computed from every member as it arrives (members read back from a
        store included) and summed exactly (int64), so the totals do not depend
        on the order of arrival; ``Ensemble.reduced`` holds them. Example:
        :func:`frostline.analysis.tile_counts` (tile classes counted on a grid).
    """
    size = _check_count(size, "size")
    if backend not in ("threads", "processes"):
        raise ValueError(f"backend must be 'threads' or 'processes', got {backend!r}")
    workers = os.cpu_count() or 1 if workers is None else _check_count(workers, "workers")
    if workers < 1:
        raise ValueError("workers must be at least 1")
    root = seed_record(normalise_seed(seed)).sequence()
    shape = tuple(np.asarray(region.extreme_heights()[0]).shape)
    from ._limits import check_memory

    check_memory(3 * 8 * int(np.prod(shape)) + 64 * size + 10**6,
                 f"an ensemble of {size} members (running sums, and the list of members still to draw)")
    group = _open_store(store, region, size, root, method, shape) if store is not None else None
    done = _done_members(group, size) if group is not None else np.zeros(size, dtype=bool)
    sums = _Sums(np.zeros(shape, dtype=np.int64), np.zeros(shape, dtype=np.int64))
    reductions = _Reductions(region, reducers)
    if group is not None:
        for i in np.flatnonzero(done):
            try:  # a chunk that fails its checksum is not data: that member is drawn again
                heights = np.asarray(group["heights"][int(i)])
                if "info" in group:
                    np.asarray(group["info"][int(i)])
            except Exception:
                done[i] = False
                continue
            sums.add(heights)
            reductions.add(heights)
    infos: Dict[int, Dict[str, Any]] = {}
    todo = [int(i) for i in np.flatnonzero(~done)]
    started = time.perf_counter()
    writer = _MemberWriter(group) if group is not None else None

    def commit(i: int, heights: np.ndarray, info: Dict[str, Any]) -> None:
        heights = np.asarray(heights)
        if heights.shape != shape:
            raise RuntimeError(f"member {i} came back with heights of shape {heights.shape}, not {shape}")
        if writer is not None:
            writer.add(i, heights, info)
        sums.add(heights)
        reductions.add(heights)
        infos[i] = info
        if progress is not None:
            progress(sums.members, size, time.perf_counter() - started)

    try:
        if client is not None:
            _run_on_cluster(client, region, root, method, todo, commit)
        elif backend == "processes" and workers > 1:
            _run_local(ProcessPoolExecutor(max_workers=workers), workers, region, root, method, todo, commit, True)
        else:
            _run_local(ThreadPoolExecutor(max_workers=workers), workers, region, root, method, todo, commit, False)
    finally:
        if writer is not None:  # members finished before a Ctrl-C or an error are kept
            writer.flush()
    if group is not None:
        _save_statistics(group, sums, reductions)
    return Ensemble(region, size, root, method, group, sums, infos, reductions)


def _save_statistics(group: Any, sums: _Sums, reductions: _Reductions) -> None:
    """The exact sums behind the statistics, saved beside the members (by the coordinating process).

    ``statistics/sum_heights`` and ``statistics/sum_squares`` (int64), one array
    per reducer, and the number of members they cover in the attribute
    ``members``. They are a convenience for other programs: frostline itself
    recomputes them from the committed members whenever a store is reopened,
    so a stale or damaged copy is never read as data.
    """
    stats = group.require_group("statistics")
    arrays = {"sum_heights": sums.total, "sum_squares": sums.squares}
    arrays.update({f"reduced_{name}": total for name, total in reductions.sums.items()})
    for name, data in arrays.items():
        target = stats.create_array(name, shape=data.shape, dtype="int64", fill_value=0, overwrite=True,
                                    compressors=_codecs())
        target[...] = data
    stats.attrs.update({"members": int(sums.members)})


class _MemberWriter:
    """Writes members into a store, in batches: each member whole (heights, then one row of seconds
    and report figures), then the commit marks of the batch.

    A kill before a member's mark leaves it to be recomputed; a batch is at
    most BATCH members or BATCH_SECONDS old, so a kill costs at most that much
    work. One zarr call writes a batch's chunks concurrently (one member per
    chunk still): per-member writes cost milliseconds each, serialised, which
    would cap the speed-up of fast members. The report figures are the
    method's integer counters, the same for every member of an ensemble;
    their names are recorded once. The arrays are opened once.
    """

    BATCH = 32
    BATCH_SECONDS = 1.0

    def __init__(self, group: Any) -> None:
        self.group = group
        self.heights, self.done = group["heights"], group["done"]
        self.info: Any = group["info"] if "info" in group else None
        self.fields: Optional[List[str]] = (list(group.attrs["report_fields"]) if "report_fields" in group.attrs
                                            else None)
        self.buffer: List[Tuple[int, np.ndarray, Dict[str, Any]]] = []
        self.since = time.perf_counter()

    def add(self, i: int, heights: np.ndarray, info: Dict[str, Any]) -> None:
        self.buffer.append((i, heights, info))
        if len(self.buffer) >= self.BATCH or time.perf_counter() - self.since > self.BATCH_SECONDS:
            self.flush()

    def flush(self) -> None:
        self.since = time.perf_counter()
        if not self.buffer:
            return
        batch, self.buffer = sorted(self.buffer, key=lambda item: item[0]), []
        reports = [{k: v for k, v in info.get("report", {}).items() if isinstance(v, (int, np.integer))}
                   for _, _, info in batch]
        if self.fields is None:
            first = batch[0][2]
            self.group.attrs.update({"report_fields": sorted(reports[0]), "method_family": first.get("method", ""),
                                     "kernel": first.get("kernel", "")})
            self.fields = sorted(reports[0])
        if self.info is None:
            self.info = self.group.create_array("info", shape=(self.done.shape[0], 1 + len(self.fields)),
                                                chunks=(1, 1 + len(self.fields)), dtype="float64", fill_value=0.0,
                                                compressors=_codecs())
        index = np.array([i for i, _, _ in batch])
        heights = np.stack([h.astype(np.int32) for _, h, _ in batch])
        # float64 holds the integer counters exactly below 2^53 (about 9e15 site updates)
        rows = np.array([[float(info.get("seconds", 0.0))] + [float(r.get(n, 0)) for n in self.fields]
                         for (_, _, info), r in zip(batch, reports)])
        # runs of consecutive members, each one slice: whole chunks, written without reading the old ones
        # (a corrupted chunk is overwritten, not read)
        starts = np.flatnonzero(np.diff(index, prepend=index[0] - 2) != 1)
        for a, b in zip(starts, list(starts[1:]) + [len(index)]):
            self.heights[index[a]: index[b - 1] + 1] = heights[a:b]
            self.info[index[a]: index[b - 1] + 1] = rows[a:b]
        for a, b in zip(starts, list(starts[1:]) + [len(index)]):
            self.done[index[a]: index[b - 1] + 1] = 1


def _run_local(pool: Any, workers: int, region: Any, root: np.random.SeedSequence, method: str, todo: List[int],
               commit: Callable[[int, np.ndarray, Dict[str, Any]], None], processes: bool) -> None:
    payload = _payload(region) if processes else None
    root_dict = seed_record(root).as_dict()

    def submit(i: int) -> Future:
        if processes:
            return pool.submit(_remote_member, payload, root_dict, i, method)
        return pool.submit(_local_member, region, root, i, method)

    pending: set = set()
    queue = list(reversed(todo))
    try:
        while queue or pending:
            while queue and len(pending) < 4 * workers:
                pending.add(submit(queue.pop()))
            finished, pending = wait(pending, timeout=0.2, return_when=FIRST_COMPLETED)
            for future in finished:
                commit(*future.result())
    except BaseException:
        for future in pending:
            future.cancel()
        raise
    finally:
        pool.shutdown(wait=True, cancel_futures=True)


def _local_member(region: Any, root: np.random.SeedSequence, i: int, method: str):
    sample = region.sample(child_sequence(root, i), method=method)
    return i, np.asarray(sample.heights), sample.info.as_dict()


def _run_on_cluster(client: Any, region: Any, root: np.random.SeedSequence, method: str, todo: List[int],
                    commit: Callable[[int, np.ndarray, Dict[str, Any]], None]) -> None:
    from distributed import as_completed

    payload = client.scatter(_payload(region), broadcast=True)
    root_dict = seed_record(root).as_dict()
    futures = client.map(_remote_member, [payload] * len(todo), [root_dict] * len(todo), todo,
                         [method] * len(todo), pure=False)
    try:
        for future in as_completed(futures):
            commit(*future.result())
    except BaseException:
        client.cancel(futures)
        raise


def store_summary(store: Any) -> Dict[str, Any]:
    """What an ensemble store holds: its region, seed, size, members done, and the mean height over them.

    Raises ValueError when ``store`` is not a frostline ensemble store.
    """
    try:
        import zarr

        group: Any = zarr.open_group(store, mode="r")
        attrs: Dict[str, Any] = dict(group.attrs)
    except Exception as exc:
        raise ValueError(f"{store} is not a frostline ensemble store ({type(exc).__name__}: {exc})") from None
    if attrs.get("format") != FORMAT:
        raise ValueError(f"{store} is not a frostline ensemble store (no '{FORMAT}' record)")
    size = int(attrs["size"])
    total = np.zeros(tuple(attrs["shape"]), dtype=np.int64)
    members = 0
    for i in np.flatnonzero(_done_members(group, size)):
        try:
            total += np.asarray(group["heights"][int(i)], dtype=np.int64)
            if "info" in group:
                np.asarray(group["info"][int(i)])
        except Exception:  # a chunk failing its checksum is not counted
            continue
        members += 1
    return {"region": attrs["region"], "size": size, "done": members, "seed": attrs["seed"],
            "method": attrs.get("method"), "frostline_version": attrs.get("frostline_version"),
            "mean_height": float(total.mean() / members) if members else float("nan")}


class _ProgressLine:
    """A one-line progress report on stderr (members done, rate, time left), at most twice a second."""

    def __init__(self) -> None:
        self._last = 0.0

    def __call__(self, done: int, size: int, seconds: float) -> None:
        now = time.perf_counter()
        if done < size and now - self._last < 0.5:
            return
        self._last = now
        rate = done / seconds if seconds > 0 else 0.0
        left = (size - done) / rate if rate > 0 else float("nan")
        sys.stderr.write(f"\r{done}/{size} members, {rate:.3g}/s, about {left:.0f} s left   ")
        if done == size:
            sys.stderr.write("\n")
        sys.stderr.flush()


def print_progress() -> Callable[[int, int, float], None]:
    """A progress hook for :func:`ensemble` that keeps one line on stderr up to date."""
    return _ProgressLine()
