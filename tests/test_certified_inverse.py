"""Placement probabilities with rigorous error bounds, against exact rational inverses.

The reference is the exact inverse of the Gaussian-integer Kasteleyn matrix
computed by python-flint (FLINT's fmpq_mat, a general-purpose library) on the
real block form [[A, -B], [B, A]] of K = A + iB, whose inverse is
[[C, -D], [D, C]] with K^{-1} = C + iD (common practice). Placement
probabilities |K(b, w) K^{-1}(w, b)| are Kenyon's local statistics (Kenyon,
"Local statistics of lattice dimers", Ann. Inst. H. Poincare 33, 1997).
"""
from __future__ import annotations

import math
import os
import signal
import subprocess
import sys
import textwrap
import time
from fractions import Fraction

import flint
import numpy as np
import pytest

import frostline as fl
from frostline.exact._ball_worker import ball_entries
from frostline.exact.certified_inverse import ball_probabilities, first_bits, float_entries, next_bits, residual
from frostline.exact.local_statistics import certified_probabilities, placement_probabilities


def exact_inverse(k: np.ndarray) -> np.ndarray:
    """K^{-1} of a Gaussian-integer matrix, exactly (python-flint fmpq_mat), rounded to complex doubles."""
    a = np.rint(k.real).astype(np.int64)
    b = np.rint(k.imag).astype(np.int64)
    assert np.array_equal(a + 1j * b, k)
    n = k.shape[0]
    block = np.block([[a, -b], [b, a]])
    inverse = flint.fmpq_mat(block.tolist()).inv()
    c = np.array([[float(inverse[i, j]) for j in range(n)] for i in range(n)])
    d = np.array([[float(inverse[n + i, j]) for j in range(n)] for i in range(n)])
    return c + 1j * d


def notched(order: int, rows: slice, start: int) -> fl.domino.DominoRegion:
    m = fl.domino.aztec_mask(order)
    m[rows, start:] = False
    return fl.domino.from_mask(m)


@pytest.fixture(scope="module")
def small_case():
    """A notched Aztec diamond of order 8: 65 x 65, small enough for an exact inverse in a blink."""
    region = notched(8, slice(6, 10), 12)
    system = region.dimer_system()
    return region, system, exact_inverse(system["matrix"])


def test_residual_bound_covers_the_true_residual(small_case):
    _, system, truth = small_case
    k, rows, cols = system["matrix"], system["rows"], system["cols"]
    rng = np.random.default_rng(5)
    x = np.linalg.inv(k) * (1 + 1e-9 * rng.standard_normal(k.shape))
    r, bound = residual(k, x, rows, cols)
    # the residual of these doubles in exact rationals (K's entries are 0, 1 and i)
    n = k.shape[0]
    worst = 0.0
    for i in range(n):
        for j in range(n):
            re = Fraction(int(i == j))
            im = Fraction(0)
            for t in np.flatnonzero(k[i]):
                kr, ki = Fraction(k[i, t].real), Fraction(k[i, t].imag)
                xr, xi = Fraction(x[t, j].real), Fraction(x[t, j].imag)
                re -= kr * xr - ki * xi
                im -= kr * xi + ki * xr
            gap = abs(Fraction(r[i, j].real) - re) + abs(Fraction(r[i, j].imag) - im)
            assert gap <= Fraction(bound[i, j]), (i, j)
            worst = max(worst, float(gap))
    assert worst > 0.0                       # rounding happened, and the bound covered it
    assert np.abs(r).max() > 1e-12          # the perturbation really shows in R


def test_float_bounds_cover_the_exact_inverse(small_case):
    _, system, truth = small_case
    k, rows, cols = system["matrix"], system["rows"], system["cols"]
    rng = np.random.default_rng(7)
    for scale in (0.0, 1e-10, 1e-4):
        x = np.linalg.inv(k) * (1 + scale * rng.standard_normal(k.shape))
        got = float_entries(k, x, rows, cols)
        assert got is not None
        values, error = got
        true = truth[cols, rows]
        assert np.all(np.abs(values - true) <= error)
        # one correction step squares the residual: bounds far below the perturbation itself
        assert error.max() < {0.0: 1e-14, 1e-10: 1e-10, 1e-4: 10.0}[scale]
    assert float_entries(k, np.linalg.inv(k) * 1.5, rows, cols) is None   # ||I - K X|| = 1/2 or more
    assert float_entries(k, np.full(k.shape, np.nan), rows, cols) is None


def test_ball_enclosures_contain_the_exact_probabilities(small_case):
    _, system, truth = small_case
    k, rows, cols = system["matrix"], system["rows"], system["cols"]
    exact = np.abs(k[rows, cols] * truth[cols, rows])
    for bits in (64, 128):
        mid, rad = ball_entries(k, rows, cols, bits)
        assert np.all(np.abs(mid - exact) <= rad + 2e-16 * exact)
    assert rad.max() < 3e-16                 # at 128 bits only the rounding of the float64 midpoint is left
    # a singular matrix has no enclosure of its inverse
    assert ball_entries(np.zeros((3, 3), complex), np.array([0]), np.array([0]), 64) is None


def test_certified_probabilities_meet_their_tolerance_on_an_ill_conditioned_region():
    """Notched Aztec diamond of order 16 (246 rows, condition number about 1e9): both routes, checked
    against exact rationals, and the cell sums hold."""
    region = notched(16, slice(13, 19), 26)
    system = region.dimer_system()
    k, rows, cols = system["matrix"], system["rows"], system["cols"]
    exact = np.abs(k[rows, cols] * exact_inverse(k)[cols, rows])
    x = np.linalg.inv(k)
    for tolerance in (1e-6, 1e-14):
        p, route = certified_probabilities(system, x, tolerance, budget=None)
        assert np.all(np.abs(p - exact) <= tolerance)
    # a poor inverse leaves only the ball route, which still meets the tolerance
    p, route = certified_probabilities(system, x * 1.5, 1e-10, budget=None)
    assert route == "ball arithmetic"
    assert np.abs(p - exact).max() <= 1e-10
    tiles, q = placement_probabilities(region, 1e-9)
    assert np.abs(q - exact).max() <= 1e-9
    assert math.isclose(q.sum(), k.shape[0], rel_tol=1e-9)   # one domino per pair of cells


def test_ball_route_refuses_above_its_budget():
    rng = np.random.default_rng(1)
    k = rng.standard_normal((400, 400)) + 0j
    rows, cols = np.arange(400), np.arange(400)
    with pytest.raises(ValueError, match="budget"):
        ball_probabilities(k, rows, cols, 1e-6, budget=0.01)


def test_ball_route_raises_when_bits_run_out():
    k = np.array([[1.0, 1.0], [1.0, 1.0 + 1e-15]], complex)   # nearly singular: 53 bits of cancellation
    with pytest.raises(ValueError, match="could not be certified"):
        ball_probabilities(k, np.array([0, 1]), np.array([0, 1]), 1e-12, budget=None, max_bits=40)


def test_precision_choices():
    assert first_bits(None, 1e-6) == 128
    assert first_bits(1e17, 1e-6) % 32 == 0 and first_bits(1e17, 1e-6) >= 2 * 56 + 20
    assert first_bits(1e17, 1e-6) > first_bits(1e5, 1e-6)
    assert next_bits(128, math.inf, 1e-6) == 256
    assert next_bits(128, 1e-7, 1e-6) == 160          # already fine: the smallest step
    assert next_bits(128, 0.06, 1e-6) >= 128 + 16 + 20
    assert next_bits(128, 0.06, 1e-6) % 32 == 0


@pytest.mark.parametrize("bad, error", [(1e-30, ValueError), (0.0, ValueError), (math.nan, ValueError),
                                        ("1e-6", TypeError), (True, TypeError)])
def test_bad_tolerance_is_refused(bad, error, small_case):
    region = small_case[0]
    with pytest.raises(error, match="tolerance"):
        placement_probabilities(region, bad)


def _run(script: str, **env: str) -> subprocess.CompletedProcess:
    return subprocess.run([sys.executable, "-c", script], capture_output=True, text=True, timeout=300,
                          env={**os.environ, **env})


def test_child_route_agrees_from_a_script_without_a_main_guard():
    """The child runs the worker by path, so an unguarded caller script is not run twice."""
    script = textwrap.dedent("""
        import numpy as np
        import frostline as fl
        from frostline.exact import certified_inverse
        from frostline.exact._ball_worker import ball_entries
        print("script body ran")
        m = fl.domino.aztec_mask(8); m[6:10, 12:] = False
        s = fl.domino.from_mask(m).dimer_system()
        k, rows, cols = s["matrix"], s["rows"], s["cols"]
        certified_inverse._CHILD_ROWS = 0
        p, rad = certified_inverse.ball_probabilities(k, rows, cols, 1e-12, budget=None)
        mid, _ = ball_entries(k, rows, cols, 128)
        print("agree", bool(np.all(np.abs(p - mid) <= 1e-12)), bool(rad.max() <= 1e-12))
    """)
    done = _run(script)
    assert done.returncode == 0, done.stderr
    assert done.stdout.count("script body ran") == 1
    assert "agree True True" in done.stdout


def _children_mentioning(folder: str) -> list:
    found = []
    for pid in os.listdir("/proc"):
        if not pid.isdigit():
            continue
        try:
            with open(f"/proc/{pid}/cmdline", "rb") as f:
                if folder.encode() in f.read():
                    found.append(pid)
        except OSError:
            pass
    return found


@pytest.mark.skipif(not os.path.isdir("/proc"), reason="needs /proc to look for a left-over child")
def test_ctrl_c_stops_a_long_ball_inverse(tmp_path):
    script = textwrap.dedent("""
        import numpy as np
        from frostline.exact.certified_inverse import ball_probabilities
        rng = np.random.default_rng(0)
        k = rng.standard_normal((500, 500)) + 1j * rng.standard_normal((500, 500))
        print("started", flush=True)
        ball_probabilities(k, np.arange(500), np.arange(500), 1e-15, budget=None, max_bits=4096)
        print("finished", flush=True)
    """)
    child = subprocess.Popen([sys.executable, "-c", script], stdout=subprocess.PIPE, stderr=subprocess.PIPE,
                             text=True, env={**os.environ, "TMPDIR": str(tmp_path)})
    try:
        assert child.stdout.readline().strip() == "started"
        time.sleep(1.5)
        assert _children_mentioning(str(tmp_path)), "the ball inverse should be running in a child by now"
        began = time.perf_counter()
        child.send_signal(signal.SIGINT)
        out, err = child.communicate(timeout=30)
        assert time.perf_counter() - began < 10
    finally:
        if child.poll() is None:
            child.kill()
    assert "KeyboardInterrupt" in err and "finished" not in out
    deadline = time.time() + 5
    while _children_mentioning(str(tmp_path)) and time.time() < deadline:
        time.sleep(0.1)
    assert not _children_mentioning(str(tmp_path))
    assert not list(tmp_path.iterdir())     # the exchange folder is gone too
