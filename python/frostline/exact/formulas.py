"""The closed forms of every lattice, in one place.

Each closed form lives with its lattice and is declared in its
``LatticeSpec.closed_forms``; this module re-exports them by name (for the
built-in lattices: ``macmahon``, ``q_macmahon``, ``volume_polynomial`` for
lozenges, MacMahon 1916, OEIS A008793; ``aztec_count`` (Elkies, Kuperberg,
Larsen, Propp 1992; OEIS A006125) and ``rectangle_count`` (Kasteleyn 1961;
Temperley-Fisher 1961) for dominoes; ``asm_count`` (Zeilberger 1996; Kuperberg
1996; OEIS A005130) and ``izergin_korepin`` (Korepin 1982; Izergin 1987) for
square ice). An outside lattice's closed forms appear here too.
"""
from __future__ import annotations

import warnings
from typing import Any, Callable, Dict, List

from ..errors import FrostlineWarning

#: the built-in closed forms (an outside lattice cannot take these names)
__all__ = ["asm_count", "aztec_count", "izergin_korepin", "macmahon", "q_macmahon", "rectangle_count",  # noqa: F822
           "table", "volume_polynomial"]


def table() -> Dict[str, Callable[..., Any]]:
    """Every declared closed form, by name.

    A name declared by two lattices keeps the built-in one (or the first, by
    lattice name) and the other is skipped with a warning.
    """
    from ..registry import is_builtin, specs

    out: Dict[str, Callable[..., Any]] = {}
    owner: Dict[str, str] = {}
    for spec in sorted(specs(), key=lambda s: (not is_builtin(s.name), s.name)):
        for name, function in spec.closed_forms.items():
            if name in out and out[name] is not function:
                warnings.warn(f"the closed form {name!r} of lattice {spec.name!r} is already declared by "
                              f"{owner[name]!r}; skipped", FrostlineWarning, stacklevel=2)
                continue
            out[name], owner[name] = function, spec.name
    return out


def __getattr__(name: str) -> Any:
    if name.startswith("_"):
        raise AttributeError(name)
    forms = table()
    if name not in forms:
        raise AttributeError(f"no closed form named {name!r}; declared: {', '.join(sorted(forms))}")
    return forms[name]


def __dir__() -> List[str]:
    return sorted(set(globals()) | set(table()))
