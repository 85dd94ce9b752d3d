"""Placement probabilities |K(b, w) K^{-1}(w, b)| with a rigorous error bound.

Kasteleyn matrices of irregular regions are badly conditioned (a notched Aztec
diamond of order 30 has condition number 1e16), so a floating-point inverse can
be wrong with no outward sign. Two routes, cheapest first, each with a bound
that holds for the matrix as stored (docs/exactness.md, "Certified placement
probabilities"):

1. float64. X = inv(K) (any approximation will do). The residual
   R = I - K X is computed with error-free transformations (Knuth's TwoSum,
   Dekker's TwoProduct; Ogita, Rump and Oishi, "Accurate sum and dot
   product", SIAM J. Sci. Comput. 26, 2005), so it is known to a few units in
   its last place even when X is poor; K has only a few entries per row.
   Then K^{-1} = X (I - R)^{-1} = X + X R + X R^2 (I - R)^{-1}, so with
   rho = ||R||_inf < 1 each wanted entry is X(w, b) + (X R)(w, b), with error
   at most (row sum of |X| at w) rho^2 / (1 - rho) plus the rounding of the
   correction, bounded by Higham's gamma_n (Higham, "Accuracy and Stability
   of Numerical Algorithms", 2002, section 3.1 and lemma 3.5).
2. Ball arithmetic (python-flint's ``acb_mat``): a rigorous enclosure of every
   entry of K^{-1}, the working precision doubled until the enclosures are
   tight enough. It costs about 3e-8 n^3 s at 128 bits; above a few hundred
   rows it runs in a child process, so Ctrl-C stops it at once.
"""
from __future__ import annotations

import math
import os
import subprocess
import sys
import tempfile
import time
from typing import Optional, Tuple

import numpy as np

from .._limits import check_memory
from ..progress import report
from . import _ball_worker
from ._ball_worker import ball_entries
from .budget import check_seconds

_U = 2.0**-53
_TINY = 2.0**-1022           # an absolute slack per operation for underflow (gradual or not)
_SPLITTER = 134217729.0      # 2^27 + 1, Dekker's split of a double into two 26-bit halves
_ROW_BLOCK = 256             # residual rows per block (memory: a few blocks of n doubles)
#: children for ball inverses from this many rows (spawning costs about half a second)
_CHILD_ROWS = 300
_START_BITS = 128
_BITS_STEP = 32


def _gamma(k: int) -> float:
    """Higham's gamma_k = k u / (1 - k u): the relative error bound of k roundings."""
    return k * _U / (1.0 - k * _U)


def _two_sum(a: np.ndarray, b: np.ndarray) -> Tuple[np.ndarray, np.ndarray]:
    s = a + b
    bb = s - a
    return s, (a - (s - bb)) + (b - bb)


def _split(a: np.ndarray) -> Tuple[np.ndarray, np.ndarray]:
    c = _SPLITTER * a
    hi = c - (c - a)
    return hi, a - hi


def _two_product(a: np.ndarray, b: np.ndarray) -> Tuple[np.ndarray, np.ndarray]:
    p = a * b
    ah, al = _split(a)
    bh, bl = _split(b)
    return p, ((ah * bh - p) + ah * bl + al * bh) + al * bl


def _neighbours(k: np.ndarray, rows: np.ndarray, cols: np.ndarray) -> Tuple[np.ndarray, np.ndarray]:
    """Columns and values of each row's nonzero entries, padded to the largest degree with weight 0."""
    n = k.shape[0]
    order = np.argsort(rows, kind="stable")
    r, c = rows[order], cols[order]
    degree = np.bincount(r, minlength=n)
    width = int(degree.max()) if n else 0
    slot = np.arange(len(r)) - np.repeat(np.cumsum(degree) - degree, degree)
    where = np.zeros((n, width), dtype=np.int64)
    value = np.zeros((n, width), dtype=complex)
    where[r, slot] = c
    value[r, slot] = k[r, c]
    return where, value


def residual(k: np.ndarray, x: np.ndarray, rows: np.ndarray, cols: np.ndarray) -> Tuple[np.ndarray, np.ndarray]:
    """R = I - K X rounded to complex doubles, and a bound on |R - R_rounded| (entrywise, real).

    K's nonzero entries are at (rows, cols). Each product is split exactly
    (TwoProduct) and each partial sum (TwoSum); only the small tails are summed
    with rounding, and their error is bounded by gamma times their absolute sum.
    """
    n = k.shape[0]
    where, value = _neighbours(k, rows, cols)
    terms = 4 * where.shape[1]                      # real products per real or imaginary part
    out = np.empty((n, n), dtype=complex)
    bound = np.empty((n, n))
    for start in range(0, n, _ROW_BLOCK):
        block = slice(start, min(n, start + _ROW_BLOCK))
        m = block.stop - block.start
        s_re, s_im = np.zeros((m, n)), np.zeros((m, n))
        s_re[np.arange(m), np.arange(block.start, block.stop)] = 1.0
        tail_re, tail_im = np.zeros((m, n)), np.zeros((m, n))
        abs_re, abs_im = np.zeros((m, n)), np.zeros((m, n))
        for t in range(where.shape[1]):
            kv = value[block, t][:, None]
            xs = x[where[block, t]]
            xr, xi = xs.real, xs.imag
            kr, ki = np.broadcast_to(kv.real, xr.shape), np.broadcast_to(kv.imag, xr.shape)
            # real part: - kr xr + ki xi; imaginary part: - kr xi - ki xr
            for (a, b, sign, part) in ((kr, xr, -1.0, 0), (ki, xi, 1.0, 0), (kr, xi, -1.0, 1), (ki, xr, -1.0, 1)):
                p, e = _two_product(a, b)
                if part == 0:
                    s_re, err = _two_sum(s_re, sign * p)
                    tail_re += err + sign * e
                    abs_re += np.abs(err) + np.abs(e)
                else:
                    s_im, err = _two_sum(s_im, sign * p)
                    tail_im += err + sign * e
                    abs_im += np.abs(err) + np.abs(e)
        re, im = s_re + tail_re, s_im + tail_im
        out[block] = re + 1j * im
        slack = 2.0 * _gamma(2 * terms + 2)
        bound[block] = (_U * (np.abs(re) + np.abs(im)) + slack * (abs_re + abs_im) + 4 * terms * _TINY)
    return out, bound


def float_entries(k: np.ndarray, x: np.ndarray, rows: np.ndarray, cols: np.ndarray
                  ) -> Optional[Tuple[np.ndarray, np.ndarray]]:
    """K^{-1}(cols[e], rows[e]) for every edge e and a rigorous bound on each error, from an approximate
    inverse ``x`` (route 1 of the module docstring); None when ||I - K X|| is not below 1/2."""
    n = k.shape[0]
    if not np.all(np.isfinite(x)) or np.abs(x).max(initial=0.0) > 1e290:
        return None
    r, r_bound = residual(k, x, rows, cols)
    r_abs = np.abs(r.real) + np.abs(r.imag) + r_bound       # bounds |R| entrywise
    rho = float(r_abs.sum(axis=1).max()) * (1.0 + 2 * _gamma(n + 2))
    if not rho < 0.5:
        return None
    x_abs = np.abs(x.real) + np.abs(x.imag)
    row_sums = x_abs.sum(axis=1) * (1.0 + 2 * _gamma(n + 2))
    w, b = cols, rows
    correction = np.empty(len(w), dtype=complex)
    correction_error = np.empty(len(w))
    spread = 2.0 * _gamma(n + 2) * (np.abs(r.real) + np.abs(r.imag)) + r_bound
    step = max(1, (1 << 22) // max(n, 1))
    for start in range(0, len(w), step):
        e = slice(start, start + step)
        correction[e] = np.einsum("ek,ke->e", x[w[e]], r[:, b[e]])
        correction_error[e] = np.einsum("ek,ke->e", x_abs[w[e]], spread[:, b[e]])
    correction_error *= 1.0 + 2 * _gamma(n + 2)
    values = x[w, b] + correction
    remainder = row_sums[w] * (rho * rho / (1.0 - rho)) * (1.0 + 8 * _U)
    error = correction_error + remainder + 2 * _U * np.abs(values) + 8 * _TINY
    return values, error


def ball_seconds(n: int, bits: int) -> float:
    """Estimated seconds of one ``acb_mat`` inverse of n rows at ``bits`` (measured here: n = 210-870,
    64-256 bits, 2.4e-8 to 6e-8 s per n^3; rounded up)."""
    return (2.5e-8 + 1.6e-10 * bits) * float(n) ** 3 + 1e-6 * n * n


def _in_child(k: np.ndarray, rows: np.ndarray, cols: np.ndarray, bits: int, stage: str, estimate: float
              ) -> Optional[Tuple[np.ndarray, np.ndarray]]:
    """ball_entries in a child interpreter running :mod:`._ball_worker` by its path (so a caller's
    unguarded main script is not run again, as a multiprocessing spawn would): progress every half
    second; Ctrl-C or any other exception here stops the child."""
    with tempfile.TemporaryDirectory(prefix="frostline-ball-") as folder:
        given, answer, errors = (os.path.join(folder, name) for name in ("in.npz", "out.npz", "stderr.txt"))
        np.savez(given, k=k, rows=rows, cols=cols, bits=np.int64(bits))
        with open(errors, "wb") as log:
            child = subprocess.Popen([sys.executable, _ball_worker.__file__, given, answer],
                                     stdin=subprocess.DEVNULL, stdout=subprocess.DEVNULL, stderr=log)
            began = time.perf_counter()
            try:
                while True:
                    try:
                        code = child.wait(timeout=0.5)
                        break
                    except subprocess.TimeoutExpired:
                        report(stage, min(int(time.perf_counter() - began), int(estimate)), max(1, int(estimate)))
            finally:
                if child.poll() is None:
                    child.kill()
                    child.wait()
        if code != 0:
            with open(errors, encoding="utf-8", errors="replace") as log:
                tail = log.read()[-600:]
            raise RuntimeError(f"the ball inverse at {bits} bits stopped without a result (exit code {code}; "
                               f"out of memory?): {tail}")
        with np.load(answer) as got:
            return (got["mid"], got["rad"]) if bool(got["ok"]) else None


def first_bits(condition: Optional[float], tolerance: float) -> int:
    """A starting precision for the ball inverse from an estimate of the condition number (a float
    inverse's ||K|| ||X||): the radii of flint's enclosures grew like cond^2 2^-bits on the notched
    Aztec diamonds measured here, so 2 log2(cond) + log2(1/tolerance) bits and a margin. Only the
    cost depends on this guess; the radii are checked either way."""
    if condition is None or not math.isfinite(condition) or condition < 1.0:
        return _START_BITS
    wanted = 2.0 * math.log2(condition) + math.log2(1.0 / tolerance) + _BITS_STEP
    return max(_START_BITS, _BITS_STEP * math.ceil(wanted / _BITS_STEP))


def next_bits(bits: int, worst: float, tolerance: float) -> int:
    """The precision to try after radii of at most ``worst`` at ``bits``: radii shrink like 2^-bits, so
    ask for log2(worst / tolerance) more bits and a margin (double when there was no enclosure)."""
    if not math.isfinite(worst) or worst <= 0.0:
        return 2 * bits
    wanted = bits + math.log2(worst / tolerance) + 24
    return max(bits + _BITS_STEP, _BITS_STEP * math.ceil(wanted / _BITS_STEP))


def ball_probabilities(k: np.ndarray, rows: np.ndarray, cols: np.ndarray, tolerance: float,
                       budget: Optional[float], max_bits: int = 1024, condition: Optional[float] = None
                       ) -> Tuple[np.ndarray, np.ndarray]:
    """Route 2: placement probabilities and their certified radii, each radius at most ``tolerance``.

    ``condition`` (an estimate of K's condition number, optional) picks the first precision
    (:func:`first_bits`). Raises ValueError above ``budget`` seconds (estimated before each precision)
    or ``max_bits``.
    """
    n = k.shape[0]
    check_memory(400 * n * n + 10**7, f"a ball-arithmetic inverse of the {n}x{n} Kasteleyn matrix")
    bits, spent, worst = min(max_bits, first_bits(condition, tolerance)), 0.0, math.inf
    best = math.inf
    while bits <= max_bits:
        estimate = ball_seconds(n, bits)
        remaining = None if budget is None else budget - spent
        check_seconds(estimate, remaining, f"certified placement probabilities of a {n}x{n} Kasteleyn matrix",
                      f"a ball-arithmetic inverse at {bits} bits, about 3e-8 n^3 s")
        stage = f"ball inverse of the {n}x{n} Kasteleyn matrix at {bits} bits, seconds"
        began = time.perf_counter()
        result = (_in_child(k, rows, cols, bits, stage, estimate) if n >= _CHILD_ROWS
                  else ball_entries(k, rows, cols, bits))
        spent += time.perf_counter() - began
        worst = math.inf
        if result is not None:
            mid, rad = result
            worst = float(rad.max(initial=0.0))
            best = min(best, worst)
            if worst <= tolerance:
                return mid, rad
        bits = next_bits(bits, worst, tolerance)
    raise ValueError(f"placement probabilities of this {n}x{n} Kasteleyn matrix could not be certified to "
                     f"{tolerance:g} within {max_bits} bits (best radius {best:.2g})")
