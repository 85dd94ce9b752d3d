"""Regression tests: answers that were silently wrong, or errors that were not clear."""
import numpy as np
import pytest

import frostline as fl


def test_integer_determinant_of_large_unsigned_entries():
    assert fl.exact.integer_determinant(np.array([[2**63]], dtype=np.uint64)) == 2**63
    assert fl.exact.integer_determinant(np.array([[2**64 - 1, 0], [0, 2]], dtype=np.uint64)) == 2 * (2**64 - 1)


def test_hexagon_minus_nothing_is_the_hexagon():
    assert fl.lozenge.hexagon_minus(2, 2, 2, removed=[]).count() == 20  # MacMahon, OEIS A008793


def test_aztec_count_refuses_negative_orders():
    with pytest.raises(ValueError, match="non-negative"):
        fl.domino.aztec_count(-3)


def test_deeply_nested_paths_are_refused_not_recursed():
    with pytest.raises(ValueError, match="nests groups"):
        fl.lozenge.from_boundary("(" * 5000 + "e" + ")" * 5000)


@pytest.mark.parametrize("make, bad", [
    (lambda: fl.lozenge.hexagon(2, 2, 2), np.array([[0, 2], [0, 0]])),
    (lambda: fl.lozenge.hexagon(2, 2, 2), np.zeros((3, 3), int)),
    (lambda: fl.domino.aztec_diamond(2), np.zeros((4, 4), int)),
    (lambda: fl.domino.aztec_diamond(2), np.zeros((5, 5), int)),
    (lambda: fl.square_ice.domain_wall(3), np.zeros((4, 4), int)),
])
def test_tiles_from_heights_refuses_what_is_not_a_configuration(make, bad):
    with pytest.raises(ValueError):
        make().tiles_from_heights(bad)


def test_loaded_heights_are_checked(tmp_path):
    import json

    sample = fl.lozenge.hexagon(2, 2, 2).sample(seed=1)
    path = fl.save(sample, tmp_path / "s.npz")
    with np.load(path) as data:
        arrays = {k: data[k] for k in data.files}
    arrays["heights"] = np.array([[0, 2], [0, 0]], np.int32)  # not a plane partition
    bad = tmp_path / "bad.npz"
    np.savez_compressed(bad, **arrays)
    with pytest.raises(ValueError, match="not a valid frostline sample"):
        fl.load(bad)
    assert json.loads(str(arrays["metadata"]))["lattice"] == "lozenge"
