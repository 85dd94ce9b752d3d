"""Alternating sign matrices by brute force, and six-vertex weights, written independently of frostline.

An ASM has entries in {-1, 0, 1}; along every row and column the nonzero
entries alternate in sign, starting and ending with +1 (common practice;
Mills, Robbins, Rumsey 1983). Vertex types follow docs/references.md section 1: an
entry 0 is an "a" vertex when its row partial sum (from the left) equals its
column partial sum (from the top), otherwise "b"; entries +-1 are "c".
"""
from __future__ import annotations

import itertools
from typing import Iterator, Tuple

import numpy as np


def asms(n: int) -> Iterator[np.ndarray]:
    """Every alternating sign matrix of order n."""
    rows = [r for r in itertools.product((-1, 0, 1), repeat=n)
            if all(0 <= s <= 1 for s in np.cumsum(r)) and sum(r) == 1]

    def extend(prefix, column_sums) -> Iterator[np.ndarray]:
        if len(prefix) == n:
            if all(s == 1 for s in column_sums):
                yield np.array(prefix)
            return
        for r in rows:
            new = tuple(s + x for s, x in zip(column_sums, r))
            if all(0 <= s <= 1 for s in new):
                yield from extend(prefix + [r], new)

    yield from extend([], (0,) * n)


def vertex_counts(a: np.ndarray) -> Tuple[int, int, int]:
    """(#a, #b, #c) vertices of an ASM."""
    row_partial = np.cumsum(a, axis=1) - a
    col_partial = np.cumsum(a, axis=0) - a
    zero = a == 0
    n_a = int(np.sum(zero & (row_partial == col_partial)))
    n_b = int(np.sum(zero & (row_partial != col_partial)))
    return n_a, n_b, int(np.sum(~zero))
