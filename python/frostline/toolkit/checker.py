"""Checks that a height model's heat-bath rule suits monotone coupling from the past.

:func:`check_monotone` runs the engine's exhaustive local check (see
``cpp/include/frostline/monotonicity.hpp``): for each chosen site, every
assignment of its neighbourhood within ``window`` steps, every single-step
raise of one neighbour, and a set of random-bit words that includes each
threshold of a two-point rule (so those rules are checked exactly).
"""
from __future__ import annotations

from dataclasses import dataclass
from typing import Any, Optional, Union

import numpy as np

from .. import _core
from ..model import HeightModel, check_rule


@dataclass(frozen=True)
class MonotonicityReport:
    """Outcome of :func:`check_monotone`."""

    monotone: bool
    detail: str             # the first violation, in words ("" when monotone)
    sites_checked: int
    configurations: int     # neighbourhood assignments examined
    comparisons: int        # pairs of draws compared
    distinct_neighbourhoods: int = 0  # kinds of site actually enumerated (equal kinds are checked once)
    exhaustive: bool = True           # every site of the model was covered

    def __bool__(self) -> bool:
        return self.monotone


def _test_bits(rule: Optional[dict], count: int) -> np.ndarray:
    words = [np.random.default_rng(20261202).integers(0, 2**64, size=count, dtype=np.uint64),
             np.array([0, 2**64 - 1], dtype=np.uint64)]
    if rule is not None:
        table = rule.get("thresholds", rule.get("context_table"))
        t = np.unique(np.asarray(table, dtype=np.uint64))
        words += [t, t - np.uint64(1)]  # both sides of every threshold (wraps at 0 harmlessly)
    return np.unique(np.concatenate(words))


def check_monotone(target: Union[HeightModel, Any], *, q: float = 1.0, rule: Optional[dict] = None,
                   sites: Optional[Any] = None, window: int = 1, random_words: int = 256,
                   max_sites: int = 10**7, progress: Any = None) -> MonotonicityReport:
    """Check the heat-bath rule of a model (or of a region: its lowered model and rule).

    Parameters
    ----------
    target : HeightModel or Region
        A region supplies its own model, q and rule (``region.heat_bath_rule()``).
    q, rule : the rule for a bare HeightModel (see :meth:`HeightModel.sample`).
    sites : which sites to check; default all of them, or ``max_sites`` spread evenly
        beyond that (then ``exhaustive`` is False in the report).
    window : neighbour heights range over +-window steps (1..4).
    max_sites : at least 1.
    progress : callable, optional; polled with the GIL released (Ctrl-C stops the check).

    Sites whose neighbourhoods are alike (the same constraints, residues, rule
    data and context, up to renaming the nodes) get the identical check, so the
    engine enumerates each kind of site once: a regular lattice costs a few
    dozen checks whatever its size.
    """
    model = target
    if not isinstance(target, HeightModel):
        model, q, rule = target.heat_bath_rule()
    n = model.n_sites
    if isinstance(max_sites, bool) or not isinstance(max_sites, (int, np.integer)) or max_sites < 1:
        raise ValueError(f"max_sites must be an int >= 1 (a check of no site proves nothing), got {max_sites!r}")
    exhaustive = sites is None and n <= max_sites
    if sites is None:
        sites = np.arange(n) if n <= max_sites else np.unique(np.linspace(0, n - 1, max_sites).astype(np.int64))
    sites = np.asarray(sites, dtype=np.int32)
    if sites.size and (sites.min() < 0 or sites.max() >= n):
        raise ValueError(f"sites must lie in 0..{n - 1}")
    check_rule(rule, model.n_sites, model.n_nodes)
    out = _core.engine.check_monotone(model._compiled, float(q), rule, sites, int(window),
                                      _test_bits(rule, random_words), progress)
    return MonotonicityReport(bool(out["monotone"]), str(out["detail"]), int(sites.size), int(out["configurations"]),
                              int(out["comparisons"]), int(out["distinct"]), bool(exhaustive))


@dataclass(frozen=True)
class ModelReport:
    """Outcome of :func:`check_model`; ``problems`` says what failed and where."""

    configurations: int
    extremes_valid: bool
    extremes_extremal: bool
    moves_connect: bool
    monotone: MonotonicityReport
    problems: tuple

    @property
    def ok(self) -> bool:
        return not self.problems

    def __bool__(self) -> bool:
        return self.ok


def check_model(target: Any, *, cap: int = 200_000, q: float = 1.0, rule: Optional[dict] = None) -> ModelReport:
    """Check a small instance of a height model (a HeightModel, or a region's lowered model).

    1. The least and greatest states from Thurston's algorithm satisfy every
       constraint and residue, and bound every configuration (extremal).
    2. Single-site moves of one step connect every configuration: the moves'
       walk from the least state (``frostline.exact.enumerate_heights``) finds
       exactly the configurations found by an independent depth-first search.
    3. The heat-bath rule is monotone (:func:`check_monotone`).
    """
    from ..exact.enumeration import enumerate_heights

    model = target
    if not isinstance(target, HeightModel):
        model, q, rule = target.heat_bath_rule()
    problems = []
    least, greatest = model.extremes()
    n = model.n_sites
    c = model.constraints
    valid = True
    for name, state in (("least", least), ("greatest", greatest)):
        broken = np.flatnonzero(state[c[:, 1]] - state[c[:, 0]] > c[:, 2])
        if broken.size:
            valid = False
            u, v, b = c[broken[0]]
            problems.append(f"the {name} state breaks h[{v}] - h[{u}] <= {b}")
        off = np.flatnonzero((state[:n] - model.residues) % model.step != 0)
        if off.size:
            valid = False
            problems.append(f"the {name} state has site {off[0]} outside its residue class")
    everything = _core.engine.all_configurations(model._compiled, int(cap))
    extremal = bool(everything.size == 0 or (np.all(everything >= least[:n]) and np.all(everything <= greatest[:n])))
    if not extremal:
        problems.append("some configuration lies outside the least / greatest states")
    walked = enumerate_heights(model, cap)[:, :n]
    reached = {row.tobytes() for row in np.ascontiguousarray(walked, dtype=np.int32)}
    missing = [row for row in np.ascontiguousarray(everything, dtype=np.int32) if row.tobytes() not in reached]
    if missing:
        problems.append(f"single-site moves from the least state reach {len(reached)} of {len(everything)} "
                        f"configurations; first one missed: {missing[0].tolist()}")
    monotone = check_monotone(model, q=q, rule=rule)
    if not monotone.monotone:
        problems.append(f"the heat-bath rule is not monotone: {monotone.detail}")
    return ModelReport(len(everything), valid, extremal, not missing, monotone, tuple(problems))
