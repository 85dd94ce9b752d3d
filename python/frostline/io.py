"""Samples on disk: one ``.npz`` file per sample, read back by :func:`load`.

The file holds the arrays ``heights`` and ``tiles``, any arrays the region
needs to be rebuilt (for example ``region_triangles``), and ``metadata``: a
JSON record with the lattice, the region, its weights, the seed (entropy and
spawn key), the frostline version and the sampler's diagnostics. Files are
written to a temporary name and renamed, so an interrupted write never leaves
a truncated file under the final name; an existing file is kept unless
``overwrite=True``.

Files are untrusted input. :func:`load` reads the zip directory and each
array's header before any data, refuses arrays whose declared sizes disagree
with their headers or exceed the memory limit (decompression bombs), never
unpickles, rebuilds the region from its defining data, reads ``heights`` only
when its header has the region's shape, and checks them; the stored ``tiles``
are not read (they are recomputed). Any broken file gives one ValueError.
"""
from __future__ import annotations

import json
import math
import os
import tempfile
import zipfile
from pathlib import Path
from typing import Any, Dict, Tuple, Union

import numpy as np

from ._version import __version__
from .region import Sample, SampleInfo
from .registry import spec

FORMAT = "frostline-sample"
FORMAT_VERSION = 2  # 2: diagnostics hold the method's own figures under "report"; 1 is still read

PathLike = Union[str, "os.PathLike[str]"]


def metadata(sample: Sample) -> Dict[str, Any]:
    """The JSON record stored beside a sample's arrays."""
    region = sample.region.describe()
    return {
        "format": FORMAT,
        "format_version": FORMAT_VERSION,
        "lattice": sample.region.lattice,
        "region": region,
        "weights": {k: v for k, v in region.items() if k in _weight_keys(sample.region.lattice)},
        "seed": sample.info.as_dict()["seed"],
        "frostline_version": __version__,
        "diagnostics": {k: v for k, v in sample.info.as_dict().items() if k != "seed"},
    }


def save(sample: Sample, path: PathLike, *, overwrite: bool = False) -> Path:
    """Write ``sample`` to ``path`` (a ``.npz`` file); returns the path written.

    An existing file is kept (FileExistsError) unless ``overwrite=True``. A
    symbolic link is followed: its target is written and the link stays. The
    file gets the permissions the umask allows, like any new file.
    """
    path = Path(path)
    if path.suffix != ".npz":
        raise ValueError(f"sample files end in .npz, got {path.name!r}")
    if not isinstance(overwrite, bool):
        raise TypeError("overwrite must be True or False")
    target = Path(os.path.realpath(path)) if path.is_symlink() else path
    if target.exists() and not overwrite:
        raise FileExistsError(f"{path} exists; pass overwrite=True (command line: --force) to replace it")
    arrays = {"heights": np.asarray(sample.heights), "tiles": np.asarray(sample.tiles)}
    for name, value in sample.region.record_arrays().items():
        arrays[f"region_{name}"] = np.asarray(value)
    record = json.dumps(metadata(sample))
    folder = target.parent if str(target.parent) else Path(".")
    fd, tmp = tempfile.mkstemp(prefix=f".{target.name}.", suffix=".tmp", dir=folder)
    try:
        with os.fdopen(fd, "wb") as handle:
            np.savez_compressed(handle, metadata=np.array(record), **arrays)  # type: ignore[arg-type]
        os.chmod(tmp, 0o666 & ~_umask())
        if overwrite:
            os.replace(tmp, target)
        else:
            _place_new(tmp, target, path)
    except BaseException:
        if os.path.exists(tmp):
            os.unlink(tmp)
        raise
    return path


def _umask() -> int:
    """The process's umask: read from /proc where Linux offers it (no change, no race with other
    threads), else by setting it and putting it straight back."""
    try:
        with open("/proc/self/status") as status:
            for line in status:
                if line.startswith("Umask:"):
                    return int(line.split()[1], 8)
    except OSError:
        pass
    mask = os.umask(0o022)
    os.umask(mask)
    return mask


def _place_new(tmp: str, target: Path, shown: Path) -> None:
    """Move ``tmp`` to ``target`` only if nothing is there (a hard link is atomic about it)."""
    try:
        os.link(tmp, target)
    except FileExistsError:
        raise FileExistsError(f"{shown} exists; pass overwrite=True (command line: --force) to replace it") from None
    except OSError:  # a file system without hard links: check, then rename
        if target.exists():
            raise FileExistsError(f"{shown} exists; pass overwrite=True (command line: --force) "
                                  "to replace it") from None
        os.replace(tmp, target)
        return
    os.unlink(tmp)


_METADATA_BYTES = 16 * 2**20  # a JSON record is a few kilobytes


class _Archive:
    """The arrays of an ``.npz`` file, read one at a time after their headers are checked."""

    def __init__(self, path: PathLike) -> None:
        self.path = path
        self.zip = zipfile.ZipFile(path)
        self.members: Dict[str, zipfile.ZipInfo] = {}
        for info in self.zip.infolist():
            if not info.filename.endswith(".npy") or info.filename[:-4] in self.members:
                raise ValueError(f"unexpected member {info.filename!r}")
            self.members[info.filename[:-4]] = info

    def __enter__(self) -> _Archive:
        return self

    def __exit__(self, *_: Any) -> None:
        self.zip.close()

    def header(self, name: str) -> Tuple[Tuple[int, ...], np.dtype]:
        """(shape, dtype) of a member, after checking its declared size against its header."""
        info = self.members[name]
        with self.zip.open(info) as f:
            version = np.lib.format.read_magic(f)
            if version == (1, 0):
                shape, _fortran, dtype = np.lib.format.read_array_header_1_0(f)
            elif version == (2, 0):
                shape, _fortran, dtype = np.lib.format.read_array_header_2_0(f)
            else:
                raise ValueError(f"array {name!r} has an unknown header version {version}")
            start = f.tell()
        if dtype.hasobject:
            raise ValueError(f"array {name!r} holds Python objects")
        expected = start + math.prod(shape) * dtype.itemsize
        if info.file_size != expected:
            raise ValueError(f"array {name!r} declares {info.file_size} bytes but its header describes {expected}")
        return tuple(shape), dtype

    def read(self, name: str, limit: int) -> np.ndarray:
        """The member's array, refused when it would take more than ``limit`` bytes."""
        self.header(name)
        if self.members[name].file_size > limit:
            raise ValueError(f"array {name!r} would take {self.members[name].file_size} bytes, more than the "
                             f"{limit} allowed (FROSTLINE_MEMORY_LIMIT)")
        with self.zip.open(self.members[name]) as f:
            return np.lib.format.read_array(f, allow_pickle=False)


def load(path: PathLike) -> Sample:
    """Read a sample written by :func:`save`; the region is rebuilt by its plugin.

    Raises ValueError for any file that is not a valid frostline sample
    (broken, truncated, crafted, or of a newer format than this version
    reads); FileNotFoundError when there is no file.
    """
    if not os.path.exists(path):
        raise FileNotFoundError(f"no sample file at {path}")
    try:
        return _load(path)
    except ValueError as exc:
        text = str(exc)
        if text.startswith(str(path)):  # already names the file and says what is wrong
            raise
        raise ValueError(f"{path} is not a valid frostline sample file ({text})") from None
    except (MemoryError, KeyboardInterrupt):
        raise
    except Exception as exc:  # zip, header, JSON and record errors of a broken file: one clear error
        raise ValueError(f"{path} is not a valid frostline sample file ({type(exc).__name__}: {exc})") from None


def _load(path: PathLike) -> Sample:
    from ._limits import memory_limit

    limit = memory_limit()
    with _Archive(path) as archive:
        if "metadata" not in archive.members or "heights" not in archive.members:
            raise ValueError("no metadata record or no heights")
        record = json.loads(str(archive.read("metadata", _METADATA_BYTES)))
        if not isinstance(record, dict):
            raise ValueError("the metadata record is not a JSON object")
        if record.get("format") != FORMAT or not isinstance(record.get("format_version", 0), int) \
                or record.get("format_version", 0) > FORMAT_VERSION:
            raise ValueError(f"{path} holds format {record.get('format')!r} version {record.get('format_version')}, "
                             f"which frostline {__version__} does not read")
        names = [k for k in archive.members if k.startswith("region_")]
        if sum(archive.members[k].file_size for k in names) > limit:
            raise ValueError("its region arrays declare more bytes than the memory limit (FROSTLINE_MEMORY_LIMIT)")
        arrays = {k[len("region_"):]: archive.read(k, limit) for k in names}
        declared = spec(record["lattice"])
        if declared.region_from_record is None:
            raise ValueError(f"the lattice {declared.name!r} does not rebuild regions from files")
        region = declared.region_from_record(record["region"], arrays)
        expected = region.extreme_heights()[0].shape
        shape, dtype = archive.header("heights")
        if shape != tuple(expected) or dtype.kind not in "iu":
            raise ValueError(f"its heights are {dtype} of shape {shape}; the region it describes has integer "
                             f"heights of shape {tuple(expected)}")
        heights = archive.read("heights", limit)
    try:  # the file's heights are untrusted: they must be a configuration of the rebuilt region
        heights = region.check_heights(heights)
    except (ValueError, TypeError) as exc:
        raise ValueError(f"{path} is not a valid frostline sample file: its heights are not a configuration of "
                         f"the region it describes ({exc})") from None
    info = SampleInfo.from_dict({**_diagnostics(record["diagnostics"]), "seed": record["seed"],
                                 "version": record["frostline_version"]})
    return Sample(region=region, heights=heights, info=info)


def _weight_keys(name: str) -> tuple:
    """The lattice's declared weight keys; none for regions of no registered lattice (run-time models)."""
    from .registry import lattices

    return spec(name).weight_keys if name in lattices() else ()


def _diagnostics(d: Dict[str, Any]) -> Dict[str, Any]:
    """Diagnostics in the current layout; files of format 1 kept the CFTP figures at the top level."""
    if "report" in d:
        return dict(d)
    top = {"method", "kernel", "seconds", "version"}
    report = {k: v for k, v in d.items() if k not in top}
    if d.get("method") == "shuffling":  # format 1 wrote zeroed coupling fields for shuffling runs
        report = {"orders": report.get("epochs", 0)}
    return {**{k: d[k] for k in top if k in d}, "report": report}
