"""The registry of lattices: built-in plugins and outside packages alike.

Every lattice, the built-in ones included, is advertised under the entry-point
group ``frostline.lattices`` (name = lattice, value = importable module that
defines ``LATTICE``, a :class:`~frostline.lattice_spec.LatticeSpec`). Modules
are imported lazily, on first use.

A bad plugin breaks only itself: an outside entry point that takes a built-in
name is skipped with a warning (the built-in wins); one name registered by two
outside distributions loads neither, and the warning names both.
"""
from __future__ import annotations

import importlib
import warnings
from importlib import metadata
from types import ModuleType
from typing import Dict, List, Tuple

from .errors import FrostlineWarning
from .lattice_spec import LatticeSpec

GROUP = "frostline.lattices"
BUILTIN_DISTRIBUTION = "frostline"

_loaded: Dict[str, ModuleType] = {}
_targets_cache: Dict[str, str] = {}
_builtin_cache: set = set()


def _distribution(ep: metadata.EntryPoint) -> str:
    dist = getattr(ep, "dist", None)
    return dist.metadata["Name"] if dist is not None else "?"


def _scan() -> Dict[str, str]:
    try:
        found = list(metadata.entry_points(group=GROUP))  # Python >= 3.10
    except TypeError:  # pragma: no cover - Python 3.9
        found = list(metadata.entry_points().get(GROUP, []))  # type: ignore[attr-defined]
    builtin: Dict[str, str] = {}
    outside: Dict[str, List[Tuple[str, str]]] = {}
    for ep in found:
        dist = _distribution(ep)
        if dist.lower() == BUILTIN_DISTRIBUTION:
            builtin[ep.name] = ep.value
        else:
            outside.setdefault(ep.name, [])
            if (dist, ep.value) not in outside[ep.name]:
                outside[ep.name].append((dist, ep.value))
    targets = dict(builtin)
    _builtin_cache.clear()
    _builtin_cache.update(builtin)
    for name, claims in outside.items():
        if name in builtin:
            warnings.warn(f"the lattice name {name!r} is built in; the plugin from "
                          f"{', '.join(d for d, _ in claims)} ({claims[0][1]}) is skipped: it must choose another "
                          "name", FrostlineWarning, stacklevel=3)
        elif len({value for _, value in claims}) > 1:
            warnings.warn(f"the lattice {name!r} is registered by {' and '.join(d for d, _ in claims)} "
                          f"({', '.join(v for _, v in claims)}); neither is loaded: uninstall one",
                          FrostlineWarning, stacklevel=3)
        else:
            targets[name] = claims[0][1]
    return targets


def _targets() -> Dict[str, str]:
    if not _targets_cache:
        _targets_cache.update(_scan())
    return _targets_cache


def is_builtin(name: str) -> bool:
    """True for a lattice registered by frostline itself."""
    _targets()
    return name in _builtin_cache


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
        When no lattice of that name is registered (the message lists those
        that are), or its module does not declare a ``LATTICE`` spec.
    """
    if not isinstance(name, str):
        raise TypeError(f"a lattice name is a str, got {type(name).__name__}")
    if name in _loaded:
        return _loaded[name]
    targets = _targets()
    if name not in targets:
        raise ValueError(f"no lattice named {name!r}; registered lattices: {', '.join(lattices())}")
    module = importlib.import_module(targets[name])
    declared = getattr(module, "LATTICE", None)
    if not isinstance(declared, LatticeSpec) or declared.name != name:
        raise ValueError(f"the module {targets[name]!r} registered as lattice {name!r} must define "
                         f"LATTICE = frostline.LatticeSpec(name={name!r}, ...)")
    _loaded[name] = module
    return module


def spec(name: str) -> LatticeSpec:
    """The declaration (:class:`LatticeSpec`) of the lattice ``name``."""
    return lattice(name).LATTICE


def specs() -> List[LatticeSpec]:
    """The declarations of every lattice that loads, sorted by name.

    A lattice whose module fails to import is skipped with a warning, so one
    broken plugin does not take the others down.
    """
    out = []
    for name in lattices():
        try:
            out.append(spec(name))
        except Exception as exc:  # noqa: BLE001 - any failure of an outside module
            warnings.warn(f"the lattice {name!r} could not be loaded ({type(exc).__name__}: {exc}); skipped",
                          FrostlineWarning, stacklevel=2)
    return out
