"""Where the frozen region ends along a line: n^(1/3) fluctuations with a Tracy-Widom shape.

The Aztec diamond's frozen boundary fluctuates on the scale n^(1/3) with the
Tracy-Widom GUE law in the limit (Johansson, "The arctic circle boundary and
the Airy process", Ann. Probab. 33, 2005), and its mean lies on the arctic
circle (Jockusch, Propp, Shor 1998): along the vertical centre line the north
frozen region ends n (1 - 1/sqrt 2) below the top corner. Exact samples by
domino shuffling, fixed seeds, 400 per size. The deviation ratio between
orders 20 and 160 is 8^(1/3) = 2 in the limit; its estimate has a standard
error of about 5.4 % (bootstrap), so the band [1.55, 2.45] is a 4.2-sigma
band (false alarm about 3e-5 for a correct sampler). The Tracy-Widom distance
is a loose shape check (module docstring of frostline.analysis.frozen_positions).
"""
from __future__ import annotations

import math

import numpy as np
import pytest

import frostline as fl
from frostline.analysis import crossing, frozen_positions


def _positions(n: int):
    samples = fl.domino.aztec_diamond(n).samples(400, seed=20261204 + n, method="shuffling")
    return frozen_positions(samples, (0.5, n), (0, -1))


@pytest.mark.slow
def test_aztec_frozen_boundary_fluctuates_like_n_to_the_third():
    small, large = _positions(20), _positions(160)
    assert small.frozen_class == large.frozen_class == "north"
    assert 1.55 < large.deviation / small.deviation < 2.45
    assert large.mean / 160 == pytest.approx(1 - 1 / math.sqrt(2), abs=0.04)
    assert not large.censored.any()
    assert large.tracy_widom_distance() < 0.12


def test_crossing_of_a_line_with_curves():
    circle = fl.domino.aztec_diamond(10).arctic_curve() / 10
    t, found = crossing([np.vstack([circle, circle[:1]])], (0.0, 1.0), (0.0, -1.0))
    assert found and t == pytest.approx(1 - 1 / math.sqrt(2), abs=1e-3)
    assert not crossing([circle], (5.0, 5.0), (1.0, 0.0))[1]


def test_lines_that_never_cross_are_censored():
    samples = fl.domino.aztec_diamond(6).samples(3, seed=1, method="shuffling")
    # along the top row the whole line is north (frozen): no crossing to see
    ends = frozen_positions(samples, (-0.5, 5.5), (1, 0), width=0.2)
    assert ends.censored.all()
    with pytest.raises(ValueError, match="never leaves the frozen class"):
        _ = ends.mean


def test_bad_lines_are_refused():
    samples = [fl.domino.aztec_diamond(4).sample(seed=1)]
    with pytest.raises(ValueError, match="non-zero direction"):
        frozen_positions(samples, (0, 0), (0, 0))
    with pytest.raises(ValueError, match="no tile centre"):
        frozen_positions(samples, (100, 100), (1, 0))
    with pytest.raises(ValueError, match="frozen_class"):
        frozen_positions(samples, (0.5, 4), (0, -1), frozen_class="up")
