"""The generic height model (docs/design.md section 1) as seen from Python.

Every plugin lowers its regions to a :class:`HeightModel`; the compiled engine
samples it by monotone coupling from the past and runs forward heat-bath
chains on it. It is the reference path against which fast kernels are tested.

Conventions
-----------
Nodes ``0 .. n_sites - 1`` are free sites; nodes ``n_sites ..`` are boundary
nodes with fixed heights. A constraint row ``(u, v, c)`` means
``h[v] - h[u] <= c``. Heights satisfy ``h[v] = residue[v] (mod step)``; the
weight ``q`` multiplies a configuration's weight by ``q`` for each step of
``step`` at any site (``q ** (h / step)`` summed over sites, up to a constant).
Sites of one colour class are never joined by a constraint.
"""
from __future__ import annotations

import re
from typing import Callable, Optional, Tuple

import numpy as np

from . import _core
from ._validate import integer

ProgressHook = Optional[Callable[[int, int, float], None]]

_NO_LIMIT = 2**40


def _int32(values, name: str) -> np.ndarray:
    """An int32 copy, refusing values that would wrap (rather than silently changing them)."""
    a = np.asarray(values)
    if a.size == 0:
        return np.zeros(a.shape, dtype=np.int32)
    if not np.issubdtype(a.dtype, np.integer):
        if np.issubdtype(a.dtype, np.floating) and np.all(a == np.round(a)):
            a = a.astype(np.int64)
        else:
            raise TypeError(f"{name} must hold integers, got dtype {a.dtype}")
    if a.min() < -(2**31) or a.max() >= 2**31:
        raise ValueError(f"{name} holds values outside the 32-bit range")
    return np.ascontiguousarray(a, dtype=np.int32)


def _index_array(value, name: str) -> np.ndarray:
    a = np.asarray(value)
    if a.ndim != 1 or (a.size and not np.issubdtype(a.dtype, np.integer)):
        raise TypeError(f"rule entry {name!r} must be a 1-D integer array, got dtype {a.dtype} and shape {a.shape}")
    return a.astype(np.int64)


def check_rule(rule: Optional[dict], n_sites: int, n_nodes: int) -> None:
    """Refuse a two-point rule dict whose arrays do not fit the model (before anything reaches C++).

    C++ checks the same again at the binding boundary; this gives the clearer message first.
    """
    if rule is None:
        return
    if not isinstance(rule, dict):
        raise TypeError(f"a rule is None or a dict, got {type(rule).__name__}")
    if "thresholds" in rule:
        t = np.asarray(rule["thresholds"])
        if t.shape != (n_sites,):
            raise ValueError(f"need one threshold per site: got shape {t.shape} for {n_sites} sites")
        return
    needed = ("context_start", "context_nodes", "context_offset", "context_table")
    missing = [k for k in needed if k not in rule]
    if missing:
        raise ValueError(f"a rule dict needs 'thresholds' or the four context arrays; missing {missing}")
    start = _index_array(rule["context_start"], "context_start")
    nodes = _index_array(rule["context_nodes"], "context_nodes")
    offset = _index_array(rule["context_offset"], "context_offset")
    table = np.asarray(rule["context_table"])
    if start.shape != (n_sites + 1,) or offset.shape != (n_sites,):
        raise ValueError(f"context_start needs n_sites + 1 = {n_sites + 1} entries and context_offset {n_sites}; "
                         f"got {start.size} and {offset.size}")
    counts = np.diff(start)
    if start[0] < 0 or start[-1] > nodes.size or np.any(counts < 0) or np.any(counts > 16):
        raise ValueError(f"context_start must rise from >= 0 to <= len(context_nodes) = {nodes.size}, by 0 to 16 "
                         "context nodes per site")
    if nodes.size and (nodes.min() < 0 or nodes.max() >= n_nodes):
        raise ValueError(f"context_nodes must be node ids 0..{n_nodes - 1}, got {nodes.min()}..{nodes.max()}")
    if n_sites and (offset.min() < 0 or np.any(offset + (1 << counts) > table.size)):
        raise ValueError(f"a site's context_offset runs past the end of context_table ({table.size} entries)")


class HeightModel:
    """A height model described by arrays; see the module docstring for conventions.

    Parameters
    ----------
    n_sites : int
        Number of free sites.
    boundary_values : array of int
        Fixed heights of the boundary nodes.
    constraints : (E, 3) array of int
        Rows ``(u, v, c)``: ``h[v] - h[u] <= c``.
    residues : array of int, length ``n_sites``
        Residue of each site's height modulo ``step``.
    step : int
        The height step of a local move (one cube of weight ``q``).
    colour_classes : array of int, length ``n_sites``
        Class of each site; classes are updated in increasing order.
    node_label : callable(int) -> str, optional
        A phrase naming a node in error messages, such as "lattice point (2, 3)";
        it replaces the engine's "site 7" / "boundary node 12".
    """

    def __init__(
        self,
        n_sites: int,
        boundary_values: np.ndarray,
        constraints: np.ndarray,
        residues: np.ndarray,
        step: int,
        colour_classes: np.ndarray,
        node_label: Optional[Callable[[int], str]] = None,
    ) -> None:
        self.n_sites = integer(n_sites, "n_sites", 0, 2**31 - 2)
        self.step = integer(step, "step", 1, 2**30)
        self.boundary_values = _int32(boundary_values, "boundary_values").ravel()
        raw = np.asarray(constraints)
        if raw.size and (raw.ndim != 2 or raw.shape[1] != 3):
            raise ValueError(f"constraints must be an integer array of shape (E, 3) with rows (from, to, bound), "
                             f"got shape {raw.shape}")
        self.constraints = _int32(raw, "constraints").reshape(-1, 3)
        self.residues = _int32(residues, "residues").ravel()
        self.colour_classes = _int32(colour_classes, "colour_classes").ravel()
        if self.colour_classes.size != self.n_sites:
            raise ValueError(f"need one colour class per site: got {self.colour_classes.size} for {self.n_sites} sites")
        if self.n_sites and self.colour_classes.min() < 0:
            raise ValueError(f"colour classes are non-negative labels (updated in increasing order), got "
                             f"{self.colour_classes.min()}")
        if self.n_sites < 0 or self.n_sites + self.boundary_values.size >= 2**31:
            raise ValueError(f"a model holds at most 2^31 - 1 nodes, got {self.n_sites} sites and "
                             f"{self.boundary_values.size} boundary nodes")
        self._compiled = _core.engine.HeightModel(
            self.n_sites, self.boundary_values, self.constraints, self.residues, self.step, self.colour_classes
        )
        self._extremes: Optional[Tuple[np.ndarray, np.ndarray]] = None
        self._node_label = node_label

    @property
    def n_nodes(self) -> int:
        """Sites plus boundary nodes."""
        return int(self._compiled.n_nodes)

    def extremes(self) -> Tuple[np.ndarray, np.ndarray]:
        """Least and greatest height functions over all nodes (Thurston's algorithm).

        Raises ValueError, naming the place, when no configuration exists.
        """
        if self._extremes is None:
            try:
                self._extremes = _core.engine.extremes(self._compiled)
            except ValueError as exc:
                raise ValueError(self._relabel(str(exc))) from None
        return self._extremes

    def set_extremes(self, least: np.ndarray, greatest: np.ndarray) -> None:
        """Give the least and greatest configurations when a plugin knows them in closed form.

        Thurston's algorithm is then skipped. Both arrays (over all nodes) are
        checked to be configurations: the boundary kept, every constraint and
        residue met, least <= greatest; extremality is the plugin's claim, and
        its tests compare it with :meth:`extremes` computed the general way.
        """
        pair = []
        for name, heights in (("least", least), ("greatest", greatest)):
            h = np.asarray(heights, dtype=np.int64)
            if h.shape != (self.n_nodes,):
                raise ValueError(f"the {name} configuration needs one height per node ({self.n_nodes})")
            if not np.array_equal(h[self.n_sites:], self.boundary_values):
                raise ValueError(f"the {name} configuration does not keep the boundary")
            u, v, c = self.constraints[:, 0], self.constraints[:, 1], self.constraints[:, 2]
            if np.any(h[v] - h[u] > c) or np.any((h[: self.n_sites] - self.residues) % self.step):
                raise ValueError(f"the {name} configuration breaks a constraint or a residue")
            pair.append(h.astype(np.int32))
        if np.any(pair[0] > pair[1]):
            raise ValueError("the least configuration lies above the greatest somewhere")
        self._extremes = (pair[0], pair[1])

    def _relabel(self, message: str) -> str:
        """Replace engine node numbers in a message by the plugin's names for them."""
        if self._node_label is None:
            return message
        label = self._node_label
        return re.sub(r"\b(?:boundary )?(?:node|site) (\d+)", lambda m: label(int(m.group(1))), message)

    def _height_range(self) -> Tuple[int, int]:
        least, greatest = self.extremes()
        if least.size == 0:
            return 0, 0
        return int(least.min()), int(greatest.max())

    def sample(
        self,
        q: float,
        key: Tuple[int, int],
        *,
        check_order: bool = False,
        max_start_time: int = _NO_LIMIT,
        progress: ProgressHook = None,
        rule: Optional[dict] = None,
    ) -> Tuple[np.ndarray, dict]:
        """One exact sample (heights over all nodes) and the engine's report.

        ``rule`` selects a two-point heat bath instead of the q rule (q must be 1):
        ``{"thresholds": uint64 per site}`` takes the higher of two allowed
        heights with probability threshold / 2^64 (edge-weighted dimers);
        ``{"context_start", "context_nodes", "context_offset", "context_table"}``
        reads the probability from a table indexed by which context nodes lie
        above the middle of the two values (six-vertex weights).
        """
        check_rule(rule, self.n_sites, self.n_nodes)
        least, greatest = self.extremes()
        return _core.engine.sample(
            self._compiled, least, greatest, float(q), key[0], key[1], check_order, max_start_time, progress, rule
        )

    def chain(self, q: float, key: Tuple[int, int], start: np.ndarray, time: int = 0, rule: Optional[dict] = None):
        """A compiled forward chain from ``start`` (heights over all nodes)."""
        check_rule(rule, self.n_sites, self.n_nodes)
        low, high = self._height_range()
        return _core.engine.generic_chain(
            self._compiled, np.ascontiguousarray(start, dtype=np.int32), low, high, float(q), key[0], key[1], time, rule
        )
