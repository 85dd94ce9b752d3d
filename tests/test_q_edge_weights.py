"""q ** volume as edge weights: exact partition functions and local statistics of q-weighted lozenge regions.

Weight q ** ((y - x) / 2) on each type-0 lozenge (x, y) gives every tiling
q ** (volume + C) with a constant C of the region (docs/references.md). The
checks: MacMahon's q-analogue on boxes (MacMahon 1916; the constant
ab(b - a)/4), exact enumeration on irregular regions for q < 1 and q > 1 (a
box alone cannot tell q from 1/q, since complementing the box maps the volume
V to abc - V), and placement probabilities against exact enumerated laws.
"""
from __future__ import annotations

import math
from fractions import Fraction

import numpy as np
import pytest

import frostline as fl
from frostline.lozenge.counts import q_partition_function

BOXES = [(4, 5, 3, 0.8), (3, 3, 3, 0.7), (2, 5, 4, 1.3), (6, 2, 3, 0.9), (5, 4, 6, 1.1)]


@pytest.mark.parametrize("box", BOXES)
def test_box_log_partition_function_is_macmahon(box):
    a, b, c, q = box
    exact = math.log(float(q_partition_function(a, b, c, q)))  # MacMahon's q-analogue
    assert fl.exact.log_partition_function(fl.lozenge.hexagon(a, b, c, q=q)) == pytest.approx(exact, abs=1e-9)
    general = fl.lozenge.hexagon_region(a, b, c, q=q)
    assert fl.exact.log_partition_function(general) == pytest.approx(exact, abs=1e-9)
    assert general.volume_offset() == a * b * (b - a) / 4


IRREGULAR = {
    "path hexagon": lambda q: fl.lozenge.from_boundary("3e 2ne 4nw 3w 2sw 4se", q=q),
    "trapezoid 6 4": lambda q: fl.lozenge.trapezoid(6, 4, q=q),
    "trapezoid 7 3": lambda q: fl.lozenge.trapezoid(7, 3, notches=[0, 3, 5], q=q),
}


@pytest.mark.parametrize("name", sorted(IRREGULAR))
@pytest.mark.parametrize("q", [0.6, 1.45])
def test_irregular_regions_against_enumeration(name, q):
    region = IRREGULAR[name](q)
    exact = region.partition_function()  # enumeration of every tiling, weights q ** volume exactly
    assert isinstance(exact, Fraction)
    assert fl.exact.log_partition_function(region) == pytest.approx(math.log(exact), abs=1e-9)


def _enumerated_probabilities(region, tiles) -> np.ndarray:
    """The probability of each tile position under the exact (enumerated) q ** volume law."""
    configurations, probabilities = fl.exact.distribution(region)
    index = {tuple(t): k for k, t in enumerate(tiles.tolist())}
    exact = np.zeros(len(tiles))
    for heights, weight in zip(configurations, probabilities):
        for t in region.tiles_from_heights(heights).tolist():
            exact[index[tuple(t)]] += float(weight)
    return exact


@pytest.mark.parametrize("name", sorted(IRREGULAR))
def test_placement_probabilities_match_the_enumerated_law(name):
    region = IRREGULAR[name](0.7)
    tiles, p = fl.exact.placement_probabilities(region)
    np.testing.assert_allclose(p, _enumerated_probabilities(region, tiles), atol=1e-9)


def test_box_placement_probabilities_with_q():
    box = fl.lozenge.hexagon(3, 4, 2, q=1.25)
    tiles, p = fl.exact.placement_probabilities(box)
    np.testing.assert_allclose(p, _enumerated_probabilities(box, tiles), atol=1e-9)


def test_large_weighted_region_partition_function_by_determinant():
    region = fl.lozenge.hexagon_region(12, 11, 10, q=0.97)  # far beyond enumeration
    value = region.partition_function()
    assert isinstance(value, float)
    assert math.log(value) == pytest.approx(math.log(float(q_partition_function(12, 11, 10, 0.97))), abs=1e-8)
