"""The registry of lattices: built-in plugins and outside packages alike.

Outside packages advertise a lattice under the entry-point group
``frostline.lattices`` (name = lattice, value = importable module). Modules are
imported lazily, on first use. An outside plugin may not shadow a built-in
name, and one name registered twice with different targets is an error.
"""
from __future__ import annotations

import importlib
from importlib import metadata
from types import ModuleType
from typing import Dict, List

GROUP = "frostline.lattices"

#: the built-in plugins, compiled into frostline._core
BUILTIN: Dict[str, str] = {"domino": "frostline.domino", "lozenge": "frostline.lozenge",
                           "square_ice": "frostline.square_ice"}

_loaded: Dict[str, ModuleType] = {}


def _entry_points() -> Dict[str, str]:
    try:
        found = metadata.entry_points(group=GROUP)  # Python >= 3.10
    except TypeError:  # pragma: no cover - Python 3.9
        found = metadata.entry_points().get(GROUP, [])  # type: ignore[attr-defined]
    targets: Dict[str, str] = {}
    for ep in found:
        if ep.name in BUILTIN and ep.value != BUILTIN[ep.name]:
            raise ValueError(
                f"the lattice name {ep.name!r} is built in; the outside plugin at {ep.value!r} must choose another name"
            )
        if ep.name in targets and targets[ep.name] != ep.value:
            raise ValueError(
                f"the lattice {ep.name!r} is registered twice, at {targets[ep.name]!r} and {ep.value!r}; "
                "uninstall one of the packages"
            )
        targets[ep.name] = ep.value
    return targets


def _targets() -> Dict[str, str]:
    merged = dict(BUILTIN)
    merged.update(_entry_points())
    return merged


def lattices() -> List[str]:
    """Names of every registered lattice, sorted."""
    return sorted(_targets())


def lattice(name: str) -> ModuleType:
    """The module of the lattice ``name`` (imported on first use).

    Raises
    ------
    TypeError
        When ``name`` is not a str.
    ValueError
        When no lattice of that name is registered (the message lists those that are).
    """
    if not isinstance(name, str):
        raise TypeError(f"a lattice name is a str, got {type(name).__name__}")
    if name in _loaded:
        return _loaded[name]
    targets = BUILTIN if name in BUILTIN else _targets()
    if name not in targets:
        raise ValueError(f"no lattice named {name!r}; registered lattices: {', '.join(lattices())}")
    module = importlib.import_module(targets[name])
    _loaded[name] = module
    return module
