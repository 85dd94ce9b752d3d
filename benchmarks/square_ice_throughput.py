"""Exact samples of domain-wall square ice (uniform ASMs and weighted): fast kernel vs generic engine.

Prints one table per run; compare ratios within the run. Rows: uniform for
n = 50, 100, 200 with the fast kernel, the generic engine for n = 50 and 100,
and the free-fermion weights (1, 1, sqrt 2) for n = 50 and 100.

Usage: python benchmarks/square_ice_throughput.py [--seed 1]
"""
from __future__ import annotations

import argparse
import math

import frostline as fl


def row(label: str, n: int, info) -> None:
    rate = info.site_updates / info.seconds if info.seconds else float("nan")
    print(f"{label:>26} {n:>5} {info.start_time:>8} {info.site_updates:>15,} {info.seconds:>10.3f} {rate:>10.3g}")


def main() -> None:
    p = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    p.add_argument("--seed", type=int, default=1)
    args = p.parse_args()
    header = f"{'sampler':>26} {'n':>5} {'T':>8} {'site updates':>15} {'s/sample':>10} {'updates/s':>10}"
    print(header)
    print("-" * len(header))
    for n in (50, 100, 200):
        row("uniform, fast kernel", n, fl.square_ice.domain_wall(n).sample(seed=args.seed).info)
        if n <= 100:
            row("uniform, generic engine", n, fl.square_ice.domain_wall(n).sample(seed=args.seed, method="generic").info)
    for n in (50, 100):
        region = fl.square_ice.domain_wall(n, 1, 1, math.sqrt(2))
        row("free fermion, fast kernel", n, region.sample(seed=args.seed).info)
    print("\nT: start time (sweeps) of the coalescing epoch. One thread, portable build.")


if __name__ == "__main__":
    main()
