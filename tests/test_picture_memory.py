"""Pictures estimate their memory before drawing: the estimate is at least the measured peak and at most 1.5x.

Each case runs in a fresh subprocess that resets its high-water mark of
resident memory (writing 5 to /proc/self/clear_refs, Linux) after the tiles
are made, then writes a picture through ``fl.plot.save`` and compares the
peak with the largest estimate the code itself passed to ``check_memory``
(recorded by a spy). The cases cover both paths (one polygon per tile, and
one raster image for large tilings), pixel-bound and tile-bound sizes, and
the vector formats, with peaks of 100 MB and more.
"""
from __future__ import annotations

import json
import subprocess
import sys
import textwrap

import pytest

import frostline as fl
from frostline.errors import RegionTooLargeError

SCRIPT = textwrap.dedent("""
    import json, sys
    import numpy as np
    import frostline as fl
    import frostline.domino.drawing as domino_drawing
    import frostline.lozenge.drawing as lozenge_drawing
    import frostline.plot as plot
    from frostline.lozenge.tiles import tiles_of_plane_partition

    def high_water():
        for line in open("/proc/self/status"):
            if line.startswith("VmHWM:"):
                return int(line.split()[1]) * 1024

    class Picture:  # stands for a sample: save() only calls plot(ax)
        def __init__(self, draw, *args):
            self.draw, self.args = draw, args
        def plot(self, ax=None, **style):
            return self.draw(*self.args, ax=ax, **style)

    checked = []  # every estimate the drawing code checks, as it checks it
    def spy(estimate, what):
        checked.append(estimate)
    import frostline._limits as limits
    for module in (domino_drawing, lozenge_drawing, plot, limits):  # by-name imports, and the module itself
        module.check_memory = spy

    fl.plot.save(fl.lozenge.hexagon(2, 2, 2).sample(seed=0), sys.argv[4] + ".warm.png", size=1, dpi=50)
    lattice, n, size, path = sys.argv[1], int(sys.argv[2]), float(sys.argv[3]), sys.argv[4]
    if lattice == "domino":  # an n x n square of horizontal dominoes in two classes
        r, c = np.mgrid[0:n, 0:n:2]
        tiles = np.stack([np.stack([r, c], -1), np.stack([r, c + 1], -1)], -2).reshape(-1, 2, 2)
        picture = Picture(domino_drawing.draw_dominoes, tiles, r.ravel() % 2)
    else:  # a staircase plane partition in the n x n x n box
        tiles = tiles_of_plane_partition(np.triu(np.full((n, n), n // 2)), n)
        picture = Picture(lozenge_drawing.draw_lozenges, tiles)
    checked.clear()
    open("/proc/self/clear_refs", "w").write("5")
    before = high_water()
    fl.plot.save(picture, path, size=size, dpi=200)
    print(json.dumps({"peak": high_water() - before, "estimate": max(checked), "checks": len(checked)}))
""")

CASES = {  # lattice, side, inches at 200 dpi, format
    "domino raster": ("domino", 2000, 6, "png"),
    "domino polygons, large canvas": ("domino", 300, 20, "png"),
    "domino polygons near the raster size": ("domino", 540, 6, "png"),
    "domino polygons as svg": ("domino", 540, 6, "svg"),
    "lozenge raster": ("lozenge", 400, 6, "png"),
    "lozenge polygons, large canvas": ("lozenge", 200, 20, "png"),
    "lozenge polygons as pdf": ("lozenge", 200, 6, "pdf"),
}


@pytest.mark.skipif(not sys.platform.startswith("linux"), reason="reads /proc/self/status")
@pytest.mark.parametrize("name", sorted(CASES))
def test_picture_estimate_bounds_the_measured_peak(name, tmp_path):
    pytest.importorskip("matplotlib")
    lattice, n, size, ext = CASES[name]
    out = subprocess.run([sys.executable, "-c", SCRIPT, lattice, str(n), str(size), str(tmp_path / f"p.{ext}")],
                         capture_output=True, text=True, check=True).stdout
    figures = json.loads(out.strip().splitlines()[-1])
    assert figures["peak"] > 100e6 and figures["checks"] >= 2  # big enough to measure; save() and the plugin
    assert figures["peak"] <= figures["estimate"] <= 1.5 * figures["peak"], figures


def test_a_picture_over_the_limit_is_refused_before_drawing(tmp_path, monkeypatch):
    pytest.importorskip("matplotlib")
    sample = fl.domino.aztec_diamond(4).sample(seed=0)
    monkeypatch.setenv("FROSTLINE_MEMORY_LIMIT", str(200e6))
    path = tmp_path / "big.png"
    with pytest.raises(RegionTooLargeError, match="picture"):
        fl.plot.save(sample, path, size=100, dpi=200)  # 20000 x 20000 pixels
    assert not path.exists()
    fl.plot.save(sample, path, size=3, dpi=100)
    assert path.stat().st_size > 0


def test_a_raster_over_the_limit_is_refused_before_allocating(monkeypatch):
    from frostline.domino.drawing import raster_dominoes
    far_apart = [[[0, 0], [0, 1]], [[10**5, 0], [10**5, 1]], [[0, 10**5], [0, 10**5 + 1]]]  # 1e10 cells
    with pytest.raises(RegionTooLargeError, match="picture of 3 dominoes"):
        raster_dominoes(far_apart, [0, 0, 0])


@pytest.mark.parametrize("bad", [{"size": 0}, {"size": -1.0}, {"size": float("nan")}, {"size": "6"},
                                 {"dpi": 0}, {"dpi": 72.5}, {"dpi": True}, {"size": 1e6}])
def test_picture_sizes_are_checked(bad, tmp_path):
    sample = fl.domino.aztec_diamond(2).sample(seed=0)
    with pytest.raises(ValueError, match="size|dpi"):
        fl.plot.save(sample, tmp_path / "p.png", **bad)
