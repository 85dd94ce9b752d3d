"""An ensemble run end to end, as a study would run it, with its numbers in one table.

1. `frostline ensemble` of SIZE exact samples of the 30^3 hexagon given as a
   boundary path (cube-column kernel) into a zarr store, on 1 and on 2 workers
   (wall time of each: the speed-up);
2. the same command again, killed after a few seconds and resumed (members
   done before the kill are kept; the finished store equals the
   uninterrupted one member for member);
3. the store's mean height at every lattice point against the exact mean
   height (`fl.exact.mean_heights`, inverse Kasteleyn matrix), standardised
   by the sample standard error with a floor of 0.05 height units for
   near-frozen points, against the Bonferroni threshold for a family-wise
   false-alarm rate of 1e-3 over the moving points.

Usage: python benchmarks/ensemble_check.py [--size 1000] [--kill-after 3]
Needs the cluster extra (zarr): pip install '.[cluster]'.
"""
from __future__ import annotations

import argparse
import os
import shutil
import signal
import subprocess
import sys
import tempfile
import time

import numpy as np
from scipy import stats

import frostline as fl

PATH = "30e 30ne 30nw 30w 30sw 30se"


def command(store: str, size: int, workers: int) -> list:
    return [sys.executable, "-m", "frostline", "ensemble", "path", PATH, "--size", str(size), "--seed", "7",
            "--store", store, "--workers", str(workers)]


def run(store: str, size: int, workers: int) -> float:
    start = time.perf_counter()
    subprocess.run(command(store, size, workers), check=True, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
    return time.perf_counter() - start


def main() -> None:
    p = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    p.add_argument("--size", type=int, default=1000)
    p.add_argument("--kill-after", type=float, default=3.0)
    args = p.parse_args()
    import zarr

    work = tempfile.mkdtemp()
    try:
        one, two, resumed = (os.path.join(work, name) for name in ("one", "two", "resumed"))
        t1 = run(one, args.size, 1)
        t2 = run(two, args.size, 2)
        child = subprocess.Popen(command(resumed, args.size, 2), stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
        time.sleep(args.kill_after)
        child.send_signal(signal.SIGKILL)
        child.wait()
        before = int(np.asarray(zarr.open(resumed, mode="r")["done"]).sum()) if os.path.exists(resumed) else 0
        t3 = run(resumed, args.size, 2)
        a, b = zarr.open(two, mode="r"), zarr.open(resumed, mode="r")
        same = bool(np.array_equal(np.asarray(a["heights"]), np.asarray(b["heights"])))
        heights = np.asarray(b["heights"]).astype(float)
        region = fl.lozenge.from_boundary(PATH)
        start = time.perf_counter()
        exact = fl.exact.mean_heights(region)
        exact_seconds = time.perf_counter() - start
        mask = region.vertex_mask
        mean = heights.mean(axis=0)
        error = heights.std(axis=0, ddof=1) / np.sqrt(len(heights))
        moving = mask & (error > 0)
        z = np.abs(mean - exact)[mask] / np.maximum(error, 0.05)[mask]
        threshold = stats.norm.isf(1e-3 / (2 * int(moving.sum())))
        print(f"# {os.cpu_count()} cores; {args.size} exact samples of the 30^3 hexagon as a boundary path")
        print(f"{'step':<52} {'value':>12}")
        print(f"{'1 worker, seconds':<52} {t1:>12.2f}")
        print(f"{'2 workers, seconds':<52} {t2:>12.2f}")
        print(f"{'speed-up, 2 workers vs 1':<52} {t1 / t2:>12.2f}")
        print(f"{'members done when killed':<52} {before:>12d}")
        print(f"{'resume, seconds':<52} {t3:>12.2f}")
        print(f"{'resumed store equals the uninterrupted one':<52} {str(same):>12}")
        print(f"{'exact mean heights, seconds':<52} {exact_seconds:>12.2f}")
        print(f"{'points (moving)':<52} {int(mask.sum()):>6d} ({int(moving.sum())})")
        print(f"{'largest |mean - exact| / max(SE, 0.05)':<52} {float(z.max()):>12.2f}")
        print(f"{'Bonferroni threshold (family-wise 1e-3)':<52} {threshold:>12.2f}")
        print(f"{'mean heights agree with exact':<52} {str(bool(z.max() < threshold)):>12}")
    finally:
        shutil.rmtree(work, ignore_errors=True)


if __name__ == "__main__":
    main()
