"""Rebuilding square-ice regions from sample files (see frostline.io)."""
from __future__ import annotations

from .region import SquareIceRegion


def region_from_record(record: dict, arrays: dict):
    """Rebuild a region from the record and arrays of a sample file."""
    description = {k: v for k, v in record.items() if k not in ("lattice", "n", "a", "b", "c")}
    return SquareIceRegion(arrays["boundary"], record["a"], record["b"], record["c"], description=description)
