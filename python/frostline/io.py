"""Samples on disk: one ``.npz`` file per sample, read back by :func:`load`.

The file holds the arrays ``heights`` and ``tiles``, any arrays the region
needs to be rebuilt (for example ``region_triangles``), and ``metadata``: a
JSON record with the lattice, the region, its weights, the seed (entropy and
spawn key), the frostline version and the sampler's diagnostics. Files are
written to a temporary name and renamed, so an interrupted write never leaves
a truncated file under the final name.
"""
from __future__ import annotations

import json
import os
import tempfile
from pathlib import Path
from typing import Any, Dict, Union

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


def save(sample: Sample, path: PathLike) -> Path:
    """Write ``sample`` to ``path`` (a ``.npz`` file); returns the path written."""
    path = Path(path)
    if path.suffix != ".npz":
        raise ValueError(f"sample files end in .npz, got {path.name!r}")
    arrays = {"heights": np.asarray(sample.heights), "tiles": np.asarray(sample.tiles)}
    for name, value in sample.region.record_arrays().items():
        arrays[f"region_{name}"] = np.asarray(value)
    record = json.dumps(metadata(sample))
    folder = path.parent if str(path.parent) else Path(".")
    fd, tmp = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".tmp", dir=folder)
    try:
        with os.fdopen(fd, "wb") as handle:
            np.savez_compressed(handle, metadata=np.array(record), **arrays)  # type: ignore[arg-type]
        os.replace(tmp, path)
    except BaseException:
        if os.path.exists(tmp):
            os.unlink(tmp)
        raise
    return path


def load(path: PathLike) -> Sample:
    """Read a sample written by :func:`save`; the region is rebuilt by its plugin.

    Raises ValueError for a file that is not a frostline sample (or is of a
    newer format than this version reads).
    """
    with np.load(path, allow_pickle=False) as data:
        if "metadata" not in data:
            raise ValueError(f"{path} is not a frostline sample file (no metadata record)")
        record = json.loads(str(data["metadata"]))
        arrays = {k[len("region_"):]: data[k] for k in data.files if k.startswith("region_")}
        heights = data["heights"]
    if record.get("format") != FORMAT or record.get("format_version", 0) > FORMAT_VERSION:
        raise ValueError(f"{path} holds format {record.get('format')!r} version {record.get('format_version')}, "
                         f"which frostline {__version__} does not read")
    declared = spec(record["lattice"])
    if declared.region_from_record is None:
        raise ValueError(f"the lattice {declared.name!r} does not rebuild regions from files")
    region = declared.region_from_record(record["region"], arrays)
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
