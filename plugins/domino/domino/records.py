"""Rebuilding domino regions from sample files (see frostline.io).

A file is untrusted: a named shape is rebuilt from its defining numbers (an
Aztec diamond's order, a rectangle's sides) and the stored mask must be that
shape's mask; anything else is rebuilt as a plain mask and checked in full
(tileability by Thurston's algorithm, holes).
"""
from __future__ import annotations

import numbers

import numpy as np

from .geometry import aztec_mask
from .region import DominoRegion


def _named_mask(description: dict):
    """The mask the description's named shape defines, or None for a plain mask."""
    shape = description.get("shape")

    def whole(key: str) -> int:
        value = description.get(key)
        if isinstance(value, bool) or not isinstance(value, numbers.Integral) or not 1 <= int(value) <= 2**14:
            raise ValueError(f"the {shape} record's {key!r} must be an int in "
                             f"[1, 16384], got {value!r}")
        return int(value)

    if shape == "aztec diamond":
        return aztec_mask(whole("order"))
    if shape == "rectangle":
        return np.ones((whole("rows"), whole("columns")), dtype=bool)
    return None


def region_from_record(record: dict, arrays: dict):
    """Rebuild a region from the record and arrays of a sample file."""
    description = {k: v for k, v in record.items() if k not in ("lattice", "weighted")}
    mask = np.asarray(arrays["mask"])
    named = _named_mask(description)
    if named is not None and (mask.shape != named.shape or not np.array_equal(mask.astype(bool), named)):
        raise ValueError(f"its mask is not the {description['shape']} its record names")
    offset = (description["order"] - 1) % 2 if description.get("shape") == "aztec diamond" else 0
    return DominoRegion(mask, arrays.get("horizontal"), arrays.get("vertical"), class_offset=offset,
                        description=description, known_tileable=named is not None)
