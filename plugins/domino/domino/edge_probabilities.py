"""Placement probabilities of the (weighted) Aztec diamond by the urban-renewal recursion.

The derivation (docs/references.md section 3, "Aztec edge probabilities"): urban renewal
of a square face with edge weights a, b, c, d (in cyclic order) and
D = ac + bd gives Z(G) = D Z(G'), where G' holds an inner square whose edges
carry a/D, b/D, c/D, d/D (Propp, "Generalized domino-shuffling", Theoret.
Comput. Sci. 303, 2003). Since P(e) = w_e d(log Z)/d(w_e), differentiating gives, for the edge of
weight a,

    P_G(a) = P_G'(the inner edge carrying a/D) + (a c / D) (1 - S'),

S' the sum of the inner square's edge probabilities in G'; edges off the
renewed faces keep their probability. Renewing every face of order k gives
the diamond of order k - 1, whose faces' edges are the inner squares' edges:
the top edge of order k - 1 face (a, b) carries the top weight of order k
face (a + 1, b) over its D, the right edge that of (a + 1, b + 1), the bottom
that of (a, b + 1), the left that of (a, b) (the windows of
plugins/domino/shuffling.hpp's renewal). So the probabilities of order k
follow from those of order k - 1, starting from order 1 (one face,
P = ac / D). Every step is a convex-type update of numbers in [0, 1]: float64
loses about n * 1e-16, where the inverse Kasteleyn matrix loses everything past
order 50. O(n^3) operations; weights other than uniform or a constant vertical
bias need the ratio ac/D of every face of every order (8 n^3 / 3 bytes).
"""
from __future__ import annotations

from fractions import Fraction
from typing import Any, Optional, Tuple

import numpy as np

from frostline._limits import check_memory
from frostline.progress import report


def face_weights(n: int, horizontal: Optional[np.ndarray], vertical: Optional[np.ndarray], dtype: Any = float):
    """(top, right, bottom, left) weights of the order-n faces, (n, n) each (face (u, v) at corner
    r = n - u + v, c = u + v + 1 of the 2n x 2n mask; the layout of the shuffle)."""
    u, v = np.meshgrid(np.arange(n), np.arange(n), indexing="ij")
    r, c = n - u + v, u + v + 1

    def pick(weights, rows, cols):
        if weights is None:
            return np.ones((n, n), dtype=dtype)
        return np.asarray(weights, dtype=dtype)[rows, cols]

    return (pick(horizontal, r - 1, c - 1), pick(vertical, r - 1, c), pick(horizontal, r, c - 1),
            pick(vertical, r - 1, c - 1))


def horizontal_ratios(n: int, horizontal: Optional[np.ndarray], vertical: Optional[np.ndarray], dtype: Any = float):
    """[c_1, ..., c_n]: c_k (k, k) = w_T w_B / D of every order-k face, by urban renewal from order n down.

    Floats run on log weights (D by logaddexp, one common offset removed per
    order): renewal divides by D order after order, which in plain floats
    drives widely spread weights to 0/0 within tens of orders.
    """
    t, r, b, l = face_weights(n, horizontal, vertical, dtype)
    logs = dtype is float
    if logs:
        t, r, b, l = np.log(t), np.log(r), np.log(b), np.log(l)
    ratios = [None] * (n + 1)
    for k in range(n, 0, -1):
        report("Aztec diamond face weights, orders done", n - k, n)
        if logs:
            d = np.logaddexp(t + b, l + r)
            ratios[k] = np.exp(t + b - d)
        else:
            d = t * b + l * r
            ratios[k] = (t * b) / d
        if k == 1:
            break
        # order k - 1 face (a, b): top from face (a+1, b), right from (a+1, b+1), bottom from (a, b+1), left from
        # (a, b), each that side's weight over that face's D (the windows of shuffling.hpp's renewal)
        if logs:
            t, r, b, l = t[1:, :-1] - d[1:, :-1], r[1:, 1:] - d[1:, 1:], b[:-1, 1:] - d[:-1, 1:], l[:-1, :-1] - d[:-1, :-1]
            offset = max(float(np.max(t)), float(np.max(r)), float(np.max(b)), float(np.max(l)))
            t, r, b, l = t - offset, r - offset, b - offset, l - offset  # one common factor changes no probability
        else:
            t, r, b, l = t[1:, :-1] / d[1:, :-1], r[1:, 1:] / d[1:, 1:], b[:-1, 1:] / d[:-1, 1:], l[:-1, :-1] / d[:-1, :-1]
    return ratios


def edge_probabilities(n: int, ratio) -> Tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray]:
    """(top, right, bottom, left) probabilities of the order-n faces' edges; ``ratio(k)`` gives c_k."""
    if n < 1:
        raise ValueError(f"the order of the Aztec diamond must be at least 1, got {n}")
    c = ratio(1)
    top, right, bottom, left = c, 1 - c, c, 1 - c
    for k in range(2, n + 1):
        report("Aztec diamond edge probabilities, orders done", k - 1, n)
        zero = np.zeros((k, k), dtype=np.asarray(top).dtype)
        a_top, a_right, a_bottom, a_left = zero.copy(), zero.copy(), zero.copy(), zero.copy()
        a_top[1:, :-1] = top          # the top edge of order k - 1 face (u - 1, v)
        a_right[1:, 1:] = right       # the right edge of (u - 1, v - 1)
        a_bottom[:-1, 1:] = bottom    # the bottom edge of (u, v - 1)
        a_left[:-1, :-1] = left       # the left edge of (u, v)
        free = 1 - (a_top + a_right + a_bottom + a_left)
        c = ratio(k)
        top, bottom = a_top + c * free, a_bottom + c * free
        left, right = a_left + (1 - c) * free, a_right + (1 - c) * free
    return top, right, bottom, left


def aztec_placement_probabilities(n: int, horizontal: Optional[np.ndarray] = None,
                                  vertical: Optional[np.ndarray] = None, *, exact: bool = False,
                                  constant_ratio: Optional[Any] = None) -> Tuple[np.ndarray, np.ndarray]:
    """Every domino position of the order-n Aztec diamond (k, 2, 2), first cell top or left, and its probability.

    ``constant_ratio``: the ratio w_T w_B / D when it is the same for every face of
    every order (1/2 uniform, 1 / (1 + a^2) for vertical weight a); otherwise it is
    computed by urban renewal from the weights. ``exact``: Fractions throughout
    (weights read as exact binary fractions), for tests on small orders.
    """
    dtype = object if exact else float
    if constant_ratio is not None:
        value = Fraction(constant_ratio) if exact else float(constant_ratio)
        check_memory(200 * n * n + 10**6, f"the edge probabilities of the order-{n} Aztec diamond")
        probs = edge_probabilities(n, lambda k: np.full((k, k), value, dtype=dtype))
    else:
        check_memory(8 * n * (n + 1) * (2 * n + 1) // 6 * (8 if exact else 1) + 200 * n * n + 10**6,
                     f"the urban-renewal ratios of the order-{n} weighted Aztec diamond")

        def convert(w):
            if w is None or not exact:
                return w
            return np.vectorize(Fraction, otypes=[object])(np.asarray(w, dtype=float))

        ratios = horizontal_ratios(n, convert(horizontal), convert(vertical), dtype)
        probs = edge_probabilities(n, lambda k: ratios[k])
    u, v = np.meshgrid(np.arange(n), np.arange(n), indexing="ij")
    r, c = (n - u + v).ravel(), (u + v + 1).ravel()
    top, right, bottom, left = (np.asarray(p).ravel() for p in probs)
    first = np.concatenate([np.stack([r - 1, c - 1], 1), np.stack([r, c - 1], 1), np.stack([r - 1, c - 1], 1),
                            np.stack([r - 1, c], 1)])
    second = np.concatenate([np.stack([r - 1, c], 1), np.stack([r, c], 1), np.stack([r, c - 1], 1),
                             np.stack([r, c], 1)])
    tiles = np.stack([first, second], axis=1).astype(np.int64)
    p = np.concatenate([top, bottom, left, right])
    if not exact:  # rounding can leave a probability 1e-14 outside [0, 1]
        p = np.clip(p.astype(float), 0.0, 1.0)
    order = np.lexsort((tiles[:, 1, 1], tiles[:, 1, 0], tiles[:, 0, 1], tiles[:, 0, 0]))
    return tiles[order], p[order]
