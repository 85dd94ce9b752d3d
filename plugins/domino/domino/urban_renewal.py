"""Partition function of the weighted Aztec diamond by urban renewal.

Urban renewal (Propp, "Generalized domino-shuffling", Theoret. Comput. Sci.
303, 2003): a face whose four edges carry the weights (w1, w2, w3, w4) in
cyclic order becomes a face carrying (w3, w4, w1, w2) / D with
D = w1 w3 + w2 w4, and Z(G) = D Z(G'). Doing this at the n^2 faces of the
order-n diamond that own all four of their edges leaves the diamond of order
n - 1, so Z is a product of n^3/3 such factors: O(n^3) work.

Conventions (docs/design.md section 3): cell (r, c) of the 2n x 2n mask, row 0 at
the top; the Aztec diamond of order n holds the cells whose centres
(c - n + 1/2, n - r - 1/2) satisfy abs(x) + abs(y) <= n, and every tiling has
n(n + 1) dominoes. ``horizontal[r, c]`` (shape (2n, 2n - 1)) weighs the domino
on cells (r, c), (r, c + 1); ``vertical[r, c]`` (shape (2n - 1, 2n)) the
domino on (r, c), (r + 1, c). Entries at positions outside the diamond are
ignored; those inside must be positive and finite. Z is the sum over tilings
of the product of their dominoes' weights.
"""
from __future__ import annotations

import math
import numbers
from fractions import Fraction
from typing import Optional, Tuple, Union

import numpy as np

__all__ = ["aztec_partition_function"]


def _order(n) -> int:
    if isinstance(n, bool) or not isinstance(n, numbers.Integral):
        raise TypeError(f"the order n must be an int, got {type(n).__name__}")
    n = int(n)
    if n < 0:
        raise ValueError(f"the order n of the Aztec diamond must be >= 0, got {n}")
    return n


def _table(values, name: str, shape: Tuple[int, int], n: int) -> Optional[np.ndarray]:
    if values is None:
        return None
    try:
        table = np.asarray(values, dtype=np.float64)
    except (TypeError, ValueError):
        raise TypeError(f"{name} must be an array of real numbers or None") from None
    if table.shape != shape:
        raise ValueError(f"{name} must have shape {shape} for order n = {n} (horizontal: (2n, 2n - 1), "
                         f"vertical: (2n - 1, 2n)), got {table.shape}")
    return table


def _face_weights(n: int, horizontal: Optional[np.ndarray], vertical: Optional[np.ndarray]):
    """The order-n face weights (top, right, bottom, left), each n x n, as float arrays.

    Face (u, v) is the mask corner (r, c) = (n - u + v, u + v + 1), the top-left
    corner of cell (r, c); its edges are the dominoes on the four cells around it.
    """
    u, v = np.meshgrid(np.arange(n), np.arange(n), indexing="ij")
    r, c = n - u + v, u + v + 1
    sides = [("horizontal", horizontal, r - 1, c - 1),  # top: cells (r-1, c-1), (r-1, c)
             ("vertical", vertical, r - 1, c),          # right: cells (r-1, c), (r, c)
             ("horizontal", horizontal, r, c - 1),      # bottom: cells (r, c-1), (r, c)
             ("vertical", vertical, r - 1, c - 1)]      # left: cells (r-1, c-1), (r, c-1)
    out = []
    for name, table, rows, cols in sides:
        if table is None:
            out.append(np.ones((n, n)))
            continue
        w = table[rows, cols]
        bad = ~(np.isfinite(w) & (w > 0))
        if bad.any():
            i = np.argwhere(bad)[0]
            raise ValueError(f"{name}[{rows[tuple(i)]}, {cols[tuple(i)]}] = {w[tuple(i)]!r} is not a usable "
                             "weight: every domino position inside the diamond needs a positive finite weight")
        out.append(w)
    return out


def aztec_partition_function(n: int, horizontal=None, vertical=None,
                             exact: bool = True) -> Union[Fraction, float]:
    """Weighted partition function Z of the domino tilings of the Aztec diamond.

    Parameters
    ----------
    n : int
        Order of the diamond (n >= 0); every tiling has n(n + 1) dominoes.
    horizontal : array_like, shape (2n, 2n - 1), optional
        ``horizontal[r, c]`` is the weight of the domino on cells (r, c) and
        (r, c + 1). None: weight 1.
    vertical : array_like, shape (2n - 1, 2n), optional
        ``vertical[r, c]`` is the weight of the domino on cells (r, c) and
        (r + 1, c). None: weight 1. Entries outside the diamond are ignored.
    exact : bool
        True: Z as a ``fractions.Fraction``, each float weight taken at its
        exact binary value (numerators grow quickly: meant for moderate n).
        False: the natural logarithm of Z as a float (double precision, with a
        rescaling at each order so large n neither overflows nor underflows).

    Returns
    -------
    Fraction or float
        Z (exact) or ln Z. Uniform weights give 2^(n(n+1)/2) (Elkies,
        Kuperberg, Larsen, Propp 1992; OEIS A006125).
    """
    n = _order(n)
    side = 2 * n
    horizontal = _table(horizontal, "horizontal", (side, max(side - 1, 0)), n)
    vertical = _table(vertical, "vertical", (max(side - 1, 0), side), n)
    if n == 0:
        return Fraction(1) if exact else 0.0
    faces = _face_weights(n, horizontal, vertical)
    if exact:
        return _exact(n, faces)
    return _logarithm(n, faces)


def _renew(k: int, top, right, bottom, left):
    """One order down: D per face and the four order-(k - 1) weight arrays.

    The order-(k-1) face (a, b) takes its top weight from face (a+1, b), its
    right from (a+1, b+1), bottom from (a, b+1) and left from (a, b) of order
    k (the edge in the same place, whose weight is the opposite edge's over D).
    """
    d = top * bottom + left * right
    return d, ((top / d)[1:, :k - 1], (right / d)[1:, 1:], (bottom / d)[:k - 1, 1:], (left / d)[:k - 1, :k - 1])


def _exact(n: int, faces) -> Fraction:
    weights = tuple(np.vectorize(Fraction, otypes=[object])(w) for w in faces)
    z = Fraction(1)
    for k in range(n, 0, -1):
        d, weights = _renew(k, *weights)
        z *= math.prod(d.ravel().tolist(), start=Fraction(1))
    return z


def _logarithm(n: int, faces) -> float:
    weights = tuple(np.asarray(w, dtype=np.float64) for w in faces)
    log_z = 0.0
    for k in range(n, 0, -1):
        # Z_k(w) = s^(k(k+1)) Z_k(w / s): rescaling by the largest weight
        # keeps every order in range without changing the answer.
        scale = max(float(w.max()) for w in weights)
        weights = tuple(w / scale for w in weights)
        log_z += k * (k + 1) * math.log(scale)
        d, weights = _renew(k, *weights)
        if not (d.min() > 0 and np.isfinite(d).all()):
            raise ValueError(f"urban renewal left the floating-point range at order {k}: the weights span "
                             "too many orders of magnitude for double precision")
        log_z += float(np.log(d).sum())
    return log_z
