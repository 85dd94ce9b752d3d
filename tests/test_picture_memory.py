"""Pictures estimate their memory before drawing: the estimate is at least the measured peak and at most 1.5x.

Each case runs in a fresh subprocess that resets its high-water mark of
resident memory (writing 5 to /proc/self/clear_refs, Linux) after the tiles
are made, then writes a PNG through ``fl.plot.save``. The cases cover both
paths (one polygon per tile, and one raster image for large tilings) with
peaks of 100 MB and more.
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
    from frostline.domino.drawing import draw_dominoes, raster_bytes as domino_raster
    from frostline.lozenge.drawing import RASTER_PIXELS, draw_lozenges, raster_bytes as lozenge_raster
    from frostline.lozenge.tiles import tiles_of_plane_partition
    from frostline.toolkit.drawing import RASTER_TILES, picture_bytes

    def high_water():
        for line in open("/proc/self/status"):
            if line.startswith("VmHWM:"):
                return int(line.split()[1]) * 1024

    class Picture:  # stands for a sample: save() only calls plot(ax)
        def __init__(self, draw, *args):
            self.draw, self.args = draw, args
        def plot(self, ax=None, **style):
            return self.draw(*self.args, ax=ax, **style)

    fl.plot.save(fl.lozenge.hexagon(2, 2, 2).sample(seed=0), sys.argv[4] + ".warm.png", size=1, dpi=50)
    lattice, n, size = sys.argv[1], int(sys.argv[2]), float(sys.argv[3])
    if lattice == "domino":  # an n x n square of horizontal dominoes in two classes
        r, c = np.mgrid[0:n, 0:n:2]
        tiles = np.stack([np.stack([r, c], -1), np.stack([r, c + 1], -1)], -2).reshape(-1, 2, 2)
        picture = Picture(draw_dominoes, tiles, r.ravel() % 2)
        cells, work = n * n, domino_raster(n, n, len(tiles))
    else:  # a staircase plane partition in the n x n x n box
        tiles = tiles_of_plane_partition(np.triu(np.full((n, n), n // 2)), n)
        picture = Picture(draw_lozenges, tiles)
        cells, work = RASTER_PIXELS ** 2, lozenge_raster(RASTER_PIXELS, RASTER_PIXELS, len(tiles))
    pixels = int(size * 200) ** 2
    if len(tiles) > RASTER_TILES:
        estimate = picture_bytes(pixels, raster_cells=cells, raster_work=work)
    else:
        estimate = picture_bytes(pixels, tiles=len(tiles))
    open("/proc/self/clear_refs", "w").write("5")
    before = high_water()
    fl.plot.save(picture, sys.argv[4], size=size, dpi=200)
    print(json.dumps({"peak": high_water() - before, "estimate": estimate, "tiles": len(tiles)}))
""")

CASES = {  # lattice, side, inches at 200 dpi
    "domino raster": ("domino", 2000, 6),
    "domino polygons": ("domino", 300, 20),
    "lozenge raster": ("lozenge", 400, 6),
    "lozenge polygons": ("lozenge", 200, 20),
}


@pytest.mark.skipif(not sys.platform.startswith("linux"), reason="reads /proc/self/status")
@pytest.mark.parametrize("name", sorted(CASES))
def test_picture_estimate_bounds_the_measured_peak(name, tmp_path):
    pytest.importorskip("matplotlib")
    lattice, n, size = CASES[name]
    out = subprocess.run([sys.executable, "-c", SCRIPT, lattice, str(n), str(size), str(tmp_path / "p.png")],
                         capture_output=True, text=True, check=True).stdout
    figures = json.loads(out.strip().splitlines()[-1])
    assert figures["peak"] > 100e6  # big enough to measure
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
