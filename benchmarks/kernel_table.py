"""One table of exact-sample speed for the rows of the speed targets, on this machine.

For each row: seconds per exact sample and site updates per second (both CFTP
chains counted) for every instruction-set level this CPU runs (FROSTLINE_SIMD)
and for one and more threads inside one sample; beside them the generic
engine and a plain numpy heat-bath chain (benchmarks/numpy_chain.py), both run
for a few seconds and extrapolated to the kernel's number of site updates
("~" marks an extrapolated time). Ratios within one run are what count: these
machines are noisy.

Usage: python benchmarks/kernel_table.py [--quick] [--threads 1 2] [--seed 1]
  --quick   smaller rows (for a smoke run; not the targets)
"""
from __future__ import annotations

import argparse
import os
import platform
import sys
import time
from typing import Callable, List, Optional

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))

import frostline as fl  # noqa: E402
from numpy_chain import numpy_chain_rate  # noqa: E402

MEASURE_SECONDS = 2.0


def generic_rate(region, seconds: float = MEASURE_SECONDS) -> float:
    """Site updates per second of the generic engine's forward chain on ``region``."""
    n_sites = region.heat_bath_rule()[0].n_sites
    chain = region.chain(seed=0, start="min", method="generic")
    sweeps, done, start = 1, 0, time.perf_counter()
    while time.perf_counter() - start < seconds:
        chain.run(sweeps)
        done += sweeps * n_sites
        sweeps *= 2
    return done / (time.perf_counter() - start)


def with_level(level: str, thunk: Callable[[], object]) -> object:
    old = os.environ.get("FROSTLINE_SIMD")
    os.environ["FROSTLINE_SIMD"] = level
    try:
        return thunk()
    finally:
        if old is None:
            del os.environ["FROSTLINE_SIMD"]
        else:
            os.environ["FROSTLINE_SIMD"] = old


def line(row: str, level: str, threads: object, seconds: float, updates: Optional[int], mark: str = " ",
         kernel: str = "-") -> None:
    rate = f"{updates / seconds:11.3g}" if updates else f"{'-':>11}"
    print(f"{row:<34} {kernel:>12} {level:>8} {str(threads):>7} {mark}{seconds:>9.3f} {rate}")


def exact_rows(name: str, region, method: str, levels: List[str], threads: List[int], seed: int,
               baselines: bool = True) -> None:
    info = None
    for level in levels:
        for k in threads if level == levels[-1] else [1]:
            sample = with_level(level, lambda: region.sample(seed=seed, method=method, threads=k))
            info = sample.info
            line(name, level, k, info.seconds, info.report.get("site_updates"), kernel=info.kernel)
    if not baselines or info is None or not info.report.get("site_updates"):
        return
    updates = info.report["site_updates"]
    rate = generic_rate(region)
    line(name, "-", 1, updates / rate, updates, "~", kernel="generic")
    rate = numpy_chain_rate(region, MEASURE_SECONDS)
    line(name, "-", 1, updates / rate, updates, "~", kernel="numpy chain")


def zigzag_strip(m: int, turns: int) -> str:
    """A strip of width about 2m that zig-zags `turns` times, skewed against the grid of cube columns
    (its columns fill about a third of their bounding box): a boundary path for fl.lozenge.from_boundary."""
    bottom = " ".join(f"{m}e {m}ne" for _ in range(turns))
    top = " ".join(f"{m}w {m}sw" for _ in range(turns))
    return f"{bottom} {m}nw {m}ne {top} {m}sw {m}se"


def main() -> None:
    p = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    p.add_argument("--quick", action="store_true")
    p.add_argument("--threads", type=int, nargs="+", default=[1, 2])
    p.add_argument("--seed", type=int, default=1)
    args = p.parse_args()
    levels = fl.simd_levels()
    small = args.quick
    print(f"# {platform.processor() or platform.machine()}, {os.cpu_count()} cores, levels {', '.join(levels)}")
    header = f"{'row':<34} {'kernel':>12} {'level':>8} {'threads':>7} {'s/sample':>10} {'updates/s':>11}"
    print(header)
    print("-" * len(header))

    n = 40 if small else 100
    exact_rows(f"hexagon {n}^3, box kernel", fl.lozenge.hexagon(n, n, n), "cftp", levels, args.threads, args.seed)
    n = 20 if small else 60
    exact_rows(f"hexagon {n}^3, box kernel", fl.lozenge.hexagon(n, n, n), "cftp", levels[-1:], [1], args.seed,
               baselines=False)
    start = time.perf_counter()
    region = fl.lozenge.hexagon_region(n, n, n)
    region.column_form()
    line(f"hexagon {n}^3 region: construction", "-", 1, time.perf_counter() - start, None, kernel="columns")
    exact_rows(f"hexagon {n}^3 as a general region", region, "columns", levels, [1], args.seed, baselines=False)
    exact_rows(f"hexagon {n}^3 as a general region", region, "points", levels[-1:], [1], args.seed)
    m = 8 if small else 20
    strip = fl.lozenge.from_boundary(zigzag_strip(m, 5))
    exact_rows(f"zig-zag strip ({len(strip.triangles) // 2} lozenges)", strip, "columns", levels[-1:], args.threads,
               args.seed, baselines=False)
    exact_rows(f"zig-zag strip ({len(strip.triangles) // 2} lozenges)", strip, "points", levels[-1:], [1], args.seed,
               baselines=False)
    n = 40 if small else 100
    exact_rows(f"Aztec diamond {n}, CFTP", fl.domino.aztec_diamond(n), "cftp", levels, args.threads, args.seed)
    exact_rows(f"ASM {n} (square ice), CFTP", fl.square_ice.domain_wall(n), "cftp", levels, args.threads, args.seed)

    n = 200 if small else 1000
    for threads in args.threads:
        start = time.perf_counter()
        region = fl.domino.aztec_diamond(n)
        built = time.perf_counter() - start
        sample = region.sample(seed=args.seed, method="shuffling", threads=threads)
        _ = sample.tiles, sample.heights
        total = time.perf_counter() - start
        if threads == args.threads[0]:
            line(f"Aztec {n}: construction", "-", 1, built, None, kernel="shuffling")
        line(f"Aztec {n}: build + sample + views", "-", threads, total, None, kernel="shuffling")

    n = 60 if small else 200
    exact_rows(f"hexagon {n}^3, box kernel", fl.lozenge.hexagon(n, n, n), "cftp", levels[-1:], args.threads,
               args.seed, baselines=False)

    n, k = (20, 8) if small else (40, 16)
    region = fl.lozenge.hexagon(n, n, n)
    for threads in args.threads:
        start = time.perf_counter()
        region.samples(k, seed=args.seed, threads=threads)
        line(f"{k} samples of {n}^3, samples()", levels[-1], threads, time.perf_counter() - start, None, kernel="box")
    print("\nlevel: instruction set of the vector kernels; threads: inside one sample (samples(): across members).")
    print("generic, numpy: rate measured for a few seconds, time extrapolated to the kernel's updates (~).")


if __name__ == "__main__":
    main()
