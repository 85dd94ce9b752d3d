"""Ensembles: the same members however they run, exact integer statistics, zarr stores that resume.

Member i must equal region.samples(size, seed)[i] for threads, processes and
a Dask LocalCluster; statistics are exact integer sums, so they are bit
identical across worker counts; a run killed at several moments (fixed
delays) and resumed gives the uninterrupted store, each member once.
"""
from __future__ import annotations

import subprocess
import sys
import time
from pathlib import Path

import numpy as np
import pytest

import frostline as fl

zarr = pytest.importorskip("zarr")

REGION = fl.lozenge.hexagon(5, 4, 3)


def _reference(size: int, seed: int):
    return REGION.samples(size, seed=seed, threads=1)


def test_members_and_statistics_match_plain_samples():
    reference = _reference(20, 8)
    stack = np.stack([s.heights for s in reference]).astype(np.int64)
    for workers, backend in ((1, "threads"), (2, "threads"), (2, "processes")):
        e = fl.ensemble(REGION, 20, seed=8, workers=workers, backend=backend)
        total, squares, members = e.sums
        assert members == 20
        np.testing.assert_array_equal(total, stack.sum(axis=0))
        np.testing.assert_array_equal(squares, (stack ** 2).sum(axis=0))
        np.testing.assert_allclose(e.var_heights, stack.var(axis=0, ddof=1), atol=1e-12)
        for i in (0, 7, 19):
            np.testing.assert_array_equal(e[i].heights, reference[i].heights)


def test_store_resumes_and_refuses_other_ensembles(tmp_path):
    path = tmp_path / "e.zarr"
    full = fl.ensemble(REGION, 15, seed=4, store=path, workers=2)
    group = zarr.open_group(str(path))  # plain zarr reads it
    assert group["heights"].shape == (15, 5, 4) and int(np.sum(group["done"][:])) == 15
    np.testing.assert_array_equal(group["heights"][6], _reference(15, 4)[6].heights)
    # forget some members (as a kill before their commit marks would): a rerun recomputes exactly those
    group["done"][3] = 0
    group["done"][11] = 0
    group["heights"][11] = np.zeros((5, 4), dtype=np.int32)
    again = fl.ensemble(REGION, 15, seed=4, store=path, workers=2)
    np.testing.assert_array_equal(again.sums[0], full.sums[0])
    assert int(np.sum(zarr.open_group(str(path))["done"][:])) == 15
    with pytest.raises(ValueError, match="another ensemble"):
        fl.ensemble(REGION, 15, seed=5, store=path)
    with pytest.raises(ValueError, match="another ensemble"):
        fl.ensemble(fl.lozenge.hexagon(5, 4, 2), 15, seed=4, store=path)


def test_a_corrupted_chunk_is_recomputed_not_read(tmp_path):
    path = tmp_path / "c.zarr"
    full = fl.ensemble(REGION, 6, seed=1, store=path, workers=1)
    target = [p for p in sorted((path / "heights" / "c" / "2").rglob("*")) if p.is_file()][0]
    data = bytearray(target.read_bytes())
    data[len(data) // 2] ^= 0xFF
    target.write_bytes(bytes(data))
    again = fl.ensemble(REGION, 6, seed=1, store=path, workers=1)
    np.testing.assert_array_equal(again.sums[0], full.sums[0])


def test_a_corrupted_info_row_is_recomputed_too(tmp_path):
    import zarr

    path = tmp_path / "i.zarr"
    fl.ensemble(REGION, 6, seed=1, store=path, workers=1)
    target = [p for p in sorted((path / "info" / "c" / "4").rglob("*")) if p.is_file()][0]
    data = bytearray(target.read_bytes())
    data[len(data) // 2] ^= 0xFF
    target.write_bytes(bytes(data))
    broken = fl.ensemble(REGION, 6, seed=1, store=path, workers=1)
    assert np.array_equal(broken[4].heights, REGION.samples(6, seed=1)[4].heights)   # redrawn, then stored
    assert float(np.asarray(zarr.open_group(str(path))["info"][4])[0]) > 0


def test_a_killed_run_resumes_without_loss_or_duplicates(tmp_path):
    script = Path(__file__).with_name("ensemble_kill_script.py")
    size = 250
    region = fl.lozenge.hexagon(14, 13, 12)
    reference = fl.ensemble(region, size, seed=2026, workers=2)
    interrupted = 0
    for delay in (0.9, 1.4, 1.9):
        path = tmp_path / f"k{delay}.zarr"
        run = subprocess.Popen([sys.executable, str(script), str(path), str(size)], stdout=subprocess.DEVNULL)
        time.sleep(delay)
        run.kill()
        run.wait()
        if (path / "done").exists():
            marked = int(np.sum(zarr.open_group(str(path))["done"][:]))
            interrupted += 0 < marked < size
        resumed = fl.ensemble(region, size, seed=2026, store=path, workers=2)
        np.testing.assert_array_equal(resumed.sums[0], reference.sums[0])
        np.testing.assert_array_equal(resumed.sums[1], reference.sums[1])
        assert resumed.sums[2] == size
    assert interrupted >= 1  # at least one kill landed in the middle of the run


def test_dask_local_cluster_gives_the_same_members():
    distributed = pytest.importorskip("distributed")
    with distributed.LocalCluster(n_workers=2, threads_per_worker=1, processes=True, dashboard_address=None) as cluster, \
            distributed.Client(cluster) as client:
        e = fl.ensemble(REGION, 12, seed=9, client=client)
    plain = fl.ensemble(REGION, 12, seed=9, workers=1)
    np.testing.assert_array_equal(e.sums[0], plain.sums[0])
    np.testing.assert_array_equal(e.sums[1], plain.sums[1])


def test_bad_arguments():
    with pytest.raises(ValueError, match="backend"):
        fl.ensemble(REGION, 3, seed=1, backend="gpu")
    with pytest.raises(TypeError):
        fl.ensemble(REGION, 2.5, seed=1)
    with pytest.raises(ValueError, match="no members"):
        _ = fl.ensemble(REGION, 0, seed=1).mean_heights
    with pytest.raises(IndexError):
        fl.ensemble(REGION, 3, seed=1)[3]


def test_command_line_ensemble_resumes(tmp_path, capsys):
    from frostline.cli import main

    store = tmp_path / "cli.zarr"
    args = ["ensemble", "hexagon", "4", "3", "3", "--size", "12", "--seed", "5", "--store", str(store),
            "--workers", "2"]
    assert main(args) == 0
    first = capsys.readouterr().out
    assert "ensemble of 12 exact samples" in first
    assert main(args) == 0  # nothing left to do: the same statistics from the store
    assert capsys.readouterr().out.splitlines()[-2:] == first.splitlines()[-2:]
    assert main(args[:6] + ["13"] + args[7:]) == 2  # another size: refused
    assert "another ensemble" in capsys.readouterr().err


def test_show_summarises_a_store(tmp_path, capsys):
    from frostline.cli import main

    store = tmp_path / "s.zarr"
    e = fl.ensemble(REGION, 5, seed=2, store=store, workers=1)
    assert main(["show", str(store)]) == 0
    out = capsys.readouterr().out
    assert "5 members, 5 done" in out
    assert f"{float(e.mean_heights.mean()):.6g}"[:5] in out
    other = tmp_path / "other"
    other.mkdir()
    assert main(["show", str(other)]) == 2
    assert "not a frostline ensemble store" in capsys.readouterr().err


def test_worker_cache_tells_regions_apart_by_their_arrays():
    # two regions with one description ({"shape": "triangles"}) but different triangles
    from frostline.ensemble import _payload, _remote_member

    first = fl.lozenge.from_triangles(fl.lozenge.hexagon_region(2, 2, 2).triangles)
    second = fl.lozenge.from_triangles(fl.lozenge.trapezoid(5, 3).triangles)
    assert first.describe() == second.describe()
    root = fl.SeedRecord.from_dict({"entropy": 1, "spawn_key": [], "pool_size": 4}).as_dict()
    _, a, _ = _remote_member(_payload(first), root, 0, "auto")
    _, b, _ = _remote_member(_payload(second), root, 0, "auto")
    assert a.shape == first.sample(seed=0).heights.shape
    assert b.shape == second.sample(seed=0).heights.shape


def test_huge_ensembles_are_refused_before_allocating(monkeypatch):
    monkeypatch.setenv("FROSTLINE_MEMORY_LIMIT", "1e8")
    start = time.perf_counter()
    with pytest.raises(fl.RegionTooLargeError, match="ensemble of 100000000 members"):
        fl.ensemble(REGION, 10**8, seed=1)
    assert time.perf_counter() - start < 2.0


def test_reducers_sum_exactly_in_any_order(tmp_path):
    counts = fl.analysis.tile_counts(REGION, bin_size=1.0)
    plain = sum(counts(s) for s in REGION.samples(8, seed=3))
    one = fl.ensemble(REGION, 8, seed=3, workers=1, reducers={"tiles": counts})
    two = fl.ensemble(REGION, 8, seed=3, workers=2, reducers={"tiles": counts})
    assert np.array_equal(one.reduced["tiles"], plain) and np.array_equal(two.reduced["tiles"], plain)
    # every member has the region's tile count, spread over the classes
    assert int(plain.sum()) == 8 * len(REGION.sample(seed=0).tiles)
    # a resumed store feeds its stored members to the reducers too
    path = tmp_path / "r.zarr"
    fl.ensemble(REGION, 8, seed=3, store=path, workers=1)
    resumed = fl.ensemble(REGION, 8, seed=3, store=path, workers=1, reducers={"tiles": counts})
    assert np.array_equal(resumed.reduced["tiles"], plain)
    with pytest.raises(ValueError, match="integer arrays"):
        fl.ensemble(REGION, 2, seed=3, workers=1, reducers={"mean": lambda s: s.heights.astype(float)})
    with pytest.raises(TypeError, match="reducers"):
        fl.ensemble(REGION, 2, seed=3, workers=1, reducers={"x": 3})


def test_tile_densities_with_and_without_the_reducer(tmp_path):
    from frostline.analysis import tile_counts

    with_reducer = fl.ensemble(REGION, 10, seed=3, workers=2, reducers={"tile_counts": tile_counts(REGION, 1.5)})
    stored = fl.ensemble(REGION, 10, seed=3, workers=2, store=tmp_path / "d.zarr")
    a, b = with_reducer.tile_densities(), stored.tile_densities(1.5)   # b: counted from the stored members
    np.testing.assert_array_equal(a, b)
    filled = ~np.isnan(a[0])
    np.testing.assert_allclose(a[:, filled].sum(axis=0), 1.0)   # the classes share each bin's tiles
    # the same as counting every member of plain samples()
    count = tile_counts(REGION, 1.5)
    total = sum(count(s) for s in REGION.samples(10, seed=3))
    np.testing.assert_allclose(a[:, filled], total[:, filled] / total.sum(axis=0)[filled])
    with pytest.raises(ValueError, match="no members"):
        fl.ensemble(REGION, 0, seed=1).tile_densities()


def test_the_store_keeps_the_exact_sums_for_other_programs(tmp_path):
    import zarr

    from frostline.analysis import tile_counts

    path = tmp_path / "s.zarr"
    e = fl.ensemble(REGION, 8, seed=2, workers=2, store=path, reducers={"tiles": tile_counts(REGION, 1.0)})
    stats = zarr.open_group(str(path), mode="r")["statistics"]
    total, squares, members = e.sums
    np.testing.assert_array_equal(np.asarray(stats["sum_heights"]), total)
    np.testing.assert_array_equal(np.asarray(stats["sum_squares"]), squares)
    np.testing.assert_array_equal(np.asarray(stats["reduced_tiles"]), e.reduced["tiles"])
    assert stats.attrs["members"] == members == 8
