"""Rebuilding lozenge regions from sample files (see frostline.io)."""
from __future__ import annotations

from .general import LozengeRegion
from .hexagon import hexagon


def region_from_record(record: dict, arrays: dict):
    """Rebuild a region from the record and arrays of a sample file."""
    q = record.get("q", 1.0)
    if record.get("shape") == "box":
        a, b, c = record["sides"]
        return hexagon(a, b, c, q=q)
    if "triangles" not in arrays:
        raise ValueError("the sample file lacks the region's triangles")
    description = {k: v for k, v in record.items() if k not in ("lattice", "q")}
    return LozengeRegion(arrays["triangles"], q, description=description)
