"""Bad input gets a clear ValueError or TypeError, never a crash or a silent wrong answer."""
import math
from fractions import Fraction

import numpy as np
import pytest

import frostline as fl


@pytest.mark.parametrize("sides, error, words", [
    ((-1, 2, 2), ValueError, "non-negative"),
    ((2, -3, 2), ValueError, "non-negative"),
    ((2.5, 2, 2), TypeError, "must be an int"),
    ((2, "3", 2), TypeError, "must be an int"),
    ((True, 2, 2), TypeError, "must be an int"),
    ((2, 2, None), TypeError, "must be an int"),
    ((2**31, 1, 1), ValueError, "32-bit"),
])
def test_bad_sides(sides, error, words):
    with pytest.raises(error, match=words):
        fl.lozenge.hexagon(*sides)


@pytest.mark.parametrize("q", [0, -0.5, math.nan, math.inf, -math.inf, Fraction(-1, 2)])
def test_bad_weights(q):
    with pytest.raises(ValueError, match="finite positive"):
        fl.lozenge.hexagon(2, 2, 2, q=q)


@pytest.mark.parametrize("q", ["0.5", None, 1j])
def test_weight_of_wrong_type(q):
    with pytest.raises(TypeError, match="real number"):
        fl.lozenge.hexagon(2, 2, 2, q=q)


def test_numpy_integers_are_accepted():
    assert fl.lozenge.hexagon(np.int64(2), np.int32(2), np.uint8(2)).count() == 20


def test_absurd_size_names_the_memory_estimate():
    with pytest.raises(fl.RegionTooLargeError, match=r"GiB of memory.*FROSTLINE_MEMORY_LIMIT"):
        fl.lozenge.hexagon(10**6, 10**6, 10)


def test_memory_limit_from_environment(monkeypatch):
    monkeypatch.setenv("FROSTLINE_MEMORY_LIMIT", "1000")
    with pytest.raises(ValueError, match="needs about"):
        fl.lozenge.hexagon(30, 30, 30)


@pytest.mark.parametrize("seed, error", [(-1, ValueError), (1.5, TypeError), ("7", TypeError), (True, TypeError)])
def test_bad_seeds(seed, error):
    with pytest.raises(error, match="seed"):
        fl.lozenge.hexagon(2, 2, 2).sample(seed=seed)


def test_bad_method():
    with pytest.raises(ValueError, match="method must be one of"):
        fl.lozenge.hexagon(2, 2, 2).sample(seed=0, method="fastest")


@pytest.mark.parametrize("start, error, words", [
    ("middle", ValueError, "'min', 'max'"),
    (np.zeros((2, 3), int), ValueError, "shape"),
    (np.array([[0, 1], [0, 0]]), ValueError, "not a plane partition"),
    (np.array([[5, 1], [0, 0]]), ValueError, "not a plane partition"),
    (np.array([[1.0, 1.0], [0.0, 0.0]]), TypeError, "integers"),
])
def test_bad_chain_start(start, error, words):
    with pytest.raises(error, match=words):
        fl.lozenge.hexagon(2, 2, 2).chain(seed=0, start=start)


@pytest.mark.parametrize("sweeps, error", [(-1, ValueError), (2.0, TypeError)])
def test_bad_sweeps(sweeps, error):
    with pytest.raises(error, match="sweeps"):
        fl.lozenge.hexagon(2, 2, 2).chain(seed=0).run(sweeps)


def test_unknown_lattice():
    with pytest.raises(ValueError, match="registered lattices: .*lozenge"):
        fl.lattice("hexagonal_ice")
    with pytest.raises(AttributeError):
        fl.not_a_lattice


def test_bad_picture_format(tmp_path):
    S = fl.lozenge.hexagon(2, 2, 2).sample(seed=0)
    with pytest.raises(ValueError, match="format"):
        fl.plot.save(S, tmp_path / "picture.bmp")


def test_progress_must_be_callable():
    import frostline as fl

    with pytest.raises(TypeError, match="progress must be None or a callable"):
        fl.square_ice.domain_wall(3).sample(seed=0, progress=True)
