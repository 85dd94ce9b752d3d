"""The outside plugin through frostline's public interfaces (run by CI after installing it)."""
import itertools
from collections import Counter

import numpy as np
import pytest
from scipy import stats

import frostline as fl


def transfer_count(rows, columns, max_height):
    """Independent count: a transfer matrix over rows of heights (common practice)."""
    states = [s for s in itertools.product(range(max_height + 1), repeat=columns)
              if abs(s[0]) <= 1 and abs(s[-1]) <= 1 and all(abs(a - b) <= 1 for a, b in zip(s, s[1:]))]
    ok = lambda s, t: all(abs(a - b) <= 1 for a, b in zip(s, t))  # noqa: E731
    first = {s: 1 for s in states if all(v <= 1 for v in s)}
    current = first
    for _ in range(rows - 1):
        current = {t: sum(w for s, w in current.items() if ok(s, t)) for t in states}
    return sum(w for s, w in current.items() if all(v <= 1 for v in s))


def test_registered_as_a_lattice():
    assert "rsos" in fl.lattices()
    assert fl.lattice("rsos").surface(2, 2, 1).lattice == "rsos"


@pytest.mark.parametrize("shape", [(1, 1, 3), (2, 3, 2), (3, 3, 2), (3, 4, 3), (4, 4, 1)])
def test_counts_against_a_transfer_matrix(shape):
    assert fl.lattice("rsos").surface(*shape).count() == transfer_count(*shape)


def test_exact_samples_are_uniform():
    R = fl.lattice("rsos").surface(2, 3, 2)
    from frostline.custom import ModelRegion

    support = [tuple(row) for row in ModelRegion(R.model).configurations().tolist()]
    n = 3000
    observed = Counter(tuple(s.heights.ravel().tolist()) for s in R.samples(n, seed=1, threads=2))
    counts = np.array([observed.get(s, 0) for s in support])
    assert sum(observed.values()) == counts.sum()  # nothing outside the support
    assert stats.chisquare(counts).pvalue > 1e-4  # fixed seed; false-alarm rate 1e-4


@pytest.mark.parametrize("q", [1.0, 0.7, 1.3])
def test_kernel_equals_generic_engine(q):
    R = fl.lattice("rsos").surface(6, 7, 3, q=q)
    for seed in range(5):
        assert np.array_equal(R.sample(seed=seed, method="kernel").heights, R.sample(seed=seed, method="generic").heights)


def test_the_checker_passes_it():
    assert fl.check_model(fl.lattice("rsos").surface(2, 3, 2)).ok


def test_bad_input():
    with pytest.raises(ValueError):
        fl.lattice("rsos").surface(0, 3, 2)
    with pytest.raises(TypeError):
        fl.lattice("rsos").surface(2.5, 3, 2)


def test_the_command_line_knows_it(capsys):
    """One folder, one registration: the outside lattice's shapes reach the CLI with no change to frostline."""
    from frostline.cli import main

    assert main(["lattices"]) == 0
    listing = capsys.readouterr().out
    assert "rsos: restricted solid-on-solid" in listing and "shape rsos ROWS COLUMNS MAX_HEIGHT" in listing
    assert main(["count", "rsos", "3", "3", "2"]) == 0
    assert capsys.readouterr().out.strip() == str(transfer_count(3, 3, 2))
    assert main(["sample", "rsos", "3", "4", "2", "--seed", "3"]) == 0
    out = capsys.readouterr().out
    assert "rsos kernel" in out and "start time" in out


def test_saved_samples_load_back(tmp_path):
    R = fl.lattice("rsos").surface(3, 4, 2, q=0.8)
    S = R.sample(seed=4)
    T = fl.load(fl.save(S, tmp_path / "s.npz"))
    assert np.array_equal(S.heights, T.heights) and T.region.describe() == R.describe()
