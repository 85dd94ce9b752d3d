"""Memory estimates hold: each is at least the measured peak and at most 1.5 times it.

Each case runs in a fresh subprocess, which reports the increase of its peak
resident memory (VmHWM of /proc/self/status: unlike ru_maxrss it starts
afresh at exec, so the parent's size does not leak in) while building the
object, next to the estimate the code checks before allocating. Sizes are chosen so the peaks are 100 MB
and more (smaller ones are dominated by the allocator's own slack).
"""
from __future__ import annotations

import json
import subprocess
import sys
import textwrap

import pytest

pytestmark = pytest.mark.skipif(not sys.platform.startswith("linux"), reason="reads /proc/self/status")

CASES = {
    "domino region": ("fl.domino.aztec_diamond(1200)", "region_bytes(2400, 2400, 2 * 1200 * 1201, False)"),
    "weighted domino region": ("fl.domino.aztec_diamond(1200, two_periodic_weights=(1.0, 0.5))",
                               "region_bytes(2400, 2400, 2 * 1200 * 1201, True)"),
    "domino mask with weights": ("fl.domino.DominoRegion(MASK, vertical=np.ones((1999, 2000)), known_tileable=True)",
                                 "region_bytes(2000, 2000, 2000 ** 2, True)"),
    "domino engine": ("fl.domino.aztec_diamond(600)._engine()", "450 * 1201 ** 2"),
    "square ice": ("fl.square_ice.domain_wall(900)", "640 * 901 ** 2"),
    # a long thin box: its tiles, made when a sample's tiles are asked for (the box itself is small)
    "box tiles": ("R = fl.lozenge.hexagon(1, 1, 10 ** 7); "
                  "h = np.zeros((1, 1), np.int32); before = high_water(); R.tiles_from_heights(h)",
                  "box_tile_bytes(1, 1, 10 ** 7)"),
    "square box tiles": ("R = fl.lozenge.hexagon(1500, 1500, 5); "
                         "h = np.zeros((1500, 1500), np.int32); before = high_water(); R.tiles_from_heights(h)",
                         "box_tile_bytes(1500, 1500, 5)"),
    "lozenge region": ("fl.lozenge.hexagon_region(300, 300, 300)", "560 * 6 * 300 ** 2 + 10 ** 6"),
    # the column form's extension check on a zig-zag strip: most of its bounding grid lies outside it
    "column form": ("R = fl.lozenge.from_boundary(ZIGZAG); before = high_water(); R.column_form()",
                    "600 * R.grid.up.size + 10 ** 6"),
}
ZIGZAG = "'" + "60e " + "60ne 60nw " * 5 + "60w " + "60sw 60se " * 5 + "'"


@pytest.mark.parametrize("name", sorted(CASES))
def test_estimate_bounds_the_measured_peak(name):
    build, estimate = CASES[name]
    script = textwrap.dedent(f"""
        import json
        import frostline as fl
        def high_water():
            for line in open("/proc/self/status"):
                if line.startswith("VmHWM:"):
                    return int(line.split()[1]) * 1024
        fl.domino.aztec_diamond(2)._engine(); fl.square_ice.domain_wall(2)  # imports and first-use caches
        fl.lozenge.hexagon_region(2, 2, 2)
        import numpy as np
        from frostline.domino.region import region_bytes
        from frostline.lozenge.hexagon import box_tile_bytes
        MASK = np.ones((2000, 2000), bool)  # the caller's own array, made before the measurement
        before = high_water()
        ZIGZAG = {ZIGZAG}
        value = {build}
        print(json.dumps({{"peak": high_water() - before, "estimate": {estimate}}}))
    """)
    out = subprocess.run([sys.executable, "-c", script], capture_output=True, text=True, check=True).stdout
    figures = json.loads(out.strip().splitlines()[-1])
    assert figures["peak"] > 50e6  # the case is big enough to measure
    assert figures["peak"] <= figures["estimate"] <= 1.5 * figures["peak"], figures


def test_rectangles_fit_the_same_estimate():
    script = textwrap.dedent("""
        import json
        import frostline as fl
        def high_water():
            for line in open("/proc/self/status"):
                if line.startswith("VmHWM:"):
                    return int(line.split()[1]) * 1024
        fl.domino.rectangle(2, 2)
        before = high_water()
        fl.domino.rectangle(2000, 2000)
        from frostline.domino.region import region_bytes
        print(json.dumps({"peak": high_water() - before, "estimate": region_bytes(2000, 2000, 2000 ** 2, False)}))
    """)
    figures = json.loads(subprocess.run([sys.executable, "-c", script], capture_output=True, text=True,
                                        check=True).stdout.strip().splitlines()[-1])
    assert figures["peak"] <= figures["estimate"] <= 1.5 * figures["peak"], figures
