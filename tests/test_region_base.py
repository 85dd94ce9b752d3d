"""The shared plumbing of Region: start states checked for every lattice, reports, pickling, old files."""
from __future__ import annotations

import json
import pickle
import zipfile

import numpy as np
import pytest

import frostline as fl
from frostline.custom import ModelRegion, dyck_path_model

REGIONS = {
    "hexagon": lambda: fl.lozenge.hexagon(3, 2, 2),
    "lozenge path": lambda: fl.lozenge.from_boundary("3e 2ne 2nw 3w 2sw 2se"),
    "aztec": lambda: fl.domino.aztec_diamond(3),
    "square ice": lambda: fl.square_ice.domain_wall(4),
    "dyck": lambda: ModelRegion(dyck_path_model(4)),
}


@pytest.mark.parametrize("make", REGIONS.values(), ids=REGIONS.keys())
def test_chain_starts_are_checked_for_every_lattice(make):
    region = make()
    least, greatest = region.extreme_heights()
    assert np.array_equal(region.chain(seed=1, start=greatest).heights, greatest)
    model = region.heat_bath_rule()[0]
    bumped = np.asarray(region.nodes_from_heights(greatest)).copy()
    bumped[model.n_sites // 2] += 20 * model.step  # a free site far above every neighbour
    with pytest.raises(ValueError, match="start is not a configuration"):
        region.chain(seed=1, start=region.heights_from_model(bumped))
    with pytest.raises(ValueError, match="shape"):
        region.chain(seed=1, start=np.zeros(np.asarray(least).shape + (2,), int))
    with pytest.raises(TypeError, match="integers"):
        region.chain(seed=1, start=np.asarray(least, float))


def test_masked_entries_are_normalised():
    """Corners outside the region hold 0 whatever a start gives there, on every kernel (same trajectory)."""
    region = fl.domino.aztec_diamond(3)
    start = region.extreme_heights()[1].copy()
    start[0, 0] = 77
    fast, generic = (region.chain(seed=2, start=start, method=m).run(5).heights for m in ("cftp", "generic"))
    assert fast[0, 0] == 0 and np.array_equal(fast, generic)


def test_sample_info_reports_the_method_that_ran():
    cftp = fl.domino.aztec_diamond(6).sample(seed=1, method="cftp").info
    shuffling = fl.domino.aztec_diamond(6).sample(seed=1).info
    assert cftp.method == "cftp" and cftp.start_time == cftp.report["start_time"] >= 1
    assert shuffling.method == "shuffling" and shuffling.report["orders"] == 6
    with pytest.raises(AttributeError, match="shuffling samples report no 'start_time'"):
        shuffling.start_time
    with pytest.raises(ValueError, match="Aztec diamonds only"):
        fl.domino.rectangle(4, 4).sample(seed=0, method="shuffling")


def test_samples_pickle_and_copy():
    sample = fl.lozenge.hexagon(2, 3, 2).sample(seed=4)
    again = pickle.loads(pickle.dumps(sample))
    assert np.array_equal(again.heights, sample.heights) and again.info == sample.info
    assert hash(again.info) == hash(sample.info)


def test_files_of_format_one_still_load(tmp_path):
    """Format 1 kept the coupling figures at the top level of the diagnostics."""
    sample = fl.lozenge.hexagon(2, 2, 2).sample(seed=3)
    path = fl.save(sample, tmp_path / "new.npz")
    with np.load(path) as data:
        arrays = {k: data[k] for k in data.files}
    record = json.loads(str(arrays.pop("metadata")))
    d = record["diagnostics"]
    record["format_version"] = 1
    record["diagnostics"] = {"method": d["method"], "kernel": d["kernel"], "seconds": d["seconds"],
                             "version": d["version"], **d["report"]}
    old = tmp_path / "old.npz"
    np.savez_compressed(old, metadata=np.array(json.dumps(record)), **arrays)
    loaded = fl.load(old)
    assert loaded.info.start_time == sample.info.start_time and np.array_equal(loaded.heights, sample.heights)
    assert zipfile.is_zipfile(old)


def test_run_time_model_samples_save(tmp_path):
    sample = ModelRegion(dyck_path_model(4)).sample(seed=1)
    path = fl.save(sample, tmp_path / "dyck.npz")
    assert path.exists()


def test_a_shape_that_takes_a_reserved_option_is_skipped(monkeypatch):
    """One plugin declaring --seed must not break the command line for every lattice."""
    from frostline import cli, registry

    bad = fl.LatticeSpec(name="bad", summary="", tile_classes=("x",), shapes=(
        fl.Shape("badshape", "", lambda seed: None, (fl.Argument("seed", "", flag="--seed"),)),))
    real = registry.specs
    monkeypatch.setattr(registry, "specs", lambda: real() + [bad])
    with pytest.warns(fl.FrostlineWarning, match="reserves"):
        assert cli.main(["count", "hexagon", "2", "2", "2"]) == 0
