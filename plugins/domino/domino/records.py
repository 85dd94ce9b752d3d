"""Rebuilding domino regions from sample files (see frostline.io)."""
from __future__ import annotations

from .region import DominoRegion


def region_from_record(record: dict, arrays: dict):
    """Rebuild a region from the record and arrays of a sample file."""
    description = {k: v for k, v in record.items() if k not in ("lattice", "weighted")}
    offset = (description["order"] - 1) % 2 if description.get("shape") == "aztec diamond" else 0
    return DominoRegion(arrays["mask"], arrays.get("horizontal"), arrays.get("vertical"), class_offset=offset,
                        description=description, known_tileable=description.get("shape") in ("aztec diamond", "rectangle"))
