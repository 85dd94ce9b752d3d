"""Lattices as plugins: the registry, run-time models (Dyck paths), the model checker, shipped headers."""
import math
import os
from collections import Counter
from importlib import metadata

import numpy as np
import pytest

import frostline as fl
from frostline import registry
from reference.statistics import P_FLOOR, pooled_chi_square


def test_builtins_are_registered():
    assert {"lozenge", "domino", "square_ice"} <= set(fl.lattices())
    assert fl.lattice("domino") is fl.domino


class FakeDistribution:
    def __init__(self, name):
        self.metadata = {"Name": name}


class FakeEntryPoint:
    def __init__(self, name, value, dist="frostline"):
        self.name, self.value, self.dist = name, value, FakeDistribution(dist)


BUILTINS = [("lozenge", "frostline.lozenge"), ("domino", "frostline.domino"), ("square_ice", "frostline.square_ice")]


@pytest.fixture
def fake_entry_points(monkeypatch):
    def install(points):
        monkeypatch.setattr(metadata, "entry_points", lambda group=None: [FakeEntryPoint(*p) for p in points])
        registry._loaded.clear()
        registry._targets_cache.clear()

    yield install
    registry._loaded.clear()
    registry._targets_cache.clear()


def test_outside_plugin_is_listed_and_loaded_lazily(fake_entry_points):
    fake_entry_points(BUILTINS + [("extra", "frostline.custom", "extra-dist")])
    assert "extra" in fl.lattices()
    with pytest.raises(ValueError, match="must define"):  # a module without a LATTICE declaration
        fl.lattice("extra")


def test_an_outside_plugin_with_a_builtin_name_is_skipped(fake_entry_points):
    """A bad plugin breaks only itself: the built-in keeps working."""
    fake_entry_points(BUILTINS + [("domino", "someone_elses.domino", "someone-else")])
    with pytest.warns(fl.FrostlineWarning, match="is built in.*someone-else"):
        names = fl.lattices()
    assert "domino" in names
    assert fl.lattice("domino").LATTICE.name == "domino"


def test_one_name_from_two_outside_packages_loads_neither(fake_entry_points):
    fake_entry_points(BUILTINS + [("extra", "pkg_one", "dist-one"), ("extra", "pkg_two", "dist-two")])
    with pytest.warns(fl.FrostlineWarning, match="dist-one and dist-two"):
        names = fl.lattices()
    assert "extra" not in names and "lozenge" in names


def test_every_lattice_declares_itself():
    ids = {}
    for spec in registry.specs():
        assert isinstance(spec, fl.LatticeSpec) and spec.tile_classes and spec.shapes
        assert spec.region_from_record is not None
        for name, value in spec.streams.items():
            assert value not in ids, f"stream {value} of {spec.name} is also {ids[value]}"
            ids[value] = f"{spec.name}.{name}"
    assert ids.get(3) == "domino.domino_shuffling"  # pinned: the shuffling samples depend on it


def test_closed_forms_come_from_the_declarations():
    assert fl.exact.formulas.macmahon(3, 3, 3) == 980  # OEIS A008793
    assert fl.exact.formulas.aztec_count(3) == 64  # OEIS A006125
    assert fl.exact.formulas.asm_count(5) == 429  # OEIS A005130
    assert "izergin_korepin" in dir(fl.exact.formulas)
    with pytest.raises(AttributeError, match="no closed form"):
        fl.exact.formulas.nonexistent


def test_lattice_spec_refuses_engine_streams():
    with pytest.raises(ValueError, match="1 and 2 belong to the engine"):
        fl.LatticeSpec(name="bad", summary="", streams={"mine": 2})


# OEIS A000108: Catalan numbers
CATALAN = [math.comb(2 * n, n) // (n + 1) for n in range(13)]


@pytest.mark.parametrize("n", range(1, 13))
def test_dyck_path_counts(n):
    assert fl.custom.ModelRegion(fl.custom.dyck_path_model(n)).count() == CATALAN[n]


def test_dyck_paths_sample_uniformly():
    R = fl.custom.ModelRegion(fl.custom.dyck_path_model(5))
    paths = [tuple(row) for row in R.configurations().tolist()]
    law = {p: 1 / len(paths) for p in paths}
    n = 3000
    observed = Counter(tuple(s.heights.tolist()) for s in R.samples(n, seed=4, threads=2))
    assert len(paths) == 42 and pooled_chi_square(observed, law, n) > P_FLOOR


def test_run_time_model_has_the_builtin_api():
    R = fl.custom.ModelRegion(fl.custom.dyck_path_model(4), q=0.5)
    S = R.sample(seed=1)
    assert np.all(S.heights >= 0) and np.all(np.abs(np.diff(np.r_[0, S.heights, 0])) == 1)
    chain = R.chain(seed=2, start="max")
    chain.run(10)
    assert chain.time == 10
    from fractions import Fraction

    z = R.partition_function()
    assert z == sum(Fraction(1, 2) ** (int((row - R.least).sum()) // 2) for row in R.configurations())


@pytest.mark.parametrize("build, words", [
    (lambda: fl.HeightModel(2, np.array([0, 5]), np.array([(2, 0, 1), (0, 2, 1), (0, 1, 1), (1, 0, 1), (1, 3, 1),
                                                           (3, 1, 1)]), np.zeros(2), 1, np.array([0, 1])),
     "inconsistent"),
    (lambda: fl.HeightModel(2, np.array([0]), np.array([(0, 1, 1), (1, 0, 1), (2, 0, 1), (0, 2, 1)]), np.zeros(2), 1,
                            np.array([0, 0])), "share colour class"),
])
def test_invalid_run_time_models(build, words):
    with pytest.raises(ValueError, match=words):
        fl.custom.ModelRegion(build())


def test_empty_lattice_is_refused():
    with pytest.raises(ValueError, match="empty lattice"):
        fl.custom.ModelRegion(fl.HeightModel(0, np.array([0]), np.zeros((0, 3), int), np.zeros(0), 1, np.zeros(0)))


@pytest.mark.parametrize("make", [lambda: fl.lozenge.hexagon(2, 2, 3, q=0.7), lambda: fl.lozenge.hexagon_region(2, 2, 2),
                                  lambda: fl.domino.aztec_diamond(3, vertical_weight=2.0),
                                  lambda: fl.square_ice.domain_wall(4), lambda: fl.square_ice.domain_wall(4, 1, 2, 2.5),
                                  lambda: fl.custom.ModelRegion(fl.custom.dyck_path_model(6))])
def test_checker_passes_the_builtins(make):
    report = fl.check_model(make())
    assert report.ok, report.problems


def test_checker_finds_moves_that_do_not_connect():
    # two sites forced equal (h1 = h0), each between 0 and 1: single-site moves cannot change either
    # (boundary node 2 holds 1: h <= 1; node 3 holds 0: h >= 0)
    rows = [(0, 1, 0), (1, 0, 0), (2, 0, 0), (2, 1, 0), (0, 3, 0), (1, 3, 0)]
    model = fl.HeightModel(2, np.array([1, 0]), np.array(rows), np.zeros(2), 1, np.array([0, 1]))
    report = fl.check_model(model)
    assert not report.moves_connect and "reach 1 of 2 configurations" in report.problems[0]


def test_checker_finds_a_non_monotone_rule():
    report = fl.check_model(fl.square_ice.domain_wall(4, 1, 2, 1.9))
    assert not report.monotone.monotone and any("not monotone" in p for p in report.problems)


def test_headers_and_cmake_config_are_shipped():
    include = fl.get_include()
    for header in ("coupling_from_the_past.hpp", "local_rule.hpp", "height_model.hpp", "bindings/support.hpp"):
        assert os.path.exists(os.path.join(include, "frostline", header))
    assert os.path.exists(os.path.join(fl.get_cmake_dir(), "frostlineConfig.cmake"))
