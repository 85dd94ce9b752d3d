"""Memory estimates: refuse absurd requests before allocating anything."""
from __future__ import annotations

import os

from .errors import RegionTooLargeError

_DEFAULT_FRACTION = 0.5  # of physical memory


def memory_limit() -> int:
    """Bytes a single run may use: ``FROSTLINE_MEMORY_LIMIT`` or half of physical memory."""
    env = os.environ.get("FROSTLINE_MEMORY_LIMIT")
    if env:
        try:
            return int(float(env))
        except ValueError as exc:
            raise ValueError(f"FROSTLINE_MEMORY_LIMIT must be a number of bytes, got {env!r}") from exc
    try:
        total = os.sysconf("SC_PAGE_SIZE") * os.sysconf("SC_PHYS_PAGES")
    except (ValueError, OSError, AttributeError):
        total = 8 * 2**30
    return int(total * _DEFAULT_FRACTION)


def check_memory(estimate: int, what: str) -> None:
    """Raise RegionTooLargeError when ``estimate`` bytes exceed the limit."""
    limit = memory_limit()
    if estimate > limit:
        raise RegionTooLargeError(
            f"{what} needs about {estimate / 2**30:.3g} GiB of memory, above the limit of "
            f"{limit / 2**30:.3g} GiB; choose a smaller region or raise FROSTLINE_MEMORY_LIMIT (bytes)"
        )
